/**
 * Reading a grid from disk: an NPY array with its JSON sidecar, or a long table.
 */
import { statSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";
import { gridSidecarName, isNpyGridName, type GridFileResult } from "./parseGridBytes.ts";
import { readGridTableFile } from "./readGridTableFile.ts";
import { readJsonFile } from "./readJsonFile.ts";
import { readNpyGrid } from "./readNpyGrid.ts";

export type { GridFileResult } from "./parseGridBytes.ts";

/** Options of {@link readGridFile}. */
export interface ReadGridFileOptions {
  /** The sidecar of an `.npy` file. Default: the same path with `.json` in place of `.npy`. */
  sidecar?: string;
  /** Put an NPY cube on a SharedArrayBuffer (for worker threads). Default false. */
  shared?: boolean;
  /** Called while a long table is read (streamed), with the fraction done (0 … 1). Default: none. */
  onProgress?: (fraction: number) => void;
}

/**
 * Reads a grid file: `.npy` (with its sidecar) or a delimited-text long table (any other extension).
 *
 * Parameters
 * ----------
 * path : string
 *     The file.
 * options : ReadGridFileOptions, optional
 *     sidecar (default `<name>.json`), shared (default false), onProgress (default none).
 *
 * Returns
 * -------
 * GridFileResult
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found`, `io/is-directory` (a folder given), `io/unreadable-json`/`io/invalid-json` for the sidecar, and every error of
 *     {@link readNpyGrid} and {@link readGridTableFile} (those of {@link parseGridTable}).
 *
 * Example
 * -------
 * ```ts
 * readGridFile("sample-curves/grid/dot-grid.npy").cube.xNM; // => { start: -3.45, step: 0.3, count: 24 } (from dot-grid.json)
 * ```
 */
export function readGridFile(path: string, options: ReadGridFileOptions = {}): GridFileResult {
  if (typeof path !== "string" || path === "") throw new DotspecError("io/bad-path", `readGridFile: path must be a non-empty string; got ${JSON.stringify(path)}`);
  let isFolder: boolean;
  try {
    isFolder = statSync(path).isDirectory();
  } catch {
    throw new DotspecError("io/not-found", `${path}: no such file`);
  }
  if (isFolder) {
    throw new DotspecError("io/is-directory", `${path}: is a folder, not a grid file; give the grid's .npy file (its axes in the .json beside it) or its long table (.csv/.tsv/.txt)`);
  }
  if (isNpyGridName(path)) {
    const sidecarPath = options.sidecar ?? gridSidecarName(path);
    const r = readNpyGrid(path, readJsonFile(sidecarPath), { shared: options.shared ?? false }, sidecarPath);
    return { cube: r.cube, layout: "npy", npy: { header: r.header, sidecar: r.sidecar }, table: null, warnings: [] };
  }
  // Streamed: memory holds the cube, never the whole text.
  const r = readGridTableFile(path, { onProgress: options.onProgress });
  return { cube: r.cube, layout: "table", npy: null, table: r.record, warnings: r.record.warnings };
}

/**
 * Size of a file in bytes; NaN when it cannot be read (the reader then says why).
 *
 * Parameters
 * ----------
 * path : string
 *     The file.
 *
 * Returns
 * -------
 * number
 *     Its size in bytes; NaN when it cannot be read.
 *
 * Example
 * -------
 * ```ts
 * fileBytes("sample-curves/grid/dot-grid.npy"); // => 555392
 * ```
 */
export function fileBytes(path: string): number {
  try {
    return statSync(path).size;
  } catch {
    return NaN;
  }
}
