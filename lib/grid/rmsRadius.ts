/**
 * The size of a state in a map: the RMS distance from the map's centre.
 */
import type { MapImage } from "./mapImage.ts";

/**
 * RMS radius √(Σ w·|r − c|² / Σ w) of a non-negative map about a centre, nm.
 *
 * Parameters
 * ----------
 * map : MapImage
 *     A thresholded map: values ≥ 0, NaN ignored.
 * centreNM : [number, number]
 *     The centre, nm (usually {@link mapCentre}).
 *
 * Returns
 * -------
 * number | null
 *     The RMS radius in nm; null when the map holds no positive value.
 *
 * Notes
 * -----
 * For a density that is spherically symmetric in 3-D and projected on the plane, the in-plane
 * mean square radius is 2/3 of the 3-D one (⟨x² + y²⟩ = (2/3)⟨r²⟩): the closed form the tests use.
 *
 * Example
 * -------
 * ```ts
 * rmsRadius({ values: Float64Array.of(1, 1), xNM: { start: -1, step: 2, count: 2 }, yNM: { start: 0, step: 1, count: 1 } }, [0, 0]);
 * // => 1
 * ```
 */
export function rmsRadius(map: MapImage, centreNM: [number, number]): number | null {
  const { xNM, yNM, values } = map;
  let sw = 0, s2 = 0;
  for (let iy = 0; iy < yNM.count; iy++) {
    const dy = yNM.start + iy * yNM.step - centreNM[1];
    for (let ix = 0; ix < xNM.count; ix++) {
      const w = values[iy * xNM.count + ix];
      if (!(w > 0)) continue;
      const dx = xNM.start + ix * xNM.step - centreNM[0];
      sw += w;
      s2 += w * (dx * dx + dy * dy);
    }
  }
  return sw > 0 ? Math.sqrt(s2 / sw) : null;
}
