// Peaks at predicted resonances kept as levels or set aside. Sources: the closed form of the
// shell-filling ladder (orthodox theory: consecutive charging peaks of one level lie Ec/η apart in
// bias, a new level or sub-level Ec/η + Δ/η beyond; C. W. J. Beenakker, Phys. Rev. B 44, 1646
// (1991)) and constructed peak lists; no value here comes from the function under test.
import { describe, it, expect } from "vitest";
import { ladderLevels, LADDER_LEVELS_DEFAULTS } from "../../lib/assign/ladderLevels.ts";

const ecV = 0.3;
const at = (peaks: { biasV: number }[], index: number) => ({ index, sourceIndex: -1, predictedV: peaks[index].biasV, carriersBelow: 0 });
const list = (vs: number[], steps: number[] = vs.map(() => 1e-12)) => vs.map((biasV, k) => ({ biasV, stepA: steps[k] }));

describe("ladderLevels(peaks, predicted, inputs)", () => {
  it("keeps a peak one Ec after a p peak in a p short of 6 and sets aside one closer than 0.7 Ec to its neighbour", () => {
    // p: 2.9, [3.2], 3.6, 3.9, [4.1], 4.6 V — closed form Ec/η = 0.3 V with a sub-level gap of 0.4 V.
    const peaks = list([2.9, 3.2, 3.6, 3.9, 4.1, 4.6], [1, 3, 1, 1, 1, 1].map((s) => s * 1e-12));
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [0, 2, 3, 5] };
    const out = ladderLevels(peaks, [at(peaks, 1), at(peaks, 4)], { multiplets: [p], chargingEnergyV: ecV });
    expect(out.levels.map((l) => [l.resonance.index, l.label])).toEqual([[1, "p"]]);
    expect(out.levels[0].levelStepA).toBe(1e-12); // the median of p's other steps, not the summed 3e-12
    expect(out.resonances.map((r) => r.index)).toEqual([4]);
  });

  it("sets aside a peak on the ladder that steps less than 0.6 × the shell's other steps: it holds no level (its step would be the level's plus the resonance's)", () => {
    // The first case's geometry; the peak at 3.2 V steps 0.5 pA against p's 1 pA, then 0.7 pA
    // (kept). The bound 0.6 is the least step ratio of charging steps in shell filling, r/(1 + r)
    // at the filling limit r = Γtip/Γsub = 1.5 (closed form of the master equation).
    const geometry = [2.9, 3.2, 3.6, 3.9, 4.6];
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [0, 2, 3, 4] };
    const weak = list(geometry, [1, 0.5, 1, 1, 1].map((s) => s * 1e-12));
    const out = ladderLevels(weak, [at(weak, 1)], { multiplets: [p], chargingEnergyV: ecV });
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([1]);
    const enough = list(geometry, [1, 0.7, 1, 1, 1].map((s) => s * 1e-12));
    expect(ladderLevels(enough, [at(enough, 1)], { multiplets: [p], chargingEnergyV: ecV }).levels.map((l) => l.resonance.index)).toEqual([1]);
  });

  it("sets aside a peak one Ec after a full shell's last peak (a new shell starts Ec + Δ beyond, Δ > 0)", () => {
    const peaks = list([1.0, 1.3, 1.6]);
    const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
    const out = ladderLevels(peaks, [at(peaks, 2)], { multiplets: [s], chargingEnergyV: ecV });
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([2]);
  });

  it("of two crowding peaks both at predicted resonances, keeps the one on the ladder (judged first) and sets aside the other", () => {
    // p: 2.0, [2.3], [2.4], 2.6 V: 2.3 is one Ec after 2.0 and one Ec before 2.6; 2.4 is 0.1 V from 2.3.
    const peaks = list([2.0, 2.3, 2.4, 2.6]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [0, 1, 2, 3] };
    const out = ladderLevels(peaks, [at(peaks, 1), at(peaks, 2)], { multiplets: [p], chargingEnergyV: ecV });
    expect(out.levels.map((l) => l.resonance.index)).toEqual([1]);
    expect(out.resonances.map((r) => r.index)).toEqual([2]);
  });

  it("in the VB (no degeneracy) a peak at a predicted resonance stays a resonance, even one Ec from its neighbours", () => {
    const peaks = list([-1.0, -1.3, -1.6]);
    const v = { band: "VB" as const, label: "v1", degeneracy: null, peakIndices: [0, 1, 2] };
    const out = ladderLevels(peaks, [at(peaks, 1)], { multiplets: [v], chargingEnergyV: ecV });
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([1]);
  });
  it("keeps a peak one Ec nearer the gap than a VB gap-edge group of one peak (spin: every level holds two carriers), not one before a group of two", () => {
    // v1 read as −1.3 V alone, the resonance predicted at −1.0 V (one Ec nearer the gap), v2 at −1.9 V.
    const peaks = list([-1.0, -1.3, -1.9]);
    const v1 = { band: "VB" as const, label: "v1", degeneracy: null, peakIndices: [1] };
    const v2 = { band: "VB" as const, label: "v2", degeneracy: null, peakIndices: [2] };
    const one = ladderLevels(peaks, [at(peaks, 0)], { multiplets: [v1, v2], chargingEnergyV: ecV });
    expect(one.levels.map((l) => [l.resonance.index, l.label])).toEqual([[0, "v1"]]);
    // v1 already holding its two charging peaks (−1.3, −1.6 V) needs none.
    const four = list([-1.0, -1.3, -1.6, -2.2]);
    const full = ladderLevels(four, [at(four, 0)], { multiplets: [{ ...v1, peakIndices: [1, 2] }, { ...v2, peakIndices: [3] }], chargingEnergyV: ecV });
    expect(full.levels).toEqual([]);
    expect(full.resonances.map((r) => r.index)).toEqual([0]);
  });

  it("sets aside a peak one Ec below p's first peak when the peak read as d's first lies one Ec beyond p's last (p is full without it)", () => {
    // Closed form Ec/η = 0.3 V: s 1.0, 1.3 V; p 2.2 … 3.7 V (six peaks 0.3 V apart) with a
    // resonance at 1.9 V one Ec below p's first; the first reading took 1.9 V as p1 and p's
    // sixth peak 3.7 V as d's first. The next shell would start Ec + Δ/η beyond 3.4 V, Δ > 0.
    const pV = [2.2, 2.5, 2.8, 3.1, 3.4, 3.7];
    const peaks = list([1.0, 1.3, 1.9, ...pV]);
    const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 4, 5, 6, 7] };
    const d = { band: "CB" as const, label: "d", degeneracy: 10, peakIndices: [8] };
    const out = ladderLevels(peaks, [at(peaks, 2)], { multiplets: [s, p, d], chargingEnergyV: ecV });
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([2]);
    // d's first peak Ec + Δ/η beyond p's fifth (Δ/η = 0.1 V ≫ 5 % of Ec): p needs the peak, it stays a level.
    const apart = list([1.0, 1.3, 1.9, 2.2, 2.5, 2.8, 3.1, 3.5]);
    const d2 = { band: "CB" as const, label: "d", degeneracy: 10, peakIndices: [7] };
    const p2 = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 4, 5, 6] };
    expect(ladderLevels(apart, [at(apart, 2)], { multiplets: [s, p2, d2], chargingEnergyV: ecV }).levels.map((l) => l.resonance.index)).toEqual([2]);
  });

  it("counts the next shell's first peak as the shell's own only within the scatter of the shell's own spacings about Ec (at least 5 % of Ec)", () => {
    // p's own spacings exactly Ec = 0.3 V; d's first peak at 3.4 + 0.3·(1 ± 0.04) continues p, at 3.4 + 0.3·1.08 it does not.
    const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 4, 5, 6, 7] };
    const d = { band: "CB" as const, label: "d", degeneracy: 10, peakIndices: [8] };
    const kept = (lastV: number, pV = [2.2, 2.5, 2.8, 3.1, 3.4]) => {
      const peaks = list([1.0, 1.3, 1.9, ...pV, lastV]);
      return ladderLevels(peaks, [at(peaks, 2)], { multiplets: [s, p, d], chargingEnergyV: ecV }).levels.length;
    };
    expect(kept(3.4 + 0.3 * 1.04)).toBe(0);
    expect(kept(3.4 + 0.3 * 0.96)).toBe(0);
    expect(kept(3.4 + 0.3 * 1.08)).toBe(1);
    // p's own spacings scatter by 0.03 V (10 % of Ec): 8 % off is within that scatter.
    expect(kept(3.43 + 0.3 * 1.08, [2.2, 2.5, 2.83, 3.1, 3.43])).toBe(0);
  });
});

