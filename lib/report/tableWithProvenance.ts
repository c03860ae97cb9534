/**
 * A CSV table with its provenance in every row, so that a row copied elsewhere still names the
 * tool's version and the options (and, for per-input tables, the input's size and SHA-256).
 */
import type { CellValue } from "../io/formatCsv.ts";
import type { Provenance } from "./provenance.ts";

/** A table: its columns in order and its rows (the shape of the size-series tables). */
export interface ProvenanceTable {
  columns: string[];
  rows: Record<string, CellValue>[];
}

/**
 * Appends provenance columns to a table.
 *
 * Parameters
 * ----------
 * table : ProvenanceTable
 *     Columns and rows (not changed; a new table is returned).
 * provenance : Provenance
 *     Of the whole table: `tool_version` and `options` (JSON) in every row.
 * inputOf : (row) => Provenance["input"], optional
 *     For a table with one row per input: that input's name, size and SHA-256, written as
 *     `input_bytes` and `input_sha256` (empty cells for null). Default: no such columns.
 *
 * Returns
 * -------
 * ProvenanceTable
 *     The columns followed by `tool_version`, `options` (and `input_bytes`, `input_sha256`).
 *
 * Example
 * -------
 * ```ts
 * tableWithProvenance({ columns: ["dot"], rows: [{ dot: "A" }] }, makeProvenance("sizes", null, { binNM: 0.25 }));
 * // => { columns: ["dot", "tool_version", "options"], rows: [{ dot: "A", tool_version: "0.1.0", options: '{"binNM":0.25}' }] }
 * ```
 */
export function tableWithProvenance(
  table: ProvenanceTable,
  provenance: Provenance,
  inputOf?: (row: Record<string, CellValue>) => Provenance["input"],
): ProvenanceTable {
  const options = JSON.stringify(provenance.options);
  const columns = [...table.columns, "tool_version", "options", ...(inputOf ? ["input_bytes", "input_sha256"] : [])];
  const rows = table.rows.map((row) => {
    const out: Record<string, CellValue> = { ...row, tool_version: provenance.version, options };
    if (inputOf) {
      const input = inputOf(row);
      out.input_bytes = input ? input.bytes : null;
      out.input_sha256 = input ? input.sha256 : null;
    }
    return out;
  });
  return { columns, rows };
}
