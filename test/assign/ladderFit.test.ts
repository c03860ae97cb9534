// fitLadderSpacing checked against closed forms of weighted least squares.
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { fitLadderSpacing } from "../../lib/assign/ladderFit.ts";

describe("fitLadderSpacing(groups)", () => {
  it("returns the exact spacing of exact ladders with separate offsets (closed form)", () => {
    const r = fitLadderSpacing([
      { positionsV: [0.7, 0.825], sigmasV: [0.002, 0.002] },
      { positionsV: [1.3, 1.425, 1.55], sigmasV: [0.001, 0.003, 0.002] },
    ])!;
    expectClose(r.spacingV, 0.125, { rtol: 1e-12 });
    expect(r.degreesOfFreedom).toBe(3);
  });

  it("gives SE = σ/√Σ(k − k̄)² for equal weights (textbook weighted regression, e.g. Bevington & Robinson ch. 6)", () => {
    // One group of 4 peaks, σ = 2 mV each: Σ(k − 1.5)² = 5, SE = 0.002/√5; exact positions give χ² = 0, so no Birge scaling.
    const r = fitLadderSpacing([{ positionsV: [1, 1.1, 1.2, 1.3], sigmasV: [0.002, 0.002, 0.002, 0.002] }])!;
    expectClose(r.spacingSEV, 0.002 / Math.sqrt(5), { rtol: 1e-12 });
  });

  it("widens the SE by the Birge ratio √χ²_red when the scatter exceeds the stated σ (Birge, Phys. Rev. 40, 207 (1932))", () => {
    const pos = [1, 1.105, 1.195, 1.3];
    const r = fitLadderSpacing([{ positionsV: pos, sigmasV: [0.001, 0.001, 0.001, 0.001] }])!;
    // Hand check: slope by least squares and residuals.
    const k = [-1.5, -0.5, 0.5, 1.5];
    const mean = pos.reduce((a, b) => a + b, 0) / 4;
    const slope = k.reduce((a, kk, i) => a + kk * (pos[i] - mean), 0) / 5;
    const chi2 = pos.reduce((a, p, i) => a + ((p - mean - k[i] * slope) / 0.001) ** 2, 0);
    expectClose(r.spacingV, slope, { rtol: 1e-12 });
    expectClose(r.reducedChiSquare, chi2 / 2, { rtol: 1e-9 });
    expectClose(r.spacingSEV, (0.001 / Math.sqrt(5)) * Math.sqrt(chi2 / 2), { rtol: 1e-9 });
  });

  it("is null when no group has two peaks", () => {
    expect(fitLadderSpacing([{ positionsV: [1], sigmasV: [0.001] }])).toBeNull();
  });
});
