/**
 * How round a map is: the ratio of the principal axes of its second moments.
 */
import type { MapImage } from "./mapImage.ts";
import { secondMoments } from "./secondMoments.ts";

/**
 * Roundness √(λmin/λmax) of a non-negative map, from the eigenvalues of its 2 × 2 covariance
 * (second central moments) about `centreNM`: 1 for a round map, → 0 for a line.
 *
 * Parameters
 * ----------
 * map : MapImage
 *     A thresholded map: values ≥ 0, NaN ignored.
 * centreNM : [number, number]
 *     The centre, nm.
 *
 * Returns
 * -------
 * number | null
 *     In [0, 1]; null when the map holds no positive value or has zero spread.
 *
 * Notes
 * -----
 * 1. Cxx = Σw·dx²/Σw, Cyy = Σw·dy²/Σw, Cxy = Σw·dx·dy/Σw.
 * 2. λ± = (Cxx + Cyy)/2 ± √(((Cxx − Cyy)/2)² + Cxy²) (closed form for a symmetric 2 × 2 matrix).
 *
 * Example
 * -------
 * ```ts
 * // four equal pixels at the corners of a 2 nm × 4 nm rectangle: axes 1 nm and 2 nm
 * mapRoundness({ values: Float64Array.of(1, 1, 1, 1), xNM: { start: -1, step: 2, count: 2 }, yNM: { start: -2, step: 4, count: 2 } }, [0, 0]);
 * // => 0.5
 * ```
 */
export function mapRoundness(map: MapImage, centreNM: [number, number]): number | null {
  const { sw, sxx, syy, sxy } = secondMoments(map, centreNM);
  if (!(sw > 0)) return null;
  const a = sxx / sw, c = syy / sw, b = sxy / sw;
  const mean = (a + c) / 2;
  const d = Math.sqrt(((a - c) / 2) ** 2 + b * b);
  const hi = mean + d, lo = Math.max(0, mean - d);
  return hi > 0 ? Math.sqrt(lo / hi) : null;
}
