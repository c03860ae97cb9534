/**
 * Which answer a curve's record stands by when `dotspec analyze --compare-models` fitted it: the
 * model comparison's or the rules'.
 */
import { REGIME_LIMITS } from "../model/regimeLimits.ts";
import type { ModelComparisonJson } from "./modelComparisonJson.ts";
import type { FittedValue } from "../model/fit/curveFit.ts";
import type { ecProfile } from "../model/fit/ecProfile.ts";
import { wholeCurveRefuted } from "./wholeCurveRefuted.ts";

/** The rules' answer a comparison is weighed against (from the analysis record). */
export interface RulesAnswer {
  /** The rules' regime. */
  regime: string;
  /** The rules' Ec, eV, or null. */
  chargingEnergyEV: number | null;
}

/** Options of {@link comparisonDecision}; every field optional (defaults in {@link MODEL_DECISION_DEFAULTS}). */
export interface ComparisonDecisionOptions {
  /** The winning grouping's BIC weight must be at least this (dimensionless, 0–1). Default 0.9. */
  minWeight?: number;
  /**
   * Where the fit names a regime other than the rules' definite one, its Γtip/Γsub must stay
   * inside that regime's range over ± this many standard errors (of ln r ≈ SE/r). Default 1.
   */
  rateRatioSigmas?: number;
  /** The fit agrees with the rules on Ec when within this fraction of the rules' Ec. Default 0.1. */
  agreeEcFraction?: number;
  /**
   * Groupings whose fitted Ec lies within this fraction of the winner's and whose Γtip/Γsub lies
   * in the same regime give the same answer: their BIC weights add up. Default 0.03.
   */
  sameAnswerEcFraction?: number;
  /**
   * … or whose Γtip/Γsub lies within this many of the fit's standard errors of its Γtip/Γsub
   * (r·exp(± k·SE/r)), or of the winning grouping's own run's, in whatever regime: two fits of
   * the same grouping that a regime boundary separates by less than their error give the same
   * answer. Default 2.
   */
  sameAnswerRateSigmas?: number;
}

/** Defaults of {@link comparisonDecision} (locked by test/report/comparisonDecision.test.ts). */
export const MODEL_DECISION_DEFAULTS = Object.freeze({
  /** Least BIC weight of the winning grouping: ΔBIC ≈ 4.4 over a single rival (positive evidence or more). */
  minWeight: 0.9,
  /** Standard errors of ln Γtip/Γsub that must stay inside the fit's regime when it overrides a named one. */
  rateRatioSigmas: 1,
  /** Ec agreement between fit and rules, fraction of the rules' Ec (the benchmark's Ec tolerance). */
  agreeEcFraction: 0.1,
  /** Groupings within this fraction of the winner's Ec, in the same regime, give the same answer (the Ec bar, 3 %). */
  sameAnswerEcFraction: 0.03,
  /** … or whose Γtip/Γsub lies within this many standard errors of the fit's (a regime boundary between them is within their error). */
  sameAnswerRateSigmas: 2,
});

/** The regime a rate ratio Γtip/Γsub lies in (`REGIME_LIMITS`). */
function regimeOfRatio(rateRatio: number): string {
  if (!(rateRatio > 0)) return "undetermined";
  if (rateRatio >= REGIME_LIMITS.fillingRateRatioMin) return "shell-filling";
  if (rateRatio <= REGIME_LIMITS.tunnelingRateRatioMax) return "shell-tunneling";
  return "intermediate";
}

/** The decision fields of a comparison: {@link comparisonDecision}'s result. */
export type ComparisonDecision = Required<Pick<ModelComparisonJson, "agreesWithRules" | "decides" | "decision">>;

