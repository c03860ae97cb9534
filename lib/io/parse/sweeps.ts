/**
 * Stage 7 of the importer, sweeps: each group's bias cut into monotonic sweeps, each sweep
 * ordered by ascending bias with its repeated bias values averaged.
 */
import { chooseSweeps, mergeDuplicates, splitMonotonic, type Segment } from "../sweepSegments.ts";
import { describeColumn, type Column } from "./columns.ts";
import type { KeptRows } from "./completeRows.ts";
import type { DataRows } from "./dataRows.ts";
import type { ColumnGroup } from "./groups.ts";
import { lineNumber, type TextLines } from "./lines.ts";
import type { ColumnValues } from "./numbers.ts";

/** Order of the bias values found in the file. */
export type BiasDirection = "ascending" | "descending" | "both" | "unordered";

/** Share of the span of the whole bias column a segment must cover to count as a full sweep. */
export const FULL_SWEEP_SHARE = 0.9;

/** Sweeps on a common bias: one bias array, the current and conductance columns on it. */
export interface SweepSet {
  /** Strictly ascending bias, V. */
  biasV: Float64Array;
  /** Current of each sweep on `biasV`, A. */
  currents: Float64Array[];
  /** Measured conductance of each conductance column on `biasV`, S. */
  conductances: Float64Array[];
}

/** The sweeps of every group. */
export interface Sweeps {
  /** One set per segment used (or per sorted group), in column order then file order. */
  sets: SweepSet[];
  /** Directions of the bias of the segments used; `"unordered"` for a sorted group. */
  directions: Set<BiasDirection>;
  /** Monotonic bias segments used, summed over the groups. */
  segments: number;
  /** Rows merged into another row with the same bias. */
  duplicatesMerged: number;
}

/**
 * Cut the rows of every group into sweeps.
 *
 * Parameters
 * ----------
 * file : TextLines
 *     The lines of stage 1 (for the line ranges in warnings).
 * table : DataRows
 *     Cells and start of the data.
 * columns : readonly Column[]
 *     The columns (to name a bias column).
 * groups : readonly ColumnGroup[]
 *     The column groups of stage 5.
 * values : ColumnValues
 *     The numbers of stage 6, SI units.
 * kept : KeptRows
 *     The rows each group keeps.
 * minPoints : number
 *     Fewest distinct bias points of a full sweep, in samples.
 * warnings : string[]
 *     Receives a warning when a bias column changes direction, when partial sweeps are left
 *     out, when a column is sorted, and when repeated bias values are averaged.
 *
 * Returns
 * -------
 * Sweeps
 *     One sweep set per segment used (bias strictly ascending, V; currents, A; conductances,
 *     S), the directions seen, the number of segments and of rows merged.
 *
 * Notes
 * -----
 * 1. Each group's bias is cut into monotonic segments (`splitMonotonic`).
 * 2. Segments that cover at least {@link FULL_SWEEP_SHARE} of the column's bias span are sweeps;
 *    up to two shorter ones (an interrupted sweep) are left out with a warning
 *    (`chooseSweeps`).
 * 3. A column whose segments are not a set of sweeps is sorted by bias (stable) and read as one
 *    sweep, direction "unordered".
 * 4. Each sweep is put in ascending bias order and its repeated bias values are averaged
 *    (`mergeDuplicates`).
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: the bias goes 0 → 4 V and back to 0 V in one column.
 * const { record } = parseCurveText("V,I\n0,1\n1,2\n2,3\n3,4\n4,5\n3.5,4.5\n2.5,3.5\n1.5,2.5\n0.5,1.5\n0,1\n");
 * [record.segments, record.biasDirection];  // => [2, "both"]
 * ```
 */
