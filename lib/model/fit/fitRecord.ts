/**
 * The record of a fit (steps 3 and 4 of {@link fitCurve}): the final values and their errors, the
 * verdict on the regime, the status and the {@link CurveFit} itself, from the run that stands.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import { parameterIndex } from "./parameterModel.ts";
import { fitStatus, peakChargingEnergy } from "./fitStatus.ts";
import { fitAlternative, plausibilityInput, type FitTrial } from "./fitTrial.ts";
import type { TrialErrors } from "./trialErrors.ts";
import { fitVerdict } from "./fitVerdict.ts";
import { orderLevels } from "./orderLevels.ts";
import { residualStructure } from "./residualStructure.ts";
import { peakEcRefuted } from "./peakEcRefuted.ts";
import { rateRatioLimit } from "./rateRatioLimit.ts";
import type { FitRun } from "./fitRunner.ts";
import type { CurveFit, FitAlternative, FittedValue } from "./curveFit.ts";
import type { FIT_DEFAULTS } from "./fitDefaults.ts";

/** What {@link fitRecord} reads: the fit's result and what the search left. */
export interface FitRecordInput {
  analysis: CurveAnalysis;
  /** The run that stands, and its errors ({@link trialErrors}). */
  best: FitTrial;
  errors: TrialErrors;
  eta: number;
  noiseA: number;
  /** The assignment's own run (null where it was not fitted). */
  assignedTrial: FitTrial | null;
  /** The CB-side winner, and the finalists that are physically plausible. */
  winner: FitTrial;
  plausible: readonly FitTrial[];
  /** A run's plausibility problems, in words (none: plausible). */
  implausibleOf: (t: FitTrial) => string[];
  /** Reduced χ² of a run. */
  reduced: (t: FitTrial) => number;
  /** The fit's run function, for the rate ratio's one-sided limit ({@link rateRatioLimit}). */
  run: FitRun;
  maxIterations: number;
  limits: typeof FIT_DEFAULTS;
  /** Why the fit was cut short, in words, or null. */
  cutShort: string | null;
  /** The evidence and warnings in words so far (the warnings are added to). */
  evidence: string[];
  warnings: string[];
  /** Every run, the CB-side finalists and their BIC weights, and the weighted groupings' whole-curve answers. */
  trials: readonly FitTrial[];
  finalists: readonly FitTrial[];
  weights: readonly number[];
  wholeAnswers: ReadonlyMap<FitTrial, NonNullable<FitAlternative["wholeCurve"]>>;
  /** The work the fit did and its limits, read at the end (the rate ratio's limit runs count). */
  work: () => CurveFit["work"];
}

/**
 * The fit's record from the run that stands.
 *
 * Parameters
 * ----------
 * input : FitRecordInput
 *
 * Returns
 * -------
 * CurveFit
 *     Levels in energy (CB positive, VB negative) and in bias (÷ η), Ec, Γtip/Γsub and the
 *     linear terms with their standard errors, the regime from the rate ratio ({@link fitVerdict}),
 *     the status ({@link fitStatus}: the residuals checked for structure over a peak's width, and
 *     Ec against the peak-based Ec where the rules read one charging ladder), every run as an
 *     alternative with its weight, and the residuals.
 *
 * Notes
 * -----
 * A fit with p split into sub-levels, or whose assignment's own grouping does not describe the
 * curve ({@link peakEcRefuted}), is not compared with the peak-based Ec; in shell tunnelling the
 * peak-based Ec (which assumes shell filling) does not apply. Where no run is plausible, the
 * fit is "failed" and the regime undetermined. The one-sided limit on Γtip/Γsub is read only from
 * a fit of the whole curve.
 *
 * Example
 * -------
 * // called once, at the end of fitCurve:
 * return fitRecord({ analysis, best, errors, eta, noiseA, ... });
 */
