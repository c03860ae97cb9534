/**
 * Whole-curve starts over Ec for a shell-tunnelling reading: where the satellites that carry Ec
 * are at the noise, the whole-curve fit started from the CB side's Ec can stay in a wrong basin
 * while starts at other Ec, each level placed so its first entry stays at its peak, reach the curve.
 */
import type { FitTrial } from "./fitTrial.ts";
import { parameterIndex } from "./parameterModel.ts";
import { continueRun } from "./fitRunner.ts";
import { ecGridStartsEV } from "./ecGridWholeFits.ts";
import { secondToFirstStepRatio } from "../regimeLimits.ts";
import type { WholeCurveSplitContext } from "./wholeCurveSplits.ts";

/** Defaults of {@link tunnelingEcStarts} (locked by test/model/fit/tunnelingEcStarts.test.ts). */
export const TUNNELING_EC_STARTS_DEFAULTS = Object.freeze({
  /**
   * The stage runs where the whole-curve fit's satellite steps r/(1 + r) are at most this fraction
   * of their levels' ({@link secondToFirstStepRatio}, orthodox theory), as EC_PROFILE_DEFAULTS.maxSatelliteFraction. Not tuned.
   */
  maxSatelliteFraction: 0.05,
  /** Ec starts: gapFraction × gap × k / gridSteps, k = 1 … gridSteps ({@link ecGridStartsEV}, as EC_GRID_DEFAULTS). Not tuned. */
  gapFraction: 0.25,
  gridSteps: 8,
  /** A start within this fraction of the fit's own Ec is that fit again and is skipped. Not tuned. */
  sameEcFraction: 0.1,
  /**
   * fitCurve runs this stage only while at most this fraction of the work budget is spent, as
   * EC_GRID_DEFAULTS.maxBudgetSpent. Not tuned.
   */
  maxBudgetSpent: 0.75,
});

/** What {@link tunnelingEcStarts} reads: the whole-curve split context and the whole-curve fit that does not describe the curve. */
export interface TunnelingEcStartsInput extends Omit<WholeCurveSplitContext, "from"> {
  /** The winner's whole-curve fit. */
  whole: FitTrial;
  /** The peaks' biases, V (CB positive, VB negative; resonances left out), for the grid's gap. */
  peaksV: readonly number[];
}

/**
 * Whole-curve fits of the winner's reading from a grid of Ec starts, each level moved by −ΔEc/2.
 *
 * Parameters
 * ----------
 * input : TunnelingEcStartsInput
 * settings : typeof TUNNELING_EC_STARTS_DEFAULTS, optional
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     The best start, finished on the whole curve, where it describes the curve and is acceptable,
 *     with its reading fitted on the CB side from it; null where the fit is not a tunnelling one
 *     with satellites at most maxSatelliteFraction, already describes the curve, or no start does.
 *
 * Notes
 * -----
 * In shell tunnelling the dot empties between entries, so each level's first entry lies at
 * ε + Ec/2 (orthodox theory, one level entered into the empty dot): a start at another Ec with
 * ε − ΔEc/2 keeps every first step where its peak is and moves only what Ec sets, the satellites
 * and, at η < 1, the second-junction resonances (ε ± Ec/2)/(1 − η) and a VB level's hole
 * charging resonance Ec/(1 − η) beyond its first. On the low-η benchmark (seed 1001 draw 1147,
 * Ec 170.4 meV, Γtip/Γsub 0.0038) the whole-curve runs started near the CB side's Ec of 86–94 meV
 * stayed at reduced χ² 2.5–2.8; the assignment's reading from Ec starts of 0.12–0.22 eV reached
 * 0.983 with Ec 170.8 meV. Each start is explored for exploreIterations; the one of least χ² is
 * finished.
 *
 * Example
 * -------
 * // in fitCurve, where the winner's whole-curve fit does not describe the curve:
 * const found = tunnelingEcStarts({ ...split, whole, peaksV });
 */
export function tunnelingEcStarts(input: TunnelingEcStartsInput, settings = TUNNELING_EC_STARTS_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const { whole, run } = input;
  const at = parameterIndex(whole.hypothesis.seeds.length);
  const p0 = whole.loop.parameters;
  if (secondToFirstStepRatio(10 ** p0[at.logRateRatio]) > settings.maxSatelliteFraction || input.describes(whole)) return null;
  const ec0 = p0[at.chargingEnergy];
  const [minEc, maxEc] = [whole.start.minValues[at.chargingEnergy], whole.start.maxValues[at.chargingEnergy]];
  const starts = ecGridStartsEV(input.peaksV, input.peaksV, input.eta, settings).filter((ec) => ec > minEc && ec < maxEc && Math.abs(ec - ec0) > settings.sameEcFraction * ec0);
  let best: FitTrial | null = null;
  for (const ecEV of starts) {
    const from = [...p0];
    whole.hypothesis.seeds.forEach((_, j) => (from[j] = p0[j] - 0.5 * (ecEV - ec0)));
    from[at.chargingEnergy] = ecEV;
    const t = continueRun(run, whole, input.exploreIterations, undefined, { hypothesis: { ...whole.hypothesis, chargingEnergyStartEV: ecEV }, from });
    input.trials.push(t);
    if (!best || t.loop.chiSquare < best.loop.chiSquare) best = t;
  }
  if (!best || best.loop.chiSquare >= whole.loop.chiSquare) return null;
  const finished = continueRun(run, best, input.maxIterations);
  input.trials.push(finished);
  if (!input.describes(finished)) return null;
  const cb = continueRun(run, finished, input.maxIterations, input.cbSide);
  input.trials.push(cb);
  return input.acceptable(finished, cb) ? { cb, whole: finished } : null;
}
