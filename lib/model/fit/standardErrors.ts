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
 *     Receives a warning when JᵀJ is singular (or a parameter does not move the model).
 *
 * Returns
 * -------
 * number[]
 *     One standard error per parameter, in its unit; NaN where the variance is not positive or
 *     the parameter does not move the model (a zero column of J), all NaN when JᵀJ is singular
 *     otherwise.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. J column k = (model(q + h_k·e_k) − model(q − h_k·e_k))/(2h_k).
 * 2. A parameter whose column of J is zero (the model does not move with it: a level whose steps
 *    all lie beyond the points fitted, as p on a CB side that ends after the s doublet) is not
 *    determined (NaN, and a warning). Its row and column of JᵀJ are zero, so JᵀJ is block
 *    diagonal and the covariance of the others is the inverse of the rest of JᵀJ (closed form):
 *    one such parameter no longer leaves every error undetermined.
 * 3. The rest of JᵀJ scaled to unit diagonal, inverted (ml-matrix), unscaled.
 * 4. SE_k = √((JᵀJ)⁻¹_kk · max(1, χ²_red)) (common practice: scale by the reduced χ² when the
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
  // A parameter that does not move the model at all (a zero column, e.g. a level whose steps lie
  // beyond the points) is not determined; the others' covariance is the inverse of the rest of JᵀJ.
  const kept = Array.from({ length: m }, (_, a) => a).filter((a) => jtj.get(a, a) > 0);
  const sub = Matrix.zeros(kept.length, kept.length);
  const d = kept.map((a) => Math.sqrt(jtj.get(a, a)));
  kept.forEach((a, i) => kept.forEach((b, j) => sub.set(i, j, jtj.get(a, b) / (d[i] * d[j]))));
  const singular = "the Jacobian at the optimum is singular: some parameters are not determined by this curve (standard errors NaN)";
  const se = new Array<number>(m).fill(NaN);
  try {
    const inv = inverse(sub);
    const factor = Math.max(1, reducedChiSquare);
    kept.forEach((a, i) => {
      const v = inv.get(i, i) / (d[i] * d[i]);
      se[a] = v > 0 ? Math.sqrt(v * factor) : NaN;
    });
  } catch {
    warnings.push(singular);
    return se;
  }
  if (kept.length < m) warnings.push(`${singular.replace(" (standard errors NaN)", "")}: ${m - kept.length} of them do not move the model at all (standard errors NaN), the others' errors are those of the rest`);
  return se;
}
