/**
 * The optical table of a series: ensemble absorption peaks, one row per size.
 */
import { DotspecError } from "../util/errors.ts";
import { quote } from "./parse/messages.ts";
import { numberCell, readSizeTableRows } from "./sizeTableRows.ts";

/** One size of the optical table. */
export interface OpticalTableRow {
  /** Line in the table (1-based), for messages. */
  line: number;
  /** Radius, nm (from `radius_nm`, or half of `diameter_nm`). */
  radiusNM: number;
  /** Absorption peaks, eV, in the order of the columns (empty cells left out). */
  peaksEV: number[];
}

/** Plausible range of an absorption peak, eV: below is infrared, above is far ultraviolet. */
export const OPTICAL_PEAK_RANGE_EV = Object.freeze([0.1, 10] as const);

/**
 * Parses the optical table of a series.
 *
 * Parameters
 * ----------
 * text : string
 *     Comma, semicolon or tab separated; `#` comment lines; a header with `radius_nm` or
 *     `diameter_nm` and peak columns whose names start with `peak` (`peak_ev_1`, `peak_ev_2`, …),
 *     in eV. Rows may leave later peak cells empty.
 * source : string
 *     The table's file name, put in front of every message.
 *
 * Returns
 * -------
 * OpticalTableRow[]
 *     One per row, in file order.
 *
 * Throws
 * ------
 * DotspecError
 *     Each naming the line: `io/optical-column` (no size column, no peak column, an unknown
 *     column), `io/optical-size` (size missing or ≤ 0), `io/optical-peak` (a row without peaks, a
 *     peak outside {@link OPTICAL_PEAK_RANGE_EV}), and those of the table reader.
 *
 * Example
 * -------
 * ```ts
 * parseOpticalTable("radius_nm,peak_ev_1,peak_ev_2\n2.0,1.95,2.21\n", "optical.csv");
 * // => [{ line: 2, radiusNM: 2, peaksEV: [1.95, 2.21] }]
 * ```
 */
export function parseOpticalTable(text: string, source: string): OpticalTableRow[] {
  const table = readSizeTableRows(text, source, "optical table");
  const sizeColumn = table.columns.includes("radius_nm") ? "radius_nm" : table.columns.includes("diameter_nm") ? "diameter_nm" : null;
  if (sizeColumn === null) {
    throw new DotspecError("io/optical-column", `${source}: the optical table has neither "radius_nm" nor "diameter_nm"; its header must be e.g. radius_nm,peak_ev_1,peak_ev_2`);
  }
  const peakColumns = table.columns.filter((c) => c.startsWith("peak"));
  if (peakColumns.length === 0) {
    throw new DotspecError("io/optical-column", `${source}: the optical table has no peak column; name them peak_ev_1, peak_ev_2, … (energies in eV)`);
  }
  for (const c of table.columns) {
    if (c !== sizeColumn && !peakColumns.includes(c) && c !== "notes") {
      throw new DotspecError("io/optical-column", `${source}: unknown column ${quote(c)} in the optical table; the columns are ${sizeColumn}, peak_ev_1, peak_ev_2, … and notes`);
    }
  }
  const [lo, hi] = OPTICAL_PEAK_RANGE_EV;
  return table.rows.map(({ line, cells }) => {
    const where = `${source}: line ${line}`;
    const size = numberCell(cells[sizeColumn], where, sizeColumn);
    if (size === null || !(size > 0)) {
      throw new DotspecError("io/optical-size", `${where}: ${sizeColumn} must be greater than 0 nm; got ${size === null ? "an empty cell" : size}`);
    }
    const peaksEV: number[] = [];
    for (const c of peakColumns) {
      const v = numberCell(cells[c], where, c);
      if (v === null) continue;
      if (v < lo || v > hi) {
        throw new DotspecError("io/optical-peak", `${where}: ${c} must be an energy in eV between ${lo} and ${hi}; got ${v} (a wavelength in nm? convert with E = 1239.84 / λ)`);
      }
      peaksEV.push(v);
    }
    if (peaksEV.length === 0) throw new DotspecError("io/optical-peak", `${where}: the row has no peak; give at least peak_ev_1`);
    return { line, radiusNM: sizeColumn === "radius_nm" ? size : size / 2, peaksEV };
  });
}
