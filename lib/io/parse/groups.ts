/**
 * Stage 5 of the importer: each current and conductance column read against its bias column.
 */
import { describeColumn, type Column } from "./columns.ts";

/** A bias column with the current and conductance columns read against it. */
export interface ColumnGroup {
  /** Index of the bias column. */
  bias: number;
  /** Indices of its current columns (at least one). */
  currents: number[];
  /** Indices of its conductance columns. */
  conductances: number[];
}

/** The columns grouped. */
export interface ColumnGroups {
  /** Every column read as bias in stage 4, ignored ones included (named in io/too-few-points). */
  biasColumns: Column[];
  /** The groups that have a current column, in column order. */
  groups: ColumnGroup[];
}

/**
 * Group the current and conductance columns with their bias column.
 *
 * Parameters
 * ----------
 * columns : Column[]
 *     The columns with roles (stage 4); a bias column without current column and its
 *     conductance columns get the role `"other"` in place.
 * warnings : string[]
 *     Receives a warning per bias column ignored.
 *
 * Returns
 * -------
 * ColumnGroups
 *     Every bias column, and the groups that have a current column, in column order.
 *
 * Notes
 * -----
 * 1. A current or conductance column joins the nearest bias column to its left, or the first
 *    bias column when none is to its left.
 * 2. A bias column with no current column is ignored, with its conductance columns.
 *
 * Example
 * -------
 * ```ts
 * const columns = nameColumns({ cells: ["V", "I", "V2", "I2"], line: 1 }, 4, resolveParseOptions({}), "(text)");
 * groupColumns(columns, []).groups;
 * // => [{ bias: 0, currents: [1], conductances: [] }, { bias: 2, currents: [3], conductances: [] }]
 * ```
 */
export function groupColumns(columns: Column[], warnings: string[]): ColumnGroups {
  const biasColumns = columns.filter((c) => c.role === "bias");
  const all: ColumnGroup[] = biasColumns.map((c) => ({ bias: c.index, currents: [], conductances: [] }));
  for (const c of columns) {
    if (c.role !== "current" && c.role !== "conductance") continue;
    let g = all[0];
    for (const k of all) if (k.bias < c.index) g = k;
    (c.role === "current" ? g.currents : g.conductances).push(c.index);
  }
  const groups: ColumnGroup[] = [];
  for (const g of all) {
    if (g.currents.length > 0) {
      groups.push(g);
      continue;
    }
    columns[g.bias].role = "other";
    for (const k of g.conductances) columns[k].role = "other";
    warnings.push(`column ${describeColumn(columns[g.bias])} is a further bias column with no current column after it; ignored`);
  }
  return { biasColumns, groups };
}
