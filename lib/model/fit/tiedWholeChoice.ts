/**
 * A CB-side tie decided by the whole curve: where the winner of a tie on the CB side gives no
 * whole-curve fit that describes the curve and a grouping it tied with does, that grouping wins.
 */
import type { FitTrial } from "./fitTrial.ts";
import { FIT_DEFAULTS } from "./fitDefaults.ts";

/** Defaults of {@link tiedWholeChoice} (locked by test/model/fit/tiedWholeChoice.test.ts). */
export const TIED_WHOLE_CHOICE_DEFAULTS = Object.freeze({
  /**
   * CB-side BICs closer than this to the winner's tie with it (the comparison's own FIT_DEFAULTS.bicTieMargin, 2: a
   * difference not worth more than a bare mention). Chosen on the accuracy benchmark (low-η mix
   * with the comparison).
   */
  tieMargin: FIT_DEFAULTS.bicTieMargin,
});

/** What the whole-curve choices between CB-side runs ({@link tiedWholeChoice}, `penaltyTiedWholeChoice`) share. */
export interface WholeChoiceContext {
  /** The CB-side winner and its whole-curve fit. */
  winner: FitTrial;
  whole: FitTrial;
  /** CB-side fit → its whole-curve fit, where one was made; one made here is added. */
  wholeOf: Map<FitTrial, FitTrial>;
  /** Whole-curve fit → its CB-side fit; one made here is added. */
  cbSideOf: Map<FitTrial, FitTrial>;
  /** Fits a CB-side run to the whole curve (each reading of its VB peaks, the best kept). */
  wholeFitOf: (cb: FitTrial) => FitTrial;
  /** Whether a whole-curve fit describes the curve (reduced χ² and residual structure within the fit's bars). */
  describes: (whole: FitTrial) => boolean;
  /** Whether a whole-curve fit and its CB-side fit are plausible together. */
  acceptable: (whole: FitTrial, cb: FitTrial) => boolean;
  /** Reduced χ² of a run. */
  reduced: (t: FitTrial) => number;
  /** Reduced χ² at or below which a whole-curve fit describes the curve (FIT_DEFAULTS.wholeCurveChiSquare). */
  wholeCurveChiSquare: number;
}

/** What {@link tiedWholeChoice} works with. */
export interface TiedWholeChoiceContext extends WholeChoiceContext {
  /** The CB-side finalists that are plausible (the winner among them or not). */
  plausible: readonly FitTrial[];
}

/**
 * The tied grouping whose whole-curve fit describes the curve, where the winner's does not.
 *
 * Parameters
 * ----------
 * context : TiedWholeChoiceContext
 *     The winner and its whole-curve fit, the plausible finalists, the whole-curve fits made so
 *     far, how to make one, and the tests.
 * settings : typeof TIED_WHOLE_CHOICE_DEFAULTS, optional
 *     tieMargin.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial; note: string } | null
 *     The tied CB-side finalist whose whole-curve fit describes the curve and is acceptable (the
 *     lowest whole-curve BIC among several), with that fit and a note in words; null when the
 *     winner's whole-curve fit describes the curve, or no tied finalist's does.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A tie on the CB side (BICs closer than tieMargin) goes to the hypothesis listed first
 *    (fitCurve): the CB side cannot tell the groupings apart. At low η a p shell split and a p
 *    shell whole, or two rate-ratio starts of one grouping, can tie there and land on Ec a few
 *    per cent apart; the whole curve adds the VB levels and the gap.
 * 2. Only where the winner's whole-curve fit meets the reduced χ² bar but does not describe the
 *    curve (residual structure left; its values would then come from the CB side alone) is a tied
 *    finalist fitted to the whole curve (or its fit reused); one that describes it and is
 *    plausible with its CB side wins. Above the χ² bar the whole-curve splits and later VB entries
 *    are tried instead (fitCurve note 5), and whole-curve fits of tied rivals spent the work
 *    budget they need (low-η intermediate draw 158 of seed 1).
 * 3. The cost: at most one whole-curve fit per tied finalist, which the weighted groupings'
 *    whole-curve answers (weightedWholeFits) would make anyway.
 *
 * Example
 * -------
 * ```ts
 * const retied = tiedWholeChoice({ winner, whole, plausible, wholeOf, cbSideOf, wholeFitOf, describes, acceptable, reduced });
 * if (retied) [winner, whole] = [retied.cb, retied.whole];
 * ```
 */
export function tiedWholeChoice(context: TiedWholeChoiceContext, settings = TIED_WHOLE_CHOICE_DEFAULTS): { cb: FitTrial; whole: FitTrial; note: string } | null {
  const { winner, whole, describes } = context;
  if (winner.side !== "CB" || describes(whole) || !(context.reduced(whole) <= context.wholeCurveChiSquare)) return null;
  const tied = context.plausible.filter((t) => t.side === "CB" && t !== winner && Math.abs(t.bic - winner.bic) < settings.tieMargin).sort((x, y) => x.bic - y.bic);
  let best: { cb: FitTrial; whole: FitTrial } | null = null;
  for (const cb of tied) {
    let w = context.wholeOf.get(cb);
    if (!w) {
      w = context.wholeFitOf(cb);
      context.wholeOf.set(cb, w);
      context.cbSideOf.set(w, cb);
    }
    if (describes(w) && context.acceptable(w, cb) && (!best || w.bic < best.whole.bic)) best = { cb, whole: w };
  }
  if (!best) return null;
  const note = `${winner.hypothesis.label} ties on the CB side with ${best.cb.hypothesis.label} (BIC ${winner.bic.toFixed(1)} and ${best.cb.bic.toFixed(1)}); only the latter's whole-curve fit describes the curve (reduced χ² ${context.reduced(best.whole).toPrecision(3)} against ${context.reduced(whole).toPrecision(3)}), and it wins`;
  return { ...best, note };
}
