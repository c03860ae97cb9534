/**
 * The η one curve is analysed with: the one the caller gives, else the one its file states.
 */
import type { Curve } from "../curve.ts";
import { etaFromMetadata } from "./etaFromMetadata.ts";

/** The η chosen for a curve, and a note for its warnings when it came from the file. */
export interface CurveEta {
  /** η in (0, 1], or undefined: none given or stated (the analysis then takes 1 and says so). */
  eta: number | undefined;
  /** `η = … taken from the file's metadata ("key")` when the file's line was used, else null. */
  note: string | null;
}

/**
 * Chooses the voltage-division factor η of one curve.
 *
 * Parameters
 * ----------
 * given : number | undefined
 *     η from the caller (`--eta`, a size table's `eta` column, a notebook control), or undefined.
 * curve : Curve
 *     The curve; its metadata lines may state η (`# eta: 0.88`, see {@link etaFromMetadata}).
 *
 * Returns
 * -------
 * CurveEta
 *     `given` when defined (no note); else the file's η with a note for the analysis warnings;
 *     else `{ eta: undefined, note: null }`.
 *
 * Notes
 * -----
 * 1. A given η wins: the caller knows the junction better than a line copied into the file.
 * 2. Else the first metadata key of `ETA_METADATA_KEYS` holding a number in (0, 1].
 * 3. Else none: `analyzeCurve` then uses 1 (energies equal bias values) and warns.
 *
 * Example
 * -------
 * ```ts
 * const text = "# eta: 0.88\nV,I\n" + Array.from({ length: 21 }, (_, i) => `${-1 + i * 0.1},${(-1 + i * 0.1) ** 3}`).join("\n");
 * etaForCurve(undefined, parseCurveText(text).curve);
 * // => { eta: 0.88, note: 'η = 0.88 taken from the file\'s metadata ("eta")' }
 * ```
 */
export function etaForCurve(given: number | undefined, curve: Curve): CurveEta {
  if (given !== undefined) return { eta: given, note: null };
  const stated = etaFromMetadata(curve.meta.metadata);
  return stated ? { eta: stated.eta, note: `η = ${stated.eta} taken from the file's metadata ("${stated.key}")` } : { eta: undefined, note: null };
}
