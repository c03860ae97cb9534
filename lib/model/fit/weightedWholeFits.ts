/**
 * The whole-curve fits of the weighted groupings: each CB-side finalist that carries BIC weight,
 * fitted to the whole curve from its CB-side values, so that the answer it gives there can be set
 * beside the winner's ({@link FitAlternative.wholeCurve}).
 */
import type { FitAlternative } from "./curveFit.ts";
import type { FitTrial } from "./fitTrial.ts";
import { parameterIndex } from "./parameterModel.ts";
import { sameFit } from "./sameFit.ts";

/** Defaults of {@link weightedWholeFits} (locked by test/model/fit/weightedWholeFits.test.ts). */
export const WEIGHTED_WHOLE_FITS_DEFAULTS = Object.freeze({
  /**
   * Least BIC weight (dimensionless, 0–1) of a CB-side finalist whose whole-curve fit is made
   * where the search did not make it: below it a rival cannot move the winner's weight under any
   * decision bar worth having (0.9 leaves 0.1 to the rivals). Chosen on the accuracy benchmark
   * (low-η mix with the comparison, seeds 1 and 1001: the rivals whose whole curve decided carried
   * 0.09–0.67 of the weight).
   */
  minWeight: 0.02,
});

/** What {@link weightedWholeFits} needs from the fit in progress. */
export interface WeightedWholeFitsInput {
  /** The CB-side finalists and their BIC weights (same order). */
  finalists: readonly FitTrial[];
  weights: readonly number[];
  /** CB-side fit → its whole-curve fit, where the search already made one. */
  wholeOf: ReadonlyMap<FitTrial, FitTrial>;
  /** Fits a CB-side finalist to the whole curve (each reading of its VB peaks, the best kept). */
  wholeFitOf: (cb: FitTrial) => FitTrial;
  /** Whether a whole-curve fit describes the curve (reduced χ² and residual structure within the fit's bars). */
  describes: (whole: FitTrial) => boolean;
  /** Reduced χ² of a run. */
  reduced: (t: FitTrial) => number;
  /** Least BIC weight of a finalist fitted to the whole curve. Default: WEIGHTED_WHOLE_FITS_DEFAULTS.minWeight (0.02). */
  minWeight?: number;
}

/**
 * The whole-curve answer of each weighted CB-side finalist.
 *
 * Parameters
 * ----------
 * input : WeightedWholeFitsInput
 *     Finalists with their weights, the whole-curve fits made so far, how to make one, and the
 *     fit's bar for describing the curve.
 *
 * Returns
 * -------
 * Map<FitTrial, NonNullable<FitAlternative["wholeCurve"]>>
 *     For every CB-side finalist with weight ≥ `minWeight`: the Γtip/Γsub, Ec (eV) and reduced χ²
 *     of its whole-curve fit (or of the one of a run at the same fit) and whether that fit
 *     describes the curve; none where the fit was cut short.
 *
 * Notes
 * -----
 * The groupings are weighed on the CB side, where a ladder read one entry off, or p split where
 * it is whole, can reach nearly the same χ² with Ec several per cent away; the whole curve adds
 * the VB levels and the gap, which pin Ec and Γtip/Γsub. Two groupings whose whole-curve fits,
 * each started from its own CB-side values, land on the same Ec and Γtip/Γsub give the same
 * answer however far apart their CB-side values were (`comparisonDecision` adds their weights).
 * Only finalists that carry weight are fitted: the rest cannot change the decision; nor is one at
 * the same fit as a run already fitted to the whole curve ({@link sameFit}: the same levels, Ec
 * and Γtip/Γsub reached from another reading of the peaks), which takes that run's answer. A whole-curve
 * fit the work budget or the time limit cut short gives no answer (the run keeps its CB side's).
 */
export function weightedWholeFits(input: WeightedWholeFitsInput): Map<FitTrial, NonNullable<FitAlternative["wholeCurve"]>> {
  const minWeight = input.minWeight ?? WEIGHTED_WHOLE_FITS_DEFAULTS.minWeight;
  const out = new Map<FitTrial, NonNullable<FitAlternative["wholeCurve"]>>();
  const weighted = input.finalists.filter((cb, i) => cb.side === "CB" && input.weights[i] >= minWeight);
  // Those with a whole-curve fit first: a run at the same fit as one of them takes its answer.
  const ordered = [...weighted.filter((cb) => input.wholeOf.has(cb)), ...weighted.filter((cb) => !input.wholeOf.has(cb))];
  const done: FitTrial[] = [];
  for (const cb of ordered) {
    const twin = input.wholeOf.has(cb) ? undefined : done.find((d) => sameFit(d, cb));
    if (twin) {
      out.set(cb, out.get(twin)!);
      continue;
    }
    const whole = input.wholeOf.get(cb) ?? input.wholeFitOf(cb);
    if (whole.loop.stoppedBy === "budget" || whole.loop.stoppedBy === "time") continue; // cut short: no answer of its own
    const at = parameterIndex(whole.hypothesis.seeds.length);
    out.set(cb, { rateRatio: 10 ** whole.loop.parameters[at.logRateRatio], chargingEnergyEV: whole.loop.parameters[at.chargingEnergy], reducedChiSquare: input.reduced(whole), describesCurve: input.describes(whole) });
    done.push(cb);
  }
  return out;
}
