/**
 * The importer's fast lane for plain numeric tables: after the head (read by stages 1–5 as
 * usual), the data rows are read in one pass over the text's character codes, with no string
 * per line or per cell, into the same column values and resolution sums as stage 6. Anything
 * that is not plain makes the lane give up (null) and the general path read the text.
 */
import { splitLine } from "../cells.ts";
import { toSI, type UnitInfo } from "../units.ts";
import type { Column } from "./columns.ts";
import type { DataRows } from "./dataRows.ts";
import { HeadLines } from "./head.ts";
import { lazyArray, type TextLines } from "./lines.ts";
import type { ColumnValues } from "./numbers.ts";
import type { ResolvedOptions } from "./options.ts";
import { addQuantum, finishResolutions, quantumOf, resolutionSums, type ResolutionSums } from "./resolution.ts";
import type { Delimiter, DelimiterGuess } from "../cells.ts";

/** When the fast lane is tried. */
export const FAST_LANE = Object.freeze({
  /** Fewer data rows than this are not worth a second road: the general path reads them. */
  minDataRows: 200,
  /** A head longer than this is not a plain table. */
  maxHeadLines: 1000,
});

/** Exact powers of ten 10^0 … 10^22 (every one a double exactly). */
const EXACT_POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/** Largest mantissa m for which 10·m + 9 is still below 2^53 (so exact in a double). */
const MANTISSA_MAX = Math.floor((2 ** 53 - 10) / 10);

/** The head of a text for the fast lane. */
export interface PlainHead {
  /** The head's lines with their line ends (a BOM dropped): the input of stages 1–5. */
  text: string;
  /** Offset in the whole text of the start of each head line. */
  lineStarts: number[];
  /** Delimiter and decimal separator, detected on the head's sample lines. */
  format: DelimiterGuess;
}

/** What stages 1–5 found on the head (the part of `curveHead`'s result the lane reads). */
export interface HeadStages {
  file: TextLines;
  format: DelimiterGuess;
  table: DataRows;
  columns: Column[];
}

/** The data rows read by the lane: what `finishCurve` needs besides the head's stages. */
export interface PlainRows {
  /** The head's lines, then the data rows, built when a message asks for a line. */
  file: TextLines;
  /** The head's table with the row count of the whole text (no cells are kept). */
  table: DataRows;
  values: ColumnValues;
  resolutions: (number | null)[];
}

/**
 * The head of a text worth the fast lane: its first lines, as the streamed reader chooses them.
 *
 * Parameters
 * ----------
 * text : string
 *     The whole text.
 * o : ResolvedOptions
 *     The importer's options (source label and delimiter).
 *
 * Returns
 * -------
 * PlainHead | null
 *     The head's text and the offsets of its lines; null when the text has fewer than
 *     `FAST_LANE.minDataRows` line ends, ends within its head, has a head longer than
 *     `FAST_LANE.maxHeadLines` lines, a CR that does not end a CRLF in the head, or decimal
 *     commas.
 *
 * Notes
 * -----
 * 1. The head holds lines until 50 content lines that start like a number have been seen, the
 *    first data row has appeared and 10 rows follow it ({@link HeadLines}).
 *
 * Example
 * -------
 * ```ts
 * const text = "V,I\n" + Array.from({ length: 300 }, (_, k) => `${k},${k}\n`).join("");
 * plainHead(text, resolveParseOptions({}))!.lineStarts.length;  // => 51
 * ```
 */
export function plainHead(text: string, o: ResolvedOptions): PlainHead | null {
  const start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let ends = 0;
  for (let i = text.indexOf("\n", start); i >= 0 && ends < FAST_LANE.minDataRows; i = text.indexOf("\n", i + 1)) ends++;
  if (ends < FAST_LANE.minDataRows) return null;
  const head = new HeadLines(o.source, o.delimiter);
  const lineStarts: number[] = [];
  let a = start;
  for (;;) {
    if (lineStarts.length >= FAST_LANE.maxHeadLines) return null;
    const lf = text.indexOf("\n", a);
    if (lf < 0) return null;
    const line = text.slice(a, lf > a && text.charCodeAt(lf - 1) === 13 ? lf - 1 : lf);
    if (line.indexOf("\r") >= 0) return null;
    lineStarts.push(a);
    a = lf + 1;
    if (head.push(line)) break;
    if (head.format?.decimalComma) return null;
  }
  return { text: text.slice(start, a), lineStarts, format: head.format! };
}

