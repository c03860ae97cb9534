/**
 * The figure of a curve against the physics model: the measured current and dI/dV with a model
 * curve (for example a scenario simulated from a notebook's controls) and the fitted model laid
 * over them, and the fit's residuals. One standalone SVG document drawn with Observable Plot.
 *
 * Like {@link curveFigure}, this module loads Observable Plot when imported: the public entry
 * loads it on demand through {@link loadModelFigure}.
 */
import * as Plot from "@observablehq/plot";
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import type { CurveFit } from "../model/fit/index.ts";
import { DotspecError } from "../util/errors.ts";
import { axisAttributes, currentUnit, energyAxis, envelope, sourceBaseName, svgMaker, svgRoot } from "./figureParts.ts";

/** A model curve to draw: `simulateCurve`'s result fits as it is. */
export interface ModelCurve {
  /** Bias, V, ascending. */
  biasV: ArrayLike<number>;
  /** Model current, A. */
  currentA: ArrayLike<number>;
  /** Model dI/dV, S; null or absent: not drawn. */
  didvS?: ArrayLike<number> | null;
}

/** Options of {@link modelFigure}. */
export interface ModelFigureOptions {
  /** The DOM document to build in. Default: `globalThis.document` (a browser). */
  document?: Document;
  /** A model curve to overlay (e.g. simulated from chosen parameters). Default: none. */
  model?: ModelCurve | null;
  /** A fit of the curve ({@link fitCurve}): its model is overlaid and its residuals drawn. Default: none. */
  fit?: CurveFit | null;
  /** Width in px. Default 760. */
  width?: number;
  /** Title line. Default: the source's base name and what is drawn. */
  title?: string;
}

/** Layout and colours of {@link modelFigure} (locked by a test). */
export const MODEL_FIGURE_DEFAULTS = Object.freeze({
  width: 760,
  /** Title and legend, px. */
  headerHeight: 62,
  /** I–V panel with the energy axis on top, px. */
  currentPanelHeight: 240,
  /** dI/dV panel, px. */
  conductancePanelHeight: 220,
  /** Residual panel (with a fit), px. */
  residualPanelHeight: 150,
  marginLeft: 72,
  marginRight: 24,
  energyTicks: 10,
  fontFamily: "system-ui, -apple-system, 'Segoe UI', sans-serif",
  colors: Object.freeze({
    background: "#ffffff",
    title: "#1d1d1f",
    subtitle: "#5c5c60",
    /** The measured curve. */
    measured: "#6b6b6b",
    /** The model from chosen parameters (Okabe–Ito vermillion). */
    model: "#D55E00",
    /** The fitted model (Okabe–Ito blue). */
    fitted: "#0072B2",
    /** The ±1σ noise band of the residuals. */
    noise: "#e3e3e3",
    zero: "#c9c9c9",
  }),
});


/**
 * Draws a measured curve against the model as a standalone SVG document.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     From {@link analyzeCurve}: the measured, offset-corrected current and the smoothed dI/dV.
 * options : ModelFigureOptions, optional
 *     `model` (a model curve to overlay), `fit` (a {@link fitCurve} result), `document`
 *     (required outside a browser), `width` in px (default 760), `title`.
 *
 * Returns
 * -------
 * string
 *     SVG markup: a title block with a legend, then panels sharing the bias axis: the current in
 *     the SI prefix that suits it under an energy axis in eV (η × bias), with the model and the
 *     fitted model; the dI/dV in nS with the model's dI/dV; with a fit, its residuals
 *     (data − fitted model) in the same current unit over the ±1σ band of the current noise. The
 *     root carries the same `data-*` axis attributes as {@link curveFigure}.
 *
 * Throws
 * ------
 * DotspecError
 *     `report/no-document` without a document outside a browser.
 *
 * Notes
 * -----
 * 1. Lines longer than 2 points per px keep each px column's first, lowest, highest and last
 *    point (as in {@link curveFigure}).
 * 2. The fit's curves are on its own (thinned) bias points; they are drawn as they are.
 *
 * Example
 * -------
 * ```ts
 * const svg = modelFigure(analysis, { document, model: simulateCurve(startingScenario(analysis), { method: "fast" }) });
 * ```
 */
