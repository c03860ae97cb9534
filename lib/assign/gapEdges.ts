/**
 * The zero-conductance region around 0 V: where dI/dV stays within the noise.
 */

/** Options of {@link gapEdges}. */
export interface GapEdgesOptions {
  /** Conductance noise σ_G in S (of the curve passed in). */
  noiseS: number;
  /** The region ends where dI/dV exceeds this many σ_G … Default 3. */
  thresholdSigma?: number;
  /** … for this many samples in a row. Default 3. */
  runSamples?: number;
}

/** Defaults of {@link GapEdgesOptions}: 3 σ_G for 3 samples in a row (locked by a test). */
export const GAP_EDGES_DEFAULTS = Object.freeze({ thresholdSigma: 3, runSamples: 3 });

/**
 * Edges of the zero-conductance region (the gap seen directly in dI/dV).
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Ascending bias in V.
 * didvS : Float64Array
 *     Conductance in S.
 * options : GapEdgesOptions
 *     The conductance noise σ_G (S) and the edge rule: dI/dV above thresholdSigma σ_G (default 3)
 *     for runSamples samples in a row (default 3).
 *
 * Returns
 * -------
 * [number, number] | null
 *     [negative edge, positive edge] in V; an edge that runs to the end of the data is the last bias
 *     point.
 *
 * Notes
 * -----
 * 1. Start at the bias point nearest 0 V.
 * 2. Walk outward on each side until dI/dV exceeds thresholdSigma·σ_G for runSamples samples in a
 *    row; the edge is the first of those samples.
 * 3. Null when 0 V is outside the bias range, or dI/dV at 0 V is itself above the threshold
 *    (no gap: a metallic or charged dot).
 *
 * Example
 * -------
 * ```ts
 * // An invented conductance: zero between −0.8 V and 1 V, rising outside.
 * const biasV = Float64Array.from({ length: 401 }, (_, i) => -2 + i * 0.01);
 * const didvS = biasV.map((v) => (v > 1 ? 1e-9 * (v - 1) : v < -0.8 ? 1e-9 * (-0.8 - v) : 0));
 * gapEdges(biasV, didvS, { noiseS: 1e-12 }); // => [-0.81, 1.0100000000000002] (the first samples above 3 σ_G)
 * ```
 */
export function gapEdges(biasV: Float64Array, didvS: Float64Array, options: GapEdgesOptions): [number, number] | null {
  const n = biasV.length;
  if (n === 0 || biasV[0] > 0 || biasV[n - 1] < 0) return null;
  const threshold = (options.thresholdSigma ?? GAP_EDGES_DEFAULTS.thresholdSigma) * options.noiseS;
  const run = options.runSamples ?? GAP_EDGES_DEFAULTS.runSamples;
  let i0 = 0;
  for (let i = 1; i < n; i++) if (Math.abs(biasV[i]) < Math.abs(biasV[i0])) i0 = i;
  if (didvS[i0] > threshold) return null;
  const walk = (dir: 1 | -1): number => {
    let count = 0;
    for (let i = i0; i >= 0 && i < n; i += dir) {
      if (didvS[i] > threshold) {
        count++;
        if (count >= run) return biasV[i - dir * (run - 1)];
      } else count = 0;
    }
    return dir > 0 ? biasV[n - 1] : biasV[0];
  };
  return [walk(-1), walk(1)];
}
