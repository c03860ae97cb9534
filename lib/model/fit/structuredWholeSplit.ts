/**
 * The winning grouping's whole-curve fit with its p shell split, where that fit meets the reduced
 * χ² bar but leaves residual structure: at low η a p shell split 2+4 or 2+2+2 fitted whole reaches
 * a low reduced χ² with Ec a few per cent off, and misses a sub-level's steps over a peak's width.
 */
import type { FitTrial } from "./fitTrial.ts";
import { wholeCurveSplits, type WholeCurveSplitContext } from "./wholeCurveSplits.ts";

/** Defaults of {@link structuredWholeSplit} (locked by test/model/fit/structuredWholeSplit.test.ts). */
export const STRUCTURED_WHOLE_SPLIT_DEFAULTS = Object.freeze({
  /**
   * The winner's whole-curve fit is split only when its residuals' largest |Σ r|/√w over a peak's
   * width ({@link residualStructure}) is above this, in noise σ: below it the residuals are noise
   * (about N(0, 1) per window), and a split would only cost time. Below
   * FIT_STATUS_DEFAULTS.poorResidualZ (5) so that a fit just under that bar is tried too. Chosen on
   * the accuracy benchmark (low-η mix with the comparison).
   */
  minStructureZ: 4,
});

/** What {@link structuredWholeSplit} works with: the split's context, the whole-curve fit to split and the tests. */
export interface StructuredWholeSplitContext extends Omit<WholeCurveSplitContext, "from"> {
  /** The winning grouping's whole-curve fit. */
  whole: FitTrial;
  /** Reduced χ² at or below which a whole-curve fit describes the curve (FIT_DEFAULTS.wholeCurveChiSquare). */
  wholeCurveChiSquare: number;
  /** The largest residual structure of a run, in noise σ ({@link residualStructure}). */
  structureZ: (t: FitTrial) => number;
  /** A CB-side refinement of the winner splitting its p shell that ties with it ({@link tiedSplitRefinement}), if any. */
  tied?: FitTrial | null;
}

/**
 * The whole-curve fit's p level split, where the fit meets the χ² bar with structure left.
 *
 * Parameters
 * ----------
 * context : StructuredWholeSplitContext
 *     The runs so far, the whole-curve fit to split, the run function, the CB side, η, the
 *     iteration budgets, the reduced χ² bar and the tests.
 * settings : typeof STRUCTURED_WHOLE_SPLIT_DEFAULTS, optional
 *     minStructureZ.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial; note: string } | null
 *     The split whole-curve run (describing the curve, acceptable, with a lower BIC than the fit
 *     it split) with its grouping fitted on the CB side, and a note in words; null when the fit is
 *     above the χ² bar, its residuals show no structure above minStructureZ (and no tied split,
 *     note 4), or no split does better.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Only a fit within the reduced χ² bar (wholeCurveChiSquare) is split here: above it
 *    {@link wholeCurveSplits} is already tried on the best whole-curve fit (fitCurve note 5).
 * 2. The splits are those of {@link wholeCurveSplits} about this fit (p whole into 2+4 and
 *    2+2+2, a sub-level of 4 into 2+2; VB levels, Ec, Γtip/Γsub and broadening kept), each
 *    explored, the best two finished; the lowest-BIC one that describes the curve (within the χ²
 *    bar, residual structure at most FIT_STATUS_DEFAULTS.poorResidualZ) and is plausible on both
 *    sides is kept.
 * 3. It replaces the fit only with a lower BIC over the whole curve (same points, so the extra
 *    sub-level's parameters are paid for by k·ln n): a p shell that is truly whole gains less
 *    than that from a split.
 * 4. A CB-side refinement of the winner with its p split that ties with it ({@link tiedSplitRefinement},
 *    context.tied) has the split tried whatever the structure: the CB side cannot tell the two
 *    apart, the whole curve may (low-η intermediate draw 2051 of seed 2001, p 2+4 fitted whole
 *    with Ec 3.6 % off at residual structure 3.7 σ). Lowering minStructureZ to 3 for every fit
 *    did the same there at about a seventh more evaluations in the median.
 * 5. In fitCurve the split's whole-curve BIC and that of the fit it replaced (with a blind CB
 *    side's choices, if any) then weigh the groupings, as where only a split describes the curve:
 *    the choice between them was made on the whole curve.
 *
 * Example
 * -------
 * ```ts
 * const found = structuredWholeSplit({ whole, trials, run, cbSide, eta, exploreIterations: 8, maxIterations: 60, reduced, describes, acceptable, wholeCurveChiSquare: 3, structureZ });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function structuredWholeSplit(context: StructuredWholeSplitContext, settings = STRUCTURED_WHOLE_SPLIT_DEFAULTS): { cb: FitTrial; whole: FitTrial; note: string } | null {
  const { whole, reduced } = context;
  if (!(reduced(whole) <= context.wholeCurveChiSquare)) return null;
  const z = context.structureZ(whole);
  if (!(z > settings.minStructureZ) && !context.tied) return null;
  const found = wholeCurveSplits({ ...context, from: whole });
  if (!found || !(found.whole.bic < whole.bic)) return null;
  const why = z > settings.minStructureZ ? `leaves residual structure of ${z.toFixed(1)} σ (> ${settings.minStructureZ})` : `ties on the CB side with ${context.tied!.hypothesis.label}`;
  const note = `the whole-curve fit of ${whole.hypothesis.label} (reduced χ² ${reduced(whole).toPrecision(3)}) ${why}; ${found.whole.hypothesis.label} describes the curve with a BIC lower by ${(whole.bic - found.whole.bic).toFixed(0)} (reduced χ² ${reduced(found.whole).toPrecision(3)})`;
  return { ...found, note };
}
