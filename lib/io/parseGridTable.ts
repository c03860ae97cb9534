/**
 * Reading a grid stored as a long table: one row per sample with the columns x (nm), y (nm),
 * bias and current.
 */
import type { GridCube } from "../grid/gridCube.ts";
import type { Delimiter } from "./cells.ts";
import {
  addGridSample,
  addGridValues,
  gridAccumulator,
  gridAxes,
  gridCubeFrom,
  gridTableLayout,
  gridValueSets,
  readGridRow,
  type GridAccumulator,
  type GridTableLayout,
} from "./gridTableRows.ts";

/** Options of {@link parseGridTable}. */
export interface ParseGridTableOptions {
  /** Name of the table for messages and the cube's source. Default "grid table". */
  source?: string;
}

/** How the table was read. */
export interface GridTableRecord {
  source: string;
  delimiter: Delimiter;
  decimalComma: boolean;
  /** The header cells of the x, y, bias and current columns as written. */
  columns: { x: string; y: string; bias: string; current: string };
  /** Units of bias and current (SI when the header gave none). */
  units: { bias: string; current: string };
  /** Data rows read. */
  rows: number;
  /** Pixels of the regular grid. */
  pixels: number;
  /** Positions [x, y] (nm) of the grid pixels with no data or an incomplete sweep (they are left out of every map). */
  missingPixelsNM: [number, number][];
  warnings: string[];
}

/** Tolerances of the grid reconstruction (locked by a test). */
export const GRID_TABLE_DEFAULTS = Object.freeze({
  /** Positions and biases may sit off their regular grid by this fraction of a step. */
  gridTolerance: 0.05,
  /**
   * The regular grid may hold at most this many points (pixels × biases) per row of the table:
   * more means the values are not on one grid (or nearly all pixels are missing), and the cube
   * would be mostly empty — refused before it is allocated.
   */
  maxPointsPerRow: 16,
});

/**
 * Parses a long-table grid: delimited text (comma, semicolon, tab or whitespace; `#`/`%` comment
 * lines) with a header naming `x (nm)`, `y (nm)`, a bias column and a current column (units as the
 * curve importer reads them: `bias (mV)`, `Current [pA]`, `bias_V`, …), one row per sample.
 *
 * Parameters
 * ----------
 * text : string
 *     The file's text.
 * options : ParseGridTableOptions, optional
 *     source (default "grid table").
 *
 * Returns
 * -------
 * { cube: GridCube; record: GridTableRecord }
 *     The cube (Float64Array, current in A; missing pixels flagged) and how it was read.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/no-header` (no header row), `io/missing-column` (x, y, bias or current not found: the
 *     message lists the headers), `io/position-unit` (x or y not in nm), `io/unknown-unit`,
 *     `io/ragged-row` (a row with too few cells or a non-number, naming the line), `io/not-grid`
 *     (positions or biases not on a regular grid, naming the value; a grid far larger than the
 *     table).
 *
 * Notes
 * -----
 * 1. Header: the first non-comment line that is not a data row; the delimiter and decimal
 *    separator from the data lines ({@link detectDelimiter}); each header cell taken apart by
 *    {@link readColumnHeader} (the curve importer's rules). x and y are the columns named `x` and
 *    `y` (unit nm); bias and current the first columns of those roles.
 * 2. Axes (pass 1 over the rows): the distinct x, y and bias values, each on a regular grid
 *    (step = the smallest spacing, every value within 5 % of a step of start + k·step); a grid of
 *    more than `maxPointsPerRow` points per row is refused before it is allocated.
 * 3. Samples (pass 2) at the same pixel and bias (there-and-back sweeps) are averaged. A pixel with no
 *    sample, or without a sample at every bias, is missing: its current is 0 and it is flagged.
 *
 * Example
 * -------
 * ```ts
 * const rows = ["x (nm),y (nm),bias (V),current (pA)"];
 * for (const y of [0, 0.5]) for (const x of [0, 0.5]) for (const v of [-1, -0.5, 0, 0.5, 1]) rows.push(`${x},${y},${v},${v ** 3}`);
 * parseGridTable(rows.join("\n")).cube.xNM;
 * // => { start: 0, step: 0.5, count: 2 }
 * ```
 */
export function parseGridTable(text: string, options: ParseGridTableOptions = {}): { cube: GridCube; record: GridTableRecord } {
  const source = options.source ?? "grid table";
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\r|\n/);
  const layout = gridTableLayout(lines, source);
  const row = new Float64Array(4);
  // Pass 1: the distinct values of each axis; pass 2: the samples onto the grid.
  const sets = gridValueSets();
  for (let li = layout.headerLine + 1; li < lines.length; li++) if (readGridRow(lines[li], li, layout, source, row)) addGridValues(sets, row, li, source);
  const axes = gridAxes(sets, GRID_TABLE_DEFAULTS.gridTolerance, GRID_TABLE_DEFAULTS.maxPointsPerRow, source);
  const acc = gridAccumulator(axes);
  for (let li = layout.headerLine + 1; li < lines.length; li++) if (readGridRow(lines[li], li, layout, source, row)) addGridSample(acc, row);
  return gridTableResult(acc, layout, sets.rows, source);
}

/**
 * The cube and record of a long table from its accumulated samples (the last stage of
 * {@link parseGridTable} and of the streaming file reader).
 */
export function gridTableResult(acc: GridAccumulator, layout: GridTableLayout, rows: number, source: string): { cube: GridCube; record: GridTableRecord } {
  const warnings = [...layout.warnings];
  const { cube, missingPixelsNM } = gridCubeFrom(acc, source, warnings);
  return {
    cube,
    record: {
      source,
      delimiter: layout.delimiter,
      decimalComma: layout.decimalComma,
      columns: layout.columns,
      units: { bias: layout.biasUnit.unit, current: layout.currentUnit.unit },
      rows,
      pixels: cube.xNM.count * cube.yNM.count,
      missingPixelsNM,
      warnings,
    },
  };
}
