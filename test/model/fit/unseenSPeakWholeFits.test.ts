// unseenSPeakWholeFits: the CB ladder in filling order read with one of s's two charging peaks
// unseen. The peak lists are built from the closed form of the orthodox ladder in filling order
// (level j's n-th charging peak at (ε_j + Ec·(N_j + n − ½))/η, N_j the electrons below it) with
// one of s's peaks left out; the whole-curve stage is checked with a run function that stands in
// for Levenberg–Marquardt (each start's reduced χ² set by hand).
import { describe, it, expect } from "vitest";
import { cbLadderPeaksV, steplessPeaksV, unseenSPeakReadings, unseenSPeakWholeFits, UNSEEN_S_PEAK_DEFAULTS } from "../../../lib/model/fit/unseenSPeakWholeFits.ts";
import type { FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import { standInPickingContext } from "../../helpers/standInWholeFit.ts";

// s at 0.9 eV, p (whole, 6) at 1.25 eV, Ec 0.15 eV, η 0.62 (closed form above).
const eta = 0.62;
const ecEV = 0.15;
const peak = (epsEV: number, n: number) => (epsEV + ecEV * (n - 0.5)) / eta;
const s = [peak(0.9, 1), peak(0.9, 2)];
const p = [3, 4, 5, 6, 7, 8].map((n) => peak(1.25, n));
const ecV = ecEV / eta;

describe("unseenSPeakReadings(cbPeaksV, layout, chargingEnergyV)", () => {
  it("UNSEEN_S_PEAK_DEFAULTS are locked", () => {
    expect(UNSEEN_S_PEAK_DEFAULTS).toEqual({ pLayouts: [[6], [2, 4]], entryGap: 0.5, laterVbEntries: 2, resonanceEntries: 3, minStepFraction: 0.01 });
    expect(Object.isFrozen(UNSEEN_S_PEAK_DEFAULTS)).toBe(true);
  });

  it("reads s's first peak unseen: s enters one Ec below the first peak seen, and each start sits on its level (closed form, filling order)", () => {
    const [firstUnseen] = unseenSPeakReadings([s[1], ...p], [2, 6], ecV);
    expect(firstUnseen.map((x) => [x.label, x.degeneracy, x.before])).toEqual([["s", 2, 1], ["p", 6, 2]]);
    expect(firstUnseen[0].firstPeakV).toBe(s[1]);
    expect(firstUnseen[1].firstPeakV).toBe(p[0]);
    // ε = η·V − Ec·(before + ½) gives back the levels.
    for (const [x, epsEV] of [[firstUnseen[0], 0.9], [firstUnseen[1], 1.25]] as const) expect(eta * x.firstPeakV - ecEV * (x.before + 0.5)).toBeCloseTo(epsEV, 12);
  });

  it("reads s's second peak unseen: p's entry is the first peak past s's predicted second (closed form)", () => {
    const [, secondUnseen] = unseenSPeakReadings([s[0], ...p], [2, 6], ecV);
    expect(secondUnseen.map((x) => [x.firstPeakV, x.before])).toEqual([[s[0], 0], [p[0], 2]]);
  });

  it("a split p: the level of four enters past the doublet's second charging peak, a peak between them (a resonance) set aside", () => {
    // p1 (2) at 1.25 eV, p2 (4) at 1.40 eV: p2 enters at (1.40 + 4.5·Ec)/η, after p1's two peaks.
    const p1 = [3, 4].map((n) => peak(1.25, n));
    const p2 = [5, 6, 7, 8].map((n) => peak(1.4, n));
    const resonanceV = p1[0] + 0.4 * ecV;
    const [firstUnseen] = unseenSPeakReadings([s[1], p1[0], resonanceV, ...p2], [2, 2, 4], ecV);
    expect(firstUnseen.map((x) => [x.degeneracy, x.firstPeakV, x.before])).toEqual([[2, s[1], 1], [2, p1[0], 2], [4, p2[0], 4]]);
  });

  it("p's peaks all set aside as resonances: p enters at the chosen resonance beyond s, a resonance below s's reach never (closed form, filling order; second-junction resonance at −η·V_v/(1 − η))", () => {
    // A VB peak at −1.3 V has its resonance at 0.62·1.3/0.38 = 2.121 V, between s's second peak and p.
    const vbResonanceV = (eta * 1.3) / (1 - eta);
    const resonancesV = [p[0], vbResonanceV, p[2], s[0] + 0.2 * ecV];
    // Without them the ladder ends at s.
    expect(unseenSPeakReadings(s, [2, 6], ecV)[1].map((x) => x.label)).toEqual(["s"]);
    const readings = [0, 1, 2].map((k) => unseenSPeakReadings(s, [2, 6], ecV, resonancesV, k)[1]);
    expect(readings.map((r) => r.map((x) => [x.label, x.firstPeakV, x.before]))).toEqual([
      [["s", s[0], 0], ["p", vbResonanceV, 2]],
      [["s", s[0], 0], ["p", p[0], 2]],
      [["s", s[0], 0], ["p", p[2], 2]],
    ]);
    // Read from its true entry, p starts on its level: ε = η·V − Ec·(before + ½).
    expect(eta * readings[1][1].firstPeakV - ecEV * 2.5).toBeCloseTo(1.25, 12);
    // A peak seen beyond s wins over every resonance.
    expect(unseenSPeakReadings([...s, p[1]], [2, 6], ecV, resonancesV, 1)[1][1].firstPeakV).toBe(p[1]);
  });

  it("gives nothing without CB peaks or Ec", () => {
    expect(unseenSPeakReadings([], [2, 6], ecV)).toEqual([]);
    expect(unseenSPeakReadings(p, [2, 6], 0)).toEqual([]);
  });
});

describe("steplessPeaksV(peaks, minStepFraction)", () => {
  // Common practice (no source): every charging peak carries a current step, so a peak stepping
  // under a hundredth of the largest is not a level's peak; the threshold is the option given.
  it("sets aside the peaks stepping under the fraction of the largest step, and none without steps measured", () => {
    const peaks = [{ biasV: 1.0, stepA: 2e-11 }, { biasV: 1.1, stepA: 1.9e-13 }, { biasV: 1.2, stepA: 2e-13 }, { biasV: -0.8, stepA: 1e-15 }];
    expect([...steplessPeaksV(peaks, 0.01)].sort()).toEqual([-0.8, 1.1]);
    expect([...steplessPeaksV(peaks, 0.001)]).toEqual([-0.8]);
    expect(steplessPeaksV([{ biasV: 1.0 }, { biasV: 1.1, stepA: null }], 0.01).size).toBe(0);
  });
});

describe("unseenSPeakWholeFits(context)", () => {
  const seen = [s[1], ...p];
  const analysis = { peaks: seen.map((biasV) => ({ biasV })), assignment: { evidence: { secondJunction: [] } } };
  const vb = [{ band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.4, before: 0 }];
  const ladder = { name: "ladder-filling 2+6", kind: "ladder-filling", label: "ladder", analysis, seeds: [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: s[1], before: 0 }, { band: "CB", label: "p", degeneracy: 6, firstPeakV: p[0], before: 2 }, ...vb], vbReadings: [vb], cbDegeneracies: [2, 6], states: 21, chargingEnergyStartEV: eta * (p[0] - s[1]), rateRatioStartLog10: 1 } as unknown as FitHypothesis;
  const context = (chiOf: (h: FitHypothesis) => number) => ({
    ...standInPickingContext(chiOf, ecEV, eta, [ladder]),
    // A VB doublet one Ec/η apart starts Ec.
    vbPeaksV: [-1.4, -1.4 - ecV],
  });

  it("takes the reading with s's first peak unseen where it alone describes the curve", () => {
    const found = unseenSPeakWholeFits(context((h) => (h.seeds[0].before === 1 && h.cbDegeneracies.length === 2 ? 1.0 : 12)));
    expect(found?.whole.hypothesis.seeds[0]).toMatchObject({ firstPeakV: s[1], before: 1 });
    expect(found?.whole.hypothesis.chargingEnergyStartEV).toBeCloseTo(ecEV, 12);
  });

  it("a peak without a current step next to the first VB peak does not start Ec: the VB doublet's spacing does (closed form: its two peaks Ec/η apart; every charging peak carries a step)", () => {
    const satelliteV = -1.409;
    const withSatellite = { peaks: [...seen.map((biasV) => ({ biasV, stepA: 20e-12 })), { biasV: satelliteV, stepA: 0.001e-12 }], assignment: { evidence: { secondJunction: [] } } };
    const base = context((h) => (h.seeds[0].before === 1 && h.cbDegeneracies.length === 2 ? 1.0 : 12));
    const found = unseenSPeakWholeFits({ ...base, hypotheses: [{ ...ladder, analysis: withSatellite } as unknown as FitHypothesis], vbPeaksV: [-1.4, satelliteV, -1.4 - ecV] });
    expect(found?.whole.hypothesis.chargingEnergyStartEV).toBeCloseTo(ecEV, 12);
  });

  it("returns null where no reading describes the curve (the unseen peak's predicted step costs χ²), and without a filling ladder", () => {
    expect(unseenSPeakWholeFits(context(() => 12))).toBeNull();
    expect(unseenSPeakWholeFits({ ...context(() => 1), hypotheses: [] })).toBeNull();
  });
});

