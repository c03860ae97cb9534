/**
 * The figures of a size series as standalone SVG documents drawn with Observable Plot: gap
 * against R with the models, Ec against 1/R with its fit, Δsp against 1/R², VB spacings against
 * R, and the optical peaks beside the tunnelling levels.
 *
 * This module loads Observable Plot when imported. The public entry point does not import it
 * statically: use {@link loadSizeFigures}, which imports it (and, in Node, jsdom) on demand.
 */
import * as Plot from "@observablehq/plot";
import { DotspecError } from "../util/errors.ts";
import { brusGap } from "../sizes/brus.ts";
import { evaluateSizeFit, type SizeFit } from "../sizes/fitSizeModels.ts";
import type { SizeQuantity } from "../sizes/sizeQuantities.ts";
import { dotQuantity, type SizeSeries } from "../sizes/sizeSeries.ts";
import type { SizeFigureName } from "./loadSizeFigures.ts";
import { svgMaker, svgRoot } from "./figureParts.ts";

/** Options of {@link sizeFigures}. */
export interface SizeFiguresOptions {
  /** The DOM document to draw in. Default `globalThis.document` (a browser); in Node pass a jsdom document or use loadSizeFigures. */
  document?: Document;
  /** Width of each figure, px. Default 720. */
  width?: number;
}

/** Layout and colours of the size figures (locked by a test). */
export const SIZE_FIGURE_DEFAULTS = Object.freeze({
  width: 720,
  height: 440,
  /** Title and legend block above the plot, px. */
  headerHeight: 64,
  legendRowHeight: 16,
  marginLeft: 64,
  marginRight: 24,
  /** Points of each model curve. */
  curvePoints: 80,
  /** The model curves extend this fraction beyond the measured radii on each side. */
  curveMargin: 0.08,
  dotRadius: 4,
  fontFamily: "system-ui, -apple-system, 'Segoe UI', sans-serif",
  colors: Object.freeze({
    background: "#ffffff",
    title: "#1d1d1f",
    subtitle: "#5c5c60",
    /** Measured points, one colour per quantity. */
    gap: "#263238",
    singleParticleGap: "#c0392b",
    chargingEnergy: "#1f77b4",
    levelSpacingSP: "#2e8b57",
    valence: "#8e44ad",
    optical: "#d35400",
    /** Model curves, in order of the fits. */
    models: Object.freeze(["#7f8c8d", "#e67e22", "#16a085", "#9b59b6", "#2980b9", "#c0392b", "#27ae60", "#f1c40f"]),
    brus: "#b0a040",
  }),
});

export type { SizeFigureName } from "./loadSizeFigures.ts";


interface PointSet {
  name: string;
  color: string;
  points: { x: number; y: number; lo: number | null; hi: number | null; title: string }[];
  symbol?: "circle" | "times";
}
interface CurveSet {
  name: string;
  color: string;
  line: { x: number; y: number }[];
  dashed?: boolean;
}

interface Panel {
  title: string;
  subtitle: string;
  xLabel: string;
  yLabel: string;
  points: PointSet[];
  curves: CurveSet[];
}

/** The x of a radius on each figure's axis. */
type XOf = (radiusNM: number) => number;

function radiusGrid(series: SizeSeries): number[] {
  const D = SIZE_FIGURE_DEFAULTS;
  const rs = [...series.dots.map((d) => d.radiusNM), ...(series.opticalRows ?? []).map((r) => r.radiusNM)];
  if (rs.length === 0) return [];
  const lo = Math.min(...rs) * (1 - D.curveMargin);
  const hi = Math.max(...rs) * (1 + D.curveMargin);
  return Array.from({ length: D.curvePoints }, (_, i) => lo + ((hi - lo) * i) / (D.curvePoints - 1));
}

function measured(series: SizeSeries, q: SizeQuantity, name: string, color: string, x: XOf): PointSet {
  return {
    name,
    color,
    points: series.dots.flatMap((d) => {
      const v = dotQuantity(d, q);
      if (!v) return [];
      const s = v.sigma;
      return [
        {
          x: x(d.radiusNM),
          y: v.value,
          lo: s === null ? null : v.value - s,
          hi: s === null ? null : v.value + s,
          title: `${d.dot}: R = ${d.radiusNM} nm, ${v.value.toFixed(4)}${s === null ? "" : ` ± ${s.toFixed(4)}`} eV (${d.curves} curve${d.curves === 1 ? "" : "s"})`,
        },
      ];
    }),
  };
}

