/**
 * The readable summary of a size series that `dotspec sizes` prints: one line per dot, the flags,
 * the unassigned curves, the size bins, the model fits and the optical pairing.
 */
import type { OpticalPairing } from "../sizes/opticalPairing.ts";
import type { SizeSeriesJson } from "./sizeSeriesJson.ts";

/** Options of {@link formatSizeSeriesText}. */
export interface FormatSizeSeriesTextOptions {
  /** Decimals of energies in eV. Default 3. */
  decimals?: number;
}

/** Defaults of {@link formatSizeSeriesText} (locked by a test). */
export const FORMAT_SIZES_TEXT_DEFAULTS = Object.freeze({
  decimals: 3,
});

const REGIME_SHORT: Record<string, string> = { "shell-filling": "filling", "shell-tunneling": "tunnelling", undetermined: "undetermined" };

/** Pads every column of `rows` to its widest cell (the first column left-aligned, the others right-aligned). */
function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => (r[j] ?? "").length)));
  return rows.map((r) => r.map((c, j) => (j === 0 ? c.padEnd(widths[j]) : c.padStart(widths[j]))).join("  ").trimEnd());
}

/**
 * Formats a size series as text.
 *
 * Parameters
 * ----------
 * series : SizeSeriesJson
 *     From sizeSeriesToJson.
 * options : FormatSizeSeriesTextOptions, optional
 *     `decimals` of energies (default 3).
 *
 * Returns
 * -------
 * string
 *     Lines ending in `\n`: a heading with the material, a table of dots (radius, curves,
 *     regime with its votes, gap, Ec, single-particle gap, Δsp and the first VB spacing in eV as
 *     mean ± standard error), flagged curves with their reasons, unassigned curves, bins
 *     (mean ± SD (count)), fits (parameters ± standard errors, χ²_red, status) and the optical
 *     pairing, then warnings.
 *
 * Example
 * -------
 * ```ts
 * const curves = ["qd-7-s01-1.csv", "qd-7-s05-1.csv"].map((file, i) => ({
 *   file, dot: null, radiusNM: [1.5, 2][i], values: analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: 0.86 })),
 * }));
 * formatSizeSeriesText(sizeSeriesToJson(sizeSeries(curves))).split("\n")[0]; // => "Size series: 2 dot(s), 2 curve(s); no material"
 * ```
 */
