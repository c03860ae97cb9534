/**
 * The noise floor of grid maps: the white noise of the pixels' current, carried through each
 * map's weights.
 */
import { median, whiteNoiseSigma } from "../signal/noise.ts";
import { checkInteger } from "../util/check.ts";
import type { GridCube } from "./gridCube.ts";
import type { PixelFunctional } from "./pixelPass.ts";

/** Options of {@link gridCurrentNoise}. */
export interface GridCurrentNoiseOptions {
  /** Pixels whose noise is measured, spread evenly over the grid. Default 256 (GRID_NOISE_DEFAULTS.samplePixels). */
  samplePixels?: number;
}

/** Defaults of the noise estimate (locked by a test). */
export const GRID_NOISE_DEFAULTS = Object.freeze({
  samplePixels: 256,
});

/**
 * White-noise σ of the current per sample, the median over a sample of pixels, A.
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     The cube (missing pixels are skipped).
 * options : GridCurrentNoiseOptions, optional
 *     samplePixels (default 256).
 *
 * Returns
 * -------
 * number
 *     σ_I in amperes (0 for a noise-free cube).
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-integer` for a samplePixels that is not a positive integer.
 *
 * Notes
 * -----
 * 1. Pick up to samplePixels pixels at even strides of the pixel index.
 * 2. For each, σ from the median absolute deviation of the third differences of its current
 *    ({@link whiteNoiseSigma}: insensitive to the smooth I–V steps).
 * 3. The median over the pixels: a few pixels with a tip change do not move it.
 *
 * Example
 * -------
 * ```ts
 * gridCurrentNoise(readGridFile("sample-curves/grid/dot-grid.npy").cube); // => 5.02e-14 (A: the demo grid's white noise)
 * ```
 */
export function gridCurrentNoise(cube: GridCube, options: GridCurrentNoiseOptions = {}): number {
  const want = options.samplePixels === undefined ? GRID_NOISE_DEFAULTS.samplePixels : checkInteger("samplePixels", options.samplePixels, 1);
  const nb = cube.biasV.count;
  const nPix = cube.xNM.count * cube.yNM.count;
  const stride = Math.max(1, Math.floor(nPix / want));
  const sigmas: number[] = [];
  for (let p = Math.floor(stride / 2); p < nPix && sigmas.length < want; p += stride) {
    if (cube.missing && cube.missing[p]) continue;
    sigmas.push(whiteNoiseSigma(cube.currentA.subarray(p * nb, (p + 1) * nb)));
  }
  return sigmas.length ? median(sigmas) : 0;
}

/**
 * σ of a map value for white current noise σ_I: σ_I·√(Σ w²) (exact for independent samples).
 *
 * Parameters
 * ----------
 * functional : PixelFunctional
 *     A map's weights over the bias samples.
 * sigmaA : number
 *     White-noise σ of the current per sample, A.
 *
 * Returns
 * -------
 * number
 *     σ of the map value, in the map's unit.
 *
 * Example
 * -------
 * ```ts
 * functionalNoise({ firstIndex: 0, weights: Float64Array.of(0.5, 0.5) }, 2); // => 1.4142135623730951
 * ```
 */
export function functionalNoise(functional: PixelFunctional, sigmaA: number): number {
  let s = 0;
  for (const w of functional.weights) s += w * w;
  return sigmaA * Math.sqrt(s);
}
