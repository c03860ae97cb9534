/**
 * A readable plain-text report of one analysed curve: what `dotspec analyze` prints per file.
 * Works on the JSON record only, so notebooks and scripts can print saved records the same way.
 */
import type { AnalysisJson } from "./analysisJson.ts";
import type { ModelComparisonJson } from "./modelComparisonJson.ts";
import { NO_MULTIPLET, SECOND_JUNCTION } from "./multipletColor.ts";
import { formatEta, formatUncertain } from "./formatUncertain.ts";
import { ratioText } from "./fitJson.ts";

/** Options of {@link formatAnalysisText}. */
export interface FormatAnalysisTextOptions {
  /**
   * Emphasise headings with ANSI bold and faint (for a terminal). Default false: plain UTF-8
   * text without control codes.
   */
  color?: boolean;
}

/** Defaults and layout constants of {@link formatAnalysisText} (locked by a test). */
export const FORMAT_TEXT_DEFAULTS = Object.freeze({
  color: false,
  /** Indentation of everything under the file's header line. */
  indent: "  ",
  /** Decimals of peak positions in V (0.1 mV). */
  biasDecimals: 4,
  /** Significant digits of an uncertainty; the value is rounded to the same decimal place. */
  uncertaintyDigits: 2,
  /** Most decimals shown for a value with an uncertainty (in mV or meV). */
  maxDecimals: 3,
  /** Written for a quantity the analysis did not define. */
  missing: "—",
});

const REGIME_WORDS: Record<AnalysisJson["regime"], string> = {
  "shell-filling": "shell filling",
  "shell-tunneling": "shell tunnelling",
  undetermined: "regime undetermined",
};

type Align = "left" | "right";

/** Pads the cells of a table into aligned columns (widths by code points, which suits this text). */
function table(headers: string[], rows: string[][], align: Align[], indent: string): string[] {
  const width = headers.map((h, c) => Math.max([...h].length, ...rows.map((r) => [...r[c]].length)));
  const pad = (s: string, c: number) => {
    const fill = " ".repeat(width[c] - [...s].length);
    return align[c] === "right" ? fill + s : s + fill;
  };
  const line = (cells: string[]) => (indent + cells.map(pad).join("  ")).trimEnd();
  return [line(headers), ...rows.map(line)];
}

/** "142.3 ± 1.8" (value and σ already in display units), or the value alone without a σ. */
function withSigma(value: number, sigma: number | null): string {
  return formatUncertain(value, sigma, { digits: FORMAT_TEXT_DEFAULTS.uncertaintyDigits, maxDecimals: FORMAT_TEXT_DEFAULTS.maxDecimals });
}

/** Three significant digits without exponent for everyday magnitudes. */
function sig3(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a >= 1e5 || a < 1e-3) return x.toExponential(2);
  const d = Math.max(0, 2 - Math.floor(Math.log10(a)));
  return x.toFixed(d);
}

/**
 * Formats the JSON record of one analysed curve as a readable text report.
 *
 * Parameters
 * ----------
 * json : AnalysisJson
 *     The record from {@link analysisToJson}.
 * options : FormatAnalysisTextOptions, optional
 *     `color` (default false) adds ANSI bold/faint to headings, for terminals only.
 *
 * Returns
 * -------
 * string
 *     Lines ending in `\n`: a header line (source, regime, η and whether it was given); the
 *     settings used; a peak table (bias in V, 1σ in mV, height in nS, FWHM in mV, SNR, multiplet
 *     label or "no multiplet"); a multiplet table (band, label, found/expected, sub-groups, peak
 *     positions) and the peaks set aside as charging satellites;
 *     the extracted quantities bias-referred in mV and as energies in meV after η
 *     (`Ec = 142.3 ± 1.8 mV  →  121.0 ± 1.5 meV (η = 0.85)`), the warnings (`! …`) and,
 *     quietly (faint on a terminal), the notes (`note: …`).
 *
 * Notes
 * -----
 * 1. An uncertainty is shown with two significant digits and its value rounded to the same
 *    decimal place (at most three decimals in mV/meV): common practice (no source).
 * 2. Quantities the regime does not define (Ec and the single-particle gap outside shell
 *    filling) are written "—" with the reason.
 * 3. Settings in the report are analysis settings, not instrument settings.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * formatAnalysisText(analysisToJson(analyzeCurve(curve, { eta: 0.85 }))).split("\n")[0];
 * // => "sample-curves/dot-01.csv  ·  shell filling  ·  η = 0.85"
 * ```
 */
