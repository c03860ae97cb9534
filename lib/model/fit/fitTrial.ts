/**
 * One Levenberg–Marquardt run of one hypothesis of the model fit, and what is read off it: the
 * regime its grouping stands for and the input of the plausibility checks.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { PlausibilityInput } from "./hypothesisPlausibility.ts";
import type { LoopResult } from "./levenbergMarquardtLoop.ts";
import { parameterIndex } from "./parameterModel.ts";
import type { StartingValues } from "./startingValues.ts";

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
 * The regime a hypothesis' grouping stands for.
 *
 * Parameters
 * ----------
 * h : FitHypothesis
 *     A hypothesis of {@link fitHypotheses}.
 *
 * Returns
 * -------
 * string
 *     "intermediate" for a ladder entered from the empty dot, "shell-filling" for one in filling
 *     order, else the regime of the hypothesis' assignment.
 *
 * Example
 * -------
 * ```ts
 * groupingRegime({ kind: "ladder-empty", ... } as FitHypothesis); // => "intermediate"
 * ```
 */
export function groupingRegime(h: FitHypothesis): string {
  if (h.kind === "ladder-empty") return "intermediate";
  if (h.kind === "ladder-filling") return "shell-filling";
  return h.analysis.assignment.regime;
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
    .filter((j) => {
      const span = t.start.maxValues[j] - t.start.minValues[j];
      return p[j] - t.start.minValues[j] < 1e-3 * span || t.start.maxValues[j] - p[j] < 1e-3 * span;
    })
    .map((j) => (j === at.chargingEnergy ? "Ec" : "Γtip/Γsub"));
  return {
    levels: t.hypothesis.seeds.map((s, j) => ({ band: s.band, label: s.label, degeneracy: s.degeneracy, energyEV: s.band === "CB" ? p[j] : -p[j] })),
    chargingEnergyEV: p[at.chargingEnergy],
    atBound,
  };
}

