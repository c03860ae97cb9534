/**
 * Zeros of the spherical Bessel functions j_l: the dimensionless wave numbers x_nl = k·R of a
 * particle in a sphere with an infinite wall.
 */
import { checkInteger } from "../util/check.ts";
import { bracketRoot } from "./bracketRoot.ts";
import { sphericalBesselJ } from "./sphericalBessel.ts";

/** Step of the sign-change scan, in units of x. Zeros of j_l are about π apart, so 0.1 cannot skip one. */
const SCAN_STEP = 0.1;

/** Pure cache of computed zeros, keyed "l,n". */
const cache = new Map<string, number>();

/**
 * The n-th positive zero x_nl of the spherical Bessel function j_l (x = 0 excluded).
 *
 * Parameters
 * ----------
 * l : number
 *     Angular momentum, integer 0…30.
 * n : number
 *     Index of the zero, integer 1…50 (n = 1 is the first positive zero).
 *
 * Returns
 * -------
 * number
 *     x_nl (dimensionless).
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-integer` for l or n out of range.
 *
 * Notes
 * -----
 * 1. Scan j_l(x) from x = l/2 + 0.05 (below the first zero, which exceeds l + ½ … l + 1.9
 *    for l ≤ 30) upward in steps of 0.1, counting sign changes; zeros of j_l are separated by
 *    more than π/2, so no two fall in one step.
 * 2. Refine the n-th bracket with {@link bracketRoot} to a few ulps.
 * 3. Results are cached (a pure cache: the same inputs always give the same number).
 *
 * References
 * ----------
 * M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (Dover, 1965), Table 10.6 (zeros
 * of j_l): x_10 = π, x_11 = 4.493409, x_12 = 5.763459, x_20 = 2π, x_21 = 7.725252 (A&S label the first
 * zero of j_l with n = 1 as here).
 *
 * Example
 * -------
 * ```ts
 * sphericalBesselZero(1, 1); // => 4.493409457909064 (the 1P level)
 * ```
 */
export function sphericalBesselZero(l: number, n: number): number {
  checkInteger("l", l, 0, 30);
  checkInteger("n", n, 1, 50);
  const key = `${l},${n}`;
  const hit = cache.get(key);
  if (hit !== undefined) return hit;
  const f = (x: number) => sphericalBesselJ(l, x).value;
  let a = l / 2 + 0.05;
  let fa = f(a);
  let found = 0;
  for (;;) {
    const b = a + SCAN_STEP;
    const fb = f(b);
    if (fb === 0 || Math.sign(fb) !== Math.sign(fa)) {
      found++;
      if (found === n) {
        const x = fb === 0 ? b : bracketRoot(f, a, b);
        cache.set(key, x);
        return x;
      }
    }
    a = b;
    fa = fb === 0 ? f(b + 1e-9) : fb;
  }
}
