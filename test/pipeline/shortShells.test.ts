// Charging peaks of short filling shells, as the pipeline looks for them
// (lib/pipeline/shortShells.ts). The predictions are checked against the closed form of the
// shell-filling ladder (orthodox theory: one shell's charging peaks Ec_V apart in bias); the curve
// is closed-form Gaussian-broadened steps, I = a + b·x + Σ c_k·Φ((x − x_k)/s) (Φ from mathjs.erf),
// with seeded white noise; the positions put in are the check values.
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { shortShellPredictions, shortShellSteps, shortShellStepKept, SHORT_SHELL_DEFAULTS } from "../../lib/pipeline/shortShells.ts";
import { lowEtaDraw, expectTrueP } from "../helpers/lowEtaDraw.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));
const peak = (biasV: number, extra: Partial<Peak> = {}): Peak => ({ biasV, biasUncertaintyV: 0.003, index: 0, heightS: 1e-10, prominenceS: 1e-10, fwhmV: 0.05, stepA: 1e-11, snr: 30, stepSignificance: 30, ...extra });
const shell = (label: string, degeneracy: number, peakIndices: number[], subgroups = [peakIndices.length]) => ({ band: "CB" as const, label, degeneracy, peakIndices, subgroups });
const filling = (multiplets: ReturnType<typeof shell>[], ecV: number) => ({ regime: "shell-filling" as const, multiplets: multiplets as never, quantities: { chargingEnergyV: ecV } as never });

describe("SHORT_SHELL_DEFAULTS", () => {
  it("is frozen with the documented values", () => {
    expect(Object.isFrozen(SHORT_SHELL_DEFAULTS)).toBe(true);
    expect(SHORT_SHELL_DEFAULTS).toEqual({ reachEc: 0.25, shellGapEc: 0.5, resonanceFwhm: 1, minStepFraction: 0.8 });
  });
});

describe("shortShellPredictions", () => {
  // Ec_V = 0.2 V; s at 1.0, 1.2 V; p from 2.0 V on.
  const ecV = 0.2;
  const ps = (n: number) => Array.from({ length: n }, (_, k) => 2.0 + k * ecV);
  it("predicts one Ec_V beyond the last and before the first peak of a short shell (closed form)", () => {
    const peaks = [1.0, 1.2, ...ps(5)].map((v) => peak(v));
    const got = shortShellPredictions(peaks, filling([shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6])], ecV), [-3, 3.5]);
    expect(got.map((p) => [p.label, p.side])).toEqual([["p", 1], ["p", -1]]);
    expect(got[0].predictedV).toBeCloseTo(2.8 + ecV, 12);
    expect(got[1].predictedV).toBeCloseTo(2.0 - ecV, 12);
  });
  it("predicts at both ends of each sub-group of a split shell (closed form)", () => {
    // p read as 2 + 3: 2.0, 2.2 | 2.6, 2.8, 3.0 (one of the second group's missing).
    const peaks = [1.0, 1.2, 2.0, 2.2, 2.6, 2.8, 3.0].map((v) => peak(v));
    const got = shortShellPredictions(peaks, filling([shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6], [2, 3])], ecV), [-3, 3.5]);
    const want = [2.2 + ecV, 2.0 - ecV, 3.0 + ecV, 2.6 - ecV];
    expect(got.length).toBe(4);
    got.forEach((p, k) => expect(p.predictedV).toBeCloseTo(want[k], 12));
  });
  it("predicts nothing for full shells, outside shell filling, outside the window or within Ec_V/2 of the next shell (notes)", () => {
    const full = [1.0, 1.2, ...ps(6)].map((v) => peak(v));
    expect(shortShellPredictions(full, filling([shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6, 7])], ecV), [-3, 3.5])).toEqual([]);
    const short = [1.0, 1.2, ...ps(5)].map((v) => peak(v));
    const multiplets = [shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6])];
    expect(shortShellPredictions(short, { ...filling(multiplets, ecV), regime: "shell-tunneling" }, [-3, 3.5])).toEqual([]);
    expect(shortShellPredictions(short, filling(multiplets, 0), [-3, 3.5])).toEqual([]);
    // The window ends before 2.8 + Ec_V.
    expect(shortShellPredictions(short, filling(multiplets, ecV), [-3, 2.9]).map((p) => p.side)).toEqual([-1]);
    // s short (one peak at 1.0 V): 1.2 V lies within Ec_V/2 of p's first peak only if p starts before 1.3 V.
    const sShort = [1.0, 1.25, 1.45].map((v) => peak(v));
    expect(shortShellPredictions(sShort, filling([shell("s", 2, [0]), shell("p", 6, [1, 2])], ecV), [-3, 3.5]).filter((p) => p.label === "s")).toEqual([{ label: "s", side: -1, predictedV: 1.0 - ecV }]);
  });
});