function modelCurves(series: SizeSeries, quantities: SizeQuantity[], grid: number[], x: XOf, label: (f: SizeFit) => string, first = 0): CurveSet[] {
  const material = series.material;
  if (!material) return [];
  const colors = SIZE_FIGURE_DEFAULTS.colors.models;
  const fits = series.fits.filter((f) => quantities.includes(f.quantity) && f.status !== "failed");
  return fits.map((f, k) => ({
    name: label(f),
    color: f.model === "brus" ? SIZE_FIGURE_DEFAULTS.colors.brus : colors[(first + k) % colors.length],
    dashed: f.model === "brus",
    line: grid.flatMap((r) => {
      let y: number;
      try {
        y = evaluateSizeFit(f, r, material);
      } catch {
        return [];
      }
      return Number.isFinite(y) ? [{ x: x(r), y }] : [];
    }),
  }));
}

function fitLabel(f: SizeFit): string {
  const chi = f.reducedChiSquare === null ? "" : `, χ²ᵣ ${f.reducedChiSquare.toFixed(2)}`;
  return `${f.model}${chi}`;
}

/**
 * Draws the figures of a size series.
 *
 * Parameters
 * ----------
 * series : SizeSeries
 *     From sizeSeries.
 * options : SizeFiguresOptions, optional
 *     `document` (required outside a browser), `width` in px (default 720).
 *
 * Returns
 * -------
 * Partial<Record<SizeFigureName, string>>
 *     SVG markup per figure (`xmlns` on the root): `gap` (tunnelling gap and single-particle
 *     gap against R with their model fits and the Brus optical gap), `chargingEnergy` (Ec against
 *     1/R with its fits), `levelSpacing` (Δsp against 1/R²), `valence` (first VB spacing against
 *     R), and `optical` when the series has optical rows and a material (optical peaks against R
 *     beside the tunnelling level pairs less J_eh). Error bars are the dots' standard errors.
 *
 * Throws
 * ------
 * DotspecError
 *     `report/no-document` without a document outside a browser.
 *
 * Example
 * -------
 * ```ts
 * const figures = sizeFigures(series, { document: new JSDOM("").window.document });
 * writeTextFile("report/sizes-gap.svg", figures.gap!);
 * ```
 */
