/**
 * The signal stage of the pipeline: from a Curve (bias, current, sweeps) to a smoothed current and
 * the tunnelling conductance dI/dV with its noise, by Savitzky–Golay differentiation.
 */
import type { Curve } from "../curve.ts";
import { checkInteger, checkKnownKeys, checkOneOf, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { averageSweepsUnchecked } from "./averageSweeps.ts";
import { medianInPlace, whiteNoiseSigmaUnchecked } from "./noise.ts";
import { checkAscending, isUniformStepUnchecked, medianStep, resampleUniformUnchecked } from "./resample.ts";
import { minimumWindowSamples, noiseGainUnchecked, savitzkyGolayUnchecked } from "./savitzkyGolay.ts";

/** Options of {@link conductance}. Every field is optional; defaults are in {@link CONDUCTANCE_DEFAULTS}. */
export interface ConductanceOptions {
  /**
   * Savitzky–Golay window in millivolts of bias, or "auto" to choose it from `peakWidthMV` and
   * the noise (see the notes of {@link conductance}). A number is rounded to the nearest odd
   * number of bias steps and must give at least max(5, order + 2) of them. Default "auto".
   */
  windowMV?: number | "auto";
  /** Degree of the Savitzky–Golay polynomial, 1–5 (2–4 are the useful ones). Default 3. */
  order?: number;
  /**
   * Expected FWHM of the narrowest dI/dV peak in millivolts of bias; sets the largest automatic
   * window. Default 40.
   */
  peakWidthMV?: number;
  /**
   * Use the measured conductance `curve.didvS` (e.g. from a lock-in) instead of differentiating
   * the current, when the curve has one. Default false.
   */
  useMeasured?: boolean;
  /**
   * Current offset removal: "gap" subtracts the median current of the zero-current region around
   * 0 V; "none" leaves the current as measured. Default "gap".
   */
  offset?: "gap" | "none";
}

/**
 * Defaults and tuning constants of {@link conductance}, all in one place (locked by
 * test/signal/conductance.test.ts; to be tuned with the accuracy benchmark).
 */
export const CONDUCTANCE_DEFAULTS = Object.freeze({
  windowMV: "auto" as number | "auto",
  order: 3,
  peakWidthMV: 40,
  useMeasured: false,
  offset: "gap" as "gap" | "none",
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
  /** The zero-current region ends where |I − I(0 V)| exceeds this many σ_I. */
  offsetNoiseMultiple: 4,
  /** …for this many samples in a row (single noise spikes do not end the region). */
  offsetRunSamples: 3,
  /** Floor of that threshold, as a fraction of the current range, for noise-free curves. */
  offsetFloorFraction: 1e-6,
  /** Fewer samples than this in the zero-current region give a warning. */
  offsetMinSamples: 5,
  /** Relative tolerance on the bias step before the curve is resampled. */
  uniformStepTolerance: 0.01,
  /**
   * Warn when the sweep-to-sweep dI/dV noise exceeds the white-noise estimate noiseConductanceS by
   * more than this factor (correlated noise or drift between sweeps).
   */
  sweepNoiseWarnRatio: 1.5,
});

const OPTION_KEYS = ["windowMV", "order", "peakWidthMV", "useMeasured", "offset"] as const;

/** How {@link conductance} obtained its result. */
export interface ConductanceRecord {
  /** Savitzky–Golay window in samples (odd). */
  windowSamples: number;
  /** The same window in millivolts: windowSamples × stepV × 1000. */
  windowMV: number;
  /** Savitzky–Golay polynomial order. */
  order: number;
  /** Whether the window was chosen automatically (windowMV "auto"). */
  automaticWindow: boolean;
  /** Why this window: the rule and the numbers it used, in words. */
  windowReason: string;
  /** Current offset subtracted, in amperes (0 with offset "none"). */
  offsetA: number;
  /** Bias range [from, to] in volts of the zero-current region the offset was taken from; null if none. */
  offsetRegionV: [number, number] | null;
  /** White-noise σ of the (resampled) current in amperes, from its third differences. */
  noiseCurrentA: number;
  /**
   * σ of the returned dI/dV in siemens: σ_I × noise gain / stepV for the numerical derivative
   * (exact for white noise), or the white-noise σ of the measured conductance when usedMeasured.
   */
  noiseConductanceS: number;
  /**
   * The same noise measured from the spread of the sweeps: rms over points of the per-point std of
   * the sweeps' dI/dV, divided by √(number of sweeps); null for one sweep or usedMeasured.
   */
  noiseConductanceSweepsS: number | null;
  /** Whether didvS is the measured conductance rather than the derivative of the current. */
  usedMeasured: boolean;
  /** Whether the curve was interpolated onto a uniform bias grid. */
  resampled: boolean;
  /** Anything the user should know about this curve's processing. */
  warnings: string[];
}

/** What {@link conductance} returns. All arrays are new and share the bias grid `biasV`. */
export interface ConductanceResult {
  /** Bias in volts, uniform step (resampled if the input was not). */
  biasV: Float64Array;
  /** Mean current in amperes, offset removed (and resampled). */
  currentA: Float64Array;
  /** Savitzky–Golay smoothed current in amperes (same window and order as the derivative). */
  currentSmoothA: Float64Array;
  /** Tunnelling conductance dI/dV in siemens. */
  didvS: Float64Array;
  /** dI/dV of each sweep with the same filter, in siemens; empty for one sweep or usedMeasured. */
  didvSweepsS: Float64Array[];
  /** Per-point sample standard deviation of didvSweepsS in siemens; null when it is empty. */
  didvSpreadS: Float64Array | null;
  /** Bias step in volts. */
  stepV: number;
  /** How the result was obtained. */
  record: ConductanceRecord;
}

function fail(code: string, message: string): never {
  throw new DotspecError(`signal/${code}`, message);
}

function fmt(x: number, digits = 3): string {
  return Number(x.toPrecision(digits)).toString();
}

function tooFewPoints(n: number, needed: number, order: number, why: string): never {
  fail(
    "too-few-points",
    `the curve must have at least ${needed} points for ${why} (order ${order}); got ${n}. Record more points or use a lower order${why.startsWith("windowMV") ? " or a smaller windowMV" : ""}.`,
  );
}

function checkCurve(curve: Curve): void {
  if (curve == null || curve.biasV == null || curve.currentA == null) {
    fail("invalid-curve", "curve must have biasV and currentA arrays; got " + String(curve) + ".");
  }
  const n = curve.biasV.length;
  if (curve.currentA.length !== n) {
    fail("length-mismatch", `currentA must have one value per bias point (${n}); got ${curve.currentA.length}.`);
  }
  if (!Array.isArray(curve.sweeps) || curve.sweeps.length === 0) {
    fail("no-sweeps", "curve.sweeps must hold at least one sweep (the importer puts the current there); got none.");
  }
  curve.sweeps.forEach((s, k) => {
    if (s.length !== n) fail("length-mismatch", `sweeps[${k}] must have one value per bias point (${n}); got ${s.length}.`);
  });
  if (curve.didvS != null && curve.didvS.length !== n) {
    fail("length-mismatch", `didvS must have one value per bias point (${n}); got ${curve.didvS.length}.`);
  }
  checkAscending(curve.biasV);
  const series: [string, ArrayLike<number>][] = [["currentA", curve.currentA]];
  curve.sweeps.forEach((s, k) => series.push([`sweeps[${k}]`, s]));
  if (curve.didvS != null) series.push(["didvS", curve.didvS]);
  for (const [name, y] of series) {
    for (let i = 0; i < y.length; i++) {
      if (!Number.isFinite(y[i])) {
        fail("not-finite", `${name} must contain finite numbers only; got ${y[i]} at index ${i} (bias ${curve.biasV[i]} V). Remove the point first.`);
      }
    }
  }
}

/** Index of the bias point nearest 0 V on an ascending axis (binary search). */
function indexNearestZero(biasV: Float64Array): number {
  let lo = 0;
  let hi = biasV.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (biasV[mid] <= 0) lo = mid;
    else hi = mid;
  }
  return Math.abs(biasV[lo]) <= Math.abs(biasV[hi]) ? lo : hi;
}

