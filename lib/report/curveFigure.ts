/**
 * The figure of one analysed curve: I–V above, dI/dV below with the assigned peaks (and, on
 * request, the normalised conductance), as one standalone SVG document drawn with Observable Plot.
 * The same drawing serves the CLI's `--out` and the notebooks.
 *
 * This module loads Observable Plot when imported. The public entry point does not import it
 * statically: use {@link loadCurveFigure}, which imports it (and, in Node, jsdom) on demand.
 */
import { formatEta } from "./formatUncertain.ts";
import * as Plot from "@observablehq/plot";
import type { Curve } from "../curve.ts";
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import { normalizedConductance } from "../signal/normalizedConductance.ts";
import { interpolateOnto } from "../util/interpolateOnto.ts";
import { DotspecError } from "../util/errors.ts";
import { MULTIPLET_COLORS, NO_MULTIPLET, SECOND_JUNCTION, multipletColor } from "./multipletColor.ts";
import { axisAttributes, currentUnit, energyAxis, envelope, sourceBaseName, SVG_NS, svgMaker, svgRoot } from "./figureParts.ts";

/** Options of {@link curveFigure}. */
export interface CurveFigureOptions {
  /**
   * The DOM document the SVG is built in. Default: `globalThis.document` (a browser). Node has
   * none: pass `new JSDOM("").window.document`, or use {@link loadCurveFigure}.
   */
  document?: Document;
  /**
   * The curve that was analysed; its individual sweeps are drawn faintly behind the mean
   * current when there are several. Default: none (the mean current only).
   */
  curve?: Curve;
  /** Width of the figure in px. Default 760. */
  width?: number;
  /**
   * Title line. Default: the base name of the source (the full path stays in the record), the
   * regime and η.
   */
  title?: string;
  /**
   * Add a third panel with the normalised conductance (dI/dV)/(I/V), I/V broadened as in
   * {@link normalizedConductance} with its default width. Default false.
   */
  normalized?: boolean;
}

/** Layout and colours of {@link curveFigure} (locked by a test). */
export const CURVE_FIGURE_DEFAULTS = Object.freeze({
  width: 760,
  /** Height of the title block (title, quantities line, one row of legend), px. */
  headerHeight: 78,
  /** Height added per further row of legend, px. */
  legendRowHeight: 16,
  /** Height of the I–V panel (with the energy axis on top), px. */
  currentPanelHeight: 220,
  /** Height of the dI/dV panel, px. */
  conductancePanelHeight: 290,
  /** Height of the optional normalised-conductance panel, px. */
  normalizedPanelHeight: 170,
  /** Target number of ticks on the energy axis. */
  energyTicks: 10,
  marginLeft: 72,
  marginRight: 24,
  /** Lines keep at most this many points per px of plot width (min/max per column beyond). */
  pointsPerPixel: 2,
  fontFamily: "system-ui, -apple-system, 'Segoe UI', sans-serif",
  colors: Object.freeze({
    background: "#ffffff",
    title: "#1d1d1f",
    subtitle: "#5c5c60",
    /** Mean current and the dI/dV line. */
    line: "#263238",
    /** Individual sweeps. */
    sweeps: "#90a4ae",
    /** The zero-conductance region. */
    gap: "#f3e3b5",
    zero: "#c9c9c9",
    /** The normalised conductance line. */
    normalized: "#4a4a8c",
  }),
  /** Peak dot radius, px. */
  dotRadius: 4.5,
});


/** The words for a resonance of the VB ladder taken out of the current before the CB peaks were found. */
const SUBTRACTED_WORDS = `${SECOND_JUNCTION}, VB ladder's, taken out of the current`;

const REGIME_WORDS: Record<CurveAnalysis["assignment"]["regime"], string> = {
  "shell-filling": "shell filling",
  "shell-tunneling": "shell tunnelling",
  undetermined: "regime undetermined",
};

/** "1499.4 mV" style number for the quantities line. */
function mv(v: number): string {
  return `${(v * 1000).toFixed(1)} mV`;
}

function quantitiesLine(analysis: CurveAnalysis): string {
  const q = analysis.assignment.quantities;
  const e = analysis.assignment.energies;
  const parts: string[] = [];
  const add = (name: string, v: number | null, ev: number | null) => {
    if (v === null) return;
    parts.push(ev === null || !e.etaGiven ? `${name} ${mv(v)}` : `${name} ${mv(v)} → ${(ev * 1000).toFixed(1)} meV`);
  };
  add("gap", q.gapV, e.gapEV);
  add("Ec", q.chargingEnergyV, e.chargingEnergyEV);
  add("Δsp", q.levelSpacingSPV, e.levelSpacingSPEV);
  add("Δpd", q.levelSpacingPDV, e.levelSpacingPDEV);
  parts.push(`${analysis.peaks.length} peak${analysis.peaks.length === 1 ? "" : "s"}`);
  return parts.join("  ·  ");
}

