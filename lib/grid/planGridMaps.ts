/**
 * Which maps a grid gets: one per assigned peak (or per bias the user asks for), one per
 * multiplet, and the current map, each with the weights that compute it from a pixel's current.
 */
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import { checkFinite, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import type { GridAxis } from "./gridCube.ts";
import { mapFunctional, type GridFilter, type MapMeasure } from "./mapFunctional.ts";
import type { PixelFunctional } from "./pixelPass.ts";

/** One planned map. */
export interface GridMapSpec {
  /** "s1", "p3", "v1" (a peak), "p (multiplet)", "current", "at 0.700 V". */
  label: string;
  /** peak: dI/dV at an assigned peak; bias: dI/dV at a bias the user gave; multiplet: ∫ dI/dV over a multiplet; current: the current. */
  kind: "peak" | "bias" | "multiplet" | "current";
  /** The map's bias (the peak, the given bias, the middle of a multiplet's range, the current's bias), V. */
  biasV: number;
  /** Bias range the map averages or integrates over, V. */
  rangeV: [number, number];
  /** Label of the multiplet the map belongs to, or null. */
  multiplet: string | null;
  /** Unit of the map values: "S" (dI/dV) or "A" (integral, current). */
  unit: "S" | "A";
  /** The weights applied to each pixel's current. */
  functional: PixelFunctional;
}

/** Options of {@link planGridMaps}. */
export interface PlanGridMapsOptions {
  /** Biases for the peak maps in V, instead of the assigned peaks. Default: the assigned peaks. */
  atV?: readonly number[];
  /** Half width of the bias window a peak map averages over, mV. Default: GRID_MAP_DEFAULTS.peakWindowFraction (0.25) × the peak's FWHM, at least half a bias step. */
  peakHalfWindowMV?: number;
  /** Bias of the current map, V. Default: the outer end of the outermost CB multiplet's range, else the top of the bias axis. */
  currentAtV?: number;
}

/** Defaults of the map plan (locked by a test). */
export const GRID_MAP_DEFAULTS = Object.freeze({
  /** A peak map averages dI/dV over ± this fraction of the peak's FWHM (half the FWHM in all). */
  peakWindowFraction: 0.25,
  /** A multiplet map integrates from this many FWHM before its first peak to this many after its last … */
  multipletReachFWHM: 1,
  /** … but stops halfway to the nearest peak outside the multiplet. */
  neighbourStopFraction: 0.5,
});

/**
 * Plans the maps of a grid from the analysis of its reference spectrum.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The reference spectrum's analysis ({@link analyzeCurve}).
 * bias : GridAxis
 *     The cube's bias axis, V.
 * filter : GridFilter
 *     The Savitzky–Golay window and order every pixel shares.
 * options : PlanGridMapsOptions, optional
 *     atV (V, default the assigned peaks), peakHalfWindowMV (mV, default 0.25 × FWHM),
 *     currentAtV (V, default the end of the CB multiplets).
 *
 * Returns
 * -------
 * GridMapSpec[]
 *     Peak (or bias) maps in bias order, then one map per multiplet, then the current map.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for a bad bias or window; `grid/empty-range` for a bias outside the axis.
 *
 * Notes
 * -----
 * 1. Peak maps: for each peak of each multiplet, dI/dV averaged over ±0.25 FWHM about it, labelled
 *    multiplet + index from the gap edge ("p1" … "p6"; the label alone for a single peak).
 * 2. Multiplet maps: ∫ dI/dV dV from one FWHM inside of the first peak to one FWHM beyond the last,
 *    each end stopped halfway to the nearest peak of another multiplet: the current the whole
 *    shell carries, so the sum of its components.
 * 3. Current map: the mean current over the same window as a peak map, less its mean over the
 *    reference's zero-current region (the per-pixel offset), sign-corrected on the VB side.
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * const sums = runPixelPass(cube, { kind: "spectrumSum", mask: null }, 0, pixelCount(cube));
 * const analysis = analyzeCurve(referenceCurve(cube, sums, "mean"), { eta: 0.8 });
 * planGridMaps(analysis, cube.biasV, { windowSamples: 15, order: 3 }).map((m) => m.label);
 * // => ["v1", "s", "p1", "p2", "s (multiplet)", "p (multiplet)", "v1 (multiplet)", "current"]
 * ```
 */
export function planGridMaps(analysis: CurveAnalysis, bias: GridAxis, filter: GridFilter, options: PlanGridMapsOptions = {}): GridMapSpec[] {
  const D = GRID_MAP_DEFAULTS;
  const fwhmAt = (v: number): number => {
    let best: { biasV: number; fwhmV: number } | null = null;
    for (const p of analysis.peaks) if (!best || Math.abs(p.biasV - v) < Math.abs(best.biasV - v)) best = p;
    return best && Number.isFinite(best.fwhmV) && best.fwhmV > 0 ? best.fwhmV : filter.windowSamples * bias.step;
  };
  const halfWindow = (v: number): number =>
    options.peakHalfWindowMV !== undefined
      ? checkPositive("peakHalfWindowMV", options.peakHalfWindowMV) / 1000
      : Math.max(bias.step / 2, D.peakWindowFraction * fwhmAt(v));
  const specs: GridMapSpec[] = [];
  const make = (label: string, kind: GridMapSpec["kind"], biasV: number, measure: MapMeasure, multiplet: string | null): GridMapSpec => ({
    label,
    kind,
    biasV,
    rangeV: [measure.fromV, measure.toV],
    multiplet,
    unit: measure.kind === "didvMean" ? "S" : "A",
    functional: mapFunctional(bias, measure, filter),
  });
  const multiplets = analysis.assignment.multiplets.filter((m) => m.peaksV.length > 0);
  if (options.atV !== undefined) {
    if (!Array.isArray(options.atV) || options.atV.length === 0) throw new DotspecError("options/bad-list", "atV must be a non-empty list of biases in V, e.g. [0.7, 1.05]");
    for (const [i, v0] of options.atV.entries()) {
      const v = checkFinite(`atV[${i}]`, v0);
      const h = halfWindow(v);
      specs.push(make(`at ${v.toFixed(3)} V`, "bias", v, { kind: "didvMean", fromV: v - h, toV: v + h }, null));
    }
  } else {
    const peaks = multiplets.flatMap((m) => m.peaksV.map((v, k) => ({ v, label: m.peaksV.length > 1 ? `${m.label}${k + 1}` : m.label, multiplet: m.label })));
    peaks.sort((a, b) => a.v - b.v);
    for (const p of peaks) {
      const h = halfWindow(p.v);
      specs.push(make(p.label, "peak", p.v, { kind: "didvMean", fromV: p.v - h, toV: p.v + h }, p.multiplet));
    }
  }
  const allPeaks = analysis.peaks.map((p) => p.biasV);
  for (const m of multiplets) {
    const sign = m.band === "CB" ? 1 : -1;
    const inner = m.peaksV[0], outer = m.peaksV[m.peaksV.length - 1];
    const others = allPeaks.filter((v) => !m.peaksV.some((q) => Math.abs(q - v) < 1e-12) && Math.sign(v) === sign);
    let lo = sign * inner - D.multipletReachFWHM * fwhmAt(inner);
    let hi = sign * outer + D.multipletReachFWHM * fwhmAt(outer);
    for (const o of others) {
      const so = sign * o;
      if (so < sign * inner) lo = Math.max(lo, so + D.neighbourStopFraction * (sign * inner - so));
      if (so > sign * outer) hi = Math.min(hi, so - D.neighbourStopFraction * (so - sign * outer));
    }
    lo = Math.max(lo, 0);
    const [fromV, toV] = sign > 0 ? [lo, hi] : [-hi, -lo];
    specs.push(make(`${m.label} (multiplet)`, "multiplet", (fromV + toV) / 2, { kind: "didvIntegral", fromV: clampToAxis(bias, fromV), toV: clampToAxis(bias, toV) }, m.label));
  }
  const cb = specs.filter((s) => s.kind === "multiplet" && s.biasV > 0);
  const endV = bias.start + (bias.count - 1) * bias.step;
  const currentV = options.currentAtV !== undefined ? checkFinite("currentAtV", options.currentAtV) : cb.length ? Math.max(...cb.map((s) => s.rangeV[1])) : endV;
  const h = halfWindow(currentV);
  const offsetV = analysis.conductance.record.offsetRegionV;
  specs.push(
    make("current", "current", currentV, { kind: "currentMean", fromV: currentV - h, toV: currentV + h, offsetV, sign: currentV < 0 ? -1 : 1 }, null),
  );
  return specs;
}

function clampToAxis(bias: GridAxis, v: number): number {
  return Math.min(bias.start + (bias.count - 1) * bias.step, Math.max(bias.start, v));
}
