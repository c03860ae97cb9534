/**
 * One Levenberg–Marquardt run of one hypothesis of the model fit, and what is read off it: the
 * regime its grouping stands for and the input of the plausibility checks.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { PlausibilityInput } from "./hypothesisPlausibility.ts";
import type { LoopResult } from "./levenbergMarquardtLoop.ts";
import { parameterIndex } from "./parameterModel.ts";
import { REGIME_LIMITS } from "../regimeLimits.ts";
import type { StartingValues } from "./startingValues.ts";
import type { FitAlternative } from "./curveFit.ts";

/** The points a run fits: bias (V), current (A), V³, their count and the noise-scaled data. */
export interface DataSet {
  biasV: Float64Array;
  dataA: Float64Array;
  v3: Float64Array;
  n: number;
  data: { x: number[]; y: number[] };
}

/** One Levenberg–Marquardt run of one hypothesis from one start. */
export interface FitTrial {
  hypothesis: FitHypothesis;
  /** The points fitted: the whole curve, or its CB side (bias > 0) when comparing groupings. */
  side: "both" | "CB";
  /** Their number. */
  n: number;
  /** The points themselves. */
  set: DataSet;
  rateRatio0: number;
  loop: LoopResult;
  start: StartingValues;
  /** Free parameters, nonlinear and linear. */
  k: number;
  /** Bayesian information criterion χ² + k·ln n (σ known). */
  bic: number;
  /** Run with the full iteration budget (not only explored). */
  finished: boolean;
  /** Why it is implausible once checked (empty: plausible); null before. */
  implausible: string[] | null;
}

/**
 * The regime a run stands for.
 *
 * Parameters
 * ----------
 * t : FitTrial
 *     One run: its hypothesis and its fitted log₁₀ Γtip/Γsub.
 *
 * Returns
 * -------
 * string
 *     For a charging ladder, the regime of its fitted rate ratio by REGIME_LIMITS (shell filling
 *     at ≥ 1.5, shell tunnelling at ≤ 3/7, intermediate between); for the rules' groupings, the
 *     regime of their assignment.
 *
 * Example
 * -------
 * ```ts
 * groupingRegime(ladderRunEndingAtRatio0_5); // => "intermediate"
 * ```
 */
export function groupingRegime(t: FitTrial): string {
  const h = t.hypothesis;
  if (h.kind !== "ladder-empty" && h.kind !== "ladder-filling") return h.analysis.assignment.regime;
  const r = 10 ** t.loop.parameters[parameterIndex(h.seeds.length).logRateRatio];
  return r >= REGIME_LIMITS.fillingRateRatioMin ? "shell-filling" : r <= REGIME_LIMITS.tunnelingRateRatioMax ? "shell-tunneling" : "intermediate";
}

/** A fitted parameter lies on a bound of its run when within this fraction of its bounds' span of one. */
export const BOUND_FRACTION = 1e-3;

/**
 * Whether parameter `j` of a run ended on one of its bounds: within `fraction` of the bounds'
 * span of either (the bound, not the curve, stopped it).
 *
 * Example
 * -------
 * ```ts
 * onBound([1.3983], { minValues: [1.27], maxValues: [1.3983] }, 0); // => true
 * ```
 */
export function onBound(parameters: readonly number[], start: Pick<StartingValues, "minValues" | "maxValues">, j: number, fraction = BOUND_FRACTION): boolean {
  const span = start.maxValues[j] - start.minValues[j];
  return parameters[j] - start.minValues[j] < fraction * span || start.maxValues[j] - parameters[j] < fraction * span;
}

/**
 * The fitted levels, Ec and key parameters at a bound of one trial, for the plausibility checks.
 *
 * Parameters
 * ----------
 * t : FitTrial
 *     One run: its hypothesis' seeds, its parameters (|ε| in eV per level, Ec in eV, log₁₀ r, …)
 *     and the bounds it ran within.
 *
 * Returns
 * -------
 * PlausibilityInput
 *     Levels with signed energies (eV; VB negative), Ec (eV), and "Ec" or "Γtip/Γsub" for each that
 *     ended within 0.1 % of the span of its bounds.
 *
 * Example
 * -------
 * ```ts
 * plausibilityInput(trial).atBound; // => [] (a fit that stayed inside its bounds)
 * ```
 */
export function plausibilityInput(t: FitTrial): PlausibilityInput {
  const p = t.loop.parameters;
  const at = parameterIndex(t.hypothesis.seeds.length);
  const atBound = [at.chargingEnergy, at.logRateRatio]
    .filter((j) => onBound(p, t.start, j))
    .map((j) => (j === at.chargingEnergy ? "Ec" : "Γtip/Γsub"));
  return {
    levels: t.hypothesis.seeds.map((s, j) => ({ band: s.band, label: s.label, degeneracy: s.degeneracy, energyEV: s.band === "CB" ? p[j] : -p[j] })),
    chargingEnergyEV: p[at.chargingEnergy],
    atBound,
    cbSideOnly: t.side === "CB",
  };
}


/**
 * The record of one run among a fit's alternatives.
 *
 * Parameters
 * ----------
 * t : FitTrial
 *     One run.
 * weight : number
 *     Its relative weight of evidence (0 unless a finalist).
 * implausible : string[] | null
 *     Why it is implausible (empty: plausible; null: not checked).
 *
 * Returns
 * -------
 * FitAlternative
 *     Hypothesis, regime, levels, CB degeneracies, start and fitted Γtip/Γsub, Ec (eV), reduced
 *     χ², side, BIC, whether finished, implausibility and weight.
 *
 * Example
 * -------
 * ```ts
 * fitAlternative(trial, 1, []).weight; // => 1
 * ```
 */
export function fitAlternative(t: FitTrial, weight: number, implausible: string[] | null, wholeCurve?: FitAlternative["wholeCurve"]): FitAlternative {
  const at = parameterIndex(t.hypothesis.seeds.length);
  return {
    hypothesis: t.hypothesis.name,
    regime: groupingRegime(t),
    levels: t.hypothesis.seeds.length,
    cbDegeneracies: t.hypothesis.cbDegeneracies,
    rateRatioStart: t.rateRatio0,
    rateRatio: 10 ** t.loop.parameters[at.logRateRatio],
    chargingEnergyEV: t.loop.parameters[at.chargingEnergy],
    reducedChiSquare: t.loop.chiSquare / Math.max(1, t.n - t.k),
    side: t.side,
    bic: t.bic,
    finished: t.finished,
    implausible,
    weight,
    ...(wholeCurve ? { wholeCurve } : {}),
  };
}
