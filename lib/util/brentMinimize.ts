/**
 * Minimum of a function of one variable within a bracket, by Brent's method: parabolic
 * interpolation through the three best points, with golden-section steps where the parabola is
 * not to be trusted.
 */

/** What {@link brentMinimize} returns. */
export interface BrentMinimum {
  /** The abscissa of the lowest value found. */
  x: number;
  /** The function's value there. */
  fx: number;
  /** Evaluations of the function (the start's value, given, not counted). */
  evaluations: number;
}

/** (3 − √5)/2: the golden-section fraction of an interval. */
const GOLDEN_FRACTION = (3 - Math.sqrt(5)) / 2;

/**
 * Brent's minimisation in a bracket [a, b] from a start x₀ inside it whose value is known.
 *
 * Parameters
 * ----------
 * f : (x: number) => number
 *     The function (any unit; NaN counts as worse than any number).
 * a, b : number
 *     The bracket, a < b, with x₀ inside and its value below the function's at both ends (or at
 *     least not above: the method then still ends within the bracket).
 * x0, f0 : number
 *     The start and its known value f(x₀).
 * tolerance : number
 *     Absolute tolerance on x: the search stops when the bracket around the best point is within
 *     2·tolerance of it.
 * maxEvaluations : number
 *     Most evaluations of f.
 *
 * Returns
 * -------
 * BrentMinimum
 *     The best x, f(x) and the number of evaluations.
 *
 * Notes
 * -----
 * 1. Keep the best point x, the second best w and the previous second best v with their values.
 * 2. Fit a parabola through x, w, v; take its vertex when it falls inside the bracket and the step
 *    is less than half the step before last (the parabola then converges); otherwise a golden-
 *    section step into the larger part of the bracket.
 * 3. Evaluate there (never closer than the tolerance to x), shrink the bracket to the side that
 *    holds the better point, and update x, w, v.
 * Superlinear near a smooth minimum, never slower than golden-section search by more than a
 * constant factor.
 *
 * References
 * ----------
 * R. P. Brent, Algorithms for Minimization without Derivatives (Prentice-Hall, 1973), ch. 5;
 * W. H. Press, S. A. Teukolsky, W. T. Vetterling and B. P. Flannery, Numerical Recipes, 3rd ed.
 * (Cambridge University Press, 2007), §10.3.
 *
 * Example
 * -------
 * ```ts
 * const m = brentMinimize((x) => (x - 2) ** 2 + 1, 0, 5, 1, 2, 1e-8, 100);
 * m.x;  // => 2 (within 1e-8)
 * m.fx; // => 1
 * ```
 */
export function brentMinimize(f: (x: number) => number, a: number, b: number, x0: number, f0: number, tolerance: number, maxEvaluations: number): BrentMinimum {
  const value = (x: number) => {
    const y = f(x);
    return Number.isNaN(y) ? Infinity : y;
  };
  let x = x0, w = x0, v = x0;
  let fx = Number.isNaN(f0) ? Infinity : f0, fw = fx, fv = fx;
  let d = 0, e = 0;
  let evaluations = 0;
  while (evaluations < maxEvaluations) {
    const xm = 0.5 * (a + b);
    const tol1 = tolerance, tol2 = 2 * tol1;
    if (Math.abs(x - xm) <= tol2 - 0.5 * (b - a)) break;
    let parabolic = false;
    if (Math.abs(e) > tol1) {
      // Parabola through x, w, v: its vertex is x + p/q.
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      q = Math.abs(q);
      const before = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * before) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = xm >= x ? tol1 : -tol1;
        parabolic = true;
      }
    }
    if (!parabolic) {
      e = x >= xm ? a - x : b - x;
      d = GOLDEN_FRACTION * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d >= 0 ? tol1 : -tol1);
    const fu = value(u);
    evaluations++;
    if (fu <= fx) {
      if (u >= x) a = x;
      else b = x;
      (v = w), (fv = fw);
      (w = x), (fw = fx);
      (x = u), (fx = fu);
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        (v = w), (fv = fw);
        (w = u), (fw = fu);
      } else if (fu <= fv || v === x || v === w) {
        (v = u), (fv = fu);
      }
    }
  }
  return { x, fx, evaluations };
}