interface OffsetEstimate {
  offsetA: number;
  lo: number;
  hi: number;
}

/**
 * Median current of the zero-current region around 0 V (steps in the notes of conductance()).
 * Assumes 0 V lies within the bias range.
 */
function estimateOffset(biasV: Float64Array, currentA: Float64Array, sigmaA: number): OffsetEstimate {
  const D = CONDUCTANCE_DEFAULTS;
  const n = currentA.length;
  const i0 = indexNearestZero(biasV);
  // Reference: median of the 5 samples around 0 V (less noisy than one sample).
  const c0 = Math.max(0, i0 - 2);
  const c1 = Math.min(n - 1, i0 + 2);
  const ref = medianInPlace(currentA.slice(c0, c1 + 1));
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    if (currentA[i] < min) min = currentA[i];
    if (currentA[i] > max) max = currentA[i];
  }
  const threshold = Math.max(D.offsetNoiseMultiple * sigmaA, D.offsetFloorFraction * (max - min));
  let hi = i0;
  for (let j = i0 + 1, run = 0; j < n && run < D.offsetRunSamples; j++) {
    if (Math.abs(currentA[j] - ref) <= threshold) {
      hi = j;
      run = 0;
    } else run++;
  }
  let lo = i0;
  for (let j = i0 - 1, run = 0; j >= 0 && run < D.offsetRunSamples; j--) {
    if (Math.abs(currentA[j] - ref) <= threshold) {
      lo = j;
      run = 0;
    } else run++;
  }
  return { offsetA: medianInPlace(currentA.slice(lo, hi + 1)), lo, hi };
}

