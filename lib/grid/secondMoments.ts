/**
 * The weighted second moments of a map about a centre: what its RMS radius and its roundness are
 * made of.
 */
import type { MapImage } from "./mapImage.ts";

/** Σw and the weighted sums of dx², dy² and dx·dy over the positive pixels (nm², weighted). */
export interface SecondMoments {
  sw: number;
  sxx: number;
  syy: number;
  sxy: number;
}

/**
 * Weighted second moments Σw, Σw·dx², Σw·dy², Σw·dx·dy of a map about a centre, over its
 * pixels with a positive value (NaN and non-positive values are ignored).
 *
 * Parameters
 * ----------
 * map : MapImage
 *     A thresholded map: values ≥ 0, NaN ignored.
 * centreNM : [number, number]
 *     The centre (x, y), nm.
 *
 * Returns
 * -------
 * SecondMoments
 *
 * Example
 * -------
 * ```ts
 * secondMoments({ values: Float64Array.of(1, 1), xNM: { start: -1, step: 2, count: 2 }, yNM: { start: 0, step: 1, count: 1 } }, [0, 0]);
 * // => { sw: 2, sxx: 2, syy: 0, sxy: 0 }
 * ```
 */
export function secondMoments(map: MapImage, centreNM: [number, number]): SecondMoments {
  const { xNM, yNM, values } = map;
  let sw = 0, sxx = 0, syy = 0, sxy = 0;
  for (let iy = 0; iy < yNM.count; iy++) {
    const dy = yNM.start + iy * yNM.step - centreNM[1];
    for (let ix = 0; ix < xNM.count; ix++) {
      const w = values[iy * xNM.count + ix];
      if (!(w > 0)) continue;
      const dx = xNM.start + ix * xNM.step - centreNM[0];
      sw += w;
      sxx += w * dx * dx;
      syy += w * dy * dy;
      sxy += w * dx * dy;
    }
  }
  return { sw, sxx, syy, sxy };
}
