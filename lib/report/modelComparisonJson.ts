/**
 * The model comparison inside an analysis record: what `dotspec analyze --compare-models` adds to
 * a curve's JSON, taken from the fit's own record ({@link fitToJson}) without its residuals and
 * its copy of the peak-based record.
 */
import { rulesDecisive } from "../assign/rulesDecisive.ts";
import type { FittedValue } from "../model/fit/curveFit.ts";
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import { comparisonDecision, type RulesAnswer } from "./comparisonDecision.ts";
import type { FitJson } from "./fitJson.ts";

/** Which curves `analyze --compare-models` fits: those where the rules are not decisive (`rulesDecisive`), or all. */
export type CompareModelsScope = "undecided" | "all";

/** The model comparison of one curve, as an analysis record carries it. */
export interface ModelComparisonJson {
  /** Why it ran: the rules were not decisive on the curve ("undecided", the reasons in `ranBecause`) or every curve is fitted ("all"). */
  scope: CompareModelsScope;
  /** "good", "poor" or "failed" (no fit: do not use the values), with the reasons. */
  status: FitJson["status"];
  statusReasons: string[];
  /** Regime from the fitted Γtip/Γsub and its error: shell filling, shell tunnelling, intermediate or undetermined. */
  regime: FitJson["regime"];
  regimeReason: string;
  /** The grouping of the peaks that won, its BIC weight and the starts tried. */
  hypothesis: FitJson["hypothesis"];
  /** Why it won, in words. */
  evidence: string[];
  /** Every grouping compared, with its score and relative weight. */
  alternatives: FitJson["alternatives"];
  /** Gap, Ec and s–p spacing the fit implies, eV, each with its 1σ (null where the fit has no such level, and all null when the fit could not run). */
  quantities: { gapEV: FittedValue | null; chargingEnergyEV: FittedValue | null; levelSpacingSPEV: FittedValue | null };
  /** Γtip/Γsub with its standard error (null when the fit could not run). */
  rateRatio: FittedValue | null;
  /** Where Γtip/Γsub ran onto a bound of the fit: the one-sided limit the curve sets on it (see `CurveFit.rateRatioLimit`); null otherwise. */
  rateRatioLimit: FitJson["rateRatioLimit"];
  /** Reduced χ² of the fit (null when it could not run). */
  reducedChiSquare: number | null;
  /** The fit's work and its limits (FitJson.work: the budget `--replay` re-runs with); absent when the fit could not run, and in records written before this field existed. */
  work?: FitJson["work"];
  warnings: string[];
  /**
   * Why the comparison ran, in words: the features that leave the rules' reading open
   * (`rulesDecisive`), or "--compare-models all" when every curve is fitted and the rules were
   * decisive. Absent in records written before this field existed.
   */
  ranBecause?: string[];
  /**
   * Whether the fit's answer agrees with the rules' (same regime and, where both give one, Ec
   * within `MODEL_DECISION_DEFAULTS.agreeEcFraction`); null when the fit has no answer (failed,
   * or its regime undetermined).
   */
  agreesWithRules?: boolean | null;
  /**
   * True when the record stands by the fit's answer (regime, Ec, Γtip/Γsub, Δsp and the grouping
   * of `hypothesis`) rather than the rules' (the record's top-level fields, which stay the
   * rules'): see {@link comparisonDecision}.
   */
  decides?: boolean;
  /** Which answer the record stands by, and why, in words. */
  decision?: string;
}

/**
 * The model comparison an analysis record carries, from the fit's record.
 *
 * Parameters
 * ----------
 * fit : FitJson
 *     The record of `fitCurve(analysis, { compareModels: true })` ({@link fitToJson}).
 * scope : CompareModelsScope
 *     Why the curve was fitted ("undecided": the rules are not decisive, `rulesDecisive`).
 * context : { ranBecause: string[]; rules: RulesAnswer }, optional
 *     Why it ran (the reasons, in words) and the rules' answer; with it the record gains
 *     `ranBecause`, `agreesWithRules`, `decides` and `decision` ({@link comparisonDecision}).
 *
 * Returns
 * -------
 * ModelComparisonJson
 *     Status, regime, winning grouping, alternatives, quantities with their errors, Γtip/Γsub,
 *     reduced χ² and the fit's warnings; no residuals and no copy of the peak-based record.
 *
 * Example
 * -------
 * ```ts
 * const analysis = analyzeCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * const fit = fitCurve(analysis, { compareModels: true });
 * modelComparisonJson(fitToJson(fit, analysisToJson(analysis)), "all").regime; // => "shell-filling"
 * ```
 */
