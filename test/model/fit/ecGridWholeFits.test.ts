// ecGridWholeFits: whole-curve fits from a grid of Ec starts, the peaks read by each Ec's ladder.
// The peak lists are built from the closed form of the orthodox ladder in filling order (a CB
// level's n-th charging peak at (ε + Ec·(N + n − ½))/η, a VB level's at −(|ε| + Ec·(N + n − ½))/η,
// N the carriers of the full levels nearer the gap) with some charging peaks left out; the
// whole-curve stage is checked with a run function that stands in for Levenberg–Marquardt (each
// start's reduced χ² set by hand).
import { describe, it, expect } from "vitest";
import { ecGridStartsEV, ecGridWholeFits, ecValenceReadings, EC_GRID_DEFAULTS } from "../../../lib/model/fit/ecGridWholeFits.ts";
import type { FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import { standInPickingContext } from "../../helpers/standInWholeFit.ts";

// s (2) at 1.073 eV, p split 2+2+2 at 1.351, 1.428, 1.505 eV; VB doublet at 0.732 eV and level of four at 0.985 eV; Ec 0.192 eV, η 0.63.
const eta = 0.63;
const ecEV = 0.192;
const cbPeak = (epsEV: number, before: number, n: number) => (epsEV + ecEV * (before + n - 0.5)) / eta;
const vbPeak = (epsEV: number, before: number, n: number) => -(epsEV + ecEV * (before + n - 0.5)) / eta;
// Seen: s's first peak, each p sub-level's first (their second ones and s's second unseen).
const cbSeenV = [cbPeak(1.073, 0, 1), cbPeak(1.351, 2, 1), cbPeak(1.428, 4, 1), cbPeak(1.505, 6, 1)];
// Seen: the doublet's first peak, the level of four's second and fourth (its first unseen).
const vbSeenV = [vbPeak(0.732, 0, 1), vbPeak(0.985, 2, 2), vbPeak(0.985, 2, 4)];

describe("ecGridStartsEV(cbPeaksV, vbPeaksV, eta)", () => {
  it("EC_GRID_DEFAULTS are locked", () => {
    expect(EC_GRID_DEFAULTS).toEqual({ gapFraction: 0.25, gridSteps: 8, pLayouts: [[6], [2, 4], [2, 2, 2]], screenIterations: 2, exploredStarts: 4, maxReadingStates: 100, maxBudgetSpent: 0.75 });
    expect(Object.isFrozen(EC_GRID_DEFAULTS)).toBe(true);
  });

  it("spaces the starts evenly up to a quarter of the gap η·(first CB peak − first VB peak) (Ec below 0.25 × the gap: common practice, no source)", () => {
    const starts = ecGridStartsEV([2.2, 1.5, -0.3], [-1.1, -1.6, 0.4], 0.6, { gapFraction: 0.25, gridSteps: 4 });
    // Gap 0.6 × (1.5 + 1.1) = 1.56 eV; a quarter 0.39 eV in four steps.
    expect(starts).toHaveLength(4);
    [0.0975, 0.195, 0.2925, 0.39].forEach((v, k) => expect(starts[k]).toBeCloseTo(v, 12));
  });

  it("gives nothing without a peak on either side", () => {
    expect(ecGridStartsEV([], [-1.1], 0.6)).toEqual([]);
    expect(ecGridStartsEV([1.5], [], 0.6)).toEqual([]);
  });
});

describe("ecValenceReadings(vbPeaksV, chargingEnergyV)", () => {
  it("reads the level of four with its first peak unseen: the start ε = η·|V| − Ec·(N + 1 + ½) sits on it (closed form, filling order)", () => {
    const readings = ecValenceReadings(vbSeenV, ecEV / eta);
    expect(readings.map((r) => r.map((s) => [s.label, s.degeneracy, s.before]))).toEqual([
      [["v1", 2, 0], ["v2", 4, 2]],
      [["v1", 2, 1], ["v2", 4, 2]],
      [["v1", 2, 0], ["v2", 4, 3]],
    ]);
    const unseen = readings[2];
    expect(eta * Math.abs(unseen[0].firstPeakV) - ecEV * (unseen[0].before + 0.5)).toBeCloseTo(0.732, 12);
    expect(eta * Math.abs(unseen[1].firstPeakV) - ecEV * (unseen[1].before + 0.5)).toBeCloseTo(0.985, 12);
    // Read as its first peak (filling order), the level starts one Ec off.
    expect(eta * Math.abs(readings[0][1].firstPeakV) - ecEV * 2.5).toBeCloseTo(0.985 + ecEV, 12);
  });

  it("gives nothing without peaks or a positive Ec", () => {
    expect(ecValenceReadings([], 0.3)).toEqual([]);
    expect(ecValenceReadings(vbSeenV, 0)).toEqual([]);
  });
});

describe("ecGridWholeFits(context)", () => {
  const analysis = { source: "closed form", peaks: [...cbSeenV, ...vbSeenV].map((biasV) => ({ biasV })), assignment: { evidence: { secondJunction: [] } } };
  const vb = [{ band: "VB", label: "v1", degeneracy: 2, firstPeakV: vbSeenV[0], before: 0 }];
  // The compared ladder reads the peaks at another Ec (its VB reading the first spacing): 2+6 from p1's first peak.
  const ladder = { name: "ladder-filling 2+6", kind: "ladder-filling", label: "ladder", analysis, seeds: [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: cbSeenV[0], before: 0 }, { band: "CB", label: "p", degeneracy: 6, firstPeakV: cbSeenV[1], before: 2 }, ...vb], vbReadings: [vb], cbDegeneracies: [2, 6], states: 21, chargingEnergyStartEV: eta * (vbSeenV[0] - vbSeenV[1]), rateRatioStartLog10: 1 } as unknown as FitHypothesis;
  // Only the true reading started within 10 % of the true Ec describes the curve (the model predicts the unseen peaks' steps).
  const truthChi = (h: FitHypothesis) => {
    const cb = h.seeds.filter((s) => s.band === "CB").map((s) => `${s.degeneracy}/${s.before}`).join(" ");
    const vbRead = h.seeds.filter((s) => s.band === "VB").map((s) => `${s.degeneracy}/${s.before}`).join(" ");
    return cb === "2/0 2/2 2/4 2/6" && vbRead === "2/0 4/3" && Math.abs((h.chargingEnergyStartEV ?? 0) - ecEV) < 0.1 * ecEV ? 1.0 : 12;
  };

  it("finds the 2+2+2+2 ladder with the level of four's first peak unseen from the grid start nearest Ec (gap 0.63 × (1.856 + 1.314) V = 1.997 eV; 3/8 of its quarter 0.187 eV)", () => {
    const found = ecGridWholeFits(standInPickingContext(truthChi, ecEV, eta, [ladder]));
    expect(found).not.toBeNull();
    const h = found!.whole.hypothesis;
    expect(h.chargingEnergyStartEV).toBeCloseTo((3 / 8) * 0.25 * eta * (cbSeenV[0] - vbSeenV[0]), 12);
    expect(h.seeds.map((s) => s.firstPeakV)).toEqual([...cbSeenV, vbSeenV[0], vbSeenV[1]]);
  });

  it("returns null where no start describes the curve, and without a ladder in filling order", () => {
    expect(ecGridWholeFits(standInPickingContext(() => 12, ecEV, eta, [ladder]))).toBeNull();
    expect(ecGridWholeFits(standInPickingContext(truthChi, ecEV, eta, [{ ...ladder, kind: "ladder-empty" } as FitHypothesis]))).toBeNull();
  });

  it("screens every grid start for screenIterations and explores only the exploredStarts best", () => {
    const context = standInPickingContext(truthChi, ecEV, eta, [ladder]);
    const iterations: number[] = [];
    const run = context.run;
    ecGridWholeFits({ ...context, run: (h, r, it, from, set) => (iterations.push(it), run(h, r, it, from, set)) });
    const screens = iterations.filter((it) => it === EC_GRID_DEFAULTS.screenIterations).length;
    expect(screens).toBeGreaterThan(EC_GRID_DEFAULTS.gridSteps); // several readings per Ec
    expect(iterations.filter((it) => it === 8)).toHaveLength(EC_GRID_DEFAULTS.exploredStarts);
  });
});