export function modelFigure(analysis: CurveAnalysis, options: ModelFigureOptions = {}): string {
  const D = MODEL_FIGURE_DEFAULTS;
  const C = D.colors;
  const document = options.document ?? (globalThis as { document?: Document }).document;
  if (!document) {
    throw new DotspecError("report/no-document", "modelFigure needs a DOM document outside a browser: pass { document }, or use loadModelFigure(), which does it for you");
  }
  const width = options.width ?? D.width;
  const sig = analysis.conductance;
  const biasV = sig.biasV;
  const n = biasV.length;
  const domain: [number, number] = [biasV[0], biasV[n - 1]];
  const columns = Math.max(50, Math.round((width - D.marginLeft - D.marginRight) / 2));
  const unit = currentUnit(sig.currentA);
  const model = options.model ?? null;
  const fit = options.fit ?? null;
  const line = (x: ArrayLike<number>, y: ArrayLike<number>, scale: number, stroke: string, extra: Record<string, unknown> = {}) => {
    const e = envelope(x, y, columns, scale);
    return Plot.line(e.x, { x: e.x, y: e.y, stroke, strokeWidth: 1.5, ...extra });
  };
  const common = { document, width, marginLeft: D.marginLeft, marginRight: D.marginRight, style: { background: "transparent" } };
  const hidden = { domain, label: null, tickFormat: () => "" };
  const biasAxis = { domain, label: "sample bias (V)", labelAnchor: "center", labelArrow: "none" } as const;

  const currentMarks: Plot.Markish[] = [Plot.ruleY([0], { stroke: C.zero }), line(biasV, sig.currentA, unit.scale, C.measured, { strokeWidth: 1 })];
  if (model) currentMarks.push(line(model.biasV, model.currentA, unit.scale, C.model));
  if (fit) currentMarks.push(line(fit.residuals.biasV, fit.residuals.modelA, unit.scale, C.fitted, { strokeDasharray: "5,3" }));
  const top = Plot.plot({
    ...common,
    height: D.currentPanelHeight,
    marginTop: 52,
    marginBottom: 10,
    x: energyAxis(domain, analysis.assignment.energies, D.energyTicks),
    y: { label: `current (${unit.label})`, grid: true, nice: true },
    marks: currentMarks,
  });

  const didvMarks: Plot.Markish[] = [Plot.ruleY([0], { stroke: C.zero }), line(biasV, sig.didvS, 1e9, C.measured, { strokeWidth: 1 })];
  if (model?.didvS) didvMarks.push(line(model.biasV, model.didvS, 1e9, C.model));
  const middle = Plot.plot({
    ...common,
    height: D.conductancePanelHeight,
    marginTop: 22,
    marginBottom: fit ? 10 : 40,
    x: fit ? hidden : biasAxis,
    y: { label: "dI/dV (nS)", grid: true, nice: true },
    marks: didvMarks,
  });
  const panels: [SVGElement | HTMLElement, number][] = [
    [top, D.currentPanelHeight],
    [middle, D.conductancePanelHeight],
  ];
  if (fit) {
    const noise = sig.record.noiseCurrentA * unit.scale;
    panels.push([
      Plot.plot({
        ...common,
        height: D.residualPanelHeight,
        marginTop: 22,
        marginBottom: 40,
        x: biasAxis,
        y: { label: `residual, data − fitted model (${unit.label})`, grid: true, nice: true },
        marks: [
          Plot.rect([0], { x1: domain[0], x2: domain[1], y1: -noise, y2: noise, fill: C.noise }),
          Plot.ruleY([0], { stroke: C.zero }),
          line(fit.residuals.biasV, fit.residuals.residualA, unit.scale, C.fitted, { strokeWidth: 1 }),
        ],
      }),
      D.residualPanelHeight,
    ]);
  }

  const legend: [string, string][] = [["measured", C.measured]];
  if (model) legend.push(["model (chosen parameters)", C.model]);
  if (fit) legend.push([`fitted model (reduced χ² ${fit.reducedChiSquare.toPrecision(3)})`, C.fitted]);
  if (fit) legend.push(["±1σ current noise", C.noise]);

  const height = D.headerHeight + panels.reduce((s, [, h]) => s + h, 0);
  const el = svgMaker(document);
  const root = svgRoot(el, width, height, D.fontFamily, axisAttributes(domain, [D.marginLeft, width - D.marginRight], [D.headerHeight, height], analysis.assignment.energies.eta));
  const title = options.title ?? `${sourceBaseName(analysis.source)}  —  measured curve and model`;
  root.append(el("title", {}, title), el("rect", { width, height, fill: C.background }), el("text", { x: 16, y: 24, "font-size": 15, "font-weight": 600, fill: C.title }, title));
  const g = el("g", { transform: "translate(16, 40)", "font-size": 11, fill: C.subtitle });
  let x = 0;
  for (const [text, fill] of legend) {
    g.append(el("rect", { x, y: 3, width: 14, height: 4, fill }), el("text", { x: x + 18, y: 9 }, text));
    x += 30 + text.length * 6.2;
  }
  root.append(g);
  let y = D.headerHeight;
  for (const [panel, h] of panels) {
    for (const style of Array.from(panel.querySelectorAll("style"))) style.remove();
    panel.setAttribute("x", "0");
    panel.setAttribute("y", String(y));
    y += h;
    root.append(panel);
  }
  return root.outerHTML.replaceAll("&nbsp;", "&#160;");
}
