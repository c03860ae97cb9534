/**
 * Stage 3 of the importer, the header: the line that names the columns (a row of units joined
 * to it), or a `#` comment line that does, or none.
 */
import { DotspecError } from "../../util/errors.ts";
import { endsBlank, splitLine, type Delimiter } from "../cells.ts";
import { isUnitsRow, readColumnHeader, splitSpacedHeader, stripBrackets } from "../readColumnHeader.ts";
import type { DataRows } from "./dataRows.ts";
import { lineNumber, lineText, readMetadata, type TextLines } from "./lines.ts";

/** The header of the columns. */
export interface Header {
  /** One cell per column (a row of units already joined to the names); null when the file has no header. */
  cells: string[] | null;
  /** Line number (from 1) of the header, or null. */
  line: number | null;
}

/**
 * Find the header of the columns.
 *
 * Parameters
 * ----------
 * file : TextLines
 *     The lines of stage 1; the metadata of a preamble is added to `file.metadata`.
 * delimiter : Delimiter
 *     Delimiter of stage 2.
 * table : DataRows
 *     Cells and start of the data (stage 3).
 * src : string
 *     Label of the text, put in front of error messages.
 * warnings : string[]
 *     Receives a warning when lines above the header (a preamble) are skipped.
 *
 * Returns
 * -------
 * Header
 *     One cell per column and the header's line number, or `{ cells: null, line: null }`.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/ragged-row` when the header line has another number of cells than the data rows.
 *
 * Notes
 * -----
 * 1. Content lines above the data: the line just above it is the header. When it holds units
 *    only (`V,pA`) and the line above has as many cells, the two are joined (`Bias (V)`).
 *    Earlier content lines are a preamble: read for `key: value` metadata and reported.
 * 2. Data from the first content line: the last comment line above the data, without its `#` or
 *    `%`, is the header when it has one cell per column and names a bias and a current column.
 * 3. Otherwise there is no header.
 * 4. With whitespace-separated columns a header line with another cell count is split again so
 *    that names may hold spaces (`splitSpacedHeader`).
 *
 * Example
 * -------
 * ```ts
 * const file = splitLines("Bias,Current\nV,pA\n0,1\n1,2\n", "(text)");
 * const table = findDataRows(file, { delimiter: ",", decimalComma: false }, "(text)");
 * findHeader(file, ",", table, "(text)", []);  // => { cells: ["Bias (V)", "Current (pA)"], line: 1 }
 * ```
 */
export function findHeader(file: TextLines, delimiter: Delimiter, table: DataRows, src: string, warnings: string[]): Header {
  return table.first > 0 ? headerAbove(file, delimiter, table, src, warnings) : commentHeader(file, delimiter, table);
}

/**
 * The header when content lines precede the data: the line just above it, joined to the row of
 * names above when it holds units only (`V,pA`). Earlier content lines are a preamble: read into
 * `file.metadata`, and reported. Throws io/ragged-row when the header has another number of cells.
 */
function headerAbove(file: TextLines, delimiter: Delimiter, table: DataRows, src: string, warnings: string[]): Header {
  const { rows, first, ncols } = table;
  let h = first - 1;
  let cells = headerCells(file, rows, h, ncols, delimiter);
  // A row of units under a row of names ("Bias,Current" then "V,pA"): join them.
  if (h > 0 && cells.length === ncols && isUnitsRow(cells)) {
    const names = headerCells(file, rows, h - 1, ncols, delimiter);
    if (names.length === ncols) {
      const units = cells;
      cells = names.map((name, i) => (units[i].trim() === "" ? name : `${name.trim()} (${stripBrackets(units[i])})`));
      h--;
    }
  }
  const line = lineNumber(file, h);
  if (cells.length !== ncols) {
    throw new DotspecError(
      "io/ragged-row",
      `${src}: line ${line} (the header) has ${cells.length} cells but the data rows from line ` +
        `${lineNumber(file, first)} have ${ncols}; give every column one header cell` +
        (delimiter === "whitespace" ? " (with space-separated columns, write names without spaces, e.g. bias_V current_nA)" : ""),
    );
  }
  if (h > 0) {
    for (let r = 0; r < h; r++) readMetadata(lineText(file, r), file.metadata);
    warnings.push(
      `lines ${lineNumber(file, 0)}–${lineNumber(file, h - 1)} above the header are not data; ` +
        `read for key: value metadata and otherwise skipped`,
    );
  }
  return { cells, line };
}

/**
 * The cells of content row `r` read as a header of `ncols` columns: an empty last cell beyond
 * `ncols` dropped, and a whitespace-separated line split again so that names may hold spaces.
 */
function headerCells(file: TextLines, rows: readonly string[][], r: number, ncols: number, delimiter: Delimiter): string[] {
  let cells = rows[r];
  if (cells.length === ncols + 1 && endsBlank(cells)) cells = cells.slice(0, -1);
  if (delimiter === "whitespace" && cells.length !== ncols) cells = splitSpacedHeader(lineText(file, r), ncols);
  return cells;
}

/**
 * The header of data that starts on the first content line: the last comment line above the data,
 * without its `#` or `%`, when it has one cell per column and names a bias and a current column.
 */
function commentHeader(file: TextLines, delimiter: Delimiter, table: DataRows): Header {
  const { lines, content, comments } = file;
  const { first, ncols } = table;
  const above = comments.filter((i) => i < content[first]);
  if (above.length > 0) {
    const line = lines[above[above.length - 1]].trimStart().replace(/^[#%]+/, "");
    const cells = delimiter === "whitespace" ? splitSpacedHeader(line, ncols) : splitLine(line, delimiter);
    if (cells.length === ncols + 1 && endsBlank(cells)) cells.pop();
    const roles = cells.map((c) => readColumnHeader(c).role);
    if (cells.length === ncols && roles.includes("bias") && roles.includes("current")) {
      return { cells, line: above[above.length - 1] + 1 };
    }
  }
  return { cells: null, line: null };
}
