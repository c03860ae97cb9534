/**
 * Stage 6b of the importer, the resolution: how finely the current and conductance numbers were
 * written, from the text of their cells.
 */
import type { Column } from "./columns.ts";
import type { DataRows } from "./dataRows.ts";
import type { ColumnValues } from "./numbers.ts";

/** Powers of ten 10^-400 … 10^400 (exact as JavaScript writes them), indexed by exponent + 400. */
const POW10 = Float64Array.from({ length: 801 }, (_, k) => Number(`1e${k - 400}`));

/**
 * The value of one unit in the last written digit of a number cell, in the cell's own unit.
 *
 * Parameters
 * ----------
 * cell : string
 *     The cell text as in the file (`"-1.52849e-11"`, `"12,50"`, `"1.5D-03"`, `"42"`).
 * decimalComma : boolean
 *     The decimal separator is a comma.
 *
 * Returns
 * -------
 * number
 *     10^(exponent − digits after the decimal separator): 1e-16 for `"-1.52849e-11"`, 0.01 for
 *     `"12,50"` with a decimal comma, 1 for `"42"`; NaN when the cell is not a plain decimal
 *     number (empty, a word, quoted).
 *
 * Notes
 * -----
 * 1. Split off an exponent (`e`, `E`, `d`, `D`); its integer is the power of ten of the number.
 * 2. Count the digits after the decimal separator of the mantissa; an integer mantissa counts 0
 *    (its trailing zeros are taken as written digits).
 * 3. The quantum is 10^(exponent − digits).
 *
 * Example
 * -------
 * ```ts
 * cellQuantum("-1.52849e-11", false);  // => 1e-16
 * cellQuantum("0.0150", false);        // => 0.0001
 * ```
 */
export function cellQuantum(cell: string, decimalComma: boolean): number {
  const s = cell.trim();
  const n = s.length;
  if (n === 0 || n > 400) return NaN;
  const sep = decimalComma ? 44 : 46; // "," or "."
  let i = 0;
  let c = s.charCodeAt(0);
  if (c === 43 || c === 45 || c === 0x2212) i = 1;
  let digits = 0;
  let decimals = 0;
  let afterSep = false;
  for (; i < n; i++) {
    c = s.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      digits++;
      if (afterSep) decimals++;
    } else if (c === sep && !afterSep) afterSep = true;
    else break;
  }
  if (digits === 0) return NaN;
  let exponent = 0;
  if (i < n) {
    c = s.charCodeAt(i) | 32;
    if (c !== 101 && c !== 100) return NaN; // e or d
    const e = exponentDigits(s, i + 1);
    if (!Number.isInteger(e) || s.length === i + 1) return NaN;
    exponent = e;
  }
  return quantumOf(exponent, decimals);
}

/** 10^(exponent − decimals) from the table of {@link cellQuantum}; NaN outside 10^-400 … 10^400. */
export function quantumOf(exponent: number, decimals: number): number {
  const k = exponent - decimals + 400;
  return k >= 0 && k <= 800 ? POW10[k] : NaN;
}

/**
 * `Number(s.slice(from))` for an exponent: a sign and up to six digits read directly (the common
 * case, without a string copy and a conversion call), anything else by `Number` as before.
 */
function exponentDigits(s: string, from: number): number {
  const n = s.length;
  let i = from;
  let sign = 1;
  const c0 = s.charCodeAt(i);
  if (c0 === 43 || c0 === 45) {
    if (c0 === 45) sign = -1;
    i++;
  }
  if (i === n || n - i > 6) return Number(s.slice(from));
  let e = 0;
  for (; i < n; i++) {
    const c = s.charCodeAt(i);
    if (c < 48 || c > 57) return Number(s.slice(from));
    e = 10 * e + (c - 48);
  }
  return sign * e;
}

