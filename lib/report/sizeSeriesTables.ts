/**
 * The CSV tables of a size series (`dotspec sizes --out`): one row per curve, per dot, per size
 * bin and per model fit.
 */
import type { CellValue } from "../io/formatCsv.ts";
import type { SeriesCurveInput } from "../sizes/sizeSeries.ts";
import type { SizeSeriesJson } from "./sizeSeriesJson.ts";

/** A table: its columns in order and its rows. */
export interface SizeTable {
  columns: string[];
  rows: Record<string, CellValue>[];
}

/** The four tables. */
export interface SizeSeriesTables {
  curves: SizeTable;
  dots: SizeTable;
  bins: SizeTable;
  fits: SizeTable;
}

/** File names of the tables in the report folder. */
export const SIZE_TABLE_FILES = Object.freeze({
  curves: "sizes-curves.csv",
  dots: "sizes-dots.csv",
  bins: "sizes-bins.csv",
  fits: "sizes-fits.csv",
});

const SCALARS = ["gap", "chargingEnergy", "singleParticleGap", "levelSpacingSP"] as const;
const BIN_KEYS = ["gapEV", "singleParticleGapEV", "chargingEnergyEV", "levelSpacingSPEV", "valenceSpacing1EV"] as const;

/**
 * Builds the CSV tables of a series.
 *
 * Parameters
 * ----------
 * series : SizeSeriesJson
 *     From sizeSeriesToJson.
 * curves : SeriesCurveInput[]
 *     The analysed curves the series was made from (for the per-curve table).
 *
 * Returns
 * -------
 * SizeSeriesTables
 *     - curves: file, dot, radius_nm (empty when unassigned), status (`used`, `flagged: …`,
 *       `unassigned: reason`), regime, eta, the bias values (V) and energies (eV) with their 1σ,
 *       VB spacings joined by `;`;
 *     - dots: dot, radius_nm, curves, regime and its votes, per quantity the mean, standard error
 *       and count in V and eV, the first two VB spacings, flags;
 *     - bins: edges, dots, mean radius, per quantity mean, SD and count (eV);
 *     - fits: quantity, model, status, points, χ²_red, then `params` and `stderr` as
 *       `name=value` lists, warnings.
 *
 * Example
 * -------
 * ```ts
 * const curves = ["qd-7-s01-1.csv", "qd-7-s05-1.csv"].map((file, i) => ({
 *   file, dot: null, radiusNM: [1.5, 2][i], values: analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: 0.86 })),
 * }));
 * const t = sizeSeriesTables(sizeSeriesToJson(sizeSeries(curves)), curves);
 * formatCsv(t.dots.rows, t.dots.columns).split("\n")[0].slice(0, 40); // => "dot,radius_nm,curves,regime,regime_votes"
 * ```
 */
