/**
 * Whole-curve fits with the VB level of four entered at a later VB peak: where no grouping's
 * whole-curve fit describes the curve, the peaks between the doublet and the level of four may be
 * a second-junction resonance, a spurious peak or an extra charging peak that every reading of
 * the VB peaks took for a level's entry.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { FitTrial } from "./fitTrial.ts";
import { seedKey, type LevelSeed } from "./levelsToFit.ts";
import { peakStartWholeFits, type PeakStartWholeContext } from "./peakStartWholeFits.ts";
import { wholeCurveSplits } from "./wholeCurveSplits.ts";

/** Defaults of {@link laterEntryWholeFits} (locked by test/model/fit/laterEntryWholeFits.test.ts). */
export const LATER_ENTRY_WHOLE_DEFAULTS = Object.freeze({
  /**
   * The level of four is entered at each VB peak from the third from the gap (the doublet's two
   * charging peaks come first in filling order) up to this one, counted from the gap (1 = the
   * first): up to three peaks between the doublet and the level's entry set aside. Chosen on the
   * accuracy benchmark (low-η mix with the comparison), where a resonance, a spurious peak and a
   * doublet's peak seen as two lay there (draw 49 of seed 1); not tuned further.
   */
  lastEntryPeak: 6,
});

/** What {@link laterEntryWholeFits} works with: that of {@link peakStartWholeFits}, and the VB peaks. */
export interface LaterEntryWholeContext extends PeakStartWholeContext {
  /** Every VB peak's bias (V, negative), the resonances the rules labelled among them, in any order. */
  vbPeaksV: readonly number[];
}

/**
 * The VB peaks read as a doublet at the first peak from the gap and a level of four entered, in
 * filling order, at each later peak in turn.
 *
 * Parameters
 * ----------
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V, negative), in any order.
 * lastEntryPeak : number, optional
 *     The farthest peak from the gap (1 = the first) at which the level of four is entered. Default 6.
 *
 * Returns
 * -------
 * LevelSeed[][]
 *     One reading per entry peak, the third from the gap outward up to lastEntryPeak: v1 (2 holes,
 *     `before` 0) at the first peak, v2 (4 holes, `before` 2) at the entry peak; empty with fewer
 *     than three VB peaks.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * In shell filling the doublet's charging peaks lie at (|ε₁| + Ec/2)/η and Ec/η beyond, and the
 * level of four enters at (|ε₂| + 5Ec/2)/η, after them (the closed form of the orthodox ladder
 * with two holes in the dot). Any peak among them that is not one of the ladder's (a resonance of
 * a CB level through the second junction, a spurious peak, one peak fitted as two) shifts every
 * reading that counts peaks, so each later peak is tried as the entry.
 *
 * Example
 * -------
 * ```ts
 * laterFourEntryReadings([-1.44, -1.69, -2.31, -2.53], 6).map((r) => r[1].firstPeakV);
 * // => [-2.31, -2.53]
 * ```
 */
export function laterFourEntryReadings(vbPeaksV: readonly number[], lastEntryPeak: number = LATER_ENTRY_WHOLE_DEFAULTS.lastEntryPeak): LevelSeed[][] {
  const outward = vbPeaksV.filter((v) => v < 0).sort((a, b) => b - a);
  const out: LevelSeed[][] = [];
  for (let k = 2; k < Math.min(outward.length, lastEntryPeak); k++) {
    out.push([
      { band: "VB", label: "v1", degeneracy: 2, firstPeakV: outward[0], before: 0 },
      { band: "VB", label: "v2", degeneracy: 4, firstPeakV: outward[k], before: 2 },
    ]);
  }
  return out;
}

/**
 * The compared groupings fitted to the whole curve with the level of four entered at each later
 * VB peak, then the best such fit's p split.
 *
 * Parameters
 * ----------
 * context : LaterEntryWholeContext
 *     That of {@link peakStartWholeFits}, and the VB peaks.
 * settings : typeof LATER_ENTRY_WHOLE_DEFAULTS, optional
 *     lastEntryPeak.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     As {@link peakStartWholeFits}: the whole-curve run that describes the curve and is
 *     acceptable, with its grouping fitted on the CB side; null when none is.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Each grouping is given the readings of {@link laterFourEntryReadings} its own readings do not
 *    hold, and fitted from its peaks as in {@link peakStartWholeFits} (the lowest BICs finished).
 * 2. Where none describes the curve, the best of these runs by reduced χ² has its p level split
 *    ({@link wholeCurveSplits}): a wrong VB entry and a split p each keep the other's fit poor.
 *
 * Example
 * -------
 * ```ts
 * const found = laterEntryWholeFits({ ...context, hypotheses, vbPeaksV });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function laterEntryWholeFits(context: LaterEntryWholeContext, settings = LATER_ENTRY_WHOLE_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const readings = laterFourEntryReadings(context.vbPeaksV, settings.lastEntryPeak);
  if (!readings.length) return null;
  const hypotheses: FitHypothesis[] = [];
  for (const h of context.hypotheses) {
    const own = new Set(h.vbReadings.map(seedKey));
    const fresh = readings.filter((r) => !own.has(seedKey(r)));
    if (fresh.length) hypotheses.push({ ...h, name: `${h.name} (VB level of four entered later)`, vbReadings: fresh });
  }
  if (!hypotheses.length) return null;
  const from = context.trials.length;
  const found = peakStartWholeFits({ ...context, hypotheses });
  if (found) return found;
  // The best of these runs with its p split (note 2).
  const best = context.trials
    .slice(from)
    .filter((t) => t.side === "both")
    .reduce<FitTrial | null>((b, t) => (!b || context.reduced(t) < context.reduced(b) ? t : b), null);
  return best ? wholeCurveSplits({ ...context, from: best }) : null;
}