export function sizeFigures(series: SizeSeries, options: SizeFiguresOptions = {}): Partial<Record<SizeFigureName, string>> {
  const document = options.document ?? (globalThis as { document?: Document }).document;
  if (!document) {
    throw new DotspecError(
      "report/no-document",
      'sizeFigures needs a DOM document outside a browser: pass { document: new JSDOM("").window.document }, or use loadSizeFigures(), which does it for you',
    );
  }
  const C = SIZE_FIGURE_DEFAULTS.colors;
  const width = options.width ?? SIZE_FIGURE_DEFAULTS.width;
  const grid = radiusGrid(series);
  const m = series.material;
  const materialWords = m ? `${m.name}: Eg ${m.bandGapEV} eV, mₑ* ${m.electronMassE}, m_h* ${m.holeMassE}, ε ${m.dielectricConstant}` : "no material: no models";
  const byR: XOf = (r) => r;
  const byInvR: XOf = (r) => 1 / r;
  const byInvR2: XOf = (r) => 1 / (r * r);
  const out: Partial<Record<SizeFigureName, string>> = {};

  const gapCurves = modelCurves(series, ["gapEV", "singleParticleGapEV"], grid, byR, (f) => `${f.quantity === "gapEV" ? "gap" : "single-particle gap"}: ${fitLabel(f)}`);
  if (m && !series.fits.some((f) => f.model === "brus")) {
    gapCurves.push({ name: "Brus optical gap (comparison)", color: C.brus, dashed: true, line: grid.map((r) => ({ x: r, y: brusGap(r, m).gapEV })) });
  }
  out.gap = drawPanel(document, width, {
    title: "Gap against radius",
    subtitle: `tunnelling gap and single-particle gap (gap − Ec), mean ± SE per dot; ${materialWords}`,
    xLabel: "radius R (nm)",
    yLabel: "energy (eV)",
    points: [measured(series, "gapEV", "tunnelling gap", C.gap, byR), measured(series, "singleParticleGapEV", "single-particle gap", C.singleParticleGap, byR)],
    curves: gapCurves,
  });
  out.chargingEnergy = drawPanel(document, width, {
    title: "Charging energy against 1/R",
    subtitle: "Ec (addition energy), mean ± SE per dot; a sphere's self-capacitance gives Ec = e²/(4πε₀·ε_eff·R) + c₀",
    xLabel: "1/R (1/nm)",
    yLabel: "Ec (eV)",
    points: [measured(series, "chargingEnergyEV", "Ec", C.chargingEnergy, byInvR)],
    curves: modelCurves(series, ["chargingEnergyEV"], grid, byInvR, fitLabel),
  });
  out.levelSpacing = drawPanel(document, width, {
    title: "s–p spacing against 1/R²",
    subtitle: "Δsp, mean ± SE per dot; parabolic confinement is a straight line through 0 here",
    xLabel: "1/R² (1/nm²)",
    yLabel: "Δsp (eV)",
    points: [measured(series, "levelSpacingSPEV", "Δsp", C.levelSpacingSP, byInvR2)],
    curves: modelCurves(series, ["levelSpacingSPEV"], grid, byInvR2, fitLabel),
  });
  out.valence = drawPanel(document, width, {
    title: "Valence-band spacing against radius",
    subtitle: "first VB group spacing (v1 → v2), mean ± SE per dot",
    xLabel: "radius R (nm)",
    yLabel: "VB spacing (eV)",
    points: [measured(series, "valenceSpacing1EV", "VB spacing 1→2", C.valence, byR)],
    curves: modelCurves(series, ["valenceSpacing1EV"], grid, byR, fitLabel),
  });
  if (m && series.optical && series.optical.length) {
    // One colour per assigned pair label: the optical peak (×) and the prediction (●) of its pair.
    const labels = [...new Set(series.optical.flatMap((row) => row.peaks.flatMap((k) => (k.assigned ? [k.assigned.label] : []))))].sort();
    const colorOf = (label: string | null) => (label === null ? C.optical : C.models[(labels.indexOf(label) + 1) % C.models.length]);
    const peaksBy = new Map<string | null, PointSet>();
    const predictedBy = new Map<string, PointSet>();
    for (const row of series.optical) {
      for (const k of row.peaks) {
        const label = k.assigned?.label ?? null;
        const set = peaksBy.get(label) ?? { name: label === null ? "optical peak, no pair" : `optical peak → ${label}`, color: colorOf(label), symbol: "times" as const, points: [] };
        set.points.push({ x: row.radiusNM, y: k.peakEV, lo: null, hi: null, title: `R ${row.radiusNM} nm: optical peak ${k.peakEV.toFixed(3)} eV${label ? ` → ${label}` : ""}` });
        peaksBy.set(label, set);
        if (k.assigned) {
          const pred = predictedBy.get(k.assigned.label) ?? { name: `${k.assigned.label} − J_eh (tunnelling)`, color: colorOf(k.assigned.label), points: [] };
          pred.points.push({ x: row.radiusNM, y: k.assigned.predictedEV, lo: null, hi: null, title: `R ${row.radiusNM} nm: ${k.assigned.label} predicted ${k.assigned.predictedEV.toFixed(3)} eV (mismatch ${k.assigned.mismatchEV.toFixed(3)})` });
          predictedBy.set(k.assigned.label, pred);
        }
      }
    }
    out.optical = drawPanel(document, width, {
      title: "Optical peaks paired with tunnelling levels",
      subtitle: `× optical peak, ● its assigned (VB, CB) pair E_CB − E_VB − J_eh from the dots of that size (J_eh = 1.786·e²/(4πε₀·ε·R), ε ${m.dielectricConstant})`,
      xLabel: "radius R (nm)",
      yLabel: "energy (eV)",
      points: [...predictedBy.values(), ...peaksBy.values()],
      curves: [],
    });
  }
  return out;
}

