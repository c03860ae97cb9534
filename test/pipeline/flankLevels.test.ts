// Levels beside predicted second-junction resonances, as the pipeline adds them
// (lib/pipeline/flankLevels.ts). The predictions are checked against the closed form of the
// double-barrier junction (orthodox theory): a level entered through the substrate junction into
// the empty dot steps at |V′| = η/(1 − η)·(|V| − N·Ec_V) at the opposite bias. The curve is
// closed-form Gaussian-broadened steps, I = a + b·x + Σ c_k·Φ((x − x_k)/s) (Φ from mathjs.erf),
// with seeded white noise; the positions put in are the check values.
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { flankLevelPeaks, predictedResonancesV, sharedLevelPeaks, sharedReadingStands, FLANK_LEVELS_DEFAULTS } from "../../lib/pipeline/flankLevels.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));
const gauss = (z: number) => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
const peak = (biasV: number, extra: Partial<Peak> = {}): Peak => ({ biasV, biasUncertaintyV: 0.003, index: 0, heightS: 1e-10, prominenceS: 1e-10, fwhmV: 0.07, stepA: 1e-11, snr: 30, stepSignificance: 30, ...extra });

describe("FLANK_LEVELS_DEFAULTS", () => {
  it("is frozen with the documented values", () => {
    expect(Object.isFrozen(FLANK_LEVELS_DEFAULTS)).toBe(true);
    expect(FLANK_LEVELS_DEFAULTS).toEqual({ overlapFwhm: 0.75, edgeFwhm: 1, sameFwhm: 0.25, sharedLevelStepRatio: 0.5, unpredictedStepRatio: 2.5 });
  });
});

describe("predictedResonancesV", () => {
  const eta = 0.6, ecV = 0.2, gain = eta / (1 - eta);
  // VB doublets at −1.0, −1.2 V (N = 0) and −1.6, −1.8 V (N = 2); one CB peak at 0.9 V.
  const peaks = [-1.8, -1.6, -1.2, -1.0, 0.9].map((v) => peak(v));
  const vb = (peakIndices: number[]) => ({ band: "VB" as const, label: "v", degeneracy: null, peakIndices, subgroups: [peakIndices.length] });
  const evidence = { secondJunction: [] };
  it("gives the ladder's η/(1 − η)·(|V| − N·Ec_V) in shell filling (closed form)", () => {
    const got = predictedResonancesV(peaks, { regime: "shell-filling", multiplets: [vb([3, 2]), vb([1, 0])] as never, quantities: { chargingEnergyV: ecV } as never, evidence: evidence as never }, eta, 0.05);
    const want = [1.0, 1.2, 1.6 - 2 * ecV, 1.8 - 2 * ecV].map((v) => gain * v);
    // 1.2·gain and (1.6 − 0.4)·gain coincide: one prediction.
    expect(got.length).toBe(3);
    for (const v of new Set(want.map((x) => x.toFixed(9)))) expect(got.some((g) => Math.abs(g - Number(v)) < 1e-9)).toBe(true);
  });
  it("gives the plain −η·V/(1 − η) of every multiplet peak outside shell filling (closed form)", () => {
    const got = predictedResonancesV(peaks, { regime: "shell-tunneling", multiplets: [vb([3]), vb([4])] as never, quantities: { chargingEnergyV: null } as never, evidence: evidence as never }, eta, 0.05);
    expect(got).toEqual([-gain * 0.9, gain * 1.0]);
  });
  it("is empty at η = 1", () => {
    expect(predictedResonancesV(peaks, { regime: "shell-tunneling", multiplets: [vb([3])] as never, quantities: { chargingEnergyV: null } as never, evidence: evidence as never }, 1, 0.05)).toEqual([]);
  });
});

