/**
 * One refinement of a CB-side grouping: every further start about its fitted values explored,
 * the best finished.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { FitTrial } from "./fitTrial.ts";
import { parameterIndex } from "./parameterModel.ts";
import { refinementStarts } from "./refinementStarts.ts";
import { splitGridStarts } from "./splitGridStarts.ts";
import { continueRun } from "./fitRunner.ts";

/** Constants of {@link refineGrouping} (locked by test/model/fit/refineGrouping.test.ts). */
export const REFINE_GROUPING_DEFAULTS = Object.freeze({
  /**
   * Explored starts finished (the best by BIC after their few iterations): with the split starts
   * at the peaks' spacings ({@link splitGridStarts}) the one ahead after 4 iterations was not
   * always the one that settled lowest (crossover benchmark, start 158: a grid start ahead, the
   * rate-ratio restart the right one).
   */
  finishedStarts: 2,
});

/** What {@link refineGrouping} works with: the fit's runs and hypotheses. */
export interface RefineContext {
  /** Whole-curve hypothesis → its CB-side version; the refined ones are added. */
  cbOnly: Map<FitHypothesis, FitHypothesis>;
  /** Every run tried; the refinement runs are added. */
  trials: FitTrial[];
  /** Voltage-division factor η. */
  eta: number;
  /** Iterations of each explored start. */
  exploreIterations: number;
  /** Iterations of the finishing run. */
  maxIterations: number;
  /** One Levenberg–Marquardt run of a CB-side hypothesis on the CB side of the curve, from the given parameters (absent: from its seeds). */
  run: (hc: FitHypothesis, iterations: number, from?: number[]) => FitTrial;
  /** Also the starts of {@link splitGridStarts} (p split at the spacings the peaks show). Default true. */
  splitAtPeaks?: boolean;
  /** The peak-based Ec in eV (the rules' shell-filling Ec) for a further split start ({@link refinementStarts}), or null. Default null. */
  peakChargingEnergyEV?: number | null;
  /** Only the split starts at the peaks, with the first p peak the first CB peak after the s doublet ({@link splitGridStarts}' `firstPeakAfterS`): fitCurve's rescue of a poor comparison. Default false. */
  afterSOnly?: boolean;
}

/**
 * Refines one CB-side fit from the further starts of {@link refinementStarts}.
 *
 * Parameters
 * ----------
 * top : FitTrial
 *     A finished CB-side run of a compared grouping.
 * context : RefineContext
 *     The fit's hypotheses and runs, η, the iteration budgets and the run function.
 *
 * Returns
 * -------
 * FitTrial | null
 *     The finished best refinement when its BIC is below top's, else null.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Each start ({@link refinementStarts}: a p split about the fitted p level, or the rate ratio
 *    moved; {@link splitGridStarts}: p split at the spacings the peaks show; with
 *    context.afterSOnly only the latter, from the first peak after the s doublet) becomes a hypothesis
 *    named "<grouping>, refined to <layout> (<change>)", with the grouping's VB levels and
 *    readings, its CB-side version registered in context.cbOnly.
 * 2. Each is explored for context.exploreIterations from its start; the REFINE_GROUPING_DEFAULTS.finishedStarts
 *    lowest BICs already below top's are finished with context.maxIterations, and the best of
 *    them is returned when its BIC is below top's.
 *
 * Example
 * -------
 * ```ts
 * refineGrouping(bestCbSideFit, context)?.hypothesis.name;
 * // => "ladder-empty 2+6, refined to 2+2+4 (p split 2+4, sub-levels 53 meV apart)"
 * ```
 */
export function refineGrouping(top: FitTrial, context: RefineContext): FitTrial | null {
  const { cbOnly, trials, eta } = context;
  const topFull = [...cbOnly.entries()].find(([, hc]) => hc === top.hypothesis)![0];
  const explored: FitTrial[] = [];
  const fitted = top.loop.parameters.slice(0, parameterIndex(top.hypothesis.seeds.length).rateScale);
  const peaks = top.hypothesis.analysis.peaks;
  const starts = context.afterSOnly
    ? splitGridStarts(top.hypothesis.seeds, fitted, eta, peaks, { firstPeakAfterS: true }).map((r) => ({ ...r, change: `${r.change}, p from the first peak after s` }))
    : [...refinementStarts(top.hypothesis.seeds, fitted, eta, context.peakChargingEnergyEV ?? null), ...(context.splitAtPeaks ?? true ? splitGridStarts(top.hypothesis.seeds, fitted, eta, peaks) : [])];
  for (const r of starts) {
    const at = parameterIndex(r.seeds.length);
    const moved = { chargingEnergyStartEV: r.parameters[at.chargingEnergy], rateRatioStartLog10: r.parameters[at.logRateRatio] };
    const name = `${topFull.name.replace(/,.*$/, "")}, refined to ${r.layout} (${r.change})`;
    const vb = topFull.seeds.filter((x) => x.band === "VB");
    const full: FitHypothesis = { ...topFull, name, label: `${topFull.label}, ${r.change}`, seeds: [...r.seeds, ...vb], cbDegeneracies: r.seeds.map((x) => x.degeneracy), ...moved };
    const hc: FitHypothesis = { ...full, seeds: r.seeds, vbReadings: [[]], heldVb: top.hypothesis.heldVb };
    cbOnly.set(full, hc);
    const run = context.run(hc, context.exploreIterations, r.parameters);
    trials.push(run);
    explored.push(run);
  }
  // The best few explored starts below top's BIC are finished (a start ahead after a few
  // iterations may settle behind another), and the best finished one is kept if below top's.
  let best: FitTrial | null = null;
  for (const t of explored.filter((x) => x.bic < top.bic).sort((x, y) => x.bic - y.bic).slice(0, REFINE_GROUPING_DEFAULTS.finishedStarts)) {
    const done = continueRun((h, _logRatio0, iterations, from) => context.run(h, iterations, from), t, context.maxIterations);
    trials.push(done);
    if (!best || done.bic < best.bic) best = done;
  }
  return best && best.bic < top.bic ? best : null;
}
