/**
 * The signal stage of the pipeline: from a Curve (bias, current, sweeps) to a smoothed current and
 * the tunnelling conductance dI/dV with its noise, by Savitzky–Golay differentiation.
 */
import type { Curve } from "../curve.ts";
import { checkInteger, checkKnownKeys, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { averageSweepsUnchecked } from "./averageSweeps.ts";
import { whiteNoiseSigmaUnchecked } from "./noise.ts";
import { prepareCurve, PREPARE_CURVE_DEFAULTS, type NoiseBound, type PreparedCurve } from "./prepareCurve.ts";
import type { SaturatedRange } from "./saturation.ts";
import { noiseGainUnchecked, savitzkyGolaySmoothAndSlopeUnchecked, savitzkyGolayUnchecked } from "./savitzkyGolay.ts";
import { savitzkyGolayWindow, SAVITZKY_GOLAY_WINDOW_DEFAULTS } from "./savitzkyGolayWindow.ts";

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
  /**
   * Differentiate each sweep as well (for the sweep-to-sweep spread) when there are several.
   * Default true; false skips that work when only the mean curve is needed.
   */
  sweeps?: boolean;
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
  sweeps: true,
  /** The window factors f_p and the noise target: {@link SAVITZKY_GOLAY_WINDOW_DEFAULTS}. */
  windowFraction: SAVITZKY_GOLAY_WINDOW_DEFAULTS.windowFraction,
  noiseTargetFraction: SAVITZKY_GOLAY_WINDOW_DEFAULTS.noiseTargetFraction,
  /** The offset and the grid: {@link PREPARE_CURVE_DEFAULTS}. */
  offset: PREPARE_CURVE_DEFAULTS.offset,
  offsetNoiseMultiple: PREPARE_CURVE_DEFAULTS.offsetNoiseMultiple,
  offsetRunSamples: PREPARE_CURVE_DEFAULTS.offsetRunSamples,
  offsetFloorFraction: PREPARE_CURVE_DEFAULTS.offsetFloorFraction,
  offsetMinSamples: PREPARE_CURVE_DEFAULTS.offsetMinSamples,
  uniformStepTolerance: PREPARE_CURVE_DEFAULTS.uniformStepTolerance,
  /**
   * Warn when the sweep-to-sweep dI/dV noise exceeds the white-noise estimate noiseConductanceS by
   * more than this factor (correlated noise or drift between sweeps).
   */
  sweepNoiseWarnRatio: 1.5,
});

const OPTION_KEYS = ["windowMV", "order", "peakWidthMV", "useMeasured", "offset", "sweeps"] as const;
const DIFFERENTIATE_KEYS = ["windowMV", "order", "peakWidthMV", "useMeasured", "sweeps"] as const;

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
  /**
   * White-noise σ of the (resampled) current in amperes, from its third differences, but never
   * below the rounding floor of the written numbers ({@link prepareCurve}, note 2).
   */
  noiseCurrentA: number;
  /** Which bound set `noiseCurrentA`: "third-differences" or "resolution" (the rounding floor). */
  noiseCurrentBound: NoiseBound;
  /** The rounding floor resolution/√12 of the current, A; null when the curve carries no resolution. */
  noiseCurrentFloorA: number | null;
  /** Which bound set the measured conductance's noise (used when usedMeasured); null without one. */
  noiseMeasuredBound: NoiseBound | null;
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
  /**
   * White-noise σ per sample of the measured conductance before smoothing, S (the noise the
   * position uncertainty of its peaks is computed from); null when didvS is a derivative.
   */
  noiseConductanceRawS: number | null;
  /** Whether didvS is the measured conductance rather than the derivative of the current. */
  usedMeasured: boolean;
  /** Whether the curve was interpolated onto a uniform bias grid. */
  resampled: boolean;
  /** Flat runs of the current at an extreme at the ends of the bias range, cut off before the analysis ({@link prepareCurve}); empty when none. */
  saturation: SaturatedRange[];
  /** Whether the current had the sign opposite to the bias and was flipped ({@link prepareCurve}). */
  currentSignFlipped: boolean;
  /** Whether the measured conductance was mostly negative and was flipped. */
  conductanceSignFlipped: boolean;
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
  checkKnownKeys("conductance options", options, OPTION_KEYS);
  const { offset, ...rest } = options;
  checkDifferentiateOptions(rest);
  return conductanceFromPrepared(prepareCurve(curve, { offset }), rest);
}

/** Options of {@link conductanceFromPrepared}: those of {@link conductance} less the offset, which the preparation fixed. */
export type DifferentiateOptions = Omit<ConductanceOptions, "offset">;

/** Checks the options of {@link conductanceFromPrepared} (known keys, values in range); throws `options/…`. */
export function checkDifferentiateOptions(options: DifferentiateOptions): void {
  checkKnownKeys("conductance options", options, DIFFERENTIATE_KEYS);
  if (options.windowMV !== undefined && options.windowMV !== "auto") checkPositive("windowMV", options.windowMV);
  if (options.order !== undefined) checkInteger("order", options.order, 1, 5);
  if (options.peakWidthMV !== undefined) checkPositive("peakWidthMV", options.peakWidthMV);
  for (const key of ["useMeasured", "sweeps"] as const) {
    const v = options[key];
    if (v !== undefined && typeof v !== "boolean") {
      throw new DotspecError("options/not-boolean", `${key} must be true or false; got ${String(v)}`);
    }
  }
}

