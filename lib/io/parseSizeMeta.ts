/**
 * The size table of a series (META.csv): which curve file belongs to which dot, and its size.
 */
import { DotspecError } from "../util/errors.ts";
import { quote } from "./parse/messages.ts";
import { numberCell, readSizeTableRows } from "./sizeTableRows.ts";

/** One row of the size table. */
export interface SizeMetaRow {
  /** Line of the row in the table (1-based), for messages. */
  line: number;
  /** The curve file, relative to the series folder, normalised with `/` separators. */
  file: string;
  /** Dot identifier. */
  dot: string;
  /** Radius, nm (from `radius_nm`, or half of `diameter_nm`). */
  radiusNM: number;
  /** Voltage-division factor η of this curve, or null when the row gives none. */
  eta: number | null;
  /** Free text, or null. */
  notes: string | null;
}

/** Column names of the size table (case-insensitive), required and optional. */
export const SIZE_META_COLUMNS = Object.freeze({
  required: Object.freeze(["file", "dot"]),
  /** One of the two size columns is required. */
  size: Object.freeze(["radius_nm", "diameter_nm"]),
  optional: Object.freeze(["eta", "notes"]),
});

/** Relative tolerance when `radius_nm` and `diameter_nm` are both given, or a dot's radius repeats. */
const SAME_SIZE_RTOL = 1e-6;

/**
 * Parses the size table of a series.
 *
 * Parameters
 * ----------
 * text : string
 *     The table: comma, semicolon or tab separated, `#` comment lines, a header naming `file`,
 *     `dot`, `radius_nm` or `diameter_nm` (or both), and optionally `eta` and `notes`.
 * source : string
 *     The table's file name, put in front of every message.
 *
 * Returns
 * -------
 * SizeMetaRow[]
 *     One per data row, in file order.
 *
 * Throws
 * ------
 * DotspecError
 *     Every message names the table and the line. `io/meta-column` (a column missing or unknown),
 *     `io/meta-file` (empty, absolute or pointing outside the folder with `..`),
 *     `io/meta-duplicate` (a file listed twice), `io/meta-dot` (empty dot id),
 *     `io/meta-size` (size missing, ≤ 0, not a number, radius and diameter disagreeing, or one
 *     dot given two sizes), `io/meta-eta` (η outside (0, 1]), and those of the table reader.
 *
 * Notes
 * -----
 * 1. The file names are read as paths relative to the series folder; `\` is taken as `/`. A
 *    name that is absolute or whose normalised form starts with `..` points outside the folder
 *    and is refused.
 * 2. A dot listed on several rows (several curves) must have the same size on each.
 *
 * Example
 * -------
 * ```ts
 * parseSizeMeta("file,dot,diameter_nm\na.csv,QD-1,4.2\n", "META.csv");
 * // => [{ line: 2, file: "a.csv", dot: "QD-1", radiusNM: 2.1, eta: null, notes: null }]
 * ```
 */
