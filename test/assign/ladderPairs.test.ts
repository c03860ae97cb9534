// Pairs of peaks at predicted resonances kept as charging peaks of a short CB shell. Sources: the
// closed form of the shell-filling ladder (orthodox theory: consecutive charging peaks of one level
// lie Ec/η apart in bias, a new level or sub-level Ec/η + Δ/η beyond) and of the substrate-side
// resonances (a level's carriers through the substrate junction lie Ec/(1 − η) apart in bias);
// constructed peak lists, no value here from the function under test.
import { describe, it, expect } from "vitest";
import { ladderPairs } from "../../lib/assign/ladderPairs.ts";
import type { LadderLevels } from "../../lib/assign/ladderLevels.ts";

const ecV = 0.2;
const list = (vs: number[], steps: number[] = vs.map(() => 1)) => vs.map((biasV, k) => ({ biasV, stepA: steps[k] * 1e-12 }));
const res = (peaks: { biasV: number }[], index: number) => ({ index, sourceIndex: -1, predictedV: peaks[index].biasV, carriersBelow: 0 });
const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
const split = (resonances: ReturnType<typeof res>[], extra: Partial<LadderLevels> = {}): LadderLevels => ({ resonances, levels: [], flanks: [], passedOver: [], ...extra });

describe("ladderPairs(peaks, split, inputs)", () => {
  it("keeps two peaks at resonances one Ec_V apart, clear of the ladder, as p's first sub-level (p read with 4 of 6)", () => {
    // s 1.6, 1.8 V; p's first sub-level 2.4, 2.6 V; then 3.0, 3.2, 3.5, 3.7 V (Ec_V = 0.2 V, sub-level gaps 0.4 and 0.3 V).
    const peaks = list([1.6, 1.8, 2.4, 2.6, 3.0, 3.2, 3.5, 3.7]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [4, 5, 6, 7] };
    const out = ladderPairs(peaks, split([res(peaks, 2), res(peaks, 3)]), { multiplets: [s, p], chargingEnergyV: ecV });
    expect(out.levels.map((l) => [l.resonance.index, l.label])).toEqual([[2, "p"], [3, "p"]]);
    expect(out.levels[0].levelStepA).toBe(1e-12); // the median step of p's peaks
    expect(out.resonances).toEqual([]);
  });

  it("keeps a pair after p's last peak and none where p is full", () => {
    const peaks = list([1.6, 1.8, 2.4, 2.6, 3.0, 3.2, 3.5, 3.7]);
    const short = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 4, 5] };
    expect(ladderPairs(peaks, split([res(peaks, 6), res(peaks, 7)]), { multiplets: [s, short], chargingEnergyV: ecV }).levels.map((l) => l.resonance.index)).toEqual([6, 7]);
    const full = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 4, 5, 6, 7] };
    const peaks2 = list([1.6, 1.8, 2.4, 2.6, 3.0, 3.2, 3.5, 3.7, 4.1, 4.3]);
    expect(ladderPairs(peaks2, split([res(peaks2, 8), res(peaks2, 9)]), { multiplets: [s, full], chargingEnergyV: ecV }).levels).toEqual([]);
  });

  it("leaves two real resonances of one level (Ec/(1 − η) apart: 0.3 V at η = 0.6, 1.5 Ec_V) as resonances", () => {
    // Ec/(1 − η) = Ec_V·η/(1 − η) = 0.2 × 1.5 = 0.3 V, off Ec_V by 0.5 Ec_V > 0.3 Ec_V.
    const peaks = list([1.6, 1.8, 2.3, 2.6, 3.0, 3.2, 3.5, 3.7]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [4, 5, 6, 7] };
    const out = ladderPairs(peaks, split([res(peaks, 2), res(peaks, 3)]), { multiplets: [s, p], chargingEnergyV: ecV });
    expect(out.levels).toEqual([]);
    expect(out.resonances.map((r) => r.index)).toEqual([2, 3]);
  });

  it("leaves a pair whose second peak is closer than 0.7 Ec_V to the ladder peak after it (no two charging peaks are that close)", () => {
    const peaks = list([1.6, 1.8, 2.6, 2.8, 2.9, 3.1, 3.4, 3.6]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [4, 5, 6, 7] };
    expect(ladderPairs(peaks, split([res(peaks, 2), res(peaks, 3)]), { multiplets: [s, p], chargingEnergyV: ecV }).levels).toEqual([]);
  });

  it("leaves a pair stepping less than 0.6 × the shell's median step (r/(1 + r) at the filling limit r = 1.5): it holds no level", () => {
    const peaks = list([1.6, 1.8, 2.4, 2.6, 3.0, 3.2, 3.5, 3.7], [1, 1, 0.5, 1, 1, 1, 1, 1]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [4, 5, 6, 7] };
    expect(ladderPairs(peaks, split([res(peaks, 2), res(peaks, 3)]), { multiplets: [s, p], chargingEnergyV: ecV }).levels).toEqual([]);
  });

  it("leaves a pair with a free peak beside one of its peaks that steps like a level (only one of two that close is a charging peak)", () => {
    const peaks = list([1.6, 1.8, 2.4, 2.45, 2.6, 3.0, 3.2, 3.5, 3.7]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [5, 6, 7, 8] };
    expect(ladderPairs(peaks, split([res(peaks, 2), res(peaks, 4)]), { multiplets: [s, p], chargingEnergyV: ecV }).levels).toEqual([]);
  });

  it("gives a pair the place of a single level kept this round that crowds it; that peak goes back to the resonances", () => {
    // p 3.0, 3.2, 3.5, 3.7 V with a level kept at 2.75 V (0.25 V before 3.0, within 0.3 Ec_V of
    // one Ec_V: note 2 of ladderLevels), 0.15 V after the pair 2.4, 2.6 V: clear of it (≥ 0.7 Ec_V
    // = 0.14 V), so it stays, p (5 of 6) has room for one more only and the pair is left.
    const clearOf = list([1.6, 1.8, 2.4, 2.6, 2.75, 3.0, 3.2, 3.5, 3.7]);
    const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [4, 5, 6, 7, 8] };
    const kept = (peaks: { biasV: number }[]) => [{ resonance: res(peaks, 4), label: "p", levelStepA: 1e-12, reason: "kept" }];
    expect(ladderPairs(clearOf, split([res(clearOf, 2), res(clearOf, 3)], { levels: kept(clearOf) }), { multiplets: [s, p], chargingEnergyV: ecV }).levels.map((l) => l.resonance.index)).toEqual([4]);
    // At 2.72 V it lies 0.12 V after the pair's second peak: it gives way.
    const crowding = list([1.6, 1.8, 2.4, 2.6, 2.72, 3.0, 3.2, 3.5, 3.7]);
    const out = ladderPairs(crowding, split([res(crowding, 2), res(crowding, 3)], { levels: kept(crowding) }), { multiplets: [s, p], chargingEnergyV: ecV });
    expect(out.levels.map((l) => l.resonance.index)).toEqual([2, 3]);
    expect(out.resonances.map((r) => r.index)).toEqual([4]);
    expect(out.passedOver.map((o) => [o.resonance.index, o.levelIndex])).toEqual([[4, 3]]);
  });

  it("keeps nothing in the VB (no degeneracy) and returns the split unchanged when nothing is found", () => {
    const peaks = list([-2.6, -2.4, -1.8, -1.6]);
    const v = { band: "VB" as const, label: "v1", degeneracy: null, peakIndices: [3, 2] };
    const before = split([res(peaks, 1), res(peaks, 0)]);
    expect(ladderPairs(peaks, before, { multiplets: [v], chargingEnergyV: ecV })).toBe(before);
  });
});
