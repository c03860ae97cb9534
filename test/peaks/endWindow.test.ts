// The step test at an end of the curve (findPeaks note 10, endWindow in lib/peaks/localStepFit.ts).
// Expected values: closed forms (noiseless data drawn from the fitted model give back its step
// exactly; a test of expected t passes a threshold T with probability Φ(t − T)), the step's
// variance from an independent least-squares computation with mathjs (inv(AᵀA) of the same design
// matrix), and the geometry of a charging ladder whose bias window ends half a spacing after its
// last step (common practice (no source): a window that stops inside a shell).
import { describe, it, expect } from "vitest";
import { erf, inv, multiply, transpose } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { endWindow, localStepFit, STEP_TEST_WINDOW, type FitWorkspace } from "../../lib/peaks/localStepFit.ts";
import { findPeaks } from "../../lib/peaks/findPeaks.ts";
import { savitzkyGolay } from "../../lib/signal/savitzkyGolay.ts";
import { differentiatedNoiseS } from "../../lib/signal/conductance.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));

describe("endWindow(x, index, halfWidth)", () => {
  const x = Float64Array.from({ length: 1001 }, (_, i) => i * 0.001);

  it("is the last or first 6 FWHM of the curve where an end cuts the ±3 FWHM window, else null (closed form)", () => {
    expect(STEP_TEST_WINDOW.endWindowFwhm).toBe(2 * STEP_TEST_WINDOW.halfWidthFwhm);
    // FWHM 50 mV (halfWidth 25 samples of 1 mV): the plain window reaches 150 samples either side.
    expect(endWindow(x, 980, 25)!.map((v) => +v.toFixed(12))).toEqual([0.7, 1]);
    expect(endWindow(x, 851, 25)!.map((v) => +v.toFixed(12))).toEqual([0.7, 1]);
    expect(endWindow(x, 20, 25)!.map((v) => +v.toFixed(12))).toEqual([0, 0.3]);
    // Inside: 850 + 150 = 1000 is the last sample, not beyond it.
    expect(endWindow(x, 850, 25)).toBeNull();
    expect(endWindow(x, 500, 25)).toBeNull();
    // A curve no longer than the end window: nothing to shift.
    expect(endWindow(x.subarray(0, 301), 280, 25)).toBeNull();
  });
});

