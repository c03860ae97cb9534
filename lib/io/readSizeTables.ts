/**
 * Reading the tables of a size series from disk: the size table (META.csv), whose rows must name
 * curve files inside the series folder, and the optical table.
 */
import { readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { DotspecError } from "../util/errors.ts";
import { decodeTextBytes } from "./decodeTextBytes.ts";
import { parseOpticalTable, type OpticalTableRow } from "./parseOpticalTable.ts";
import { parseSizeMeta, type SizeMetaRow } from "./parseSizeMeta.ts";

/** Options of {@link readTextFile}, {@link readSizeMetaFile} and {@link readOpticalFile}. */
export interface ReadTableOptions {
  /**
   * Called with each warning about how the file was read (today: "PATH: the file is not valid
   * UTF-8; read as Windows-1252 (Latin-1) text"), so that the caller can report it beside its
   * own. Default: none (the warning is dropped).
   */
  onWarning?: (message: string) => void;
}

/**
 * Reads a small text file (a table, a material file), decoded as every reader decodes text
 * ({@link decodeTextBytes}: UTF-16 by its byte-order mark, UTF-8, else Windows-1252).
 *
 * Parameters
 * ----------
 * path : string
 *     The file.
 * what : string
 *     What it is, for the message ("size table", "material file").
 * options : ReadTableOptions, optional
 *     `onWarning`, called with "PATH: …" when the file was not UTF-8.
 *
 * Returns
 * -------
 * string
 *     Its text.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unreadable` naming the file and the reason (no such file, a folder, permission);
 *     `io/binary` when the file holds NUL bytes outside UTF-16.
 *
 * Example
 * -------
 * ```ts
 * JSON.parse(readTextFile("sample-curves/grid/dot-grid.json", "grid sidecar")).currentUnit; // => "pA"
 * ```
 */
export function readTextFile(path: string, what: string, options: ReadTableOptions = {}): string {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "is a folder, not a table" : code === "EACCES" ? "permission denied" : (err as Error).message;
    throw new DotspecError("io/unreadable", `${path}: the ${what} cannot be read (${why})`);
  }
  const { text, warning } = decodeTextBytes(bytes, path, `a ${what}`, "save it as UTF-8 text");
  if (warning !== null) options.onWarning?.(`${path}: ${warning}`);
  return text;
}

/** A size-table row with the curve file's path as it can be opened. */
export interface SizeMetaFileRow extends SizeMetaRow {
  /** `dir` joined with the row's file. */
  path: string;
}

/**
 * Reads a size table and checks that every file it names exists in the series folder.
 *
 * Parameters
 * ----------
 * path : string
 *     The size table (META.csv).
 * dir : string
 *     The series folder the table's file names are relative to.
 * options : ReadTableOptions, optional
 *     `onWarning`, called with "PATH: …" when the table was not UTF-8.
 *
 * Returns
 * -------
 * SizeMetaFileRow[]
 *     The rows of {@link parseSizeMeta}, each with `path` = dir/file.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unreadable` (the table), `io/meta-missing-file` naming the line and the file when a
 *     file does not exist or is not a file, and every error of {@link parseSizeMeta}.
 *
 * Example
 * -------
 * ```ts
 * readSizeMetaFile("sample-curves/series/META.csv", "sample-curves/series/curves")[0];
 * // => { line: 3, file: "qd-7-s01-1.csv", dot: "QD-7-S01", radiusNM: 1.5, eta: 0.86, notes: null,
 * //      path: "sample-curves/series/curves/qd-7-s01-1.csv" }
 * ```
 */
export function readSizeMetaFile(path: string, dir: string, options: ReadTableOptions = {}): SizeMetaFileRow[] {
  const rows = parseSizeMeta(readTextFile(path, "size table", options), path);
  return rows.map((row) => {
    const full = join(dir, row.file);
    let isFile = false;
    try {
      isFile = statSync(full).isFile();
    } catch {
      isFile = false;
    }
    if (!isFile) {
      throw new DotspecError("io/meta-missing-file", `${path}: line ${row.line} (${row.file.length > 60 ? row.file.slice(0, 57) + "..." : row.file}): no such file in ${dir}; check the name, or remove the row`);
    }
    return { ...row, path: full };
  });
}

/**
 * Reads an optical table.
 *
 * Parameters
 * ----------
 * path : string
 *     The table file.
 * options : ReadTableOptions, optional
 *     `onWarning`, called with "PATH: …" when the table was not UTF-8.
 *
 * Returns
 * -------
 * OpticalTableRow[]
 *     See {@link parseOpticalTable}.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unreadable`, and every error of {@link parseOpticalTable}.
 *
 * Example
 * -------
 * ```ts
 * readOpticalFile("sample-curves/series/optical.csv")[0];
 * // => { line: 3, radiusNM: 1.5, peaksEV: [2.671, 3.581] }
 * ```
 */
export function readOpticalFile(path: string, options: ReadTableOptions = {}): OpticalTableRow[] {
  return parseOpticalTable(readTextFile(path, "optical table", options), path);
}