/**
 * Which answer a curve's record stands by when the model comparison ran: the fit's or the rules'.
 *
 * Parameters
 * ----------
 * comparison : ModelComparisonJson
 *     The comparison (status, regime, Γtip/Γsub with its error, alternatives with their weights).
 * rules : RulesAnswer
 *     The rules' regime and Ec (eV).
 * options : ComparisonDecisionOptions, optional
 *     `minWeight` (default 0.9), `rateRatioSigmas` (default 1), `agreeEcFraction` (default 0.1),
 *     `sameAnswerEcFraction` (default 0.03), `sameAnswerRateSigmas` (default 2).
 *
 * Returns
 * -------
 * ComparisonDecision
 *     `agreesWithRules` (null without a fitted answer), `decides` (true: the fit's answer stands)
 *     and `decision` in words.
 *
 * Throws
 * ------
 * Nothing: the inputs come from the fit's own record.
 *
 * Notes
 * -----
 * The fit decides only when it is trustworthy on its own terms; otherwise the rules' answer
 * stands and the comparison is reported beside it:
 * 1. Status "good" (reduced χ² ≤ 3, no residual structure, Ec and Γtip/Γsub determined) and a
 *    definite regime (not "undetermined"); else the rules stand.
 * 2. The groupings that give the fit's answer (the winning grouping's own weighted run, and
 *    every run with Γtip/Γsub in the same regime or within `sameAnswerRateSigmas` of the fit's
 *    standard errors of it and Ec within `sameAnswerEcFraction` of that run's: the weights and the
 *    runs' values come from the points the groupings were compared on, which may be the CB side
 *    alone while the fit reports its whole curve's; the same model reached from several starts splits its weight between them,
 *    and a regime boundary between two of them that lies within the fit's error of Γtip/Γsub
 *    does not make their answers differ; nor does one between the fit's Γtip/Γsub and that of
 *    the winning grouping's own run: the runs within `sameAnswerRateSigmas` of the fit's relative
 *    error of that run's Γtip/Γsub, its Ec within `sameAnswerEcFraction`, are the same model
 *    reached from other starts, on the same points, even where the whole curve moved the fit
 *    across a regime boundary from them) carry at least `minWeight` of the BIC weight (exp(−ΔBIC/2),
 *    normalised): at 0.9, ΔBIC ≈ 4.4 over one rival answer, positive evidence on the scale of
 *    Kass & Raftery; a close contest leaves the rules' reading.
 * 3. Where the rules named a regime and the fit names another, Γtip/Γsub must stay inside the
 *    fit's regime over ± `rateRatioSigmas` standard errors (r·exp(± k·SE/r) against the
 *    boundaries 3/7 and 1.5 of `REGIME_LIMITS`): a fit near a boundary does not overturn a
 *    definite reading.
 * 4. Where the fit reads the rules' regime but leaves a quantity undetermined (an error that is
 *    not finite or larger than the value itself, so that not even its size is known: a level
 *    whose steps all lie beyond the points it was fitted to, as p on a CB side that ends after
 *    the s doublet at low η, whose energy then carries an error of 10⁶ eV or a NaN; or a shell-tunnelling Ec whose χ² profile
 *    stays flat, {@link ecProfile}, with the gap built on it), the rules' reading stands: the fit cannot replace
 *    the levels it does not see (low-η mix with the comparison, seed 1: spectra 48 and 192, shell
 *    filling, would take Δsp from such a p level, 40–280 % off). It still answers where the rules
 *    left the regime undetermined or read another regime, on Ec and Γtip/Γsub, which it determines.
 * 5. When all hold, the fit decides: where the rules were undetermined it gives the answer; where
 *    they agree it confirms them with its grouping (a shell the rules read short of its
 *    degeneracy is fitted whole); where they disagree it overrides them.
 * 6. A weighted run's answer, for step 2, is also the one its own whole-curve fit gives
 *    (`FitAlternative.wholeCurve`: the fit makes one from each CB-side finalist that carries
 *    weight): where that fit describes the curve and lands on the fit's Ec (within
 *    `sameAnswerEcFraction`) and regime (or within `sameAnswerRateSigmas` of its Γtip/Γsub), the
 *    run gives the fit's answer however far its CB-side values lay. On the CB side a ladder
 *    entered one carrier later, or p split where it is whole, can reach nearly the same χ² with Ec
 *    5–15 % away; the VB levels and the gap on the whole curve pin Ec and Γtip/Γsub, and two
 *    groupings whose whole-curve fits agree are not rival answers (low-η mix with the comparison,
 *    seed 1001: spectra 1027, 1041, 1068 and 1162, intermediate, read right by a good fit whose
 *    own grouping carried 0.33–0.81 of the weight).
 * 7. Where the fit's answer is its own grouping's whole-curve fit, which describes the curve, a
 *    rival run whose own whole-curve fit does not (reduced χ² also at least twice the fit's) is a
 *    reading the whole curve refutes ({@link wholeCurveRefuted}): its weight is set aside and the
 *    fit's answer weighed against the rivals left (low-η mix with the comparison: seed 1001 spectrum
 *    1077, seed 2001 spectra 2048 and 2082, intermediate, and seed 5001 spectrum 5199, shell
 *    filling, read right by a good fit whose own grouping carried 0.16–0.74 of the weight against
 *    rivals 4–13 times above its reduced χ² on the whole curve).
 *
 * References
 * ----------
 * R. E. Kass and A. E. Raftery, "Bayes factors", J. Am. Stat. Assoc. 90, 773 (1995) (the scale
 * of evidence for BIC differences); G. Schwarz, Ann. Stat. 6, 461 (1978) (BIC).
 *
 * Example
 * -------
 * ```ts
 * const analysis = analyzeCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * const m = modelComparisonJson(fitToJson(fitCurve(analysis, { compareModels: true }), analysisToJson(analysis)), "all");
 * // As if the rules had left the regime open: the fit's answer carries all the BIC weight.
 * comparisonDecision(m, { regime: "undetermined", chargingEnergyEV: null }).decision;
 * // => "the record stands by the fit (shell-filling): the rules left the regime undetermined, the fit is good and the groupings that give its answer (best: assigned) carry 1.00 of the BIC weight (≥ 0.9)"
 * ```
 */