function drawPanel(document: Document, width: number, panel: Panel): string {
  const D = SIZE_FIGURE_DEFAULTS;
  const C = D.colors;
  const marks: Plot.Markish[] = [Plot.frame({ stroke: "#d0d0d0" })];
  for (const c of panel.curves) {
    if (c.line.length > 1) marks.push(Plot.line(c.line, { x: "x", y: "y", stroke: c.color, strokeWidth: 1.6, ...(c.dashed ? { strokeDasharray: "6,4" } : {}) }));
  }
  for (const s of panel.points) {
    const bars = s.points.filter((p) => p.lo !== null && p.hi !== null);
    if (bars.length) marks.push(Plot.ruleX(bars, { x: "x", y1: "lo", y2: "hi", stroke: s.color, strokeWidth: 1.2 }));
    marks.push(
      Plot.dot(s.points, {
        x: "x",
        y: "y",
        r: D.dotRadius,
        symbol: s.symbol ?? "circle",
        fill: s.symbol === "times" ? null : s.color,
        stroke: s.symbol === "times" ? s.color : C.background,
        strokeWidth: s.symbol === "times" ? 2 : 1,
        title: "title",
      }),
    );
  }
  const empty = panel.points.every((s) => s.points.length === 0) && panel.curves.every((c) => c.line.length === 0);
  if (empty) marks.push(Plot.text(["no dot has this quantity"], { frameAnchor: "middle", fill: C.subtitle, fontSize: 13 }));
  const plotHeight = D.height - D.headerHeight;
  const plot = Plot.plot({
    document,
    width,
    height: plotHeight,
    marginLeft: D.marginLeft,
    marginRight: D.marginRight,
    marginTop: 26,
    marginBottom: 40,
    style: { background: "transparent" },
    x: { label: panel.xLabel, labelAnchor: "center", labelArrow: "none", nice: true },
    y: { label: panel.yLabel, grid: true, nice: true },
    marks,
  });
  for (const style of Array.from(plot.querySelectorAll("style"))) style.remove();

  type Swatch = "circle" | "times" | "line" | "dashed";
  const entries: [string, string, Swatch][] = [
    ...panel.points.filter((s) => s.points.length).map((s): [string, string, Swatch] => [s.name, s.color, s.symbol ?? "circle"]),
    ...panel.curves.filter((c) => c.line.length > 1).map((c): [string, string, Swatch] => [c.name, c.color, c.dashed ? "dashed" : "line"]),
  ];
  const placed: { text: string; fill: string; swatch: Swatch; x: number; row: number }[] = [];
  let lx = 0;
  let row = 0;
  for (const [text, fill, swatch] of entries) {
    const w = 34 + text.length * 6.4;
    if (lx > 0 && 16 + lx + w > width - 8) {
      lx = 0;
      row++;
    }
    placed.push({ text, fill, swatch, x: lx, row });
    lx += w;
  }
  const header = D.headerHeight + row * D.legendRowHeight;
  const height = header + plotHeight;
  const el = svgMaker(document);
  const root = svgRoot(el, width, height, D.fontFamily);
  root.append(
    el("title", {}, panel.title),
    el("rect", { width, height, fill: C.background }),
    el("text", { x: 16, y: 22, "font-size": 15, "font-weight": 600, fill: C.title }, panel.title),
    el("text", { x: 16, y: 40, fill: C.subtitle, "font-size": 11 }, panel.subtitle),
  );
  const legend = el("g", { transform: "translate(16, 50)", "font-size": 11, fill: C.subtitle });
  for (const e of placed) {
    const y = e.row * D.legendRowHeight;
    const swatch =
      e.swatch === "line"
        ? el("rect", { x: e.x, y: y + 4, width: 14, height: 2.5, fill: e.fill })
        : e.swatch === "dashed"
          ? el("line", { x1: e.x, y1: y + 5, x2: e.x + 14, y2: y + 5, stroke: e.fill, "stroke-width": 2, "stroke-dasharray": "4,2" })
          : e.swatch === "times"
            ? el("path", { d: `M${e.x + 1},${y + 1}L${e.x + 9},${y + 9}M${e.x + 9},${y + 1}L${e.x + 1},${y + 9}`, stroke: e.fill, "stroke-width": 2 })
            : el("circle", { cx: e.x + 5, cy: y + 5, r: 4, fill: e.fill });
    legend.append(swatch, el("text", { x: e.x + 18, y: y + 9 }, e.text));
  }
  root.append(legend);
  plot.setAttribute("x", "0");
  plot.setAttribute("y", String(header));
  root.append(plot);
  return root.outerHTML.replaceAll("&nbsp;", "&#160;");
}