export function modelComparisonJson(fit: FitJson, scope: CompareModelsScope, context?: { ranBecause: string[]; rules: RulesAnswer }): ModelComparisonJson {
  const record: ModelComparisonJson = {
    scope,
    status: fit.status,
    statusReasons: fit.statusReasons,
    regime: fit.regime,
    regimeReason: fit.regimeReason,
    hypothesis: fit.hypothesis,
    evidence: fit.evidence,
    alternatives: fit.alternatives,
    quantities: fit.quantities,
    rateRatio: { value: fit.rateRatio, standardError: fit.rateRatioSE },
    rateRatioLimit: fit.rateRatioLimit,
    reducedChiSquare: fit.reducedChiSquare,
    work: { ...fit.work },
    warnings: fit.warnings,
  };
  return context ? { ...record, ranBecause: context.ranBecause, ...comparisonDecision(record, context.rules) } : record;
}

/**
 * The model comparison of a curve the fit could not start on (for example no peak grouped into a
 * multiplet): status "failed" with the reason, no values.
 *
 * Parameters
 * ----------
 * reason : string
 *     Why the fit could not run (the fit's error message).
 * scope : CompareModelsScope
 *     Why the curve was to be fitted.
 * ranBecause : string[], optional
 *     Why it ran, in words; with it the record gains `ranBecause` and the decision fields (the
 *     rules' answer stands).
 *
 * Returns
 * -------
 * ModelComparisonJson
 *     Status "failed", regime "undetermined", every value null, no alternatives.
 *
 * Example
 * -------
 * ```ts
 * failedModelComparison("no multiplets to fit", "undecided").status; // => "failed"
 * ```
 */
export function failedModelComparison(reason: string, scope: CompareModelsScope, ranBecause?: string[]): ModelComparisonJson {
  const record: ModelComparisonJson = {
    scope,
    status: "failed",
    statusReasons: [reason],
    regime: "undetermined",
    regimeReason: "no fit",
    hypothesis: "",
    evidence: [],
    alternatives: [],
    quantities: { gapEV: null, chargingEnergyEV: null, levelSpacingSPEV: null },
    rateRatio: null,
    rateRatioLimit: null,
    reducedChiSquare: null,
    warnings: [],
  };
  return ranBecause ? { ...record, ranBecause, agreesWithRules: null, decides: false, decision: `the record stands by the rules' answer: no fit (${reason})` } : record;
}

/**
 * Whether `--compare-models` fits a curve, and why: the reasons the rules are not decisive on it,
 * or with scope "all" a note that every curve is fitted.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The curve's analysis (its peaks, assignment and conductance bias axis are read).
 * scope : CompareModelsScope
 *     `"undecided"`: only curves where the rules are not decisive; `"all"`: every curve with levels.
 *
 * Returns
 * -------
 * string[] | null
 *     The reasons in words (`ModelComparisonJson.ranBecause`); null when the curve is not to be
 *     fitted: the rules are decisive and the scope is "undecided", or the curve has no levels
 *     (`noLevels`), where there is nothing to compare.
 *
 * Notes
 * -----
 * The reasons are those of {@link rulesDecisive} over the bias window of the conductance curve.
 * `dotspec analyze --compare-models` and the model notebook both ask this function, so they fit
 * the same curves for the same reasons.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * compareModelsReasons(analyzeCurve(curve), "undecided");
 * // => null (the rules decide this curve; a list of reasons on a curve they leave open)
 * ```
 */
export function compareModelsReasons(analysis: CurveAnalysis, scope: CompareModelsScope): string[] | null {
  if (analysis.assignment.noLevels !== null) return null;
  const bias = analysis.conductance.biasV;
  const verdict = rulesDecisive({ peaks: analysis.peaks, assignment: analysis.assignment, biasRangeV: [bias[0], bias[bias.length - 1]] });
  if (!verdict.decisive) return verdict.reasons;
  return scope === "all" ? ["--compare-models all: every curve is fitted (the rules are decisive on this one)"] : null;
}