/** Largest odd integer ≤ x (at least 1). */
function oddFloor(x: number): number {
  const f = Math.max(1, Math.floor(x));
  return f % 2 === 1 ? f : f - 1;
}

interface WindowChoice {
  windowSamples: number;
  reason: string;
}

function chooseAutomaticWindow(
  n: number,
  stepV: number,
  order: number,
  peakWidthMV: number,
  sigmaA: number,
  currentA: Float64Array,
  biasV: Float64Array,
  warnings: string[],
): WindowChoice {
  const D = CONDUCTANCE_DEFAULTS;
  const stepMV = stepV * 1e3;
  const fp = D.windowFraction[order];
  const nMin = minimumWindowSamples(order);
  if (n < nMin) tooFewPoints(n, nMin, order, `the smallest Savitzky–Golay window of ${nMin} samples`);
  // 1. The largest window that resolves peaks of peakWidthMV.
  let nRes = oddFloor((fp * peakWidthMV) / stepMV);
  let reason = `peaks of ${fmt(peakWidthMV)} mV FWHM allow at most f_${order}·W = ${fmt(fp)} × ${fmt(peakWidthMV)} mV = ${fmt(fp * peakWidthMV)} mV → ${nRes} samples at ${fmt(stepMV)} mV per step`;
  if (nRes < nMin) {
    nRes = nMin;
    reason += `; raised to the minimum of ${nMin} samples`;
    warnings.push(
      `peakWidthMV ${fmt(peakWidthMV)} spans only ${fmt(peakWidthMV / stepMV)} bias steps: the smallest window (${nMin} samples = ${fmt(nMin * stepMV)} mV) is wider than ${fmt(fp)} × peakWidthMV, so peaks that narrow lose more than 5 % of their height. Record with a finer bias step or use order ${Math.min(5, order + 2)}.`,
    );
  }
  // 2. No wider than the curve.
  const nCap = Math.min(nRes, oddFloor(n));
  if (nCap < nRes) {
    reason += `; limited to ${nCap} samples by the length of the curve`;
    warnings.push(`the automatic window was limited to ${nCap} samples by the curve's ${n} points (peaks call for ${nRes}).`);
  }
  // 3. The smallest window that meets the noise target, if one does.
  const vMin = biasV[0];
  const vMax = biasV[n - 1];
  let iMin = Infinity;
  let iMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (currentA[i] < iMin) iMin = currentA[i];
    if (currentA[i] > iMax) iMax = currentA[i];
  }
  const meanConductanceS = (iMax - iMin) / (vMax - vMin);
  const targetS = D.noiseTargetFraction * meanConductanceS;
  for (let w = nMin; w <= nCap; w += 2) {
    const sigmaG = (sigmaA * noiseGainUnchecked(w, order, 1)) / stepV;
    if (sigmaG <= targetS) {
      reason += `; the noise target σ_G ≤ ${fmt(D.noiseTargetFraction * 100)} % of the mean conductance (${fmt(targetS)} S) is met at ${w} samples (σ_G = ${fmt(sigmaG)} S)`;
      return { windowSamples: w, reason };
    }
  }
  const sigmaG = (sigmaA * noiseGainUnchecked(nCap, order, 1)) / stepV;
  reason += `; the noise target σ_G ≤ ${fmt(D.noiseTargetFraction * 100)} % of the mean conductance (${fmt(targetS)} S) is not met below that (σ_G = ${fmt(sigmaG)} S at ${nCap} samples), so the largest window is used`;
  return { windowSamples: nCap, reason };
}

