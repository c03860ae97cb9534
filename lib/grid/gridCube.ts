/**
 * The value grid spectroscopy passes on: a current cube over a regular (x, y) grid with one
 * common bias axis, stored flat in one typed array.
 */
import { DotspecError } from "../util/errors.ts";

/** A regular axis: `count` values `startX + i·stepX`. */
export interface GridAxis {
  /** First value (nm for positions, V for bias). */
  start: number;
  /** Step (> 0; nm for positions, V for bias). */
  step: number;
  /** Number of values (≥ 1). */
  count: number;
}

/**
 * A grid of I–V sweeps. Layout: C order, shape [ny, nx, nbias]; the current of pixel (ix, iy) at
 * bias index k is `currentA[(iy·nx + ix)·nbias + k]`.
 */
export interface GridCube {
  /** Current in amperes, C order [ny, nx, nbias]. May live on a SharedArrayBuffer (workers read it in place). */
  currentA: Float32Array | Float64Array;
  /** x positions of the columns, nm. */
  xNM: GridAxis;
  /** y positions of the rows, nm. */
  yNM: GridAxis;
  /** Sample bias, V (ascending). */
  biasV: GridAxis;
  /** 1 for a pixel without data (its current is 0 and it is left out of every map); null when none is missing. */
  missing: Uint8Array | null;
  /** Where the cube came from (file name or a label). */
  source: string;
}

/**
 * Number of pixels nx·ny of a cube.
 *
 * Parameters
 * ----------
 * cube : Pick<GridCube, "xNM" | "yNM">
 *     A cube, or anything with its two spatial axes.
 *
 * Returns
 * -------
 * number
 *     nx·ny.
 *
 * Example
 * -------
 * ```ts
 * pixelCount({ xNM: { start: 0, step: 0.5, count: 16 }, yNM: { start: 0, step: 0.5, count: 8 } }); // => 128
 * ```
 */
export function pixelCount(cube: Pick<GridCube, "xNM" | "yNM">): number {
  return cube.xNM.count * cube.yNM.count;
}

/**
 * The values of an axis as a new Float64Array.
 *
 * Parameters
 * ----------
 * axis : GridAxis
 *     `{ start, step, count }` in the axis's unit.
 *
 * Returns
 * -------
 * Float64Array
 *     start + i·step for i = 0 … count − 1.
 *
 * Example
 * -------
 * ```ts
 * axisValues({ start: -1, step: 0.5, count: 3 }); // => Float64Array [-1, -0.5, 0]
 * ```
 */
export function axisValues(axis: GridAxis): Float64Array {
  const out = new Float64Array(axis.count);
  for (let i = 0; i < axis.count; i++) out[i] = axis.start + i * axis.step;
  return out;
}

/**
 * Checks that a cube is consistent: axes with a positive step and a positive integer count, and
 * a current array (Float32Array or Float64Array) of exactly nx·ny·nbias values.
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     The cube to check.
 *
 * Returns
 * -------
 * GridCube
 *     The same cube (for chaining).
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/bad-axis` naming the axis and the bad field; `grid/bad-shape` when the array length
 *     is not nx·ny·nbias; `grid/bad-dtype` when the current is not a float typed array;
 *     `grid/bad-missing` for a mask of the wrong length.
 *
 * Example
 * -------
 * ```ts
 * const biasV = { start: -1, step: 0.5, count: 5 };
 * const cube = { xNM: { start: 0, step: 0.5, count: 2 }, yNM: { start: 0, step: 0.5, count: 1 }, biasV, currentA: new Float64Array(10), source: "demo" };
 * checkGridCube(cube) === cube; // => true
 * checkGridCube({ ...cube, currentA: new Float64Array(9) }); // throws: 9 values where 2·1·5 = 10 are needed
 * ```
 */
export function checkGridCube(cube: GridCube): GridCube {
  for (const name of ["xNM", "yNM", "biasV"] as const) {
    const a = cube[name];
    if (!a || !Number.isFinite(a.start)) throw new DotspecError("grid/bad-axis", `${name}.start must be a finite number; got ${a?.start}`);
    if (!(Number.isFinite(a.step) && a.step > 0)) throw new DotspecError("grid/bad-axis", `${name}.step must be a finite number greater than 0; got ${a.step}`);
    if (!(Number.isInteger(a.count) && a.count >= 1)) throw new DotspecError("grid/bad-axis", `${name}.count must be an integer of at least 1; got ${a.count}`);
  }
  if (cube.biasV.count < 5) throw new DotspecError("grid/bad-axis", `biasV.count must be at least 5 (a Savitzky–Golay window); got ${cube.biasV.count}`);
  if (!(cube.currentA instanceof Float32Array || cube.currentA instanceof Float64Array)) {
    throw new DotspecError("grid/bad-dtype", `currentA must be a Float32Array or Float64Array; got ${Object.prototype.toString.call(cube.currentA)}`);
  }
  const n = cube.xNM.count * cube.yNM.count * cube.biasV.count;
  if (cube.currentA.length !== n) {
    throw new DotspecError(
      "grid/bad-shape",
      `currentA holds ${cube.currentA.length} values but ny × nx × nbias = ${cube.yNM.count} × ${cube.xNM.count} × ${cube.biasV.count} = ${n}: check the axes`,
    );
  }
  if (cube.missing && cube.missing.length !== cube.xNM.count * cube.yNM.count) {
    throw new DotspecError("grid/bad-missing", `missing must have one entry per pixel (${cube.xNM.count * cube.yNM.count}); got ${cube.missing.length}`);
  }
  return cube;
}
