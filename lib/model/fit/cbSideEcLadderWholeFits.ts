/**
 * Whole-curve fits of the charging ladders matched to the CB peaks at the CB side's own Ec: where
 * a resonance lies among the first VB peaks, their first spacing gives a wrong Ec and the ladders
 * matched at it miss the CB peaks, while the CB side, whose s doublet carries Ec, has it right.
 */
import type { FitTrial } from "./fitTrial.ts";
import type { LevelSeed } from "./levelsToFit.ts";
import { distinctReadings } from "./levelsToFit.ts";
import { fillingOrderValenceReadings } from "./droppedPeakWholeFits.ts";
import { matchedLadderReadings, matchedLadderWholeFits, mergedPeakEcEV, MERGED_PEAK_DEFAULTS } from "./mergedPeakWholeFits.ts";
import { steplessPeaksV, UNSEEN_S_PEAK_DEFAULTS, type UnseenSPeakContext } from "./unseenSPeakWholeFits.ts";
import { layoutOf } from "./penaltyTiedWholeChoice.ts";

/** Defaults of {@link cbSideEcLadderWholeFits} (locked by test/model/fit/cbSideEcLadderWholeFits.test.ts). */
export const CB_SIDE_EC_LADDER_DEFAULTS = Object.freeze({
  /**
   * The stage runs only where the CB side's Ec differs from the one {@link mergedPeakWholeFits}
   * matched its ladders with by more than this fraction: within it, the ladders matched are those
   * already fitted (MERGED_PEAK_DEFAULTS.matchFraction of Ec/η is the match tolerance). Not tuned.
   */
  sameEcFraction: 0.1,
  /** VB layout in filling order from the gap: a doublet and a level of four (the benchmark's and the usual dot's v1, v2). Not tuned. */
  vbLayout: Object.freeze([2, 4]) as readonly number[],
  /**
   * Most VB readings matched at the CB side's Ec that are fitted, those whose charging peaks lie
   * closest to peaks first (at low η the VB side holds the CB levels' resonances, so a reading that
   * passes over peaks is no less likely). Not tuned.
   */
  vbReadings: 2,
  /**
   * fitCurve runs this stage only while at most this fraction of the fit's work budget is spent,
   * as MERGED_PEAK_DEFAULTS.maxBudgetSpent (the same readings at another Ec). Not tuned.
   */
  maxBudgetSpent: MERGED_PEAK_DEFAULTS.maxBudgetSpent,
});

/** What {@link cbSideEcLadderWholeFits} reads: the context of {@link mergedPeakWholeFits} and the CB-side winner's fitted Ec. */
export interface CbSideEcLadderContext extends UnseenSPeakContext {
  /** The CB-side winner's fitted charging energy, eV. */
  cbSideEcEV: number;
  /**
   * The CB-side winner itself (its BIC on the CB side and its grouping): a reading found here with
   * another CB layout replaces it only at a lower CB-side BIC (note 4). Absent: no such check.
   */
  cbSideWinner?: Pick<FitTrial, "bic" | "hypothesis">;
}

