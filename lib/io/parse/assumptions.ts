/**
 * Stage 4 of the importer, warnings: everything assumed about the columns, said once.
 */
import { parseNumberCell } from "../cells.ts";
import { describeColumn, type Column } from "./columns.ts";
import type { DataRows } from "./dataRows.ts";
import type { Header } from "./header.ts";

/**
 * Warn about the roles and units that were assumed.
 *
 * Parameters
 * ----------
 * columns : readonly Column[]
 *     The columns with roles and units (stage 4).
 * header : Header
 *     The header of stage 3.
 * table : DataRows
 *     Cells and start of the data.
 * decimalComma : boolean
 *     Whether numbers use a decimal comma.
 * defaulted : readonly string[]
 *     Columns given the SI unit by default (from `assignUnits`).
 * warnings : string[]
 *     Receives the warnings, in this order: roles read without header (and a bias column that
 *     counts like a row number), units assumed, a tip bias read as sample bias.
 *
 * Returns
 * -------
 * void
 *
 * Notes
 * -----
 * 1. A bias column whose first rows (up to 10, at least 3) count 0, 1, 2… or 1, 2, 3… looks like
 *    a row number ({@link looksLikeIndex}); it is reported when the file has no header and at
 *    least three columns.
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: no header, three columns, the first counting 0, 1, 2, …
 * parseCurveText("0,0,1\n1,1,2\n2,2,3\n3,3,4\n4,4,5\n").record.warnings.slice(0, 2);
 * // => ["no header line: column 0 read as bias, columns 1, 2 as current",
 * //     "column 0 counts 0, 1, 2… or 1, 2, 3… like a row number; if it is not the bias, pass biasColumn and currentColumns"]
 * ```
 */
export function warnColumnAssumptions(
  columns: readonly Column[],
  header: Header,
  table: DataRows,
  decimalComma: boolean,
  defaulted: readonly string[],
  warnings: string[],
): void {
  if (!header.cells) {
    const currents = columns.filter((c) => c.role === "current").map((c) => c.index);
    const bias = columns.find((c) => c.role === "bias")!.index;
    warnings.push(`no header line: column ${bias} read as bias, column${currents.length > 1 ? "s" : ""} ${currents.join(", ")} as current`);
    if (table.ncols >= 3 && looksLikeIndex(table.rows, table.first, bias, decimalComma)) {
      warnings.push(`column ${bias} counts 0, 1, 2… or 1, 2, 3… like a row number; if it is not the bias, pass biasColumn and currentColumns`);
    }
  }
  if (defaulted.length > 0) {
    warnings.push(
      `no unit given for ${defaulted.join(", ")} (SI assumed); write units in the header (for example "bias (mV)") ` +
        `or pass biasUnit / currentUnit / conductanceUnit`,
    );
  }
  for (const c of columns) {
    if (c.role === "bias" && c.tipBias) {
      warnings.push(`column ${describeColumn(c)} is read as sample bias without changing its sign; negate it if the bias was applied to the tip`);
    }
  }
}

/**
 * Whether the first rows of a column count 0, 1, 2… or 1, 2, 3… (a row number written by a
 * spreadsheet or a script).
 *
 * Parameters
 * ----------
 * rows : readonly string[][]
 *     Cells of the content rows.
 * first : number
 *     Index of the first data row.
 * col : number
 *     Column index, from 0.
 * decimalComma : boolean
 *     Whether numbers use a decimal comma.
 *
 * Returns
 * -------
 * boolean
 *     True when at least three data rows exist and the first (up to 10) count up by one from 0
 *     or 1.
 *
 * Example
 * -------
 * ```ts
 * looksLikeIndex([["1", "0.1"], ["2", "0.2"], ["3", "0.3"]], 0, 0, false);  // => true
 * ```
 */
export function looksLikeIndex(rows: readonly string[][], first: number, col: number, decimalComma: boolean): boolean {
  const n = Math.min(rows.length - first, 10);
  if (n < 3) return false;
  const start = parseNumberCell(rows[first][col], decimalComma);
  if (start !== 0 && start !== 1) return false;
  for (let i = 1; i < n; i++) if (parseNumberCell(rows[first + i][col] ?? "", decimalComma) !== start + i) return false;
  return true;
}
