/**
 * One refinement of a CB-side grouping: every further start about its fitted values explored,
 * the best finished.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { FitTrial } from "./fitTrial.ts";
import { parameterIndex } from "./parameterModel.ts";
import { refinementStarts } from "./refinementStarts.ts";
import { splitGridStarts } from "./splitGridStarts.ts";

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
  /** The peak-based Ec in eV (the rules' shell-filling Ec) for a further split start ({@link refinementStarts}), or null. Default null. */
  peakChargingEnergyEV?: number | null;
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
 * 1. Each start (a p split about the fitted p level, or the rate ratio moved) becomes a hypothesis
 *    named "<grouping>, refined to <layout> (<change>)", with the grouping's VB levels and
 *    readings, its CB-side version registered in context.cbOnly.
 * 2. Each is explored for context.exploreIterations from its start; the lowest BIC is finished
 *    with context.maxIterations if it is already below top's.
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
  let best: FitTrial | null = null;
  const fitted = top.loop.parameters.slice(0, parameterIndex(top.hypothesis.seeds.length).rateScale);
  const starts = [...refinementStarts(top.hypothesis.seeds, fitted, eta, context.peakChargingEnergyEV ?? null), ...splitGridStarts(top.hypothesis.seeds, fitted, eta, top.hypothesis.analysis.peaks)];
  for (const r of starts) {
    const at = parameterIndex(r.seeds.length);
    const moved = { chargingEnergyStartEV: r.parameters[at.chargingEnergy], rateRatioStartLog10: r.parameters[at.logRateRatio] };
    const name = `${topFull.name.replace(/,.*$/, "")}, refined to ${r.layout} (${r.change})`;
    const vb = topFull.seeds.filter((x) => x.band === "VB");
    const full: FitHypothesis = { ...topFull, name, label: `${topFull.label}, ${r.change}`, seeds: [...r.seeds, ...vb], cbDegeneracies: r.seeds.map((x) => x.degeneracy), ...moved };
    const hc: FitHypothesis = { ...full, seeds: r.seeds, vbReadings: [[]] };
    cbOnly.set(full, hc);
    const explored = context.run(hc, context.exploreIterations, r.parameters);
    trials.push(explored);
    if (!best || explored.bic < best.bic) best = explored;
  }
  if (!best || best.bic >= top.bic) return null;
  const done = { ...context.run(best.hypothesis, context.maxIterations, best.loop.parameters), rateRatio0: best.rateRatio0 };
  trials.push(done);
  return done.bic < top.bic ? done : null;
}
