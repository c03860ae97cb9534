/**
 * The reference spectrum of a grid: the mean I–V curve over the dot, a region or one pixel, which
 * the normal single-curve analysis assigns.
 */
import type { Curve } from "../curve.ts";
import { DotspecError } from "../util/errors.ts";
import { axisValues, type GridCube } from "./gridCube.ts";

/**
 * Which pixels make the reference spectrum: "mean" (every pixel with data), one pixel by index,
 * or the pixels within a circle.
 */
export type ReferenceSelection = "mean" | { pixel: [number, number] } | { centreNM: [number, number]; radiusNM: number };

/**
 * The pixel mask of a reference selection (1 = in), or null for every pixel.
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     The cube (its spatial axes).
 * selection : ReferenceSelection
 *     "mean" (every pixel), `{ pixel: [ix, iy] }` (one pixel) or `{ centreNM: [x, y], radiusNM }`
 *     (the pixels within a disc; nm).
 *
 * Returns
 * -------
 * Uint8Array | null
 *     One byte per pixel (1 = in the reference), or null for every pixel.
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/bad-reference` for a pixel outside the grid, a bad circle, or a selection with no
 *     pixel holding data.
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * referenceMask(cube, { centreNM: [0, 0], radiusNM: 1.5 })!.reduce((n, v) => n + v, 0); // => 80 (pixels within 1.5 nm)
 * referenceMask(cube, "mean"); // => null (every pixel)
 * ```
 */
export function referenceMask(cube: GridCube, selection: ReferenceSelection): Uint8Array | null {
  const nx = cube.xNM.count, ny = cube.yNM.count;
  if (selection === "mean") return null;
  const mask = new Uint8Array(nx * ny);
  if (typeof selection === "object" && "pixel" in selection) {
    const [ix, iy] = selection.pixel;
    if (!(Number.isInteger(ix) && Number.isInteger(iy) && ix >= 0 && iy >= 0 && ix < nx && iy < ny)) {
      throw new DotspecError("grid/bad-reference", `reference pixel must be [ix, iy] with 0 ≤ ix < ${nx} and 0 ≤ iy < ${ny}; got ${JSON.stringify(selection.pixel)}`);
    }
    mask[iy * nx + ix] = 1;
  } else if (typeof selection === "object" && "centreNM" in selection) {
    const [cx, cy] = selection.centreNM;
    const r = selection.radiusNM;
    if (![cx, cy, r].every(Number.isFinite) || !(r > 0)) {
      throw new DotspecError("grid/bad-reference", `reference circle needs a finite centreNM [x, y] and radiusNM > 0; got ${JSON.stringify(selection)}`);
    }
    const xs = axisValues(cube.xNM), ys = axisValues(cube.yNM);
    for (let iy = 0; iy < ny; iy++) for (let ix = 0; ix < nx; ix++) if ((xs[ix] - cx) ** 2 + (ys[iy] - cy) ** 2 <= r * r) mask[iy * nx + ix] = 1;
  } else {
    throw new DotspecError("grid/bad-reference", `reference must be "mean", {pixel: [ix, iy]} or {centreNM: [x, y], radiusNM}; got ${JSON.stringify(selection)}`);
  }
  let any = false;
  for (let p = 0; p < mask.length; p++) if (mask[p] && !(cube.missing && cube.missing[p])) any = true;
  if (!any) throw new DotspecError("grid/bad-reference", `the reference selection ${JSON.stringify(selection)} holds no pixel with data: choose pixels inside the grid`);
  return mask;
}

/**
 * The reference curve from a spectrum sum ({@link runPixelPass} "spectrumSum": nbias sums, then
 * the pixel count).
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     The cube the sums came from (its bias axis and source).
 * sums : Float64Array
 *     A "spectrumSum" pass's result: nbias current sums (A), then the pixel count.
 * selection : ReferenceSelection
 *     The selection the sums were taken over (named in the curve's source).
 *
 * Returns
 * -------
 * Curve
 *     The mean current spectrum of the selected pixels, as a curve for {@link analyzeCurve}.
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/bad-reference` when no pixel was summed.
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * const sums = runPixelPass(cube, { kind: "spectrumSum", mask: null }, 0, pixelCount(cube));
 * referenceCurve(cube, sums, "mean").meta.source; // => "sample-curves/grid/dot-grid.npy (reference: mean of 576 pixels)"
 * ```
 */
export function referenceCurve(cube: GridCube, sums: Float64Array, selection: ReferenceSelection): Curve {
  const nb = cube.biasV.count;
  const count = sums[nb];
  if (!(count > 0)) throw new DotspecError("grid/bad-reference", "the reference spectrum holds no pixel with data");
  const currentA = new Float64Array(nb);
  for (let k = 0; k < nb; k++) currentA[k] = sums[k] / count;
  const what = selection === "mean" ? `mean of ${count} pixels` : "pixel" in selection ? `pixel ${selection.pixel.join(", ")}` : `mean of ${count} pixels within ${selection.radiusNM} nm`;
  return { biasV: axisValues(cube.biasV), currentA, sweeps: [currentA], didvS: null, meta: { source: `${cube.source} (reference: ${what})`, metadata: {} } };
}
