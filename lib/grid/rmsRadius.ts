/**
 * The size of a state in a map: the RMS distance from the map's centre.
 */
import type { MapImage } from "./mapImage.ts";
import { secondMoments } from "./secondMoments.ts";

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
  const { sw, sxx, syy } = secondMoments(map, centreNM);
  return sw > 0 ? Math.sqrt((sxx + syy) / sw) : null;
}
