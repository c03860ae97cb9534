/**
 * Stage 9 of the importer, the curve: the common bias, every sweep, their mean current, the mean
 * measured conductance, and the metadata.
 */
import type { Curve } from "../../curve.ts";
import type { SweepSet } from "./sweeps.ts";

/**
 * Make the {@link Curve} value.
 *
 * Parameters
 * ----------
 * common : SweepSet
 *     Every sweep on the common bias (stage 8): bias V, currents A, conductances S.
 * src : string
 *     Stored as `meta.source`.
 * metadata : Map<string, string>
 *     The file's metadata, stored as a plain object in file order.
 *
 * Returns
 * -------
 * Curve
 *     `biasV`, `currentA` = the mean of the sweeps (a new array), `sweeps`, `didvS` = the mean of
 *     the conductance columns or null, `meta`.
 *
 * Notes
 * -----
 * 1. The mean of k arrays is summed as Σ a/k ({@link mean}).
 *
 * Example
 * -------
 * const c = makeCurve({ biasV: Float64Array.of(0, 1), currents: [Float64Array.of(1, 2), Float64Array.of(3, 4)],
 *   conductances: [] }, "(text)", new Map());
 * c.currentA;  // => Float64Array [2, 3]
 */
export function makeCurve(common: SweepSet, src: string, metadata: Map<string, string>): Curve {
  const grid = common.biasV;
  return {
    biasV: grid,
    currentA: mean(common.currents, grid.length),
    sweeps: common.currents,
    didvS: common.conductances.length > 0 ? mean(common.conductances, grid.length) : null,
    meta: { source: src, metadata: Object.fromEntries(metadata) },
  };
}

/**
 * Element-wise mean of arrays.
 *
 * Parameters
 * ----------
 * arrays : readonly Float64Array[]
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
 * mean([Float64Array.of(1, 2), Float64Array.of(3, 4)], 2);  // => Float64Array [2, 3]
 */
export function mean(arrays: readonly Float64Array[], n: number): Float64Array {
  if (arrays.length === 1) return Float64Array.from(arrays[0]);
  const out = new Float64Array(n);
  const k = arrays.length;
  for (const a of arrays) for (let i = 0; i < n; i++) out[i] += a[i] / k;
  return out;
}