/**
 * The white-noise σ of the Savitzky–Golay derivative of a current with white noise σ_I: σ_I times
 * the filter's noise gain for the first derivative, over the bias step (exact for white noise), S.
 */
export function differentiatedNoiseS(noiseCurrentA: number, windowSamples: number, order: number, stepV: number): number {
  return (noiseCurrentA * noiseGainUnchecked(windowSamples, order, 1)) / stepV;
}

/**
 * The window-dependent half of {@link conductance}: Savitzky–Golay smoothing and differentiation
 * of a curve already prepared by {@link prepareCurve}. Call it once per window on the same
 * prepared curve; the preparation (grid, noise, offset) is not repeated.
 *
 * Parameters
 * ----------
 * prepared : PreparedCurve
 *     The result of {@link prepareCurve}; not modified.
 * options : DifferentiateOptions, optional
 *     windowMV (mV or "auto", default "auto"), order (default 3), peakWidthMV (mV, default 40),
 *     useMeasured (default false), sweeps (default true).
 *
 * Returns
 * -------
 * ConductanceResult
 *     As {@link conductance}; its warnings start with the preparation's.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/too-few-points`, `signal/window-too-small`; `options/…` for invalid options.
 *
 * Notes
 * -----
 * Steps 4–8 of {@link conductance}.
 *
 * Example
 * -------
 * ```ts
 * const prepared = prepareCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * const narrow = conductanceFromPrepared(prepared, { windowMV: 20 });
 * const wide = conductanceFromPrepared(prepared, { windowMV: 60 });
 * wide.record.windowMV > narrow.record.windowMV; // => true
 * ```
 */
export function conductanceFromPrepared(prepared: PreparedCurve, options: DifferentiateOptions = {}): ConductanceResult {
  const D = CONDUCTANCE_DEFAULTS;
  checkDifferentiateOptions(options);
  const windowOption = options.windowMV ?? D.windowMV;
  const order = options.order ?? D.order;
  const peakWidthMV = options.peakWidthMV ?? D.peakWidthMV;
  const useMeasured = options.useMeasured ?? D.useMeasured;
  const { biasV, currentA, stepV, noiseCurrentA } = prepared;
  const sweeps = prepared.sweepsA;
  const measured = prepared.measuredS;

  // 4. Window.
  const window = savitzkyGolayWindow(prepared, windowOption, order, peakWidthMV);
  const { windowSamples } = window;
  const warnings = [...prepared.warnings, ...window.warnings];

  // 5. Smoothed current and dI/dV.
  const useCurrent = !(useMeasured && measured);
  const pair = useCurrent ? savitzkyGolaySmoothAndSlopeUnchecked(currentA, windowSamples, order, stepV) : null;
  const currentSmoothA = pair ? pair.smooth : savitzkyGolayUnchecked(currentA, windowSamples, order, 0, stepV);
  let didvS: Float64Array;
  let noiseConductanceS: number;
  let noiseConductanceRawS: number | null = null;
  let usedMeasured = false;
  if (useMeasured && measured) {
    // Smoothed with the same window (derivative 0), so its peaks are found like the derivative's.
    didvS = savitzkyGolayUnchecked(measured, windowSamples, order, 0, stepV);
    noiseConductanceRawS = prepared.noiseMeasuredS ?? whiteNoiseSigmaUnchecked(measured, 3);
    noiseConductanceS = noiseConductanceRawS * noiseGainUnchecked(windowSamples, order, 0);
    usedMeasured = true;
  } else {
    if (useMeasured) warnings.push("useMeasured: the curve has no measured dI/dV, so the current was differentiated.");
    didvS = pair!.slope;
    // 6. Noise of dI/dV (exact for white noise).
    noiseConductanceS = differentiatedNoiseS(noiseCurrentA, windowSamples, order, stepV);
  }

  // 7. Sweep-to-sweep spread.
  const didvSweepsS: Float64Array[] = [];
  let didvSpreadS: Float64Array | null = null;
  let noiseConductanceSweepsS: number | null = null;
  if (sweeps.length >= 2 && !usedMeasured && (options.sweeps ?? D.sweeps)) {
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
    biasV,
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
      automaticWindow: window.automatic,
      windowReason: window.reason,
      offsetA: prepared.offsetA,
      offsetRegionV: prepared.offsetRegionV,
      noiseCurrentA,
      noiseCurrentBound: prepared.noiseCurrentBound,
      noiseCurrentFloorA: prepared.noiseCurrentFloorA,
      noiseMeasuredBound: prepared.noiseMeasuredBound,
      noiseConductanceS,
      noiseConductanceSweepsS,
      noiseConductanceRawS,
      usedMeasured,
      resampled: prepared.resampled,
      saturation: prepared.saturation,
      currentSignFlipped: prepared.currentSignFlipped,
      conductanceSignFlipped: prepared.conductanceSignFlipped,
      warnings,
    },
  };
}

function fmt(x: number, digits = 3): string {
  return Number(x.toPrecision(digits)).toString();
}
