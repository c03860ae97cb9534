/**
 * Savitzky–Golay smoothing and differentiation of uniformly sampled data, with least-squares
 * fits at both ends instead of padding.
 *
 * The interior is a convolution with the centre weights of the least-squares fit (computed once
 * per window, order and derivative, and cached); the first and last (windowSamples − 1)/2 points
 * are evaluated from asymmetric fits of the same polynomial order over the first and last
 * windowSamples points, so the ends are neither padded nor distorted. The tests compare the
 * interior with the general-purpose library ml-savitzky-golay and with the published tables.
 */
import { DotspecError } from "../util/errors.ts";

/** Options of {@link savitzkyGolay}. */
export interface SavitzkyGolayOptions {
  /** Window length in samples: odd, at least 5 and at least order + 2. Required. */
  windowSamples: number;
  /** Degree of the fitted polynomial, 1–5. Default 3 ({@link SAVITZKY_GOLAY_DEFAULTS}). */
  order?: number;
  /** Derivative to return: 0 (smoothed values), 1 or 2; at most `order`. Default 0. */
  derivative?: number;
  /**
   * Sampling step of the abscissa, e.g. the bias step in volts; derivatives are returned per unit of
   * it (d-th derivative divided by stepV^d). Default 1 (per sample).
   */
  stepV?: number;
}

/** Defaults of {@link savitzkyGolay} (locked by test/signal/savitzkyGolay.test.ts). */
export const SAVITZKY_GOLAY_DEFAULTS = Object.freeze({
  order: 3,
  derivative: 0,
  stepV: 1,
  /** Smallest window: five points, the shortest in the published tables. */
  minWindowSamples: 5,
  minOrder: 1,
  maxOrder: 5,
  maxDerivative: 2,
});

/**
 * Smallest valid window (odd, ≥ 5, ≥ order + 2) for a polynomial order.
 *
 * Parameters
 * ----------
 * order : number
 *     Polynomial order of the filter (1–5).
 *
 * Returns
 * -------
 * number
 *     The smallest odd window, in samples, of at least 5 and order + 2.
 *
 * Example
 * -------
 * ```ts
 * minimumWindowSamples(3); // => 5
 * minimumWindowSamples(4); // => 7
 * ```
 */
export function minimumWindowSamples(order: number): number {
  const n = Math.max(SAVITZKY_GOLAY_DEFAULTS.minWindowSamples, order + 2);
  return n % 2 === 1 ? n : n + 1;
}

function fail(code: string, message: string): never {
  throw new DotspecError(`signal/${code}`, message);
}

/** Validates (windowSamples, order, derivative); shared by every public function of this module. */
function checkFilter(windowSamples: number, order: number, derivative: number): void {
  const { minOrder, maxOrder, maxDerivative } = SAVITZKY_GOLAY_DEFAULTS;
  if (!Number.isInteger(order) || order < minOrder || order > maxOrder) {
    fail(
      "invalid-order",
      `order must be an integer from ${minOrder} to ${maxOrder} (the degree of the fitted polynomial); got ${order}. Use 2–4 for spectra.`,
    );
  }
  if (!Number.isInteger(derivative) || derivative < 0 || derivative > Math.min(maxDerivative, order)) {
    fail(
      "invalid-derivative",
      `derivative must be an integer from 0 to ${Math.min(maxDerivative, order)} (at most 2 and at most order ${order}); got ${derivative}.`,
    );
  }
  const minWindow = minimumWindowSamples(order);
  if (!Number.isInteger(windowSamples) || windowSamples % 2 !== 1 || windowSamples < minWindow) {
    fail(
      "invalid-window",
      `windowSamples must be an odd integer of at least ${minWindow} for order ${order} (odd, ≥ 5 and ≥ order + 2); got ${windowSamples}. Use ${Number.isFinite(windowSamples) ? Math.max(minWindow, 2 * Math.floor(windowSamples / 2) + 1) : minWindow}.`,
    );
  }
}

// ---------------------------------------------------------------------------------------------
// Weights

/**
 * The least-squares projector of one (window, order): row k holds the weights that give the
 * coefficient a_k of the fitted polynomial Σ a_k x^k in the scaled abscissa x_i = (i − c)/s,
 * c = (windowSamples − 1)/2, s = max(c, 1). Any weight vector (any derivative, any position) is a
 * combination of these rows, and a fit at the ends of a series needs only these (order + 1) sums.
 */
interface Projector {
  windowSamples: number;
  order: number;
  /** (order + 1) × windowSamples, row-major. */
  rows: Float64Array;
  centre: number;
  scale: number;
}

