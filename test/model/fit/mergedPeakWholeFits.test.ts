// mergedPeakWholeFits: the CB ladders in filling order matched to the peaks among second-junction
// resonances. The peak lists are built from the closed form of the orthodox ladder in filling order
// (level j's n-th charging peak at (ε_j + Ec·(N_j + n − ½))/η, N_j the electrons below it) with
// resonances added: one alone below s, two merged into s's peaks (each pulling the peak found by
// a few tens of mV) and two alone between s and p; the whole-curve stage is checked with a run
// function that stands in for Levenberg–Marquardt (each start's reduced χ² set by hand).
import { describe, it, expect } from "vitest";
import { matchedLadderReadings, mergedPeakWholeFits, MERGED_PEAK_DEFAULTS } from "../../../lib/model/fit/mergedPeakWholeFits.ts";
import type { FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import { standInPickingContext } from "../../helpers/standInWholeFit.ts";

// s at 1.0 eV, p (whole, 6) at 1.35 eV, Ec 0.11 eV, η 0.55 (closed form above): Ec/η 0.2 V.
const eta = 0.55;
const ecEV = 0.11;
const ecV = ecEV / eta;
const peak = (epsEV: number, n: number) => (epsEV + ecEV * (n - 0.5)) / eta;
const s = [peak(1.0, 1), peak(1.0, 2)];
const p = [3, 4, 5, 6, 7, 8].map((n) => peak(1.35, n));
// s's peaks as found, each merged with a resonance; resonances alone below s and between s and p.
const sMerged = [s[0] + 0.02, s[1] + 0.04];
const aloneV = [s[0] - 0.22, s[1] + 0.27, s[1] + 0.52];
const cbPeaksV = [...aloneV, ...sMerged, ...p];
const topV = p[5] + 0.3;
const firstPeaks = (r: { cb: { firstPeakV: number }[] }) => r.cb.map((x) => x.firstPeakV);

describe("matchedLadderReadings(cbPeaksV, layout, chargingEnergyV, topV)", () => {
  it("MERGED_PEAK_DEFAULTS are locked", () => {
    expect(MERGED_PEAK_DEFAULTS).toEqual({ pLayouts: [[6], [2, 4], [2, 2, 2]], matchFraction: 0.3, maxPassed: 3, readingsPerLayout: 2, maxBudgetSpent: 0.8 });
    expect(Object.isFrozen(MERGED_PEAK_DEFAULTS)).toBe(true);
  });

  it("reads s at the merged peaks and p at its own entry, passing over the resonances alone; each start sits on its level (closed form, filling order)", () => {
    const readings = matchedLadderReadings(cbPeaksV, [2, 6], ecV, topV);
    const right = readings.find((r) => r.cb[0].firstPeakV === sMerged[0]);
    expect(right && firstPeaks(right)).toEqual([sMerged[0], p[0]]);
    expect(right?.cb.map((x) => [x.label, x.degeneracy, x.before])).toEqual([["s", 2, 0], ["p", 6, 2]]);
    expect(right?.passed).toBe(3);
    // ε = η·V − Ec·(before + ½): p exactly, s within the merged resonance's pull (η × 20 mV).
    expect(eta * right!.cb[1].firstPeakV - ecEV * 2.5).toBeCloseTo(1.35, 12);
    expect(Math.abs(eta * right!.cb[0].firstPeakV - ecEV * 0.5 - 1.0)).toBeLessThan(eta * 0.021);
    // No reading enters p at a resonance alone: its ladder's peaks are not there.
    for (const r of readings) expect(r.cb[1].firstPeakV).toBe(p[0]);
    // Fewest peaks passed over first.
    expect(readings.map((r) => r.passed)).toEqual([...readings.map((r) => r.passed)].sort((a, b) => a - b));
  });

  it("a split p: the level of four enters after the doublet's two charging peaks (closed form: p1 and p2 at 1.35 eV enter two Ec/η apart)", () => {
    const readings = matchedLadderReadings(cbPeaksV, [2, 2, 4], ecV, topV);
    const right = readings.find((r) => firstPeaks(r).join() === [sMerged[0], p[0], p[2]].join());
    expect(right?.cb.map((x) => x.before)).toEqual([0, 2, 4]);
    // A doublet entered at a resonance alone, a second resonance within the match of its second peak, is read too; the fit tells them apart.
    expect(readings.every((r) => r.cb.every((x) => x.degeneracy !== 4 || p.includes(x.firstPeakV)))).toBe(true);
  });

  it("places a p sub-level without peaks midway between the equal sub-levels on either side, once per reading (closed form: equal sub-levels enter equally spaced)", () => {
    // p split 2+2+2 at 1.30, 1.45, 1.60 eV; p2's charging peaks unseen.
    const p1 = [3, 4].map((n) => peak(1.3, n));
    const p3 = [7, 8].map((n) => peak(1.6, n));
    const readings = matchedLadderReadings([...s, ...p1, ...p3], [2, 2, 2, 2], ecV, p3[1] + 0.3);
    const withP2 = readings.find((r) => r.cb.length === 4);
    expect(withP2?.cb.map((x) => [x.label, x.before])).toEqual([["s", 0], ["p1", 2], ["p2", 4], ["p3", 6]]);
    // ε = η·V − Ec·(before + ½) gives back every level, p2's included.
    withP2!.cb.forEach((x, j) => expect(eta * x.firstPeakV - ecEV * (x.before + 0.5)).toBeCloseTo([1.0, 1.3, 1.45, 1.6][j], 12));
    expect(withP2?.passed).toBe(0);
    // The reading without it (p3's peaks taken for p2's) is there too; no reading places two levels without peaks.
    expect(readings.some((r) => r.cb.length === 3 && r.cb[2].firstPeakV === p3[0])).toBe(true);
    expect(readings.every((r) => r.cb.filter((x) => ![...s, ...p1, ...p3].includes(x.firstPeakV)).length <= 1)).toBe(true);
    // Not between s and p1 (s is no p sub-level): with p1's peaks unseen no 4-level reading is made.
    expect(matchedLadderReadings([...s, ...p3], [2, 2, 2, 2], ecV, p3[1] + 0.3).some((r) => r.cb.length === 4)).toBe(false);
  });

  it("keeps a ladder whose last charging peaks lie past the window's end, and leaves out levels past the last peak", () => {
    const cut = matchedLadderReadings(cbPeaksV.filter((v) => v < p[3]), [2, 6], ecV, p[3] - 0.05);
    expect(cut.some((r) => firstPeaks(r).join() === [sMerged[0], p[0]].join())).toBe(true);
    const sOnly = matchedLadderReadings([...aloneV, ...sMerged], [2, 6], ecV, topV);
    expect(sOnly.every((r) => r.cb.length >= 2)).toBe(true);
  });

  it("returns no reading without peaks or a positive Ec/η, nor where a level's charging peaks are not there (spacing twice the ladder's)", () => {
    expect(matchedLadderReadings([], [2, 6], ecV, topV)).toEqual([]);
    expect(matchedLadderReadings(cbPeaksV, [2, 6], 0, topV)).toEqual([]);
    const sparse = [1.0, 1.4, 2.0, 2.4, 2.8];
    expect(matchedLadderReadings(sparse, [2, 6], 0.2, 3.0)).toEqual([]);
  });
});

describe("mergedPeakWholeFits(context)", () => {
  const vbV = [-1.4, -1.4 - ecV];
  const analysis = {
    peaks: [...vbV.map((biasV) => ({ biasV, role: "level", stepA: 10e-12 })), ...cbPeaksV.map((biasV) => ({ biasV, role: aloneV.includes(biasV) ? "second-junction" : "level", stepA: 10e-12 }))],
    conductance: { biasV: [-3, topV] },
    assignment: { multiplets: [], evidence: { secondJunction: [] } },
  };
  const vb = [{ band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.4, before: 0 }];
  // The rules' ladder: a resonance alone taken for s, s's merged peaks for p.
  const ladder = { name: "ladder-filling 2+6", kind: "ladder-filling", label: "ladder", analysis, seeds: [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: aloneV[0], before: 0 }, { band: "CB", label: "p", degeneracy: 6, firstPeakV: sMerged[1], before: 2 }, ...vb], vbReadings: [vb], cbDegeneracies: [2, 6], states: 21, chargingEnergyStartEV: 0.2, rateRatioStartLog10: 1 } as unknown as FitHypothesis;
  const context = (chiOf: (h: FitHypothesis) => number) => ({ ...standInPickingContext(chiOf, ecEV, eta, [ladder]), vbPeaksV: vbV });
  const right = (h: FitHypothesis) => h.seeds.filter((x) => x.band === "CB").map((x) => x.firstPeakV).join() === [sMerged[0], p[0]].join();

  it("takes s at the merged peaks where that reading alone describes the curve, Ec started from the VB doublet's spacing (one Ec/η in shell filling)", () => {
    const found = mergedPeakWholeFits(context((h) => (right(h) ? 1.0 : 12)));
    expect(found?.whole.hypothesis.name).toContain(`s at ${sMerged[0].toFixed(3)} V`);
    expect(found?.whole.hypothesis.chargingEnergyStartEV).toBeCloseTo(ecEV, 12);
    // The VB read as a doublet and a level of four in filling order comes first.
    expect(found?.whole.hypothesis.vbReadings[0][0]).toMatchObject({ degeneracy: 2, firstPeakV: -1.4, before: 0 });
  });

  it("returns null where no reading describes the curve, and without a filling ladder", () => {
    expect(mergedPeakWholeFits(context(() => 12))).toBeNull();
    expect(mergedPeakWholeFits({ ...context(() => 1), hypotheses: [] })).toBeNull();
  });
});
