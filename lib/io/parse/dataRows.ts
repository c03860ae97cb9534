/**
 * Stage 3 of the importer, the data: every content line split into cells, and the row where the
 * numbers start.
 */
import { DotspecError } from "../../util/errors.ts";
import { endsBlank, isDataRow, splitLine, type DelimiterGuess } from "../cells.ts";
import { lineNumber, lineText, type TextLines } from "./lines.ts";
import { quote } from "./messages.ts";

/** The content lines as cells, and where the data starts. */
export interface DataRows {
  /** Cells of every content line: `rows[r]` is line `content[r]`. */
  rows: string[][];
  /** Index in `rows` of the first data row; the data runs to the last row. */
  first: number;
  /** Cells per data row (an empty last column already dropped). */
  ncols: number;
}

/**
 * Split the content lines into cells and find the first data row.
 *
 * Parameters
 * ----------
 * file : TextLines
 *     The lines of stage 1.
 * format : DelimiterGuess
 *     Delimiter and decimal separator of stage 2.
 * src : string
 *     Label of the text, put in front of error messages.
 *
 * Returns
 * -------
 * DataRows
 *     The cells of every content line, the index of the first data row and the number of
 *     cells per data row.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/no-numeric-rows` when no row is mostly numbers; `io/one-column` when the data rows
 *     have a single cell.
 *
 * Notes
 * -----
 * 1. The first row that is mostly numbers (`isDataRow`) starts the data; the data runs to the
 *    last content line.
 * 2. When every data row has the same number of cells and ends in an empty cell (a trailing
 *    delimiter), that cell is dropped from every data row (not for whitespace-separated text).
 *
 * Example
 * -------
 * ```ts
 * const file = splitLines("bias,current,\n0,1,\n1,2,\n", "(text)");
 * const t = findDataRows(file, { delimiter: ",", decimalComma: false }, "(text)");
 * [t.first, t.ncols];  // => [1, 2]
 * ```
 */
export function findDataRows(file: TextLines, format: DelimiterGuess, src: string): DataRows {
  const { lines, content } = file;
  const { delimiter, decimalComma } = format;
  const rows = content.map((i) => splitLine(lines[i], delimiter));
  let first = -1;
  for (let r = 0; r < rows.length; r++) {
    if (isDataRow(rows[r], decimalComma)) {
      first = r;
      break;
    }
  }
  if (first < 0) {
    throw new DotspecError(
      "io/no-numeric-rows",
      `${src}: no row of numbers found in ${content.length} non-comment line(s) (line ${content[0] + 1}: ` +
        `${quote(lines[content[0]])}); expected rows like "-1.5,2.3e-12" below the header`,
    );
  }
  let ncols = rows[first].length;
  if (delimiter !== "whitespace" && endsBlank(rows[first])) {
    let all = true;
    for (let r = first; r < rows.length && all; r++) all = rows[r].length === ncols && endsBlank(rows[r]);
    if (all) {
      for (let r = first; r < rows.length; r++) rows[r].pop();
      ncols--;
    }
  }
  if (ncols < 2) {
    throw new DotspecError(
      "io/one-column",
      `${src}: the data rows have a single column (line ${lineNumber(file, first)}: ${quote(lineText(file, first))}); ` +
        `a curve needs a bias column and at least one current column, separated by commas, semicolons, tabs or spaces`,
    );
  }
  return { rows, first, ncols };
}