/*
 * A pure cache: projectors depend only on (windowSamples, order). Entries are never handed out
 * (public functions return new arrays), so nothing outside can change them. Bounded so that a long
 * session with many windows cannot grow it without limit.
 */
const projectorCache = new Map<number, Projector>();
const PROJECTOR_CACHE_LIMIT = 256;

/** The projector of (windowSamples, order), computed on first use; arguments assumed valid. */
function projector(windowSamples: number, order: number): Projector {
  const key = windowSamples * 8 + order;
  let p = projectorCache.get(key);
  if (p === undefined) {
    p = computeProjector(windowSamples, order);
    if (projectorCache.size >= PROJECTOR_CACHE_LIMIT) projectorCache.clear();
    projectorCache.set(key, p);
  }
  return p;
}

/**
 * P = (AᵀA)⁻¹Aᵀ with A_ik = x_i^k, x_i = (i − c)/s ∈ [−1, 1], by a Cholesky factorisation of the
 * (order+1)² Gram matrix AᵀA (the normal equations). Scaling x to [−1, 1] keeps that matrix well
 * conditioned (condition number below 1e4 up to order 5), so the weights are accurate to a few
 * ulps times that.
 */
function computeProjector(windowSamples: number, order: number): Projector {
  const n = windowSamples;
  const q = order + 1;
  const c = (n - 1) / 2;
  const s = Math.max(c, 1);
  // Gram matrix G_jk = Σ x^(j+k) from the power sums Σ x^m, m = 0 … 2·order.
  const powerSums = new Float64Array(2 * order + 1);
  for (let i = 0; i < n; i++) {
    const x = (i - c) / s;
    let xp = 1;
    for (let m = 0; m <= 2 * order; m++) {
      powerSums[m] += xp;
      xp *= x;
    }
  }
  const g = new Float64Array(q * q);
  for (let j = 0; j < q; j++) for (let k = 0; k < q; k++) g[j * q + k] = powerSums[j + k];
  // Cholesky G = L·Lᵀ, in place in the lower triangle.
  for (let j = 0; j < q; j++) {
    let d = g[j * q + j];
    for (let k = 0; k < j; k++) d -= g[j * q + k] * g[j * q + k];
    const ljj = Math.sqrt(d);
    g[j * q + j] = ljj;
    for (let i = j + 1; i < q; i++) {
      let v = g[i * q + j];
      for (let k = 0; k < j; k++) v -= g[i * q + k] * g[j * q + k];
      g[i * q + j] = v / ljj;
    }
  }
  // Column i of P solves L·Lᵀ·p = (x_i^0, …, x_i^order).
  const rows = new Float64Array(q * n);
  const z = new Float64Array(q);
  for (let i = 0; i < n; i++) {
    const x = (i - c) / s;
    let xp = 1;
    for (let k = 0; k < q; k++) {
      z[k] = xp;
      xp *= x;
    }
    for (let r = 0; r < q; r++) {
      let v = z[r];
      for (let k = 0; k < r; k++) v -= g[r * q + k] * z[k];
      z[r] = v / g[r * q + r];
    }
    for (let r = q - 1; r >= 0; r--) {
      let v = z[r];
      for (let k = r + 1; k < q; k++) v -= g[k * q + r] * z[k];
      z[r] = v / g[r * q + r];
    }
    for (let k = 0; k < q; k++) rows[k * n + i] = z[k];
  }
  return { windowSamples: n, order, rows, centre: c, scale: s };
}

/**
 * e_k = d^d/dx^d (x^k) at the scaled position of `position`, divided by s^d (so that Σ_k e_k a_k
 * is the derivative per sample^d). Written into `out` (length order + 1).
 */
function derivativeOfMonomials(p: Projector, derivative: number, position: number, out: Float64Array): Float64Array {
  const x0 = (position - p.centre) / p.scale;
  const sd = p.scale ** derivative;
  for (let k = 0; k <= p.order; k++) {
    if (k < derivative) {
      out[k] = 0;
      continue;
    }
    let falling = 1;
    for (let t = 0; t < derivative; t++) falling *= k - t;
    out[k] = (falling * x0 ** (k - derivative)) / sd;
  }
  return out;
}

/* Centre weights by (windowSamples, order, derivative): a pure cache like the projectors'. */
const centreCache = new Map<number, Float64Array>();