describe("ladderLevels: a peak beside one at a predicted resonance (notes 6 and 7)", () => {
  // Closed form Ec/η = 0.3 V: s 1.0, 1.3 V; p from 2.3 V in steps of 0.3 V; 1 pA per charging step.
  const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };

  it("leaves a peak at a predicted resonance a resonance when a peak beside it sits one Ec before p's next peak and steps like a level", () => {
    // The resonance at 2.25 V (2 pA: level-like step plus resonance) was read as p1; the peak at
    // 2.30 V (1 pA) lies exactly one Ec before p2 at 2.6 V, the resonance 0.05 V off.
    const peaks = list([1.0, 1.3, 2.25, 2.3, 2.6, 2.9, 3.2, 3.5], [1, 1, 2, 1, 1, 1, 1, 1].map((x) => x * 1e-12));
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 4, 5, 6, 7] };
    const out = ladderLevels(peaks, [at(peaks, 2)], { multiplets: [s, p], chargingEnergyV: ecV });
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([2]);
    expect(out.passedOver.map((o) => [o.resonance.index, o.levelIndex])).toEqual([[2, 3]]);
    // A neighbour stepping 2 × the shell's steps (above the 1.3 of one shell's charging steps)
    // holds a resonance too: the peak at the prediction stays the level.
    const strong = list([1.0, 1.3, 2.25, 2.3, 2.6, 2.9, 3.2, 3.5], [1, 1, 2, 2, 1, 1, 1, 1].map((x) => x * 1e-12));
    const kept = ladderLevels(strong, [at(strong, 2)], { multiplets: [s, p], chargingEnergyV: ecV });
    expect(kept.levels.map((l) => l.resonance.index)).toEqual([2]);
    expect(kept.passedOver).toEqual([]);
  });

  it("names a weak peak closer than 0.65 Ec to a kept shared peak as its flank, and not one that steps like a level", () => {
    // p: 2.3, 2.6, [2.9: level + resonance, 2 pA], 3.2, 3.5 with a peak of 0.3 pA at 2.87 V.
    const weak = list([1.0, 1.3, 2.3, 2.6, 2.87, 2.9, 3.2, 3.5], [1, 1, 1, 1, 0.3, 2, 1, 1].map((x) => x * 1e-12));
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 6, 7] };
    const out = ladderLevels(weak, [at(weak, 5)], { multiplets: [s, p], chargingEnergyV: ecV });
    expect(out.levels.map((l) => l.resonance.index)).toEqual([5]);
    expect(out.flanks.map((f) => [f.index, f.sharedIndex])).toEqual([[4, 5]]);
    // 0.7 pA is at least 0.6 × the level's 1 pA (the least charging step ratio in shell filling): no flank.
    const like = list([1.0, 1.3, 2.3, 2.6, 2.87, 2.9, 3.2, 3.5], [1, 1, 1, 1, 0.7, 2, 1, 1].map((x) => x * 1e-12));
    expect(ladderLevels(like, [at(like, 5)], { multiplets: [s, p], chargingEnergyV: ecV }).flanks).toEqual([]);
  });
});

