// refinementStarts: the split starts keep the degeneracy-weighted mean of the p level (closed form:
// 2·(ε − 2δ/3) + 4·(ε + δ/3) = 6ε, and 2·(ε − δ) + 2ε + 2·(ε + δ) = 6ε), the spacings are the
// documented fractions of Ec, and each seed's first-peak bias inverts the start formula of
// startingValues, ε = η·V − Ec·(before + ½) (closed form).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { refinementStarts, REFINEMENT_DEFAULTS } from "../../../lib/model/fit/refinementStarts.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";

const seeds: LevelSeed[] = [
  { band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.76, before: 0 },
  { band: "CB", label: "p", degeneracy: 6, firstPeakV: 1.18, before: 2 },
];
const fitted = [0.6, 0.9, 0.1, 0, -2]; // ε_s, ε_p (eV), Ec (eV), log₁₀ r, log₁₀ σ
const eta = 0.85;

describe("refinementStarts(seeds, parameters, eta)", () => {
  it("REFINEMENT_DEFAULTS are locked", () => {
    expect(REFINEMENT_DEFAULTS).toEqual({ splitSpacingsEc: [0.35, 0.9], splitRateRatioOffsetLog10: -0.5, peakEcMinDrop: 0.05, rateRatioOffsetsLog10: [-0.5, 0.5] });
    expect(Object.isFrozen(REFINEMENT_DEFAULTS)).toBe(true);
  });

  it("splits a whole p level into 2+4 and 2+2+2 about it at each spacing, then moves the rate ratio", () => {
    const starts = refinementStarts(seeds, fitted, eta);
    expect(starts.map((s) => s.layout)).toEqual(["2+2+4", "2+2+2+2", "2+2+4", "2+2+2+2", "2+6", "2+6"]);
    for (const [k, spacing] of REFINEMENT_DEFAULTS.splitSpacingsEc.entries()) {
      const delta = spacing * 0.1;
      const [twoFour, twoTwoTwo] = [starts[2 * k], starts[2 * k + 1]];
      expectClose(twoFour.parameters.slice(0, 3), [0.6, 0.9 - (2 * delta) / 3, 0.9 + delta / 3], { rtol: 1e-12, what: "2+4 about ε_p" });
      expectClose(twoTwoTwo.parameters.slice(0, 4), [0.6, 0.9 - delta, 0.9, 0.9 + delta], { rtol: 1e-12, what: "2+2+2 about ε_p" });
      const mean = (s: typeof twoFour) => s.seeds.slice(1).reduce((a, x, j) => a + x.degeneracy * s.parameters[j + 1], 0) / 6;
      expectClose([mean(twoFour), mean(twoTwoTwo)], [0.9, 0.9], { rtol: 1e-12, what: "degeneracy-weighted mean ε_p" });
      expect(twoTwoTwo.seeds.map((s) => s.label)).toEqual(["s", "p1", "p2", "p3"]);
      expect(twoTwoTwo.seeds.map((s) => s.before)).toEqual([0, 2, 4, 6]);
    }
    expectClose(starts[4].parameters, [0.6, 0.9, 0.1, -0.5, -2], { rtol: 1e-12 });
    expectClose(starts[5].parameters, [0.6, 0.9, 0.1, 0.5, -2], { rtol: 1e-12 });
  });

  it("places each seed's first peak where startingValues' formula gives back the start: ε = η·V − Ec·(before + ½)", () => {
    for (const start of refinementStarts(seeds, fitted, eta)) {
      const ec = start.parameters[start.seeds.length];
      const back = start.seeds.map((s) => eta * s.firstPeakV - ec * (s.before + 0.5));
      expectClose(back, start.parameters.slice(0, start.seeds.length), { rtol: 1e-12, what: start.change });
    }
  });

  it("splits a p sub-level of 4 into 2+2 and leaves an s-only grouping with rate-ratio restarts alone", () => {
    const split = [seeds[0], { band: "CB", label: "p1", degeneracy: 2, firstPeakV: 1.1, before: 2 }, { band: "CB", label: "p2", degeneracy: 4, firstPeakV: 1.3, before: 4 }] as LevelSeed[];
    const starts = refinementStarts(split, [0.6, 0.85, 0.95, 0.1, 0, -2], eta);
    expect(starts.map((s) => s.layout)).toEqual(["2+2+2+2", "2+2+2+2", "2+2+4", "2+2+4"]);
    expectClose(starts[0].parameters.slice(0, 4), [0.6, 0.85, 0.95 - 0.0175, 0.95 + 0.0175], { rtol: 1e-12, what: "±δ/2, δ = 0.35·Ec" });
    expect(refinementStarts([seeds[0]], [0.6, 0.1, 0, -2], eta).map((s) => s.layout)).toEqual(["2", "2"]);
  });

  it("adds a 2+2+2 split at a lower peak-based Ec whose levels keep the centroid of their peaks in the fitted ladder (closed form), and none without one", () => {
    // Fitted: ε_s 0.6, ε_p 0.9 eV, Ec 0.1 eV; peak-based Ec 0.08 eV (ΔEc = 0.02 eV).
    const starts = refinementStarts(seeds, fitted, eta, 0.08);
    const extra = starts.find((s) => /peak-based Ec 80 meV/.test(s.change))!;
    expect(extra.layout).toBe("2+2+2+2");
    expectClose(extra.parameters.slice(4), [0.08, 0, -2], { rtol: 1e-12, what: "Ec, log r, log σ" });
    // Centroid of the peaks of the carriers b … b + g − 1: ε + Ec·(b + g/2), the same in both.
    const centroid = (e: number, ec: number, b: number, g: number) => e + ec * (b + g / 2);
    const fittedCentroids = [centroid(0.6, 0.1, 0, 2), centroid(0.9, 0.1, 2, 2), centroid(0.9, 0.1, 4, 2), centroid(0.9, 0.1, 6, 2)];
    const startCentroids = extra.seeds.map((x, j) => centroid(extra.parameters[j], 0.08, x.before, x.degeneracy));
    expectClose(startCentroids, fittedCentroids, { rtol: 1e-12, what: "peak centroids" });
    expectClose(extra.parameters[2] - extra.parameters[1], 0.04, { rtol: 1e-9, what: "sub-levels 2·ΔEc apart" });
    expect(refinementStarts(seeds, fitted, eta).some((s) => /peak-based/.test(s.change))).toBe(false);
    expect(refinementStarts(seeds, fitted, eta, 0.097).some((s) => /peak-based/.test(s.change))).toBe(false); // less than 5 % lower
  });

  it("below Γtip/Γsub = 1 also starts each 2+2+2 split at a third of the fitted rate ratio, the levels as in the plain split (exact)", () => {
    const slow = [0.6, 0.9, 0.1, -0.3, -2]; // Γtip/Γsub = 0.5
    const starts = refinementStarts(seeds, slow, eta);
    expect(starts.map((s) => s.layout)).toEqual(["2+2+4", "2+2+2+2", "2+2+2+2", "2+2+4", "2+2+2+2", "2+2+2+2", "2+6", "2+6"]);
    for (const k of [0, 1]) {
      const [plain, slower] = [starts[3 * k + 1], starts[3 * k + 2]];
      expect(slower.parameters.slice(0, 5)).toEqual(plain.parameters.slice(0, 5));
      expectClose(slower.parameters[5] - plain.parameters[5], REFINEMENT_DEFAULTS.splitRateRatioOffsetLog10, { rtol: 1e-12, what: "log₁₀ Γtip/Γsub offset" });
    }
    expect(refinementStarts(seeds, fitted, eta).length).toBe(6); // Γtip/Γsub = 1: none
  });
});