/**
 * Read the data rows of a plain numeric table in one pass over the text, as stage 6 would.
 *
 * Parameters
 * ----------
 * text : string
 *     The whole text.
 * head : PlainHead
 *     Its head ({@link plainHead}).
 * stages : HeadStages
 *     What stages 1–5 found on `head.text`.
 *
 * Returns
 * -------
 * PlainRows | null
 *     The column values (SI, by `toSI`), the resolutions (the same sums in the same order as
 *     `columnResolutions`), and the lines and row count for `finishCurve`; null when the text is
 *     not plain (see Notes), and the general path must read it.
 *
 * Notes
 * -----
 * 1. Plain: a decimal point; LF or CRLF line ends; no blank or comment line from the first data
 *    row on; no trailing delimiter on the first data row; at least `FAST_LANE.minDataRows` data
 *    rows, each of exactly the table's number of cells; ASCII only and no double quote. Cells
 *    are separated by one comma, semicolon or tab (no spaces in the row), or by runs of spaces
 *    and tabs (leading and trailing space allowed).
 * 2. A cell of a used column must read `[+-]?digits[.digits]([eE][+-]?digits)` with at most
 *    six exponent digits and 400 characters, and its value must be finite. Cells of ignored
 *    columns are skipped (any printable characters but the delimiter and a quote).
 * 3. A value with mantissa m < 2^53 (its digits without the point) and power of ten
 *    k = exponent − decimals within ±22 is m·10^k or m/10^k: both operands are exact doubles, so
 *    the one rounding of the product or quotient gives the correctly rounded value, the double
 *    `Number()` reads (closed form). Other values are read by `Number()` on the cell's text.
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: a 300-row table takes the lane and gives the general path's curve.
 * parseCurveText("V,I\n" + Array.from({ length: 300 }, (_, k) => `${k},${k}\n`).join("")).curve.biasV.length;  // => 300
 * ```
 */
export function readPlainRows(text: string, head: PlainHead, stages: HeadStages): PlainRows | null {
  const { file, format, table, columns } = stages;
  const firstRow = table.first;
  const ncols = table.ncols;
  const firstLine = file.content[firstRow];
  if (format.decimalComma || firstLine >= head.lineStarts.length || columns.length !== ncols) return null;
  if (splitLine(file.lines[firstLine], format.delimiter).length !== ncols) return null; // a trailing delimiter dropped
  const from = head.lineStarts[firstLine];
  const len = text.length;
  let n = text.charCodeAt(len - 1) === 10 ? 0 : 1;
  for (let i = text.indexOf("\n", from); i >= 0; i = text.indexOf("\n", i + 1)) n++;
  if (n < FAST_LANE.minDataRows) return null;

  const values: ColumnValues = columns.map((c) => (c.role === "other" ? null : new Float64Array(n)));
  const sums = resolutionSums(columns);
  const starts = scanRows(text, from, n, format.delimiter, columns, values, sums);
  if (starts === null) return null;

  // Line numbers and texts, for messages only: the head's lines, then the data rows.
  const lineOf = (r: number) => (r < firstRow ? file.content[r] : firstLine + r - firstRow);
  const textOf = (li: number) => {
    const k = li - firstLine;
    if (k < 0 || k >= n) return file.lines[li] ?? "";
    let e = starts[k + 1];
    if (text.charCodeAt(e - 1) === 10) e--;
    if (text.charCodeAt(e - 1) === 13) e--;
    return text.slice(starts[k], e);
  };
  return {
    file: { lines: lazyArray(textOf), content: lazyArray(lineOf), comments: file.comments, metadata: file.metadata },
    table: { rows: { length: firstRow + n } as unknown as string[][], first: firstRow, ncols },
    values,
    resolutions: finishResolutions(sums, columns),
  };
}

/**
 * The one pass of {@link readPlainRows} over `n` rows from offset `from`: fills `values` (SI) and
 * the resolution `sums`; the start offset of each row (and the text's length after the last), or
 * null at the first thing that is not plain. A function of its own, without closures, so that the
 * loop's variables stay in registers.
 */
