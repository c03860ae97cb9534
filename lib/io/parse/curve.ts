/**
 * Stage 9 of the importer, the curve: the common bias, every sweep, their mean current, the mean
 * measured conductance, and the metadata.
 */
import type { Curve } from "../../curve.ts";
import type { SweepSet } from "./sweeps.ts";
import { meanOfSeries } from "../../util/meanOfSeries.ts";

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
 * 1. The mean of k arrays is summed as Σ a/k ({@link meanOfSeries}).
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
    currentA: meanOfSeries(common.currents, grid.length),
    sweeps: common.currents,
    didvS: common.conductances.length > 0 ? meanOfSeries(common.conductances, grid.length) : null,
    meta: { source: src, metadata: Object.fromEntries(metadata) },
  };
}
