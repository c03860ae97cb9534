/**
 * The Savitzky–Golay window of the conductance: given in millivolts, or chosen from the expected
 * peak width and the noise of the current.
 */
import { DotspecError } from "../util/errors.ts";
import { minimumWindowSamples, noiseGainUnchecked } from "./savitzkyGolay.ts";

/** Constants of the automatic window (locked by test/signal/conductance.test.ts through CONDUCTANCE_DEFAULTS). */
export const SAVITZKY_GOLAY_WINDOW_DEFAULTS = Object.freeze({
  /**
   * f_p: the largest automatic window is f_p × peakWidthMV for polynomial order p. Measured on a
   * Gaussian dI/dV peak sampled with 20, 50 and 200 points per FWHM as the largest window that
   * keeps both the height loss and the FWHM growth of the first-derivative peak within 5 %
   * (test/signal/fixtures/windowFactors.ts; checked in test/signal/conductance.test.ts).
   * Orders 1 and 2, 3 and 4 share their centre derivative weights.
   */
  windowFraction: Object.freeze({ 1: 0.55, 2: 0.55, 3: 1.35, 4: 1.35, 5: 2.25 }) as Readonly<Record<number, number>>,
  /**
   * Noise target of the automatic window: the smallest window whose dI/dV noise σ_G is at most this
   * fraction of the mean conductance (I_max − I_min)/(V_max − V_min) is used, when smaller than
   * the largest window that resolves the peaks.
   */
  noiseTargetFraction: 0.01,
});

/** The grid and noise a window is chosen for. */
export interface WindowInput {
  /** Bias in volts, uniform step. */
  biasV: Float64Array;
  /** Current in amperes (offset removed or not: only its range is used). */
  currentA: Float64Array;
  /** Bias step in volts. */
  stepV: number;
  /** White-noise σ of the current per sample, A. */
  noiseCurrentA: number;
}

/** What {@link savitzkyGolayWindow} returns. */
export interface WindowChoice {
  /** Window in samples (odd). */
  windowSamples: number;
  /** Whether it was chosen automatically. */
  automatic: boolean;
  /** Why this window: the rule and the numbers it used, in words. */
  reason: string;
  /** What the user should know (window limited by the curve or by the peak width). */
  warnings: string[];
}

function fmt(x: number, digits = 3): string {
  return Number(x.toPrecision(digits)).toString();
}

/** Throws `signal/too-few-points` with the minimum and a fix. */
export function tooFewPoints(n: number, needed: number, order: number, why: string): never {
  throw new DotspecError(
    "signal/too-few-points",
    `the curve must have at least ${needed} points for ${why} (order ${order}); got ${n}. Record more points or use a lower order${why.startsWith("windowMV") ? " or a smaller windowMV" : ""}.`,
  );
}

/** Largest odd integer ≤ x (at least 1). */
function oddFloor(x: number): number {
  const f = Math.max(1, Math.floor(x));
  return f % 2 === 1 ? f : f - 1;
}

/**
 * The Savitzky–Golay window for the conductance of one curve.
 *
 * Parameters
 * ----------
 * input : WindowInput
 *     The uniform grid, the current and its white-noise σ (e.g. a {@link PreparedCurve}).
 * windowMV : number | "auto"
 *     A window in millivolts of bias (rounded to the nearest odd number of steps), or "auto".
 * order : number
 *     Polynomial order, 1–5 (validated by the caller).
 * peakWidthMV : number
 *     Expected FWHM of the narrowest dI/dV peak in millivolts (used by "auto").
 *
 * Returns
 * -------
 * WindowChoice
 *     `{ windowSamples, automatic, reason, warnings }`.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/window-too-small` (a window below max(5, order + 2) bias steps),
 *     `signal/too-few-points` (fewer points than the window).
 *
 * Notes
 * -----
 * With windowMV a number: the nearest odd number of bias steps. With "auto":
 * 1. The largest window that resolves a Gaussian dI/dV peak of FWHM W = peakWidthMV is f_p·W for
 *    polynomial order p ({@link SAVITZKY_GOLAY_WINDOW_DEFAULTS}.windowFraction), measured as the
 *    widest window that keeps the height loss and the FWHM growth of the first-derivative peak
 *    within 5 % for 20, 50 and 200 samples per FWHM. Take the largest odd number of samples
 *    within f_p·W.
 * 2. Raise it to the minimum max(5, order + 2) (odd) if smaller (warning) and lower it to the
 *    number of points if larger (warning).
 * 3. When the noise allows, use a smaller window: the smallest odd window from the minimum up
 *    whose dI/dV noise σ_I·gain/stepV is at most noiseTargetFraction (1 %) of the mean
 *    conductance (I_max − I_min)/(V_max − V_min); if none up to (2) does, use (2). Noise-free
 *    curves thus get the minimum window (least distortion); noisy ones the widest that resolves
 *    the peaks.
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964).
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002);
 * savitzkyGolayWindow({ biasV, currentA: biasV.map((v) => 1e-9 * v), stepV: 0.002, noiseCurrentA: 0 }, 30, 3, 40).windowSamples;
 * // => 15 (30 mV at 2 mV per step)
 * ```
 */
