/**
 * The weights that turn one pixel's current into one map value: a window average of dI/dV, an
 * integral of dI/dV over a bias range, or a window average of the offset-corrected current.
 */
import { savitzkyGolayWeights } from "../signal/savitzkyGolay.ts";
import { DotspecError } from "../util/errors.ts";
import type { GridAxis } from "./gridCube.ts";
import type { PixelFunctional } from "./pixelPass.ts";

/** The Savitzky–Golay filter every pixel shares. */
export interface GridFilter {
  /** Window in samples (odd, ≥ 5, ≥ order + 2, ≤ the number of bias points). */
  windowSamples: number;
  /** Polynomial order. */
  order: number;
}

/** What a map measures. */
export type MapMeasure =
  /** Mean dI/dV over the bias indices in [fromV, toV], S. */
  | { kind: "didvMean"; fromV: number; toV: number }
  /** ∫ dI/dV dV over [fromV, toV] (trapezoid rule on the bias points inside), A. */
  | { kind: "didvIntegral"; fromV: number; toV: number }
  /**
   * Mean smoothed current over [fromV, toV] minus its mean over the zero-current region
   * `offsetV` (null: no offset removed), times `sign` so that the map is positive on both bias
   * sides, A.
   */
  | { kind: "currentMean"; fromV: number; toV: number; offsetV: [number, number] | null; sign: 1 | -1 };

/**
 * The linear functional of a map: the Savitzky–Golay weights of every bias index the map uses,
 * combined, so that one dot product per pixel gives the map value.
 *
 * Parameters
 * ----------
 * bias : GridAxis
 *     The bias axis of the cube (V).
 * measure : MapMeasure
 *     What the map measures (bias range in V).
 * filter : GridFilter
 *     Window (samples) and order shared by every pixel.
 *
 * Returns
 * -------
 * PixelFunctional
 *     First bias index and weights (S per A for dI/dV means, dimensionless for integrals and
 *     currents).
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/empty-range` when no bias point lies in [fromV, toV] (the nearest point is used when
 *     the range is narrower than one step but inside the axis).
 *
 * Notes
 * -----
 * 1. The dI/dV at bias index i is Σ_j w_ij·I_j with the Savitzky–Golay first-derivative weights
 *    of the window centred on i (asymmetric fits within half a window of the ends), divided by
 *    the step.
 * 2. A mean over indices i ∈ [a, b] is (1/(b − a + 1))·Σ_i w_i; an integral weights the
 *    indices by the trapezoid rule (step/2 at both ends); a current mean uses the smoothing
 *    weights instead.
 * 3. Because the Savitzky–Golay filter is linear, the map value equals the same average of the
 *    per-pixel dI/dV computed with the full filter ({@link gridConductance}) up to rounding.
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964).
 *
 * Example
 * -------
 * ```ts
 * const f = mapFunctional({ start: 0, step: 0.01, count: 101 }, { kind: "didvIntegral", fromV: 0.2, toV: 0.5 }, { windowSamples: 7, order: 3 });
 * // Σ f.weights·I = I(0.5 V) − I(0.2 V) for any cubic I(V) (exact derivative of a cubic)
 * ```
 */
export function mapFunctional(bias: GridAxis, measure: MapMeasure, filter: GridFilter): PixelFunctional {
  const n = bias.count;
  const [a, b] = indexRange(bias, measure.fromV, measure.toV);
  const derivative = measure.kind === "currentMean" ? 0 : 1;
  const parts: [number, number, number][] = []; // [index, factor, sign]
  if (measure.kind === "didvMean") {
    for (let i = a; i <= b; i++) parts.push([i, 1 / (b - a + 1) / bias.step, 1]);
  } else if (measure.kind === "didvIntegral") {
    // Trapezoid: ∫ g dV ≈ step·(g_a/2 + g_{a+1} + … + g_b/2), g = (Σ w·I)/step.
    if (a === b) parts.push([a, 0, 1]);
    else for (let i = a; i <= b; i++) parts.push([i, i === a || i === b ? 0.5 : 1, 1]);
  } else {
    for (let i = a; i <= b; i++) parts.push([i, measure.sign / (b - a + 1), 1]);
    if (measure.offsetV) {
      const [oa, ob] = indexRange(bias, measure.offsetV[0], measure.offsetV[1]);
      for (let i = oa; i <= ob; i++) parts.push([i, -measure.sign / (ob - oa + 1), 1]);
    }
  }
  const w = filter.windowSamples;
  const half = (w - 1) >> 1;
  const starts = parts.map(([i]) => windowStart(i, n, w, half));
  const first = Math.min(...starts);
  const last = Math.max(...starts) + w;
  const weights = new Float64Array(last - first);
  const centre = savitzkyGolayWeights(w, filter.order, derivative);
  parts.forEach(([i, factor], k) => {
    if (factor === 0) return;
    const s = starts[k];
    const row = i - s === half ? centre : savitzkyGolayWeights(w, filter.order, derivative, i - s);
    for (let j = 0; j < w; j++) weights[s - first + j] += factor * row[j];
  });
  return { firstIndex: first, weights };
}

/** First index of the window used for index i: centred, or flush with an end. */
function windowStart(i: number, n: number, w: number, half: number): number {
  return Math.min(Math.max(i - half, 0), n - w);
}

/**
 * Bias indices [a, b] within [fromV, toV]; the nearest single index for a range narrower than a step.
 *
 * Parameters
 * ----------
 * bias : GridAxis
 *     The bias axis, V.
 * fromV : number
 *     Lower end of the range, V.
 * toV : number
 *     Upper end of the range, V.
 *
 * Returns
 * -------
 * [number, number]
 *     The first and last bias index within the range (inclusive).
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/empty-range` when the range is not finite or lies outside the bias axis (by more than
 *     half a step).
 *
 * Example
 * -------
 * ```ts
 * indexRange({ start: -1, step: 0.1, count: 21 }, 0.25, 0.55); // => [13, 15]
 * ```
 */
export function indexRange(bias: GridAxis, fromV: number, toV: number): [number, number] {
  const lo = Math.min(fromV, toV);
  const hi = Math.max(fromV, toV);
  const endV = bias.start + (bias.count - 1) * bias.step;
  if (!(Number.isFinite(lo) && Number.isFinite(hi)) || hi < bias.start - bias.step / 2 || lo > endV + bias.step / 2) {
    throw new DotspecError(
      "grid/empty-range",
      `bias range [${lo}, ${hi}] V lies outside the cube's bias axis [${bias.start}, ${endV}] V: choose map biases inside it`,
    );
  }
  const eps = 1e-9 * bias.step;
  let a = Math.max(0, Math.ceil((lo - bias.start - eps) / bias.step));
  let b = Math.min(bias.count - 1, Math.floor((hi - bias.start + eps) / bias.step));
  if (a > b) {
    const mid = Math.min(bias.count - 1, Math.max(0, Math.round(((lo + hi) / 2 - bias.start) / bias.step)));
    a = b = mid;
  }
  return [a, b];
}
