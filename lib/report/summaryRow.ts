/**
 * One row of the batch summary table (`summary.csv` of `dotspec analyze --out`): the numbers
 * users tabulate per dot, from the JSON record of its analysis.
 */
import type { AnalysisJson } from "./analysisJson.ts";

/**
 * Columns of the summary table, in order. Units are in the names: `_V` bias-referred volts,
 * `_eV` energies after η, `_sigma_` one standard deviation.
 */
export const SUMMARY_COLUMNS = Object.freeze([
  "source",
  "regime",
  "gap_V",
  "gap_sigma_V",
  "Ec_V",
  "Ec_sigma_V",
  "single_particle_gap_V",
  "dSP_V",
  "dSP_sigma_V",
  "eta",
  "gap_eV",
  "Ec_eV",
  "single_particle_gap_eV",
  "dSP_eV",
  "n_peaks",
  "n_warnings",
] as const);

export type SummaryColumn = (typeof SUMMARY_COLUMNS)[number];

/** A summary row: text for source and regime, numbers (or null for an empty cell) elsewhere. */
export type SummaryRow = Record<SummaryColumn, string | number | null>;

/**
 * The summary row of one analysed curve.
 *
 * Parameters
 * ----------
 * json : AnalysisJson
 *     The record from {@link analysisToJson}.
 *
 * Returns
 * -------
 * SummaryRow
 *     Keys {@link SUMMARY_COLUMNS}. Bias-referred values and their 1σ in V; energies in eV after
 *     the η in the `eta` column (1 when η was not given, and then the energies equal the bias
 *     values); null where the analysis did not define a value (written as an empty CSV cell).
 *     `Ec` is the charging (addition) energy e²/CΣ, `dSP` the s–p level spacing.
 *
 * Example
 * -------
 * formatCsv(jsons.map(summaryRow), SUMMARY_COLUMNS);
 * // => "source,regime,gap_V,…\ndot-07.csv,shell-filling,1.4994,…\n"
 */
export function summaryRow(json: AnalysisJson): SummaryRow {
  const e = json.energies;
  return {
    source: json.source,
    regime: json.regime,
    gap_V: json.gapV,
    gap_sigma_V: json.uncertainties.gapV,
    Ec_V: json.chargingEnergyV,
    Ec_sigma_V: json.uncertainties.chargingEnergyV,
    single_particle_gap_V: json.singleParticleGapV,
    dSP_V: json.levelSpacingSPV,
    dSP_sigma_V: json.uncertainties.levelSpacingSPV,
    eta: e.eta,
    gap_eV: e.gapEV,
    Ec_eV: e.chargingEnergyEV,
    single_particle_gap_eV: e.singleParticleGapEV,
    dSP_eV: e.levelSpacingSPEV,
    n_peaks: json.peaks.length,
    n_warnings: json.warnings.length,
  };
}
