/**
 * dI/dV at every pixel of a grid with one Savitzky–Golay filter.
 */
import { savitzkyGolay } from "../signal/savitzkyGolay.ts";
import { checkGridCube, type GridCube } from "./gridCube.ts";
import type { GridFilter } from "./mapFunctional.ts";

/**
 * The dI/dV cube: each pixel's current differentiated with the same Savitzky–Golay window and
 * order (asymmetric least-squares fits at the ends, as for single curves).
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     Current cube (A), [ny, nx, nbias].
 * filter : GridFilter
 *     windowSamples (odd, ≥ 5) and order, shared by every pixel (dotspec takes them from the
 *     reference spectrum's analysis).
 *
 * Returns
 * -------
 * Float32Array | Float64Array
 *     dI/dV in S, same layout and precision as the cube (NaN for missing pixels).
 *
 * Throws
 * ------
 * DotspecError
 *     The codes of {@link checkGridCube} and of the Savitzky–Golay filter (`signal/invalid-window`, …).
 *
 * Notes
 * -----
 * The maps do not need this cube: a map value is a fixed linear combination of a pixel's current
 * ({@link mapFunctional}), equal to the same combination of this cube's values. It is here for
 * users who want the per-pixel spectra (memory: one more cube).
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964).
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * const didv = gridConductance(cube, { windowSamples: 15, order: 3 });
 * didv.length; // => 138816 (one value per current sample)
 * ```
 */
export function gridConductance(cube: GridCube, filter: GridFilter): Float32Array | Float64Array {
  checkGridCube(cube);
  const nb = cube.biasV.count;
  const nPix = cube.xNM.count * cube.yNM.count;
  const out = cube.currentA instanceof Float32Array ? new Float32Array(cube.currentA.length) : new Float64Array(cube.currentA.length);
  for (let p = 0; p < nPix; p++) {
    if (cube.missing && cube.missing[p]) {
      out.fill(NaN, p * nb, (p + 1) * nb);
      continue;
    }
    const d = savitzkyGolay(cube.currentA.subarray(p * nb, (p + 1) * nb), { windowSamples: filter.windowSamples, order: filter.order, derivative: 1, stepV: cube.biasV.step });
    out.set(d, p * nb);
  }
  return out;
}
