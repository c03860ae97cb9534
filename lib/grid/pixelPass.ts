/**
 * The per-pixel work of grid spectroscopy, as passes over a range of pixels that can run in any
 * thread and be combined: the sum of the spectra of selected pixels, and linear maps.
 */
import type { GridCube } from "./gridCube.ts";

/** A linear functional of one pixel's current: value = Σ_k weights[k]·I[firstIndex + k]. */
export interface PixelFunctional {
  /** First bias index the weights apply to. */
  firstIndex: number;
  /** Weights, per ampere of current (their unit is the map's unit per A). */
  weights: Float64Array;
}

/** One pass over the pixels. */
export type PixelPass =
  /** Sum of the current spectra of the selected pixels (mask 1; null: every pixel), missing pixels left out. */
  | { kind: "spectrumSum"; mask: Uint8Array | null }
  /** Each functional applied to each pixel (NaN for a missing pixel). */
  | { kind: "maps"; functionals: readonly PixelFunctional[] };

/**
 * Runs a pass over the pixels [fromPixel, toPixel) (row-major pixel index iy·nx + ix).
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     The cube (its current may be on a SharedArrayBuffer).
 * pass : PixelPass
 *     What to compute: "spectrumSum" (with a pixel mask or null for every pixel) or "maps" (with
 *     the functionals to apply).
 * fromPixel : number
 *     First pixel of the share (row-major index iy·nx + ix).
 * toPixel : number
 *     One past the last pixel of the share.
 *
 * Returns
 * -------
 * Float64Array
 *     spectrumSum: nbias sums (A) followed by the number of pixels summed;
 *     maps: for functional m and pixel p, the value at m·(toPixel − fromPixel) + (p − fromPixel).
 *
 * Notes
 * -----
 * Pure: reads the cube, writes only the new array. The cube may live on a SharedArrayBuffer, so
 * worker threads run this on their share of pixels without copying it.
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * const sums = runPixelPass(cube, { kind: "spectrumSum", mask: null }, 0, pixelCount(cube));
 * sums[sums.length - 1]; // => 576 (pixels summed)
 * ```
 */
export function runPixelPass(cube: GridCube, pass: PixelPass, fromPixel: number, toPixel: number): Float64Array {
  const nb = cube.biasV.count;
  const I = cube.currentA;
  const missing = cube.missing;
  if (pass.kind === "spectrumSum") {
    const out = new Float64Array(nb + 1);
    const mask = pass.mask;
    let count = 0;
    for (let p = fromPixel; p < toPixel; p++) {
      if ((missing && missing[p]) || (mask && !mask[p])) continue;
      const base = p * nb;
      for (let k = 0; k < nb; k++) out[k] += I[base + k];
      count++;
    }
    out[nb] = count;
    return out;
  }
  const len = toPixel - fromPixel;
  const fs = pass.functionals;
  const out = new Float64Array(fs.length * len);
  for (let p = fromPixel; p < toPixel; p++) {
    const skip = missing !== null && missing[p] === 1;
    const base = p * nb;
    for (let m = 0; m < fs.length; m++) {
      if (skip) {
        out[m * len + (p - fromPixel)] = NaN;
        continue;
      }
      const { firstIndex, weights } = fs[m];
      const o = base + firstIndex;
      let s = 0;
      for (let k = 0; k < weights.length; k++) s += weights[k] * I[o + k];
      out[m * len + (p - fromPixel)] = s;
    }
  }
  return out;
}

/** One part of a pass: its pixel range and what {@link runPixelPass} returned for it. */
export interface PixelPassPart {
  fromPixel: number;
  toPixel: number;
  values: Float64Array;
}

/**
 * Puts the parts of a pass back together, as if it had run over every pixel at once.
 *
 * Parameters
 * ----------
 * pass : PixelPass
 *     The pass the parts ran.
 * parts : readonly PixelPassPart[]
 *     Each share's pixel range and its values ({@link runPixelPass}).
 * nPixels : number
 *     Pixels of the whole cube (nx·ny).
 * nbias : number
 *     Bias points per spectrum.
 *
 * Returns
 * -------
 * Float64Array
 *     spectrumSum: the sums added (and the counts); maps: functional m, pixel p at m·nPixels + p.
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * const pass = { kind: "spectrumSum", mask: null } as const;
 * const n = pixelCount(cube);
 * const parts = [[0, 300], [300, n]].map(([fromPixel, toPixel]) => ({ fromPixel, toPixel, values: runPixelPass(cube, pass, fromPixel, toPixel) }));
 * combinePixelPass(pass, parts, n, cube.biasV.count)[cube.biasV.count]; // => 576 (as one pass over every pixel)
 * ```
 */
export function combinePixelPass(pass: PixelPass, parts: readonly PixelPassPart[], nPixels: number, nbias: number): Float64Array {
  if (pass.kind === "spectrumSum") {
    const out = new Float64Array(nbias + 1);
    for (const part of parts) for (let k = 0; k <= nbias; k++) out[k] += part.values[k];
    return out;
  }
  const nMaps = pass.functionals.length;
  const out = new Float64Array(nMaps * nPixels);
  for (const { fromPixel, toPixel, values } of parts) {
    const len = toPixel - fromPixel;
    for (let m = 0; m < nMaps; m++) out.set(values.subarray(m * len, (m + 1) * len), m * nPixels + fromPixel);
  }
  return out;
}
