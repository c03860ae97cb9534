/**
 * The compared groupings fitted to the whole curve from their own peak-based starts: where no
 * grouping's whole-curve fit started from its CB-side values describes the curve. At low η the CB
 * side may end before p (or hold the s doublet alone), so its values say nothing of p, and a
 * grouping that is implausible there (Γtip/Γsub run onto a bound on a side blind to p) is never
 * fitted to the whole curve, though its levels started from the peaks, with its own reading of
 * the VB peaks, describe it.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { FitTrial } from "./fitTrial.ts";
import { continueRun } from "./fitRunner.ts";
import { seedKey, type LevelSeed } from "./levelsToFit.ts";
import { finishBest, type WholeCurveSplitContext } from "./wholeCurveSplits.ts";
import { stateCount } from "../scenario.ts";
import { recentredSeeds } from "./wholeCurveRestarts.ts";

/** Defaults of {@link peakStartWholeFits} (locked by test/model/fit/peakStartWholeFits.test.ts). */
export const PEAK_START_WHOLE_DEFAULTS = Object.freeze({
  /** Explored starts finished (the lowest BICs after their explore iterations). Chosen on the accuracy benchmark (low-η mix with the comparison). */
  finishedStarts: 2,
  /** Most charge states of a start's CB levels and of its VB reading (FIT_DEFAULTS.maxAssignedStates): larger master equations solve slowly. */
  maxReadingStates: 100,
});

/** What {@link peakStartWholeFits} works with: that of {@link wholeCurveSplits}, and the groupings compared. */
export interface PeakStartWholeContext extends Omit<WholeCurveSplitContext, "from"> {
  /** The groupings compared (fitHypotheses); the assignment's own is left out where it was not fitted. */
  hypotheses: readonly FitHypothesis[];
}

/**
 * The best whole-curve fit of a compared grouping started from its peaks.
 *
 * Parameters
 * ----------
 * context : PeakStartWholeContext
 *     The runs so far, the run function, the CB side, η, the iteration budgets, the tests, the
 *     held VB levels of the CB-side hypotheses and the groupings compared.
 * settings : typeof PEAK_START_WHOLE_DEFAULTS, optional
 *     finishedStarts and maxReadingStates.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     The finished whole-curve run with the lowest BIC that describes the curve and is
 *     acceptable, with its grouping fitted on the CB side from it; null when none is.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Each grouping that holds CB levels, with each of its VB readings within maxReadingStates
 *    charge states, is explored on the whole curve from the starting values its peaks give
 *    ({@link startingValues}: ε = η·V_first − Ec·(N_before + ½), its own Ec and Γtip/Γsub starts);
 *    the finishedStarts lowest BICs are finished.
 * 2. The CB side of the chosen run is fitted from its whole-curve values, so that the comparison
 *    of the two sides' Ec and Γtip/Γsub (fitCurve) is made within one grouping; its model holds
 *    the run's VB levels at their whole-curve energies ({@link heldValenceLevels}' held levels:
 *    at low η a broad first hole's step through the substrate junction reaches onto the CB side,
 *    and without it the CB side does not fit what the whole curve does). Where that fit
 *    is not acceptable (on a side that ends before p, Γtip/Γsub runs onto a bound: the s doublet
 *    alone barely constrains it), the CB side is fitted again with Ec and Γtip/Γsub held at the
 *    whole curve's values, and counts only where it then describes its side (reduced χ² and
 *    residual structure as for the whole curve).
 * 3. On the low-η mix with the comparison (seed 1, draw 65: p split 2+4, the CB side ending
 *    before p), the 2+2+4 ladder in filling order reaches reduced χ² 1.06 on the whole curve this
 *    way, where the whole-curve fits started from the CB side's values stayed in the hundreds.
 *
 * Example
 * -------
 * ```ts
 * const found = peakStartWholeFits({ trials, run, cbSide, eta, exploreIterations: 8, maxIterations: 60, reduced, describes, acceptable, hypotheses });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function peakStartWholeFits(context: PeakStartWholeContext, settings = PEAK_START_WHOLE_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const { trials, run } = context;
  const explored: FitTrial[] = [];
  for (const h of context.hypotheses) {
    const cbSeeds = h.seeds.filter((s) => s.band === "CB");
    if (!cbSeeds.length || stateCount(cbSeeds) > settings.maxReadingStates) continue;
    for (const vb of h.vbReadings) {
      if (stateCount(vb) > settings.maxReadingStates) continue;
      const hv: FitHypothesis = { ...h, name: `${h.name} (whole curve from its peaks)`, seeds: [...cbSeeds, ...vb] };
      const t = run(hv, null, context.exploreIterations);
      trials.push(t);
      explored.push(t);
    }
  }
  const finished = finishBest(explored, settings.finishedStarts, run, context.maxIterations, trials);
  for (const w of finished.filter(context.describes).sort((x, y) => x.bic - y.bic)) {
    const nw = w.hypothesis.seeds.filter((s) => s.band === "CB").length;
    const at = w.hypothesis.seeds.length;
    // The CB side's model holds the VB levels at the whole curve's energies (note 2).
    const heldVb = recentredSeeds(w.hypothesis.seeds.slice(nw), w.loop.parameters.slice(nw, at), context.eta, w.loop.parameters[at]);
    const hc: FitHypothesis = { ...w.hypothesis, seeds: w.hypothesis.seeds.slice(0, nw), vbReadings: [[]], heldVb };
    const from = [...w.loop.parameters.slice(0, nw), ...w.loop.parameters.slice(at, at + 3)];
    const free = continueRun(run, w, context.maxIterations, context.cbSide, { hypothesis: hc, from });
    trials.push(free);
    // A CB side blind to p may run Γtip/Γsub onto a bound: Ec and Γtip/Γsub held at the whole curve's (note 2).
    const cb = context.acceptable(w, free) ? free : continueRun(run, w, context.maxIterations, context.cbSide, { hypothesis: hc, from, held: [nw, nw + 1] });
    if (cb !== free) trials.push(cb);
    if (cb !== free && !context.describes(cb)) continue;
    if (context.acceptable(w, cb)) return { cb, whole: w };
  }
  return null;
}

/** A CB reading offered to {@link ladderHypotheses}, with the hypothesis' name and label. */
export interface LadderReading {
  cb: LevelSeed[];
  name: string;
  label: string;
}

