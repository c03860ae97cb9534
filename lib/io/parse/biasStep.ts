/**
 * The median bias step of a curve and whether the steps are uniform, as the import record
 * reports them.
 */

/** Tolerance of {@link ImportRecord.uniformStep}, as a fraction of the median step. */
export const UNIFORM_STEP_RTOL = 0.01;

/**
 * Median bias step and step uniformity.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Strictly ascending bias, V; at least two points.
 *
 * Returns
 * -------
 * { medianV: number; uniform: boolean }
 *     The median of the steps between neighbours, V, and whether every step is within
 *     {@link UNIFORM_STEP_RTOL} of it.
 *
 * Notes
 * -----
 * 1. Steps Δᵢ = Vᵢ₊₁ − Vᵢ; the median is the middle step, or the mean of the middle two.
 * 2. Uniform when |Δᵢ − median| ≤ 0.01·median for every i.
 *
 * Example
 * -------
 * biasStep(Float64Array.of(0, 0.001, 0.002, 0.004));  // => { medianV: 0.001, uniform: false }
 */
export function biasStep(biasV: Float64Array): { medianV: number; uniform: boolean } {
  const n = biasV.length - 1;
  const steps = new Float64Array(n);
  for (let i = 0; i < n; i++) steps[i] = biasV[i + 1] - biasV[i];
  const sorted = Float64Array.from(steps).sort();
  const medianV = n % 2 === 1 ? sorted[(n - 1) / 2] : sorted[n / 2 - 1] / 2 + sorted[n / 2] / 2;
  let uniform = true;
  for (let i = 0; i < n && uniform; i++) uniform = Math.abs(steps[i] - medianV) <= UNIFORM_STEP_RTOL * medianV;
  return { medianV, uniform };
}
