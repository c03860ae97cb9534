/**
 * A split of the winning grouping's p shell that the CB side cannot tell from the grouping itself:
 * at low η a p shell split 2+4 whose sub-levels lie about a charging energy apart puts its peaks
 * where the whole shell's ladder does, and the CB side's BICs tie; the VB side's steps (the whole
 * curve) tell them apart.
 */
import type { FitTrial } from "./fitTrial.ts";
import { FIT_DEFAULTS } from "./fitDefaults.ts";

/** Defaults of {@link tiedSplitRefinement} (locked by test/model/fit/tiedSplitRefinement.test.ts). */
export const TIED_SPLIT_REFINEMENT_DEFAULTS = Object.freeze({
  /**
   * A CB-side refinement of the winner with its p split ties with the winner when its BIC is above
   * the winner's by less than this (the comparison's own FIT_DEFAULTS.bicTieMargin, 2: a difference not worth more than a
   * bare mention). Chosen on the accuracy benchmark (low-η mix with the comparison).
   */
  tieMargin: FIT_DEFAULTS.bicTieMargin,
});

/** Number of CB p levels of a run's grouping (1: p whole). */
function pLevels(t: FitTrial): number {
  return t.hypothesis.seeds.filter((s) => s.band === "CB" && /^p/.test(s.label)).length;
}

/** The grouping a hypothesis was refined from ("<grouping>, refined to …" → "<grouping>"). */
function groupingOf(t: FitTrial): string {
  return t.hypothesis.name.replace(/,.*$/, "");
}

/**
 * The CB-side refinement of the winner that splits its p shell and ties with it, if any.
 *
 * Parameters
 * ----------
 * winner : FitTrial
 *     The CB-side winner of the comparison of groupings.
 * trials : readonly FitTrial[]
 *     Every run so far.
 * settings : typeof TIED_SPLIT_REFINEMENT_DEFAULTS, optional
 *     tieMargin.
 *
 * Returns
 * -------
 * FitTrial | null
 *     The lowest-BIC CB-side run of the winner's grouping refined with more p levels than the
 *     winner has, whose BIC is less than tieMargin above the winner's; null when the winner is not
 *     a CB-side fit or no such run exists.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Refinements are named "<grouping>, refined to <layout> (<change>)" (refineGrouping); one
 *    of the winner's grouping with more CB p levels than the winner splits its p shell.
 * 2. Explored runs count as well as finished ones: a refinement left unfinished because it was
 *    not below the winner's BIC may still tie with it.
 * 3. In fitCurve such a tie makes the winner's whole-curve fit be split (structuredWholeSplit)
 *    even where its residuals show little structure: the split then stands only with a lower
 *    whole-curve BIC.
 *
 * Example
 * -------
 * ```ts
 * const tied = tiedSplitRefinement(winner, trials);
 * if (tied) console.log(`${tied.hypothesis.name} ties with ${winner.hypothesis.name}`);
 * ```
 */
export function tiedSplitRefinement(winner: FitTrial, trials: readonly FitTrial[], settings = TIED_SPLIT_REFINEMENT_DEFAULTS): FitTrial | null {
  if (winner.side !== "CB") return null;
  const grouping = groupingOf(winner);
  const p = pLevels(winner);
  let tied: FitTrial | null = null;
  for (const t of trials) {
    if (t.side !== "CB" || t === winner || groupingOf(t) !== grouping || !/, refined to /.test(t.hypothesis.name) || pLevels(t) <= p) continue;
    if (t.bic - winner.bic < settings.tieMargin && (!tied || t.bic < tied.bic)) tied = t;
  }
  return tied;
}
