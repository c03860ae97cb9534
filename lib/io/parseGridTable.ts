/**
 * Reading a grid stored as a long table: one row per sample with the columns x (nm), y (nm),
 * bias and current.
 */
import type { GridAxis, GridCube } from "../grid/gridCube.ts";
import { DotspecError } from "../util/errors.ts";
import { detectDelimiter, isDataRow, parseNumberCell, splitLine, startsLikeNumber, type Delimiter } from "./cells.ts";
import { readColumnHeader, splitSpacedHeader } from "./readColumnHeader.ts";
import { parseUnit, toSI, type UnitInfo } from "./units.ts";

/** Options of {@link parseGridTable}. */
export interface ParseGridTableOptions {
  /** Name of the table for messages and the cube's source. Default "grid table". */
  source?: string;
}

/** How the table was read. */
export interface GridTableRecord {
  source: string;
  delimiter: Delimiter;
  decimalComma: boolean;
  /** The header cells of the x, y, bias and current columns as written. */
  columns: { x: string; y: string; bias: string; current: string };
  /** Units of bias and current (SI when the header gave none). */
  units: { bias: string; current: string };
  /** Data rows read. */
  rows: number;
  /** Pixels of the regular grid. */
  pixels: number;
  /** Positions [x, y] (nm) of the grid pixels with no data or an incomplete sweep (they are left out of every map). */
  missingPixelsNM: [number, number][];
  warnings: string[];
}

/** Tolerances of the grid reconstruction (locked by a test). */
export const GRID_TABLE_DEFAULTS = Object.freeze({
  /** Positions and biases may sit off their regular grid by this fraction of a step. */
  gridTolerance: 0.05,
});

/**
 * Parses a long-table grid: delimited text (comma, semicolon, tab or whitespace; `#`/`%` comment
 * lines) with a header naming `x (nm)`, `y (nm)`, a bias column and a current column (units as the
 * curve importer reads them: `bias (mV)`, `Current [pA]`, `bias_V`, …), one row per sample.
 *
 * Parameters
 * ----------
 * text : string
 *     The file's text.
 * options : ParseGridTableOptions, optional
 *     source (default "grid table").
 *
 * Returns
 * -------
 * { cube: GridCube; record: GridTableRecord }
 *     The cube (Float64Array, current in A; missing pixels flagged) and how it was read.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/no-header` (no header row), `io/missing-column` (x, y, bias or current not found: the
 *     message lists the headers), `io/position-unit` (x or y not in nm), `io/unknown-unit`,
 *     `io/ragged-row` (a row with too few cells or a non-number, naming the line), `io/not-grid`
 *     (positions or biases not on a regular grid, naming the value).
 *
 * Notes
 * -----
 * 1. Header: the first non-comment line that is not a data row; the delimiter and decimal
 *    separator from the data lines ({@link detectDelimiter}); each header cell taken apart by
 *    {@link readColumnHeader} (the curve importer's rules). x and y are the columns named `x` and
 *    `y` (unit nm); bias and current the first columns of those roles.
 * 2. Axes: the distinct x, y and bias values, each on a regular grid (step = the smallest
 *    spacing, every value within 5 % of a step of start + k·step).
 * 3. Samples at the same pixel and bias (there-and-back sweeps) are averaged. A pixel with no
 *    sample, or without a sample at every bias, is missing: its current is 0 and it is flagged.
 *
 * Example
 * -------
 * ```ts
 * parseGridTable("x (nm),y (nm),bias (V),current (pA)\n0,0,-1,-2.5\n…").cube.xNM;
 * // => { start: 0, step: 0.5, count: 16 }
 * ```
 */