export function cutSweeps(
  file: TextLines,
  table: DataRows,
  columns: readonly Column[],
  groups: readonly ColumnGroup[],
  values: ColumnValues,
  kept: KeptRows,
  minPoints: number,
  warnings: string[],
): Sweeps {
  const sets: SweepSet[] = [];
  const directions = new Set<BiasDirection>();
  let segments = 0;
  let duplicatesMerged = 0;
  for (let k = 0; k < groups.length; k++) {
    const g = groups[k];
    const rows = kept.perGroup[k];
    const idx = (i: number) => (rows === null ? i : rows[i]);
    const gb = rows === null ? values[g.bias]! : pickRows(values[g.bias]!, rows);
    const gcols = [...g.currents, ...g.conductances].map((c) => (rows === null ? values[c]! : pickRows(values[c]!, rows)));
    const nc = g.currents.length;
    const toSet = (order: ArrayLike<number> | null): SweepSet => {
      const m = mergeDuplicates(gb, gcols, order);
      duplicatesMerged += m.merged;
      return { biasV: m.biasV, currents: m.values.slice(0, nc), conductances: m.values.slice(nc) };
    };
    const segs = splitMonotonic(gb);
    const fullSegs = segs.length === 1 ? segs : chooseSweeps(gb, segs, minPoints, FULL_SWEEP_SHARE);
    const name = describeColumn(columns[g.bias]);
    const lineRange = (s: Segment) =>
      `lines ${lineNumber(file, table.first + idx(s.start))}–${lineNumber(file, table.first + idx(s.end))}`;
    if (fullSegs) {
      for (const s of fullSegs) {
        // A whole ascending column needs no list of rows (null: in order).
        const whole = s.direction >= 0 && s.start === 0 && s.end === gb.length - 1;
        const order = whole ? null : new Int32Array(s.end - s.start + 1);
        if (order) for (let i = 0; i < order.length; i++) order[i] = s.direction >= 0 ? s.start + i : s.end - i;
        sets.push(toSet(order));
        directions.add(s.direction >= 0 ? "ascending" : "descending");
      }
      segments += fullSegs.length;
      if (segs.length > 1) {
        const parts = fullSegs.map((s) => `${s.direction >= 0 ? "up" : "down"} on ${lineRange(s)}`);
        warnings.push(`bias column ${name} changes direction: read as ${fullSegs.length} sweep${fullSegs.length > 1 ? "s" : ""} (${parts.join(", ")})`);
        const partial = segs.filter((s) => !fullSegs.includes(s));
        if (partial.length > 0) {
          warnings.push(
            `left out ${partial.length} partial sweep${partial.length > 1 ? "s" : ""} of ${name} covering less than ` +
              `${FULL_SWEEP_SHARE * 100} % of its bias range (${partial.map(lineRange).join(", ")})`,
          );
        }
      }
    } else {
      const order = Array.from(gb.keys()).sort((i, j) => gb[i] - gb[j] || i - j);
      sets.push(toSet(order));
      directions.add("unordered");
      segments += 1;
      warnings.push(
        `bias column ${name} is not monotonic (${segs.length - 1} changes of direction that do not form whole sweeps); ` +
          `rows sorted by bias and read as one sweep`,
      );
    }
  }
  if (duplicatesMerged > 0) {
    warnings.push(`${duplicatesMerged} repeated bias value${duplicatesMerged === 1 ? "" : "s"} within a sweep averaged with the row${duplicatesMerged === 1 ? "" : "s"} of the same bias`);
  }
  return { sets, directions, segments, duplicatesMerged };
}

/**
 * The values of a column at some rows.
 *
 * Parameters
 * ----------
 * col : Float64Array
 *     Values by data row.
 * idx : ArrayLike<number>
 *     Data rows to take, ascending and distinct (as {@link keepCompleteRows} gives them).
 *
 * Returns
 * -------
 * Float64Array
 *     `col[idx[i]]` at `i`: a new array, or `col` itself when every row is taken (not to be
 *     written to).
 *
 * Example
 * -------
 * ```ts
 * pickRows(Float64Array.of(5, 6, 7), [2, 0]);  // => Float64Array [7, 5]
 * ```
 */
export function pickRows(col: Float64Array, idx: ArrayLike<number>): Float64Array {
  // Every row kept (ascending and distinct, so the identity): the column itself, not a copy.
  if (idx.length === col.length) return col;
  const out = new Float64Array(idx.length);
  for (let i = 0; i < idx.length; i++) out[i] = col[idx[i]];
  return out;
}
