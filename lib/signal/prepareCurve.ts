/**
 * The window-independent half of the signal stage: a curve checked, put on a uniform bias grid,
 * its current noise measured and its offset removed, once, so that any number of
 * Savitzky–Golay windows can then be applied to it ({@link conductanceFromPrepared}).
 */
import type { Curve } from "../curve.ts";
import { biasStep, UNIFORM_STEP_TOLERANCE } from "../util/biasGrid.ts";
import { checkKnownKeys, checkOneOf } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { medianInPlace } from "../util/medianInPlace.ts";
import { whiteNoiseSigmaUnchecked } from "./noise.ts";
import { checkAscending, resampleUniformUnchecked } from "./resample.ts";

/** Options of {@link prepareCurve}. */
export interface PrepareCurveOptions {
  /**
   * Current offset removal: "gap" subtracts the median current of the zero-current region around
   * 0 V; "none" leaves the current as measured. Default "gap" ({@link PREPARE_CURVE_DEFAULTS}).
   */
  offset?: "gap" | "none";
}

/** Defaults and constants of {@link prepareCurve} (locked by test/signal/prepareCurve.test.ts). */
export const PREPARE_CURVE_DEFAULTS = Object.freeze({
  offset: "gap" as "gap" | "none",
  /** The zero-current region ends where |I − I(0 V)| exceeds this many σ_I … */
  offsetNoiseMultiple: 4,
  /** … for this many samples in a row (single noise spikes do not end the region). */
  offsetRunSamples: 3,
  /** Floor of that threshold, as a fraction of the current range, for noise-free curves. */
  offsetFloorFraction: 1e-6,
  /** Fewer samples than this in the zero-current region give a warning. */
  offsetMinSamples: 5,
  /** Relative tolerance on the bias step before the curve is resampled ({@link UNIFORM_STEP_TOLERANCE}). */
  uniformStepTolerance: UNIFORM_STEP_TOLERANCE,
  /** The sign check counts the points where |I| exceeds this many σ_I (above the noise) … */
  signCheckSigma: 4,
  /** … and flips the current when at least this fraction of them has the sign opposite to the bias. */
  oppositeSignFraction: 0.8,
});

const OPTION_KEYS = ["offset"] as const;

/** A curve ready for differentiation: uniform grid, offset removed, noise measured. */
export interface PreparedCurve {
  /** Bias in volts, uniform step (a new array; resampled if the input was not uniform). */
  biasV: Float64Array;
  /** Mean current in amperes on that grid, offset removed. */
  currentA: Float64Array;
  /** Each sweep's current on that grid, in amperes, as measured (offset not removed: a constant does not change a derivative). */
  sweepsA: readonly ArrayLike<number>[];
  /** The measured conductance on that grid, in siemens, or null. */
  measuredS: ArrayLike<number> | null;
  /** Bias step in volts. */
  stepV: number;
  /** White-noise σ of the current per sample, A (third differences, before the offset). */
  noiseCurrentA: number;
  /** White-noise σ of the measured conductance per sample, S; null without one. */
  noiseMeasuredS: number | null;
  /** Current offset subtracted, A (0 with offset "none" or 0 V outside the range). */
  offsetA: number;
  /** Bias range [from, to] in volts of the zero-current region the offset was taken from; null if none. */
  offsetRegionV: [number, number] | null;
  /** Whether the curve was interpolated onto a uniform bias grid. */
  resampled: boolean;
  /** Whether the current (and its sweeps) had the sign opposite to the bias and was flipped. */
  currentSignFlipped: boolean;
  /** Whether the measured conductance was mostly negative and was flipped. */
  conductanceSignFlipped: boolean;
  /** What the user should know about these steps (non-uniform grid, no zero-current region). */
  warnings: string[];
}

function fail(code: string, message: string): never {
  throw new DotspecError(`signal/${code}`, message);
}

function fmt(x: number, digits = 3): string {
  return Number(x.toPrecision(digits)).toString();
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

/** Median current of the zero-current region around 0 V (note 3 of {@link prepareCurve}); 0 V must lie in the range. */
function estimateOffset(biasV: Float64Array, currentA: Float64Array, sigmaA: number): { offsetA: number; lo: number; hi: number } {
  const D = PREPARE_CURVE_DEFAULTS;
  const n = currentA.length;
  const i0 = indexNearestZero(biasV);
  // Reference: median of the 5 samples around 0 V (less noisy than one sample).
  const ref = medianInPlace(currentA.slice(Math.max(0, i0 - 2), Math.min(n - 1, i0 + 2) + 1));
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    if (currentA[i] < min) min = currentA[i];
    if (currentA[i] > max) max = currentA[i];
  }
  const threshold = Math.max(D.offsetNoiseMultiple * sigmaA, D.offsetFloorFraction * (max - min));
  const grow = (dir: 1 | -1): number => {
    let edge = i0;
    for (let j = i0 + dir, run = 0; j >= 0 && j < n && run < D.offsetRunSamples; j += dir) {
      if (Math.abs(currentA[j] - ref) <= threshold) {
        edge = j;
        run = 0;
      } else run++;
    }
    return edge;
  };
  const hi = grow(1);
  const lo = grow(-1);
  return { offsetA: medianInPlace(currentA.slice(lo, hi + 1)), lo, hi };
}

