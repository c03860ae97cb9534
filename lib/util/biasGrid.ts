/**
 * The bias grid of a curve: its median step and whether it is uniform. One rule for the importer
 * (which reports it) and the signal stage (which resamples when it fails).
 */
import { medianInPlace } from "./medianInPlace.ts";

/**
 * Largest accepted |step − median step| as a fraction of the median step for a grid to count as
 * uniform. Common practice (no source): 1 % keeps the Savitzky–Golay weights, which assume equal
 * spacing, within 1 % of their design values.
 */
export const UNIFORM_STEP_TOLERANCE = 0.01;

/** What {@link biasStep} returns. */
export interface BiasStep {
  /** Median of the steps, V (same sign as the steps). */
  medianV: number;
  /** Whether every step lies within `tolerance` × |median| of the median. */
  uniform: boolean;
}

/**
 * The median step of a bias axis and whether every step lies within a relative tolerance of it.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in volts, at least 2 points, monotonic (not checked).
 * tolerance : number, optional
 *     Largest accepted |step − median| / |median|. Default {@link UNIFORM_STEP_TOLERANCE} (0.01).
 *
 * Returns
 * -------
 * BiasStep
 *     `{ medianV, uniform }`; with fewer than 2 points, `{ medianV: NaN, uniform: true }`.
 *
 * Notes
 * -----
 * 1. Steps d_i = V_{i+1} − V_i; the median by selection (odd count: the middle one; even: the
 *    mean of the two middle ones).
 * 2. Uniform when |d_i − median| ≤ tolerance·|median| for every i.
 *
 * Example
 * -------
 * ```ts
 * biasStep([0, 0.1, 0.2, 0.3]);        // => { medianV: 0.1, uniform: true }  (up to rounding)
 * biasStep([0, 0.1, 0.25, 0.35]);      // => { medianV: 0.1, uniform: false } (up to rounding)
 * ```
 */
export function biasStep(biasV: ArrayLike<number>, tolerance: number = UNIFORM_STEP_TOLERANCE): BiasStep {
  const d = new Float64Array(Math.max(0, biasV.length - 1));
  for (let i = 0; i < d.length; i++) d[i] = biasV[i + 1] - biasV[i];
  const medianV = d.length ? medianInPlace(d) : NaN;
  const limit = tolerance * Math.abs(medianV);
  let uniform = true;
  // The steps again from the axis (the same differences; no copy of them for a long sweep).
  for (let i = 0; i < d.length && uniform; i++) uniform = Math.abs(biasV[i + 1] - biasV[i] - medianV) <= limit;
  return { medianV, uniform };
}

/**
 * Whether the range of a bias axis's steps alone shows it uniform: a sufficient test for
 * `biasStep(biasV, tolerance).uniform`, without the median.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in volts, monotonic (not checked).
 * tolerance : number, optional
 *     Largest accepted |step − median| / |median|. Default {@link UNIFORM_STEP_TOLERANCE} (0.01).
 *
 * Returns
 * -------
 * boolean
 *     true when every step has one sign, none is zero, and max |d_i| − min |d_i| ≤ tolerance ·
 *     min |d_i| (then {@link biasStep} says uniform too); false means undecided, not non-uniform.
 *     Fewer than 2 points: true.
 *
 * Notes
 * -----
 * 1. With a = min |d_i| and b = max |d_i| over steps of one sign, the median lies in [a, b], so
 *    every |d_i − median| ≤ b − a; when b − a ≤ tolerance·a ≤ tolerance·|median| the axis is
 *    uniform. Rounding is monotonic, so the floating-point test implies {@link biasStep}'s.
 *
 * Example
 * -------
 * ```ts
 * uniformByStepRange([0, 0.1, 0.2, 0.3]);           // => true
 * uniformByStepRange([0, 0.995, 1.995, 2.995, 4.003]); // => false (undecided: biasStep says uniform)
 * ```
 */
export function uniformByStepRange(biasV: ArrayLike<number>, tolerance: number = UNIFORM_STEP_TOLERANCE): boolean {
  const n = biasV.length;
  if (n < 2) return true;
  let a = Infinity, b = 0, positive = 0, negative = 0;
  for (let i = 0; i + 1 < n; i++) {
    const d = biasV[i + 1] - biasV[i];
    if (d > 0) positive++;
    else if (d < 0) negative++;
    const m = Math.abs(d);
    if (m < a) a = m;
    if (m > b) b = m;
  }
  const oneSign = positive === n - 1 || negative === n - 1;
  return oneSign && a > 0 && b - a <= tolerance * a;
}

/**
 * Whether a bias axis is uniform: the same answer as `biasStep(biasV, tolerance).uniform`, found
 * without the median when the steps' range already decides it ({@link uniformByStepRange}).
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in volts, monotonic (not checked).
 * tolerance : number, optional
 *     Largest accepted |step − median| / |median|. Default {@link UNIFORM_STEP_TOLERANCE} (0.01).
 *
 * Returns
 * -------
 * boolean
 *
 * Example
 * -------
 * ```ts
 * isUniformAxis([0, 0.1, 0.2, 0.3]);   // => true
 * isUniformAxis([0, 0.1, 0.25, 0.35]); // => false
 * ```
 */
export function isUniformAxis(biasV: ArrayLike<number>, tolerance: number = UNIFORM_STEP_TOLERANCE): boolean {
  return uniformByStepRange(biasV, tolerance) || biasStep(biasV, tolerance).uniform;
}