describe("ladderLevels: a shell's last free place (note 8)", () => {
  // Closed form Ec/η = 0.3 V: s 1.0, 1.3 V; p 2.3 … 3.8 V in steps of 0.3 V with p5 (3.5 V) at a
  // predicted resonance, and another predicted resonance just below p1; 1 pA per charging step.
  const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
  const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [3, 4, 5, 6, 8] };
  // The peak below p1 lies 0.015 V (5 % of Ec) below its predicted resonance, drawn down by a
  // level it shares (note 10 would leave it a resonance were it on the prediction).
  const judge = (belowV: number, p5V: number) => {
    const peaks = list([1.0, 1.3, belowV, 2.3, 2.6, 2.9, 3.2, p5V, 3.8], [1, 1, 2, 1, 1, 1, 1, 2, 1].map((x) => x * 1e-12));
    return ladderLevels(peaks, [{ ...at(peaks, 2), predictedV: belowV + 0.015 }, at(peaks, 7)], { multiplets: [s, p], chargingEnergyV: ecV });
  };

  it("gives the place of a peak kept 0.05 V off one Ec to a later one on the ladder", () => {
    // 2.05 V lies 0.25 V before p1 (0.05 V = 17 % of Ec off), 3.5 V exactly one Ec from p4 and p6.
    const out = judge(2.05, 3.5);
    expect(out.levels.map((l) => l.resonance.index)).toEqual([7]);
    expect(out.resonances.map((r) => r.index)).toEqual([2]);
    expect(out.passedOver.map((o) => [o.resonance.index, o.levelIndex])).toEqual([[2, 7]]);
  });

  it("keeps the first when the two lie within 5 % of Ec of each other's fit (the scatter of positions)", () => {
    // 2.005 V is 0.005 V off one Ec before p1, 3.5 V on it: 0.005 V < 0.05 × 0.3 V.
    const out = judge(2.005, 3.5);
    expect(out.levels.map((l) => l.resonance.index)).toEqual([2]);
    expect(out.resonances.map((r) => r.index)).toEqual([7]);
    expect(out.passedOver).toEqual([]);
  });
});

