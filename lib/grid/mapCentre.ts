/**
 * The centre of a map: the value-weighted mean position.
 */
import type { MapImage } from "./mapImage.ts";

/**
 * Value-weighted centre (x̄, ȳ) of a non-negative map, nm.
 *
 * Parameters
 * ----------
 * map : MapImage
 *     A thresholded map ({@link thresholdMap}): values ≥ 0, NaN ignored.
 *
 * Returns
 * -------
 * [number, number] | null
 *     [x̄, ȳ] in nm with x̄ = Σ w·x / Σ w; null when the map holds no positive value.
 *
 * Example
 * -------
 * ```ts
 * mapCentre({ values: Float64Array.of(1, 3), xNM: { start: 0, step: 2, count: 2 }, yNM: { start: 5, step: 1, count: 1 } });
 * // => [1.5, 5]
 * ```
 */
export function mapCentre(map: MapImage): [number, number] | null {
  const { xNM, yNM, values } = map;
  let sw = 0, sx = 0, sy = 0;
  for (let iy = 0; iy < yNM.count; iy++) {
    const y = yNM.start + iy * yNM.step;
    for (let ix = 0; ix < xNM.count; ix++) {
      const w = values[iy * xNM.count + ix];
      if (!(w > 0)) continue;
      sw += w;
      sx += w * (xNM.start + ix * xNM.step);
      sy += w * y;
    }
  }
  return sw > 0 ? [sx / sw, sy / sw] : null;
}
