/**
 * The width of a band's first step, measured on the raw current: the one step whose lower side
 * (the gap) no other level overlaps.
 */
import { normalCdfFast, NORMAL_CDF_FAST_REACH } from "../util/special.ts";
import { brentMinimize } from "../util/brentMinimize.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";

/** Options of {@link edgeStepWidth}. */
export interface EdgeStepWidthOptions {
  /** Position of the step (the peak of dI/dV), V. Required. */
  positionV: number;
  /** Bias range of the fit [from, to], V; should cover the gap side and stop before the next step. Required. */
  rangeV: [number, number];
  /** Smallest and largest FWHM tried, V. Default: EDGE_STEP_WIDTH_DEFAULTS.boundsV ([0.005, 0.4]). */
  boundsV?: [number, number];
  /**
   * +1 for a conduction-band step; −1 for a valence-band step: the fit then works on −V and −I
   * (positionV and rangeV given in that mirrored frame, so the step rises with the coordinate).
   * Default: EDGE_STEP_WIDTH_DEFAULTS.sign (1).
   */
  sign?: 1 | -1;
}

/** Defaults and constants of {@link edgeStepWidth} (locked by test/peaks/peakAreas.test.ts). */
export const EDGE_STEP_WIDTH_DEFAULTS = Object.freeze({
  boundsV: Object.freeze([0.005, 0.4]) as readonly [number, number],
  sign: 1 as 1 | -1,
  /** Fewer points than this in the range give null. */
  minPoints: 5,
  /** Log-spaced trial widths between the bounds (note 1). */
  trialCount: 10,
  /** Brent's search after the trials stops within this of the best ln s (a relative 1e-4 in the width, far below the width's own error; note 1). */
  logWidthTolerance: 1e-4,
  /** Most evaluations of that search (note 1). */
  refineEvaluations: 40,
});

/**
 * FWHM of a Gaussian-broadened current step at a known position, by least squares.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in volts, ascending.
 * currentA : ArrayLike<number>
 *     Current in amperes at each bias (unsmoothed).
 * options : EdgeStepWidthOptions
 *     positionV (V) and rangeV ([from, to], V), required; boundsV ([min, max] FWHM, V, default
 *     [0.005, 0.4]); sign (+1 CB, −1 VB, default +1).
 *
 * Returns
 * -------
 * number | null
 *     The FWHM of the step in volts, or null when the range holds fewer than 5 points or the
 *     fitted step is not positive.
 *
 * Throws
 * ------
 * Nothing: the caller (the pipeline) passes checked arrays; an unusable range gives null.
 *
 * Notes
 * -----
 * 1. Model I(V) = a + c·Φ((V − V₀)/s) on the given range; for each trial s the best a and c
 *    follow linearly, so only s is searched: 10 log-spaced trials between the bounds (a factor
 *    1.63 apart over the default 5–400 mV), then
 *    Brent's method (parabolic interpolation, golden-section steps where it is not to be
 *    trusted) in ln s between the best trial's neighbours, to 1e-4 ({@link brentMinimize}).
 * 2. Returns FWHM = 2√(2 ln 2)·s, or null when the range holds fewer than 5 points or the
 *    fitted step is not positive.
 * Measured on the unsmoothed current, the width carries no smoothing bias. The constants are in
 * {@link EDGE_STEP_WIDTH_DEFAULTS}.
 *
 * References
 * ----------
 * R. P. Brent, Algorithms for Minimization without Derivatives (Prentice-Hall, 1973), ch. 5.
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 1001 }, (_, i) => -1 + i * 0.002);
 * // A 0.1 nA step at 0.3 V broadened by a Gaussian of σ = 20 mV (FWHM 47.1 mV).
 * const currentA = fastCurrent({ baseA: 0, steps: [{ biasV: 0.3, heightA: 1e-10, thermalWidthV: 0 }] }, biasV, 0.02);
 * edgeStepWidth(biasV, currentA, { positionV: 0.3, rangeV: [0, 0.32] });
 * // => 0.0471 (V)
 * ```
 */
export function edgeStepWidth(biasV: ArrayLike<number>, currentA: ArrayLike<number>, options: EdgeStepWidthOptions): number | null {
  const [from, to] = options.rangeV;
  const D = EDGE_STEP_WIDTH_DEFAULTS;
  const sign = options.sign ?? D.sign;
  let count = 0;
  for (let i = 0; i < biasV.length; i++) {
    const x = sign * biasV[i];
    if (x >= from && x <= to) count++;
  }
  if (count < D.minPoints) return null;
  const x0 = options.positionV;
  // Offsets from the step and the current, in range order; the sums over y do not depend on s.
  const dx = new Float64Array(count), ys = new Float64Array(count);
  let sy = 0, syy = 0;
  for (let i = 0, k = 0; i < biasV.length; i++) {
    const x = sign * biasV[i];
    if (!(x >= from && x <= to)) continue;
    const y = sign * currentA[i];
    dx[k] = x - x0;
    ys[k++] = y;
    sy += y;
    syy += y * y;
  }
  const n = count;
  // dx runs one way (ascending for +1, descending for −1), and Φ is exactly 0 at and below
  // −NORMAL_CDF_FAST_REACH: those points add nothing to the sums, so only the others are visited
  // (the same sums, term for term; most of the gap side lies that far below the step). A bias
  // axis out of order is summed whole.
  let monotonic = true;
  for (let i = 1; i < n && monotonic; i++) monotonic = sign * (dx[i] - dx[i - 1]) >= 0;
  const ascending = sign === 1;
  const firstNonZero = (s: number): number => {
    if (!monotonic) return ascending ? 0 : n;
    // Ascending: the first index with dx/s above the reach; descending: one past the last.
    let lo = 0, hi = n;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((dx[mid] / s <= -NORMAL_CDF_FAST_REACH) === ascending) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  const residual = (s: number): { r: number; c: number } => {
    let sf = 0, sff = 0, sfy = 0;
    const edge = firstNonZero(s);
    const [first, end] = ascending ? [edge, n] : [0, edge];
    for (let i = first; i < end; i++) {
      const f = normalCdfFast(dx[i] / s);
      sf += f;
      sff += f * f;
      sfy += f * ys[i];
    }
    const det = n * sff - sf * sf;
    if (!(det > 0)) return { r: Infinity, c: 0 };
    const c = (n * sfy - sf * sy) / det;
    const a = (sy - c * sf) / n;
    // Σ(y − a − c f)² expanded.
    const r = syy - 2 * a * sy - 2 * c * sfy + n * a * a + 2 * a * c * sf + c * c * sff;
    return { r, c };
  };
  const [lo, hi] = (options.boundsV ?? D.boundsV).map((w) => w / GAUSSIAN_FWHM_PER_SIGMA);
  const trials = D.trialCount;
  let best = 0, bestR = Infinity;
  const grid = Array.from({ length: trials }, (_, k) => lo * (hi / lo) ** (k / (trials - 1)));
  grid.forEach((s, k) => {
    const { r } = residual(s);
    if (r < bestR) (bestR = r), (best = k);
  });
  // Brent's method in log s between the neighbours of the best trial, from the best trial.
  const lnLo = Math.log(grid[Math.max(0, best - 1)]), lnHi = Math.log(grid[Math.min(trials - 1, best + 1)]);
  const found = brentMinimize((lnS) => residual(Math.exp(lnS)).r, lnLo, lnHi, Math.log(grid[best]), bestR, D.logWidthTolerance, D.refineEvaluations);
  const s = Math.exp(found.x);
  if (!(residual(s).c > 0)) return null;
  return GAUSSIAN_FWHM_PER_SIGMA * s;
}
