/**
 * The point-by-point mean of several series of equal length: one routine for the importer (the
 * mean current of the sweeps) and the signal stage (the mean of the sweeps' dI/dV).
 */

/**
 * Element-wise mean of arrays.
 *
 * Parameters
 * ----------
 * arrays : readonly ArrayLike<number>[]
 *     At least one array, each of length `n`.
 * n : number
 *     Their length.
 *
 * Returns
 * -------
 * Float64Array
 *     A new array: a copy of the only array, or Σ a/k element by element for k arrays.
 *
 * Example
 * -------
 * ```ts
 * meanOfSeries([Float64Array.of(1, 2), Float64Array.of(3, 4)], 2);  // => Float64Array [2, 3]
 * ```
 */
export function meanOfSeries(arrays: readonly ArrayLike<number>[], n: number): Float64Array {
  if (arrays.length === 1) return Float64Array.from(arrays[0]);
  const out = new Float64Array(n);
  const k = arrays.length;
  for (const a of arrays) for (let i = 0; i < n; i++) out[i] += a[i] / k;
  return out;
}