export function parseSizeMeta(text: string, source: string): SizeMetaRow[] {
  const table = readSizeTableRows(text, source, "size table");
  const known = [...SIZE_META_COLUMNS.required, ...SIZE_META_COLUMNS.size, ...SIZE_META_COLUMNS.optional];
  for (const c of table.columns) {
    if (!known.includes(c)) {
      throw new DotspecError("io/meta-column", `${source}: unknown column ${quote(c)} in the size table; the columns are ${known.join(", ")}`);
    }
  }
  for (const c of SIZE_META_COLUMNS.required) {
    if (!table.columns.includes(c)) {
      throw new DotspecError("io/meta-column", `${source}: the size table has no "${c}" column; its header must name file, dot and radius_nm or diameter_nm`);
    }
  }
  if (!SIZE_META_COLUMNS.size.some((c) => table.columns.includes(c))) {
    throw new DotspecError("io/meta-column", `${source}: the size table has neither "radius_nm" nor "diameter_nm"; add one of them`);
  }
  const out: SizeMetaRow[] = [];
  const byFile = new Map<string, number>();
  const byDot = new Map<string, { radiusNM: number; line: number }>();
  for (const { line, cells } of table.rows) {
    const file = cells.file ?? "";
    const where = `${source}: line ${line}${file ? ` (${cut(file)})` : ""}`;
    if (file === "") throw new DotspecError("io/meta-file", `${where}: the file cell is empty; give the curve file relative to the series folder`);
    const path = normalizeRelative(file.replaceAll("\\", "/"));
    if (path.startsWith("/") || /^[A-Za-z]:/.test(path) || path === ".." || path.startsWith("../")) {
      throw new DotspecError("io/meta-file", `${where}: the file points outside the series folder; give a path relative to that folder, without ".."`);
    }
    const previous = byFile.get(path);
    if (previous !== undefined) {
      throw new DotspecError("io/meta-duplicate", `${where}: the file is already listed on line ${previous}; list each curve file once`);
    }
    byFile.set(path, line);
    const dot = (cells.dot ?? "").trim();
    if (dot === "") throw new DotspecError("io/meta-dot", `${where}: the dot cell is empty; give the dot's identifier`);
    const r = numberCell(cells.radius_nm ?? "", where, "radius_nm");
    const d = numberCell(cells.diameter_nm ?? "", where, "diameter_nm");
    if (r === null && d === null) {
      throw new DotspecError("io/meta-size", `${where}: the size is missing; give radius_nm or diameter_nm (a curve without a size belongs out of the table: it is then listed as unassigned)`);
    }
    if ((r !== null && !(r > 0)) || (d !== null && !(d > 0))) {
      throw new DotspecError("io/meta-size", `${where}: the size must be greater than 0 nm; got ${r !== null ? `radius_nm ${r}` : `diameter_nm ${d}`}`);
    }
    if (r !== null && d !== null && Math.abs(2 * r - d) > SAME_SIZE_RTOL * d) {
      throw new DotspecError("io/meta-size", `${where}: radius_nm ${r} and diameter_nm ${d} disagree (the diameter must be twice the radius); keep one of them`);
    }
    const radiusNM = r ?? d! / 2;
    const same = byDot.get(dot);
    if (same && Math.abs(same.radiusNM - radiusNM) > SAME_SIZE_RTOL * same.radiusNM) {
      throw new DotspecError(
        "io/meta-size",
        `${where}: dot ${quote(dot)} has radius ${radiusNM} nm here but ${same.radiusNM} nm on line ${same.line}; one dot has one size (give its curves the same size, or different dot ids)`,
      );
    }
    if (!same) byDot.set(dot, { radiusNM, line });
    const eta = numberCell(cells.eta ?? "", where, "eta");
    if (eta !== null && !(eta > 0 && eta <= 1)) {
      throw new DotspecError("io/meta-eta", `${where}: eta must be greater than 0 and at most 1 (the voltage-division factor); got ${eta}`);
    }
    const notes = (cells.notes ?? "").trim();
    out.push({ line, file: path, dot, radiusNM, eta, notes: notes === "" ? null : notes });
  }
  return out;
}

/** A text cut to 60 characters for a message (a file name as written, without quotes). */
function cut(s: string): string {
  return s.length > 60 ? s.slice(0, 57) + "..." : s;
}

/**
 * A "/"-separated path with "." and ".." segments resolved (POSIX rules; a leading ".." that
 * cannot be resolved is kept, so a path leaving its folder stays visible). Pure, so that the
 * parser runs in a browser too.
 */
function normalizeRelative(path: string): string {
  const out: string[] = [];
  for (const segment of path.split("/")) {
    if (segment === "" || segment === ".") continue;
    if (segment === ".." && out.length && out[out.length - 1] !== "..") out.pop();
    else out.push(segment);
  }
  return (path.startsWith("/") ? "/" : "") + (out.join("/") || (path.startsWith("/") ? "" : "."));
}