/**
 * The RMS quantum of the written numbers of every current and conductance column, in SI units.
 *
 * Parameters
 * ----------
 * table : DataRows
 *     Cells and start of the data.
 * columns : readonly Column[]
 *     Columns with roles and units (stage 4).
 * values : ColumnValues
 *     The numbers of stage 6 (cells that are not finite numbers are skipped).
 * decimalComma : boolean
 *     The decimal separator is a comma.
 *
 * Returns
 * -------
 * (number | null)[]
 *     Per column: √(mean q²) over its cells, q = {@link cellQuantum} × the unit's SI scale (A or
 *     S); null for bias and ignored columns and for a column without a readable cell.
 *
 * Notes
 * -----
 * 1. A cell whose value is exactly zero says nothing of the digits a magnitude gets (`0`
 *    in a column of `1.23456e-11`): it is skipped, unless the whole column is zero.
 * 2. The root mean square suits a noise floor: the variance of a rounding error of width q is
 *    q²/12, so the mean variance over the cells is mean(q²)/12.
 *
 * References
 * ----------
 * B. Widrow and I. Kollár, Quantization Noise: Roundoff Error in Digital Computation, Signal
 * Processing, Control, and Communications, Cambridge University Press (2008), ch. 4 (the q²/12
 * variance of rounding; from memory).
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: "bias (V),current (pA)" with cells "1.25", "-0.50" → 0.01 pA.
 * parseCurveText("bias (V),current (pA)\n0,1.25\n1,-0.50\n2,3.00\n", { minPoints: 3 }).curve.meta.currentResolutionA;
 * // => 1e-14
 * ```
 */
export function columnResolutions(table: DataRows, columns: readonly Column[], values: ColumnValues, decimalComma: boolean): (number | null)[] {
  const acc = resolutionSums(columns);
  addResolutions(acc, table, columns, values, decimalComma);
  return finishResolutions(acc, columns);
}

/** Running √(Σq²) of one column, kept as scale·√sum with rescaling (no overflow or underflow). */
interface QuantumSum {
  scale: number;
  sum: number;
  count: number;
}

/** The running sums of {@link columnResolutions} per column (cells of value zero apart); null for columns without one. */
export type ResolutionSums = ({ nonzero: QuantumSum; zero: QuantumSum } | null)[];

/** Empty running sums for the current and conductance columns. */
export function resolutionSums(columns: readonly Column[]): ResolutionSums {
  return columns.map((col) =>
    (col.role !== "current" && col.role !== "conductance") || !col.unitInfo ? null : { nonzero: { scale: 0, sum: 0, count: 0 }, zero: { scale: 0, sum: 0, count: 0 } },
  );
}

/**
 * Adds the cells of the data rows of `table` (with their `values`) to the running sums: the same
 * sums, in the same order, whether the rows come at once or in consecutive parts (a streamed file).
 */
export function addResolutions(acc: ResolutionSums, table: DataRows, columns: readonly Column[], values: ColumnValues, decimalComma: boolean): void {
  const { rows, first } = table;
  for (const col of columns) {
    const sums = acc[col.index];
    const v = values[col.index];
    if (!sums || !v) continue;
    for (let r = first; r < rows.length; r++) {
      const x = v[r - first];
      if (!Number.isFinite(x)) continue;
      addQuantum(sums, x, cellQuantum(rows[r][col.index], decimalComma));
    }
  }
}

/**
 * Adds one cell, of value `x` (finite, SI) and quantum `q` (in the column's unit), to the running
 * sums of its column; a `q` that is not positive (NaN, 0) is skipped. Cells must come in row order.
 */
export function addQuantum(sums: NonNullable<ResolutionSums[number]>, x: number, q: number): void {
  if (!(q > 0)) return;
  const a = x === 0 ? sums.zero : sums.nonzero;
  if (q > a.scale) {
    a.sum = a.scale === 0 ? 0 : a.sum * (a.scale / q) ** 2;
    a.scale = q;
  }
  a.sum += (q / a.scale) ** 2;
  a.count++;
}

/** The resolutions from the running sums (see {@link columnResolutions}). */
export function finishResolutions(acc: ResolutionSums, columns: readonly Column[]): (number | null)[] {
  return columns.map((col) => {
    const sums = acc[col.index];
    if (!sums) return null;
    const a = sums.nonzero.count > 0 ? sums.nonzero : sums.zero;
    if (a.count === 0) return null;
    const rms = a.scale * Math.sqrt(a.sum / a.count) * col.unitInfo!.scale;
    return Number.isFinite(rms) ? rms : null;
  });
}