/**
 * Tunnelling conductance dI/dV of a curve by Savitzky–Golay differentiation, with the smoothed
 * current, the offset-corrected current, the noise of dI/dV and the sweep-to-sweep spread.
 *
 * Parameters
 * ----------
 * curve : Curve
 *     Bias (V, strictly ascending), mean current (A), sweeps (A), optional measured dI/dV (S).
 * options : ConductanceOptions, optional
 *     windowMV (mV or "auto", default "auto"), order (default 3), peakWidthMV (mV, default 40),
 *     useMeasured (default false), offset ("gap" or "none", default "gap").
 *
 * Returns
 * -------
 * ConductanceResult
 *     `{ biasV, currentA, currentSmoothA, didvS, didvSweepsS, didvSpreadS, stepV, record }`, on a
 *     uniform bias grid; `record` holds the window, offset, noise estimates and warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/too-few-points` (fewer points than the window; the message gives the minimum),
 *     `signal/window-too-small` (windowMV below max(5, order + 2) bias steps),
 *     `signal/not-ascending`, `signal/not-finite`, `signal/length-mismatch`, `signal/no-sweeps`,
 *     `signal/invalid-curve`; `options/…` for option values of the wrong type or range.
 *
 * Notes
 * -----
 * 1. Resample: if some bias step differs from the median step by more than 1 %, interpolate the
 *    current, the sweeps and the measured dI/dV linearly onto a uniform grid (warning).
 * 2. Noise: σ_I = whiteNoiseSigma(I), from the third differences of the current (robust to the
 *    steps of I(V)).
 * 3. Offset ("gap"): starting from the bias point nearest 0 V, grow an interval outward on each
 *    side while |I − I₀| ≤ max(4σ_I, 1e-6 × current range), I₀ the median of the 5 samples around
 *    0 V; a side stops after 3 samples in a row outside. The offset is the median current of the
 *    interval and is subtracted from the current (a constant does not change any derivative).
 *    0 V outside the bias range, or an interval of fewer than 5 samples, gives a warning.
 * 4. Window. With windowMV a number: the nearest odd number of bias steps. With "auto":
 *    a. The largest window that resolves a Gaussian dI/dV peak of FWHM W = peakWidthMV is
 *       f_p·W for polynomial order p: f_1 = f_2 = 0.55, f_3 = f_4 = 1.35, f_5 = 2.25. Measured
 *       (test/signal/fixtures/windowFactors.ts) as the widest window that keeps the height loss
 *       and the FWHM growth of the first-derivative peak within 5 %, for 20, 50 and 200 samples
 *       per FWHM. The height limit alone would allow 0.55–0.62 (p ≤ 2), 1.62–1.65 (p = 3, 4),
 *       2.55–2.60 (p = 5); the FWHM limit allows 0.55–0.60, 1.35–1.44, 2.25–2.26 (p = 3 and 4
 *       broaden before they flatten). Take the largest odd number of samples within f_p·W.
 *    b. Raise it to the minimum max(5, order + 2) (odd) if smaller (warning) and lower it to the
 *       number of points if larger (warning).
 *    c. When the noise allows, use a smaller window: the smallest odd window from the minimum up
 *       whose dI/dV noise σ_I·gain/stepV is at most 1 % of the mean conductance
 *       (I_max − I_min)/(V_max − V_min); if none up to (b) does, use (b). Noise-free curves thus
 *       get the minimum window (least distortion); noisy ones the widest that resolves the peaks.
 *    All constants are in CONDUCTANCE_DEFAULTS.
 * 5. Filter: the smoothed current and dI/dV are the Savitzky–Golay fits (derivative 0 and 1,
 *    divided by stepV) with that window and order, exact at the ends (asymmetric fits).
 * 6. Noise of dI/dV: σ_G = σ_I·‖w‖₂/stepV with w the centre derivative weights (exact for white
 *    noise; the outermost (window − 1)/2 points on each side are noisier).
 * 7. Sweeps (≥ 2): each sweep is differentiated with the same filter; didvSpreadS is the per-point
 *    sample std. Its rms over points divided by √(sweeps) measures σ_G from the data
 *    (noiseConductanceSweepsS); a value above 1.5 σ_G gives a warning (noise not white, or the
 *    sweeps differ).
 * 8. useMeasured with a measured dI/dV: didvS is that conductance (resampled), smoothed by the
 *    same filter (derivative 0), and σ_G its white-noise σ times the filter's noise gain (an
 *    underestimate if the lock-in output is already low-pass filtered).
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964); J. Steinier, Y. Termonia and
 * J. Deltour, Anal. Chem. 44, 1906 (1972); P. A. Gorry, Anal. Chem. 62, 570 (1990).
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002);
 * const currentA = biasV.map((v) => 1e-9 * v + 5e-12);      // 1 nS, 5 pA offset
 * const r = conductance({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "demo", metadata: {} } });
 * r.didvS[1000];           // => 1e-9 (S, up to rounding)
 * r.record.offsetA;        // => 5e-12 (A, up to rounding)
 * r.record.windowSamples;  // => 5 (noise-free: the minimum window)
 * r.record.warnings.length; // => 1 ("no zero-current region around 0 V …": an ohmic curve has no gap)
 * ```
 */