export function formatAnalysisText(json: AnalysisJson, options: FormatAnalysisTextOptions = {}): string {
  const D = FORMAT_TEXT_DEFAULTS;
  const color = options.color ?? D.color;
  const bold = (s: string) => (color ? `\x1b[1m${s}\x1b[22m` : s);
  const faint = (s: string) => (color ? `\x1b[2m${s}\x1b[22m` : s);
  const I = D.indent;
  const eta = formatEta(json.energies.eta);
  const etaText = json.energies.etaGiven ? `η = ${eta}` : `η = ${eta} (not given: energies equal bias values)`;
  const out: string[] = [];

  out.push(bold(`${json.source}  ·  ${REGIME_WORDS[json.regime]}  ·  ${etaText}`));
  const s = json.settings;
  const sweeps = json.import ? `${json.import.points} points, ${json.import.sweeps} sweep${json.import.sweeps === 1 ? "" : "s"}; ` : "";
  const how = s.useMeasured ? "measured dI/dV" : `dI/dV by Savitzky–Golay, window ${s.windowMV.toFixed(1)} mV (${s.automaticWindow ? "automatic" : "given"}), order ${s.order}`;
  const floor = s.noiseCurrentBound === "resolution" ? "; current noise at the rounding floor of the written numbers" : "";
  out.push(faint(`${I}${sweeps}${how}; step ${(s.biasStepV * 1000).toPrecision(3)} mV${floor}`));
  if (json.noLevels) {
    out.push("");
    out.push(`${I}${bold("No levels found")}: ${json.noLevels.reason}`);
  }

  // Peaks.
  out.push("");
  if (json.peaks.length === 0) out.push(`${I}${bold("Peaks")}: none found`);
  else {
    out.push(`${I}${bold("Peaks")} (${json.peaks.length})`);
    const rows = json.peaks.map((p, i) => [
      String(i + 1),
      p.biasV.toFixed(D.biasDecimals),
      (p.biasUncertaintyV * 1000).toFixed(p.biasUncertaintyV * 1000 < 0.1 ? 2 : 1),
      sig3(p.height * 1e9),
      (p.fwhmV * 1000).toFixed(1),
      p.snr >= 10 ? p.snr.toFixed(0) : p.snr.toFixed(1),
      p.multiplet ?? (p.role === "second-junction" ? SECOND_JUNCTION : NO_MULTIPLET),
    ]);
    out.push(
      ...table(
        ["#", "bias (V)", "±σ (mV)", "height (nS)", "FWHM (mV)", "SNR", "multiplet"],
        rows,
        ["right", "right", "right", "right", "right", "right", "left"],
        I + I,
      ),
    );
  }

  // Multiplets.
  if (json.multiplets.length) {
    out.push("");
    out.push(`${I}${bold("Multiplets")}`);
    const split = json.multiplets.some((m) => m.subgroups.length > 1);
    const rows = json.multiplets.map((m) => [
      m.band,
      m.label,
      `${m.found}/${m.expected ?? D.missing}`,
      ...(split ? [m.subgroups.length > 1 ? m.subgroups.join("+") : ""] : []),
      m.peaksV.map((v) => v.toFixed(D.biasDecimals)).join("  "),
    ]);
    const headers = ["band", "label", "found/expected", ...(split ? ["split"] : []), "peaks (V)"];
    const align: Align[] = ["left", "left", "right", ...(split ? (["left"] as Align[]) : []), "left"];
    out.push(...table(headers, rows, align, I + I));
  }
  if (json.evidence.satellitePeaksV.length) {
    const list = json.evidence.satellitePeaksV.map((v) => v.toFixed(D.biasDecimals)).join("  ");
    out.push(`${I}${I}${faint(`set aside as charging satellites (${NO_MULTIPLET}): ${list} V`)}`);
  }
  if (json.evidence.secondJunction.length) {
    const list = json.evidence.secondJunction.map((r) => `${json.peaks[r.index].biasV.toFixed(D.biasDecimals)} (of ${json.peaks[r.sourceIndex].biasV.toFixed(D.biasDecimals)})`).join("  ");
    out.push(`${I}${I}${faint(`set aside as ${SECOND_JUNCTION} resonances, −η·V/(1 − η) of a tip-junction peak: ${list} V`)}`);
  }

  // Quantities.
  out.push("");
  out.push(`${I}${bold("Quantities")}  (bias-referred  →  energy after η)`);
  const e = json.energies;
  const notInRegime =
    json.regime === "shell-tunneling" ? "not measurable in shell tunnelling" : json.regime === "undetermined" ? "regime undetermined" : null;
  const items: { name: string; v: number | null; sv: number | null; e: number | null; se: number | null; why?: string | null }[] = [
    { name: "gap", v: json.gapV, sv: json.uncertainties.gapV, e: e.gapEV, se: e.uncertainties.gapEV, why: "needs a peak on each side of 0 V" },
    { name: "Ec", v: json.chargingEnergyV, sv: json.uncertainties.chargingEnergyV, e: e.chargingEnergyEV, se: e.uncertainties.chargingEnergyEV, why: notInRegime },
    {
      name: "single-particle gap",
      v: json.singleParticleGapV,
      sv: json.uncertainties.singleParticleGapV,
      e: e.singleParticleGapEV,
      se: e.uncertainties.singleParticleGapEV,
      why: notInRegime,
    },
    { name: "Δsp", v: json.levelSpacingSPV, sv: json.uncertainties.levelSpacingSPV, e: e.levelSpacingSPEV, se: e.uncertainties.levelSpacingSPEV, why: null },
    { name: "Δpd", v: json.levelSpacingPDV, sv: json.uncertainties.levelSpacingPDV, e: e.levelSpacingPDEV, se: e.uncertainties.levelSpacingPDEV, why: null },
  ];
  json.valenceSpacingsV.forEach((v, i) => {
    const from = json.multiplets.filter((m) => m.band === "VB")[i]?.label ?? `v${i + 1}`;
    const to = json.multiplets.filter((m) => m.band === "VB")[i + 1]?.label ?? `v${i + 2}`;
    items.push({
      name: `VB ${from}→${to}`,
      v,
      sv: json.uncertainties.valenceSpacingsV[i] ?? null,
      e: e.valenceSpacingsEV[i] ?? null,
      se: e.uncertainties.valenceSpacingsEV[i] ?? null,
    });
  });
  const biasCells = items.map((q) => (q.v === null ? "" : `${withSigma(q.v * 1000, q.sv === null ? null : q.sv * 1000)} mV`));
  const nameWidth = Math.max(...items.map((q) => [...q.name].length));
  const biasWidth = Math.max(...biasCells.map((c) => [...c].length));
  items.forEach((q, i) => {
    const name = q.name + " ".repeat(nameWidth - [...q.name].length);
    if (q.v === null) {
      out.push(`${I}${I}${name} = ${D.missing}${q.why ? ` (${q.why})` : ""}`);
      return;
    }
    const bias = " ".repeat(biasWidth - [...biasCells[i]].length) + biasCells[i];
    const energy = q.e === null ? D.missing : `${withSigma(q.e * 1000, q.se === null ? null : q.se * 1000)} meV (η = ${eta})`;
    out.push(`${I}${I}${name} = ${bias}  →  ${energy}`);
  });

  if (json.modelComparison) out.push("", ...modelComparisonLines(json.modelComparison, eta, I, bold, faint));

  // Warnings.
  if (json.warnings.length) {
    out.push("");
    out.push(`${I}${bold("Warnings")} (${json.warnings.length})`);
    for (const w of json.warnings) out.push(`${I}${I}! ${w}`);
  }
  // Notes: routine facts, printed quietly after the warnings.
  const notes = json.notes ?? [];
  if (notes.length) {
    out.push("");
    for (const n of notes) out.push(faint(`${I}note: ${n}`));
  }
  return out.join("\n") + "\n";
}