export function formatSizeSeriesText(series: SizeSeriesJson, options: FormatSizeSeriesTextOptions = {}): string {
  const dp = options.decimals ?? FORMAT_SIZES_TEXT_DEFAULTS.decimals;
  const f = (v: number | null | undefined) => (v === null || v === undefined ? "—" : v.toFixed(dp));
  const pm = (v: number | null | undefined, s: number | null | undefined) => (v === null || v === undefined ? "—" : s === null || s === undefined ? f(v) : `${f(v)}±${f(s)}`);
  const out: string[] = [];
  const m = series.material;
  out.push(
    `Size series: ${series.dots.length} dot(s), ${series.dots.reduce((s, d) => s + d.curves, 0)} curve(s)` +
      (series.unassigned.length ? `, ${series.unassigned.length} unassigned` : "") +
      (m ? `; material ${m.name} (Eg ${m.bandGapEV} eV, mₑ* ${m.electronMassE}, m_h* ${m.holeMassE}, ε ${m.dielectricConstant})` : "; no material"),
  );
  if (series.dots.length) {
    out.push("", "Per dot (energies in eV after each curve's η; mean ± standard error over its curves):");
    const rows = [["dot", "R/nm", "curves", "regime", "gap", "Ec", "Eg,sp", "Δsp", "VB 1→2", "η"]];
    for (const d of series.dots) {
      const e = d.energies;
      const u = e.uncertainties;
      const votes = d.regimeVotes[d.regime];
      rows.push([
        d.dot,
        d.radiusNM.toFixed(2),
        String(d.curves),
        `${REGIME_SHORT[d.regime]} ${votes}/${d.curves}`,
        pm(e.gapEV, u.gapEV),
        pm(e.chargingEnergyEV, u.chargingEnergyEV),
        pm(e.singleParticleGapEV, u.singleParticleGapEV),
        pm(e.levelSpacingSPEV, u.levelSpacingSPEV),
        pm(e.valenceSpacingsEV[0], u.valenceSpacingsEV[0]),
        e.etas.map((x) => String(x)).join("/") + (e.etaGiven ? "" : " (1: none given)"),
      ]);
    }
    out.push(...table(rows).map((l) => "  " + l));
  }
  const flags = series.dots.flatMap((d) => d.flags.map((fl) => ({ dot: d.dot, ...fl })));
  if (flags.length) {
    out.push("", "Flagged curves:");
    for (const fl of flags) out.push(`  ${fl.dot}: ${fl.file}: ${fl.reason}`);
  }
  if (series.unassigned.length) {
    out.push("", "Unassigned curves (no size; not in the dots, bins or fits):");
    for (const u of series.unassigned) out.push(`  ${u.file}${u.dot ? ` (dot ${u.dot})` : ""}: ${u.reason}; ${REGIME_SHORT[u.regime]}, gap ${u.gapV === null ? "—" : u.gapV.toFixed(dp) + " V"}`);
  }
  if (series.bins.length) {
    out.push("", `Size bins of ${series.settings.binNM} nm (mean ± SD between dots (dots)):`);
    const rows = [["R/nm", "dots", "gap", "Ec", "Eg,sp", "Δsp", "VB 1→2"]];
    const cell = (s: { mean: number; sd: number | null; count: number } | null | undefined) => (s ? `${s.sd === null ? f(s.mean) : `${f(s.mean)}±${f(s.sd)}`} (${s.count})` : "—");
    for (const b of series.bins) {
      rows.push([
        `${b.fromNM.toFixed(2)}–${b.toNM.toFixed(2)}`,
        String(b.dots.length),
        cell(b.values.gapEV),
        cell(b.values.chargingEnergyEV),
        cell(b.values.singleParticleGapEV),
        cell(b.values.levelSpacingSPEV),
        cell(b.values.valenceSpacing1EV),
      ]);
    }
    out.push(...table(rows).map((l) => "  " + l));
  }
  if (series.fits.length) {
    out.push("", "Model fits (parameters ± standard error; χ²_red; points):");
    for (const fit of series.fits) {
      const params = Object.entries(fit.params)
        .map(([k, v]) => {
          const s = fit.stderr[k];
          return `${k} = ${fmtNum(v)}${s === null || s === undefined ? "" : ` ± ${fmtNum(s)}`}`;
        })
        .join(", ");
      const chi = fit.reducedChiSquare === null ? "—" : fit.reducedChiSquare.toFixed(2);
      out.push(`  ${fit.quantity} · ${fit.model}: ${params || (fit.status === "failed" ? "no fit" : "no free parameters")}; χ²_red ${chi}; ${fit.pointsUsed} points${fit.status === "ok" ? "" : ` [${fit.status}]`}`);
      for (const w of fit.warnings) out.push(`      ${w}`);
    }
  }
  if (series.optical && series.optical.length) {
    out.push("", "Optical pairing (each optical peak, eV, with the (VB, CB) level pair assigned consistently across sizes):");
    for (const p of series.optical) out.push(`  ${describePairing(p)}`);
  }
  const warnings = [...series.warnings, ...series.dots.flatMap((d) => d.warnings.map((w) => `${d.dot}: ${w}`))];
  if (warnings.length) {
    out.push("", "Warnings:");
    for (const w of warnings) out.push(`  ${w}`);
  }
  return out.join("\n") + "\n";
}

/** A number with 4 significant digits, in exponent form outside 1e-3…1e5. */
function fmtNum(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  return a !== 0 && (a < 1e-3 || a >= 1e5) ? v.toExponential(3) : String(Number(v.toPrecision(4)));
}

/** One line per optical row: each peak with its assigned (VB, CB) pair, prediction and mismatch. */
function describePairing(p: OpticalPairing): string {
  const peaks = p.peaks
    .map((k) =>
      k.assigned
        ? `${k.peakEV.toFixed(3)} → ${k.assigned.label} (predicted ${k.assigned.predictedEV.toFixed(3)}, ${k.assigned.mismatchEV >= 0 ? "+" : ""}${k.assigned.mismatchEV.toFixed(3)})`
        : `${k.peakEV.toFixed(3)} → no pair at this size`,
    )
    .join("; ");
  const dots = p.dotsUsed.length ? `${p.dotsUsed.length} dot(s)` : "no dot within reach";
  return `R ${p.radiusNM.toFixed(2)} nm (${dots}, J_eh ${p.coulombEV.toFixed(3)} eV): ${peaks || "—"}${p.warnings.length ? ` [${p.warnings.join("; ")}]` : ""}`;
}
