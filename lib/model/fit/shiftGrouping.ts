/**
 * A CB-side grouping retried one Ec off: every CB level started one charging energy lower and
 * higher, for a ladder whose first charging peak was missed or that took one peak too many.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { FitTrial } from "./fitTrial.ts";
import type { LevelSeed } from "./levelsToFit.ts";
import { parameterIndex } from "./parameterModel.ts";
import type { RefineContext } from "./refineGrouping.ts";
import { continueRun } from "./fitRunner.ts";

/**
 * Retries one CB-side fit with every CB start shifted by −Ec and by +Ec.
 *
 * Parameters
 * ----------
 * t : FitTrial
 *     A finished CB-side run of a compared grouping.
 * context : RefineContext
 *     The fit's hypotheses and runs, η, the iteration budgets and the run function.
 *
 * Returns
 * -------
 * FitTrial | null
 *     The better finished retry when its BIC is below t's, else null.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. For each sign: every CB seed's first-peak bias moved by that sign × Ec/η (Ec the fitted
 *    one), the start's Ec and rate ratio the fitted ones; named "<grouping> −Ec" or "+Ec", its
 *    CB-side version registered in context.cbOnly; skipped when a level would start at or below
 *    zero bias.
 * 2. Explored for context.exploreIterations from its seeds; finished with context.maxIterations
 *    when already below the best BIC so far.
 *
 * Example
 * -------
 * ```ts
 * shiftGrouping(ladderOneEcOff, context)?.hypothesis.name; // => "ladder-empty 2+6 −Ec"
 * ```
 */
export function shiftGrouping(t: FitTrial, context: RefineContext): FitTrial | null {
  const { cbOnly, trials, eta } = context;
  const at = parameterIndex(t.hypothesis.seeds.length);
  const ecV = t.loop.parameters[at.chargingEnergy] / eta;
  const original = [...cbOnly.entries()].find(([, hc]) => hc === t.hypothesis)![0];
  let best: FitTrial | null = null;
  for (const sign of [-1, 1]) {
    const shift = (x: LevelSeed): LevelSeed => (x.band === "CB" ? { ...x, firstPeakV: x.firstPeakV + sign * ecV } : x);
    const moved = { chargingEnergyStartEV: t.loop.parameters[at.chargingEnergy], rateRatioStartLog10: t.loop.parameters[at.logRateRatio] };
    const full: FitHypothesis = { ...original, name: `${original.name} ${sign < 0 ? "−" : "+"}Ec`, label: `${original.label}, every level one Ec ${sign < 0 ? "lower" : "higher"}`, seeds: original.seeds.map(shift), ...moved };
    const hc: FitHypothesis = { ...full, seeds: t.hypothesis.seeds.map(shift), vbReadings: [[]], heldVb: t.hypothesis.heldVb };
    if (hc.seeds.some((x) => x.firstPeakV <= 0)) continue;
    cbOnly.set(full, hc);
    const explored = context.run(hc, context.exploreIterations);
    trials.push(explored);
    if (explored.bic >= (best ?? t).bic) continue;
    const done = continueRun((h, _logRatio0, iterations, from) => context.run(h, iterations, from), explored, context.maxIterations);
    trials.push(done);
    if (done.bic < (best ?? t).bic) best = done;
  }
  return best;
}