/** The centre weights of (windowSamples, order, derivative), computed on first use; never handed out. */
function centreWeights(windowSamples: number, order: number, derivative: number): Float64Array {
  const key = (windowSamples * 8 + order) * 4 + derivative;
  let w = centreCache.get(key);
  if (w === undefined) {
    w = weightsUnchecked(windowSamples, order, derivative, (windowSamples - 1) / 2);
    if (centreCache.size >= PROJECTOR_CACHE_LIMIT) centreCache.clear();
    centreCache.set(key, w);
  }
  return w;
}

/** Weights for (derivative, position) as a new array; arguments assumed valid. */
function weightsUnchecked(windowSamples: number, order: number, derivative: number, position: number): Float64Array {
  const p = projector(windowSamples, order);
  const e = derivativeOfMonomials(p, derivative, position, new Float64Array(order + 1));
  const w = new Float64Array(windowSamples);
  for (let k = 0; k <= order; k++) {
    const ek = e[k];
    if (ek === 0) continue;
    const off = k * windowSamples;
    for (let i = 0; i < windowSamples; i++) w[i] += ek * p.rows[off + i];
  }
  return w;
}

/**
 * Savitzky–Golay convolution weights: least-squares polynomial fit over a window, evaluated (or
 * differentiated) at one sample of it.
 *
 * Parameters
 * ----------
 * windowSamples : number
 *     Window length in samples; odd, ≥ 5, ≥ order + 2.
 * order : number
 *     Degree of the fitted polynomial, 1–5.
 * derivative : number
 *     0 (smoothing), 1 or 2; at most `order`.
 * position : number, optional
 *     Sample (0 … windowSamples − 1) at which the fit is evaluated. Default the centre,
 *     (windowSamples − 1)/2; other positions give the asymmetric weights used at the ends of a
 *     series.
 *
 * Returns
 * -------
 * Float64Array
 *     windowSamples weights w such that Σ w_i·y_i is the `derivative`-th derivative of the fit at
 *     `position`, **per sample^derivative** (divide by step^derivative for physical units).
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/invalid-window`, `signal/invalid-order`, `signal/invalid-derivative`,
 *     `signal/invalid-position`.
 *
 * Notes
 * -----
 * 1. Put x_i = (i − c)/s with c the centre and s = max(c, 1), so the abscissa spans [−1, 1].
 * 2. Form the (order+1)² Gram matrix G = AᵀA of the monomials x^k and the vector e of the
 *    d-th derivatives of the monomials at the evaluation point (divided by s^d).
 * 3. Solve G z = e by Cholesky; the weights are w = A z (the d-th derivative of the least-squares
 *    polynomial is linear in y with these coefficients).
 * At the centre, weights of order 2k and 2k+1 coincide for smoothing, and of order 2k−1 and 2k for
 * the first derivative (the odd/even monomials decouple on a symmetric window).
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, "Smoothing and differentiation of data by simplified least
 * squares procedures", Anal. Chem. 36, 1627–1639 (1964); corrections: J. Steinier, Y. Termonia and
 * J. Deltour, Anal. Chem. 44, 1906–1909 (1972).
 *
 * Example
 * -------
 * ```ts
 * Array.from(savitzkyGolayWeights(5, 2, 0), (w) => Math.round(w * 35));
 * // => [-3, 12, 17, 12, -3]
 * ```
 */
export function savitzkyGolayWeights(
  windowSamples: number,
  order: number,
  derivative: number,
  position: number = (windowSamples - 1) / 2,
): Float64Array {
  checkFilter(windowSamples, order, derivative);
  if (!Number.isInteger(position) || position < 0 || position > windowSamples - 1) {
    fail(
      "invalid-position",
      `position must be an integer sample index from 0 to ${windowSamples - 1} (windowSamples − 1); got ${position}. Omit it for the centre.`,
    );
  }
  return weightsUnchecked(windowSamples, order, derivative, position);
}

/**
 * White-noise gain of the centre Savitzky–Golay weights: the factor by which the standard
 * deviation σ of white noise is multiplied by the filter.
 *
 * Parameters
 * ----------
 * windowSamples : number
 *     Window length in samples (odd, ≥ 5, ≥ order + 2).
 * order : number
 *     Polynomial order, 1–5.
 * derivative : number
 *     0, 1 or 2.
 * stepV : number, optional
 *     Sampling step; the gain is divided by stepV^derivative. Default 1 (per sample).
 *
 * Returns
 * -------
 * number
 *     √(Σ w_i²) / stepV^derivative, for the centre weights w.
 *
 * Throws
 * ------
 * DotspecError
 *     As {@link savitzkyGolayWeights}; `signal/invalid-step` for stepV ≤ 0.
 *
 * Notes
 * -----
 * 1. For independent noise of variance σ², Var(Σ w_i ε_i) = σ² Σ w_i² (exact).
 * 2. The end points use asymmetric weights whose gain is larger (up to several times for the
 *    outermost point); this function describes the interior.
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964).
 *
 * Example
 * -------
 * ```ts
 * savitzkyGolayNoiseGain(5, 2, 1); // => 0.3162277660168379  (√10/10)
 * ```
 */
