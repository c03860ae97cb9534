/**
 * Normalised conductance (dI/dV)/(I/V) with an exponentially broadened I/V, which stays finite
 * inside the gap.
 */
import { checkKnownKeys, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { checkAscending } from "./resample.ts";

/** Options of {@link normalizedConductance}. */
export interface NormalizedConductanceOptions {
  /**
   * Width ΔV of the exponential broadening of I/V, in volts. Default 0.5 V
   * ({@link NORMALIZED_CONDUCTANCE_DEFAULTS}).
   */
  broadeningV?: number;
}

/** Defaults of {@link normalizedConductance} (locked by test/signal/normalizedConductance.test.ts). */
export const NORMALIZED_CONDUCTANCE_DEFAULTS = Object.freeze({
  /**
   * ΔV in volts. Common practice (no source): of the order of the gap, so that inside the gap
   * the broadened I/V is carried by the current just outside it. Gaps of few-nm dots are 1–3 V in
   * bias; 0.5 V keeps the band-edge structure (spacings of 0.1–0.3 V) from being averaged into the
   * normalisation while still bridging the gap. Feenstra (1994) took ΔV comparable to the band gap
   * of the bulk crystal (memory).
   */
  broadeningV: 0.5,
});

/** The input of {@link normalizedConductance}; a {@link ConductanceResult} fits as it is. */
export interface NormalizedConductanceInput {
  /** Bias in volts, strictly ascending (need not be uniform). */
  biasV: ArrayLike<number>;
  /** Current in amperes with its offset removed (the `currentA` of a conductance result). */
  currentA: ArrayLike<number>;
  /** dI/dV in siemens on the same points. */
  didvS: ArrayLike<number>;
}

/** What {@link normalizedConductance} returns. */
export interface NormalizedConductanceResult {
  /** (dI/dV) / broadened I/V, dimensionless; finite everywhere (0 where the broadened I/V is 0). */
  normalized: Float64Array;
  /** The broadened |I/V| in siemens. */
  broadenedConductanceS: Float64Array;
  /** The broadening width used, volts. */
  broadeningV: number;
}

/**
 * Normalised tunnelling conductance (dI/dV)/\overline{I/V} with an exponentially broadened I/V.
 *
 * Parameters
 * ----------
 * input : NormalizedConductanceInput
 *     `{ biasV (V), currentA (A, offset removed), didvS (S) }`, e.g. the result of conductance().
 *     At least 2 points.
 * options : NormalizedConductanceOptions, optional
 *     broadeningV: ΔV in volts, > 0; default 0.5.
 *
 * Returns
 * -------
 * NormalizedConductanceResult
 *     `{ normalized, broadenedConductanceS, broadeningV }`.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/too-few-points`, `signal/length-mismatch`, `signal/not-ascending`,
 *     `signal/not-finite`; `options/…` for a bad broadeningV.
 *
 * Notes
 * -----
 * 1. a(V) = |I(V)/V|; at points with |V| below half a bias step (0 V itself, or a grid point
 *    that misses 0 V only by rounding) a = |dI/dV| instead, the limit of I/V at 0 V once the
 *    offset is removed: this avoids the 0/0 there.
 * 2. \overline{I/V}(V) = ∫ a(V′) e^{−|V′−V|/ΔV} dV′ / ∫ e^{−|V′−V|/ΔV} dV′ over the measured bias
 *    range (the denominator keeps the ends unbiased), by the trapezoid rule on the data points.
 * 3. Both sums are computed in O(n) as the sum of a forward and a backward exponential recursion:
 *    L_i = a_i w_i + e^{−(V_i − V_{i−1})/ΔV} L_{i−1}, R_i likewise from the right, S_i = L_i + R_i − a_i w_i
 *    (w_i the trapezoid weights), valid for non-uniform grids too.
 * 4. normalized = dI/dV / \overline{I/V}; 0 where \overline{I/V} = 0 (a current that is zero
 *    throughout the broadening range), so the output is finite everywhere.
 * For an ohmic I = V/R the normalised conductance is exactly 1 (a = 1/R everywhere).
 *
 * References
 * ----------
 * P. Mårtensson and R. M. Feenstra, "Geometric and electronic structure of antimony on the
 * GaAs(110) surface studied by scanning tunneling microscopy", Phys. Rev. B 39, 7744–7753 (1989);
 * R. M. Feenstra, "Tunneling spectroscopy of the (110) surface of direct-gap III–V
 * semiconductors", Phys. Rev. B 50, 4561–4570 (1994) (broadened I/V; exact form from memory).
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 401 }, (_, i) => -2 + i * 0.01);
 * const currentA = biasV.map((v) => v / 1e9);             // 1 GΩ, ohmic
 * const didvS = new Float64Array(401).fill(1e-9);
 * normalizedConductance({ biasV, currentA, didvS }).normalized[200]; // => 1 (up to rounding)
 * ```
 */
export function normalizedConductance(
  input: NormalizedConductanceInput,
  options: NormalizedConductanceOptions = {},
): NormalizedConductanceResult {
  checkKnownKeys("normalizedConductance options", options, ["broadeningV"]);
  const broadeningV = checkPositive("broadeningV", options.broadeningV ?? NORMALIZED_CONDUCTANCE_DEFAULTS.broadeningV);
  const { biasV, currentA, didvS } = input;
  const n = biasV.length;
  if (n < 2) {
    throw new DotspecError("signal/too-few-points", `biasV must have at least 2 points; got ${n}.`);
  }
  for (const [name, y] of [["currentA", currentA], ["didvS", didvS]] as const) {
    if (y.length !== n) {
      throw new DotspecError("signal/length-mismatch", `${name} must have one value per bias point (${n}); got ${y.length}.`);
    }
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(y[i])) {
        throw new DotspecError("signal/not-finite", `${name} must contain finite numbers only; got ${y[i]} at index ${i}.`);
      }
    }
  }
  checkAscending(biasV);

  // 1. a_i w_i and w_i (trapezoid weights).
  const aw = new Float64Array(n);
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const left = i > 0 ? biasV[i] - biasV[i - 1] : 0;
    const right = i < n - 1 ? biasV[i + 1] - biasV[i] : 0;
    w[i] = (left + right) / 2;
    const localStep = Math.max(left, right);
    const v = biasV[i];
    const a = Math.abs(v) < 0.5 * localStep ? Math.abs(didvS[i]) : Math.abs(currentA[i] / v);
    aw[i] = a * w[i];
  }
  // 2–3. Forward and backward exponential recursions for numerator and denominator.
  const decay = new Float64Array(n); // decay[i] = e^{−(V_i − V_{i−1})/ΔV}
  for (let i = 1; i < n; i++) decay[i] = Math.exp(-(biasV[i] - biasV[i - 1]) / broadeningV);
  const numL = new Float64Array(n);
  const denL = new Float64Array(n);
  numL[0] = aw[0];
  denL[0] = w[0];
  for (let i = 1; i < n; i++) {
    numL[i] = aw[i] + decay[i] * numL[i - 1];
    denL[i] = w[i] + decay[i] * denL[i - 1];
  }
  const broadened = new Float64Array(n);
  const normalized = new Float64Array(n);
  let numR = 0;
  let denR = 0;
  for (let i = n - 1; i >= 0; i--) {
    const d = i < n - 1 ? decay[i + 1] : 0;
    numR = aw[i] + d * numR;
    denR = w[i] + d * denR;
    const num = numL[i] + numR - aw[i];
    const den = denL[i] + denR - w[i];
    const b = den > 0 ? num / den : 0;
    broadened[i] = b;
    // 4. Finite everywhere.
    const g = b > 0 ? didvS[i] / b : 0;
    normalized[i] = Number.isFinite(g) ? g : 0;
  }
  return { normalized, broadenedConductanceS: broadened, broadeningV };
}
