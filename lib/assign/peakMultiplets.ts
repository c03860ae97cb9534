/**
 * The link from each peak to the multiplet holding it, read from the multiplets' peak indices.
 */
import type { Multiplet } from "./multiplets.ts";
import { DotspecError } from "../util/errors.ts";

/**
 * The multiplet of every peak.
 *
 * Parameters
 * ----------
 * peaks : readonly P[]
 *     The peak list that was given to `assignSpectrum` (any objects; they are copied, not
 *     changed).
 * multiplets : readonly Multiplet[]
 *     `assignment.multiplets` of that call.
 *
 * Returns
 * -------
 * (P & { multiplet: number | null })[]
 *     A copy of each peak with `multiplet`: the index in `multiplets` of the multiplet whose
 *     `peakIndices` holds the peak, or null for a peak outside every multiplet (satellite, noise,
 *     unassigned).
 *
 * Throws
 * ------
 * DotspecError
 *     `assign/foreign-multiplets` when a multiplet names a peak index outside `peaks` or two
 *     multiplets claim the same peak: the multiplets were not assigned from this peak list.
 *
 * Notes
 * -----
 * 1. The link is read from `Multiplet.peakIndices`; positions are never compared.
 *
 * Example
 * -------
 * ```ts
 * const m = [{ peakIndices: [1, 2] } as Multiplet];
 * withMultiplets([{ biasV: -0.8 }, { biasV: 0.69 }, { biasV: 0.81 }], m).map((p) => p.multiplet);  // => [null, 0, 0]
 * ```
 */
export function withMultiplets<P extends object>(peaks: readonly P[], multiplets: readonly Multiplet[]): (P & { multiplet: number | null })[] {
  const of: (number | null)[] = peaks.map(() => null);
  multiplets.forEach((m, k) => {
    for (const i of m.peakIndices) {
      if (!(Number.isInteger(i) && i >= 0 && i < peaks.length)) {
        throw new DotspecError(
          "assign/foreign-multiplets",
          `multiplet ${k} (${m.label}) names peak ${i}, outside the ${peaks.length} peaks given; pass the peak list the multiplets were assigned from`,
        );
      }
      if (of[i] !== null) {
        throw new DotspecError(
          "assign/foreign-multiplets",
          `peak ${i} is claimed by multiplets ${of[i]} and ${k} (${m.label}); pass the multiplets of one assignSpectrum call`,
        );
      }
      of[i] = k;
    }
  });
  return peaks.map((p, i) => ({ ...p, multiplet: of[i] }));
}

/**
 * What a peak is in an assignment: a member of a multiplet (`"level"`), a charging satellite or
 * noise peak set aside (`"satellite"`), a resonance through the dot–substrate junction
 * (`"second-junction"`), or left out of every group (`"unassigned"`, e.g. beyond the assigned
 * shells or in an undetermined spectrum).
 */
export type PeakRole = "level" | "satellite" | "second-junction" | "unassigned";

/**
 * The role of every peak of an assignment.
 *
 * Parameters
 * ----------
 * peakCount : number
 *     Number of peaks given to `assignSpectrum`.
 * assignment : { multiplets, evidence }
 *     Its multiplets (`peakIndices`) and evidence (`satellitePeakIndices`, `secondJunction`).
 *
 * Returns
 * -------
 * PeakRole[]
 *     One role per peak, by index.
 *
 * Example
 * -------
 * ```ts
 * peakRoles(3, { multiplets: [{ peakIndices: [1, 2] }], evidence: { satellitePeakIndices: [0], secondJunction: [] } });
 * // => ["satellite", "level", "level"]
 * ```
 */
export function peakRoles(
  peakCount: number,
  assignment: {
    multiplets: readonly Pick<Multiplet, "peakIndices">[];
    evidence: { satellitePeakIndices: readonly number[]; secondJunction: readonly { index: number }[] };
  },
): PeakRole[] {
  const roles: PeakRole[] = Array.from({ length: peakCount }, () => "unassigned");
  for (const i of assignment.evidence.satellitePeakIndices) roles[i] = "satellite";
  for (const r of assignment.evidence.secondJunction) roles[r.index] = "second-junction";
  for (const m of assignment.multiplets) for (const i of m.peakIndices) roles[i] = "level";
  return roles;
}