export function savitzkyGolayNoiseGain(windowSamples: number, order: number, derivative: number, stepV = 1): number {
  checkFilter(windowSamples, order, derivative);
  checkStep(stepV);
  return noiseGainUnchecked(windowSamples, order, derivative) / stepV ** derivative;
}

/** Noise gain of the centre weights, per sample^derivative, arguments assumed valid. */
export function noiseGainUnchecked(windowSamples: number, order: number, derivative: number): number {
  const w = weightsUnchecked(windowSamples, order, derivative, (windowSamples - 1) / 2);
  let ss = 0;
  for (let i = 0; i < w.length; i++) ss += w[i] * w[i];
  return Math.sqrt(ss);
}

function checkStep(stepV: number): void {
  if (typeof stepV !== "number" || !Number.isFinite(stepV) || !(stepV > 0)) {
    fail("invalid-step", `stepV must be a finite number greater than 0 (the sampling step); got ${stepV}.`);
  }
}

/**
 * Savitzky–Golay smoothing or differentiation of a uniformly sampled series, exact at the ends.
 *
 * Parameters
 * ----------
 * y : ArrayLike<number>
 *     Samples on a uniform grid; at least windowSamples of them.
 * options : SavitzkyGolayOptions
 *     windowSamples (samples, required), order (default 3), derivative (default 0),
 *     stepV (sampling step, default 1).
 *
 * Returns
 * -------
 * Float64Array
 *     Same length as y: the smoothed values (derivative 0) or the derivative per unit of stepV.
 *
 * Throws
 * ------
 * DotspecError
 *     `signal/invalid-window`, `signal/invalid-order`, `signal/invalid-derivative`,
 *     `signal/invalid-step`, `signal/too-few-points` (fewer points than windowSamples).
 *
 * Notes
 * -----
 * 1. Interior points m … n−1−m (m = (windowSamples − 1)/2) are the convolution of y with the
 *    centre weights (position m of the window): out_i = Σ_j w_j·y_{i−m+j}.
 * 2. Points 0 … m−1 are evaluated at positions 0 … m−1 of a fit over samples 0 … windowSamples−1;
 *    points n−m … n−1 at positions m+1 … windowSamples−1 of a fit over the last windowSamples
 *    samples (asymmetric weights, same order). A polynomial of degree ≤ order is therefore
 *    reproduced (or differentiated) exactly everywhere, but the end points are noisier than the
 *    interior.
 * 3. Derivatives are divided by stepV^derivative.
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964); P. A. Gorry, "General least-squares
 * smoothing and differentiation by the convolution (Savitzky–Golay) method", Anal. Chem. 62,
 * 570–573 (1990) (fits at the ends of a series).
 *
 * Example
 * -------
 * ```ts
 * const y = Float64Array.from({ length: 9 }, (_, i) => (i * 0.1) ** 2);
 * savitzkyGolay(y, { windowSamples: 5, order: 2, derivative: 1, stepV: 0.1 });
 * // => Float64Array [0, 0.2, 0.4, 0.6, 0.8, 1, 1.2, 1.4, 1.6]  (2x, up to rounding)
 * ```
 */
export function savitzkyGolay(y: ArrayLike<number>, options: SavitzkyGolayOptions): Float64Array {
  const {
    windowSamples,
    order = SAVITZKY_GOLAY_DEFAULTS.order,
    derivative = SAVITZKY_GOLAY_DEFAULTS.derivative,
    stepV = SAVITZKY_GOLAY_DEFAULTS.stepV,
  } = options;
  checkFilter(windowSamples, order, derivative);
  checkStep(stepV);
  if (y.length < windowSamples) {
    fail(
      "too-few-points",
      `y must have at least ${windowSamples} points for a window of ${windowSamples} samples; got ${y.length}. Use a smaller window or a longer series.`,
    );
  }
  return savitzkyGolayUnchecked(y, windowSamples, order, derivative, stepV);
}