describe("flankLevelPeaks", () => {
  // η = 0.6, ε = 0.95 eV, Ec = 0.1 eV: the resonance at (0.95 + 0.05)/0.4 = 2.5 V (closed form); a
  // level 0.7 FWHM above it, and another level further out with a peak of its own.
  const fwhmV = 0.07, s = fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
  const resonanceV = (0.95 + 0.05) / (1 - 0.6), levelV = resonanceV + 0.7 * fwhmV;
  const steps: [number, number][] = [[resonanceV, 20e-12], [levelV, 12e-12], [2.85, 15e-12]];
  const n = 1001;
  const biasV = Float64Array.from({ length: n }, (_, i) => 2 + i * 0.001);
  const rng = seededRandom(3);
  const noiseA = 0.3e-12;
  const currentA = biasV.map((v) => 1e-12 + steps.reduce((a, [at, c]) => a + c * phi((v - at) / s), 0) + noiseA * rng.normal());
  const didvS = biasV.map((v) => steps.reduce((a, [at, c]) => a + (c / s) * gauss((v - at) / s), 0));
  const curve = { biasV, currentA, didvS, noiseA, noiseS: 1e-12, floorV: 0.001 };
  // The peak finder's view: one peak between the resonance and the level, and the level at 2.85 V.
  const found = [peak(resonanceV + 0.02, { index: 520 }), peak(2.85, { index: 850 })];

  it("adds the level and moves the merged peak to the resonance", () => {
    const got = flankLevelPeaks(curve, found, [resonanceV], fwhmV, 5);
    expect(got).not.toBeNull();
    expect(got!.length).toBe(3);
    expect(got![0].biasV).toBe(resonanceV);
    expect(Math.abs(got![1].biasV - levelV)).toBeLessThan(0.1 * fwhmV);
    expect(got![2].biasV).toBe(2.85);
    // The added level's step: the Gaussian prominence times 1.0645·FWHM gives it back.
    expect(Math.abs(got![1].stepA - 12e-12)).toBeLessThan(0.15 * 12e-12);
  });
  it("changes nothing where no peak lies at a prediction, or the prediction is near an end", () => {
    expect(flankLevelPeaks(curve, found, [2.2], fwhmV, 5)).toBeNull();
    expect(flankLevelPeaks(curve, [peak(2.99, { index: 990 })], [2.99], fwhmV, 5)).toBeNull();
  });
});

/**
 * A p shell read as three charging peaks (2.2 V, the shared peak, 2.8 V; 15 pA each) whose second
 * holds a level `offsetFwhm` FWHM below a resonance at 2.5 V stepping `resonanceA`; closed-form
 * steps with seeded noise. Positions and steps put in are the check values.
 */
function sharedCurve(offsetFwhm: number, resonanceA: number) {
  const fwhmV = 0.07, s = fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
  const resonanceV = 2.5, levelV = resonanceV - offsetFwhm * fwhmV;
  const steps: [number, number][] = [[2.2, 15e-12], [levelV, 15e-12], [resonanceV, resonanceA], [2.8, 15e-12]];
  const biasV = Float64Array.from({ length: 1001 }, (_, i) => 2 + i * 0.001);
  const rng = seededRandom(7);
  const noiseA = 0.6e-12;
  const currentA = biasV.map((v) => 1e-12 + steps.reduce((a, [at, c]) => a + c * phi((v - at) / s), 0) + noiseA * rng.normal());
  const didvS = biasV.map((v) => steps.reduce((a, [at, c]) => a + (c / s) * gauss((v - at) / s), 0));
  const curve = { biasV, currentA, didvS, noiseA, noiseS: 1e-12, floorV: 0.001 };
  const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [0, 1, 2], subgroups: [3] };
  const filling = { regime: "shell-filling" as const, multiplets: [p] as never };
  return { fwhmV, resonanceV, levelV, curve, p, filling };
}