export function sizeSeriesTables(series: SizeSeriesJson, curves: readonly SeriesCurveInput[]): SizeSeriesTables {
  const flagged = new Map<string, string[]>();
  for (const d of series.dots) for (const fl of d.flags) flagged.set(fl.file, [...(flagged.get(fl.file) ?? []), `${fl.quantity}${fl.excluded ? " (left out)" : ""}`]);
  const unassigned = new Map(series.unassigned.map((u) => [u.file, u.reason]));
  const dotOf = new Map<string, string>();
  for (const d of series.dots) for (const f of d.files) dotOf.set(f, d.dot);

  const curveColumns = ["file", "dot", "radius_nm", "status", "regime", "eta"];
  for (const q of SCALARS) curveColumns.push(`${q}V`, `${q}V_sigma`, `${q}EV`);
  curveColumns.push("valenceSpacingsV", "valenceSpacingsEV");
  const curveRows = curves.map((c) => {
    const v = c.values;
    const row: Record<string, CellValue> = {
      file: c.file,
      dot: dotOf.get(c.file) ?? c.dot,
      radius_nm: c.radiusNM,
      status: unassigned.has(c.file) ? `unassigned: ${unassigned.get(c.file)}` : flagged.has(c.file) ? `flagged: ${flagged.get(c.file)!.join(", ")}` : "used",
      regime: v.regime,
      eta: v.energies.eta,
    };
    for (const q of SCALARS) {
      row[`${q}V`] = v[`${q}V`];
      row[`${q}V_sigma`] = v.uncertainties[`${q}V`];
      row[`${q}EV`] = v.energies[`${q}EV`];
    }
    row.valenceSpacingsV = v.valenceSpacingsV.join(";");
    row.valenceSpacingsEV = v.energies.valenceSpacingsEV.join(";");
    return row;
  });

  const dotColumns = ["dot", "radius_nm", "curves", "regime", "regime_votes"];
  for (const q of SCALARS) dotColumns.push(`${q}V`, `${q}V_se`, `${q}EV`, `${q}EV_se`, `${q}_n`);
  dotColumns.push("valenceSpacing1EV", "valenceSpacing1EV_se", "valenceSpacing2EV", "valenceSpacing2EV_se", "etas", "flags");
  const dotRows = series.dots.map((d) => {
    const row: Record<string, CellValue> = {
      dot: d.dot,
      radius_nm: d.radiusNM,
      curves: d.curves,
      regime: d.regime,
      regime_votes: Object.entries(d.regimeVotes)
        .filter(([, n]) => n > 0)
        .map(([r, n]) => `${r} ${n}`)
        .join("; "),
    };
    for (const q of SCALARS) {
      row[`${q}V`] = d[`${q}V`];
      row[`${q}V_se`] = d.uncertainties[`${q}V`];
      row[`${q}EV`] = d.energies[`${q}EV`];
      row[`${q}EV_se`] = d.energies.uncertainties[`${q}EV`];
      row[`${q}_n`] = d.counts[`${q}V`];
    }
    for (const k of [0, 1]) {
      row[`valenceSpacing${k + 1}EV`] = d.energies.valenceSpacingsEV[k] ?? null;
      row[`valenceSpacing${k + 1}EV_se`] = d.energies.uncertainties.valenceSpacingsEV[k] ?? null;
    }
    row.etas = d.energies.etas.join(";");
    row.flags = d.flags.map((fl) => `${fl.file}: ${fl.reason}`).join(" | ");
    return row;
  });

  const binColumns = ["from_nm", "to_nm", "dots", "radius_nm"];
  for (const k of BIN_KEYS) binColumns.push(k, `${k}_sd`, `${k}_n`);
  const binRows = series.bins.map((b) => {
    const row: Record<string, CellValue> = { from_nm: b.fromNM, to_nm: b.toNM, dots: b.dots.join(";"), radius_nm: b.radiusNM };
    for (const k of BIN_KEYS) {
      const s = b.values[k] ?? null;
      row[k] = s?.mean ?? null;
      row[`${k}_sd`] = s?.sd ?? null;
      row[`${k}_n`] = s?.count ?? 0;
    }
    return row;
  });

  const fitColumns = ["quantity", "model", "status", "points", "reducedChiSquare", "params", "stderr", "dots", "warnings"];
  const fitRows = series.fits.map((fit) => ({
    quantity: fit.quantity,
    model: fit.model,
    status: fit.status,
    points: fit.pointsUsed,
    reducedChiSquare: fit.reducedChiSquare,
    params: Object.entries(fit.params).map(([k, v]) => `${k}=${v}`).join("; "),
    stderr: Object.entries(fit.stderr).map(([k, v]) => `${k}=${v ?? ""}`).join("; "),
    dots: fit.dotsUsed.join(";"),
    warnings: fit.warnings.join(" | "),
  }));

  return {
    curves: { columns: curveColumns, rows: curveRows },
    dots: { columns: dotColumns, rows: dotRows },
    bins: { columns: binColumns, rows: binRows },
    fits: { columns: fitColumns, rows: fitRows },
  };
}
