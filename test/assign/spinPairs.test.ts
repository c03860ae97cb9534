// p read again as three spin pairs. Positions are closed forms of the constant-interaction model
// (orthodox theory of the double-barrier junction): the two electrons of one orbital charge Ec
// apart, so their peaks lie Ec_V = Ec/η apart, and the next orbital's first peak Ec_V + Δ/η beyond.
import { describe, it, expect } from "vitest";
import { spinPairSet, SPIN_PAIRS_DEFAULTS } from "../../lib/assign/spinPairs.ts";

const pA = 1e-12;
// Ec_V = 0.2 V: s at 2.0, 2.2 V; p's orbitals at 2.7/2.9 (Δ/η = 0.3 V after s), 3.2/3.4
// (Δ/η = 0.1 V) and 3.6/3.8 V (Δ = 0: the 2 + 4 split).
const S = [2.0, 2.2];
const P = [2.7, 2.9, 3.2, 3.4, 3.6, 3.8];
const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
const pOf = (peakIndices: number[]) => ({ band: "CB" as const, label: "p", degeneracy: 6, peakIndices });
// The peak list: s, p and extra peaks (position V, step in level steps), sorted by bias.
const listOf = (extra: [number, number][]) => {
  const all: [number, number][] = [...S.map((v) => [v, 1] as [number, number]), ...P.map((v) => [v, 1] as [number, number]), ...extra].sort((a, b) => a[0] - b[0]);
  return all.map(([biasV, steps]) => ({ biasV, stepA: steps * pA }));
};
const indexOf = (peaks: { biasV: number }[], v: number) => peaks.findIndex((q) => Math.abs(q.biasV - v) < 1e-9);

