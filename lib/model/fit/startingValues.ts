/**
 * Where the model fit starts and how far each parameter may go: from the assignment and the
 * measured peak width.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import type { LevelSeed } from "./levelsToFit.ts";

/** Start, bounds and difference steps of the nonlinear parameters ({@link parameterIndex} layout). */
export interface StartingValues {
  /** Start: |ε_j| per level (eV), Ec (eV), log₁₀(Γtip/Γsub), log₁₀ σ (σ in eV). */
  initialValues: number[];
  /** Lower bound of each parameter, same units. */
  minValues: number[];
  /** Upper bound of each parameter, same units. */
  maxValues: number[];
  /** Finite-difference step of each parameter, same units. */
  gradientDifference: number[];
}

/**
 * Starting values, bounds and difference steps of the nonlinear fit parameters.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis: regime, Ec (eV, or null) and the measured peak width (mV).
 * seeds : readonly LevelSeed[]
 *     The levels to fit ({@link levelsToFit}).
 * eta : number
 *     Voltage-division factor η.
 * chargingEnergyGuessEV : number
 *     Starting Ec in eV where the analysis gives none (shell tunnelling).
 * start : { chargingEnergyEV?: number | null; rateRatioLog10?: number | null }, optional
 *     A hypothesis' own Ec₀ (eV) and log₁₀ Γtip/Γsub to start from instead of the analysis'
 *     (null or absent: the analysis' values).
 *
 * Returns
 * -------
 * StartingValues
 *     `{ initialValues, minValues, maxValues, gradientDifference }`, one entry per nonlinear
 *     parameter.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Ec₀ = start.chargingEnergyEV, else the analysis' Ec, else chargingEnergyGuessEV.
 * 2. Level j: |ε_j| = η·|V_first| − Ec₀·(N_before + ½) (shell filling: N_before carriers of the
 *    band already in; shell tunnelling: N_before = 0).
 * 3. Γtip/Γsub = 10^start.rateRatioLog10, else 10 (shell filling), 0.02 (shell tunnelling) or 1
 *    (undetermined).
 * 4. σ₀ = max(0.1 meV, η·W/2.3548), W the measured dI/dV peak FWHM in V.
 * 5. Bounds: each level within its reach of the start, the reach being min(0.2 eV, 0.45 × the
 *    distance to any other start of the same band) but at least 3σ₀, so levels cannot swap places;
 *    Ec in [0.1 meV, 2 eV]; log₁₀ r in [−4, 4]; log₁₀ σ in [−4, log₁₀ 0.5].
 * 6. Difference steps: 0.1 meV for the levels and Ec, 1e-3 for the logarithms.
 *
 * Example
 * -------
 * ```ts
 * // analysis: the analyzeCurve result of the fitCurve example (Ec 0.1 eV, η 0.85, s at 0.6 eV).
 * startingValues(analysis, levelsToFit(analysis), 0.85, 0.1).initialValues.slice(0, 1);
 * // => [0.600] (eV: η·V_s1 − Ec/2)
 * ```
 */
export function startingValues(
  analysis: CurveAnalysis,
  seeds: readonly LevelSeed[],
  eta: number,
  chargingEnergyGuessEV: number,
  start: { chargingEnergyEV?: number | null; rateRatioLog10?: number | null } = {},
): StartingValues {
  const filling = analysis.assignment.regime === "shell-filling";
  const ec0 = start.chargingEnergyEV ?? analysis.assignment.energies.chargingEnergyEV ?? chargingEnergyGuessEV;
  const levels0 = seeds.map((s) => eta * Math.abs(s.firstPeakV) - ec0 * (s.before + 0.5));
  const ratio0 = start.rateRatioLog10 != null ? 10 ** start.rateRatioLog10 : filling ? 10 : analysis.assignment.regime === "shell-tunneling" ? 0.02 : 1;
  const sigma0 = Math.max(1e-4, ((analysis.settings.peakWidthMV / 1000) * eta) / 2.3548);
  // Nonlinear parameters: |ε| per level, Ec, log10 r, log10 σ.
  const initialValues = [...levels0, ec0, Math.log10(ratio0), Math.log10(sigma0)];
  // Each level stays within reach of its start, short of its neighbours in the same band, so
  // levels cannot swap places; the reach is a few peak widths.
  const reach = levels0.map((e, j) => {
    let room = 0.2;
    levels0.forEach((f, k) => {
      if (k !== j && seeds[k].band === seeds[j].band) room = Math.min(room, 0.45 * Math.abs(f - e));
    });
    return Math.max(room, 3 * sigma0);
  });
  const minValues = [...levels0.map((e, j) => e - reach[j]), 1e-4, -4, -4];
  const maxValues = [...levels0.map((e, j) => e + reach[j]), 2, 4, Math.log10(0.5)];
  const gradientDifference = [...levels0.map(() => 1e-4), 1e-4, 1e-3, 1e-3];
  return { initialValues, minValues, maxValues, gradientDifference };
}