/**
 * The model-comparison block: why it ran, headline with status and regime, the fit's quantities
 * with their ±, the best groupings, and which answer the record stands by (the fit's or the rules').
 */
function modelComparisonLines(m: ModelComparisonJson, eta: string, I: string, bold: (s: string) => string, faint: (s: string) => string): string[] {
  const pm = (v: { value: number; standardError: number } | null, scale: number, unit: string) =>
    v === null ? FORMAT_TEXT_DEFAULTS.missing : `${withSigma(v.value * scale, Number.isFinite(v.standardError) ? v.standardError * scale : null)} ${unit}`;
  // Records written before `ranBecause` existed were fitted only where the rules left the regime undetermined.
  const why = m.ranBecause ? "the rules are not decisive" : m.scope === "undecided" ? "the rules left the regime undetermined" : "--compare-models all";
  const out = [`${I}${bold("Model comparison")} (orthodox model fitted with every grouping of the peaks; ${why})`];
  for (const r of m.ranBecause ?? []) out.push(faint(`${I}${I}why: ${r}`));
  const decision = m.decision === undefined ? [] : [`${I}${I}${m.decides ? bold("the fit decides") : "the rules stand"}: ${m.decision}`];
  if (m.status === "failed") {
    out.push(`${I}${I}NO FIT: ${m.statusReasons.join("; ")}`, ...decision);
    return out;
  }
  out.push(`${I}${I}${REGIME_WORDS[m.regime as keyof typeof REGIME_WORDS] ?? m.regime}, fit ${m.status === "good" ? "good" : "POOR"} (reduced χ² ${m.reducedChiSquare?.toPrecision(3) ?? FORMAT_TEXT_DEFAULTS.missing}): ${m.regimeReason}`);
  out.push((m.rateRatioLimit && m.rateRatio ? `${I}${I}Γtip/Γsub ${ratioText(m.rateRatio.value, m.rateRatio.standardError, m.rateRatioLimit)}` : `${I}${I}Γtip/Γsub = ${pm(m.rateRatio, 1, "")}`.trimEnd()) + `, Ec = ${pm(m.quantities.chargingEnergyEV, 1000, "meV")}, gap = ${pm(m.quantities.gapEV, 1000, "meV")}, Δsp = ${pm(m.quantities.levelSpacingSPEV, 1000, "meV")} (η = ${eta})`);
  const ranked = [...m.alternatives].sort((a, b) => b.weight - a.weight).slice(0, 3);
  if (ranked.length) out.push(faint(`${I}${I}best groupings: ${ranked.map((a) => `${a.hypothesis} (weight ${a.weight.toPrecision(2)})`).join(", ")}`));
  if (m.status === "poor") out.push(faint(`${I}${I}${m.statusReasons.join("; ")}`));
  out.push(...decision);
  for (const w of m.warnings) out.push(`${I}${I}! ${w}`);
  return out;
}
