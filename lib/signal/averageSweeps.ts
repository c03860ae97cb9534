/**
 * Point-by-point mean and spread of repeated sweeps on a common bias axis.
 */
import { DotspecError } from "../util/errors.ts";
import { meanOfSeries } from "../util/meanOfSeries.ts";

/** What {@link averageSweeps} returns. */
export interface SweepAverage {
  /** Mean over the sweeps at each point, in the sweeps' unit. */
  mean: Float64Array;
  /** Sample standard deviation (n − 1 in the denominator) at each point; zeros for one sweep. */
  std: Float64Array;
  /** √(mean over points of std²): one number for the sweep-to-sweep spread; 0 for one sweep. */
  rmsStd: number;
  /** Number of sweeps averaged. */
  sweepCount: number;
}

/**
 * Mean and sample standard deviation across sweeps, per point.
 *
 * Parameters
 * ----------
 * sweeps : ArrayLike<number>[]
 *     At least one sweep; all of the same length (≥ 1), finite values, any unit.
 *
 * Returns
 * -------
 * SweepAverage
 *     `{ mean, std, rmsStd, sweepCount }`.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/no-sweeps` (empty list), `signal/length-mismatch`, `signal/too-few-points` (empty
 *     sweeps).
 *
 * Notes
 * -----
 * 1. mean_i = Σ_s y_si / n.
 * 2. std_i = √(Σ_s (y_si − mean_i)² / (n − 1)) (two passes, so no cancellation); 0 when n = 1.
 * 3. rmsStd = √(Σ_i std_i² / m) over the m points. The standard error of the mean at a point is
 *    std_i/√n.
 *
 * Example
 * -------
 * ```ts
 * averageSweeps([new Float64Array([1, 2]), new Float64Array([3, 2])]);
 * // => { mean: [2, 2], std: [1.4142…, 0], rmsStd: 1, sweepCount: 2 }
 * ```
 */
export function averageSweeps(sweeps: readonly ArrayLike<number>[]): SweepAverage {
  if (!Array.isArray(sweeps) || sweeps.length === 0) {
    throw new DotspecError("signal/no-sweeps", `sweeps must be a non-empty list of series; got ${Array.isArray(sweeps) ? "[]" : String(sweeps)}.`);
  }
  const m = sweeps[0].length;
  if (m === 0) throw new DotspecError("signal/too-few-points", "sweeps must have at least 1 point each; got 0.");
  for (let s = 1; s < sweeps.length; s++) {
    if (sweeps[s].length !== m) {
      throw new DotspecError(
        "signal/length-mismatch",
        `every sweep must have the same number of points (${m}, as sweeps[0]); got ${sweeps[s].length} for sweeps[${s}].`,
      );
    }
  }
  return averageSweepsUnchecked(sweeps);
}

/** {@link averageSweeps} for validated input. */
export function averageSweepsUnchecked(sweeps: readonly ArrayLike<number>[]): SweepAverage {
  const n = sweeps.length;
  const m = sweeps[0].length;
  const mean = meanOfSeries(sweeps, m);
  const std = new Float64Array(m);
  if (n === 1) return { mean, std, rmsStd: 0, sweepCount: 1 };
  for (const y of sweeps) {
    for (let i = 0; i < m; i++) {
      const d = y[i] - mean[i];
      std[i] += d * d;
    }
  }
  let sumVar = 0;
  for (let i = 0; i < m; i++) {
    const v = std[i] / (n - 1);
    sumVar += v;
    std[i] = Math.sqrt(v);
  }
  return { mean, std, rmsStd: Math.sqrt(sumVar / m), sweepCount: n };
}