/**
 * Puts a curve on a uniform bias grid, measures the white noise of its current and removes the
 * current offset: everything of the signal stage that does not depend on the Savitzky–Golay
 * window.
 *
 * Parameters
 * ----------
 * curve : Curve
 *     Bias (V, strictly ascending), mean current (A), sweeps (A), optional measured dI/dV (S).
 * options : PrepareCurveOptions, optional
 *     offset ("gap" or "none", default "gap").
 *
 * Returns
 * -------
 * PreparedCurve
 *     New arrays on a uniform grid, the noise of the current (and of a measured conductance),
 *     the offset and its region, and warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/not-ascending`, `signal/not-finite`, `signal/length-mismatch`, `signal/no-sweeps`,
 *     `signal/invalid-curve`; `options/…` for an unknown key or an offset other than "gap"/"none".
 *
 * Notes
 * -----
 * 1. Resample: if some bias step differs from the median step by more than 1 %
 *    ({@link UNIFORM_STEP_TOLERANCE}), interpolate the current, the sweeps and the measured dI/dV
 *    linearly onto a uniform grid with the median step (warning).
 * 2. Noise: σ_I = whiteNoiseSigma(I), from the third differences of the current (robust to the
 *    steps of I(V)); likewise σ of a measured conductance.
 * 3. Offset ("gap"): starting from the bias point nearest 0 V, grow an interval outward on each
 *    side while |I − I₀| ≤ max(4σ_I, 1e-6 × current range), I₀ the median of the 5 samples around
 *    0 V; a side stops after 3 samples in a row outside. The offset is the median current of the
 *    interval and is subtracted from the current. 0 V outside the bias range, or an interval of
 *    fewer than 5 samples, gives a warning. The constants are in {@link PREPARE_CURVE_DEFAULTS}.
 * 4. Sign: of the points where the offset-corrected |I| > 4σ_I, if at least 80 % have
 *    I·V < 0, the current and its sweeps are negated (warning): the project's convention is
 *    that the current has the sign of the (sample) bias. A measured conductance negative at 80 %
 *    of its points above 4σ is negated too (an inverted lock-in phase). The constants are in
 *    {@link PREPARE_CURVE_DEFAULTS}.
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002);
 * const currentA = biasV.map((v) => (Math.abs(v) < 1 ? 0 : 1e-9 * (v - Math.sign(v))) + 5e-12);
 * const p = prepareCurve({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "demo", metadata: {} } });
 * p.offsetA;        // => 5e-12 (A)
 * p.offsetRegionV;  // => [-1, 1] (V, the zero-current region)
 * p.resampled;      // => false
 * ```
 */