/** {@link savitzkyGolay} without validation (for callers that have validated already). */
export function savitzkyGolayUnchecked(
  y: ArrayLike<number>,
  windowSamples: number,
  order: number,
  derivative: number,
  stepV: number,
): Float64Array {
  const out = new Float64Array(y.length);
  interiorUnchecked(y instanceof Float64Array ? y : Float64Array.from(y), windowSamples, order, derivative, stepV, out);
  endsUnchecked(y, windowSamples, order, derivative, stepV, out);
  return out;
}

/**
 * The smoothed curve and its first derivative with the same window, in one pass over the data:
 * the same values as two calls of {@link savitzkyGolayUnchecked} (derivative 0 and 1), each
 * folded sum and difference of a sample pair serving both. Arguments assumed valid.
 */
export function savitzkyGolaySmoothAndSlopeUnchecked(
  y: ArrayLike<number>,
  windowSamples: number,
  order: number,
  stepV: number,
): { smooth: Float64Array; slope: Float64Array } {
  const n = y.length;
  const m = (windowSamples - 1) / 2;
  const ys = y instanceof Float64Array ? y : Float64Array.from(y);
  const smooth = new Float64Array(n);
  const slope = new Float64Array(n);
  const w0 = centreWeights(windowSamples, order, 0);
  const w1 = centreWeights(windowSamples, order, 1);
  const scale1 = 1 / stepV;
  const c0 = w0[m];
  for (let i = m; i < n - m; i++) {
    let a0 = c0 * ys[i];
    let a1 = 0;
    for (let j = 0; j < m; j++) {
      const lo = ys[i - m + j], hi = ys[i + m - j];
      a0 += w0[j] * (lo + hi);
      a1 += w1[j] * (lo - hi);
    }
    smooth[i] = a0 * 1;
    slope[i] = a1 * scale1;
  }
  endsUnchecked(y, windowSamples, order, 0, stepV, smooth);
  endsUnchecked(y, windowSamples, order, 1, stepV, slope);
  return { smooth, slope };
}

/**
 * Interior: convolution with the centre weights, folded about the centre. The centre weights of
 * an even derivative are symmetric and those of an odd one antisymmetric (the window is symmetric
 * about its centre), so each pair of samples at ±j shares one weight: half the multiplications.
 */
function interiorUnchecked(ys: Float64Array, windowSamples: number, order: number, derivative: number, stepV: number, out: Float64Array): void {
  const n = ys.length;
  const m = (windowSamples - 1) / 2;
  const w = centreWeights(windowSamples, order, derivative);
  const scaleInterior = 1 / stepV ** derivative;
  const odd = derivative % 2 === 1;
  const wc = odd ? 0 : w[m];
  for (let i = m; i < n - m; i++) {
    let acc = wc * ys[i];
    if (odd) for (let j = 0; j < m; j++) acc += w[j] * (ys[i - m + j] - ys[i + m - j]);
    else for (let j = 0; j < m; j++) acc += w[j] * (ys[i - m + j] + ys[i + m - j]);
    out[i] = acc * scaleInterior;
  }
}

/**
 * Ends: fit the first and last windows once (order + 1 coefficients each) and evaluate the
 * derivative of each fit at the m outer positions, into `out`.
 */
function endsUnchecked(y: ArrayLike<number>, windowSamples: number, order: number, derivative: number, stepV: number, out: Float64Array): void {
  const n = y.length;
  const m = (windowSamples - 1) / 2;
  const p = projector(windowSamples, order);
  const q = order + 1;
  const scale = 1 / stepV ** derivative;
  const tail = n - windowSamples;
  const left = new Float64Array(q);
  const right = new Float64Array(q);
  for (let k = 0; k < q; k++) {
    const off = k * windowSamples;
    let sl = 0;
    let sr = 0;
    for (let i = 0; i < windowSamples; i++) {
      sl += p.rows[off + i] * y[i];
      sr += p.rows[off + i] * y[tail + i];
    }
    left[k] = sl;
    right[k] = sr;
  }
  const e = new Float64Array(q);
  for (let j = 0; j < m; j++) {
    // Left end: sample j at position j of the first window.
    derivativeOfMonomials(p, derivative, j, e);
    let vl = 0;
    for (let k = 0; k < q; k++) vl += e[k] * left[k];
    out[j] = vl * scale;
    // Right end: sample tail + r at position r = m + 1 + j of the last window.
    const r = m + 1 + j;
    derivativeOfMonomials(p, derivative, r, e);
    let vr = 0;
    for (let k = 0; k < q; k++) vr += e[k] * right[k];
    out[tail + r] = vr * scale;
  }
}
