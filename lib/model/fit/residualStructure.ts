/**
 * Structure left in the residuals of a fit: a run of residuals of one sign about a peak's width
 * long, where the model misses a step or adds one, which a low reduced χ² over the whole curve
 * can hide.
 */

/** What {@link residualStructure} finds. */
export interface ResidualStructure {
  /**
   * The largest |Σ r_i|/√w over windows of w consecutive points, r_i the residuals in units of the
   * noise: about N(0, 1) in any one window when the residuals are the noise alone.
   */
  largestZ: number;
  /** Bias at the middle of that window, V. */
  atBiasV: number;
  /** Points per window. */
  windowPoints: number;
}

/**
 * The most structured window of a fit's residuals.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias of each point in V, ascending.
 * residualA : ArrayLike<number>
 *     Data − model at each point, A.
 * noiseA : number
 *     The current noise (1σ) in A, > 0.
 * windowV : number
 *     Window width in V (a peak's width: a step the model misses or adds leaves residuals of one
 *     sign over about that much bias).
 *
 * Returns
 * -------
 * ResidualStructure
 *     The largest |Σ r_i|/√w, where it is, and w (at least 3 points, at most all of them).
 *
 * Throws
 * ------
 * Nothing (fewer than 3 points give largestZ 0).
 *
 * Notes
 * -----
 * 1. r_i = residual_i / noise; w = max(3, round(windowV / median point spacing)), at most n.
 * 2. Running sums give Σ r_i over every window of w consecutive points; the largest |Σ|/√w wins.
 * 3. For independent Gaussian noise each window's statistic is standard normal, and the largest
 *    of about n/w independent windows exceeds 5 with probability about (n/w)·5.7e-7 (closed
 *    form: 2·(1 − Φ(5))); a missed or extra step of a few noise σ per point over a peak's width
 *    gives far more.
 *
 * Example
 * -------
 * ```ts
 * const biasV = Array.from({ length: 100 }, (_, i) => i * 0.01);
 * const residualA = biasV.map((v) => (v >= 0.5 && v < 0.6 ? 2e-12 : 0)); // 10 points at 2σ
 * residualStructure(biasV, residualA, 1e-12, 0.1);
 * // => { largestZ: 6.32, atBiasV: 0.545, windowPoints: 10 } (20/√10)
 * ```
 */
export function residualStructure(biasV: ArrayLike<number>, residualA: ArrayLike<number>, noiseA: number, windowV: number): ResidualStructure {
  const n = biasV.length;
  if (n < 3) return { largestZ: 0, atBiasV: n ? biasV[0] : 0, windowPoints: n };
  const gaps = Array.from({ length: n - 1 }, (_, i) => biasV[i + 1] - biasV[i]).sort((a, b) => a - b);
  const spacing = gaps[Math.floor(gaps.length / 2)];
  const w = Math.min(n, Math.max(3, Math.round(windowV / (spacing > 0 ? spacing : 1))));
  const cumulative = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) cumulative[i + 1] = cumulative[i] + residualA[i] / noiseA;
  let largestZ = 0;
  let at = 0;
  for (let i = 0; i + w <= n; i++) {
    const z = Math.abs(cumulative[i + w] - cumulative[i]) / Math.sqrt(w);
    if (z > largestZ) {
      largestZ = z;
      at = i;
    }
  }
  return { largestZ, atBiasV: (biasV[at] + biasV[at + w - 1]) / 2, windowPoints: w };
}
