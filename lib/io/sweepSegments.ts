/**
 * Cutting a bias sequence into monotonic sweeps, choosing the full sweeps among them, merging
 * repeated bias points, and carrying a sweep onto another sweep's bias points
 * ({@link interpolateOnto}, shared with the signal stage). Used by the importer only.
 */
import { interpolateOnto } from "../util/interpolateOnto.ts";

export { interpolateOnto };

/** One monotonic run of a bias sequence: rows `start..end` (inclusive). */
export interface Segment {
  start: number;
  end: number;
  /** +1 rising, −1 falling, 0 constant (a single bias value). */
  direction: 1 | -1 | 0;
}

/**
 * Cut a bias sequence into monotonic segments.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in file order (finite values), V.
 *
 * Returns
 * -------
 * Segment[]
 *     Consecutive segments covering every row; one segment when the sequence is monotonic.
 *
 * Notes
 * -----
 * Repeated values do not change the direction. At a turning point:
 * 1. a turning value that occurs once belongs to both segments (the end of one sweep and the
 *    start of the next: `0 1 2 1 0` → rows 0–2 and 2–4);
 * 2. a turning value that is repeated is split: its last occurrence starts the next segment and
 *    the others end the previous one (`0 1 2 2 1 0` → rows 0–2 and 3–5).
 *
 * Example
 * -------
 * ```ts
 * splitMonotonic([0, 1, 2, 1, 0]);
 * // => [{start: 0, end: 2, direction: 1}, {start: 2, end: 4, direction: -1}]
 * ```
 */
export function splitMonotonic(biasV: ArrayLike<number>): Segment[] {
  const n = biasV.length;
  const out: Segment[] = [];
  if (n === 0) return out;
  let start = 0;
  let direction: 1 | -1 | 0 = 0;
  let lastMove = 0; // first index of the current run of equal values
  for (let i = 1; i < n; i++) {
    const d = biasV[i] > biasV[i - 1] ? 1 : biasV[i] < biasV[i - 1] ? -1 : 0;
    if (d === 0) continue;
    if (direction !== 0 && d !== direction) {
      const runStart = lastMove;
      const runEnd = i - 1;
      if (runStart === runEnd) {
        out.push({ start, end: runEnd, direction });
        start = runEnd;
      } else {
        out.push({ start, end: runEnd - 1, direction });
        start = runEnd;
      }
    }
    direction = d;
    lastMove = i;
  }
  out.push({ start, end: n - 1, direction });
  return out;
}

/**
 * The full sweeps among the monotonic segments of a bias column.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias in file order (finite values), V.
 * segments : Segment[]
 *     Its monotonic segments, from {@link splitMonotonic}.
 * minPoints : number
 *     Fewest distinct bias values a full sweep has, in samples.
 * fullShare : number
 *     Share (0 to 1) of the span of the whole column that a full sweep covers.
 *
 * Returns
 * -------
 * Segment[] | null
 *     The full sweeps in file order, when there is at least one and at most two other (partial)
 *     segments; otherwise null: the column is not a set of sweeps.
 *
 * Notes
 * -----
 * Spans are computed from halves (max/2 − min/2), which stay finite for any finite bias.
 *
 * Example
 * -------
 * ```ts
 * chooseSweeps(Float64Array.of(0, 1, 2, 1, 0), splitMonotonic([0, 1, 2, 1, 0]), 3, 0.9);
 * // => [{start: 0, end: 2, direction: 1}, {start: 2, end: 4, direction: -1}]
 * ```
 */
export function chooseSweeps(
  biasV: Float64Array,
  segments: readonly Segment[],
  minPoints: number,
  fullShare: number,
): Segment[] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < biasV.length; i++) {
    if (biasV[i] < lo) lo = biasV[i];
    if (biasV[i] > hi) hi = biasV[i];
  }
  const span = hi / 2 - lo / 2;
  const full = segments.filter((s) => {
    const segSpan = Math.abs(biasV[s.end] / 2 - biasV[s.start] / 2);
    if (!(segSpan >= fullShare * span)) return false;
    let distinct = 1;
    for (let i = s.start + 1; i <= s.end; i++) if (biasV[i] !== biasV[i - 1]) distinct++;
    return distinct >= minPoints;
  });
  return full.length >= 1 && segments.length - full.length <= 2 ? full : null;
}

/** Bias points in ascending order with one or more value columns, repeated points merged. */
export interface MergedSweep {
  /** Distinct bias values, strictly ascending, V. */
  biasV: Float64Array;
  /** One array per input column, on `biasV`. */
  values: Float64Array[];
  /** Rows removed by merging repeated bias values (rows in − points out). */
  merged: number;
}

/**
 * Order rows by bias and average the rows that share a bias value.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias of every row, V.
 * columns : ArrayLike<number>[]
 *     Values of every row, one array per column (any unit).
 * order : ArrayLike<number> | null
 *     Row indices in ascending bias order (ties adjacent); null for the rows as they are.
 *
 * Returns
 * -------
 * MergedSweep
 *     Strictly ascending bias, the mean of each column over the rows at each bias, and the count
 *     of rows merged away. When the rows are already in order with no repeated bias (and the
 *     inputs are Float64Arrays), the input arrays themselves (not to be written to).
 *
 * Notes
 * -----
 * Means are summed as Σ xᵢ/n so that values near the largest double cannot overflow.
 *
 * Example
 * -------
 * ```ts
 * mergeDuplicates([0, 1, 1, 2], [[0, 10, 20, 30]], [0, 1, 2, 3]);
 * // => {biasV: [0, 1, 2], values: [[0, 15, 30]], merged: 1}
 * ```
 */
export function mergeDuplicates(
  biasV: ArrayLike<number>,
  columns: readonly ArrayLike<number>[],
  orderOrNull: ArrayLike<number> | null,
): MergedSweep {
  const n = orderOrNull === null ? biasV.length : orderOrNull.length;
  // Rows already in order with no repeated bias (a whole ascending sweep): the arrays themselves.
  if (n === biasV.length && biasV instanceof Float64Array && columns.every((c) => c instanceof Float64Array && c.length === n)) {
    let plain = true;
    for (let i = 0; i < n && plain; i++) plain = (orderOrNull === null || orderOrNull[i] === i) && (i === 0 || biasV[i] > biasV[i - 1]);
    if (plain) return { biasV, values: columns as Float64Array[], merged: 0 };
  }
  const order: ArrayLike<number> = orderOrNull ?? Int32Array.from({ length: n }, (_, i) => i);
  const outBias = new Float64Array(n);
  const outValues = columns.map(() => new Float64Array(n));
  let m = 0;
  let i = 0;
  while (i < n) {
    const b = biasV[order[i]];
    let j = i + 1;
    while (j < n && biasV[order[j]] === b) j++;
    outBias[m] = b;
    const k = j - i;
    for (let c = 0; c < columns.length; c++) {
      const col = columns[c];
      if (k === 1) {
        outValues[c][m] = col[order[i]];
      } else {
        let s = 0;
        for (let r = i; r < j; r++) s += col[order[r]] / k;
        outValues[c][m] = s;
      }
    }
    m++;
    i = j;
  }
  return {
    biasV: m === n ? outBias : outBias.slice(0, m),
    values: outValues.map((v) => (m === n ? v : v.slice(0, m))),
    merged: n - m,
  };
}
