// Resonances predicted by a shell-filling ladder. Closed form (orthodox theory of the double-barrier
// junction with a capacitive divider: D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena in
// Solids (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)): through the tip
// junction the j-th charging peak of a level ε with N carriers below lies at
// V = (ε + Ec·(N + j + ½))/η; through the substrate junction of an otherwise empty dot the same level
// takes its (j + 1)-th carrier at V′ = −(ε + Ec·(j + ½))/(1 − η). The expected values below are these
// closed forms computed from ε, Ec and η, not from the function under test.
import { describe, it, expect } from "vitest";
import { ladderResonances, LADDER_RESONANCES_DEFAULTS } from "../../lib/assign/ladderResonances.ts";
import { substrateToTipStepRatio } from "../../lib/model/regimeLimits.ts";
import { expectClose } from "../helpers/expectClose.ts";

const eta = 0.6;
const ecEV = 0.12; // Ec in bias Ec/η = 0.2 V
const tip = (eps: number, n: number) => (eps + ecEV * (n + 0.5)) / eta;
const substrate = (eps: number, j: number) => (eps + ecEV * (j + 0.5)) / (1 - eta);
const peak = (biasV: number) => ({ biasV, biasUncertaintyV: 0.002, fwhmV: 0.04 });

describe("ladderResonances(peaks, inputs)", () => {
  it("predicts every charging peak's resonance of a VB level of 2 and one of 4 states (N = 2), closed form", () => {
    // VB levels |ε| = 0.6 eV (2 states) and 0.75 eV (4 states): tip peaks at −tip(ε, N + j).
    const v1 = [0, 1].map((j) => -tip(0.6, j));
    const v2 = [0, 1, 2, 3].map((j) => -tip(0.75, 2 + j));
    const expected = [...[0, 1].map((j) => substrate(0.6, j)), ...[0, 1, 2, 3].map((j) => substrate(0.75, j))];
    const peaks = [...v1, ...v2, ...expected].map(peak);
    const vb = (peakIndices: number[]) => ({ band: "VB" as const, degeneracy: null, peakIndices, subgroups: [peakIndices.length] });
    const out = ladderResonances(peaks, { multiplets: [vb([0, 1]), vb([2, 3, 4, 5])], chargingEnergyV: ecEV / eta, eta });
    expect(out.map((r) => r.index)).toEqual([6, 7, 8, 9, 10, 11]);
    expect(out.map((r) => r.sourceIndex)).toEqual([0, 1, 2, 3, 4, 5]);
    expectClose(out.map((r) => r.predictedV), expected, { rtol: 1e-12, what: "(|ε| + Ec(j + ½))/(1 − η)" });
    expect(out.map((r) => r.carriersBelow)).toEqual([0, 0, 2, 2, 2, 2]);
  });

  it("counts the states below each sub-level of a split CB shell (p split 2 + 4 after s: N = 2, then 4)", () => {
    const s = [0, 1].map((j) => tip(0.5, j));
    const pa = [0, 1].map((j) => tip(0.8, 2 + j));
    const pb = [0, 1, 2, 3].map((j) => tip(0.9, 4 + j));
    const expected = [...[0, 1].map((j) => -substrate(0.5, j)), ...[0, 1].map((j) => -substrate(0.8, j)), ...[0, 1, 2, 3].map((j) => -substrate(0.9, j))];
    const peaks = [...s, ...pa, ...pb, ...expected].map(peak);
    const multiplets = [
      { band: "CB" as const, degeneracy: 2, peakIndices: [0, 1], subgroups: [2] },
      { band: "CB" as const, degeneracy: 6, peakIndices: [2, 3, 4, 5, 6, 7], subgroups: [2, 4] },
    ];
    const out = ladderResonances(peaks, { multiplets, chargingEnergyV: ecEV / eta, eta });
    expect(out.map((r) => r.index)).toEqual([8, 9, 10, 11, 12, 13, 14, 15]);
    expectClose(out.map((r) => r.predictedV), expected, { rtol: 1e-12, what: "−(ε + Ec(j + ½))/(1 − η)" });
  });

  it("a CB shell read whole adds its degeneracy for the next shell (s read 1 of 2: p still has N = 2)", () => {
    const peaks = [tip(0.5, 0), tip(0.8, 2), -substrate(0.8, 0)].map(peak);
    const multiplets = [
      { band: "CB" as const, degeneracy: 2, peakIndices: [0], subgroups: [1] },
      { band: "CB" as const, degeneracy: 6, peakIndices: [1], subgroups: [1] },
    ];
    const out = ladderResonances(peaks, { multiplets, chargingEnergyV: ecEV / eta, eta });
    expect(out.map((r) => [r.index, r.sourceIndex])).toEqual([[2, 1]]);
  });

  it("names no peak outside tolerance, none on the source's own side, and nothing for η = 1 or Ec ≤ 0", () => {
    const v = -tip(0.6, 0);
    const peaks = [v, substrate(0.6, 0) + 0.1, -substrate(0.6, 0)].map(peak); // 0.1 V off; wrong side
    const multiplets = [{ band: "VB" as const, degeneracy: null, peakIndices: [0], subgroups: [1] }];
    expect(ladderResonances(peaks, { multiplets, chargingEnergyV: 0.2, eta })).toEqual([]);
    const exact = [v, substrate(0.6, 0)].map(peak);
    expect(ladderResonances(exact, { multiplets, chargingEnergyV: 0.2, eta: 1 })).toEqual([]);
    expect(ladderResonances(exact, { multiplets, chargingEnergyV: 0, eta })).toEqual([]);
    expect(ladderResonances(exact, { multiplets, chargingEnergyV: 0.2, eta }).map((r) => r.index)).toEqual([1]);
  });

  it("names, for a level's first charging peak, a peak stepping at least its source's step before a nearer weak one (note 5; (g·r + 1)/(g + r) ≥ 1 for r ≥ 1)", () => {
    // A VB doublet |ε| = 0.6 eV stepping 10 pA per peak at Γtip/Γsub = 10: its first peak's resonance
    // carries (2·10 + 1)/(2 + 10) = 1.75 of that step (closed form), found 15 mV above the
    // prediction; a level's weak flank (0.3 of the step) lies 5 mV below it. Both are within
    // tolerance (half the 40 mV FWHM).
    const stepA = 1e-11;
    const resonanceStepA = substrateToTipStepRatio(2, 10) * stepA;
    expect(resonanceStepA / stepA).toBeGreaterThanOrEqual(LADDER_RESONANCES_DEFAULTS.firstResonanceStepMin);
    const at = (biasV: number, step: number) => ({ ...peak(biasV), stepA: step });
    const v1 = [0, 1].map((j) => at(-tip(0.6, j), stepA));
    const first = substrate(0.6, 0);
    const multiplets = [{ band: "VB" as const, degeneracy: null, peakIndices: [0, 1], subgroups: [2] }];
    const peaks = [...v1, at(first - 0.005, 0.3 * stepA), at(first + 0.015, resonanceStepA)];
    const out = ladderResonances(peaks, { multiplets, chargingEnergyV: ecEV / eta, eta });
    expect(out.map((r) => [r.index, r.sourceIndex])).toEqual([[3, 0]]);
    // With no peak stepping enough within tolerance, the weak one is still the resonance.
    const alone = [...v1, at(first - 0.005, 0.3 * stepA), at(first + 0.1, resonanceStepA)];
    expect(ladderResonances(alone, { multiplets, chargingEnergyV: ecEV / eta, eta }).map((r) => [r.index, r.sourceIndex])).toEqual([[2, 0]]);
    // The second charging peak's resonance carries far less (1/(1 + r) of the first): the nearest stands.
    const second = substrate(0.6, 1);
    const later = [...v1, at(second - 0.005, 0.3 * stepA), at(second + 0.015, resonanceStepA)];
    expect(ladderResonances(later, { multiplets, chargingEnergyV: ecEV / eta, eta }).map((r) => [r.index, r.sourceIndex])).toEqual([[2, 1]]);
  });
});

describe("LADDER_RESONANCES_DEFAULTS", () => {
  it("is locked and frozen", () => {
    // closed form: (g·r + 1)/(g + r) at r = 1 is 1 for every g (substrateToTipStepRatio).
    expect(LADDER_RESONANCES_DEFAULTS).toEqual({ firstResonanceStepMin: substrateToTipStepRatio(2, 1) });
    expect(LADDER_RESONANCES_DEFAULTS.firstResonanceStepMin).toBe(1);
    expect(Object.isFrozen(LADDER_RESONANCES_DEFAULTS)).toBe(true);
  });
});
