/**
 * Saturation of the current amplifier: a flat run of the current at its maximum or minimum at an
 * end of the bias range.
 */

/** Constants of {@link findSaturation} (locked by test/signal/saturation.test.ts). */
export const SATURATION_DEFAULTS = Object.freeze({
  /** A flat run needs at least this many samples in a row at the extreme … */
  minRunSamples: 5,
  /** … equal to it within the resolution, and at least this fraction of the current range (for curves without a resolution). */
  toleranceFraction: 1e-9,
  /** A run is taken as saturation outright when the noise σ exceeds this many tolerances (equal samples cannot be chance) … */
  noiseDominanceRatio: 2,
  /**
   * … otherwise only at a knee: the current's mean change per sample over the `minRunSamples`
   * samples before the run exceeds this fraction of the largest change per sample of the curve.
   */
  kneeSlopeFraction: 1e-3,
});

/** One saturated end of a curve. */
export interface SaturatedRange {
  /** Which end: "negative" (the run ends at the lowest bias) or "positive" (at the highest). */
  end: "negative" | "positive";
  /** First and last index of the flat run. */
  indices: [number, number];
  /** Bias range [from, to] of the run, V. */
  biasV: [number, number];
  /** The current of the run (the curve's extreme there), A. */
  levelA: number;
}

/** Inputs of {@link findSaturation} beyond the curve. */
export interface FindSaturationOptions {
  /** Resolution of the written current, A (see `CurveMeta.currentResolutionA`); null or absent when unknown. */
  resolutionA?: number | null;
  /** White-noise σ of the current from its third differences, A (before any floor). */
  noiseA: number;
}

/**
 * Find flat runs of the current at its maximum or minimum at the ends of the bias range.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias, V, ascending.
 * currentA : ArrayLike<number>
 *     Current, A, as measured (before any offset removal).
 * options : FindSaturationOptions
 *     Resolution of the written numbers (A, optional) and the current's noise σ (A).
 *
 * Returns
 * -------
 * SaturatedRange[]
 *     Zero, one or two ranges (negative end first).
 *
 * Notes
 * -----
 * With D = {@link SATURATION_DEFAULTS}, at the positive end (the maximum) and likewise at the
 * negative end (the minimum):
 * 1. Tolerance t = max(resolution, D.toleranceFraction × (max − min)).
 * 2. The run: the samples from the last one backwards whose current is within t of the maximum;
 *    at least D.minRunSamples of them, the last sample included.
 * 3. A run is saturation when the noise σ exceeds D.noiseDominanceRatio × t (with real noise,
 *    equal samples cannot be chance), or, for a curve without noise, when the current's mean
 *    change per sample over the D.minRunSamples samples before the run exceeds
 *    D.kneeSlopeFraction × the largest change per sample of the curve: an amplifier's rail cuts a
 *    rising curve off at a knee, while a noise-free curve approaches its own plateau smoothly
 *    (a Gaussian-broadened step is within 10⁻⁶ of its plateau only where its slope is below
 *    10⁻⁵ of its peak slope).
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 101 }, (_, i) => -1 + 0.02 * i);
 * const currentA = biasV.map((v) => Math.min(1e-9 * v, 0.8e-9));
 * findSaturation(biasV, currentA, { noiseA: 0 });
 * // => [{ end: "positive", indices: [90, 100], biasV: [0.8, 1], levelA: 8e-10 }]
 * ```
 */
export function findSaturation(biasV: ArrayLike<number>, currentA: ArrayLike<number>, options: FindSaturationOptions): SaturatedRange[] {
  const D = SATURATION_DEFAULTS;
  const n = currentA.length;
  if (n < 2 * D.minRunSamples) return [];
  let min = Infinity;
  let max = -Infinity;
  let maxStep = 0;
  for (let i = 0; i < n; i++) {
    if (currentA[i] < min) min = currentA[i];
    if (currentA[i] > max) max = currentA[i];
    if (i > 0) maxStep = Math.max(maxStep, Math.abs(currentA[i] - currentA[i - 1]));
  }
  if (!(max > min)) return [];
  const q = options.resolutionA != null && options.resolutionA > 0 ? options.resolutionA : 0;
  const tol = Math.max(q, D.toleranceFraction * (max - min));
  const sigma = Number.isFinite(options.noiseA) ? options.noiseA : 0;
  const out: SaturatedRange[] = [];
  for (const end of ["negative", "positive"] as const) {
    const dir = end === "positive" ? -1 : 1; // walking inward from the end
    const start = end === "positive" ? n - 1 : 0;
    // The extreme the end sits at, if any.
    const level = Math.abs(currentA[start] - max) <= tol ? max : Math.abs(currentA[start] - min) <= tol ? min : null;
    if (level === null) continue;
    let k = start;
    while (k + dir >= 0 && k + dir < n && Math.abs(currentA[k + dir] - level) <= tol) k += dir;
    const run = Math.abs(k - start) + 1;
    if (run < D.minRunSamples || run > n - D.minRunSamples) continue;
    const before = k + dir * D.minRunSamples;
    const rise = before >= 0 && before < n ? Math.abs(level - currentA[before]) : 0;
    const noisy = sigma > D.noiseDominanceRatio * tol;
    if (!noisy && rise <= D.kneeSlopeFraction * D.minRunSamples * maxStep) continue;
    const lo = Math.min(start, k);
    const hi = Math.max(start, k);
    out.push({ end, indices: [lo, hi], biasV: [biasV[lo], biasV[hi]], levelA: level });
  }
  return out;
}
