/**
 * The scenario of a fitted dot: a fit's levels, charging energy, rates and broadening as a
 * scenario that `simulateCurve` draws (and `dotspec simulate --config` reads).
 */
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import type { CurveFit } from "./fit/index.ts";
import { FIT_DEFAULTS } from "./fit/index.ts";
import { parseScenario, type Level, type Scenario } from "./scenario.ts";
import { checkKnownKeys, checkPositive } from "../util/check.ts";

/** Options of {@link fittedScenario}. */
export interface FittedScenarioOptions {
  /** Temperature in K. Default 4.5 (`FIT_DEFAULTS.temperatureK`, the fit's default). */
  temperatureK?: number;
}

/**
 * A fit as a scenario over the analysed curve's bias axis.
 *
 * Parameters
 * ----------
 * fit : CurveFit
 *     From {@link fitCurve}.
 * analysis : CurveAnalysis
 *     The analysis the fit started from: its bias axis becomes the scenario's.
 * options : FittedScenarioOptions, optional
 *     `temperatureK` (default 4.5 K).
 *
 * Returns
 * -------
 * Scenario
 *     Validated by {@link parseScenario}: the fitted level energies and degeneracies (each band in
 *     filling order), Ec, η, Γsub = the fitted rate scale and Γtip = Γtip/Γsub × Γsub, the fitted
 *     broadening; relaxation at its default; no noise, no lock-in. The fit's offset and smooth
 *     background are not part of a dot and are left out.
 *
 * Throws
 * ------
 * DotspecError
 *     The errors of {@link parseScenario} (for example a fitted rate scale that is not positive).
 *
 * Notes
 * -----
 * 1. The fit's model at unit substrate rate has Γtip = r and relaxation 1000·max(r, 1); every
 *    current scales with a common factor of all rates, so multiplying them by the fitted scale
 *    gives the same current as the fit's dot: `simulateCurve(fittedScenario(fit, analysis),
 *    { method: "fast" })` is the fitted model less its offset and background.
 *
 * Example
 * -------
 * ```ts
 * const analysis = analyzeCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * const fit = fitCurve(analysis);
 * const curve = simulateCurve({ ...fittedScenario(fit, analysis), noise: { relative: 0.003, seed: 1 } });
 * curve.biasV.length; // => 2000
 * ```
 */
export function fittedScenario(fit: CurveFit, analysis: CurveAnalysis, options: FittedScenarioOptions = {}): Scenario {
  checkKnownKeys("fittedScenario options", options, ["temperatureK"]);
  const temperatureK = checkPositive("temperatureK", options.temperatureK ?? FIT_DEFAULTS.temperatureK);
  const cb: Level[] = [];
  const vb: Level[] = [];
  for (const l of fit.levels) (l.band === "CB" ? cb : vb).push({ energyEV: l.energyEV.value, degeneracy: l.degeneracy });
  cb.sort((a, b) => a.energyEV - b.energyEV);
  vb.sort((a, b) => b.energyEV - a.energyEV);
  const substrateRatePerS = fit.substrateRatePerS.value;
  const sig = analysis.conductance;
  return parseScenario({
    cb,
    vb,
    chargingEnergyEV: fit.chargingEnergyEV.value,
    eta: fit.eta,
    tipRatePerS: fit.rateRatio.value * substrateRatePerS,
    substrateRatePerS,
    temperatureK,
    broadeningEV: fit.broadeningEV.value,
    bias: { fromV: sig.biasV[0], toV: sig.biasV[sig.biasV.length - 1], stepV: sig.stepV },
    noise: null,
  });
}
