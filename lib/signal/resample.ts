/**
 * Uniform bias grids: test whether a bias axis is uniformly stepped, and interpolate series onto a
 * uniform grid when it is not.
 */
import { DotspecError } from "../util/errors.ts";
import { biasStep, isUniformAxis, UNIFORM_STEP_TOLERANCE } from "../util/biasGrid.ts";
import { interpolateOnto } from "../util/interpolateOnto.ts";

/** Defaults of {@link isUniformStep} and {@link resampleUniform} (locked by test/signal/resample.test.ts). */
export const RESAMPLE_DEFAULTS = Object.freeze({
  /** Largest accepted |step − median step| as a fraction of the median step. */
  tolerance: UNIFORM_STEP_TOLERANCE,
});

/** What {@link resampleUniform} returns. */
export interface ResampledSeries {
  /** The uniform bias grid in volts, from min to max of the input. */
  biasV: Float64Array;
  /** Each input series interpolated onto `biasV`, in the input's order and unit. */
  series: Float64Array[];
  /** The grid step in volts actually used (see the notes of {@link resampleUniform}). */
  stepV: number;
}

/** Throws unless biasV is finite and strictly ascending. */
export function checkAscending(biasV: ArrayLike<number>): void {
  for (let i = 0; i < biasV.length; i++) {
    if (!Number.isFinite(biasV[i])) {
      throw new DotspecError(
        "signal/not-finite",
        `biasV must contain finite numbers only; got ${biasV[i]} at index ${i}. Remove the point first.`,
      );
    }
    if (i > 0 && !(biasV[i] > biasV[i - 1])) {
      throw new DotspecError(
        "signal/not-ascending",
        `biasV must be strictly ascending; got ${biasV[i - 1]} then ${biasV[i]} at index ${i}. Sort the points and merge repeated biases first.`,
      );
    }
  }
}

/** Median of the steps of an ascending axis with at least 2 points. */
export function medianStep(biasV: ArrayLike<number>): number {
  return biasStep(biasV).medianV;
}

/**
 * Whether a bias axis is uniformly stepped within a relative tolerance.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in volts, strictly ascending.
 * tolerance : number, optional
 *     Largest accepted |step − median step| / median step. Default 0.01.
 *
 * Returns
 * -------
 * boolean
 *     true when every step is within tolerance of the median step (also for fewer than 3 points).
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/not-ascending`, `signal/not-finite`, `signal/invalid-tolerance`.
 *
 * Notes
 * -----
 * 1. Steps Δ_i = V_{i+1} − V_i; h = median(Δ).
 * 2. Uniform when max |Δ_i − h| ≤ tolerance·h. Comparing with the median, not the mean, keeps one
 *    long gap (a missing point) from passing as a slightly larger uniform step.
 *
 * Example
 * -------
 * ```ts
 * isUniformStep([0, 0.1, 0.2, 0.3]);      // => true
 * isUniformStep([0, 0.1, 0.2, 0.4, 0.5]); // => false
 * ```
 */
export function isUniformStep(biasV: ArrayLike<number>, tolerance: number = RESAMPLE_DEFAULTS.tolerance): boolean {
  if (typeof tolerance !== "number" || !Number.isFinite(tolerance) || tolerance < 0) {
    throw new DotspecError(
      "signal/invalid-tolerance",
      `tolerance must be a finite number of at least 0 (a fraction of the median step); got ${tolerance}. Use 0.01.`,
    );
  }
  checkAscending(biasV);
  return isUniformStepUnchecked(biasV, tolerance);
}

/** {@link isUniformStep} for a validated, strictly ascending axis. */
export function isUniformStepUnchecked(biasV: ArrayLike<number>, tolerance: number): boolean {
  return biasV.length < 3 || isUniformAxis(biasV, tolerance);
}

/**
 * Linear interpolation of one or more series onto a uniform bias grid.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in volts, strictly ascending, at least 2 points.
 * series : ArrayLike<number>[]
 *     Series sampled on `biasV` (same length each), any unit.
 * stepV : number, optional
 *     Requested grid step in volts, > 0. Default: the median step of `biasV`.
 *
 * Returns
 * -------
 * ResampledSeries
 *     `{ biasV, series, stepV }`: the grid from min to max of the input, the interpolated series
 *     and the step actually used.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/not-ascending`, `signal/not-finite`, `signal/too-few-points`,
 *     `signal/length-mismatch`, `signal/invalid-step`.
 *
 * Notes
 * -----
 * 1. span = max − min; the number of grid points is n = round(span/stepV) + 1 and the step is
 *    adjusted to span/(n − 1), so the grid ends exactly at the last measured bias (the adjustment
 *    is at most half a step over the whole span; the returned stepV is the one used).
 * 2. Each grid point is interpolated linearly between the two measured points around it
 *    ({@link interpolateOnto}, one forward pass since both axes are ascending): O(n + m).
 * 3. Linear interpolation reproduces linear functions exactly but averages neighbouring noise: the
 *    white-noise σ of a resampled series is lower than that of the data, and its noise is
 *    correlated between neighbouring points.
 *
 * Example
 * -------
 * ```ts
 * resampleUniform([0, 0.1, 0.3, 0.4], [new Float64Array([0, 1, 3, 4])], 0.1);
 * // => { biasV: [0, 0.1, 0.2, 0.3, 0.4], series: [[0, 1, 2, 3, 4]], stepV: 0.1 }  (up to rounding)
 * ```
 */
export function resampleUniform(
  biasV: ArrayLike<number>,
  series: readonly ArrayLike<number>[],
  stepV?: number,
): ResampledSeries {
  if (biasV == null || biasV.length < 2) {
    throw new DotspecError(
      "signal/too-few-points",
      `biasV must have at least 2 points to resample; got ${biasV == null ? String(biasV) : biasV.length}.`,
    );
  }
  checkAscending(biasV);
  for (let s = 0; s < series.length; s++) {
    if (series[s].length !== biasV.length) {
      throw new DotspecError(
        "signal/length-mismatch",
        `series[${s}] must have one value per bias point (${biasV.length}); got ${series[s].length}.`,
      );
    }
  }
  const h = stepV ?? medianStep(biasV);
  if (typeof h !== "number" || !Number.isFinite(h) || !(h > 0)) {
    throw new DotspecError("signal/invalid-step", `stepV must be a finite number greater than 0 (volts); got ${h}. Omit it for the median step.`);
  }
  return resampleUniformUnchecked(biasV, series, h);
}

/** {@link resampleUniform} for validated input. */
export function resampleUniformUnchecked(
  biasV: ArrayLike<number>,
  series: readonly ArrayLike<number>[],
  requestedStepV: number,
): ResampledSeries {
  const m = biasV.length;
  const v0 = biasV[0];
  const span = biasV[m - 1] - v0;
  const n = Math.max(2, Math.round(span / requestedStepV) + 1);
  const step = span / (n - 1);
  const grid = new Float64Array(n);
  for (let k = 0; k < n; k++) grid[k] = k === n - 1 ? biasV[m - 1] : v0 + k * step;
  const out = series.map((y) => interpolateOnto(biasV, y, grid));
  return { biasV: grid, series: out, stepV: step };
}
