/**
 * CSV text for result tables and curves (pure: no file I/O, so it runs in a browser too).
 */
import { csvFormat } from "d3-dsv";
import { DotspecError } from "../util/errors.ts";

/** A value of a table cell. null is written as an empty cell. */
export type CellValue = string | number | boolean | null;

/**
 * Text that a spreadsheet would run as a formula: a cell starting with `=`, `+`, `-`, `@`, a tab
 * or a carriage return (OWASP, "CSV Injection", https://owasp.org/www-community/attacks/CSV_Injection).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/** A plain decimal number written as text (`-0.5`, `+1e-3`): a number to a spreadsheet, not a formula. */
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Escapes a text cell that a spreadsheet would run as a formula, as the OWASP guidance on CSV
 * injection advises: a single quote is put in front. Numbers, and text that is a plain decimal
 * number, are left as they are.
 *
 * Parameters
 * ----------
 * value : CellValue
 *     One cell.
 *
 * Returns
 * -------
 * CellValue
 *     The cell, with a leading `'` when it is text that starts with =, +, -, @, a tab or a
 *     carriage return and is not a plain decimal number.
 *
 * Example
 * -------
 * ```ts
 * escapeFormulaCell("=HYPERLINK(\"x\")"); // => "'=HYPERLINK(\"x\")"
 * escapeFormulaCell("-0.5");              // => "-0.5"
 * ```
 */
export function escapeFormulaCell(value: CellValue): CellValue {
  if (typeof value !== "string" || !FORMULA_START.test(value) || PLAIN_NUMBER.test(value)) return value;
  return "'" + value;
}

/** Significant digits of the numbers written by {@link formatCurveCsv}. */
export const CURVE_CSV_DIGITS = 10;

/**
 * Format rows as CSV text.
 *
 * Parameters
 * ----------
 * rows : Record<string, CellValue>[]
 *     One object per row.
 * columns : string[], optional
 *     Column order. Default: every key, in order of first appearance.
 *
 * Returns
 * -------
 * string
 *     RFC 4180 CSV with a header line and a final line end (`\n`). Cells that hold a comma, a
 *     double quote or a line end are quoted (d3-dsv's `csvFormat`). Numbers are written in full
 *     (JavaScript's shortest exact form, so they read back to the same double); null as an empty
 *     cell; booleans as `true`/`false`; NaN and ±Infinity as `NaN`, `Infinity`, `-Infinity`.
 *     Text that a spreadsheet would run as a formula (starting with `=`, `+`, `-`, `@`, tab or
 *     CR, and not a plain number) gets a leading single quote ({@link escapeFormulaCell}).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-rows` when `rows` is not a list.
 *
 * References
 * ----------
 * OWASP Foundation, "CSV Injection", https://owasp.org/www-community/attacks/CSV_Injection.
 *
 * Example
 * -------
 * ```ts
 * formatCsv([{ file: "a,b.csv", gapV: 0.1 + 0.2, ec: null }]);
 * // => 'file,gapV,ec\n"a,b.csv",0.30000000000000004,\n'
 * ```
 */
export function formatCsv(rows: readonly Record<string, CellValue>[], columns?: readonly string[]): string {
  if (!Array.isArray(rows)) {
    throw new DotspecError("io/not-rows", `formatCsv: rows must be a list of objects; got ${typeof rows}`);
  }
  const safe = rows.map((row) => {
    const out: Record<string, CellValue> = {};
    for (const key of Object.keys(row)) out[key] = escapeFormulaCell(row[key]);
    return out;
  });
  const text = columns ? csvFormat(safe, columns as string[]) : csvFormat(safe);
  return text + "\n";
}

/** Options of {@link formatCurveCsv}. */
export interface FormatCurveCsvOptions {
  /**
   * Metadata written as `# key: value` lines before the header. Keys are letters, digits, `_`
   * and `-`; line ends in a value become spaces. Default: none.
   */
  metadata?: Readonly<Record<string, string | number>>;
}

/** The arrays {@link formatCurveCsv} writes: a Curve, or any object with these fields. */
export interface CurveColumns {
  /** Bias, V. */
  biasV: ArrayLike<number>;
  /** Current, A; same length as `biasV`. */
  currentA: ArrayLike<number>;
  /** Conductance, S; same length, or null/absent for no column. */
  didvS?: ArrayLike<number> | null;
}

/**
 * Format a curve as CSV that {@link parseCurveText} reads back.
 *
 * Parameters
 * ----------
 * curve : CurveColumns
 *     `biasV` in V, `currentA` in A, optionally `didvS` in S; equal lengths, finite values.
 * options : FormatCurveCsvOptions, optional
 *     `metadata`: `key: value` pairs written first as `# key: value` lines, which the importer
 *     reads back into the curve's metadata. Default: none.
 *
 * Returns
 * -------
 * string
 *     The metadata lines, then the header `bias (V),current (A)` (plus `,dI/dV (S)`), then one row per point with each number
 *     rounded to 10 significant digits and written in its shortest form (`0.001`, `1.234567891e-12`),
 *     and a final `\n`.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/length-mismatch` when the arrays differ in length; `io/not-finite` for a NaN or infinite
 *     value (names the array and index).
 *
 * Example
 * -------
 * ```ts
 * formatCurveCsv({ biasV: [-0.1, 0.1], currentA: [-2e-12, 2.0000000001234e-12] });
 * // => "bias (V),current (A)\n-0.1,-2e-12\n0.1,2e-12\n"
 * ```
 */
export function formatCurveCsv(curve: CurveColumns, options: FormatCurveCsvOptions = {}): string {
  const { biasV, currentA } = curve;
  const didvS = curve.didvS ?? null;
  const n = biasV.length;
  const arrays: [string, ArrayLike<number>][] = [
    ["biasV", biasV],
    ["currentA", currentA],
  ];
  if (didvS) arrays.push(["didvS", didvS]);
  for (const [name, a] of arrays) {
    if (a.length !== n) {
      throw new DotspecError("io/length-mismatch", `formatCurveCsv: ${name} has ${a.length} values but biasV has ${n}; give arrays of equal length`);
    }
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(a[i])) {
        throw new DotspecError("io/not-finite", `formatCurveCsv: ${name}[${i}] is ${a[i]}; a curve holds finite numbers only`);
      }
    }
  }
  const parts: string[] = [];
  for (const [key, value] of Object.entries(options.metadata ?? {})) {
    if (!/^[A-Za-z][A-Za-z0-9_-]*$/.test(key)) {
      throw new DotspecError("io/bad-metadata-key", `formatCurveCsv: metadata key ${JSON.stringify(key)} must be letters, digits, _ or - (starting with a letter)`);
    }
    parts.push(`# ${key}: ${String(value).replace(/[\r\n]+/g, " ").trim()}`);
  }
  parts.push(didvS ? "bias (V),current (A),dI/dV (S)" : "bias (V),current (A)");
  for (let i = 0; i < n; i++) {
    parts.push(didvS ? `${compact(biasV[i])},${compact(currentA[i])},${compact(didvS[i])}` : `${compact(biasV[i])},${compact(currentA[i])}`);
  }
  return parts.join("\n") + "\n";
}

function compact(x: number): string {
  return String(Number(x.toPrecision(CURVE_CSV_DIGITS)));
}
