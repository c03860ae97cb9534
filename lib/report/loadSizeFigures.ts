/**
 * On-demand loading of the size-series figures (Observable Plot, and jsdom in Node), so that the
 * public entry point stays light.
 */
import type { SizeSeries } from "../sizes/sizeSeries.ts";
import type { SizeFiguresOptions } from "./sizeFigures.ts";
import { figureDocument } from "./figureDocument.ts";

/** File names of the size figures in a report folder, by figure. */
export const SIZE_FIGURE_FILES = Object.freeze({
  gap: "sizes-gap.svg",
  chargingEnergy: "sizes-charging-energy.svg",
  levelSpacing: "sizes-level-spacing.svg",
  valence: "sizes-valence.svg",
  optical: "sizes-optical.svg",
});

/** The figures {@link loadSizeFigures}' function draws. */
export type SizeFigureName = keyof typeof SIZE_FIGURE_FILES;

/** {@link sizeFigures} with its document bound. */
export type SizeFiguresRenderer = (series: SizeSeries, options?: Omit<SizeFiguresOptions, "document">) => Partial<Record<SizeFigureName, string>>;

/**
 * Loads Observable Plot (and, outside a browser, jsdom) and returns the size-figure function.
 *
 * Parameters
 * ----------
 * document : Document, optional
 *     The DOM document to draw in. Default: `globalThis.document` in a browser; in Node a new
 *     jsdom document, created once.
 *
 * Returns
 * -------
 * Promise<SizeFiguresRenderer>
 *     `(series, options?) => { gap, chargingEnergy, levelSpacing, valence, optical? }` (SVG markup).
 *
 * Example
 * -------
 * ```ts
 * const curves = ["qd-7-s01-1.csv", "qd-7-s05-1.csv"].map((file, i) => ({
 *   file, dot: null, radiusNM: [1.5, 2][i], values: analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: 0.86 })),
 * }));
 * const sizeFigures = await loadSizeFigures();
 * sizeFigures(sizeSeries(curves)).gap!.startsWith("<svg"); // => true
 * ```
 */
export async function loadSizeFigures(document?: Document): Promise<SizeFiguresRenderer> {
  const [{ sizeFigures }, doc] = await Promise.all([import("./sizeFigures.ts"), document ?? figureDocument()]);
  return (series, options = {}) => sizeFigures(series, { ...options, document: doc });
}