/**
 * Draws the figure of one analysed curve as a standalone SVG document.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     From {@link analyzeCurve}.
 * options : CurveFigureOptions, optional
 *     `document` (required outside a browser), `curve` (for the individual sweeps), `width` in
 *     px (default 760), `title`, `normalized` (default false).
 *
 * Returns
 * -------
 * string
 *     SVG markup with `xmlns="http://www.w3.org/2000/svg"` on the root: a title block (the
 *     source's base name, regime, η; the extracted quantities; a legend of the multiplets), then
 *     panels sharing the bias axis: the current (mean, and each sweep faintly when there are
 *     several) under an energy axis in eV (η × bias), the smoothed dI/dV in nS with one dot per
 *     peak coloured by multiplet ({@link multipletColor}; grey and "no multiplet" for satellites
 *     and unassigned peaks), the multiplet labels, the zero-conductance region shaded, and with
 *     `normalized` the normalised conductance; the sample-bias axis in V at the bottom. The root
 *     carries `data-bias-range-v`, `data-plot-x-px`, `data-panels-y-px` and `data-eta`, so a page
 *     can map the pointer to a bias.
 *
 * Throws
 * ------
 * DotspecError
 *     `report/no-document` when no document is given and there is no `globalThis.document`.
 *
 * Notes
 * -----
 * 1. Each panel is an Observable Plot chart with the same width, margins and x domain, so the
 *    bias axes line up; the two are nested `<svg>` elements at their y offsets in one root.
 * 2. Lines longer than 2 points per px of width keep the first, lowest, highest and last point of
 *    each px column, which keeps every peak and step visible while bounding the file size.
 * 3. The current is drawn offset-corrected (the offset the analysis removed is removed from the
 *    sweeps too), in the SI prefix that suits its range.
 * 4. The energy axis places round energies E at bias E/η, so it reads the same curve in eV; with
 *    η not given it is 1 and the axis says so.
 *
 * Example
 * -------
 * ```ts
 * const svg = curveFigure(analysis, { document: new JSDOM("").window.document, curve });
 * svg.startsWith("<svg"); // => true
 * ```
 */
