/**
 * Stage 6 of the importer: the cells of the used columns read as numbers, in SI units.
 */
import { DotspecError } from "../../util/errors.ts";
import { parseNumberCell, type DelimiterGuess } from "../cells.ts";
import { toSI } from "../units.ts";
import type { Column } from "./columns.ts";
import type { DataRows } from "./dataRows.ts";
import type { Header } from "./header.ts";
import { lineNumber, lineText, type TextLines } from "./lines.ts";
import { quote } from "./messages.ts";

/** The numbers of the used columns in SI units, indexed by column then data row; null for ignored columns. */
export type ColumnValues = (Float64Array | null)[];

/**
 * Read every cell of the used columns as a number in SI units.
 *
 * Parameters
 * ----------
 * file : TextLines
 *     The lines of stage 1 (for messages).
 * format : DelimiterGuess
 *     Delimiter and decimal separator.
 * table : DataRows
 *     Cells and start of the data.
 * header : Header
 *     The header (named in the ragged-row message).
 * columns : readonly Column[]
 *     Columns with roles and units; `"other"` columns are not read.
 * src : string
 *     Label of the text, put in front of error messages.
 *
 * Returns
 * -------
 * ColumnValues
 *     Per column, its values by data row in V, A or S (NaN for a missing or non-numeric cell);
 *     null for ignored columns.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/ragged-row` for a data row with another number of cells, naming its line.
 *
 * Notes
 * -----
 * 1. Cells are read by `parseNumberCell` (decimal comma, Unicode minus, `D` exponents) and
 *    scaled by the column's unit (`toSI`).
 *
 * References
 * ----------
 * SI prefixes: BIPM, The International System of Units, 9th ed. (2019), Table 7.
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: a row "2,5" under "bias (mV),current (pA)".
 * const { curve } = parseCurveText("bias (mV),current (pA)\n-2,-5\n-1,-1\n0,0\n1,1\n2,5\n");
 * [curve.biasV[4], curve.currentA[4]];  // => [0.002, 5e-12]
 * ```
 */
export function readNumbers(
  file: TextLines,
  format: DelimiterGuess,
  table: DataRows,
  header: Header,
  columns: readonly Column[],
  src: string,
): ColumnValues {
  const { rows, first, ncols } = table;
  const { delimiter, decimalComma } = format;
  const nData = rows.length - first;
  const values: ColumnValues = columns.map((c) => (c.role === "other" ? null : new Float64Array(nData)));
  const used = columns.filter((c) => c.role !== "other");
  for (let r = first; r < rows.length; r++) {
    const row = rows[r];
    if (row.length !== ncols) {
      throw new DotspecError(
        "io/ragged-row",
        `${src}: line ${lineNumber(file, r)} has ${row.length} cell${row.length === 1 ? "" : "s"} but the ` +
          `${header.line !== null ? `header (line ${header.line})` : `first data row (line ${lineNumber(file, first)})`} has ${ncols}: ` +
          `${quote(lineText(file, r))}; give every row the same number of cells or delete the line` +
          (delimiter === "whitespace" ? " (with space-separated columns, write NaN for a missing value)" : ""),
      );
    }
    for (const c of used) values[c.index]![r - first] = toSI(parseNumberCell(row[c.index], decimalComma), c.unitInfo!);
  }
  return values;
}