describe("shortShellPredictions: a full shell led by a peak at a predicted resonance (note 2)", () => {
  const ecV = 0.2;
  const full = [1.0, 1.2, 2.0, 2.2, 2.4, 2.6, 2.8, 3.0].map((v) => peak(v));
  const multiplets = [shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6, 7])];
  it("predicts one Ec_V beyond the last peak, replacing the first, where the first lies at a resonance (closed form)", () => {
    const got = shortShellPredictions(full, filling(multiplets, ecV), [-3, 3.5], { resonancesV: [2.01], toleranceV: 0.025 });
    expect(got.length).toBe(1);
    expect(got[0]).toMatchObject({ label: "p", side: 1, replaces: 2 });
    expect(got[0].predictedV).toBeCloseTo(3.0 + ecV, 12);
  });
  it("predicts nothing where the first peak lies beyond the tolerance of every resonance, or for the s doublet", () => {
    expect(shortShellPredictions(full, filling(multiplets, ecV), [-3, 3.5], { resonancesV: [2.05], toleranceV: 0.025 })).toEqual([]);
    expect(shortShellPredictions(full, filling(multiplets, ecV), [-3, 3.5], { resonancesV: [1.0], toleranceV: 0.025 })).toEqual([]);
  });
});

describe("shortShellSteps", () => {
  // FWHM 50 mV on 2 mV samples; s at 1.0, 1.2 V and p at 2.0 … 3.0 V (Ec_V = 0.2 V), p6 stepping
  // half the others: the peak list lacks it.
  const fw = 0.05, s = fw / GAUSSIAN_FWHM_PER_SIGMA, ecV = 0.2;
  const found = [1.0, 1.2, 2.0, 2.2, 2.4, 2.6, 2.8];
  const p6 = 3.0;
  const biasV = Float64Array.from({ length: 1501 }, (_, i) => 0.5 + i * 0.002);
  const rng = seededRandom(5);
  const noiseA = 0.2e-12;
  const currentA = biasV.map((v) => 1e-12 + found.reduce((a, x) => a + 10e-12 * phi((v - x) / s), 0) + 5e-12 * phi((v - p6) / s) + noiseA * rng.normal());
  const curve = { biasV, currentA, didvS: new Float64Array(biasV.length), noiseA, noiseS: 1e-12, floorV: 0.001 };
  const peaks = found.map((v) => peak(v));
  const assignment = filling([shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6])], ecV);
  const predictions = shortShellPredictions(peaks, assignment, [biasV[0], biasV[biasV.length - 1]]);

  it("finds the missing p6 at its drawn position as a peak of the expected width labelled p", () => {
    const got = shortShellSteps(curve, peaks, predictions, [], ecV, fw, 5);
    expect(got.length).toBe(1);
    expect(got[0].label).toBe("p");
    expect(Math.abs(got[0].peak.biasV - p6)).toBeLessThan(0.1 * fw);
    expect(got[0].peak.fwhmV).toBe(fw);
    // Its step: the Gaussian prominence times 1.0645·FWHM gives the drawn 5 pA back.
    expect(Math.abs(got[0].peak.prominenceS * 1.0645 * fw - 5e-12)).toBeLessThan(0.1 * 5e-12);
  });
  it("passes over a prediction within one FWHM of a predicted resonance, and fits a resonance further away as a step (note 1)", () => {
    expect(shortShellSteps(curve, peaks, predictions, [p6 + 0.5 * fw], ecV, fw, 5)).toEqual([]);
    const beside = shortShellSteps(curve, peaks, predictions, [p6 + 2.5 * fw], ecV, fw, 5);
    expect(beside.length).toBe(1);
    expect(Math.abs(beside[0].peak.biasV - p6)).toBeLessThan(0.1 * fw);
  });
  it("finds nothing where the current has no step there", () => {
    const flat = biasV.map((v) => 1e-12 + found.reduce((a, x) => a + 10e-12 * phi((v - x) / s), 0));
    expect(shortShellSteps({ ...curve, currentA: flat }, peaks, predictions, [], ecV, fw, 5)).toEqual([]);
  });
});

