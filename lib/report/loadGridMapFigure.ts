/**
 * On-demand loading of the grid map figure: Observable Plot, and in Node jsdom with a PNG canvas
 * for the raster. Browser-safe: a page draws in its own document, on its own canvas, so the notebook
 * and `dotspec grid --out` draw their maps with the same code.
 */
import type { GridMap } from "../grid/analyzeGrid.ts";
import type { GridMapFigureOptions } from "./gridMapFigure.ts";
import { figureDocument } from "./figureDocument.ts";

/** {@link gridMapFigure} with its document bound. */
export type GridMapFigureRenderer = (map: GridMap, options?: Omit<GridMapFigureOptions, "document">) => string;

/**
 * Loads the figure code and returns the figure function.
 *
 * Parameters
 * ----------
 * document : Document, optional
 *     The document to draw in; default a jsdom document (Node) or the page's (browser).
 *
 * Returns
 * -------
 * Promise<GridMapFigureRenderer>
 *     The figure function: a map (and its options) in, an SVG string out.
 *
 * Example
 * -------
 * ```ts
 * const grid = analyzeGrid(readGridFile("sample-curves/grid/dot-grid.npy").cube, { eta: 0.8 });
 * const draw = await loadGridMapFigure();
 * draw(grid.maps[0]).startsWith("<svg"); // => true
 * ```
 */
export async function loadGridMapFigure(document?: Document): Promise<GridMapFigureRenderer> {
  const [{ gridMapFigure }, doc] = await Promise.all([import("./gridMapFigure.ts"), document ?? rasterDocument()]);
  return (map, options = {}) => gridMapFigure(map, { ...options, document: doc });
}

/** The figure document, given a canvas in Node (jsdom has none; the raster mark draws on one). */
async function rasterDocument(): Promise<Document> {
  const doc = await figureDocument();
  if ((globalThis as { document?: Document }).document === doc) return doc;
  // A variable specifier keeps browser bundlers from pulling node:zlib into a page (which has a canvas of its own).
  const zlib = "node:zlib";
  const [{ withPngCanvas }, { deflateSync }] = await Promise.all([import("./pngCanvas.ts"), import(/* @vite-ignore */ zlib) as Promise<typeof import("node:zlib")>]);
  return withPngCanvas(doc, deflateSync);
}
