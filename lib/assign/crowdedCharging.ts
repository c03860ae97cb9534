/**
 * Two conduction-band peaks closer than a charging step inside a shell-filling shell: only one
 * can be a charging peak of the ladder, and this stage says which.
 */
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";

/** A CB peak as {@link replacesCrowded} reads it: |bias| `x` in V and its current step in A. */
export interface CrowdedPeak {
  /** |bias|, V. */
  x: number;
  /** The peak's current step. */
  peak: { stepA: number };
}

/**
 * Whether a peak crowding a shell's last charging peak replaces it on the ladder.
 *
 * Parameters
 * ----------
 * beforeV : number
 *     |bias| of the shell's charging peak before the last one, V.
 * last : CrowdedPeak
 *     The shell's last charging peak so far (`x` > beforeV; step in A).
 * crowding : CrowdedPeak
 *     The next peak, closer to `last` than `ASSIGN_DEFAULTS.minLadderSpacingFraction` × Ec
 *     (`x` > last.x; step in A).
 * ecV : number
 *     Ec in bias (the s doublet's spacing), V; > 0.
 *
 * Returns
 * -------
 * boolean
 *     True when the crowding peak lies nearer one Ec beyond `beforeV` than the last one does and
 *     steps at least `ASSIGN_DEFAULTS.fillingStepRatio[0]` × the last one's step: the crowding
 *     peak is the charging peak and the last one is set aside in its place (a tie keeps the
 *     reading order).
 *
 * Notes
 * -----
 * 1. In shell filling consecutive charging peaks of one level lie Ec/η apart in bias (orthodox
 *    theory: each added carrier costs Ec more), so of two peaks closer than
 *    `minLadderSpacingFraction` × Ec at most one is a charging peak.
 * 2. The shells are read from the gap edge outward, so the earlier of the two was taken first. At
 *    low η a resonance through the substrate junction (or a level's charging satellite) often
 *    lies a fraction of Ec before a charging peak; taken first, it pushes the level itself off the
 *    ladder. The charging peak is the one lying one Ec beyond the ladder peak before the two: the
 *    other goes off the ladder instead.
 * 3. Only inside a shell (a charging peak of the same shell before the two): a shell's first peak
 *    follows the jump Ec + Δ/η from the shell below, which does not say where a charging peak lies.
 * 4. Charging steps of one shell are alike to within `ASSIGN_DEFAULTS.fillingStepRatio`. A
 *    crowding peak stepping less than r[0] × the last one leaves it in place: a peak stepping that
 *    much more than its neighbour may hold a level and a resonance at once (a shared peak), which
 *    the later stages judge (the resonances set aside, a shared peak refitted as the two); taken
 *    off the ladder here it would be lost to them.
 * 5. No margin: a peak split by the search into two beside each other (a level read as two
 *    peaks) is best taken at the part nearer the ladder, however small the difference; an exact
 *    tie keeps the peak read first.
 *
 * Example
 * -------
 * ```ts
 * // Ec/η = 0.275 V; p's first peak at 3.232 V, a resonance at 3.418 V, p's second level peak at 3.537 V.
 * const at = (x: number, stepA: number) => ({ x, peak: { stepA } });
 * replacesCrowded(3.232, at(3.418, 6e-12), at(3.537, 12e-12), 0.275);   // => true
 * replacesCrowded(3.232, at(3.418, 30e-12), at(3.537, 12e-12), 0.275);  // => false (the first may be shared)
 * replacesCrowded(3.232, at(3.537, 12e-12), at(3.616, 12e-12), 0.275);  // => false
 * ```
 */
export function replacesCrowded(beforeV: number, last: CrowdedPeak, crowding: CrowdedPeak, ecV: number): boolean {
  const off = (v: number) => Math.abs(v - beforeV - ecV);
  return off(crowding.x) < off(last.x) && crowding.peak.stepA >= ASSIGN_DEFAULTS.fillingStepRatio[0] * last.peak.stepA;
}