describe("spinPairSet(peaks, { multiplets, resonant })", () => {
  it("reads p's six peaks as three pairs Ec_V wide where a resonance was counted in p for a level", () => {
    // A resonance at 3.06 V (stepping 2 levels) read in p, p's 3.2 V peak left out.
    const peaks = listOf([[3.06, 2]]);
    const res = indexOf(peaks, 3.06);
    const read = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
    const got = spinPairSet(peaks, { multiplets: [s, pOf(read)], resonant: new Set([res]) })!;
    expect(got.members.map((i) => peaks[i].biasV)).toEqual(P);
    expect(got.leftOut).toEqual([res]);
    expect(got.chargingEnergyV).toBeCloseTo(0.2, 12);
    for (const d of got.pairDeviations) expect(Math.abs(d)).toBeLessThan(1e-9);
    expect(got.levelStepA).toBe(pA);
  });

  it("leaves p that is already three pairs, and p without a resonance beyond s (the rules' reading stands)", () => {
    const peaks = listOf([[3.06, 2]]);
    const p = P.map((v) => indexOf(peaks, v));
    expect(spinPairSet(peaks, { multiplets: [s, pOf(p)], resonant: new Set([indexOf(peaks, 3.06)]) })).toBeNull();
    const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
    expect(spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant: new Set() })).toBeNull();
  });

  it("does not leave out a peak stepping like a level that nothing explains", () => {
    // 3.06 V steps like one level (× 1) and is no resonance: pairs cannot skip it.
    const peaks = listOf([[3.06, 1]]);
    const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
    const res = indexOf(peaks, 3.8);
    expect(spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant: new Set([res]) })).toBeNull();
  });

  it("leaves out a peak stepping more than fillingStepRatio[1] (1.3) × a level, or less than [0] (0.6) ×", () => {
    for (const steps of [2, 0.3]) {
      const peaks = listOf([[3.06, steps], [4.5, 2]]);
      const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
      const got = spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant: new Set([indexOf(peaks, 4.5)]) });
      expect(got?.members.map((i) => peaks[i].biasV), `extra step ${steps}`).toEqual(P);
    }
  });

  it("takes a peak at a resonance into p only if it steps at least fillingStepRatio[0] (0.6) × the level", () => {
    // p's 3.2 V peak is at a resonance: as a shared peak (× 2.5) it is p's; stepping × 0.4 it holds no level.
    for (const [steps, expected] of [[2.5, P], [0.4, null]] as const) {
      const peaks = listOf([[3.06, 2]]).map((q) => (Math.abs(q.biasV - 3.2) < 1e-9 ? { ...q, stepA: steps * pA } : q));
      const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
      const got = spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant: new Set([indexOf(peaks, 3.06), indexOf(peaks, 3.2)]) });
      expect(got ? got.members.map((i) => peaks[i].biasV) : null, `step ${steps}`).toEqual(expected);
    }
  });

  it("takes a peak that is no resonance into p only if it steps at least memberStepMin (0.4) × the level", () => {
    // p's 3.8 V peak steps × 0.5 (kept) or × 0.3 (a flank, not a charging peak).
    for (const [steps, expected] of [[0.5, P], [0.3, null]] as const) {
      const peaks = listOf([[3.06, 2]]).map((q) => (Math.abs(q.biasV - 3.8) < 1e-9 ? { ...q, stepA: steps * pA } : q));
      const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
      const got = spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant: new Set([indexOf(peaks, 3.06)]) });
      expect(got ? got.members.map((i) => peaks[i].biasV) : null, `step ${steps}`).toEqual(expected);
    }
  });

  it("leaves out a peak stepping like a level closer than splitHalfFraction (0.65) × Ec_V to a member at a resonance, only then", () => {
    // p's 3.2 V peak is at a resonance and a peak at 3.24 V (0.2 Ec_V on, stepping like a level) is
    // its other half split apart (no two charging peaks lie closer than Ec_V: closed form).
    const peaks = listOf([[3.06, 2], [3.24, 1]]);
    const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
    const resonant = new Set([indexOf(peaks, 3.06), indexOf(peaks, 3.2)]);
    const got = spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant });
    expect(got?.members.map((i) => peaks[i].biasV)).toEqual(P);
    expect(got?.leftOut.map((i) => peaks[i].biasV)).toEqual([3.06, 3.24]);
    // With 3.2 V no resonance, nothing explains 3.24 V: no set skips it.
    expect(spinPairSet(peaks, { multiplets: [s, pOf(broken)], resonant: new Set([indexOf(peaks, 3.06)]) })).toBeNull();
  });

  it("leaves out p as read when it is one peak before the set, and only then", () => {
    // p read as a lone peak at 2.42 V (stepping like a level; its spin partner would lie 0.2 V on),
    // p's six peaks read as the next shell; a resonance at 3.06 V.
    const peaks = listOf([[2.42, 1], [3.06, 2]]);
    const resonant = new Set([indexOf(peaks, 3.06)]);
    const got = spinPairSet(peaks, { multiplets: [s, pOf([indexOf(peaks, 2.42)])], resonant });
    expect(got?.members.map((i) => peaks[i].biasV)).toEqual(P);
    // Read with p's peaks after it, 2.42 V is one of six: nothing explains it, no set skips it.
    const six = [2.42, 2.7, 2.9, 3.06, 3.4, 3.6].map((v) => indexOf(peaks, v));
    expect(spinPairSet(peaks, { multiplets: [s, pOf(six)], resonant })).toBeNull();
  });

  it("needs an s doublet and a p of degeneracy 6", () => {
    const peaks = listOf([[3.06, 2]]);
    const broken = [2.7, 2.9, 3.06, 3.4, 3.6, 3.8].map((v) => indexOf(peaks, v));
    const resonant = new Set([indexOf(peaks, 3.06)]);
    expect(spinPairSet(peaks, { multiplets: [pOf(broken)], resonant })).toBeNull();
    expect(spinPairSet(peaks, { multiplets: [{ ...s, peakIndices: [0] }, pOf(broken)], resonant })).toBeNull();
  });

  it("SPIN_PAIRS_DEFAULTS are locked", () => {
    expect(SPIN_PAIRS_DEFAULTS).toEqual({ readTolerance: 0.2, pairTolerance: 0.25, memberStepMin: 0.4, splitHalfFraction: 0.65, maxCandidates: 12, unpredictedReach: 0.5 });
  });
});
