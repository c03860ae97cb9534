/**
 * Standard errors of the fitted parameters from the Jacobian of the model at the optimum.
 */
import { mlMatrix } from "./mlMatrix.ts";

/**
 * Standard errors of all parameters of a least-squares fit, from a central-difference Jacobian of
 * the noise-scaled model.
 *
 * Parameters
 * ----------
 * model : (q: number[]) => Float64Array
 *     The model at parameters q, divided by the noise σ of the data (dimensionless residual units).
 * q : number[]
 *     The parameters at the optimum (each in its own unit).
 * steps : number[]
 *     Difference step of each parameter, in its unit (> 0).
 * reducedChiSquare : number
 *     χ² per degree of freedom at the optimum.
 * warnings : string[]
 *     Receives a warning when JᵀJ is singular.
 *
 * Returns
 * -------
 * number[]
 *     One standard error per parameter, in its unit; NaN where the variance is not positive, all
 *     NaN when JᵀJ is singular.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. J column k = (model(q + h_k·e_k) − model(q − h_k·e_k))/(2h_k).
 * 2. JᵀJ scaled to unit diagonal, inverted (ml-matrix), unscaled.
 * 3. SE_k = √((JᵀJ)⁻¹_kk · max(1, χ²_red)) (common practice: scale by the reduced χ² when the
 *    model does not reach the noise).
 *
 * References
 * ----------
 * W. H. Press, S. A. Teukolsky, W. T. Vetterling and B. P. Flannery, Numerical Recipes, 3rd ed.
 * (Cambridge University Press, 2007), §15.5 (covariance of nonlinear least-squares parameters).
 *
 * Example
 * -------
 * ```ts
 * // A straight line a + b·x at unit noise on x = 0 … 4: closed form SE(b) = 1/√Σ(x − x̄)² = 1/√10.
 * const x = [0, 1, 2, 3, 4];
 * standardErrors((q) => Float64Array.from(x, (v) => q[0] + q[1] * v), [1, 2], [1e-3, 1e-3], 1, []);
 * // => [0.7746, 0.3162] (√(Σx²/(n·Sxx)) = √0.6, 1/√10)
 * ```
 */
export function standardErrors(model: (q: number[]) => Float64Array, q: number[], steps: number[], reducedChiSquare: number, warnings: string[]): number[] {
  const m = q.length;
  const cols: Float64Array[] = [];
  for (let k = 0; k < m; k++) {
    const up = q.slice(), down = q.slice();
    up[k] += steps[k];
    down[k] -= steps[k];
    const a = model(up), b = model(down);
    cols.push(a.map((v, i) => (v - b[i]) / (2 * steps[k])));
  }
  const { Matrix, inverse } = mlMatrix();
  const jtj = Matrix.zeros(m, m);
  for (let a = 0; a < m; a++) for (let b = a; b < m; b++) {
    let s = 0;
    for (let i = 0; i < cols[a].length; i++) s += cols[a][i] * cols[b][i];
    jtj.set(a, b, s);
    jtj.set(b, a, s);
  }
  const d = Array.from({ length: m }, (_, a) => Math.sqrt(jtj.get(a, a)) || 1);
  for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) jtj.set(a, b, jtj.get(a, b) / (d[a] * d[b]));
  try {
    const inv = inverse(jtj);
    const factor = Math.max(1, reducedChiSquare);
    return d.map((da, a) => {
      const v = inv.get(a, a) / (da * da);
      return v > 0 ? Math.sqrt(v * factor) : NaN;
    });
  } catch {
    warnings.push("the Jacobian at the optimum is singular: some parameters are not determined by this curve (standard errors NaN)");
    return new Array(m).fill(NaN);
  }
}
