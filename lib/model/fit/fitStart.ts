/**
 * Where the model fit starts, as physical values: the levels, Ec, rate ratio and broadening read
 * from the peak-based assignment. The notebooks draw the model from it before any fit.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import { checkEta, checkPositive } from "../../util/check.ts";
import { DotspecError } from "../../util/errors.ts";
import type { FitOptions } from "./fitCurve.ts";
import { FIT_DEFAULTS } from "./fitDefaults.ts";
import { levelsToFit, type LevelSeed } from "./levelsToFit.ts";
import { startingValues } from "./startingValues.ts";

/** Where {@link fitCurve} starts: the levels and parameters read from the peak-based assignment. */
export interface FitStart {
  /** Levels in the order of the assignment (CB then VB), each with its band, label and degeneracy. */
  seeds: LevelSeed[];
  /** |ε| of each seed in eV, same order (CB levels at +ε, VB levels at −ε). */
  levelMagnitudesEV: number[];
  /** Starting charging energy Ec, eV. */
  chargingEnergyEV: number;
  /** Starting Γtip/Γsub. */
  rateRatio: number;
  /** Starting Gaussian level broadening σ, eV. */
  broadeningEV: number;
  /** η used (held fixed by the fit). */
  eta: number;
  /** Temperature, K. */
  temperatureK: number;
}

/**
 * The start of {@link fitCurve}: levels, Ec, rate ratio and broadening from an analysis.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     From `analyzeCurve`.
 * options : FitOptions, optional
 *     `eta` (default the analysis' η), `temperatureK` (default FIT_DEFAULTS.temperatureK),
 *     `chargingEnergyGuessEV` (default FIT_DEFAULTS.chargingEnergyGuessEV, used outside shell
 *     filling); other fields are ignored here.
 *
 * Returns
 * -------
 * FitStart
 *     The seeds of {@link levelsToFit} and the starting values of {@link startingValues} in
 *     physical units.
 *
 * Throws
 * ------
 * DotspecError
 *     `fit/no-levels` when the assignment gives no level; the checks of `eta` and `temperatureK`.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * fitStart(analyzeCurve(curve, { eta: 0.85 })).seeds.map((s) => s.label); // => ["s", "p", "v1", "v2"]
 * ```
 */
export function fitStart(analysis: CurveAnalysis, options: FitOptions = {}): FitStart {
  const F = FIT_DEFAULTS;
  const eta = options.eta === undefined ? analysis.assignment.energies.eta : checkEta("eta", options.eta);
  const temperatureK = checkPositive("temperatureK", options.temperatureK ?? F.temperatureK);
  const seeds = levelsToFit(analysis);
  if (!seeds.length) {
    throw new DotspecError("fit/no-levels", `${analysis.source}: the assignment has no multiplets to start the fit from (regime ${analysis.assignment.regime}); nothing to fit`);
  }
  const p0 = startingValues(analysis, seeds, eta, options.chargingEnergyGuessEV ?? F.chargingEnergyGuessEV).initialValues;
  const nl = seeds.length;
  return {
    seeds,
    levelMagnitudesEV: p0.slice(0, nl),
    chargingEnergyEV: p0[nl],
    rateRatio: 10 ** p0[nl + 1],
    broadeningEV: 10 ** p0[nl + 2],
    eta,
    temperatureK,
  };
}
