/**
 * The stages of the long-table grid reader, shared by the text parser ({@link parseGridTable},
 * browser-safe) and the streaming file reader (readGridTableFile): the layout from the head of the
 * file, each row's four numbers, the regular axes through the distinct values, and the cube.
 * Reading in two passes (values first, then the cube) keeps memory to the cube itself.
 */
import type { GridAxis, GridCube } from "../grid/gridCube.ts";
import { DotspecError } from "../util/errors.ts";
import { detectDelimiter, isDataRow, parseNumberCell, splitLine, startsLikeNumber, type Delimiter } from "./cells.ts";
import { quote } from "./parse/messages.ts";
import { readColumnHeader, splitSpacedHeader } from "./readColumnHeader.ts";
import { parseUnit, toSI, type UnitInfo } from "./units.ts";

/** Limits of the long-table reader's stages (locked by a test). */
export const GRID_TABLE_ROWS_DEFAULTS = Object.freeze({
  /** Lines that start like a number used to find the delimiter and decimal separator. */
  sampleLines: 50,
  /** The layout is found within this many lines at most (a file of words is not read to its end). */
  headLines: 100_000,
  /** Most distinct values of one axis (x, y or bias) before the table is refused as not a grid. */
  maxDistinct: 1_000_000,
});

/** How a long table is laid out: found from its first lines. */
export interface GridTableLayout {
  delimiter: Delimiter;
  decimalComma: boolean;
  /** Index of the header line (0-based). */
  headerLine: number;
  /** Column indices of x, y, bias and current. */
  ix: number;
  iy: number;
  ib: number;
  ic: number;
  /** Cells a data row needs at least. */
  need: number;
  /** The header cells of the four columns as written. */
  columns: { x: string; y: string; bias: string; current: string };
  biasUnit: UnitInfo;
  currentUnit: UnitInfo;
  warnings: string[];
}