export function curveFigure(analysis: CurveAnalysis, options: CurveFigureOptions = {}): string {
  const D = CURVE_FIGURE_DEFAULTS;
  const C = D.colors;
  const document = options.document ?? (globalThis as { document?: Document }).document;
  if (!document) {
    throw new DotspecError(
      "report/no-document",
      "curveFigure needs a DOM document outside a browser: pass { document: new JSDOM(\"\").window.document }, or use loadCurveFigure(), which does it for you",
    );
  }
  const width = options.width ?? D.width;
  const sig = analysis.conductance;
  const biasV = sig.biasV;
  const n = biasV.length;
  const domain: [number, number] = [biasV[0], biasV[n - 1]];
  const plotColumns = Math.max(50, Math.round((width - D.marginLeft - D.marginRight) * (D.pointsPerPixel / 4)));
  const gap = analysis.gapEdgesV;
  const gapMarks = (label: boolean) =>
    gap
      ? [
          Plot.rect([gap], { x1: (d: [number, number]) => d[0], x2: (d: [number, number]) => d[1], fill: C.gap, fillOpacity: 0.6 }),
          ...(label
            ? [Plot.text([gap], { x: (d: [number, number]) => (d[0] + d[1]) / 2, frameAnchor: "top", dy: 6, text: () => "gap", fill: "#8a6d1d", fontSize: 10 })]
            : []),
        ]
      : [];

  // Top panel: current.
  const unit = currentUnit(sig.currentA);
  const sweepMarks: Plot.Markish[] = [];
  const sweeps = options.curve && options.curve.sweeps.length > 1 ? options.curve.sweeps : [];
  if (sweeps.length) {
    const offset = sig.record.offsetA;
    const cx = options.curve!.biasV;
    const all = { x: [] as number[], y: [] as number[], z: [] as number[] };
    sweeps.forEach((s, k) => {
      const shifted = Float64Array.from(s, (v) => v - offset);
      const line = envelope(cx, shifted, plotColumns, unit.scale);
      all.x.push(...line.x);
      all.y.push(...line.y);
      for (let i = 0; i < line.x.length; i++) all.z.push(k);
    });
    sweepMarks.push(Plot.line(all.x, { x: all.x, y: all.y, z: all.z, stroke: C.sweeps, strokeOpacity: 0.55, strokeWidth: 1 }));
  }
  const mean = envelope(biasV, sig.currentA, plotColumns, unit.scale);
  const top = Plot.plot({
    document,
    width,
    height: D.currentPanelHeight,
    marginLeft: D.marginLeft,
    marginRight: D.marginRight,
    marginTop: 52,
    marginBottom: 10,
    style: { background: "transparent" },
    x: energyAxis(domain, analysis.assignment.energies, D.energyTicks),
    y: { label: `current (${unit.label})`, grid: true, nice: true },
    marks: [
      ...gapMarks(false),
      Plot.ruleY([0], { stroke: C.zero }),
      ...sweepMarks,
      Plot.line(mean.x, { x: mean.x, y: mean.y, stroke: C.line, strokeWidth: 1.5 }),
    ],
  });

  // Bottom panel: dI/dV and peaks.
  const didv = envelope(biasV, sig.didvS, plotColumns, 1e9);
  const multiplets = analysis.assignment.multiplets;
  const peaks = analysis.peaks.map((p) => ({
    biasV: p.biasV,
    heightNS: p.heightS * 1e9,
    sigmaMV: p.biasUncertaintyV * 1000,
    // A second-junction resonance is in no multiplet but is named as what it is.
    label: p.multiplet !== null ? multiplets[p.multiplet].label : p.role === "second-junction" ? SECOND_JUNCTION : null,
  }));
  let yMax = 0;
  let yMin = 0;
  for (const v of didv.y) {
    yMax = Math.max(yMax, v);
    yMin = Math.min(yMin, v);
  }
  const groups = new Map<string | null, typeof peaks>();
  for (const p of peaks) groups.set(p.label, [...(groups.get(p.label) ?? []), p]);
  const dotMarks: Plot.Markish[] = [];
  const labelMarks: Plot.Markish[] = [];
  for (const [name, list] of groups) {
    const fill = multipletColor(name);
    dotMarks.push(
      Plot.dot(list, {
        x: "biasV",
        y: "heightNS",
        r: D.dotRadius,
        fill,
        stroke: C.background,
        strokeWidth: 1.2,
        title: (d: (typeof peaks)[number]) => `${d.label ?? NO_MULTIPLET}: ${d.biasV.toFixed(4)} V ± ${d.sigmaMV.toFixed(1)} mV`,
      }),
    );
    if (name !== null) {
      const at = list.reduce((a, b) => (b.heightNS > a.heightNS ? b : a));
      const x = list.reduce((s, p) => s + p.biasV, 0) / list.length;
      labelMarks.push(Plot.text([{ x, y: at.heightNS }], { x: "x", y: "y", text: () => name, dy: -13, fill, fontWeight: "bold", fontSize: 12 }));
    }
  }
  // The VB ladder's resonances taken out of the current before the CB peaks were found (no peaks
  // of the list): hollow circles on the measured dI/dV at each subtracted step.
  const subtractedV = (analysis.subtractedResonances?.steps ?? []).map((q) => q.biasV).filter((v) => v >= biasV[0] && v <= biasV[biasV.length - 1]);
  const subtractedNS = interpolateOnto(biasV, sig.didvS, Float64Array.from(subtractedV.sort((x, y) => x - y)));
  const subtracted = subtractedV.map((v, k) => ({ biasV: v, heightNS: subtractedNS[k] * 1e9 }));
  if (subtracted.length) {
    const stroke = multipletColor(SECOND_JUNCTION);
    dotMarks.push(
      Plot.dot(subtracted, {
        x: "biasV",
        y: "heightNS",
        r: D.dotRadius,
        fill: C.background,
        stroke,
        strokeWidth: 1.8,
        title: (d: (typeof subtracted)[number]) => `${SUBTRACTED_WORDS}: ${d.biasV.toFixed(4)} V`,
      }),
    );
  }
  const biasAxis = { domain, label: "sample bias (V)", labelAnchor: "center", labelArrow: "none" } as const;
  const hiddenAxis = { domain, label: null, tickFormat: () => "" };
  const normalized = options.normalized ?? false;
  const bottom = Plot.plot({
    document,
    width,
    height: D.conductancePanelHeight,
    marginLeft: D.marginLeft,
    marginRight: D.marginRight,
    marginTop: 22,
    marginBottom: normalized ? 10 : 40,
    style: { background: "transparent" },
    x: normalized ? hiddenAxis : biasAxis,
    y: { label: "dI/dV (nS)", grid: true, domain: [yMin, yMax > 0 ? yMax * 1.15 : 1] },
    marks: [
      ...gapMarks(true),
      Plot.ruleY([0], { stroke: C.zero }),
      Plot.line(didv.x, { x: didv.x, y: didv.y, stroke: C.line, strokeWidth: 1.5 }),
      ...dotMarks,
      ...labelMarks,
    ],
  });

  // Optional third panel: the normalised conductance.
  const panels = [top, bottom];
  if (normalized) {
    const nc = normalizedConductance(sig);
    const line = envelope(biasV, nc.normalized, plotColumns, 1);
    panels.push(
      Plot.plot({
        document,
        width,
        height: D.normalizedPanelHeight,
        marginLeft: D.marginLeft,
        marginRight: D.marginRight,
        marginTop: 16,
        marginBottom: 40,
        style: { background: "transparent" },
        x: biasAxis,
        y: { label: `(dI/dV)/(I/V), ΔV = ${nc.broadeningV} V (1)`, grid: true, nice: true },
        marks: [...gapMarks(false), Plot.ruleY([0], { stroke: C.zero }), Plot.line(line.x, { x: line.x, y: line.y, stroke: C.normalized, strokeWidth: 1.5 })],
      }),
    );
  }

  // Legend entries: one swatch per multiplet, then "no multiplet" and the gap; laid out in rows
  // that fit the width (text width estimated at 6.2 px per character of 11 px type).
  const a = analysis.assignment;
  // Each entry: text, colour, and whether its swatch is hollow (a mark drawn in outline).
  const entries: [string, string, boolean?][] = a.multiplets.map((m) => [
    `${m.label} (${m.band}, ${m.found}${m.expected === null ? "" : "/" + m.expected} peak${(m.expected ?? m.found) === 1 ? "" : "s"})`,
    multipletColor(m.label),
  ]);
  if (peaks.some((p) => p.label === SECOND_JUNCTION)) entries.push([`${SECOND_JUNCTION} (−η·V/(1 − η) of a level)`, multipletColor(SECOND_JUNCTION)]);
  if (peaks.some((p) => p.label === null)) entries.push([NO_MULTIPLET, MULTIPLET_COLORS.none]);
  if (subtracted.length) entries.push([SUBTRACTED_WORDS, multipletColor(SECOND_JUNCTION), true]);
  if (gap) entries.push(["zero-conductance region", C.gap]);
  const placed: { text: string; fill: string; hollow: boolean; x: number; row: number }[] = [];
  let lx = 0;
  let row = 0;
  for (const [text, fill, hollow = false] of entries) {
    const w = 22 + text.length * 6.2;
    if (lx > 0 && 16 + lx + w > width - 8) {
      lx = 0;
      row++;
    }
    placed.push({ text, fill, hollow, x: lx, row });
    lx += w;
  }
  const headerHeight = D.headerHeight + row * D.legendRowHeight;

  // Compose one SVG document.
  const height = headerHeight + D.currentPanelHeight + D.conductancePanelHeight + (normalized ? D.normalizedPanelHeight : 0);
  const el = svgMaker(document);
  const root = svgRoot(el, width, height, D.fontFamily, axisAttributes(domain, [D.marginLeft, width - D.marginRight], [headerHeight, height], a.energies.eta));
  const etaText = a.energies.etaGiven ? `η = ${formatEta(a.energies.eta)}` : "η not given (energies = bias values)";
  const title = options.title ?? `${sourceBaseName(analysis.source)}  —  ${REGIME_WORDS[a.regime]}, ${etaText}`;
  root.append(
    el("title", {}, title),
    el("rect", { width, height, fill: C.background }),
    el("text", { x: 16, y: 24, "font-size": 15, "font-weight": 600, fill: C.title }, title),
    el("text", { x: 16, y: 44, fill: C.subtitle }, quantitiesLine(analysis)),
  );
  const legend = el("g", { transform: `translate(16, 58)`, "font-size": 11, fill: C.subtitle });
  for (const e of placed) {
    const y = e.row * D.legendRowHeight;
    const swatch: Record<string, string | number> = e.hollow ? { fill: C.background, stroke: e.fill, "stroke-width": 1.8 } : { fill: e.fill };
    legend.append(el("rect", { x: e.x, y, width: 10, height: 10, rx: 2, ...swatch }), el("text", { x: e.x + 14, y: y + 9 }, e.text));
  }
  root.append(legend);
  // Plot's stylesheet is meant for HTML pages (display: block; height: auto), which would resize
  // a nested <svg>; the panels need none of it.
  let y = headerHeight;
  const heights = [D.currentPanelHeight, D.conductancePanelHeight, D.normalizedPanelHeight];
  panels.forEach((panel, i) => {
    for (const style of Array.from(panel.querySelectorAll("style"))) style.remove();
    panel.setAttribute("x", "0");
    panel.setAttribute("y", String(y));
    y += heights[i];
    root.append(panel);
  });
  return serialize(root);
}

/**
 * Markup of a root <svg> built in `document`, as XML: the namespace declared on the root, and the
 * one HTML entity the serialisation can emit (`&nbsp;`) written as a character reference. No
 * attribute holds user text, so the HTML rules for attributes (which leave `<` alone) suffice.
 */
function serialize(root: Element): string {
  if (root.getAttribute("xmlns") !== SVG_NS) root.setAttribute("xmlns", SVG_NS);
  return root.outerHTML.replaceAll("&nbsp;", "&#160;");
}
