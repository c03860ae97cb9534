/**
 * Linear interpolation of a sampled series onto other abscissae: one routine for the importer
 * (sweeps onto a common bias grid) and the signal stage (a curve onto a uniform grid).
 */

/**
 * Linear interpolation of a sweep onto other bias points.
 *
 * Parameters
 * ----------
 * fromBiasV : ArrayLike<number>
 *     Strictly ascending bias of the sweep, V.
 * values : ArrayLike<number>
 *     The sweep's values on `fromBiasV`.
 * toBiasV : ArrayLike<number>
 *     Ascending target bias, V, inside [fromBiasV[0], fromBiasV[last]].
 *
 * Returns
 * -------
 * Float64Array
 *     Values on `toBiasV`; exact at shared points. Computed as y0·(1 − t) + y1·t, which stays
 *     finite for finite inputs.
 *
 * Example
 * -------
 * ```ts
 * interpolateOnto(Float64Array.of(0, 2), Float64Array.of(0, 4), Float64Array.of(0.5, 1));  // => [1, 2]
 * ```
 */
export function interpolateOnto(fromBiasV: ArrayLike<number>, values: ArrayLike<number>, toBiasV: ArrayLike<number>): Float64Array {
  const out = new Float64Array(toBiasV.length);
  const last = fromBiasV.length - 1;
  let j = 0;
  for (let i = 0; i < toBiasV.length; i++) {
    const x = toBiasV[i];
    while (j < last - 1 && fromBiasV[j + 1] < x) j++;
    if (last === 0 || x <= fromBiasV[j]) {
      out[i] = values[j];
    } else if (x >= fromBiasV[j + 1]) {
      out[i] = values[j + 1];
    } else {
      // Halves keep the differences finite even for biases near the largest double.
      const t = (x / 2 - fromBiasV[j] / 2) / (fromBiasV[j + 1] / 2 - fromBiasV[j] / 2);
      out[i] = values[j] * (1 - t) + values[j + 1] * t;
    }
  }
  return out;
}