/** A comment (`#`, `%`) or blank line. */
export function isGridComment(line: string): boolean {
  return /^\s*[#%]/.test(line) || line.trim() === "";
}

/**
 * The layout of a long table from its first lines: the whole text, or a head holding at least
 * `sampleLines` lines that start like a number (or `headLines` lines); the answer is the same.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/no-data`, `io/no-header`, `io/missing-column`, `io/position-unit`, `io/unknown-unit`.
 *
 * Example
 * -------
 * ```ts
 * gridTableLayout(["x (nm),y (nm),bias (V),current (pA)", "0,0,-1,2"], "g.csv").ic; // => 3
 * ```
 */
export function gridTableLayout(lines: readonly string[], source: string): GridTableLayout {
  const head = lines.length > GRID_TABLE_ROWS_DEFAULTS.headLines ? lines.slice(0, GRID_TABLE_ROWS_DEFAULTS.headLines) : lines;
  const sample = head.filter((l) => !isGridComment(l) && startsLikeNumber(l)).slice(0, GRID_TABLE_ROWS_DEFAULTS.sampleLines);
  if (!sample.length) throw new DotspecError("io/no-data", `${source}: no data rows`);
  const { delimiter, decimalComma } = detectDelimiter(sample);
  let headerLine = -1;
  for (let i = 0; i < head.length; i++) {
    if (isGridComment(head[i])) continue;
    if (!isDataRow(splitLine(head[i], delimiter), decimalComma)) headerLine = i;
    break;
  }
  if (headerLine < 0) {
    throw new DotspecError("io/no-header", `${source}: a grid table needs a header row naming x (nm), y (nm), bias and current before the data`);
  }
  const width = splitLine(sample[0], delimiter).length;
  const cells = delimiter === "whitespace" ? splitSpacedHeader(head[headerLine], width) : splitLine(head[headerLine], delimiter);
  const headers = cells.map((c) => readColumnHeader(c));
  const find = (pred: (h: (typeof headers)[number]) => boolean, what: string): number => {
    const i = headers.findIndex(pred);
    if (i < 0) {
      throw new DotspecError(
        "io/missing-column",
        `${source}: no ${what} column among the headers ${headers.slice(0, 12).map((h) => quote(h.header)).join(", ")}${headers.length > 12 ? ", …" : ""}; name the columns x (nm), y (nm), bias (V) and current (A) (other units as for curves)`,
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
      throw new DotspecError("io/position-unit", `${source}: column ${quote(headers[i].header)} must give positions in nm, as "${headers[i].name} (nm)"`);
    }
  }
  const unit = (i: number, q: "bias" | "current"): UnitInfo =>
    headers[i].unitText === null ? parseUnit(q === "bias" ? "V" : "A", q) : parseUnit(headers[i].unitText!, q, `${source}: column ${quote(headers[i].header)}`);
  const biasUnit = unit(ib, "bias");
  const currentUnit = unit(ic, "current");
  const warnings: string[] = [];
  if (headers[ib].unitText === null) warnings.push(`bias column ${quote(headers[ib].header)} has no unit: read as V`);
  if (headers[ic].unitText === null) warnings.push(`current column ${quote(headers[ic].header)} has no unit: read as A`);
  return {
    delimiter,
    decimalComma,
    headerLine,
    ix,
    iy,
    ib,
    ic,
    need: Math.max(ix, iy, ib, ic) + 1,
    columns: { x: headers[ix].header, y: headers[iy].header, bias: headers[ib].header, current: headers[ic].header },
    biasUnit,
    currentUnit,
    warnings,
  };
}

/**
 * Reads one data line into `out` = [x (nm), y (nm), bias (V), current (A)]; false for a comment
 * or blank line.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/ragged-row` naming the line (from 1) when a used cell is missing or not a finite number.
 */
export function readGridRow(line: string, lineIndex: number, layout: GridTableLayout, source: string, out: Float64Array): boolean {
  if (isGridComment(line)) return false;
  const row = splitLine(line, layout.delimiter);
  const cols = [layout.ix, layout.iy, layout.ib, layout.ic];
  let ok = row.length >= layout.need;
  for (let k = 0; k < 4 && ok; k++) {
    const v = parseNumberCell(row[cols[k]], layout.decimalComma);
    out[k] = k === 2 ? toSI(v, layout.biasUnit) : k === 3 ? toSI(v, layout.currentUnit) : v;
    ok = Number.isFinite(out[k]);
  }
  if (!ok) {
    throw new DotspecError("io/ragged-row", `${source}: line ${lineIndex + 1} needs numbers in columns ${cols.map((i) => i + 1).join(", ")}; got ${JSON.stringify(line.slice(0, 80))}`);
  }
  return true;
}

/** The distinct values of x, y and bias seen in pass 1, and the number of data rows. */
export interface GridValueSets {
  x: Set<number>;
  y: Set<number>;
  bias: Set<number>;
  rows: number;
}

/** An empty {@link GridValueSets}. */
export function gridValueSets(): GridValueSets {
  return { x: new Set(), y: new Set(), bias: new Set(), rows: 0 };
}

/**
 * Pass 1: adds one row's values to the sets.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-grid` when an axis has more than {@link GRID_TABLE_ROWS_DEFAULTS}.maxDistinct values.
 */
export function addGridValues(sets: GridValueSets, row: Float64Array, lineIndex: number, source: string): void {
  sets.x.add(row[0]);
  sets.y.add(row[1]);
  sets.bias.add(row[2]);
  sets.rows++;
  const max = GRID_TABLE_ROWS_DEFAULTS.maxDistinct;
  if (sets.x.size > max || sets.y.size > max || sets.bias.size > max) {
    const which = sets.x.size > max ? "x" : sets.y.size > max ? "y" : "bias";
    throw new DotspecError("io/not-grid", `${source}: line ${lineIndex + 1}: more than ${max} distinct ${which} values; grid tables need regularly spaced x, y and bias values`);
  }
}

/** The regular axes of a table and how far the grid may reach per row. */
export interface GridAxes {
  xNM: GridAxis;
  yNM: GridAxis;
  biasV: GridAxis;
}

/**
 * The regular axes through the distinct values of pass 1.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-grid` (values off a regular grid, a span no grid can have, or a grid of more than
 *     `maxPointsPerRow` points per row of the table).
 */
export function gridAxes(sets: GridValueSets, tolerance: number, maxPointsPerRow: number, source: string): GridAxes {
  const xNM = regularAxis(sets.x, "x", "nm", tolerance, source);
  const yNM = regularAxis(sets.y, "y", "nm", tolerance, source);
  const biasV = regularAxis(sets.bias, "bias", "V", tolerance, source);
  const nx = xNM.count, ny = yNM.count, nb = biasV.count;
  if (nx * ny * nb > maxPointsPerRow * sets.rows) {
    throw new DotspecError(
      "io/not-grid",
      `${source}: the x, y and bias values span a regular grid of ${nx} × ${ny} × ${nb} points but the table has only ${sets.rows} rows; ` +
        `grid tables need regularly spaced x, y and bias values, each sweep on the same biases`,
    );
  }
  return { xNM, yNM, biasV };
}

/** The regular axis through a set of values: the smallest spacing as step, every value on it. */
function regularAxis(values: Iterable<number>, name: string, unit: string, tol: number, source: string): GridAxis {
  const u = Float64Array.from(values).sort();
  const distinct: number[] = [];
  for (const v of u) if (!distinct.length || v - distinct[distinct.length - 1] > 1e-9 * Math.max(1, Math.abs(v))) distinct.push(v);
  if (distinct.length === 1) return { start: distinct[0], step: 1, count: 1 };
  const start = distinct[0];
  const end = distinct[distinct.length - 1];
  if (!Number.isFinite(end - start)) {
    throw new DotspecError("io/not-grid", `${source}: ${name} runs from ${start} to ${end} ${unit}, a span no grid can have; check the ${name} column`);
  }
  let step = Infinity;
  for (let i = 1; i < distinct.length; i++) step = Math.min(step, distinct[i] - distinct[i - 1]);
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
  if (!Number.isSafeInteger(count)) {
    throw new DotspecError("io/not-grid", `${source}: ${name} from ${start} to ${merged[merged.length - 1]} ${unit} in steps of ${step} ${unit} is not a grid a table can fill; check the ${name} column`);
  }
  // The step over the whole span: less rounding than the smallest spacing.
  return { start, step: (merged[merged.length - 1] - start) / (count - 1), count };
}

/** Pass 2: the sums and counts of the samples at each grid point. */
export interface GridAccumulator {
  axes: GridAxes;
  sum: Float64Array;
  count: Uint16Array;
}

/** An empty accumulator over the axes. */
export function gridAccumulator(axes: GridAxes): GridAccumulator {
  const n = axes.xNM.count * axes.yNM.count * axes.biasV.count;
  return { axes, sum: new Float64Array(n), count: new Uint16Array(n) };
}

/** Pass 2: adds one row (x, y, bias, current) to its grid point. */
export function addGridSample(acc: GridAccumulator, row: Float64Array): void {
  const { xNM, yNM, biasV } = acc.axes;
  const a = Math.round((row[0] - xNM.start) / xNM.step);
  const b = Math.round((row[1] - yNM.start) / yNM.step);
  const k = Math.round((row[2] - biasV.start) / biasV.step);
  const j = (b * xNM.count + a) * biasV.count + k;
  acc.sum[j] += row[3];
  if (acc.count[j] < 65535) acc.count[j]++;
}

/**
 * The cube from the accumulated samples: the mean current at each grid point; a pixel without a
 * sample at every bias is missing (current 0, flagged).
 */
export function gridCubeFrom(acc: GridAccumulator, source: string, warnings: string[]): { cube: GridCube; missingPixelsNM: [number, number][] } {
  const { xNM, yNM, biasV } = acc.axes;
  const nx = xNM.count, ny = yNM.count, nb = biasV.count;
  const { sum, count } = acc;
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
    missingPixelsNM.push([xNM.start + (p % nx) * xNM.step, yNM.start + Math.floor(p / nx) * yNM.step]);
  }
  if (missingPixelsNM.length) {
    warnings.push(`${missingPixelsNM.length} of ${nx * ny} grid pixels have no data${incomplete ? ` (${incomplete} of them an incomplete sweep)` : ""}; they are left out of every map`);
  }
  const cube: GridCube = { currentA: sum, xNM, yNM, biasV, missing: missingPixelsNM.length ? missing : null, source };
  return { cube, missingPixelsNM };
}