describe("sharedLevelPeaks", () => {
  // The level 0.6 FWHM below the resonance (15 pA beside 20 pA, one peak, read at 2.485 V).
  const { fwhmV, resonanceV, levelV, curve, p, filling } = sharedCurve(0.6, 20e-12);
  const found = [peak(2.2, { index: 200 }), peak(2.485, { index: 485 }), peak(2.8, { index: 800 })];

  it("replaces the shared peak by the level and the resonance where they were put in", () => {
    const got = sharedLevelPeaks(curve, found, [15e-12, 35e-12, 15e-12], filling, [resonanceV], fwhmV, 5);
    expect(got).not.toBeNull();
    expect(got!.peaks.map((q) => q.biasV).length).toBe(4);
    expect(Math.abs(got!.peaks[1].biasV - levelV)).toBeLessThan(0.05 * fwhmV);
    expect(Math.abs(got!.peaks[2].biasV - resonanceV)).toBeLessThan(0.05 * fwhmV);
    expect(got!.levels.map((l) => [l.peak, l.label])).toEqual([[got!.peaks[1], "p"]]);
  });
  it("changes nothing where the peak steps like one level of its shell, or outside shell filling", () => {
    // 1.3 × the shell's median step (ASSIGN_DEFAULTS.fillingStepRatio[1]) is a level's at most.
    expect(sharedLevelPeaks(curve, found, [15e-12, 19e-12, 15e-12], filling, [resonanceV], fwhmV, 5)).toBeNull();
    expect(sharedLevelPeaks(curve, found, [15e-12, 35e-12, 15e-12], { ...filling, regime: "shell-tunneling" }, [resonanceV], fwhmV, 5)).toBeNull();
    expect(sharedLevelPeaks(curve, found, [15e-12, 35e-12, 15e-12], filling, [2.3], fwhmV, 5)).toBeNull();
  });
  it("places a level stepping at least half the level's share, and none stepping less (note 2)", () => {
    // The put-in level steps 15 pA: 0.56 of a share of 27 pA (the shell's other peaks as read),
    // 0.45 of one of 33 pA; the shared peak steps more than 1.3 × the share in both (note 1).
    const wide = sharedLevelPeaks(curve, found, [27e-12, 40e-12, 27e-12], filling, [resonanceV], fwhmV, 5);
    expect(wide).not.toBeNull();
    expect(Math.abs(wide!.peaks[1].biasV - levelV)).toBeLessThan(0.05 * fwhmV);
    expect(wide!.peaks[1].stepA).toBeGreaterThanOrEqual(FLANK_LEVELS_DEFAULTS.sharedLevelStepRatio * 27e-12);
    expect(sharedLevelPeaks(curve, found, [33e-12, 50e-12, 33e-12], filling, [resonanceV], fwhmV, 5)).toBeNull();
  });
  // The same curve with the shared peak set aside as a resonance (note 4): p holds 2.2 and 2.8 V only.
  const aside = { regime: "shell-filling" as const, multiplets: [{ ...p, peakIndices: [0, 2], subgroups: [1, 1] }] as never, evidence: { secondJunction: [{ index: 1, sourceIndex: -1, predictedV: resonanceV }] } };
  it("refits a peak set aside as a resonance inside a shell as the level and the resonance", () => {
    const got = sharedLevelPeaks(curve, found, [15e-12, 35e-12, 15e-12], aside, [resonanceV], fwhmV, 5);
    expect(got).not.toBeNull();
    expect(got!.peaks.length).toBe(4);
    // The put-in level and resonance, to 5 % of a FWHM (the put-in values, as above).
    expect(Math.abs(got!.peaks[1].biasV - levelV)).toBeLessThan(0.05 * fwhmV);
    expect(Math.abs(got!.peaks[2].biasV - resonanceV)).toBeLessThan(0.05 * fwhmV);
    expect(got!.levels).toEqual([{ peak: got!.peaks[1], label: "p", alternate: got!.peaks[2] }]);
  });
  it("leaves a set-aside peak alone where its shell has no degeneracy or it steps like one level", () => {
    const open = { ...aside, multiplets: [{ ...p, degeneracy: null, peakIndices: [0, 2], subgroups: [1, 1] }] as never };
    expect(sharedLevelPeaks(curve, found, [15e-12, 35e-12, 15e-12], open, [resonanceV], fwhmV, 5)).toBeNull();
    expect(sharedLevelPeaks(curve, found, [15e-12, 19e-12, 15e-12], aside, [resonanceV], fwhmV, 5)).toBeNull();
  });
});

