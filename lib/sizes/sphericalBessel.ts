/**
 * Spherical Bessel functions of the first kind j_l(x) and the (exponentially scaled) modified
 * spherical Bessel functions of the second kind, with their derivatives: the interior and
 * exterior radial solutions of a particle in a spherical well.
 */
import { checkFinite, checkInteger, checkPositive } from "../util/check.ts";

/** The value and the derivative of a radial function at one point. */
export interface ValueAndSlope {
  /** f(x). */
  value: number;
  /** df/dx. */
  slope: number;
}

/** j_l(x) for x ≥ 0 by its power series (used where upward recurrence loses digits). */
function seriesJ(l: number, x: number): number {
  // j_l(x) = x^l/(2l+1)!! · Σ_k (−x²/2)^k / (k! · (2l+3)(2l+5)…(2l+2k+1))
  let df = 1;
  for (let i = 3; i <= 2 * l + 1; i += 2) df *= i;
  const lead = x ** l / df;
  const q = -0.5 * x * x;
  let term = 1, sum = 1;
  for (let k = 1; k < 60; k++) {
    term *= q / (k * (2 * l + 2 * k + 1));
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum)) break;
  }
  return lead * sum;
}

/**
 * The spherical Bessel function of the first kind j_l(x) and its derivative.
 *
 * Parameters
 * ----------
 * l : number
 *     Order, integer 0…30.
 * x : number
 *     Argument, ≥ 0 (dimensionless).
 *
 * Returns
 * -------
 * ValueAndSlope
 *     {value, slope}.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-integer` for l outside 0…30, `options/not-finite` for an x that is not finite.
 *
 * Notes
 * -----
 * 1. For x < max(1, l): the power series (absolutely convergent, no cancellation at small x).
 * 2. Otherwise: j_0 = sin x / x, j_1 = sin x / x² − cos x / x, and the upward recurrence
 *    j_{l+1} = (2l+1)/x · j_l − j_{l−1} (stable for x > l).
 * 3. Derivative: j_0' = −j_1; j_l' = j_{l−1} − (l+1)/x · j_l for l ≥ 1 (and j_1'(0) = 1/3).
 *
 * References
 * ----------
 * M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (Dover, 1965), §10.1 (10.1.2,
 * 10.1.11, 10.1.19–10.1.22).
 *
 * Example
 * -------
 * ```ts
 * sphericalBesselJ(0, Math.PI / 2).value; // => 0.6366197723675814 (2/π)
 * ```
 */
export function sphericalBesselJ(l: number, x: number): ValueAndSlope {
  checkInteger("l", l, 0, 30);
  checkFinite("x", x);
  const value = jl(l, Math.abs(x));
  let slope: number;
  if (x === 0) slope = l === 1 ? 1 / 3 : 0;
  else if (l === 0) slope = -jl(1, x);
  else slope = jl(l - 1, x) - ((l + 1) / x) * value;
  return { value, slope };
}

function jl(l: number, x: number): number {
  if (x < Math.max(1, l)) return seriesJ(l, x);
  const s = Math.sin(x), c = Math.cos(x);
  let jm = s / x;
  if (l === 0) return jm;
  let j = s / (x * x) - c / x;
  for (let k = 1; k < l; k++) {
    const next = ((2 * k + 1) / x) * j - jm;
    jm = j;
    j = next;
  }
  return j;
}

/**
 * The modified spherical Bessel function of the second kind, scaled by eˣ: K_l(x) = eˣ·k_l(x)
 * with k_0(x) = e⁻ˣ/x, and its derivative dK_l/dx. The decaying solution outside a spherical
 * well; the scaling keeps it finite at large x and does not change the log-derivative except
 * by +1 (k_l'/k_l = K_l'/K_l − 1).
 *
 * Parameters
 * ----------
 * l : number
 *     Order, integer 0…30.
 * x : number
 *     Argument, > 0 (dimensionless).
 *
 * Returns
 * -------
 * ValueAndSlope
 *     {value, slope} of the scaled function.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-integer` for l outside 0…30, `options/not-positive` for x ≤ 0.
 *
 * Notes
 * -----
 * 1. k_0 = e⁻ˣ/x, k_1 = e⁻ˣ(1/x + 1/x²), k_{l+1} = k_{l−1} + (2l+1)/x · k_l (stable upward).
 * 2. k_l' = −k_{l−1} − (l+1)/x · k_l, with k_{−1} = k_0.
 * 3. With the factor eˣ: K_l' = K_l + eˣ·k_l'.
 *
 * References
 * ----------
 * M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (Dover, 1965), §10.2 (10.2.4,
 * 10.2.15, 10.2.18–10.2.21), up to the constant factor π/2 that cancels in the log-derivative.
 *
 * Example
 * -------
 * ```ts
 * scaledModifiedSphericalBesselK(0, 1); // => { value: 1, slope: -1 }
 * ```
 */
export function scaledModifiedSphericalBesselK(l: number, x: number): ValueAndSlope {
  checkInteger("l", l, 0, 30);
  checkPositive("x", x);
  let km = 1 / x; // K_{-1} = K_0
  let k = 1 / x;
  for (let i = 0; i < l; i++) {
    const next = km + ((2 * i + 1) / x) * k;
    km = k;
    k = next;
  }
  // here k = K_l, km = K_{l−1} (K_{−1} = K_0 for l = 0)
  const unscaledSlope = -km - ((l + 1) / x) * k; // eˣ·k_l'
  return { value: k, slope: k + unscaledSlope };
}
