/**
 * The window-independent half of the signal stage: a curve checked, put on a uniform bias grid,
 * its current noise measured and its offset removed, once, so that any number of
 * Savitzky–Golay windows can then be applied to it ({@link conductanceFromPrepared}).
 */
import type { Curve } from "../curve.ts";
import { biasStep, uniformByStepRange, UNIFORM_STEP_TOLERANCE } from "../util/biasGrid.ts";
import { checkKnownKeys, checkOneOf } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { medianInPlace } from "../util/medianInPlace.ts";
import { blockAverageUnchecked } from "./blockAverage.ts";
import { whiteNoiseSigmaUnchecked } from "./noise.ts";
import { checkAscending, resampleUniformUnchecked } from "./resample.ts";
import { findSaturation, type SaturatedRange } from "./saturation.ts";

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
  /**
   * Largest |current| (A) and |conductance| (S) accepted: far beyond any instrument, and small
   * enough that squares and sums of squares stay finite in double precision (1e60² = 1e120).
   */
  maxMagnitude: 1e60,
  /** Largest |bias| accepted, V: far beyond any tunnelling junction (the same reason). */
  maxBiasV: 1e6,
  /**
   * A curve with more points than this is averaged in blocks of adjacent samples down to at most
   * this many (note 2): 20,000 points over a few volts is a step of a few tenths of a mV, finer
   * than the thermal width at liquid-helium temperature (3.5 kT ≈ 1.4 mV at 4.5 K), so nothing
   * the analysis measures is lost, while the cost of the smoothing and of the local step fits
   * (which grows with the samples per peak) stays bounded. Common practice (no source).
   */
  maxPoints: 20000,
});

const OPTION_KEYS = ["offset"] as const;

/** Which bound set a noise estimate: the data's third differences, or the rounding floor of the written numbers. */
export type NoiseBound = "third-differences" | "resolution";

/**
 * σ of a rounding error of width q: q/√12 (closed form: the standard deviation of a uniform
 * distribution of width q; B. Widrow and I. Kollár, Quantization Noise, Cambridge University Press
 * (2008), from memory).
 */
export const ROUNDING_SIGMA_PER_QUANTUM = 1 / Math.sqrt(12);

