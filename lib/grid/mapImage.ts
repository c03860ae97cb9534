/**
 * A map over the grid: one value per pixel, row-major [ny, nx], with the pixel positions.
 */
import type { GridAxis } from "./gridCube.ts";

/** One value per pixel; NaN where there is no data. */
export interface MapImage {
  /** Values, row-major: pixel (ix, iy) at iy·nx + ix. */
  values: Float64Array;
  /** x positions of the columns, nm. */
  xNM: GridAxis;
  /** y positions of the rows, nm. */
  yNM: GridAxis;
}