describe("sharedReadingStands", () => {
  // Peaks a–f; before the refit p held a, b and d held e, f, with a shared peak set aside between.
  // Which moves stand is the rule of its note 1 (common practice, no source: a refit that moves
  // other peaks reads something the fit did not show, but for the short shell's own peaks).
  const [a, b, e, f, level, resonance] = [2.8, 2.97, 3.75, 3.94, 3.28, 3.4].map((biasV) => peak(biasV));
  const cb = (label: string, peakIndices: number[]) => ({ band: "CB" as const, label, peakIndices });
  const before = { assignment: { multiplets: [cb("p", [0, 1]), cb("d", [2, 3])] } as never, peaks: [a, b, e, f] };
  const list = [a, b, level, resonance, e, f];
  const intoP = { assignment: { multiplets: [cb("p", [0, 1, 2, 4, 5])] } as never, peaks: list };
  it("lets a later shell's peaks join the short shell that a set-aside peak's level joined", () => {
    expect(sharedReadingStands(before, intoP, [{ peak: level, label: "p", alternate: resonance }])).toBe(true);
    // Its alternate may hold the level instead.
    const viaAlternate = { assignment: { multiplets: [cb("p", [0, 1, 3, 4, 5])] } as never, peaks: list };
    expect(sharedReadingStands(before, viaAlternate, [{ peak: level, label: "p", alternate: resonance }])).toBe(true);
  });
  it("lets the shell give up one peak for each level from a set-aside peak, and no more", () => {
    // p full before (a, b, e, f and two more): the level takes one place, the peak it displaces leaves.
    const [g, h] = [4.1, 4.3].map((biasV) => peak(biasV));
    const full = { assignment: { multiplets: [cb("p", [0, 1, 2, 3, 4, 5])] } as never, peaks: [a, b, e, f, g, h] };
    const next = [a, b, level, resonance, e, f, g, h];
    const oneOut = { assignment: { multiplets: [cb("p", [0, 1, 2, 4, 5, 6])] } as never, peaks: next };
    expect(sharedReadingStands(full, oneOut, [{ peak: level, label: "p", alternate: resonance }])).toBe(true);
    const twoOut = { assignment: { multiplets: [cb("p", [0, 1, 2, 4, 5])] } as never, peaks: next };
    expect(sharedReadingStands(full, twoOut, [{ peak: level, label: "p", alternate: resonance }])).toBe(false);
    expect(sharedReadingStands(full, oneOut, [{ peak: level, label: "p" }])).toBe(false);
  });
  it("keeps the old rule for a level from a shell's own peak, and refuses a level outside its shell", () => {
    expect(sharedReadingStands(before, intoP, [{ peak: level, label: "p" }])).toBe(false);
    const apart = { assignment: { multiplets: [cb("p", [0, 1]), cb("d", [4, 5])] } as never, peaks: list };
    expect(sharedReadingStands(before, apart, [{ peak: level, label: "p", alternate: resonance }])).toBe(false);
    // A peak moving out to a later shell never stands.
    const out = { assignment: { multiplets: [cb("p", [0, 2]), cb("d", [1, 4, 5])] } as never, peaks: list };
    expect(sharedReadingStands(before, out, [{ peak: level, label: "p", alternate: resonance }])).toBe(false);
  });
});

describe("sharedLevelPeaks: a resonance no level predicts (note 5)", () => {
  // The level 0.8 FWHM below the resonance (15 pA beside 25 pA); the only prediction lies far off
  // (2.3 V). The shared peak is read where the put-in steps' conductance is highest.
  const { fwhmV, resonanceV, levelV, curve, filling } = sharedCurve(0.8, 25e-12);
  const { biasV, didvS } = curve;
  let top = 0;
  for (let i = 1; i < biasV.length; i++) if (biasV[i] > 2.4 && biasV[i] < 2.6 && didvS[i] > didvS[top]) top = i;
  const found = [peak(2.2, { index: 200 }), peak(biasV[top], { index: top }), peak(2.8, { index: 800 })];
  it("refits a peak stepping more than 2.5 × the share with the resonance held at the peak", () => {
    const got = sharedLevelPeaks(curve, found, [15e-12, 40e-12, 15e-12], filling, [2.3], fwhmV, 5);
    expect(got).not.toBeNull();
    expect(got!.peaks.length).toBe(4);
    // The put-in level and resonance, to 5 % of a FWHM (the put-in values).
    expect(Math.abs(got!.peaks[1].biasV - levelV)).toBeLessThan(0.05 * fwhmV);
    expect(Math.abs(got!.peaks[2].biasV - resonanceV)).toBeLessThan(0.05 * fwhmV);
    expect(got!.levels.map((l) => [l.peak, l.label])).toEqual([[got!.peaks[1], "p"]]);
  });
  it("leaves a peak stepping no more than 2.5 × the share alone, and one at a prediction to note 1", () => {
    expect(sharedLevelPeaks(curve, found, [15e-12, 37e-12, 15e-12], filling, [2.3], fwhmV, 5)).toBeNull();
    // With a prediction at the peak the refit is note 1's: the same level and resonance.
    const predicted = sharedLevelPeaks(curve, found, [15e-12, 40e-12, 15e-12], filling, [resonanceV], fwhmV, 5);
    expect(Math.abs(predicted!.peaks[1].biasV - levelV)).toBeLessThan(0.05 * fwhmV);
  });
});