describe("ladderLevels: a shell's first peak and its spin partner (note 10)", () => {
  // Closed form Ec/η = 0.3 V: s 1.0, 1.3 V; p 2.3 … 3.5 V in steps of 0.3 V with p6 missing (p
  // needs a peak), and a peak at a predicted resonance below p1; 1 pA per charging step, 2 pA at
  // the resonance. A shell's first two peaks are one orbital's two electrons, one Ec apart.
  const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
  const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [3, 4, 5, 6, 7] };
  const judge = (belowV: number, predictedV: number) => {
    const peaks = list([1.0, 1.3, belowV, 2.3, 2.6, 2.9, 3.2, 3.5], [1, 1, 2, 1, 1, 1, 1, 1].map((x) => x * 1e-12));
    return ladderLevels(peaks, [{ ...at(peaks, 2), predictedV }], { multiplets: [s, p], chargingEnergyV: ecV });
  };

  it("leaves a peak on its predicted resonance 0.8 Ec before p1 a resonance: p1's spin partner lies one Ec on, not 0.8", () => {
    // 0.24 V = 0.8 Ec < (1 − 0.1) Ec; the peak lies on the prediction (0 V below, < 0.03 Ec).
    const out = judge(2.06, 2.06);
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([2]);
    // Above the prediction (a level below would draw a shared peak down, not up): a resonance too.
    expect(judge(2.06, 2.05).levels).toEqual([]);
  });

  it("keeps it where it lies 0.03 Ec or more below the prediction (a level below draws the shared peak down) or one Ec before p1 to within 10 %", () => {
    // 0.015 V = 0.05 Ec below the prediction.
    expect(judge(2.06, 2.075).levels.map((l) => [l.resonance.index, l.label])).toEqual([[2, "p"]]);
    // 0.006 V = 0.02 Ec below: not told from the prediction's scatter, a resonance.
    expect(judge(2.06, 2.066).levels).toEqual([]);
    // 2.02 V: 0.28 V = 0.93 Ec before p1, within 10 % of Ec, kept on its prediction.
    expect(judge(2.02, 2.02).levels.map((l) => l.resonance.index)).toEqual([2]);
  });

  it("does not apply to a peak with a peak of its shell before it (the gap there is the ladder's own)", () => {
    // p's first peak 2.3 V set aside in the shell; the peak at 2.6 V at a prediction lies 0.3 V on.
    const peaks = list([1.0, 1.3, 2.3, 2.6, 2.84, 3.2, 3.5], [1, 1, 1, 2, 1, 1, 1].map((x) => x * 1e-12));
    const p2 = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 4, 5, 6] };
    const out = ladderLevels(peaks, [at(peaks, 3)], { multiplets: [s, p2], chargingEnergyV: ecV });
    expect(out.levels.map((l) => l.resonance.index)).toEqual([3]);
  });
});

describe("LADDER_LEVELS_DEFAULTS", () => {
  it("is locked and frozen", () => {
    // common practice (no source): peak positions scatter by a few % of Ec at the benchmark's noise.
    expect(LADDER_LEVELS_DEFAULTS).toEqual({ continuationToleranceMin: 0.05, firstPairTolerance: 0.1, sharedPullMin: 0.03 });
    expect(Object.isFrozen(LADDER_LEVELS_DEFAULTS)).toBe(true);
  });
});