function scanRows(
  text: string,
  from: number,
  n: number,
  delimiter: Delimiter,
  columns: readonly Column[],
  values: ColumnValues,
  sums: ResolutionSums,
): Int32Array | null {
  const len = text.length;
  const ncols = columns.length;
  const ws = delimiter === "whitespace";
  const dc = ws ? -1 : delimiter.charCodeAt(0);
  const units: (UnitInfo | null)[] = columns.map((c) => (c.role === "other" ? null : c.unitInfo!));
  const starts = new Int32Array(n + 1);
  let i = from;
  let ch = 0;
  for (let r = 0; r < n; r++) {
    starts[r] = i;
    // A blank or comment line (first non-space character # or %) is not plain.
    let j = i;
    ch = text.charCodeAt(j);
    while (ch === 32 || ch === 9) ch = text.charCodeAt(++j);
    if (ch === 35 || ch === 37 || ch === 10 || ch === 13 || j >= len) return null;
    if (ws) i = j;
    else ch = text.charCodeAt(i);
    for (let c = 0; c < ncols; c++) {
      if (c > 0) {
        if (!ws) {
          if (ch !== dc) return null;
          ch = text.charCodeAt(++i);
        } else {
          if (ch !== 32 && ch !== 9) return null;
          do ch = text.charCodeAt(++i);
          while (ch === 32 || ch === 9);
        }
      }
      const a = i;
      const v = values[c];
      if (v === null) {
        // An ignored cell: printable ASCII but a quote and the delimiter (spaces only between
        // character delimiters).
        while (ch > 32 ? ch < 127 && ch !== 34 && ch !== dc : ch === 32 && !ws) ch = text.charCodeAt(++i);
        if (ws && i === a) return null;
        continue;
      }
      let negative = false;
      if (ch === 45 || ch === 43) {
        negative = ch === 45;
        ch = text.charCodeAt(++i);
      }
      // Digits, with one point after the first of them: m is the digits as an integer (exact
      // while below 2^53), decimals the digits after the point (-1 before a point).
      let m = 0;
      let exact = true;
      let digits = 0;
      let decimals = -1;
      for (;;) {
        if (ch >= 48 && ch <= 57) {
          if (m <= MANTISSA_MAX) m = m * 10 + (ch - 48);
          else exact = false;
          digits++;
          if (decimals >= 0) decimals++;
        } else if (ch === 46 && decimals < 0 && digits > 0) decimals = 0;
        else break;
        ch = text.charCodeAt(++i);
      }
      if (digits === 0 || decimals === 0) return null;
      if (decimals < 0) decimals = 0;
      let exponent = 0;
      if (ch === 101 || ch === 69) {
        ch = text.charCodeAt(++i);
        let negativeExponent = false;
        if (ch === 45 || ch === 43) {
          negativeExponent = ch === 45;
          ch = text.charCodeAt(++i);
        }
        let exponentDigits = 0;
        while (ch >= 48 && ch <= 57) {
          exponent = exponent * 10 + (ch - 48);
          exponentDigits++;
          ch = text.charCodeAt(++i);
        }
        if (exponentDigits === 0 || exponentDigits > 6) return null;
        if (negativeExponent) exponent = -exponent;
      }
      if (i - a > 400) return null;
      const k = exponent - decimals;
      let x: number;
      if (exact && k >= -22 && k <= 22) {
        x = k >= 0 ? m * EXACT_POW10[k] : m / EXACT_POW10[-k];
        if (negative) x = -x;
      } else {
        x = Number(text.slice(a, i));
        if (x === Infinity || x === -Infinity) return null;
      }
      x = toSI(x, units[c]!);
      v[r] = x;
      const s = sums[c];
      if (s !== null) addQuantum(s, x, quantumOf(exponent, decimals));
    }
    if (ws) while (ch === 32 || ch === 9) ch = text.charCodeAt(++i);
    if (ch === 13) ch = text.charCodeAt(++i);
    if (ch === 10) i++;
    else if (i < len || text.charCodeAt(i - 1) === 13) return null; // another cell, a stray character, a lone CR
  }
  if (i !== len) return null;
  starts[n] = len;
  return starts;

}
