/**
 * Stage 8 of the importer: every sweep on the same bias points.
 */
import { DotspecError } from "../../util/errors.ts";
import { interpolateOnto } from "../sweepSegments.ts";
import { describeColumn, type Column } from "./columns.ts";
import type { RowCounts } from "./record.ts";
import type { SweepSet } from "./sweeps.ts";

/**
 * Put every sweep on the same bias points.
 *
 * Parameters
 * ----------
 * sets : readonly SweepSet[]
 *     The sweep sets of stage 7, bias strictly ascending (V).
 * minPoints : number
 *     Fewest distinct bias points a sweep and the common points may have, in samples.
 * src : string
 *     Label of the text, put in front of error messages.
 * counts : RowCounts
 *     What happened to the data rows (named in the too-few-points message).
 * biasColumns : readonly Column[]
 *     Every bias column (named in the too-few-points message).
 * warnings : string[]
 *     Receives a warning when the sweeps are interpolated.
 *
 * Returns
 * -------
 * SweepSet
 *     One set: the common bias (V) and every current and conductance column on it, in order.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/too-few-points` for a sweep, or for the common points, with fewer than `minPoints`
 *     points; `io/no-common-range` when the sweeps' bias ranges do not overlap.
 *
 * Notes
 * -----
 * 1. Sweeps on the same bias values as the first are taken as they are.
 * 2. Otherwise the common range is [max of the first biases, min of the last biases]; each sweep
 *    is carried by linear interpolation (`interpolateOnto`) onto the points of the first sweep
 *    inside it.
 *
 * References
 * ----------
 * Linear interpolation: M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions
 * (Dover, 1964), 25.2.4 (two-point formula).
 *
 * Example
 * -------
 * ```ts
 * // Through the importer: sweeps on 0…5 V and on 0.5…5.5 V share 0.5…5 V; the first sweep's
 * // points inside it are kept.
 * parseCurveText("V,I,V2,I2\n0,1,0.5,1\n1,2,1.5,2\n2,3,2.5,3\n3,4,3.5,4\n4,5,4.5,5\n5,6,5.5,6\n").curve.biasV;
 * // => Float64Array [1, 2, 3, 4, 5]
 * ```
 */
export function ontoCommonBias(
  sets: readonly SweepSet[],
  minPoints: number,
  src: string,
  counts: RowCounts,
  biasColumns: readonly Column[],
  warnings: string[],
): SweepSet {
  const tooFew = (n: number, where = "after cleaning") =>
    new DotspecError(
      "io/too-few-points",
      `${src}: only ${n} distinct bias point${n === 1 ? "" : "s"} ${where}; at least ${minPoints} are needed ` +
        `(${counts.dataRows} data rows, ${counts.rowsDropped} left out, ${counts.duplicatesMerged} repeated bias values merged); ` +
        `check that the bias column (${biasColumns.map(describeColumn).join(", ")}) is the swept one`,
    );
  for (const s of sets) if (s.biasV.length < minPoints) throw tooFew(s.biasV.length);
  const first = sets[0].biasV;
  if (sets.every((s) => sameValues(s.biasV, first))) {
    return { biasV: first, currents: sets.flatMap((s) => s.currents), conductances: sets.flatMap((s) => s.conductances) };
  }
  let lo = -Infinity;
  let hi = Infinity;
  for (const s of sets) {
    lo = Math.max(lo, s.biasV[0]);
    hi = Math.min(hi, s.biasV[s.biasV.length - 1]);
  }
  if (!(lo < hi)) {
    throw new DotspecError(
      "io/no-common-range",
      `${src}: the sweeps cover bias ranges that do not overlap (${sets.map((s) => `${s.biasV[0]} to ${s.biasV[s.biasV.length - 1]} V`).join("; ")}); ` +
        `pass biasColumn and currentColumns to read one sweep`,
    );
  }
  let a = 0;
  while (first[a] < lo) a++;
  let z = first.length;
  while (first[z - 1] > hi) z--;
  const lost = first.length - (z - a);
  const grid = first.slice(a, z);
  const common: SweepSet = {
    biasV: grid,
    currents: sets.flatMap((s) => s.currents.map((v) => interpolateOnto(s.biasV, v, grid))),
    conductances: sets.flatMap((s) => s.conductances.map((v) => interpolateOnto(s.biasV, v, grid))),
  };
  warnings.push(
    `the sweeps have different bias points: carried by linear interpolation onto the ${grid.length} points of the first ` +
      `sweep inside their common range ${lo} to ${hi} V` + (lost > 0 ? ` (${lost} points outside it left out)` : ""),
  );
  if (grid.length < minPoints) throw tooFew(grid.length, `inside the bias range shared by all sweeps (${lo} to ${hi} V)`);
  return common;
}

/**
 * Whether two arrays hold the same numbers in the same order.
 *
 * Parameters
 * ----------
 * a, b : Float64Array
 *
 * Returns
 * -------
 * boolean
 *     True for the same array or equal lengths and `===` values (NaN never equal).
 *
 * Example
 * -------
 * ```ts
 * sameValues(Float64Array.of(1, 2), Float64Array.of(1, 2));  // => true
 * ```
 */
export function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}
