/**
 * The figure of one grid map: the map as a raster in nm, a colour-blind-safe perceptual colour
 * scale, a scale bar, the centre and the numbers that describe its shape, as one SVG document.
 *
 * This module loads Observable Plot when imported: use {@link loadGridMapFigure}.
 */
import * as Plot from "@observablehq/plot";
import type { GridMap } from "../grid/analyzeGrid.ts";
import { DotspecError } from "../util/errors.ts";

/** Options of {@link gridMapFigure}. */
export interface GridMapFigureOptions {
  /** The DOM document the SVG is built in (with a canvas; see {@link loadGridMapFigure}). Default: `globalThis.document`. */
  document?: Document;
  /** Width of the figure in px. Default 420 (GRID_MAP_FIGURE_DEFAULTS.width). */
  width?: number;
  /** Title line. Default: the map's label, bias and kind. */
  title?: string;
}

/** Layout of {@link gridMapFigure} (locked by a test). */
export const GRID_MAP_FIGURE_DEFAULTS = Object.freeze({
  width: 420,
  marginLeft: 48,
  marginRight: 16,
  marginTop: 16,
  marginBottom: 40,
  /** Perceptually uniform and readable with colour-vision deficiencies. */
  scheme: "viridis",
  /** The scale bar is the largest of these lengths (nm) that fits in this fraction of the map width. */
  scaleBarLengthsNM: Object.freeze([0.2, 0.5, 1, 2, 5, 10, 20, 50, 100]),
  scaleBarMaxFraction: 0.3,
  fontFamily: "system-ui, -apple-system, 'Segoe UI', sans-serif",
});

const UNIT_LABEL = { S: ["dI/dV", "nS", 1e9], A: ["current", "pA", 1e12] } as const;

/**
 * Draws one map as a standalone SVG document.
 *
 * Parameters
 * ----------
 * map : GridMap
 *     A map of {@link analyzeGrid}.
 * options : GridMapFigureOptions
 *     `document` (required outside a browser, with canvas support), width in px (default 420), title.
 *
 * Returns
 * -------
 * string
 *     SVG markup with `xmlns` on the root: the title, a line with RMS radius, dip depth and
 *     roundness, the raster (x and y in nm, equal scales, y up), a colour legend in nS (dI/dV) or
 *     pA (integrals and currents), a white scale bar and a cross at the centre.
 *
 * Throws
 * ------
 * DotspecError
 *     `report/no-document` without a document.
 *
 * Example
 * -------
 * ```ts
 * const draw = await loadGridMapFigure();
 * writeTextFile("grid/s.svg", draw(grid.maps[1]));
 * ```
 */
export function gridMapFigure(map: GridMap, options: GridMapFigureOptions = {}): string {
  const D = GRID_MAP_FIGURE_DEFAULTS;
  const document = options.document ?? (globalThis as { document?: Document }).document;
  if (!document) throw new DotspecError("report/no-document", "gridMapFigure needs a DOM document outside a browser: use loadGridMapFigure(), which makes one");
  const { xNM, yNM, values } = map.image;
  const nx = xNM.count, ny = yNM.count;
  const x1 = xNM.start - xNM.step / 2, x2 = xNM.start + (nx - 0.5) * xNM.step;
  const y1 = yNM.start - yNM.step / 2, y2 = yNM.start + (ny - 0.5) * yNM.step;
  const width = options.width ?? D.width;
  const plotW = width - D.marginLeft - D.marginRight;
  const height = Math.round(D.marginTop + D.marginBottom + plotW * ((y2 - y1) / (x2 - x1)));
  const [quantity, unit, scale] = map.kind === "multiplet" ? (["∫ dI/dV dV", "pA", 1e12] as const) : UNIT_LABEL[map.unit];
  // Rows drawn top to bottom: the raster's first row is the largest y.
  const data = new Float64Array(nx * ny);
  let lo = 0, hi = 0;
  for (let iy = 0; iy < ny; iy++)
    for (let ix = 0; ix < nx; ix++) {
      const v = values[iy * nx + ix] * scale;
      data[(ny - 1 - iy) * nx + ix] = v;
      if (v > hi) hi = v;
      if (v < lo) lo = v;
    }
  const span = x2 - x1;
  const bar = [...D.scaleBarLengthsNM].reverse().find((l) => l <= D.scaleBarMaxFraction * span) ?? D.scaleBarLengthsNM[0];
  const bx = x1 + 0.06 * span, by = y1 + 0.07 * (y2 - y1);
  const marks: Plot.Markish[] = [
    Plot.raster(Array.from(data), { width: nx, height: ny, x1, x2, y1: y2, y2: y1, imageRendering: "pixelated" }),
    Plot.ruleY([by], { x1: bx, x2: bx + bar, stroke: "white", strokeWidth: 3 }),
    Plot.text([`${bar} nm`], { x: bx + bar / 2, y: by, dy: -9, fill: "white", fontSize: 11, fontWeight: 600 }),
  ];
  if (map.centreNM) marks.push(Plot.dot([map.centreNM], { x: (d: number[]) => d[0], y: (d: number[]) => d[1], symbol: "plus", stroke: "white", r: 5, strokeWidth: 1.5 }));
  const plot = Plot.plot({
    document,
    width,
    height,
    marginLeft: D.marginLeft,
    marginRight: D.marginRight,
    marginTop: D.marginTop,
    marginBottom: D.marginBottom,
    style: { background: "white", fontFamily: D.fontFamily },
    x: { domain: [x1, x2], label: "x (nm)" },
    y: { domain: [y1, y2], label: "y (nm)" },
    color: { type: "linear", scheme: D.scheme, domain: [Math.min(0, lo), hi > lo ? hi : lo + 1], legend: true, label: `${quantity} (${unit})` },
    marks,
  });
  const fmt = (v: number | null, d = 2) => (v === null ? "–" : v.toFixed(d));
  const title = options.title ?? `${map.label} — ${map.kind === "multiplet" ? `${map.rangeV[0].toFixed(3)} to ${map.rangeV[1].toFixed(3)} V` : `${map.biasV.toFixed(3)} V`}`;
  const sub = `RMS radius ${fmt(map.rmsRadiusNM)} nm · dip ${fmt(map.dipDepth)} · roundness ${fmt(map.roundness)} · ${map.pixelsAboveFloor} px above floor`;
  const svgNS = "http://www.w3.org/2000/svg";
  const figure = plot as unknown as Element;
  // A legend makes Plot return a <figure>; collect its svgs into one standalone SVG document.
  const parts = figure.tagName.toLowerCase() === "svg" ? [figure] : Array.from(figure.querySelectorAll("svg"));
  let y = 44;
  let inner = "";
  for (const [i, p] of parts.entries()) {
    const h = Number(p.getAttribute("height") ?? 0);
    // The legend comes first; it is indented so its label is not cut at the left edge.
    inner += `<g transform="translate(${i === 0 && parts.length > 1 ? 12 : 0},${y})">${p.outerHTML}</g>`;
    y += h + 6;
  }
  const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;");
  return (
    `<svg xmlns="${svgNS}" xmlns:xlink="http://www.w3.org/1999/xlink" width="${width}" height="${y}" viewBox="0 0 ${width} ${y}" font-family="${D.fontFamily}">` +
    `<rect width="100%" height="100%" fill="white"/>` +
    `<text x="12" y="18" font-size="14" font-weight="600" fill="#1d1d1f">${esc(title)}</text>` +
    `<text x="12" y="36" font-size="11" fill="#5c5c60">${esc(sub)}</text>` +
    inner +
    `</svg>`
  );
}