export function prepareCurve(curve: Curve, options: PrepareCurveOptions = {}): PreparedCurve {
  const D = PREPARE_CURVE_DEFAULTS;
  checkKnownKeys("prepareCurve options", options, OPTION_KEYS);
  const offsetMode = checkOneOf("offset", options.offset ?? D.offset, ["gap", "none"] as const);
  checkCurve(curve);
  const warnings: string[] = [];

  // 1. Uniform grid.
  let biasV: Float64Array;
  let currentIn: ArrayLike<number> = curve.currentA;
  let sweepsA: readonly ArrayLike<number>[] = curve.sweeps;
  let measuredS: ArrayLike<number> | null = curve.didvS;
  const n0 = curve.biasV.length;
  let stepV: number;
  let resampled = false;
  const step = biasStep(curve.biasV, D.uniformStepTolerance);
  if (n0 < 3 || step.uniform) {
    biasV = Float64Array.from(curve.biasV);
    stepV = (biasV[n0 - 1] - biasV[0]) / Math.max(1, n0 - 1);
  } else {
    const all: ArrayLike<number>[] = [currentIn, ...sweepsA];
    if (measuredS) all.push(measuredS);
    const r = resampleUniformUnchecked(curve.biasV, all, step.medianV);
    let dMin = Infinity;
    let dMax = -Infinity;
    for (let i = 1; i < n0; i++) {
      const d = curve.biasV[i] - curve.biasV[i - 1];
      if (d < dMin) dMin = d;
      if (d > dMax) dMax = d;
    }
    warnings.push(
      `the bias step is not uniform (${fmt(dMin * 1e3)} to ${fmt(dMax * 1e3)} mV): the curve was interpolated linearly onto ${r.biasV.length} points with a step of ${fmt(r.stepV * 1e3)} mV; the noise estimates refer to the interpolated data.`,
    );
    biasV = r.biasV;
    stepV = r.stepV;
    currentIn = r.series[0];
    sweepsA = r.series.slice(1, 1 + sweepsA.length);
    measuredS = measuredS ? r.series[r.series.length - 1] : null;
    resampled = true;
  }
  const n = biasV.length;

  // 2. Noise.
  const noiseCurrentA = n >= 4 ? whiteNoiseSigmaUnchecked(currentIn, 3) : 0;
  const noiseMeasuredS = measuredS && n >= 4 ? whiteNoiseSigmaUnchecked(measuredS, 3) : null;

  // 3. Offset.
  const currentA = Float64Array.from(currentIn);
  let offsetA = 0;
  let offsetRegionV: [number, number] | null = null;
  if (offsetMode === "gap") {
    if (biasV[0] > 0 || biasV[n - 1] < 0) {
      warnings.push(
        `0 V lies outside the bias range [${fmt(biasV[0])}, ${fmt(biasV[n - 1])}] V: no current offset was removed (offset "gap" needs the zero-current region around 0 V).`,
      );
    } else {
      const est = estimateOffset(biasV, currentA, noiseCurrentA);
      offsetA = est.offsetA;
      offsetRegionV = [biasV[est.lo], biasV[est.hi]];
      const count = est.hi - est.lo + 1;
      if (count < D.offsetMinSamples) {
        warnings.push(
          `no zero-current region around 0 V (only ${count} sample${count === 1 ? "" : "s"} within ${D.offsetNoiseMultiple} σ_I of I(0 V)): the offset ${fmt(offsetA)} A was taken from the current near 0 V; use offset "none" for curves without a gap.`,
        );
      }
      for (let i = 0; i < n; i++) currentA[i] -= offsetA;
    }
  }
  // 4. Sign (on the offset-corrected current; the offset stays as the file has it): the current has the sign of the bias (sample-bias convention); a file that records it
  // the other way round is flipped, with a warning.
  const currentSignFlipped = opposesBias(biasV, currentA, D.signCheckSigma * noiseCurrentA, D.oppositeSignFraction);
  if (currentSignFlipped) {
    for (let i = 0; i < n; i++) currentA[i] = -currentA[i];
    sweepsA = sweepsA.map((sw) => Float64Array.from(sw, (v) => -v));
    warnings.push(
      "the current has the sign opposite to the bias over most of the curve: it was flipped (sample-bias convention: current has the sign of the bias). If the bias was applied to the tip, read the file with biasPolarity \"tip\" instead.",
    );
  }
  let conductanceSignFlipped = false;
  if (measuredS && noiseMeasuredS !== null && mostlyNegative(measuredS, D.signCheckSigma * noiseMeasuredS, D.oppositeSignFraction)) {
    measuredS = Float64Array.from(measuredS, (v) => -v);
    conductanceSignFlipped = true;
    warnings.push("the measured dI/dV is negative over most of the curve (an inverted lock-in phase?): it was flipped.");
  }

  return { biasV, currentA, sweepsA, measuredS, stepV, noiseCurrentA, noiseMeasuredS, offsetA, offsetRegionV, resampled, currentSignFlipped, conductanceSignFlipped, warnings };
}

/** Whether, of the points with |I| > threshold, at least `fraction` have I·V < 0. */
function opposesBias(biasV: ArrayLike<number>, currentA: ArrayLike<number>, threshold: number, fraction: number): boolean {
  let counted = 0;
  let opposite = 0;
  for (let i = 0; i < biasV.length; i++) {
    if (Math.abs(currentA[i]) <= threshold || biasV[i] === 0) continue;
    counted++;
    if (currentA[i] * biasV[i] < 0) opposite++;
  }
  return counted > 0 && opposite >= fraction * counted;
}

/** Whether, of the points with |G| > threshold, at least `fraction` are negative. */
function mostlyNegative(values: ArrayLike<number>, threshold: number, fraction: number): boolean {
  let counted = 0;
  let negative = 0;
  for (let i = 0; i < values.length; i++) {
    if (Math.abs(values[i]) <= threshold) continue;
    counted++;
    if (values[i] < 0) negative++;
  }
  return counted > 0 && negative >= fraction * counted;
}
