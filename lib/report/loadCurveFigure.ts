/**
 * On-demand loading of the figure code (the curve figure and the model figure). Observable Plot and jsdom take most of a second to
 * import; the public entry point stays light by importing them only when a figure is wanted.
 */
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import type { CurveFigureOptions } from "./curveFigure.ts";
import type { ModelFigureOptions } from "./modelFigure.ts";
import { figureDocument } from "./figureDocument.ts";

/** {@link curveFigure} with its document bound. */
export type CurveFigureRenderer = (analysis: CurveAnalysis, options?: Omit<CurveFigureOptions, "document">) => string;

/**
 * Loads Observable Plot (and, outside a browser, jsdom) and returns the figure function.
 *
 * Parameters
 * ----------
 * document : Document, optional
 *     The DOM document to draw in. Default: `globalThis.document` in a browser; in Node a new
 *     jsdom document, created once and reused by every call of the returned function.
 *
 * Returns
 * -------
 * Promise<CurveFigureRenderer>
 *     `(analysis, options?) => svg`: {@link curveFigure} with the document bound.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * const analysis = analyzeCurve(curve);
 * const curveFigure = await loadCurveFigure();
 * curveFigure(analysis, { curve }).startsWith("<svg"); // => true
 * ```
 */
export async function loadCurveFigure(document?: Document): Promise<CurveFigureRenderer> {
  const [{ curveFigure }, doc] = await Promise.all([import("./curveFigure.ts"), document ?? figureDocument()]);
  return (analysis, options = {}) => curveFigure(analysis, { ...options, document: doc });
}

/** {@link modelFigure} with its document bound. */
export type ModelFigureRenderer = (analysis: CurveAnalysis, options?: Omit<ModelFigureOptions, "document">) => string;

/**
 * Loads Observable Plot (and, outside a browser, jsdom) and returns the model figure function.
 *
 * Parameters
 * ----------
 * document : Document, optional
 *     As for {@link loadCurveFigure}.
 *
 * Returns
 * -------
 * Promise<ModelFigureRenderer>
 *     `(analysis, { model, fit }?) => svg`: {@link modelFigure} with the document bound.
 *
 * Example
 * -------
 * ```ts
 * const analysis = analyzeCurve(readCurveFile("sample-curves/dot-01.csv").curve);
 * const modelFigure = await loadModelFigure();
 * modelFigure(analysis, { fit: fitCurve(analysis) }).startsWith("<svg"); // => true
 * ```
 */
export async function loadModelFigure(document?: Document): Promise<ModelFigureRenderer> {
  const [{ modelFigure }, doc] = await Promise.all([import("./modelFigure.ts"), document ?? figureDocument()]);
  return (analysis, options = {}) => modelFigure(analysis, { ...options, document: doc });
}