export function comparisonDecision(comparison: ModelComparisonJson, rules: RulesAnswer, options: ComparisonDecisionOptions = {}): ComparisonDecision {
  const D = MODEL_DECISION_DEFAULTS;
  const minWeight = options.minWeight ?? D.minWeight;
  const k = options.rateRatioSigmas ?? D.rateRatioSigmas;
  const agreeEc = options.agreeEcFraction ?? D.agreeEcFraction;
  const sameEc = options.sameAnswerEcFraction ?? D.sameAnswerEcFraction;
  const sameRate = options.sameAnswerRateSigmas ?? D.sameAnswerRateSigmas;
  const m = comparison;
  const rulesWord = rules.regime === "undetermined" ? "the rules' undetermined regime" : `the rules' reading (${rules.regime})`;
  if (m.status === "failed" || m.regime === "undetermined") {
    return { agreesWithRules: null, decides: false, decision: `the record stands by ${rulesWord}: the fit gives no answer (${m.status === "failed" ? "no fit" : "its regime is undetermined"})` };
  }
  const fitEc = m.quantities.chargingEnergyEV?.value ?? null;
  const sameRegime = m.regime === rules.regime;
  const ecAgrees = fitEc === null || rules.chargingEnergyEV === null || Math.abs(fitEc - rules.chargingEnergyEV) <= agreeEc * rules.chargingEnergyEV;
  const agreesWithRules = sameRegime && ecAgrees;
  const what = agreesWithRules ? "agrees with the rules" : sameRegime ? `agrees on the regime but not on Ec (${(fitEc! * 1e3).toFixed(1)} against ${(rules.chargingEnergyEV! * 1e3).toFixed(1)} meV)` : `reads ${m.regime} where the rules read ${rules.regime}`;
  if (m.status !== "good") return { agreesWithRules, decides: false, decision: `the record stands by ${rulesWord}: the fit ${what} but its status is ${m.status}` };
  // A fit that leaves a quantity undetermined (a level whose steps lie beyond the points it was
  // fitted to: its error is not finite, or larger than the value itself) cannot replace the
  // rules' reading of the same regime, which places every level.
  const undetermined = (Object.entries(m.quantities) as [string, FittedValue | null][]).filter(([, q]) => q !== null && !(q.standardError <= Math.abs(q.value))).map(([name]) => name);
  if (sameRegime && undetermined.length) {
    return { agreesWithRules, decides: false, decision: `the record stands by ${rulesWord}: the fit ${what} but leaves ${undetermined.join(", ")} undetermined (an error that is not finite or exceeds the value: a level beyond the points it was fitted to), which the rules' reading places` };
  }
  // The weight of the fit's answer: every grouping that gives the same regime and Ec (the same
  // model reached from several starts splits the weight between them).
  // The weights are those of the compared runs, on the points they were compared on (the CB side
  // where groupings were compared), while the fit's values may be its whole curve's: the winning
  // grouping's own weighted run counts, and the others are compared with its Ec.
  const own = m.alternatives.filter((a) => a.hypothesis === m.hypothesis && a.weight > 0).reduce<(typeof m.alternatives)[number] | null>((x, a) => (!x || a.weight > x.weight ? a : x), null);
  const winnerEc = own?.chargingEnergyEV ?? fitEc ?? NaN;
  const rate = m.rateRatio;
  // Near the fit's Γtip/Γsub, or the winning grouping's own run's (the same run from another
  // start, on the same points as it, whatever regime the whole curve then moved the fit into).
  const near = (x: number, ref: number) => rate !== null && rate !== undefined && rate.value > 0 && ref > 0 && x > 0 && Math.abs(Math.log(x / ref)) <= (sameRate * rate.standardError) / rate.value;
  const nearRate = (x: number) => near(x, rate?.value ?? NaN) || (own !== null && near(x, own.rateRatio));
  // … or whose own whole-curve fit, started from its CB-side values, describes the curve and lands
  // on the fit's answer (step 6): the whole curve, with the VB levels and the gap, does not tell
  // them apart.
  const sameWhole = (a: (typeof m.alternatives)[number]) => {
    const w = a.wholeCurve;
    return w !== undefined && w.describesCurve && fitEc !== null && (regimeOfRatio(w.rateRatio) === m.regime || near(w.rateRatio, rate?.value ?? NaN)) && Math.abs(w.chargingEnergyEV - fitEc) <= sameEc * fitEc;
  };
  const sameAnswer = m.alternatives.filter((a) => a === own || sameWhole(a) || ((regimeOfRatio(a.rateRatio) === m.regime || nearRate(a.rateRatio)) && Math.abs(a.chargingEnergyEV - winnerEc) <= sameEc * winnerEc));
  // Rivals whose own whole-curve fits the curve refutes, where the fit's is its own grouping's (step 7), are set aside.
  const refuted = wholeCurveRefuted({ rivals: m.alternatives.filter((a) => !sameAnswer.includes(a)), own, fitChargingEnergyEV: fitEc }, { sameEcFraction: sameEc });
  const setAside = Math.min(1, refuted.reduce((sum, a) => sum + a.weight, 0));
  const weight = Math.min(1, sameAnswer.reduce((sum, a) => sum + a.weight, 0) / (setAside < 1 ? 1 - setAside : 1));
  if (weight < minWeight) {
    return { agreesWithRules, decides: false, decision: `the record stands by ${rulesWord}: the fit ${what}, but the groupings that give its answer carry ${weight.toFixed(2)} of the BIC weight (< ${minWeight}): a grouping with another answer fits nearly as well` };
  }
  if (!sameRegime && rules.regime !== "undetermined") {
    const r = m.rateRatio;
    const inside = (x: number) =>
      m.regime === "shell-filling" ? x >= REGIME_LIMITS.fillingRateRatioMin : m.regime === "shell-tunneling" ? x <= REGIME_LIMITS.tunnelingRateRatioMax : x > REGIME_LIMITS.tunnelingRateRatioMax && x < REGIME_LIMITS.fillingRateRatioMin;
    const spread = r && Number.isFinite(r.standardError) && r.value > 0 ? Math.exp((k * r.standardError) / r.value) : Infinity;
    if (!r || !Number.isFinite(spread) || !inside(r.value / spread) || !inside(r.value * spread)) {
      const shown = r ? `${r.value.toPrecision(3)} ± ${r.standardError.toPrecision(2)}` : "unknown";
      return { agreesWithRules, decides: false, decision: `the record stands by ${rulesWord}: the fit ${what}, but its Γtip/Γsub (${shown}) does not stay inside ${m.regime} over ± ${k} standard error${k === 1 ? "" : "s"}` };
    }
  }
  const aside = refuted.length ? ` once the rival groupings whose own whole-curve fits do not describe the curve (${setAside.toFixed(2)} of the weight) are set aside` : "";
  const grouping = `the groupings that give its answer (best: ${m.hypothesis}) carry ${weight.toFixed(2)} of the BIC weight (≥ ${minWeight})${aside}`;
  const decision =
    rules.regime === "undetermined"
      ? `the record stands by the fit (${m.regime}): the rules left the regime undetermined, the fit is good and ${grouping}`
      : agreesWithRules
        ? `the record stands by the fit, which agrees with the rules (${m.regime}): it is good and ${grouping}; read its values where they differ from the peak-based ones`
        : `the record stands by the fit over the rules: it ${what}, is good and ${grouping}${sameRegime ? "" : ", with Γtip/Γsub inside that regime over ± " + k + " standard error" + (k === 1 ? "" : "s")}`;
  return { agreesWithRules, decides: true, decision };
}