/**
 * The filling-order ladders matched to the CB peaks among resonances, at the CB side's Ec, fitted to the whole curve.
 *
 * Parameters
 * ----------
 * context : CbSideEcLadderContext
 *     That of {@link mergedPeakWholeFits}, and the CB-side winner's Ec (eV).
 * settings : typeof CB_SIDE_EC_LADDER_DEFAULTS, optional
 *     sameEcFraction.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     As {@link mergedPeakWholeFits}: the whole-curve run that describes the curve and is
 *     acceptable, with its grouping fitted on the CB side; null where the CB side's Ec is not
 *     positive, lies within sameEcFraction of the Ec mergedPeakWholeFits used, no reading does, or
 *     the reading found lays out the CB levels otherwise than the CB-side winner without a lower
 *     CB-side BIC (note 4).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. In shell filling s's two charging peaks lie Ec/η apart (orthodox theory, the closed form of
 *    the ladder), so a CB side that holds the s doublet fits Ec even where it is blind to p; the
 *    first VB spacing {@link mergedPeakWholeFits} starts from is Ec/η only where no
 *    second-junction resonance lies between the VB doublet's peaks, which at low η it may.
 * 2. Run after mergedPeakWholeFits, only where no grouping's whole-curve fit describes the curve
 *    (fitCurve), with the same readings ({@link matchedLadderReadings}) at Ec/η from the CB side.
 * 3. On the low-η benchmark (seed 5001 draw 5085, η 0.58, Ec 196.4 meV, p split 2+4, p's entry at
 *    2.805 V labelled a resonance, a resonance at −2.265 V between the VB doublet's peaks at −2.072
 *    and −2.414 V): the CB side fitted Ec 196.5 meV, the VB spacing gave 111 meV, and every
 *    grouping's whole-curve fit stayed at reduced χ² 27 or more; matched at the CB side's Ec
 *    with p's entry at the labelled peak the 2+2+4 ladder describes the curve.
 * 4. A whole-curve reading that describes the curve says nothing by itself about the CB layout
 *    where the CB side already has a reading: a ladder with one more sub-level can fit the CB side
 *    as well as the right one and then carry the whole curve too. So a reading whose CB
 *    degeneracies differ from the CB-side winner's is kept only where its own CB-side fit has the
 *    lower BIC (the comparison every grouping goes through, χ² + k·ln n). On the low-η benchmark:
 *    5085's winner (2+6) fits its CB side at reduced χ² 3.36, the 2+2+4 reading at 0.97, kept;
 *    seed 2001's 2027 (p whole) and 2052 had a right-sized 2+6 CB side at 0.95 and 0.92, and the
 *    2+2+4 and 2+2+2+2 readings found here (0.97, 0.92 with one more level) are not kept.
 *
 * Example
 * -------
 * ```ts
 * const found = cbSideEcLadderWholeFits({ ...context, hypotheses, vbPeaksV, cbSideEcEV });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function cbSideEcLadderWholeFits(context: CbSideEcLadderContext, settings = CB_SIDE_EC_LADDER_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const { cbSideEcEV } = context;
  if (!(cbSideEcEV > 0)) return null;
  const usedEV = mergedPeakEcEV(context);
  if (usedEV !== null && Math.abs(usedEV - cbSideEcEV) <= settings.sameEcFraction * cbSideEcEV) return null;
  const ladders = context.hypotheses.filter((h) => h.kind === "ladder-filling");
  if (!ladders.length) return null;
  const bias = ladders[0].analysis.conductance.biasV;
  const vb = [...matchedValenceReadings(ladders[0].analysis.peaks, cbSideEcEV / context.eta, Math.min(bias[0], bias[bias.length - 1]), settings), ...fillingOrderValenceReadings(ladders, cbSideEcEV / context.eta).slice(0, 1)];
  const found = matchedLadderWholeFits(context, cbSideEcEV, MERGED_PEAK_DEFAULTS, distinctReadings(vb));
  const w = context.cbSideWinner;
  if (found && w && layoutOf(found.cb) !== layoutOf(w) && !(found.cb.bic < w.bic)) return null;
  return found;
}


/**
 * The VB peaks read as charging ladders in filling order from the gap, matched as the CB peaks are
 * ({@link matchedLadderReadings} on |V|), at Ec/η in V: the first `vbReadings`, each level's seed
 * at the negative bias of its entry.
 *
 * Parameters
 * ----------
 * peaks : readonly { biasV: number; stepA?: number | null }[]
 *     The analysis' peaks (V), labelled resonances included; those that carry almost no current
 *     step (UNSEEN_S_PEAK_DEFAULTS.minStepFraction of the largest) are left out.
 * chargingEnergyV : number
 *     Ec/η, V.
 * bottomV : number
 *     The curve's lowest bias, V (negative): charging peaks beyond it are not looked for.
 * settings : typeof CB_SIDE_EC_LADDER_DEFAULTS, optional
 *     vbLayout and vbReadings.
 *
 * Returns
 * -------
 * LevelSeed[][]
 *     The readings (VB seeds, `before` the holes above), the least mean distance from their
 *     charging peaks inside the window to the nearest peak first.
 */
export function matchedValenceReadings(peaks: Parameters<typeof steplessPeaksV>[0], chargingEnergyV: number, bottomV: number, settings = CB_SIDE_EC_LADDER_DEFAULTS): LevelSeed[][] {
  const stepless = steplessPeaksV(peaks, UNSEEN_S_PEAK_DEFAULTS.minStepFraction);
  const vbV = peaks.filter((x) => x.biasV < 0 && !stepless.has(x.biasV)).map((x) => -x.biasV);
  if (!vbV.length) return [];
  // Each reading's mean distance from its charging peaks inside the window to the nearest peak, V.
  const meanOffV = (levels: readonly LevelSeed[]) => {
    const predicted = levels.flatMap((l) => Array.from({ length: l.degeneracy }, (_, n) => l.firstPeakV + n * chargingEnergyV)).filter((v) => v <= -bottomV);
    return predicted.reduce((sum, v) => sum + Math.min(...vbV.map((x) => Math.abs(x - v))), 0) / Math.max(1, predicted.length);
  };
  return matchedLadderReadings(vbV, settings.vbLayout, chargingEnergyV, -bottomV)
    .map(({ cb }) => ({ cb, offV: meanOffV(cb) }))
    .sort((a, b) => a.offV - b.offV)
    .slice(0, settings.vbReadings)
    .map(({ cb }) => cb.map((x, j) => ({ ...x, band: "VB" as const, label: `v${j + 1}`, firstPeakV: -x.firstPeakV })));
}
