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
