/**
 * A root of a continuous function inside a bracket where it changes sign.
 */
import { DotspecError } from "../util/errors.ts";

/** Options of {@link bracketRoot}. */
export interface BracketRootOptions {
  /** Absolute tolerance on x (same unit as x). Default 0 (then only `relativeTolerance` counts). */
  absoluteTolerance?: number;
  /** Relative tolerance on x. Default 4e-16 (a couple of ulps). */
  relativeTolerance?: number;
  /** Iteration cap. Default 200. */
  maxIterations?: number;
}

/** Defaults of {@link bracketRoot} (locked by test/sizes/defaults.test.ts). */
export const BRACKET_ROOT_DEFAULTS = Object.freeze({
  absoluteTolerance: 0,
  relativeTolerance: 4e-16,
  maxIterations: 200,
});

/**
 * Finds x in [a, b] with f(x) = 0, given f(a) and f(b) of opposite signs.
 *
 * Parameters
 * ----------
 * f : (x: number) => number
 *     The function; must be continuous on [a, b].
 * a : number
 *     One end of the bracket.
 * b : number
 *     The other end.
 * options : BracketRootOptions, optional
 *     Tolerances and the iteration cap; default {}: {@link BRACKET_ROOT_DEFAULTS}.
 *
 * Returns
 * -------
 * number
 *     The root.
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/no-bracket` when f(a) and f(b) have the same sign or are not finite.
 *
 * Notes
 * -----
 * 1. Keep a bracket [a, b] with f(a)·f(b) ≤ 0.
 * 2. Try the false-position (regula falsi) point; when the same end has been kept twice in a
 *    row, halve its stored function value (the Illinois modification), which restores
 *    superlinear convergence on convex functions.
 * 3. If the trial point does not fall strictly inside the bracket, bisect instead.
 * 4. Stop when the bracket is narrower than atol + rtol·|x|, or f(x) = 0 exactly.
 *
 * References
 * ----------
 * M. Dowell and P. Jarratt, "A modified regula falsi method for computing the root of an equation",
 * BIT 11, 168–174 (1971) (the Illinois method).
 *
 * Example
 * -------
 * ```ts
 * bracketRoot((x) => x * x - 2, 0, 2); // => 1.4142135623730951
 * ```
 */
export function bracketRoot(f: (x: number) => number, a: number, b: number, options: BracketRootOptions = {}): number {
  const atol = options.absoluteTolerance ?? BRACKET_ROOT_DEFAULTS.absoluteTolerance;
  const rtol = options.relativeTolerance ?? BRACKET_ROOT_DEFAULTS.relativeTolerance;
  const maxIterations = options.maxIterations ?? BRACKET_ROOT_DEFAULTS.maxIterations;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(Number.isFinite(fa) && Number.isFinite(fb)) || Math.sign(fa) === Math.sign(fb)) {
    throw new DotspecError(
      "sizes/no-bracket",
      `bracketRoot: f must change sign between a = ${a} and b = ${b}; got f(a) = ${fa}, f(b) = ${fb}. Choose a bracket around one root.`,
    );
  }
  let side = 0;
  for (let i = 0; i < maxIterations; i++) {
    let x = (a * fb - b * fa) / (fb - fa);
    const lo = Math.min(a, b), hi = Math.max(a, b);
    if (!(x > lo && x < hi)) x = 0.5 * (a + b);
    const fx = f(x);
    if (fx === 0) return x;
    if (Math.sign(fx) === Math.sign(fb)) {
      b = x;
      fb = fx;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      a = x;
      fa = fx;
      if (side === 1) fb /= 2;
      side = 1;
    }
    if (Math.abs(b - a) <= atol + rtol * Math.abs(x)) return Math.abs(fa) < Math.abs(fb) ? a : b;
  }
  return Math.abs(fa) < Math.abs(fb) ? a : b;
}