describe("shortShellStepKept", () => {
  // The rule of its notes on hand-made readings (exact logic, no source beyond the notes).
  const [a, b, c, d] = [1.0, 1.2, 1.4, 1.6].map((v) => peak(v));
  const read = (list: Peak[], p: number[], regime = "shell-filling") => ({ list, assignment: { regime, multiplets: [{ label: "p", peakIndices: p }] } as never });
  it("keeps a step that joins the shell while the shell keeps its peaks (note 1)", () => {
    expect(shortShellStepKept("p", c, read([a, b], [0, 1]), read([a, b, c], [0, 1, 2]))).toBe(true);
  });
  it("drops a step the re-read puts outside the shell, or that changes the regime (note 1)", () => {
    expect(shortShellStepKept("p", c, read([a, b], [0, 1]), read([a, b, c], [0, 1]))).toBe(false);
    expect(shortShellStepKept("p", c, read([a, b], [0, 1]), read([a, b, c], [0, 1, 2], "shell-tunneling"))).toBe(false);
  });
  it("keeps a new reading that trades a peak of the shell for two, and drops one that trades one for one (note 2)", () => {
    expect(shortShellStepKept("p", d, read([a, b, c], [0, 1]), read([a, b, c, d], [1, 2, 3]))).toBe(true);
    expect(shortShellStepKept("p", d, read([a, b, c], [0, 1]), read([a, b, c, d], [1, 3]))).toBe(false);
  });
  it("lets the peak named by replaces leave the shell", () => {
    expect(shortShellStepKept("p", d, read([a, b, c], [0, 1, 2]), read([a, b, c, d], [1, 2, 3]), 0)).toBe(true);
    expect(shortShellStepKept("p", d, read([a, b, c], [0, 1, 2]), read([a, b, c, d], [1, 2, 3]))).toBe(false);
  });
});

// Two draws of the accuracy benchmark's low-η mix (η 0.55–0.65, resonances kept), simulated by the
// project's model: the step found one Ec_V beyond p's last rung joins p, and the re-read ladder
// drops a second-junction resonance p had held while the rung was missing (note 2 of
// shortShellStepKept). Every expected value is the simulation's truth, the tolerance the
// project's quality bar (25 % of Ec/η).
describe("analyzeCurve(curve, { eta }): a short shell's step that reshapes the shell (low-η draws)", () => {
  for (const [start, resonanceV] of [[10, 2.462], [1193, 3.517]] as const) {
    it(`reads p as the simulation's six levels, without the resonance at ${resonanceV} V (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      // The resonance is the simulation's own, within 5 mV.
      expect(draw.truth.secondJunctionPeaksV.some((v) => Math.abs(v - resonanceV) < 0.005)).toBe(true);
      expectTrueP(draw, [resonanceV]);
    }, 30_000);
  }
});
