/**
 * Reading a grid from disk: an NPY array with its JSON sidecar, or a long table.
 */
import { readFileSync, statSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";
import { gridSidecarName, isNpyGridName, parseGridBytes, type GridFileResult } from "./parseGridBytes.ts";
import { readJsonFile } from "./readJsonFile.ts";
import { readNpyGrid } from "./readNpyGrid.ts";
import { MAX_CURVE_FILE_BYTES } from "./readCurveFile.ts";

export type { GridFileResult } from "./parseGridBytes.ts";

/** Options of {@link readGridFile}. */
export interface ReadGridFileOptions {
  /** The sidecar of an `.npy` file. Default: the same path with `.json` in place of `.npy`. */
  sidecar?: string;
  /** Put an NPY cube on a SharedArrayBuffer (for worker threads). Default false. */
  shared?: boolean;
}

/**
 * Reads a grid file: `.npy` (with its sidecar) or a delimited-text long table (any other extension).
 *
 * Parameters
 * ----------
 * path : string
 *     The file.
 * options : ReadGridFileOptions, optional
 *     sidecar (default `<name>.json`), shared (default false).
 *
 * Returns
 * -------
 * GridFileResult
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found`, `io/too-large` (a table over 256 MiB), `io/unreadable-json`/`io/invalid-json`
 *     for the sidecar, and every error of {@link readNpyGrid} and {@link parseGridTable}.
 *
 * Example
 * -------
 * ```ts
 * readGridFile("dot.npy").cube.xNM; // the axes from dot.json
 * ```
 */
export function readGridFile(path: string, options: ReadGridFileOptions = {}): GridFileResult {
  if (typeof path !== "string" || path === "") throw new DotspecError("io/bad-path", `readGridFile: path must be a non-empty string; got ${JSON.stringify(path)}`);
  let size: number;
  try {
    size = statSync(path).size;
  } catch {
    throw new DotspecError("io/not-found", `${path}: no such file`);
  }
  if (isNpyGridName(path)) {
    const sidecarPath = options.sidecar ?? gridSidecarName(path);
    const r = readNpyGrid(path, readJsonFile(sidecarPath), { shared: options.shared ?? false }, sidecarPath);
    return { cube: r.cube, layout: "npy", npy: { header: r.header, sidecar: r.sidecar }, table: null, warnings: [] };
  }
  if (size > MAX_CURVE_FILE_BYTES) throw new DotspecError("io/too-large", `${path}: ${size} bytes is more than a grid table may hold (${MAX_CURVE_FILE_BYTES}); store large grids as NPY`);
  // The table's bytes are decoded and parsed as a page parses a file it was given.
  return parseGridBytes(readFileSync(path), { source: path });
}

/**
 * Size of a file in bytes; NaN when it cannot be read (the reader then says why).
 *
 * Example
 * -------
 * ```ts
 * fileBytes("dot.npy"); // => 33554560
 * ```
 */
export function fileBytes(path: string): number {
  try {
    return statSync(path).size;
  } catch {
    return NaN;
  }
}
