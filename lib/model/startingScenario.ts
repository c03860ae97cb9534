/**
 * A complete model scenario read from a peak-based analysis: the start of the fit, with a rate
 * scale that matches the measured current. The notebooks draw it over the curve and let the user
 * move its parameters; `simulateCurve` turns it into a curve.
 */
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import { bandLadders, currentSteps, fastCurrent, type DotModel } from "./bandCurrent.ts";
import { fitStart, type FitOptions } from "./fit/index.ts";
import { parseScenario, type Level, type Scenario } from "./scenario.ts";
import { checkKnownKeys } from "../util/check.ts";

/** Options of {@link startingScenario}. */
export interface StartingScenarioOptions {
  /** Voltage-division factor η. Default: the analysis' η. */
  eta?: number;
  /** Temperature in K. Default 4.5 (`FIT_DEFAULTS.temperatureK`). */
  temperatureK?: number;
  /** Ec in eV where the peaks do not give one (outside shell filling). Default 0.1. */
  chargingEnergyGuessEV?: number;
}

/** Defaults of {@link startingScenario} (locked by a test). */
export const STARTING_SCENARIO_DEFAULTS = Object.freeze({
  /** Relaxation rate inside the dot, as a multiple of the faster tunnelling rate (as in the fit). */
  relaxationRateFactor: 1000,
  /** Substrate rate used when the measured current gives no positive scale, 1/s. */
  fallbackSubstrateRatePerS: 1e8,
});

/**
 * The scenario the fit starts from, with its rates scaled to the measured current.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     From {@link analyzeCurve}.
 * options : StartingScenarioOptions, optional
 *     `eta` (default the analysis' η), `temperatureK` (default 4.5 K), `chargingEnergyGuessEV`
 *     (default 0.1 eV, outside shell filling).
 *
 * Returns
 * -------
 * Scenario
 *     Validated by {@link parseScenario}: the levels, Ec, Γtip/Γsub and broadening of
 *     {@link fitStart}; Γsub such that the model current best matches the measured one; the bias
 *     axis of the analysed curve; no noise, no lock-in.
 *
 * Throws
 * ------
 * DotspecError
 *     `fit/no-levels` when the assignment gives no level; the errors of {@link parseScenario}.
 *
 * Notes
 * -----
 * 1. Levels, Ec, rate ratio r and broadening σ from {@link fitStart} (CB levels at +|ε|, VB
 *    levels at −|ε|, each band in filling order).
 * 2. Model current u(V) of the fast form at Γsub = 1/s, Γtip = r/s (every current of the master
 *    equation scales with a common factor of all rates).
 * 3. Γsub = Σ u·I / Σ u² over the offset-corrected measured current I (least squares for one
 *    factor); Γtip = r·Γsub.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * const scenario = startingScenario(analyzeCurve(curve, { eta: 0.8 }));
 * simulateCurve(scenario, { method: "fast" }).biasV.length; // => 2000
 * ```
 */
export function startingScenario(analysis: CurveAnalysis, options: StartingScenarioOptions = {}): Scenario {
  checkKnownKeys("startingScenario options", options, ["eta", "temperatureK", "chargingEnergyGuessEV"]);
  const D = STARTING_SCENARIO_DEFAULTS;
  const start = fitStart(analysis, options as FitOptions);
  const cb: Level[] = [];
  const vb: Level[] = [];
  start.seeds.forEach((s, j) => (s.band === "CB" ? cb : vb).push({ energyEV: s.band === "CB" ? start.levelMagnitudesEV[j] : -start.levelMagnitudesEV[j], degeneracy: s.degeneracy }));
  cb.sort((a, b) => a.energyEV - b.energyEV);
  vb.sort((a, b) => b.energyEV - a.energyEV);
  const { eta, temperatureK, rateRatio, chargingEnergyEV, broadeningEV } = start;
  const unit: DotModel = {
    cb,
    vb,
    chargingEnergyEV,
    eta,
    tipRatePerS: rateRatio,
    substrateRatePerS: 1,
    relaxationRatePerS: D.relaxationRateFactor * Math.max(rateRatio, 1),
    temperatureK,
  };
  const sig = analysis.conductance;
  const u = fastCurrent(currentSteps(unit, bandLadders(unit)), sig.biasV, broadeningEV / eta);
  let uu = 0;
  let ui = 0;
  for (let i = 0; i < u.length; i++) {
    uu += u[i] * u[i];
    ui += u[i] * sig.currentA[i];
  }
  const scale = uu > 0 && ui > 0 && Number.isFinite(ui / uu) ? ui / uu : D.fallbackSubstrateRatePerS;
  const n = sig.biasV.length;
  return parseScenario({
    cb,
    vb,
    chargingEnergyEV,
    eta,
    tipRatePerS: rateRatio * scale,
    substrateRatePerS: scale,
    temperatureK,
    broadeningEV,
    relaxationRatePerS: D.relaxationRateFactor * Math.max(rateRatio, 1) * scale,
    bias: { fromV: sig.biasV[0], toV: sig.biasV[n - 1], stepV: sig.stepV },
    noise: null,
  });
}
