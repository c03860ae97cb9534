/**
 * The record {@link fitCurve} returns: every fitted value with its standard error, the levels,
 * the status, the hypothesis the values come from and every run tried.
 */
import type { RateRatioLimit } from "./rateRatioLimit.ts";
import type { FitStatus } from "./fitStatus.ts";
import type { ResidualStructure } from "./residualStructure.ts";

/** One fitted parameter with its standard error. */
export interface FittedValue {
  value: number;
  standardError: number;
}

/** A fitted level. */
export interface FittedLevel {
  band: "CB" | "VB";
  /** Label of the multiplet it came from (s, p, d, v1, …), with a sub-group index when split. */
  label: string;
  degeneracy: number;
  /** Level energy relative to the Fermi level at zero bias, eV. */
  energyEV: FittedValue;
  /** The same referred to bias, ε/η, V. */
  energyV: FittedValue;
}

/** One start of one hypothesis that {@link fitCurve} tried. */
export interface FitAlternative {
  /**
   * "assigned", the regime forced on the same peaks ("shell-filling", "shell-tunneling"), or a
   * charging ladder with its CB degeneracies ("ladder-filling 2+2+4", "ladder-empty 2+6", …),
   * followed by " −Ec" or " +Ec" when retried with every CB level started one Ec lower or higher,
   * and by ", refined to <layout> (<change>)" when started from a grouping's fitted values with
   * its p shell split or its rate ratio moved ("ladder-empty 2+6, refined to 2+2+4 (p split 2+4,
   * sub-levels 53 meV apart)").
   */
  hypothesis: string;
  /** Regime of that grouping of the peaks ("intermediate" for a ladder entered from the empty dot). */
  regime: string;
  /** Levels fitted. */
  levels: number;
  /** Degeneracies of its CB levels, from the gap outward (multiplet sizes). */
  cbDegeneracies: number[];
  /** Γtip/Γsub it started from and ended at. */
  rateRatioStart: number;
  rateRatio: number;
  /** Fitted Ec, eV. */
  chargingEnergyEV: number;
  reducedChiSquare: number;
  /**
   * The points fitted: "both" (the whole curve) or "CB" (its CB side, where groupings of the CB
   * peaks are compared). BIC compares only runs on the same points.
   */
  side: "both" | "CB";
  /** Bayesian information criterion χ² + k·ln n ({@link bayesianInformationCriterion}). */
  bic: number;
  /** Whether this run had the full iteration budget (not only explored). */
  finished: boolean;
  /** Why it is physically implausible (empty: plausible); null when not checked. */
  implausible: string[] | null;
  /**
   * exp(−ΔBIC/2), normalised over the plausible finalists (their CB-side fits when groupings were
   * compared, else the assignment's whole-curve fits): the relative weight of evidence; 0 for the rest.
   */
  weight: number;
  /**
   * The whole-curve fit started from this CB-side run ({@link weightedWholeFits}): its Γtip/Γsub,
   * Ec (eV), reduced χ² and whether it describes the curve; set on the CB-side finalists that
   * carry weight, absent elsewhere.
   */
  wholeCurve?: { rateRatio: number; chargingEnergyEV: number; reducedChiSquare: number; describesCurve: boolean };
}

/** The work a fit did and its limits ({@link fitCurve}). */
export interface FitWork {
  /** Model evaluations the Levenberg–Marquardt iterations of all runs asked for. */
  evaluations: number;
  /** The work budget: most model evaluations of the whole fit. */
  maxEvaluations: number;
  /** The wall-clock limit asked for, ms (machine-dependent); null: none. */
  timeLimitMs: number | null;
  /** What cut a run short: the budget (the same on every machine), the time limit, or nothing (null). */
  stoppedBy: "budget" | "time" | null;
}

/** Result of {@link fitCurve}. */
export interface CurveFit {
  source: string;
  converged: boolean;
  /** Why the run reported stopped. */
  message: string;
  iterations: number;
  /** The work of the whole fit (all runs) and its limits; a fit cut short is at best poor. */
  work: FitWork;
  eta: number;
  /**
   * "good" (the model describes the curve and Ec and Γtip/Γsub are determined), "poor" (it
   * describes it only roughly, or a key parameter is poorly determined) or "failed" (no start
   * describes the curve: no fit; the values are not to be used). From the reduced χ² and the
   * parameter errors, not from the optimiser's convergence.
   */
  status: FitStatus;
  /** Why the status is what it is, in words. */
  statusReasons: string[];
  /** The hypothesis the values come from. */
  hypothesis: FitAlternative["hypothesis"];
  /** Why that hypothesis won, in words (BIC differences, implausible rivals). */
  evidence: string[];
  /** Every start of every hypothesis tried, with its score. */
  alternatives: FitAlternative[];
  levels: FittedLevel[];
  chargingEnergyEV: FittedValue;
  /** Ec/η, V. */
  chargingEnergyV: FittedValue;
  /** Γtip/Γsub. */
  rateRatio: FittedValue;
  /**
   * Where Γtip/Γsub ran onto a bound of the fit (10⁻⁴ or 10⁴): the one-sided limit the curve sets
   * on it inside one regime (`kind` "lower": Γtip/Γsub ≥ `rateRatio`, deep shell filling; "upper":
   * ≤, deep shell tunnelling); null where it did not, or where the curve sets no limit inside one
   * regime. `rateRatio` then holds the bound, with no finite error.
   */
  rateRatioLimit: RateRatioLimit | null;
  /** Γsub, 1/s (the overall rate scale). */
  substrateRatePerS: FittedValue;
  /** Gaussian level broadening, eV. */
  broadeningEV: FittedValue;
  /** Current offset, A. */
  offsetA: FittedValue;
  /** Background I_bg = b1·V + b3·V³: b1 in S, b3 in A/V³. */
  backgroundLinearS: FittedValue;
  backgroundCubicAPerV3: FittedValue;
  /** χ² per degree of freedom, with the current noise of the analysis as σ. */
  reducedChiSquare: number;
  /**
   * Regime implied by the fitted rate ratio and its error ({@link fitVerdict}); "undetermined"
   * when the error reaches both regimes or there is no fit.
   */
  regime: "shell-filling" | "shell-tunneling" | "intermediate" | "undetermined";
  /** Why, in words (the ratio and its range, or what is missing). */
  regimeReason: string;
  /** Bias, data, model and residual on the points used, for plotting. */
  residuals: { biasV: Float64Array; currentA: Float64Array; modelA: Float64Array; residualA: Float64Array };
  /**
   * The most structured stretch of those residuals, a peak's width long ({@link residualStructure}):
   * above FIT_STATUS_DEFAULTS.poorResidualZ (5) the status is poor and says where.
   */
  residualStructure: ResidualStructure;
  warnings: string[];
}
