/**
 * The JSON record of a model fit: what `dotspec fit --json` prints (one per file).
 * Bias-referred values in volts (ε/η, Ec/η), energies in eV alongside.
 */
import type { CurveFit, FittedValue } from "../model/fit/fitCurve.ts";
import type { AnalysisJson } from "./analysisJson.ts";

export interface FitJson {
  source: string;
  converged: boolean;
  message: string;
  iterations: number;
  eta: number;
  /** Ec/η, V. */
  chargingEnergyV: number;
  chargingEnergyVSE: number;
  /** Γtip/Γsub. */
  rateRatio: number;
  rateRatioSE: number;
  /** Regime implied by the fitted rate ratio. */
  regime: CurveFit["regime"];
  /** Level energies referred to bias, ε/η, V, per band from the gap edge. */
  levelsV: { CB: number[]; VB: number[] };
  reducedChiSquare: number;
  energies: {
    chargingEnergyEV: FittedValue;
    broadeningEV: FittedValue;
    levels: { band: "CB" | "VB"; label: string; degeneracy: number; energyEV: FittedValue; energyV: FittedValue }[];
  };
  substrateRatePerS: FittedValue;
  offsetA: FittedValue;
  backgroundLinearS: FittedValue;
  backgroundCubicAPerV3: FittedValue;
  /** Data, model and residual on the points fitted (for a residual plot). */
  residuals: { biasV: number[]; currentA: number[]; modelA: number[]; residualA: number[] };
  /** The peak-based result the fit started from (and the answer to use when it did not converge). */
  peakBased: AnalysisJson;
  warnings: string[];
}

const round = (v: number) => Number(v.toPrecision(8));

/**
 * Turns a fit into its JSON record.
 *
 * @param fit - from fitCurve.
 * @param peakBased - the analysis record it started from (analysisToJson).
 */
export function fitToJson(fit: CurveFit, peakBased: AnalysisJson): FitJson {
  const band = (b: "CB" | "VB") =>
    fit.levels
      .filter((l) => l.band === b)
      .map((l) => l.energyV.value)
      .sort((x, y) => (b === "CB" ? x - y : y - x));
  return {
    source: fit.source,
    converged: fit.converged,
    message: fit.message,
    iterations: fit.iterations,
    eta: fit.eta,
    chargingEnergyV: fit.chargingEnergyV.value,
    chargingEnergyVSE: fit.chargingEnergyV.standardError,
    rateRatio: fit.rateRatio.value,
    rateRatioSE: fit.rateRatio.standardError,
    regime: fit.regime,
    levelsV: { CB: band("CB"), VB: band("VB") },
    reducedChiSquare: fit.reducedChiSquare,
    energies: {
      chargingEnergyEV: fit.chargingEnergyEV,
      broadeningEV: fit.broadeningEV,
      levels: fit.levels.map((l) => ({ ...l })),
    },
    substrateRatePerS: fit.substrateRatePerS,
    offsetA: fit.offsetA,
    backgroundLinearS: fit.backgroundLinearS,
    backgroundCubicAPerV3: fit.backgroundCubicAPerV3,
    residuals: {
      biasV: Array.from(fit.residuals.biasV, round),
      currentA: Array.from(fit.residuals.currentA, round),
      modelA: Array.from(fit.residuals.modelA, round),
      residualA: Array.from(fit.residuals.residualA, round),
    },
    peakBased,
    warnings: fit.warnings,
  };
}

/** A readable report of a fit, for the terminal. */
export function formatFitText(fit: FitJson): string {
  const pm = (v: FittedValue, scale = 1, digits = 4) =>
    `${(v.value * scale).toFixed(digits)} ± ${Number.isFinite(v.standardError) ? (v.standardError * scale).toFixed(digits) : "—"}`;
  const lines: string[] = [];
  lines.push(`${fit.source}  ·  model fit ${fit.converged ? "converged" : "DID NOT CONVERGE"}  ·  η = ${fit.eta} (held fixed)`);
  lines.push(`  ${fit.message}; ${fit.iterations} iterations; reduced χ² = ${fit.reducedChiSquare.toFixed(2)}`);
  if (!fit.converged) lines.push("  The peak-based result (dotspec analyze) stands; the values below are the best the fit reached.");
  lines.push("");
  lines.push(`  Ec                 = ${pm(fit.energies.chargingEnergyEV, 1000, 2)} meV   (${pm({ value: fit.chargingEnergyV, standardError: fit.chargingEnergyVSE }, 1000, 2)} mV of bias)`);
  lines.push(`  Γtip/Γsub          = ${fit.rateRatio.toPrecision(3)} ± ${fit.rateRatioSE.toPrecision(2)}  →  ${fit.regime}`);
  lines.push(`  Γsub               = ${fit.substrateRatePerS.value.toExponential(3)} /s`);
  lines.push(`  broadening σ       = ${pm(fit.energies.broadeningEV, 1000, 2)} meV`);
  lines.push("");
  lines.push("  Levels  (energy relative to the Fermi level at zero bias)");
  for (const l of fit.energies.levels) {
    lines.push(`    ${l.band} ${l.label.padEnd(4)} g = ${String(l.degeneracy).padStart(2)}   ε = ${pm(l.energyEV, 1, 4)} eV   (${pm(l.energyV, 1, 4)} V of bias)`);
  }
  if (fit.warnings.length) {
    lines.push("");
    lines.push(`  Warnings (${fit.warnings.length})`);
    for (const w of fit.warnings) lines.push(`    ! ${w}`);
  }
  return lines.join("\n") + "\n";
}
