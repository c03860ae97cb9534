/**
 * Reading a long-table grid file with bounded memory: the file is streamed twice (values, then
 * the cube), never held as a whole text. Node only.
 */
import { statSync } from "node:fs";
import type { GridCube } from "../grid/gridCube.ts";
import { DotspecError } from "../util/errors.ts";
import { forEachFileLine, withFileEncoding, type FileEncoding } from "./fileLines.ts";
import { GRID_TABLE_DEFAULTS, gridTableResult, type GridTableRecord } from "./parseGridTable.ts";
import {
  addGridSample,
  addGridValues,
  GRID_TABLE_ROWS_DEFAULTS,
  gridAccumulator,
  gridAxes,
  gridTableLayout,
  gridValueSets,
  isGridComment,
  readGridRow,
  type GridTableLayout,
  type GridValueSets,
} from "./gridTableRows.ts";
import { startsLikeNumber } from "./cells.ts";

/** Options of {@link readGridTableFile}. */
export interface ReadGridTableFileOptions {
  /** Called as the file is read, with the fraction done (0 … 1; the file is read twice). Default: none. */
  onProgress?: (fraction: number) => void;
  /** Bytes read per call. Default: FILE_LINES_DEFAULTS.chunkBytes (1048576, 1 MiB). */
  chunkBytes?: number;
}

/**
 * Reads a long-table grid file, streamed.
 *
 * Parameters
 * ----------
 * path : string
 *     The table (any size; the text is never held whole).
 * options : ReadGridTableFileOptions, optional
 *     onProgress (fraction read), chunkBytes (default 1 MiB).
 *
 * Returns
 * -------
 * { cube: GridCube; record: GridTableRecord }
 *     The same as {@link parseGridTable} on the file's decoded text.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found`, `io/read-failed`, `io/binary` (NUL bytes outside UTF-16), and every error of
 *     {@link parseGridTable}.
 *
 * Notes
 * -----
 * 1. Encoding as for every reader: UTF-16 by its byte-order mark, UTF-8, else (a second read)
 *    Windows-1252 with a warning.
 * 2. Pass 1: the head of the file (until 50 lines that start like a number) gives the layout
 *    ({@link gridTableLayout}); every row is read and the distinct x, y and bias values are kept.
 * 3. The regular axes; the cube is allocated once (refused first when far larger than the table).
 * 4. Pass 2: every row is read again and added to its grid point.
 * Memory: one chunk of text, the distinct values and the cube (8 bytes and 2 bytes of count per
 * grid point) — not the rows.
 *
 * Example
 * -------
 * ```ts
 * import { writeFileSync } from "node:fs";
 * import { tmpdir } from "node:os";
 * import { join } from "node:path";
 * const rows = ["x (nm),y (nm),bias (V),current (pA)"];
 * for (const y of [0, 0.5]) for (const x of [0, 0.5]) for (const v of [-1, -0.5, 0, 0.5, 1]) rows.push(`${x},${y},${v},${v ** 3}`);
 * const path = join(tmpdir(), "dotspec-example-grid.csv");
 * writeFileSync(path, rows.join("\n"));
 * readGridTableFile(path, { onProgress: (f) => {} }).cube.biasV.count; // => 5
 * ```
 */
export function readGridTableFile(path: string, options: ReadGridTableFileOptions = {}): { cube: GridCube; record: GridTableRecord } {
  const source = path;
  let size = 0;
  try {
    size = statSync(path).size;
  } catch {
    throw new DotspecError("io/not-found", `${path}: no such file`);
  }
  const progress = (offset: number) => (options.onProgress ? (done: number) => options.onProgress!((offset + done) / Math.max(1, 2 * size)) : undefined);
  const read = (encoding: FileEncoding, visit: (line: string, index: number) => void, offset: number) =>
    forEachFileLine(path, encoding, visit, { chunkBytes: options.chunkBytes, onBytes: progress(offset), what: "a grid table" });

  let layout: GridTableLayout | null = null;
  let sets: GridValueSets = gridValueSets();
  const row = new Float64Array(4);
  const { encoding, warning } = withFileEncoding(path, (enc) => {
    layout = null;
    sets = gridValueSets();
    const head: string[] = [];
    let samples = 0;
    const take = (line: string, li: number) => {
      if (li > layout!.headerLine && readGridRow(line, li, layout!, source, row)) addGridValues(sets, row, li, source);
    };
    const decide = () => {
      layout = gridTableLayout(head, source);
      head.forEach(take);
      head.length = 0;
    };
    read(
      enc,
      (line, li) => {
        if (layout !== null) return take(line, li);
        head.push(line);
        if (!isGridComment(line) && startsLikeNumber(line)) samples++;
        if (samples >= GRID_TABLE_ROWS_DEFAULTS.sampleLines || head.length >= GRID_TABLE_ROWS_DEFAULTS.headLines) decide();
      },
      0,
    );
    if (layout === null) decide();
  });
  const found = layout as unknown as GridTableLayout;
  const axes = gridAxes(sets, GRID_TABLE_DEFAULTS.gridTolerance, GRID_TABLE_DEFAULTS.maxPointsPerRow, source);
  const acc = gridAccumulator(axes);
  read(encoding, (line, li) => {
    if (li > found.headerLine && readGridRow(line, li, found, source, row)) addGridSample(acc, row);
  }, size);
  const result = gridTableResult(acc, found, sets.rows, source);
  if (warning) result.record.warnings.unshift(warning);
  return result;
}