/** The larger of an estimated σ and the rounding floor of a resolution (null: no floor). */
function floored(estimate: number, resolution: number | null | undefined): { sigma: number; floor: number | null; bound: NoiseBound } {
  const floor = resolution != null && Number.isFinite(resolution) && resolution > 0 ? resolution * ROUNDING_SIGMA_PER_QUANTUM : null;
  if (floor !== null && floor > estimate) return { sigma: floor, floor, bound: "resolution" };
  return { sigma: estimate, floor, bound: "third-differences" };
}

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
  /**
   * White-noise σ of the current per sample, A: the larger of the estimate from third differences
   * (before the offset) and the rounding floor resolution/√12 of the written numbers.
   */
  noiseCurrentA: number;
  /** Which of the two set `noiseCurrentA`: "third-differences" or "resolution" (the floor). */
  noiseCurrentBound: NoiseBound;
  /** The σ from third differences alone, A. */
  noiseCurrentEstimateA: number;
  /** The rounding floor resolution/√12, A; null when the curve carries no resolution. */
  noiseCurrentFloorA: number | null;
  /** White-noise σ of the measured conductance per sample, S (floored the same way); null without one. */
  noiseMeasuredS: number | null;
  /** Which bound set `noiseMeasuredS`; null without a measured conductance. */
  noiseMeasuredBound: NoiseBound | null;
  /** Current offset subtracted, A (0 with offset "none" or 0 V outside the range). */
  offsetA: number;
  /** Bias range [from, to] in volts of the zero-current region the offset was taken from; null if none. */
  offsetRegionV: [number, number] | null;
  /** Whether the curve was interpolated onto a uniform bias grid. */
  resampled: boolean;
  /** Samples averaged per point (1: none; more when the curve had more than PREPARE_CURVE_DEFAULTS.maxPoints points). */
  blockSamples: number;
  /**
   * Flat runs of the current at its extreme at an end of the bias range (the amplifier's range,
   * {@link findSaturation}), on the grid before the cut; they and the bias beyond them were left
   * out of the arrays above. Empty when none.
   */
  saturation: SaturatedRange[];
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
  // A sweep that is the current itself (one sweep, as the importer gives it) is checked once.
  curve.sweeps.forEach((s, k) => s !== curve.currentA && series.push([`sweeps[${k}]`, s]));
  if (curve.didvS != null) series.push(["didvS", curve.didvS]);
  const D = PREPARE_CURVE_DEFAULTS;
  for (const [name, y] of series) {
    const unit = name === "didvS" ? "S" : "A";
    for (let i = 0; i < y.length; i++) {
      // One test passes every good value; a value that fails it is told apart below.
      if (Math.abs(y[i]) <= D.maxMagnitude) continue;
      if (!Number.isFinite(y[i])) {
        fail("not-finite", `${name} must contain finite numbers only; got ${y[i]} at index ${i} (bias ${curve.biasV[i]} V). Remove the point first.`);
      }
      if (Math.abs(y[i]) > D.maxMagnitude) {
        fail(
          "out-of-range",
          `${name} must lie within ±${D.maxMagnitude} ${unit} (beyond any instrument); got ${y[i]} ${unit} at index ${i} (bias ${curve.biasV[i]} V). Check the unit of the current or conductance column.`,
        );
      }
    }
  }
  const nb = curve.biasV.length;
  if (nb > 0 && Math.max(Math.abs(curve.biasV[0]), Math.abs(curve.biasV[nb - 1])) > D.maxBiasV) {
    fail(
      "out-of-range",
      `biasV must lie within ±${D.maxBiasV} V (beyond any tunnelling junction); got ${Math.abs(curve.biasV[0]) > D.maxBiasV ? curve.biasV[0] : curve.biasV[nb - 1]} V. Check the unit of the bias column.`,
    );
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
 *     `signal/invalid-curve`, `signal/out-of-range` (|I| or |G| above 1e60, |V| above 1e6:
 *     {@link PREPARE_CURVE_DEFAULTS}); `options/…` for an unknown key or an offset other than "gap"/"none".
 *
 * Notes
 * -----
 * 1. Resample: if some bias step differs from the median step by more than 1 %
 *    ({@link UNIFORM_STEP_TOLERANCE}), interpolate the current, the sweeps and the measured dI/dV
 *    linearly onto a uniform grid with the median step (warning).
 * 2. Block averages: a curve of more than PREPARE_CURVE_DEFAULTS.maxPoints points (20,000) is
 *    averaged in blocks of b = ⌈n / maxPoints⌉ adjacent samples ({@link blockAverageUnchecked};
 *    the last n mod b samples are left out), with a warning; `blockSamples` says b.
 * 3. Saturation ({@link findSaturation}): a flat run of ≥ 5 samples at the current's maximum or
 *    minimum at an end of the bias range, equal within the resolution of the written numbers and
 *    either noisy around it or entered at a knee, is the amplifier's range: it is cut off, with
 *    a warning, and listed in `saturation`.
 * 4. Noise: σ_I = whiteNoiseSigma(I), from the third differences of the current (robust to the
 *    steps of I(V)); likewise σ of a measured conductance. Neither goes below q/√12, the σ of
 *    a rounding error of width q, where q is the resolution the numbers were written with
 *    (`curve.meta.currentResolutionA`, `conductanceResolutionS`, set by the importer): a curve
 *    written without noise would otherwise have σ ≈ 0 and every rounding step would pass as a
 *    peak. `noiseCurrentBound` says which bound was used. After block averages, q/√(12·b).
 * 5. Offset ("gap"): starting from the bias point nearest 0 V, grow an interval outward on each
 *    side while |I − I₀| ≤ max(4σ_I, 1e-6 × current range), I₀ the median of the 5 samples around
 *    0 V; a side stops after 3 samples in a row outside. The offset is the median current of the
 *    interval and is subtracted from the current. 0 V outside the bias range, or an interval of
 *    fewer than 5 samples, gives a warning. The constants are in {@link PREPARE_CURVE_DEFAULTS}.
 * 6. Sign: of the points where the offset-corrected |I| > 4σ_I, if at least 80 % have
 *    I·V < 0, the current and its sweeps are negated (warning): the project's convention is
 *    that the current has the sign of the (sample) bias. A measured conductance negative at 80 %
 *    of its points above 4σ is negated too (an inverted lock-in phase). The constants are in
 *    {@link PREPARE_CURVE_DEFAULTS}.
 *
 * References
 * ----------
 * B. Widrow and I. Kollár, Quantization Noise: Roundoff Error in Digital Computation, Signal
 * Processing, Control, and Communications, Cambridge University Press (2008), ch. 4 (the
 * variance q²/12 of rounding to a step q; from memory).
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
  // The median step only where the steps' range leaves it open (and then for resampling).
  const step = n0 < 3 || uniformByStepRange(curve.biasV, D.uniformStepTolerance) ? null : biasStep(curve.biasV, D.uniformStepTolerance);
  if (!step || step.uniform) {
    // Read in place; copied on return only if no later step made a new array (block averages,
    // the saturation cut), so a long curve is not copied before it is averaged.
    biasV = curve.biasV;
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
  // 2. Oversampled curves: block averages (note 2), before anything else reads every sample.
  let blockSamples = 1;
  if (biasV.length > D.maxPoints) {
    blockSamples = Math.ceil(biasV.length / D.maxPoints);
    const all: ArrayLike<number>[] = [currentIn, ...sweepsA];
    if (measuredS) all.push(measuredS);
    const r = blockAverageUnchecked(biasV, all, blockSamples);
    warnings.push(
      `the curve has ${biasV.length} points, more than ${D.maxPoints}: adjacent samples were averaged in blocks of ${blockSamples} (bias step ${fmt(stepV * 1e3)} → ${fmt(stepV * blockSamples * 1e3)} mV, ${r.biasV.length} points); the noise estimates refer to the averages.`,
    );
    biasV = r.biasV;
    stepV *= blockSamples;
    currentIn = r.series[0];
    sweepsA = r.series.slice(1, 1 + sweepsA.length);
    measuredS = measuredS ? r.series[r.series.length - 1] : null;
  }
  // 3. Saturation (on the averages): flat runs at the current's extremes at the ends are cut off.
  const resolutionA = curve.meta?.currentResolutionA;
  // The white-noise estimate of the whole curve: reused in step 4 unless saturated ends are cut off.
  const noiseBeforeCutA = biasV.length >= 4 ? whiteNoiseSigmaUnchecked(currentIn, 3) : 0;
  const saturation = biasV.length >= 4 ? findSaturation(biasV, currentIn, { resolutionA, noiseA: noiseBeforeCutA }) : [];
  if (saturation.length) {
    let lo = 0;
    let hi = biasV.length - 1;
    for (const s of saturation) {
      if (s.end === "negative") lo = s.indices[1] + 1;
      else hi = s.indices[0] - 1;
      warnings.push(
        `the current is flat at its ${s.levelA >= 0 ? "maximum" : "minimum"} ${fmt(s.levelA)} A from ${fmt(s.biasV[0])} to ${fmt(s.biasV[1])} V (${s.indices[1] - s.indices[0] + 1} samples): the current amplifier's range was probably reached (saturation); that range was left out of the analysis. Check the amplifier's gain against the instrument's own limits and local practice before measuring again.`,
      );
    }
    const cut = (a: ArrayLike<number>) => Float64Array.from({ length: hi - lo + 1 }, (_, i) => a[lo + i]);
    biasV = biasV.slice(lo, hi + 1);
    currentIn = cut(currentIn);
    sweepsA = sweepsA.map(cut);
    measuredS = measuredS ? cut(measuredS) : null;
  }
  const n = biasV.length;

  // 4. Noise (the rounding floor of a block mean is that of one sample over √b).
  const perBlock = (q: number | null | undefined) => (q == null ? q : q / Math.sqrt(blockSamples));
  const noiseCurrentEstimateA = n < 4 ? 0 : saturation.length ? whiteNoiseSigmaUnchecked(currentIn, 3) : noiseBeforeCutA;
  const currentNoise = floored(noiseCurrentEstimateA, perBlock(curve.meta?.currentResolutionA));
  const noiseCurrentA = currentNoise.sigma;
  const measuredNoise = measuredS && n >= 4 ? floored(whiteNoiseSigmaUnchecked(measuredS, 3), perBlock(curve.meta?.conductanceResolutionS)) : null;
  const noiseMeasuredS = measuredNoise ? measuredNoise.sigma : null;

  // 5. Offset.
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
  // 6. Sign (on the offset-corrected current; the offset stays as the file has it): the current has the sign of the bias (sample-bias convention); a file that records it
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

  return {
    biasV: biasV === curve.biasV ? Float64Array.from(biasV) : biasV,
    currentA,
    sweepsA,
    measuredS,
    stepV,
    noiseCurrentA,
    noiseCurrentBound: currentNoise.bound,
    noiseCurrentEstimateA,
    noiseCurrentFloorA: currentNoise.floor,
    noiseMeasuredS,
    noiseMeasuredBound: measuredNoise ? measuredNoise.bound : null,
    offsetA,
    offsetRegionV,
    resampled,
    blockSamples,
    saturation,
    currentSignFlipped,
    conductanceSignFlipped,
    warnings,
  };
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