export function fitRecord(input: FitRecordInput): CurveFit {
  const { analysis, best, errors, eta, noiseA, assignedTrial, winner, plausible, implausibleOf, reduced, run, maxIterations, limits: F, cutShort, evidence, warnings, trials, finalists, weights, wholeAnswers } = input;
  const { hypothesis } = best;
  const { seeds } = hypothesis;
  const at = parameterIndex(seeds.length);
  const { parameters: params, iterations, converged, message } = best.loop;
  // 3. Final linear coefficients and standard errors from the full Jacobian, on the points the
  // result was fitted to.
  const { biasV, dataA } = best.set;
  const { final, full, se, reducedChiSquare } = errors;

  // 4. The verdict, the status and the result. The residuals are checked for structure over a
  // peak's width, and Ec against the peak-based Ec where the rules read a charging ladder.
  const structure = residualStructure(biasV, dataA.map((v, i) => v - final.out[i]), noiseA, analysis.settings.peakWidthMV / 1000);
  // A fit with p split into sub-levels reads a ladder the peak-based Ec (one ladder over p) does
  // not: it is not compared (the fit's own reading stands or falls by its residuals).
  const pSplit = seeds.filter((s) => s.band === "CB" && /^p/.test(s.label)).length > 1;
  const rulesEc = peakChargingEnergy(analysis, eta);
  const refuted = peakEcRefuted({ assignedReducedChiSquare: assignedTrial?.side === "both" ? reduced(assignedTrial) : null, fitReducedChiSquare: reducedChiSquare, fitIsAssigned: hypothesis.kind === "assigned" });
  const peakEc = pSplit || refuted ? null : rulesEc;
  const ratio = 10 ** params[at.logRateRatio];
  // Γtip/Γsub on a bound: the one-sided limit the curve sets on it (null off the bounds, or where
  // none lies inside one regime), read only from a fit of the whole curve: values from the CB side
  // alone already lack the VB reading that the whole curve rejected, and a ratio on a bound there
  // leaves the fit without its second measure (on the low-η benchmark such CB-side fits were wrong groupings).
  const limit = best.side === "CB" ? null : rateRatioLimit({ trial: best, run, maxIterations, chiSquareRise: F.rateRatioLimitChiSquare, fromUpperLog10: F.rateRatioLimitFromUpperLog10, fromLowerLog10: F.rateRatioLimitFromLowerLog10 });
  const verdict = fitVerdict(ratio, reducedChiSquare, F, se[at.logRateRatio], limit);
  if (verdict.warning) warnings.push(verdict.warning);
  const status = fitStatus({
    reducedChiSquare,
    regime: verdict.regime,
    chargingEnergyEV: params[at.chargingEnergy],
    chargingEnergySE: se[at.chargingEnergy],
    logRateRatioSE: se[at.logRateRatio],
    rateRatio: ratio,
    atBound: [...plausibilityInput(best).atBound],
    residualStructure: structure,
    peakChargingEnergy: peakEc,
    cutShort,
    rateRatioLimit: limit,
  });
  if (rulesEc && verdict.regime === "shell-tunneling") {
    warnings.push(`the fit reads the peaks as shell tunnelling: the peak-based Ec (${(rulesEc.valueEV * 1000).toFixed(1)} meV) assumes shell filling and does not apply`);
  } else if (rulesEc && (pSplit || refuted)) {
    warnings.push(pSplit ? `the fit splits p into sub-levels: the peak-based Ec (${(rulesEc.valueEV * 1000).toFixed(1)} meV) reads p as one charging ladder and is not compared with the fit's` : `the assignment's own grouping does not describe the curve (reduced χ² ${reduced(assignedTrial!).toPrecision(3)}): the peak-based Ec (${(rulesEc.valueEV * 1000).toFixed(1)} meV) it reads is not compared with the fit's (peakEcRefuted)`);
  }
  const value = (k: number): FittedValue => ({ value: full[k], standardError: se[k] });
  const ratioSE = Math.LN10 * ratio * se[at.logRateRatio];
  const sigmaEV = 10 ** params[at.logBroadening];
  const scaleRate = final.coef[0];
  const modelA = final.out;
  if (!plausible.length) status.reasons.unshift("no hypothesis is physically plausible");
  const failed = status.status === "failed" || !plausible.length;
  const regime = failed ? "undetermined" : verdict.regime;
  const regimeReason = failed ? `no fit: ${(plausible.length ? status.reasons : implausibleOf(winner)).join("; ")}` : verdict.regimeReason;
  return {
    source: analysis.source,
    converged,
    message,
    iterations,
    work: input.work(),
    eta,
    status: failed ? "failed" : status.status,
    statusReasons: status.reasons,
    hypothesis: hypothesis.name,
    evidence,
    alternatives: trials.map((t) => (finalists.includes(t) ? fitAlternative(t, weights[finalists.indexOf(t)], implausibleOf(t), wholeAnswers.get(t)) : fitAlternative(t, 0, t.implausible))),
    levels: orderLevels(seeds.map((s, j) => ({
      band: s.band,
      label: s.label,
      degeneracy: s.degeneracy,
      energyEV: { value: s.band === "CB" ? params[j] : -params[j], standardError: se[j] },
      energyV: { value: (s.band === "CB" ? params[j] : -params[j]) / eta, standardError: se[j] / eta },
    }))),
    chargingEnergyEV: value(at.chargingEnergy),
    chargingEnergyV: { value: params[at.chargingEnergy] / eta, standardError: se[at.chargingEnergy] / eta },
    rateRatio: { value: ratio, standardError: ratioSE },
    rateRatioLimit: limit,
    substrateRatePerS: { value: scaleRate, standardError: se[at.rateScale] },
    broadeningEV: { value: sigmaEV, standardError: Math.LN10 * sigmaEV * se[at.logBroadening] },
    offsetA: value(at.offset),
    backgroundLinearS: value(at.backgroundLinear),
    backgroundCubicAPerV3: value(at.backgroundCubic),
    reducedChiSquare,
    regime,
    regimeReason,
    residuals: { biasV, currentA: dataA, modelA, residualA: dataA.map((v, i) => v - modelA[i]) },
    residualStructure: structure,
    warnings,
  };
}
