/**
 * The small delimited tables of a size series (META.csv and the optical table): lines, header and
 * cells, with the line number of every row kept for error messages. Shared by
 * {@link parseSizeMeta} and {@link parseOpticalTable}.
 */
import { DotspecError } from "../util/errors.ts";
import { quote } from "./parse/messages.ts";

/** One data row of a table: its 1-based line in the file and its cells by lower-case column name. */
export interface TableRow {
  line: number;
  cells: Record<string, string>;
}

/** A parsed table: the column names (trimmed, lower case) and the data rows. */
export interface SizeTable {
  columns: string[];
  rows: TableRow[];
}

/** Splits one line at `delimiter`, honouring double quotes ("a,b" and "" inside quotes). */
function splitCells(line: string, delimiter: string): string[] {
  const cells: string[] = [];
  let cell = "";
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"' && cell.trim() === "") {
      quoted = true;
      cell = "";
    } else if (c === delimiter) {
      cells.push(cell.trim());
      cell = "";
    } else cell += c;
  }
  cells.push(cell.trim());
  return cells;
}

/**
 * Reads a small delimited table: `#` comment lines and blank lines skipped, the first other line
 * is the header; the delimiter (comma, semicolon or tab) is the one the header holds most of.
 *
 * Parameters
 * ----------
 * text : string
 *     The file's text.
 * source : string
 *     The file name, put in front of every message.
 * what : string
 *     What the table is, for messages ("size table", "optical table").
 *
 * Returns
 * -------
 * SizeTable
 *     Columns in lower case, rows with their line numbers.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/empty` without a header line; `io/ragged-row` when a row has more cells than the header;
 *     `io/duplicate-column` when a column name repeats.
 */
export function readSizeTableRows(text: string, source: string, what: string): SizeTable {
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\r|\n/);
  let header: string[] | null = null;
  let delimiter = ",";
  const rows: TableRow[] = [];
  for (let i = 0; i < lines.length; i++) {
    const s = lines[i].trim();
    if (s === "" || s.startsWith("#")) continue;
    if (header === null) {
      const counts = [",", ";", "\t"].map((d) => [d, s.split(d).length - 1] as const);
      delimiter = counts.reduce((a, b) => (b[1] > a[1] ? b : a))[0];
      header = splitCells(s, delimiter).map((c) => c.toLowerCase());
      const seen = new Set<string>();
      for (const name of header) {
        if (seen.has(name)) {
          throw new DotspecError("io/duplicate-column", `${source}: line ${i + 1}: the column ${quote(name)} appears twice in the header of the ${what}; keep one`);
        }
        seen.add(name);
      }
      continue;
    }
    const cells = splitCells(s, delimiter);
    if (cells.length > header.length && cells.slice(header.length).some((c) => c !== "")) {
      throw new DotspecError(
        "io/ragged-row",
        `${source}: line ${i + 1}: ${cells.length} cells but the header names ${header.length} columns (${header.join(", ")}); remove the extra cells or add a column name`,
      );
    }
    const record: Record<string, string> = {};
    header.forEach((name, k) => (record[name] = cells[k] ?? ""));
    rows.push({ line: i + 1, cells: record });
  }
  if (header === null) {
    throw new DotspecError("io/empty", `${source}: the ${what} is empty; expected a header line and one row per entry`);
  }
  return { columns: header, rows };
}

/**
 * A number cell: "" gives null; anything else must be a finite number (a decimal comma is read
 * when the table is not comma-separated and the cell has no point).
 */
export function numberCell(value: string, where: string, column: string): number | null {
  if (value === "") return null;
  const v = Number(value.includes(",") && !value.includes(".") ? value.replace(",", ".") : value);
  if (!Number.isFinite(v)) {
    throw new DotspecError("io/not-a-number", `${where}: ${column} must be a number; got ${quote(value)}`);
  }
  return v;
}