describe("the step test half a spacing before the end of the curve", () => {
  // A charging ladder: four equal Gaussian-broadened steps 1.4 FWHM apart (Ec/η ≈ 85 mV at a FWHM
  // of 60 mV), the bias window ending half a spacing after the last one.
  const h = 0.002, fw = 0.06, s = fw / GAUSSIAN_FWHM_PER_SIGMA, spacing = 1.4 * fw;
  const positions = [0, 1, 2, 3].map((k) => 0.5 + k * spacing);
  const endV = positions[3] + spacing / 2;
  const x = Float64Array.from({ length: Math.floor(endV / h + 1e-9) + 1 }, (_, i) => i * h);
  const halfWidth = Math.round(fw / (2 * h));
  const step = 1e-11;
  const clean = x.map((v) => 2e-12 + 3e-12 * v + positions.reduce((sum, xj) => sum + step * phi((v - xj) / s), 0));
  const last = Math.round(positions[3] / h);
  const others = positions.slice(0, 3);

  /** Var(step)/σ² of the last column by mathjs over samples [lo, hi] (line, the given steps, the tested one). */
  function referenceStepVar(lo: number, hi: number, fitted: number[]): number {
    const rows: number[][] = [];
    for (let i = lo; i <= hi; i++) rows.push([1, x[i], ...fitted.map((v) => phi((x[i] - v) / s)), phi((x[i] - x[last]) / s)]);
    const invAta = inv(multiply(transpose(rows), rows) as number[][]) as number[][];
    return invAta[rows[0].length - 1][rows[0].length - 1];
  }

  it("gives back the step from noiseless data over the end window, with the variance mathjs gives, about half the cut window's standard error", () => {
    const work: FitWorkspace = { cols: new Float64Array(0) };
    const n = x.length;
    expect(last + 6 * halfWidth).toBeGreaterThan(n - 1);
    const window = endWindow(x, last, halfWidth)!;
    const end = localStepFit(x, clean, last, x[last], others, halfWidth, false, work, window, 0, false, false)!;
    expectClose(end.step, step, { rtol: 1e-4, what: "the last step over the end window" });
    const lo = Math.round(window[0] / h);
    expect(lo).toBe(n - 1 - 12 * halfWidth);
    // Every other step lies within the window or one FWHM before it: all three are fitted.
    expectClose(end.stepVar, referenceStepVar(lo, n - 1, others), { rtol: 1e-4, what: "Var(step)/σ², end window" });
    const cut = localStepFit(x, clean, last, x[last], others, halfWidth, false, work)!;
    const cutFitted = others.filter((v) => v >= x[last - 6 * halfWidth] - fw);
    expectClose(cut.stepVar, referenceStepVar(last - 6 * halfWidth, n - 1, cutFitted), { rtol: 1e-4, what: "Var(step)/σ², cut window" });
    expect(Math.sqrt(end.stepVar)).toBeLessThan(0.6 * Math.sqrt(cut.stepVar));
  });

  it("finds the last step within its σ in nearly every draw where the cut window alone would mostly miss it (Monte Carlo, 60 seeded draws; closed form Φ(t − 5))", () => {
    const work: FitWorkspace = { cols: new Float64Array(0) };
    const end = localStepFit(x, clean, last, x[last], others, halfWidth, false, work, endWindow(x, last, halfWidth)!, 0, false, false)!;
    const cut = localStepFit(x, clean, last, x[last], others, halfWidth, false, work)!;
    // The noise that puts the expected t over the end window at 7: Φ(7 − 5) = 0.977 of draws pass;
    // over the cut window the expected t is 7·SE_end/SE_cut ≈ 3.8, Φ(3.8 − 5) ≈ 0.11.
    const sigmaA = step / (7 * Math.sqrt(end.stepVar));
    const tCut = step / (sigmaA * Math.sqrt(cut.stepVar));
    expect(tCut).toBeLessThan(4);
    const g = x.map((v) => positions.reduce((sum, xj) => sum + (step / (s * Math.sqrt(2 * Math.PI))) * Math.exp(-0.5 * ((v - xj) / s) ** 2), 3e-12));
    let found = 0;
    const draws = 60;
    for (let k = 0; k < draws; k++) {
      const rng = seededRandom(900 + k);
      const current = clean.map((v) => v + sigmaA * rng.normal());
      const { peaks } = findPeaks(x, g, { noiseS: 1e-3 * Math.max(...g), current: { currentA: current, noiseA: sigmaA }, expectedFwhmV: fw, minSeparationMV: 0 });
      if (peaks.some((p) => Math.abs(p.biasV - positions[3]) < s)) found++;
    }
    // 0.977 expected; 0.9 is 4 binomial standard errors below it and far above 0.11.
    expect(found / draws).toBeGreaterThan(0.9);
  });

  it("invents no step at an end the curve has none at: a plateau with a line background, the conductance smoothed from the noisy current (Monte Carlo, 100 seeded draws)", () => {
    // The same ladder, the window ending 4 spacings after the last step. Each candidate at an end
    // is tested twice (cut and end window): at t ≥ 5 a pure-noise candidate passes with
    // probability below 2·(1 − Φ(5)) ≈ 6·10⁻⁷.
    const far = Float64Array.from({ length: Math.floor((positions[3] + 4 * spacing) / h) + 1 }, (_, i) => i * h);
    const sigmaA = 1e-12;
    const window = 2 * halfWidth + 1;
    const noiseS = differentiatedNoiseS(sigmaA, window, 3, h);
    let atEnd = 0;
    for (let k = 0; k < 100; k++) {
      const rng = seededRandom(1300 + k);
      const current = far.map((v) => 2e-12 + 3e-12 * v + positions.reduce((sum, xj) => sum + step * phi((v - xj) / s), 0) + sigmaA * rng.normal());
      const g = savitzkyGolay(current, { windowSamples: window, order: 3, derivative: 1, stepV: h });
      const { peaks } = findPeaks(far, g, { noiseS, current: { currentA: current, noiseA: sigmaA }, expectedFwhmV: fw });
      atEnd += peaks.filter((p) => p.biasV > positions[3] + spacing).length;
    }
    expect(atEnd).toBe(0);
  });
});
