/**
 * Reading a grid from the bytes of its file (and, for NPY, the text of its sidecar): the layout
 * chosen by the file name as `readGridFile` chooses it, with its messages, and no file system, so
 * a page reads a grid the user picked exactly as `dotspec grid` reads it from disk.
 */
import type { GridCube } from "../grid/gridCube.ts";
import { DotspecError } from "../util/errors.ts";
import { decodeTextBytes } from "./decodeTextBytes.ts";
import { parseGridTable, type GridTableRecord } from "./parseGridTable.ts";
import { parseJsonText } from "./parseJsonText.ts";
import { parseNpyGridBytes, type NpyGridResult } from "./parseNpyGridBytes.ts";

/** What a grid reader read: the cube and, by layout, how. */
export interface GridFileResult {
  cube: GridCube;
  layout: "npy" | "table";
  /** The NPY header and sidecar (layout "npy"), or null. */
  npy: Omit<NpyGridResult, "cube"> | null;
  /** The table record (layout "table"), or null. */
  table: GridTableRecord | null;
  warnings: string[];
}

/** Options of {@link parseGridBytes}. */
export interface ParseGridBytesOptions {
  /** The file's name: one ending in `.npy` is read as NPY, any other as a long table; put in front of messages. Default: PARSE_GRID_BYTES_DEFAULTS.source ("grid table"). */
  source?: string;
  /** The text of the JSON sidecar of an `.npy` file. Required for NPY; ignored for a table. Default none. */
  sidecarText?: string;
  /** The sidecar's name, for messages. Default: `source` with `.json` in place of `.npy`. */
  sidecarSource?: string;
}

/** Defaults of {@link parseGridBytes} (locked by a test). */
export const PARSE_GRID_BYTES_DEFAULTS = Object.freeze({
  source: "grid table",
});

/**
 * The sidecar name that goes with an `.npy` file: the same name with `.json`.
 *
 * Parameters
 * ----------
 * npyName : string
 *     The NPY file's name or path.
 *
 * Returns
 * -------
 * string
 *     The same with `.json` in place of the `.npy` ending (any case).
 *
 * Example
 * -------
 * ```ts
 * gridSidecarName("scans/dot-03.NPY"); // => "scans/dot-03.json"
 * ```
 */
export function gridSidecarName(npyName: string): string {
  return npyName.replace(/\.npy$/i, ".json");
}

/**
 * Whether a file name is read as NPY (ends in `.npy`, any case) rather than as a long table.
 *
 * Parameters
 * ----------
 * name : string
 *     A file name or path.
 *
 * Returns
 * -------
 * boolean
 *     True when it ends in `.npy` (any case).
 *
 * Example
 * -------
 * ```ts
 * isNpyGridName("dot.npy"); // => true
 * ```
 */
export function isNpyGridName(name: string): boolean {
  return /\.npy$/i.test(name);
}

/**
 * Reads a grid from the bytes of its file: NPY with its sidecar, or a delimited-text long table.
 *
 * Parameters
 * ----------
 * bytes : Uint8Array
 *     The whole file (in a browser, `new Uint8Array(await file.arrayBuffer())`). Not changed.
 * options : ParseGridBytesOptions, optional
 *     source (the file's name; default "grid table"), sidecarText (required for `.npy`),
 *     sidecarSource (default the source with `.json`).
 *
 * Returns
 * -------
 * GridFileResult
 *     The cube (current in A), the layout, the NPY header and sidecar or the table record, and
 *     the reader's warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-bytes`; `io/no-sidecar` for an `.npy` without its sidecar text; `io/invalid-json`
 *     for a sidecar that is not JSON; every error of {@link parseNpyGridBytes} and
 *     {@link parseGridTable}.
 *
 * Notes
 * -----
 * 1. A name ending in `.npy` selects NPY: the sidecar text is parsed ({@link parseJsonText}) and the
 *    cube read by {@link parseNpyGridBytes}.
 * 2. Anything else is a long table: the bytes are decoded as every reader decodes text
 *    ({@link decodeTextBytes}: UTF-16 by its byte-order mark, UTF-8, else Windows-1252) and parsed
 *    by {@link parseGridTable}.
 *
 * Example
 * -------
 * ```ts
 * import { readFileSync } from "node:fs";
 * const bytes = new Uint8Array(readFileSync("sample-curves/grid/dot-grid.npy"));
 * const r = parseGridBytes(bytes, { source: "dot-grid.npy", sidecarText: readFileSync("sample-curves/grid/dot-grid.json", "utf8") });
 * r.layout; // => "npy"
 * ```
 */
export function parseGridBytes(bytes: Uint8Array, options: ParseGridBytesOptions = {}): GridFileResult {
  if (!(bytes instanceof Uint8Array)) {
    throw new DotspecError("io/not-bytes", `parseGridBytes: bytes must be a Uint8Array (the file's content); got ${bytes === null ? "null" : typeof bytes}`);
  }
  const source = options.source ?? PARSE_GRID_BYTES_DEFAULTS.source;
  if (isNpyGridName(source)) {
    const sidecarSource = options.sidecarSource ?? gridSidecarName(source);
    if (typeof options.sidecarText !== "string") {
      throw new DotspecError("io/no-sidecar", `${source}: an .npy grid needs its JSON sidecar (${sidecarSource}) with the axes and the current unit; open both files together`);
    }
    const r = parseNpyGridBytes(bytes, parseJsonText(options.sidecarText, sidecarSource), { source, sidecarSource });
    return { cube: r.cube, layout: "npy", npy: { header: r.header, sidecar: r.sidecar }, table: null, warnings: [] };
  }
  const { text, warning } = decodeTextBytes(bytes, source, "a grid table", "export the grid as CSV or plain text");
  const r = parseGridTable(text, { source });
  return { cube: r.cube, layout: "table", npy: null, table: r.record, warnings: warning ? [warning, ...r.record.warnings] : r.record.warnings };
}