describe("cbLadderPeaksV(analysis, setAsideV)", () => {
  // The ladder above (s, p at their closed-form positions), a VB peak at −(0.6 + Ec/2)/η, and a
  // second-junction resonance of a VB level at ε_v/(1 − η) = 0.6/0.38 V (the substrate junction
  // takes 1 − η of the bias; closed form) among p's peaks.
  const resonanceV = 0.6 / (1 - eta);
  const vbV = -(0.6 + ecEV / 2) / eta;
  const peaks = [vbV, ...s, ...p.slice(0, 2), resonanceV, ...p.slice(2)].map((biasV) => ({ biasV }));
  const secondJunction = [{ index: 5 }];

  it("gives the CB ladder's peaks without the labelled resonance, and the resonance apart (exact)", () => {
    expect(peaks[5].biasV).toBe(resonanceV);
    expect(cbLadderPeaksV({ peaks, assignment: { evidence: { secondJunction } } })).toEqual({ cbPeaksV: [...s, ...p], resonancesV: [resonanceV] });
  });

  it("leaves out the peaks set aside by position from the ladder's peaks, not from the resonances (exact)", () => {
    const out = cbLadderPeaksV({ peaks, assignment: { evidence: { secondJunction } } }, new Set([s[1], resonanceV]));
    expect(out).toEqual({ cbPeaksV: [s[0], ...p], resonancesV: [resonanceV] });
  });
});