export function conductance(curve: Curve, options: ConductanceOptions = {}): ConductanceResult {
  const D = CONDUCTANCE_DEFAULTS;
  checkKnownKeys("conductance options", options, OPTION_KEYS);
  const windowOption = options.windowMV ?? D.windowMV;
  if (windowOption !== "auto") checkPositive("windowMV", windowOption);
  const order = checkInteger("order", options.order ?? D.order, 1, 5);
  const peakWidthMV = checkPositive("peakWidthMV", options.peakWidthMV ?? D.peakWidthMV);
  const useMeasured = options.useMeasured ?? D.useMeasured;
  if (typeof useMeasured !== "boolean") {
    throw new DotspecError("options/not-boolean", `useMeasured must be true or false; got ${String(useMeasured)}`);
  }
  const offsetMode = checkOneOf("offset", options.offset ?? D.offset, ["gap", "none"] as const);
  checkCurve(curve);
  const warnings: string[] = [];

  // 1. Uniform grid.
  let biasV: Float64Array = curve.biasV;
  let currentIn = curve.currentA;
  let sweeps: ArrayLike<number>[] = curve.sweeps;
  let measured: ArrayLike<number> | null = curve.didvS;
  const n0 = biasV.length;
  const nMin = minimumWindowSamples(order);
  if (n0 < nMin) tooFewPoints(n0, nMin, order, `the smallest Savitzky–Golay window of ${nMin} samples`);
  let stepV: number;
  let resampled = false;
  if (isUniformStepUnchecked(biasV, D.uniformStepTolerance)) {
    stepV = (biasV[n0 - 1] - biasV[0]) / (n0 - 1);
  } else {
    const h = medianStep(biasV);
    const all: ArrayLike<number>[] = [currentIn, ...sweeps];
    if (measured) all.push(measured);
    const r = resampleUniformUnchecked(biasV, all, h);
    let dMin = Infinity;
    let dMax = -Infinity;
    for (let i = 1; i < n0; i++) {
      const d = biasV[i] - biasV[i - 1];
      if (d < dMin) dMin = d;
      if (d > dMax) dMax = d;
    }
    warnings.push(
      `the bias step is not uniform (${fmt(dMin * 1e3)} to ${fmt(dMax * 1e3)} mV): the curve was interpolated linearly onto ${r.biasV.length} points with a step of ${fmt(r.stepV * 1e3)} mV; the noise estimates refer to the interpolated data.`,
    );
    biasV = r.biasV;
    stepV = r.stepV;
    currentIn = r.series[0];
    sweeps = r.series.slice(1, 1 + sweeps.length);
    measured = measured ? r.series[r.series.length - 1] : null;
    resampled = true;
  }
  const n = biasV.length;
  if (n < nMin) tooFewPoints(n, nMin, order, `the smallest Savitzky–Golay window of ${nMin} samples`);
  const bias = resampled ? biasV : Float64Array.from(biasV);

  // 2. Noise of the current.
  const noiseCurrentA = whiteNoiseSigmaUnchecked(currentIn, 3);

  // 3. Offset.
  const currentA = Float64Array.from(currentIn);
  let offsetA = 0;
  let offsetRegionV: [number, number] | null = null;
  if (offsetMode === "gap") {
    if (bias[0] > 0 || bias[n - 1] < 0) {
      warnings.push(
        `0 V lies outside the bias range [${fmt(bias[0])}, ${fmt(bias[n - 1])}] V: no current offset was removed (offset "gap" needs the zero-current region around 0 V).`,
      );
    } else {
      const est = estimateOffset(bias, currentA, noiseCurrentA);
      offsetA = est.offsetA;
      offsetRegionV = [bias[est.lo], bias[est.hi]];
      const count = est.hi - est.lo + 1;
      if (count < D.offsetMinSamples) {
        warnings.push(
          `no zero-current region around 0 V (only ${count} sample${count === 1 ? "" : "s"} within ${D.offsetNoiseMultiple} σ_I of I(0 V)): the offset ${fmt(offsetA)} A was taken from the current near 0 V; use offset "none" for curves without a gap.`,
        );
      }
      for (let i = 0; i < n; i++) currentA[i] -= offsetA;
    }
  }

  // 4. Window.
  let windowSamples: number;
  let windowReason: string;
  const automaticWindow = windowOption === "auto";
  if (windowOption === "auto") {
    const choice = chooseAutomaticWindow(n, stepV, order, peakWidthMV, noiseCurrentA, currentA, bias, warnings);
    windowSamples = choice.windowSamples;
    windowReason = "automatic: " + choice.reason + ".";
  } else {
    const stepMV = stepV * 1e3;
    windowSamples = 2 * Math.round((windowOption / stepMV - 1) / 2) + 1;
    if (windowSamples < nMin) {
      fail(
        "window-too-small",
        `windowMV must be at least ${nMin} bias steps (${fmt(nMin * stepMV)} mV here) for order ${order}; got ${windowOption}. Use windowMV ≥ ${fmt(nMin * stepMV)} or "auto".`,
      );
    }
    if (windowSamples > n) {
      tooFewPoints(n, windowSamples, order, `windowMV = ${windowOption} (${windowSamples} samples at ${fmt(stepMV)} mV per step)`);
    }
    windowReason = `given: windowMV = ${windowOption} → ${windowSamples} samples at ${fmt(stepMV)} mV per step.`;
  }

  // 5. Smoothed current and dI/dV.
  const currentSmoothA = savitzkyGolayUnchecked(currentA, windowSamples, order, 0, stepV);
  const gain1 = noiseGainUnchecked(windowSamples, order, 1);
  let didvS: Float64Array;
  let noiseConductanceS: number;
  let usedMeasured = false;
  if (useMeasured && measured) {
    // Smoothed with the same window (derivative 0), so its peaks are found like the derivative's.
    const raw = Float64Array.from(measured);
    didvS = savitzkyGolayUnchecked(raw, windowSamples, order, 0, stepV);
    noiseConductanceS = whiteNoiseSigmaUnchecked(raw, 3) * noiseGainUnchecked(windowSamples, order, 0);
    usedMeasured = true;
  } else {
    if (useMeasured) warnings.push("useMeasured: the curve has no measured dI/dV, so the current was differentiated.");
    didvS = savitzkyGolayUnchecked(currentA, windowSamples, order, 1, stepV);
    // 6. Noise of dI/dV (exact for white noise).
    noiseConductanceS = (noiseCurrentA * gain1) / stepV;
  }

  // 7. Sweep-to-sweep spread.
  const didvSweepsS: Float64Array[] = [];
  let didvSpreadS: Float64Array | null = null;
  let noiseConductanceSweepsS: number | null = null;
  if (sweeps.length >= 2 && !usedMeasured) {
    for (const s of sweeps) didvSweepsS.push(savitzkyGolayUnchecked(s, windowSamples, order, 1, stepV));
    const avg = averageSweepsUnchecked(didvSweepsS);
    didvSpreadS = avg.std;
    noiseConductanceSweepsS = avg.rmsStd / Math.sqrt(sweeps.length);
    if (noiseConductanceSweepsS > D.sweepNoiseWarnRatio * noiseConductanceS) {
      warnings.push(
        `the sweeps differ more than white noise explains: dI/dV noise from the sweep spread ${fmt(noiseConductanceSweepsS)} S vs ${fmt(noiseConductanceS)} S from the current's noise (correlated noise, drift or tip changes between sweeps); noiseConductanceS may be too small.`,
      );
    }
  }

  return {
    biasV: bias,
    currentA,
    currentSmoothA,
    didvS,
    didvSweepsS,
    didvSpreadS,
    stepV,
    record: {
      windowSamples,
      windowMV: windowSamples * stepV * 1e3,
      order,
      automaticWindow,
      windowReason,
      offsetA,
      offsetRegionV,
      noiseCurrentA,
      noiseConductanceS,
      noiseConductanceSweepsS,
      usedMeasured,
      resampled,
      warnings,
    },
  };
}
