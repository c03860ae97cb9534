/**
 * One row of the batch summary table (`summary.csv` of `dotspec analyze --out`): the numbers
 * users tabulate per dot, from the JSON record of its analysis.
 */
import type { AnalysisJson } from "./analysisJson.ts";
import type { Provenance } from "./provenance.ts";

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
  "status",
  "reason",
  "n_notes",
  "tool_version",
  "input_bytes",
  "input_sha256",
  "options",
] as const);

/** A column of the summary table (one of {@link SUMMARY_COLUMNS}). */
export type SummaryColumn = (typeof SUMMARY_COLUMNS)[number];

/** Prefix of the columns that carry the file's own metadata lines (`meta_dot`, `meta_radius_nm`, …). */
export const SUMMARY_METADATA_PREFIX = "meta_";

/**
 * A summary row: text for source, regime, status and reason, numbers (or null for an empty cell)
 * elsewhere, plus one `meta_<key>` text cell per metadata line of the file.
 */
export type SummaryRow = Record<SummaryColumn, string | number | null> & { [metadata: `meta_${string}`]: string } & Partial<Record<ModelSummaryColumn, string | number | null>>;

/** Columns of the model comparison (`analyze --compare-models`), present when some row has one. */
export const MODEL_SUMMARY_COLUMNS = Object.freeze(["model_regime", "model_status", "model_Ec_eV", "model_Ec_sigma_eV", "model_rate_ratio", "model_rate_ratio_sigma", "model_rate_ratio_limit", "model_decides"] as const);
/** A column of {@link MODEL_SUMMARY_COLUMNS}. */
export type ModelSummaryColumn = (typeof MODEL_SUMMARY_COLUMNS)[number];

/**
 * The columns of a summary table holding these rows: {@link SUMMARY_COLUMNS}, then
 * {@link MODEL_SUMMARY_COLUMNS} when some row has a model comparison, then every `meta_<key>`
 * column that some row has, in order of first appearance.
 *
 * Parameters
 * ----------
 * rows : readonly SummaryRow[]
 *     The table's rows ({@link summaryRow}, {@link failedSummaryRow}).
 *
 * Returns
 * -------
 * string[]
 *     The column names, in table order.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * const rows = [summaryRow(analysisToJson(analyzeCurve(curve)))];
 * summaryColumns(rows).slice(0, 3); // => ["source", "regime", "gap_V"]
 * ```
 */
export function summaryColumns(rows: readonly SummaryRow[]): string[] {
  const meta = new Set<string>();
  for (const row of rows) for (const key of Object.keys(row)) if (key.startsWith(SUMMARY_METADATA_PREFIX)) meta.add(key);
  const model = rows.some((row) => MODEL_SUMMARY_COLUMNS[0] in row) ? MODEL_SUMMARY_COLUMNS : [];
  return [...SUMMARY_COLUMNS, ...model, ...meta];
}

/** The provenance cells of a row. */
function provenanceCells(p: Provenance | null | undefined) {
  return {
    tool_version: p ? p.version : null,
    input_bytes: p?.input ? p.input.bytes : null,
    input_sha256: p?.input ? p.input.sha256 : null,
    options: p ? JSON.stringify(p.options) : null,
  };
}

/** `meta_<key>` cells; a key is reduced to letters, digits and `_`. */
function metadataCells(metadata: Readonly<Record<string, string>> | undefined): Record<`meta_${string}`, string> {
  const out: Record<`meta_${string}`, string> = {};
  for (const [key, value] of Object.entries(metadata ?? {})) {
    out[`${SUMMARY_METADATA_PREFIX}${key.trim().replace(/[^A-Za-z0-9_]+/g, "_")}`] = value;
  }
  return out;
}

/**
 * The summary row of an input that failed: its name, status "failed" and the reason; the
 * quantities are empty.
 *
 * Parameters
 * ----------
 * source : string
 *     The input's name (file or path).
 * reason : string
 *     Why it failed, in one line (e.g. {@link failureReason}).
 * provenance : Provenance | null, optional
 *     The run's provenance for the row's columns; default null.
 *
 * Returns
 * -------
 * SummaryRow
 *     The row: status "failed", the reason, every quantity null.
 *
 * Example
 * -------
 * ```ts
 * failedSummaryRow("bad.csv", "line 12: 3 cells, expected 2");
 * // => { source: "bad.csv", regime: null, …, status: "failed", reason: "line 12: 3 cells, expected 2", … }
 * ```
 */
export function failedSummaryRow(source: string, reason: string, provenance: Provenance | null = null): SummaryRow {
  const row = {} as Record<string, string | number | null>;
  for (const c of SUMMARY_COLUMNS) row[c] = null;
  return { ...(row as SummaryRow), source, status: "failed", reason, ...provenanceCells(provenance) };
}

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
 *     `Ec` is the charging (addition) energy e²/CΣ, `dSP` the s–p level spacing. `status` is
 *     "ok" and `reason` empty (see {@link failedSummaryRow}); `tool_version`, `input_bytes`,
 *     `input_sha256` and `options` (JSON of the options as given) come from the record's
 *     provenance (empty without one); then one `meta_<key>` cell per metadata line of the file.
 *
 * Example
 * -------
 * ```ts
 * const jsons = ["sample-curves/dot-01.csv", "sample-curves/dot-02.tsv"].map((file) => analysisToJson(analyzeCurve(readCurveFile(file).curve)));
 * const rows = jsons.map(summaryRow);
 * formatCsv(rows, summaryColumns(rows)).split("\n")[1].slice(0, 40);
 * // => "sample-curves/dot-01.csv,shell-filling,3"
 * ```
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
    status: "ok",
    reason: null,
    n_notes: json.notes?.length ?? 0,
    ...provenanceCells(json.provenance),
    ...modelCells(json.modelComparison),
    ...metadataCells(json.metadata),
  };
}

/** The model-comparison cells of a row (none when the comparison did not run; empty values when it found no fit). */
function modelCells(m: AnalysisJson["modelComparison"]): Partial<Record<ModelSummaryColumn, string | number | null>> {
  if (!m) return {};
  const ok = m.status !== "failed";
  return {
    model_regime: ok ? m.regime : null,
    model_status: m.status,
    model_Ec_eV: ok ? (m.quantities.chargingEnergyEV?.value ?? null) : null,
    model_Ec_sigma_eV: ok ? (m.quantities.chargingEnergyEV?.standardError ?? null) : null,
    // Where Γtip/Γsub ran onto a bound of the fit, the one-sided limit the curve sets (model_rate_ratio_limit
    // "lower": Γtip/Γsub ≥ model_rate_ratio; "upper": ≤), with no σ; empty otherwise.
    model_rate_ratio: ok ? (m.rateRatioLimit?.rateRatio ?? m.rateRatio?.value ?? null) : null,
    model_rate_ratio_sigma: ok && !m.rateRatioLimit ? (m.rateRatio?.standardError ?? null) : null,
    model_rate_ratio_limit: ok ? (m.rateRatioLimit?.kind ?? null) : null,
    // "yes" where the record stands by the fit over the rules' reading (comparisonDecision), "no"
    // where it stands by the rules; empty for a comparison made without that weighing.
    model_decides: m.decides === undefined ? null : m.decides ? "yes" : "no",
  };
}