export function savitzkyGolayWindow(input: WindowInput, windowMV: number | "auto", order: number, peakWidthMV: number): WindowChoice {
  const c = chooseWindow(input, windowMV, order, peakWidthMV);
  const { stepMV, nMin } = c;
  if (c.given) {
    return { windowSamples: c.windowSamples, automatic: false, reason: `given: windowMV = ${windowMV} → ${c.windowSamples} samples at ${fmt(stepMV)} mV per step.`, warnings: [] };
  }
  const D = SAVITZKY_GOLAY_WINDOW_DEFAULTS;
  const fp = D.windowFraction[order];
  const warnings: string[] = [];
  let reason = `peaks of ${fmt(peakWidthMV)} mV FWHM allow at most f_${order}·W = ${fmt(fp)} × ${fmt(peakWidthMV)} mV = ${fmt(fp * peakWidthMV)} mV → ${c.nResolve} samples at ${fmt(stepMV)} mV per step`;
  if (c.nResolve < nMin) {
    reason += `; raised to the minimum of ${nMin} samples`;
    warnings.push(
      `peakWidthMV ${fmt(peakWidthMV)} spans only ${fmt(peakWidthMV / stepMV)} bias steps: the smallest window (${nMin} samples = ${fmt(nMin * stepMV)} mV) is wider than ${fmt(fp)} × peakWidthMV, so peaks that narrow lose more than 5 % of their height. Record with a finer bias step or use order ${Math.min(5, order + 2)}.`,
    );
  }
  const nRes = Math.max(nMin, c.nResolve);
  if (c.nCap < nRes) {
    reason += `; limited to ${c.nCap} samples by the length of the curve`;
    warnings.push(`the automatic window was limited to ${c.nCap} samples by the curve's ${input.biasV.length} points (peaks call for ${nRes}).`);
  }
  const target = `the noise target σ_G ≤ ${fmt(D.noiseTargetFraction * 100)} % of the mean conductance (${fmt(c.targetS)} S)`;
  if (c.noiseTargetMet) {
    return { windowSamples: c.windowSamples, automatic: true, reason: `automatic: ${reason}; ${target} is met at ${c.windowSamples} samples (σ_G = ${fmt(c.sigmaGS)} S).`, warnings };
  }
  reason += `; ${target} is not met below that (σ_G = ${fmt(c.sigmaGS)} S at ${c.nCap} samples), so the largest window is used`;
  return { windowSamples: c.windowSamples, automatic: true, reason: `automatic: ${reason}.`, warnings };
}

/** The numbers of a window choice ({@link chooseWindow}), from which the words are made. */
interface WindowNumbers {
  windowSamples: number;
  /** Whether windowMV was given (the rest is then unused). */
  given: boolean;
  stepMV: number;
  nMin: number;
  /** The largest window that resolves the peaks, before the minimum (samples). */
  nResolve: number;
  /** That window within the minimum and the curve's length (samples). */
  nCap: number;
  /** The noise target, S. */
  targetS: number;
  /** Whether a window up to nCap meets it. */
  noiseTargetMet: boolean;
  /** The dI/dV noise at the chosen window, S. */
  sigmaGS: number;
}

/**
 * The window in samples that {@link savitzkyGolayWindow} chooses, without the words of its
 * reason and warnings: for passes that use the number alone (the pipeline's first pass). Throws
 * as savitzkyGolayWindow does.
 */
export function savitzkyGolayWindowSamples(input: WindowInput, windowMV: number | "auto", order: number, peakWidthMV: number): number {
  return chooseWindow(input, windowMV, order, peakWidthMV).windowSamples;
}

/** The choice of {@link savitzkyGolayWindow} (its notes), as numbers. */
function chooseWindow(input: WindowInput, windowMV: number | "auto", order: number, peakWidthMV: number): WindowNumbers {
  const { biasV, stepV } = input;
  const n = biasV.length;
  const nMin = minimumWindowSamples(order);
  if (n < nMin) tooFewPoints(n, nMin, order, `the smallest Savitzky–Golay window of ${nMin} samples`);
  const stepMV = stepV * 1e3;
  const none = { nResolve: 0, nCap: 0, targetS: 0, noiseTargetMet: false, sigmaGS: 0 };
  if (windowMV !== "auto") {
    const windowSamples = 2 * Math.round((windowMV / stepMV - 1) / 2) + 1;
    if (windowSamples < nMin) {
      throw new DotspecError(
        "signal/window-too-small",
        `windowMV must be at least ${nMin} bias steps (${fmt(nMin * stepMV)} mV here) for order ${order}; got ${windowMV}. Use windowMV ≥ ${fmt(nMin * stepMV)} or "auto".`,
      );
    }
    if (windowSamples > n) tooFewPoints(n, windowSamples, order, `windowMV = ${windowMV} (${windowSamples} samples at ${fmt(stepMV)} mV per step)`);
    return { windowSamples, given: true, stepMV, nMin, ...none };
  }
  const D = SAVITZKY_GOLAY_WINDOW_DEFAULTS;
  const fp = D.windowFraction[order];
  // 1. The largest window that resolves peaks of peakWidthMV, at least the minimum.
  const nResolve = oddFloor((fp * peakWidthMV) / stepMV);
  const nRes = Math.max(nMin, nResolve);
  // 2. No wider than the curve.
  const nCap = Math.min(nRes, oddFloor(n));
  // 3. The smallest window that meets the noise target, if one does.
  let iMin = Infinity;
  let iMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (input.currentA[i] < iMin) iMin = input.currentA[i];
    if (input.currentA[i] > iMax) iMax = input.currentA[i];
  }
  const targetS = (D.noiseTargetFraction * (iMax - iMin)) / (biasV[n - 1] - biasV[0]);
  for (let w = nMin; w <= nCap; w += 2) {
    const sigmaGS = (input.noiseCurrentA * noiseGainUnchecked(w, order, 1)) / stepV;
    if (sigmaGS <= targetS) return { windowSamples: w, given: false, stepMV, nMin, nResolve, nCap, targetS, noiseTargetMet: true, sigmaGS };
  }
  const sigmaGS = (input.noiseCurrentA * noiseGainUnchecked(nCap, order, 1)) / stepV;
  return { windowSamples: nCap, given: false, stepMV, nMin, nResolve, nCap, targetS, noiseTargetMet: false, sigmaGS };
}
