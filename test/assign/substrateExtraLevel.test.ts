// The weak fourth p peak of a shell-tunnelling reading at low η: a charging peak through the
// substrate junction. Constants from the orthodox theory of the double-barrier junction (the
// substrate-side step over a two-state level's tip-side step, (g·r + 1)/(g + r), closed form).
import { describe, it, expect } from "vitest";
import { deeperPlainResonances, substrateExtraLevel, SUBSTRATE_EXTRA_LEVEL_DEFAULTS } from "../../lib/assign/substrateExtraLevel.ts";

const at = (list: [number, number][]) => list.map(([biasV, stepA]) => ({ biasV, stepA, fwhmV: 0.05 }));
const groups = (p: number[]) => [
  { band: "CB" as const, label: "s", peakIndices: [1] },
  { band: "CB" as const, label: "p", peakIndices: p },
  { band: "VB" as const, label: "v1", peakIndices: [0] },
];
// η = 0.6: the v1 peak at −1.5 V has its resonance at 0.6 × 1.5 / 0.4 = 2.25 V.
const base: [number, number][] = [[-1.5, 2e-13], [1.8, 2e-13], [2.3, 2e-13], [2.4, 2e-13], [2.5, 2e-13]];

describe("substrateExtraLevel(peaks, multiplets, eta)", () => {
  it("sets aside a fourth p peak of one carrier's step beyond the gap-edge level's resonance", () => {
    expect(substrateExtraLevel(at([...base, [2.7, 1e-13]]), groups([2, 3, 4, 5]), 0.6)).toEqual({ index: 5, sourceIndex: 0, predictedV: 2.7 });
  });

  it("leaves p alone at three levels (three p orbitals), at a level's step, or before the resonance", () => {
    expect(substrateExtraLevel(at(base), groups([2, 3, 4]), 0.6)).toBeNull();
    // 0.8 × the other steps: above 13/17.
    expect(substrateExtraLevel(at([...base, [2.7, 1.6e-13]]), groups([2, 3, 4, 5]), 0.6)).toBeNull();
    // The weakest peak below 2.25 V − FWHM/2: no substrate-side step lies there.
    const early = at([[-1.5, 2e-13], [1.8, 2e-13], [2.15, 1e-13], [2.3, 2e-13], [2.4, 2e-13], [2.5, 2e-13]]);
    expect(substrateExtraLevel(early, groups([2, 3, 4, 5]), 0.6)).toBeNull();
    // η = 1: no bias across the substrate junction.
    expect(substrateExtraLevel(at([...base, [2.7, 1e-13]]), groups([2, 3, 4, 5]), 1)).toBeNull();
  });

  it("SUBSTRATE_EXTRA_LEVEL_DEFAULTS: three p orbitals; (g·r + 1)/(g + r) at g = 2, r = 3/7 is 13/17 (closed form)", () => {
    expect(SUBSTRATE_EXTRA_LEVEL_DEFAULTS.pOrbitals).toBe(3);
    expect(SUBSTRATE_EXTRA_LEVEL_DEFAULTS.stepRatioMax).toBeCloseTo(13 / 17, 12);
  });
});

describe("deeperPlainResonances(peaks, resonances, eta)", () => {
  // η = 0.6 (gain 1.5): v1 at −1.5 V is the VB edge, v2 at −2.0 V behind it.
  const peaks = [-2.0, -1.5, 1.4, 2.25, 3.0].map((biasV) => ({ biasV, fwhmV: 0.05 }));
  it("names the plain resonance of a level behind its band's edge, not the edge level's or a moved one", () => {
    const edge = { index: 3, sourceIndex: 1, predictedV: 2.25 };
    const deeper = { index: 4, sourceIndex: 0, predictedV: 3.0 };
    expect(deeperPlainResonances(peaks, [edge, deeper], 0.6)).toEqual([deeper]);
    // A prediction moved by N·Ec/(1 − η) (not the plain one) is not named.
    expect(deeperPlainResonances(peaks, [edge, { ...deeper, predictedV: 3.1 }], 0.6)).toEqual([]);
    expect(deeperPlainResonances(peaks, [edge, deeper], 1)).toEqual([]);
  });

  it("names none where a peak that is no resonance lies within the smaller FWHM: one level split at the prediction", () => {
    // Exact geometry (no source needed): a level peak 0.03 V from the plain prediction 3.0 V, both
    // 0.05 V wide, is within one width; at 0.08 V it is not.
    const edge = { index: 3, sourceIndex: 1, predictedV: 2.25 };
    const deeper = { index: 4, sourceIndex: 0, predictedV: 3.0 };
    const near = [...peaks, { biasV: 2.97, fwhmV: 0.05 }];
    expect(deeperPlainResonances(near, [edge, deeper], 0.6)).toEqual([]);
    const apart = [...peaks, { biasV: 2.92, fwhmV: 0.05 }];
    expect(deeperPlainResonances(apart, [edge, deeper], 0.6)).toEqual([deeper]);
    // A neighbour that is itself a resonance does not count.
    expect(deeperPlainResonances(near, [edge, deeper, { index: 5, sourceIndex: 0, predictedV: 2.97 }], 0.6)).toContainEqual(deeper);
  });
});
