/**
 * Stage 4 of the importer, roles: what each column is (bias, current, conductance or other),
 * from its header and the column options.
 */
import { DotspecError } from "../../util/errors.ts";
import { readColumnHeader, type ColumnRole } from "../readColumnHeader.ts";
import type { UnitInfo } from "../units.ts";
import type { Header } from "./header.ts";
import { quote } from "./messages.ts";
import type { ColumnRef, ResolvedOptions } from "./options.ts";

/** How a column of the file was read. */
export interface ImportColumn {
  /** Position in the row, from 0. */
  index: number;
  /** Header cell as written (trimmed); `""` when the file has no header. */
  header: string;
  /** Header without its unit; `"column 0"`, `"column 1"`… when the file has no header. */
  name: string;
  /** What the column was used as; `"other"` columns were ignored. */
  role: ColumnRole;
  /** The unit used (`"pA"`), or null for ignored columns. */
  unit: string | null;
  /** SI value of one unit (1e-12 for pA), or null for ignored columns. */
  scale: number | null;
  /** Where the unit came from: the header, an option, or the SI default (with a warning). */
  unitFrom: "header" | "option" | "default" | null;
  /**
   * Current and conductance columns: the resolution of the written numbers in A or S, the root
   * mean square over the cells of the value of one unit in the last written digit (see the
   * importer's `resolution.ts`); null for other columns or when no cell was a plain number.
   */
  resolutionSI?: number | null;
}

/** A column while it is read: {@link ImportColumn} and what its header says. */
export interface Column extends ImportColumn {
  /** The unit as written in the header (not yet validated), or null. */
  unitText: string | null;
  /** The header names a tip bias. */
  tipBias: boolean;
  /** The unit used, chosen in stage 4; null for ignored columns. */
  unitInfo: UnitInfo | null;
}

/**
 * One {@link Column} per data cell, named and given a role.
 *
 * Parameters
 * ----------
 * header : Header
 *     The header of stage 3 (cells null without header).
 * ncols : number
 *     Cells per data row.
 * o : ResolvedOptions
 *     The checked options; `biasColumn` and `currentColumns` are read.
 * src : string
 *     Label of the text, put in front of error messages.
 *
 * Returns
 * -------
 * Column[]
 *     One per column, in order, with name, header, unit text and role; units not yet chosen.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/no-such-column` (a column option that matches nothing), `options/column-twice` (a
 *     column named in both options), `io/no-bias-column`, `io/no-current-column`.
 *
 * Notes
 * -----
 * 1. With a header, each cell gives a name, a unit text and a role (`readColumnHeader`).
 * 2. Without header, columns are named `column 0`, `column 1`…; the bias is `biasColumn`
 *    (default 0) and the currents are `currentColumns` (default every other column).
 * 3. With a header, `biasColumn` makes its column the only bias column.
 * 4. `currentColumns` makes exactly its columns the current columns.
 *
 * Example
 * -------
 * ```ts
 * const o = resolveParseOptions({});
 * nameColumns({ cells: ["bias (V)", "I (pA)", "T (K)"], line: 1 }, 3, o, "(text)").map((c) => c.role);
 * // => ["bias", "current", "other"]
 * ```
 */
export function nameColumns(header: Header, ncols: number, o: ResolvedOptions, src: string): Column[] {
  const headerCells = header.cells;
  const columns: Column[] = [];
  for (let index = 0; index < ncols; index++) {
    if (headerCells) {
      const h = readColumnHeader(headerCells[index]);
      columns.push({ index, header: h.header, name: h.name, role: h.role, unit: null, scale: null, unitFrom: null, unitText: h.unitText, tipBias: h.tipBias, unitInfo: null });
    } else {
      columns.push({ index, header: "", name: `column ${index}`, role: "other", unit: null, scale: null, unitFrom: null, unitText: null, tipBias: false, unitInfo: null });
    }
  }
  if (!headerCells) {
    // Without header: the bias is biasColumn (default 0), the currents are currentColumns (default all others).
    const b = o.biasColumn === null ? 0 : findColumn(src, "biasColumn", o.biasColumn, columns);
    for (const c of columns) c.role = c.index === b ? "bias" : o.currentColumns === null ? "current" : "other";
  }
  if (headerCells && o.biasColumn !== null) {
    const b = findColumn(src, "biasColumn", o.biasColumn, columns);
    for (const c of columns) if (c.role === "bias") c.role = "other";
    columns[b].role = "bias";
  }
  if (o.currentColumns !== null) {
    const picked = o.currentColumns.map((ref) => findColumn(src, "currentColumns", ref, columns));
    for (const c of columns) if (c.role === "current") c.role = "other";
    for (const i of picked) {
      if (o.biasColumn !== null && columns[i].role === "bias") {
        throw new DotspecError(
          "options/column-twice",
          `${src}: column ${i} (${describeColumn(columns[i])}) is named both in biasColumn and in currentColumns; name it in one only`,
        );
      }
      columns[i].role = "current";
    }
  }
  const listColumns = () => columns.map(describeColumn).join(", ");
  if (!columns.some((c) => c.role === "bias")) {
    throw new DotspecError(
      "io/no-bias-column",
      `${src}: no bias column among ${listColumns()}; name it in the header (for example "bias (V)", ` +
        `"V", "U", "voltage", "sample bias") or pass the option biasColumn (header or index from 0)`,
    );
  }
  if (!columns.some((c) => c.role === "current")) {
    throw new DotspecError(
      "io/no-current-column",
      `${src}: no current column among ${listColumns()}; name it in the header (for example "current (A)", ` +
        `"I", "It") or pass the option currentColumns (headers or indices from 0)`,
    );
  }
  return columns;
}

/**
 * Index of the column a `biasColumn` or `currentColumns` option names.
 *
 * Parameters
 * ----------
 * src : string
 *     Label of the text, put in front of error messages.
 * option : string
 *     Name of the option, for the message.
 * ref : ColumnRef
 *     A header or name (any letter case, trimmed) or an index from 0.
 * columns : readonly Column[]
 *
 * Returns
 * -------
 * number
 *     The column's index.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/no-such-column`, listing the columns.
 *
 * Example
 * -------
 * ```ts
 * const columns = nameColumns({ cells: ["bias (V)", "I (pA)"], line: 1 }, 2, resolveParseOptions({}), "(text)");
 * findColumn("(text)", "biasColumn", "BIAS (V)", columns);  // => 0
 * ```
 */
export function findColumn(src: string, option: string, ref: ColumnRef, columns: readonly Column[]): number {
  if (typeof ref === "number") {
    if (ref < columns.length) return ref;
  } else {
    const want = ref.trim().toLowerCase();
    const hit = columns.find((c) => c.header.toLowerCase() === want || c.name.toLowerCase() === want);
    if (hit) return hit.index;
  }
  throw new DotspecError(
    "io/no-such-column",
    `${src}: ${option} = ${JSON.stringify(ref)} matches no column; the columns are ` +
      `${columns.map((c) => `${c.index} ${describeColumn(c)}`).join(", ")} (give a header or an index from 0)`,
  );
}

/**
 * A column as messages name it.
 *
 * Parameters
 * ----------
 * c : Pick<Column, "header" | "name">
 *
 * Returns
 * -------
 * string
 *     Its header, quoted, or its name (`column 2`) without header.
 *
 * Example
 * -------
 * ```ts
 * describeColumn({ header: "", name: "column 2" });  // => "column 2"
 * ```
 */
export function describeColumn(c: Pick<Column, "header" | "name">): string {
  return c.header ? quote(c.header) : c.name;
}
