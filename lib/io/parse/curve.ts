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
 * resolution : {currentA, conductanceS}, optional
 *     Resolution of the written current (A) and conductance (S) numbers, stored in `meta`
 *     (default null for both).
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
 * ```ts
 * const c = makeCurve({ biasV: Float64Array.of(0, 1), currents: [Float64Array.of(1, 2), Float64Array.of(3, 4)],
 *   conductances: [] }, "(text)", new Map());
 * c.currentA;  // => Float64Array [2, 3]
 * ```
 */
export function makeCurve(
  common: SweepSet,
  src: string,
  metadata: Map<string, string>,
  resolution: { currentA: number | null; conductanceS: number | null } = { currentA: null, conductanceS: null },
): Curve {
  const grid = common.biasV;
  return {
    biasV: grid,
    currentA: meanOfSeries(common.currents, grid.length),
    sweeps: common.currents,
    didvS: common.conductances.length > 0 ? meanOfSeries(common.conductances, grid.length) : null,
    meta: {
      source: src,
      metadata: Object.fromEntries(metadata),
      currentResolutionA: resolution.currentA,
      conductanceResolutionS: common.conductances.length > 0 ? resolution.conductanceS : null,
    },
  };
}

/**
 * The curve of a file whose bias was applied to the tip, in the project's sample-bias convention.
 *
 * Parameters
 * ----------
 * curve : Curve
 *     As read, bias ascending in the file's (tip) convention.
 *
 * Returns
 * -------
 * Curve
 *     New arrays: bias V_sample = −V_tip (reordered to ascend), currents negated with it (the
 *     current keeps the sign of the bias), a measured dI/dV reordered only (d(−I)/d(−V) = dI/dV).
 *
 * Notes
 * -----
 * With the sample grounded and the bias V on the tip, the sample sits at −V relative to the tip:
 * the states probed at tip bias +V are the sample's filled states (closed form of the
 * electrostatics of the junction).
 *
 * Example
 * -------
 * ```ts
 * const c = toSampleBias({ biasV: Float64Array.of(-1, 0, 2), currentA: Float64Array.of(-3, 0, 5),
 *   sweeps: [Float64Array.of(-3, 0, 5)], didvS: null, meta: { source: "t", metadata: {} } });
 * [Array.from(c.biasV), Array.from(c.currentA)];  // => [[-2, 0, 1], [-5, 0, 3]]
 * ```
 */
export function toSampleBias(curve: Curve): Curve {
  // 0 − x rather than −x: no −0 in the bias axis.
  const flip = (a: Float64Array, sign: 1 | -1) => Float64Array.from(a, (_, i) => (sign === 1 ? a[a.length - 1 - i] : 0 - a[a.length - 1 - i]));
  return {
    biasV: flip(curve.biasV, -1),
    currentA: flip(curve.currentA, -1),
    sweeps: curve.sweeps.map((s) => flip(s, -1)),
    didvS: curve.didvS ? flip(curve.didvS, 1) : null,
    meta: curve.meta,
  };
}