export function parseGridTable(text: string, options: ParseGridTableOptions = {}): { cube: GridCube; record: GridTableRecord } {
  const source = options.source ?? "grid table";
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\r|\n/);
  const isComment = (l: string) => /^\s*[#%]/.test(l) || l.trim() === "";
  const sample = lines.filter((l) => !isComment(l) && startsLikeNumber(l)).slice(0, 50);
  if (!sample.length) throw new DotspecError("io/no-data", `${source}: no data rows`);
  const { delimiter, decimalComma } = detectDelimiter(sample);
  let headerLine = -1;
  for (let i = 0; i < lines.length; i++) {
    if (isComment(lines[i])) continue;
    if (!isDataRow(splitLine(lines[i], delimiter), decimalComma)) headerLine = i;
    break;
  }
  if (headerLine < 0) {
    throw new DotspecError("io/no-header", `${source}: a grid table needs a header row naming x (nm), y (nm), bias and current before the data`);
  }
  const width = splitLine(sample[0], delimiter).length;
  const cells = delimiter === "whitespace" ? splitSpacedHeader(lines[headerLine], width) : splitLine(lines[headerLine], delimiter);
  const headers = cells.map((c) => readColumnHeader(c));
  const find = (pred: (h: (typeof headers)[number]) => boolean, what: string): number => {
    const i = headers.findIndex(pred);
    if (i < 0) {
      throw new DotspecError(
        "io/missing-column",
        `${source}: no ${what} column among the headers ${headers.map((h) => JSON.stringify(h.header)).join(", ")}; name the columns x (nm), y (nm), bias (V) and current (A) (other units as for curves)`,
      );
    }
    return i;
  };
  const ix = find((h) => h.name.toLowerCase() === "x", "x");
  const iy = find((h) => h.name.toLowerCase() === "y", "y");
  const ib = find((h) => h.role === "bias", "bias");
  const ic = find((h) => h.role === "current", "current");
  for (const i of [ix, iy]) {
    if (headers[i].unitText !== "nm") {
      throw new DotspecError("io/position-unit", `${source}: column ${JSON.stringify(headers[i].header)} must give positions in nm, as "${headers[i].name} (nm)"`);
    }
  }
  const unit = (i: number, q: "bias" | "current"): UnitInfo =>
    headers[i].unitText === null ? parseUnit(q === "bias" ? "V" : "A", q) : parseUnit(headers[i].unitText!, q, `${source}: column ${JSON.stringify(headers[i].header)}`);
  const biasUnit = unit(ib, "bias");
  const currentUnit = unit(ic, "current");
  const warnings: string[] = [];
  if (headers[ib].unitText === null) warnings.push(`bias column ${JSON.stringify(headers[ib].header)} has no unit: read as V`);
  if (headers[ic].unitText === null) warnings.push(`current column ${JSON.stringify(headers[ic].header)} has no unit: read as A`);

  const need = Math.max(ix, iy, ib, ic) + 1;
  const xs: number[] = [], ys: number[] = [], vs: number[] = [], is: number[] = [];
  for (let li = headerLine + 1; li < lines.length; li++) {
    if (isComment(lines[li])) continue;
    const row = splitLine(lines[li], delimiter);
    const vals = [ix, iy, ib, ic].map((i) => (i < row.length ? parseNumberCell(row[i], decimalComma) : NaN));
    if (row.length < need || vals.some((v) => !Number.isFinite(v))) {
      throw new DotspecError("io/ragged-row", `${source}: line ${li + 1} needs numbers in columns ${[ix, iy, ib, ic].map((i) => i + 1).join(", ")}; got ${JSON.stringify(lines[li].slice(0, 80))}`);
    }
    xs.push(vals[0]);
    ys.push(vals[1]);
    vs.push(toSI(vals[2], biasUnit));
    is.push(toSI(vals[3], currentUnit));
  }
  const xAxis = regularAxis(xs, "x", "nm", source);
  const yAxis = regularAxis(ys, "y", "nm", source);
  const bAxis = regularAxis(vs, "bias", "V", source);
  const nx = xAxis.count, ny = yAxis.count, nb = bAxis.count;
  const sum = new Float64Array(nx * ny * nb);
  const count = new Uint16Array(nx * ny * nb);
  for (let r = 0; r < xs.length; r++) {
    const a = Math.round((xs[r] - xAxis.start) / xAxis.step);
    const b = Math.round((ys[r] - yAxis.start) / yAxis.step);
    const k = Math.round((vs[r] - bAxis.start) / bAxis.step);
    const j = (b * nx + a) * nb + k;
    sum[j] += is[r];
    if (count[j] < 65535) count[j]++;
  }
  const missing = new Uint8Array(nx * ny);
  const missingPixelsNM: [number, number][] = [];
  let incomplete = 0;
  for (let p = 0; p < nx * ny; p++) {
    let have = 0;
    for (let k = 0; k < nb; k++) if (count[p * nb + k] > 0) have++;
    if (have === nb) {
      for (let k = 0; k < nb; k++) sum[p * nb + k] /= count[p * nb + k];
      continue;
    }
    if (have > 0) incomplete++;
    missing[p] = 1;
    sum.fill(0, p * nb, (p + 1) * nb);
    missingPixelsNM.push([xAxis.start + (p % nx) * xAxis.step, yAxis.start + Math.floor(p / nx) * yAxis.step]);
  }
  if (missingPixelsNM.length) {
    warnings.push(
      `${missingPixelsNM.length} of ${nx * ny} grid pixels have no data${incomplete ? ` (${incomplete} of them an incomplete sweep)` : ""}; they are left out of every map`,
    );
  }
  const cube: GridCube = { currentA: sum, xNM: xAxis, yNM: yAxis, biasV: bAxis, missing: missingPixelsNM.length ? missing : null, source };
  return {
    cube,
    record: {
      source,
      delimiter,
      decimalComma,
      columns: { x: headers[ix].header, y: headers[iy].header, bias: headers[ib].header, current: headers[ic].header },
      units: { bias: biasUnit.unit, current: currentUnit.unit },
      rows: xs.length,
      pixels: nx * ny,
      missingPixelsNM,
      warnings,
    },
  };
}

/** The regular axis through a set of values: the smallest spacing as step, every value on it. */
function regularAxis(values: readonly number[], name: string, unit: string, source: string): GridAxis {
  const u = Float64Array.from(values).sort();
  const distinct: number[] = [];
  for (const v of u) if (!distinct.length || v - distinct[distinct.length - 1] > 1e-9 * Math.max(1, Math.abs(v))) distinct.push(v);
  if (distinct.length === 1) return { start: distinct[0], step: 1, count: 1 };
  let step = Infinity;
  for (let i = 1; i < distinct.length; i++) step = Math.min(step, distinct[i] - distinct[i - 1]);
  const start = distinct[0];
  const tol = GRID_TABLE_DEFAULTS.gridTolerance;
  // Values within the tolerance of one grid point count as one (rounding in the file).
  const merged: number[] = [];
  for (const v of distinct) if (!merged.length || v - merged[merged.length - 1] > tol * step) merged.push(v);
  step = Infinity;
  for (let i = 1; i < merged.length; i++) step = Math.min(step, merged[i] - merged[i - 1]);
  if (merged.length === 1) return { start, step: 1, count: 1 };
  for (const v of merged) {
    const k = (v - start) / step;
    if (Math.abs(k - Math.round(k)) > tol) {
      throw new DotspecError("io/not-grid", `${source}: ${name} = ${v} ${unit} is not on a regular grid from ${start} ${unit} in steps of ${step} ${unit}; grid tables need regularly spaced ${name} values`);
    }
  }
  const count = Math.round((merged[merged.length - 1] - start) / step) + 1;
  // The step over the whole span: less rounding than the smallest spacing.
  return { start, step: (merged[merged.length - 1] - start) / (count - 1), count };
}
