/**
 * The azimuthally averaged radial profile of a map about its centre.
 */
import { checkPositive } from "../util/check.ts";
import type { MapImage } from "./mapImage.ts";

/** A radial profile: mean value per ring. */
export interface RadialProfile {
  /** Centre radius of each ring, nm ((k + ½)·binNM). */
  radiusNM: Float64Array;
  /** Mean map value of the pixels in each ring (map unit); NaN for an empty ring. */
  mean: Float64Array;
  /** Pixels in each ring. */
  pixels: Uint32Array;
  /** Ring width, nm. */
  binNM: number;
}

/** Options of {@link radialProfile}. */
export interface RadialProfileOptions {
  /** Ring width in nm. Default: the smaller pixel step. */
  binNM?: number;
  /** Largest radius in nm. Default: the distance from the centre to the nearest grid edge plus half a pixel (only whole rings). */
  maxRadiusNM?: number;
}

/**
 * Azimuthal average of a map in rings of width binNM about a centre.
 *
 * Parameters
 * ----------
 * map : MapImage
 *     The map (thresholded for shape measures); NaN pixels are left out.
 * centreNM : [number, number]
 *     Centre, nm.
 * options : RadialProfileOptions, optional
 *     binNM (nm, default the smaller pixel step), maxRadiusNM (nm, default whole rings only).
 *
 * Returns
 * -------
 * RadialProfile
 *     Ring k holds the pixels at distance d with k·binNM ≤ d < (k + 1)·binNM.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-positive` for a bad binNM or maxRadiusNM.
 *
 * Example
 * -------
 * ```ts
 * // a 3 × 3 map, 1 nm pixels, 1 at the centre and 2 around it
 * radialProfile({ values: Float64Array.of(2, 2, 2, 2, 1, 2, 2, 2, 2), xNM: { start: -1, step: 1, count: 3 }, yNM: { start: -1, step: 1, count: 3 } }, [0, 0], { maxRadiusNM: 2 }).mean;
 * // => Float64Array [1, 2]   (ring 1 holds the 4 edge pixels at 1 nm and the 4 corners at 1.41 nm)
 * ```
 */
export function radialProfile(map: MapImage, centreNM: [number, number], options: RadialProfileOptions = {}): RadialProfile {
  const { xNM, yNM, values } = map;
  const binNM = options.binNM === undefined ? Math.min(xNM.step, yNM.step) : checkPositive("binNM", options.binNM);
  const xEnd = xNM.start + (xNM.count - 1) * xNM.step;
  const yEnd = yNM.start + (yNM.count - 1) * yNM.step;
  const edge = Math.min(centreNM[0] - xNM.start, xEnd - centreNM[0], centreNM[1] - yNM.start, yEnd - centreNM[1]);
  const maxR = options.maxRadiusNM === undefined ? Math.max(edge + binNM / 2, binNM) : checkPositive("maxRadiusNM", options.maxRadiusNM);
  const rings = Math.max(1, Math.ceil(maxR / binNM - 1e-9));
  const sum = new Float64Array(rings);
  const pixels = new Uint32Array(rings);
  for (let iy = 0; iy < yNM.count; iy++) {
    const dy = yNM.start + iy * yNM.step - centreNM[1];
    for (let ix = 0; ix < xNM.count; ix++) {
      const v = values[iy * xNM.count + ix];
      if (v !== v) continue;
      const dx = xNM.start + ix * xNM.step - centreNM[0];
      const d = Math.sqrt(dx * dx + dy * dy);
      if (d >= maxR) continue;
      const k = Math.floor(d / binNM);
      if (k >= rings) continue;
      sum[k] += v;
      pixels[k]++;
    }
  }
  const radiusNM = new Float64Array(rings);
  const mean = new Float64Array(rings);
  for (let k = 0; k < rings; k++) {
    radiusNM[k] = (k + 0.5) * binNM;
    mean[k] = pixels[k] > 0 ? sum[k] / pixels[k] : NaN;
  }
  return { radiusNM, mean, pixels, binNM };
}
