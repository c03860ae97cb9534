/**
 * A map with everything below the noise floor set to zero: the input of every shape measure.
 */
import { checkNonNegative } from "../util/check.ts";
import type { MapImage } from "./mapImage.ts";

/**
 * Sets to 0 every value below `floor` (negative values included), keeps NaN (no data).
 *
 * Parameters
 * ----------
 * map : MapImage
 *     The map (any unit).
 * floor : number
 *     The threshold in the map's unit, ≥ 0: typically k·σ of the map's noise.
 *
 * Returns
 * -------
 * { map: MapImage; kept: number }
 *     A new map, and the number of pixels at or above the floor.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/negative` or `options/not-finite` for a bad floor.
 *
 * Example
 * -------
 * ```ts
 * thresholdMap({ values: Float64Array.of(-1, 0.5, 3), xNM: { start: 0, step: 1, count: 3 }, yNM: { start: 0, step: 1, count: 1 } }, 1).map.values;
 * // => Float64Array [0, 0, 3]
 * ```
 */
export function thresholdMap(map: MapImage, floor: number): { map: MapImage; kept: number } {
  const f = checkNonNegative("floor", floor);
  const values = new Float64Array(map.values.length);
  let kept = 0;
  for (let i = 0; i < values.length; i++) {
    const v = map.values[i];
    if (v !== v) values[i] = NaN;
    else if (v >= f && v > 0) {
      values[i] = v;
      kept++;
    } else values[i] = 0;
  }
  return { map: { ...map, values }, kept };
}
