// laterEntryWholeFits: the VB level of four entered at each later VB peak. The peak lists are
// built from the closed form of the orthodox ladder in filling order (a level's n-th charging peak
// at (|ε| + Ec·(N + n − ½))/η with N the holes already in the dot) with one peak added that is not
// on it (a second-junction resonance); the whole-curve stage is checked with a run function that
// stands in for Levenberg–Marquardt (each start's reduced χ² set by hand).
import { describe, it, expect } from "vitest";
import { laterEntryWholeFits, laterFourEntryReadings, LATER_ENTRY_WHOLE_DEFAULTS } from "../../../lib/model/fit/laterEntryWholeFits.ts";
import type { FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import type { DataSet, FitTrial } from "../../../lib/model/fit/fitTrial.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";
import { standInWholeFields } from "../../helpers/standInWholeFit.ts";

// A doublet at |ε₁| 0.85 eV and a level of four at |ε₂| 1.15 eV, Ec 0.15 eV, η 0.62 (closed form above).
const eta = 0.62;
const ecEV = 0.15;
const peak = (epsEV: number, n: number) => -(epsEV + ecEV * (n - 0.5)) / eta;
const doublet = [peak(0.85, 1), peak(0.85, 2)];
const four = [3, 4, 5, 6].map((n) => peak(1.15, n));
const resonanceV = (doublet[1] + four[0]) / 2;
const vbPeaksV = [...four, resonanceV, ...doublet];

describe("laterFourEntryReadings(vbPeaksV)", () => {
  it("LATER_ENTRY_WHOLE_DEFAULTS are locked", () => {
    expect(LATER_ENTRY_WHOLE_DEFAULTS).toEqual({ lastEntryPeak: 6 });
    expect(Object.isFrozen(LATER_ENTRY_WHOLE_DEFAULTS)).toBe(true);
  });

  it("enters the level of four at each peak from the third from the gap, after the doublet's two (closed form, filling order)", () => {
    const readings = laterFourEntryReadings(vbPeaksV);
    // Peaks outward: doublet ×2, the resonance, then the level of four's: entries at peaks 3 … 6.
    expect(readings.map((r) => r[1].firstPeakV)).toEqual([resonanceV, four[0], four[1], four[2]]);
    for (const r of readings) {
      expect(r.map((s) => [s.degeneracy, s.before])).toEqual([[2, 0], [4, 2]]);
      expect(r[0].firstPeakV).toBe(doublet[0]);
    }
  });

  it("holds the true reading though a resonance lies between the doublet and the level of four", () => {
    const readings = laterFourEntryReadings(vbPeaksV);
    expect(readings.some((r) => r[0].firstPeakV === doublet[0] && r[1].firstPeakV === four[0])).toBe(true);
  });

  it("gives nothing with fewer than three VB peaks, and stops at lastEntryPeak", () => {
    expect(laterFourEntryReadings(doublet)).toEqual([]);
    expect(laterFourEntryReadings(vbPeaksV, 4).map((r) => r[1].firstPeakV)).toEqual([resonanceV, four[0]]);
  });
});

describe("laterEntryWholeFits(context)", () => {
  const cb: LevelSeed[] = [
    { band: "CB", label: "s", degeneracy: 2, firstPeakV: 1.8, before: 0 },
    { band: "CB", label: "p", degeneracy: 6, firstPeakV: 2.7, before: 2 },
  ];
  const countedReading: LevelSeed[] = [
    { band: "VB", label: "v1", degeneracy: 2, firstPeakV: doublet[0], before: 0 },
    { band: "VB", label: "v2", degeneracy: 4, firstPeakV: resonanceV, before: 2 },
  ];
  const hypothesis = { name: "ladder-filling 2+6", kind: "ladder-filling", label: "ladder-filling 2+6", analysis: { peaks: [] }, seeds: [...cb, ...countedReading], vbReadings: [countedReading], cbDegeneracies: [2, 6], states: 100, chargingEnergyStartEV: ecEV, rateRatioStartLog10: 1 } as unknown as FitHypothesis;
  const cbSide = { biasV: new Float64Array(0) } as unknown as DataSet;

  function context(chiOfEntryV: (entryV: number) => number) {
    const runs: { entryV: number | null; iterations: number; set: DataSet | undefined }[] = [];
    return {
      runs,
      context: {
        trials: [] as FitTrial[],
        run: (h: FitHypothesis, _r: number | null, iterations: number, from?: number[], set?: DataSet) => {
          const vb = h.seeds.filter((s) => s.band === "VB");
          const entryV = vb.length === 2 ? vb[1].firstPeakV : null;
          runs.push({ entryV, iterations, set });
          const parameters = from ?? [...h.seeds.map((_, j) => 0.5 + 0.1 * j), ecEV, 1, -1.7];
          const chi = set ? 1.1 : entryV === null ? 50 : chiOfEntryV(entryV);
          return { hypothesis: h, bic: chi, side: set ? "CB" : "both", loop: { parameters, chiSquare: chi } } as unknown as FitTrial;
        },
        cbSide,
        eta,
        ...standInWholeFields(),
        hypotheses: [hypothesis],
        vbPeaksV,
      },
    };
  }

  it("tries only the readings the grouping did not hold, and keeps the true entry where it describes the curve", () => {
    const { context: ctx, runs } = context((v) => (v === four[0] ? 1.05 : 25));
    const found = laterEntryWholeFits(ctx);
    // The entry at the resonance was the grouping's own reading: three new ones explored.
    expect(runs.filter((r) => r.iterations === 8 && !r.set).map((r) => r.entryV)).toEqual([four[0], four[1], four[2]]);
    expect(found?.whole.loop.chiSquare).toBe(1.05);
    expect(found?.whole.hypothesis.seeds.filter((s) => s.band === "VB").map((s) => s.firstPeakV)).toEqual([doublet[0], four[0]]);
  });

  it("finds nothing where no entry describes the curve and no p split does", () => {
    const { context: ctx } = context(() => 25);
    expect(laterEntryWholeFits(ctx)).toBeNull();
  });
});