/**
 * Filling-order ladder hypotheses for {@link peakStartWholeFits} from CB readings of the peaks:
 * each reading of two or more levels whose CB grouping is not among `compared` (nor an earlier
 * reading) becomes `base` with those CB levels, the VB readings (the first one held in its seeds)
 * and the Ec start.
 *
 * Parameters
 * ----------
 * base : FitHypothesis
 *     The ladder the readings vary (its analysis, rate-ratio start, held VB levels).
 * compared : readonly FitHypothesis[]
 *     The groupings already compared: a reading of the same CB levels is left out.
 * readings : Iterable<LadderReading>
 *     The CB readings, in the order they are to be fitted.
 * vbReadings : LevelSeed[][]
 *     The VB readings tried with each (none: the CB levels alone).
 * chargingEnergyStartEV : number
 *     Ec start, eV.
 *
 * Returns
 * -------
 * FitHypothesis[]
 *     One per new reading, in order.
 *
 * Example
 * -------
 * ```ts
 * const hypotheses = ladderHypotheses(ladders[0], context.hypotheses, readings, vbReadings, ecEV);
 * const found = hypotheses.length ? peakStartWholeFits({ ...context, hypotheses }) : null;
 * ```
 */
export function ladderHypotheses(base: FitHypothesis, compared: readonly FitHypothesis[], readings: Iterable<LadderReading>, vbReadings: LevelSeed[][], chargingEnergyStartEV: number): FitHypothesis[] {
  const seen = new Set(compared.map((h) => seedKey(h.seeds.filter((s) => s.band === "CB"))));
  const out: FitHypothesis[] = [];
  for (const { cb, name, label } of readings) {
    if (cb.length < 2 || seen.has(seedKey(cb))) continue;
    seen.add(seedKey(cb));
    out.push({
      ...base,
      name,
      label,
      seeds: [...cb, ...(vbReadings[0] ?? [])],
      vbReadings: vbReadings.length ? vbReadings : [[]],
      cbDegeneracies: cb.map((s) => s.degeneracy),
      chargingEnergyStartEV,
    });
  }
  return out;
}
