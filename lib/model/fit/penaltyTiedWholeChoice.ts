/**
 * A grouping that loses the CB-side comparison by its parameter penalty alone, carried to the
 * whole curve: where its CB-side χ² ties with the winner's and it has more parameters, the CB
 * side's BIC difference is the penalty k·ln n and not the data (a CB side that sees too little of
 * p to tell the groupings apart); the whole curve, with the VB's points, decides by its own BIC.
 */
import type { FitTrial } from "./fitTrial.ts";
import { FIT_DEFAULTS } from "./fitDefaults.ts";
import type { WholeChoiceContext } from "./tiedWholeChoice.ts";

/** Defaults of {@link penaltyTiedWholeChoice} (locked by test/model/fit/penaltyTiedWholeChoice.test.ts). */
export const PENALTY_TIED_WHOLE_CHOICE_DEFAULTS = Object.freeze({
  /**
   * A rival's CB-side χ² ties with the winner's when it is above it by less than this (the
   * comparison's own FIT_DEFAULTS.bicTieMargin, 2, on the χ² instead of the BIC: the fit alone,
   * without the parameter penalty).
   */
  chiSquareMargin: FIT_DEFAULTS.bicTieMargin,
  /** Most rival groupings (distinct CB layouts) fitted to the whole curve, those of lowest CB-side χ² first. */
  maxRivals: 2,
});

/** What {@link penaltyTiedWholeChoice} works with. */
export interface PenaltyTiedWholeChoiceContext extends WholeChoiceContext {
  /** Every run so far (explored and finished, both sides). */
  trials: readonly FitTrial[];
  /** Finishes an explored CB-side run (the full iteration budget from its values); a finished run is returned as it is. */
  finish: (t: FitTrial) => FitTrial;
  /** Whether a CB-side run is plausible. */
  plausible: (cb: FitTrial) => boolean;
}

/**
 * The CB layout of a run: its CB levels' degeneracies from the gap outward ("2+2+4"). Shared with
 * `cbSideEcLadderWholeFits`.
 */
export function layoutOf(t: Pick<FitTrial, "hypothesis">): string {
  return t.hypothesis.seeds.filter((s) => s.band === "CB").map((s) => s.degeneracy).join("+");
}

/**
 * The grouping that lost on the CB side by its parameter penalty alone and whose whole-curve fit
 * describes the curve, where the winner's meets the χ² bar but leaves residual structure.
 *
 * Parameters
 * ----------
 * context : PenaltyTiedWholeChoiceContext
 *     The winner and its whole-curve fit, every run so far, how to finish a run and fit it to the
 *     whole curve, and the tests.
 * settings : typeof PENALTY_TIED_WHOLE_CHOICE_DEFAULTS, optional
 *     chiSquareMargin, maxRivals.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial; note: string } | null
 *     The rival's finished CB-side run, its whole-curve fit (the lowest whole-curve BIC among the
 *     rivals that describe the curve, below the winner's whole-curve BIC) and a note in words;
 *     null when the winner is not a CB-side fit, its whole-curve fit describes the curve or is
 *     above the χ² bar, or no rival's does.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The criterion stays BIC = χ² + k·ln n throughout. On the CB side a rival with more
 *    parameters whose χ² is within chiSquareMargin of the winner's loses by at most its extra
 *    parameters' k·ln n (plus the margin): the CB side cannot tell the two apart, it only prefers
 *    the smaller model. The whole curve adds the VB's points (and the p steps beyond the CB
 *    side's end); there the two are compared by their whole-curve BICs, on the same points.
 * 2. A rival is a CB-side run (explored or finished) with more parameters than the winner and
 *    another CB layout (degeneracies); per layout the run of lowest χ², and at most maxRivals
 *    layouts, lowest χ² first. Each is finished (where it was only explored) and, where it is then
 *    plausible, fitted to the whole curve; it wins where that fit describes the curve, is
 *    acceptable with its CB side and has a lower whole-curve BIC than the winner's.
 * 3. It runs only where the winner's whole-curve fit meets the reduced χ² bar (wholeCurveChiSquare)
 *    but does not describe the curve (residual structure left): where it describes it, the CB
 *    side's choice stands (and the smaller model with it); above the bar the whole-curve splits
 *    and later VB entries are tried instead (fitCurve note 5), and rivals fitted there first
 *    took work those stages need (low-η intermediate draws 1107 and 1157, the latter's whole curve
 *    at reduced χ² 5.6: good without this stage, poor with it; no rival described the curve). Measured with the comparison on the low-η mix, seeds 1001–1200, before
 *    that limit: shell filling 195 → 196 (1027: 2+2+4 on the CB side, its whole curve at reduced
 *    χ² 2.78 with structure; 2+2+2+2 χ² 0.4 behind there, 1.02 on the whole curve), intermediate
 *    186 → 184 (1107, 1157). With the limit, filling 196 and the draws it touches otherwise as before.
 *
 * Example
 * -------
 * ```ts
 * const carried = penaltyTiedWholeChoice({ winner, whole, trials, finish, plausible, wholeOf, cbSideOf, wholeFitOf, describes, acceptable, reduced, wholeCurveChiSquare: 3 });
 * if (carried) [winner, whole] = [carried.cb, carried.whole];
 * ```
 */
export function penaltyTiedWholeChoice(context: PenaltyTiedWholeChoiceContext, settings = PENALTY_TIED_WHOLE_CHOICE_DEFAULTS): { cb: FitTrial; whole: FitTrial; note: string } | null {
  const { winner, whole, describes } = context;
  if (winner.side !== "CB" || describes(whole) || !(context.reduced(whole) <= context.wholeCurveChiSquare)) return null;
  const winnerLayout = layoutOf(winner);
  const bestOfLayout = new Map<string, FitTrial>();
  for (const t of context.trials) {
    if (t.side !== "CB" || t === winner || t.n !== winner.n || t.k <= winner.k || !(t.loop.chiSquare - winner.loop.chiSquare < settings.chiSquareMargin)) continue;
    const layout = layoutOf(t);
    if (layout === winnerLayout) continue;
    const b = bestOfLayout.get(layout);
    if (!b || t.loop.chiSquare < b.loop.chiSquare) bestOfLayout.set(layout, t);
  }
  const rivals = [...bestOfLayout.values()].sort((x, y) => x.loop.chiSquare - y.loop.chiSquare).slice(0, settings.maxRivals);
  let best: { cb: FitTrial; whole: FitTrial } | null = null;
  for (const r of rivals) {
    const cb = context.finish(r);
    if (!context.plausible(cb)) continue;
    let w = context.wholeOf.get(cb);
    if (!w) {
      w = context.wholeFitOf(cb);
      context.wholeOf.set(cb, w);
      context.cbSideOf.set(w, cb);
    }
    if (describes(w) && context.acceptable(w, cb) && w.bic < whole.bic && (!best || w.bic < best.whole.bic)) best = { cb, whole: w };
  }
  if (!best) return null;
  const note = `${best.cb.hypothesis.label} loses on the CB side to ${winner.hypothesis.label} by its parameter penalty alone (χ² ${best.cb.loop.chiSquare.toFixed(1)} against ${winner.loop.chiSquare.toFixed(1)}, ${best.cb.k - winner.k} more parameters); only its whole-curve fit describes the curve (reduced χ² ${context.reduced(best.whole).toPrecision(3)} against ${context.reduced(whole).toPrecision(3)}, BIC lower by ${(whole.bic - best.whole.bic).toFixed(0)}), and it wins`;
  return { ...best, note };
}
