/**
 * Stage 7 of the importer, rows: the data rows each column group keeps (every value finite).
 */
import { DotspecError } from "../../util/errors.ts";
import type { DelimiterGuess } from "../cells.ts";
import type { DataRows } from "./dataRows.ts";
import type { ColumnGroup } from "./groups.ts";
import { lineNumber, lineText, type TextLines } from "./lines.ts";
import { delimiterName, quote } from "./messages.ts";
import type { ColumnValues } from "./numbers.ts";

/** The data rows each group keeps. */
export interface KeptRows {
  /**
   * Per group (same order), the data rows (from 0) with a finite value in every cell of the
   * group; null when that is every row (no list of all rows is made).
   */
  perGroup: (Int32Array | null)[];
  /** Data rows left out of at least one group. */
  dropped: number;
}

/**
 * Keep, per group, the data rows whose every value is finite.
 *
 * Parameters
 * ----------
 * file : TextLines
 *     The lines of stage 1 (for messages).
 * format : DelimiterGuess
 *     Delimiter and decimal separator (named in the message when most rows are unreadable).
 * table : DataRows
 *     Cells and start of the data.
 * groups : readonly ColumnGroup[]
 *     The column groups of stage 5.
 * values : ColumnValues
 *     The numbers of stage 6.
 * src : string
 *     Label of the text, put in front of error messages.
 * warnings : string[]
 *     Receives the count of rows left out and the first such line.
 *
 * Returns
 * -------
 * KeptRows
 *     Per group the kept data rows (from 0), and the number of data rows left out of at least
 *     one group.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/too-many-bad-rows` when more than half the data rows are left out; the message names
 *     the delimiter and decimal separator read, since a wrong guess is the usual cause.
 *
 * Notes
 * -----
 * 1. A row is left out of a group when its bias, a current or a conductance value of the group
 *    is NaN or infinite.
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: one row of six has a NaN current.
 * parseCurveText("V,I\n0,1\n1,NaN\n2,3\n3,4\n4,5\n5,6\n").record.rowsDropped;  // => 1
 * ```
 */
export function keepCompleteRows(
  file: TextLines,
  format: DelimiterGuess,
  table: DataRows,
  groups: readonly ColumnGroup[],
  values: ColumnValues,
  src: string,
  warnings: string[],
): KeptRows {
  const first = table.first;
  const nData = table.rows.length - first;
  const rowBad = new Uint8Array(nData);
  const perGroup: (Int32Array | null)[] = [];
  for (const g of groups) {
    const cols = [g.bias, ...g.currents, ...g.conductances].map((k) => values[k]!);
    const finite = (r: number) => {
      for (const col of cols) {
        const x = col[r];
        if (x !== x || x === Infinity || x === -Infinity) return false;
      }
      return true;
    };
    // Every row kept (the usual case): no list of rows at all. Otherwise typed row indices,
    // 4 bytes a row (a file of 10⁷ rows keeps 40 MB, not a list of numbers).
    let complete = true;
    for (let r = 0; r < nData && complete; r++) complete = finite(r);
    if (complete) {
      perGroup.push(null);
      continue;
    }
    const all = new Int32Array(nData);
    let kept = 0;
    for (let r = 0; r < nData; r++) {
      let ok = true;
      for (const col of cols) {
        const x = col[r];
        if (x !== x || x === Infinity || x === -Infinity) {
          ok = false;
          break;
        }
      }
      if (ok) all[kept++] = r;
      else rowBad[r] = 1;
    }
    perGroup.push(kept === nData ? all : all.slice(0, kept));
  }
  let dropped = 0;
  let firstBad = -1;
  for (let r = 0; r < nData; r++) {
    if (rowBad[r]) {
      dropped++;
      if (firstBad < 0) firstBad = r;
    }
  }
  if (dropped * 2 > nData) {
    throw new DotspecError(
      "io/too-many-bad-rows",
      `${src}: ${dropped} of ${nData} data rows have a missing or non-numeric value in a bias, current or ` +
        `conductance column (first: line ${lineNumber(file, first + firstBad)}, ${quote(lineText(file, first + firstBad))}); ` +
        `delimiter read as ${delimiterName(format.delimiter)} with decimal ${format.decimalComma ? "comma" : "point"}: ` +
        `if that is wrong pass the option delimiter, otherwise clean the file`,
    );
  }
  if (dropped > 0) {
    warnings.push(
      `${dropped} data row${dropped === 1 ? "" : "s"} with a missing or non-numeric value (NaN, inf, -, empty…) ` +
        `left out (first: line ${lineNumber(file, first + firstBad)})`,
    );
  }
  return { perGroup, dropped };
}
