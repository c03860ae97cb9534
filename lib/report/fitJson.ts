/**
 * The JSON record of a model fit: what `dotspec fit --json` prints (one per file).
 * Bias-referred values in volts (ε/η, Ec/η), energies in eV alongside.
 */
import { formatEta } from "./formatUncertain.ts";
import type { CurveFit, FittedValue } from "../model/fit/fitCurve.ts";
import type { AnalysisJson } from "./analysisJson.ts";

/** The JSON record of one fitted curve: what `dotspec fit --json` prints per file and `--out` writes as <name>.fit.json. */
export interface FitJson {
  source: string;
  /** "good", "poor" or "failed" (no fit: do not use the values), from χ² and the parameter errors. */
  status: CurveFit["status"];
  statusReasons: string[];
  /** The grouping of the peaks the values come from, and every start tried with its BIC weight. */
  hypothesis: CurveFit["hypothesis"];
  /** Why that hypothesis won, in words. */
  evidence: string[];
  alternatives: CurveFit["alternatives"];
  /**
   * The quantities the fit implies, in eV, beside the peak-based ones (`peakBased.energies`):
   * gap = ε_s + |ε_v1| + Ec (the first carrier of each band), Ec, Δsp = ε_p − ε_s; 1σ from the
   * level and Ec errors in quadrature (their correlations neglected); null where the fit has no
   * such level.
   */
  quantities: { gapEV: FittedValue | null; chargingEnergyEV: FittedValue; levelSpacingSPEV: FittedValue | null };
  converged: boolean;
  message: string;
  iterations: number;
  /**
   * The work of the whole fit and its limits: model evaluations used, the work budget
   * (maxEvaluations, the same on every machine), the opt-in time limit (ms or null) and what cut
   * the fit short ("budget", "time" or null). `--replay` re-runs with this budget.
   */
  work: CurveFit["work"];
  eta: number;
  /** Ec/η, V. */
  chargingEnergyV: number;
  chargingEnergyVSE: number;
  /** Γtip/Γsub. */
  rateRatio: number;
  rateRatioSE: number;
  /** Where Γtip/Γsub ran onto a bound of the fit: the one-sided limit the curve sets on it (kind "lower": Γtip/Γsub ≥ rateRatio; "upper": ≤); null otherwise. */
  rateRatioLimit: CurveFit["rateRatioLimit"];
  /** Regime implied by the fitted rate ratio and its error ("undetermined" when they cannot tell, or no fit). */
  regime: CurveFit["regime"];
  /** Why, in words. */
  regimeReason: string;
  /** Level energies referred to bias, ε/η, V, per band from the gap edge. */
  levelsV: { CB: number[]; VB: number[] };
  reducedChiSquare: number;
  /**
   * The most structured stretch of the residuals, a peak's width long: the largest |Σ r|/√w in
   * noise units (about N(0, 1) for noise alone), where (bias, V) and over how many points.
   */
  residualStructure: CurveFit["residualStructure"];
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
 * Parameters
 * ----------
 * fit : CurveFit
 *     From fitCurve.
 * peakBased : AnalysisJson
 *     The analysis record it started from (analysisToJson).
 *
 * Returns
 * -------
 * FitJson
 *     The fit's record, plain JSON values only (see {@link FitJson}).
 *
 * Example
 * -------
 * ```ts
 * const analysis = analyzeCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * const json = fitToJson(fitCurve(analysis), analysisToJson(analysis));
 * json.regime; // => "shell-filling"
 * json.status; // => "good"
 * ```
 */
export function fitToJson(fit: CurveFit, peakBased: AnalysisJson): FitJson {
  const band = (b: "CB" | "VB") =>
    fit.levels
      .filter((l) => l.band === b)
      .map((l) => l.energyV.value)
      .sort((x, y) => (b === "CB" ? x - y : y - x));
  const first = (band: "CB" | "VB", prefix: string) => fit.levels.find((l) => l.band === band && l.label.startsWith(prefix));
  const s1 = first("CB", "s"), p1 = first("CB", "p"), v1 = first("VB", "v");
  const sum = (parts: FittedValue[], signs: number[]): FittedValue => ({
    value: parts.reduce((acc, x, i) => acc + signs[i] * x.value, 0),
    standardError: Math.hypot(...parts.map((x) => x.standardError)),
  });
  return {
    source: fit.source,
    status: fit.status,
    statusReasons: fit.statusReasons,
    hypothesis: fit.hypothesis,
    evidence: fit.evidence,
    alternatives: fit.alternatives,
    quantities: {
      gapEV: s1 && v1 ? sum([s1.energyEV, v1.energyEV, fit.chargingEnergyEV], [1, -1, 1]) : null,
      chargingEnergyEV: fit.chargingEnergyEV,
      levelSpacingSPEV: s1 && p1 ? sum([p1.energyEV, s1.energyEV], [1, -1]) : null,
    },
    converged: fit.converged,
    message: fit.message,
    iterations: fit.iterations,
    work: { ...fit.work },
    eta: fit.eta,
    chargingEnergyV: fit.chargingEnergyV.value,
    chargingEnergyVSE: fit.chargingEnergyV.standardError,
    rateRatio: fit.rateRatio.value,
    rateRatioSE: fit.rateRatio.standardError,
    rateRatioLimit: fit.rateRatioLimit,
    regime: fit.regime,
    regimeReason: fit.regimeReason,
    levelsV: { CB: band("CB"), VB: band("VB") },
    reducedChiSquare: fit.reducedChiSquare,
    residualStructure: { ...fit.residualStructure },
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

/**
 * A readable report of a fit, for the terminal.
 *
 * Parameters
 * ----------
 * fit : FitJson
 *     A fit's record ({@link fitToJson}).
 *
 * Returns
 * -------
 * string
 *     Lines of text, each ending in a line end: the headline (source, regime, η), the status and
 *     its reasons, the fitted levels and parameters with their standard errors, the warnings.
 *
 * Example
 * -------
 * ```ts
 * const analysis = analyzeCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * formatFitText(fitToJson(fitCurve(analysis), analysisToJson(analysis))).split("\n")[0];
 * // => "sample-curves/dot-01.csv  ·  model fit: good  ·  η = 1 (held fixed)"
 * ```
 */
export function formatFitText(fit: FitJson): string {
  const pm = (v: FittedValue, scale = 1, digits = 4) =>
    `${(v.value * scale).toFixed(digits)} ± ${Number.isFinite(v.standardError) ? (v.standardError * scale).toFixed(digits) : "—"}`;
  const lines: string[] = [];
  const headline = fit.status === "good" ? "model fit: good" : fit.status === "poor" ? "model fit: POOR" : "NO FIT";
  lines.push(`${fit.source}  ·  ${headline}  ·  η = ${formatEta(fit.eta)} (held fixed)`);
  lines.push(`  ${fit.statusReasons.join("; ")}`);
  const work = fit.work ? `; ${fit.work.evaluations.toLocaleString("en-US")} of ${fit.work.maxEvaluations.toLocaleString("en-US")} model evaluations (work budget)` : "";
  lines.push(`  ${fit.message}; ${fit.iterations} iterations${work}; reduced χ² = ${fit.reducedChiSquare.toFixed(2)}; ${fit.alternatives.length} start${fit.alternatives.length === 1 ? "" : "s"} tried, values from the ${fit.hypothesis === "assigned" ? "assignment's grouping" : fit.hypothesis + " grouping"}`);
  if (fit.status === "failed") {
    // BIC compares only runs on the same points: the whole-curve runs where there are any.
    const whole = fit.alternatives.filter((a) => a.side === "both");
    const best = (whole.length ? whole : fit.alternatives).reduce((a, b) => (b.bic < a.bic ? b : a));
    lines.push(`  No start describes the curve (best reduced χ² ${best.reducedChiSquare.toPrecision(4)}, from Γtip/Γsub = ${best.rateRatioStart.toPrecision(2)}); the peak-based result (dotspec analyze) stands.`);
    if (fit.warnings.length) {
      lines.push("");
      lines.push(`  Warnings (${fit.warnings.length})`);
      for (const w of fit.warnings) lines.push(`    ! ${w}`);
    }
    return lines.join("\n") + "\n";
  }
  if (!fit.converged) lines.push("  The peak-based result (dotspec analyze) stands; the values below are the best the fit reached.");
  lines.push("");
  lines.push("  Levels  (energy relative to the Fermi level at zero bias)");
  for (const l of fit.energies.levels) {
    lines.push(`    ${l.band} ${l.label.padEnd(4)} g = ${String(l.degeneracy).padStart(2)}   ε = ${pm(l.energyEV, 1, 4)} eV   (${pm(l.energyV, 1, 4)} V of bias)`);
  }
  lines.push("");
  lines.push("  Quantities (eV)         fit                 peaks (dotspec analyze)");
  const pe = fit.peakBased.energies;
  const row = (name: string, f: FittedValue | null, v: number | null, sv: number | null) =>
    `    ${name.padEnd(20)} ${(f ? pm(f, 1, 4) : "—").padEnd(19)} ${v === null ? "—" : `${v.toFixed(4)} ± ${sv === null ? "—" : sv.toFixed(4)}`}`;
  lines.push(row("gap", fit.quantities.gapEV, pe.gapEV, pe.uncertainties.gapEV));
  lines.push(row("Ec", fit.quantities.chargingEnergyEV, pe.chargingEnergyEV, pe.uncertainties.chargingEnergyEV));
  lines.push(row("Δsp", fit.quantities.levelSpacingSPEV, pe.levelSpacingSPEV, pe.uncertainties.levelSpacingSPEV));
  lines.push("");
  lines.push(`  Ec                 = ${pm(fit.energies.chargingEnergyEV, 1000, 2)} meV   (${pm({ value: fit.chargingEnergyV, standardError: fit.chargingEnergyVSE }, 1000, 2)} mV of bias)`);
  lines.push(`  Γtip/Γsub          ${ratioText(fit.rateRatio, fit.rateRatioSE, fit.rateRatioLimit)}  →  ${fit.regime}`);
  lines.push(`  Γsub               = ${fit.substrateRatePerS.value.toExponential(3)} ± ${Number.isFinite(fit.substrateRatePerS.standardError) ? fit.substrateRatePerS.standardError.toExponential(1) : "—"} /s`);
  lines.push(`  broadening σ       = ${pm(fit.energies.broadeningEV, 1000, 2)} meV`);
  lines.push(`  regime: ${fit.regimeReason}`);
  if (fit.evidence.length > 1) {
    lines.push("");
    lines.push("  Why this grouping");
    for (const e of fit.evidence) lines.push(`    ${e}`);
  }
  if (fit.warnings.length) {
    lines.push("");
    lines.push(`  Warnings (${fit.warnings.length})`);
    for (const w of fit.warnings) lines.push(`    ! ${w}`);
  }
  return lines.join("\n") + "\n";
}

/**
 * Γtip/Γsub as the text shows it: "= r ± σ", or where it ran onto a bound of the fit the
 * one-sided limit the curve sets ("≥ 12.5 (one-sided 95 %, on the fit's bound)").
 *
 * Example
 * -------
 * ```ts
 * ratioText(1e4, Infinity, { kind: "lower", rateRatio: 12.5, chiSquareRise: 2.71 }); // => "≥ 12.5 (one-sided 95 %; the fit ran onto its bound 1.0e+4)"
 * ratioText(3.2, 0.15, null);                                                       // => "= 3.20 ± 0.15"
 * ```
 */
export function ratioText(rateRatio: number, standardError: number, limit: FitJson["rateRatioLimit"]): string {
  if (limit) return `${limit.kind === "lower" ? "≥" : "≤"} ${limit.rateRatio.toPrecision(3)} (one-sided 95 %; the fit ran onto its bound ${rateRatio.toExponential(1)})`;
  return `= ${rateRatio.toPrecision(3)} ± ${standardError.toPrecision(2)}`;
}
