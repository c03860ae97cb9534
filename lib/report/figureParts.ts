/**
 * Pieces the figures share: the current's SI prefix, thinning long lines for a plot's width,
 * round tick values (for the energy axis) and the base name of a source path.
 */
import { formatEta } from "./formatUncertain.ts";

/** Current unit for the I–V axis: the prefix that puts the largest |I| between 1 and 1000. */
export function currentUnit(currentA: ArrayLike<number>): { label: string; scale: number } {
  let m = 0;
  for (let i = 0; i < currentA.length; i++) m = Math.max(m, Math.abs(currentA[i]));
  const units: [string, number][] = [["fA", 1e15], ["pA", 1e12], ["nA", 1e9], ["µA", 1e6], ["mA", 1e3]];
  for (const [label, scale] of units) if (m * scale < 1000) return { label, scale };
  return { label: "A", scale: 1 };
}

/**
 * Keeps the shape of a long line for a plot `columns` px wide: the first, lowest, highest and last
 * point of each column (in bias order), so no peak or step is lost. Short lines are returned whole.
 */
export function envelope(x: ArrayLike<number>, y: ArrayLike<number>, columns: number, scale: number): { x: number[]; y: number[] } {
  const n = x.length;
  const xs: number[] = [];
  const ys: number[] = [];
  if (n <= 4 * columns) {
    for (let i = 0; i < n; i++) {
      xs.push(x[i]);
      ys.push(y[i] * scale);
    }
    return { x: xs, y: ys };
  }
  const x0 = x[0];
  const span = x[n - 1] - x0 || 1;
  let start = 0;
  while (start < n) {
    const col = Math.min(columns - 1, Math.floor(((x[start] - x0) / span) * columns));
    let end = start;
    while (end + 1 < n && Math.min(columns - 1, Math.floor(((x[end + 1] - x0) / span) * columns)) === col) end++;
    let lo = start;
    let hi = start;
    for (let i = start; i <= end; i++) {
      if (y[i] < y[lo]) lo = i;
      if (y[i] > y[hi]) hi = i;
    }
    for (const i of [...new Set([start, Math.min(lo, hi), Math.max(lo, hi), end])]) {
      xs.push(x[i]);
      ys.push(y[i] * scale);
    }
    start = end + 1;
  }
  return { x: xs, y: ys };
}

/** The last part of a path (after the last "/" or "\\"), or the whole source when it has none. */
export function sourceBaseName(source: string): string {
  const i = Math.max(source.lastIndexOf("/"), source.lastIndexOf("\\"));
  const base = i >= 0 ? source.slice(i + 1) : source;
  return base === "" ? source : base;
}

/** Round tick values covering [lo, hi]: steps of 1, 2 or 5 × 10^k, about `count` of them. */
export function niceTicks(lo: number, hi: number, count: number): number[] {
  const span = hi - lo;
  if (!(span > 0) || !Number.isFinite(span)) return [];
  const raw = span / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((m) => m >= raw) ?? 10 * power;
  const out: number[] = [];
  for (let k = Math.ceil(lo / step); k * step <= hi + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/**
 * Options of a Plot x scale that draws an energy axis (eV, η × bias) on top of a bias scale:
 * round energies E placed at bias E/η. With η not given, η = 1 and the label says so.
 */
export function energyAxis(domain: [number, number], energies: { eta: number; etaGiven: boolean }, count: number) {
  const eta = energies.eta;
  const ticks = niceTicks(Math.min(domain[0], domain[1]) * eta, Math.max(domain[0], domain[1]) * eta, count);
  const decimals = ticks.length > 1 ? Math.max(0, -Math.floor(Math.log10(ticks[1] - ticks[0]) + 1e-9)) : 1;
  return {
    domain,
    axis: "top" as const,
    ticks: ticks.map((e) => e / eta),
    // Plot writes negative ticks with a minus sign (U+2212); so does this axis.
    tickFormat: (v: number) => (v * eta).toFixed(decimals).replace(/^-(?=.*[1-9])/, "\u2212").replace(/^-/, ""),
    label: energies.etaGiven ? `energy after η = ${formatEta(eta)} (eV)` : "energy (eV; η not given, taken as 1)",
    labelAnchor: "center" as const,
    labelArrow: "none" as const,
  };
}

/**
 * Attributes that tell a page how the figure's panels map bias to px, so it can follow the
 * pointer across them: the bias range (V) and the px range of the plot area (of the figure's
 * viewBox), the panels' top and bottom (px), and η.
 */
export function axisAttributes(domain: [number, number], plotX: [number, number], panelsY: [number, number], eta: number): Record<string, string> {
  return {
    "data-bias-range-v": `${domain[0]} ${domain[1]}`,
    "data-plot-x-px": `${plotX[0]} ${plotX[1]}`,
    "data-panels-y-px": `${panelsY[0]} ${panelsY[1]}`,
    "data-eta": String(eta),
  };
}

/** The SVG namespace of every figure. */
export const SVG_NS = "http://www.w3.org/2000/svg";

/** Makes SVG elements in `document`: `el(name, attributes, text?)`. */
export function svgMaker(document: Document): (name: string, attrs: Record<string, string | number>, text?: string) => Element {
  return (name, attrs, text) => {
    const e = document.createElementNS(SVG_NS, name);
    for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, String(v));
    if (text !== undefined) e.textContent = text;
    return e;
  };
}

/** The root `<svg>` of a figure of width × height px in the given font, with any further attributes. */
export function svgRoot(el: ReturnType<typeof svgMaker>, width: number, height: number, fontFamily: string, extra: Record<string, string> = {}): Element {
  return el("svg", { xmlns: SVG_NS, width, height, viewBox: `0 0 ${width} ${height}`, "font-family": fontFamily, "font-size": 12, ...extra });
}
