/**
 * Areas of overlapping conductance peaks: the current step each peak carries, from a linear
 * least-squares decomposition into Gaussians at the found positions.
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { scaledSymmetricInverse } from "../util/smallSymmetric.ts";
import { gaussianFast } from "../util/special.ts";

/** Options of {@link peakAreas}. */
export interface PeakAreasOptions {
  /** Common Gaussian FWHM of the peaks, V. Required. */
  fwhmV: number;
  /** The fit spans the peaks ± this many Gaussian standard deviations. Default: PEAK_AREAS_DEFAULTS.marginSigma (3). */
  marginSigma?: number;
}

/** Defaults and constants of {@link peakAreas} (locked by test/peaks/peakAreas.test.ts). */
export const PEAK_AREAS_DEFAULTS = Object.freeze({
  marginSigma: 3,
  /** Each basis Gaussian is cut at ± this many standard deviations (e^−18 ≈ 1.5e−8 of its top). */
  basisReachSigma: 6,
});

/** Result of {@link peakAreas}. */
export interface PeakAreasResult {
  /** Gaussian amplitude of each peak, S (clamped at 0). */
  amplitudesS: number[];
  /** Area of each peak = the current step it carries, A. */
  areasA: number[];
  /** Baseline conductance at the first peak and its slope (S, S/V). */
  baseline: [number, number];
}

/**
 * Decomposes a stretch of dI/dV into Gaussians of a common width at given positions plus a
 * linear baseline, by linear least squares.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias in volts, ascending.
 * didvS : Float64Array
 *     Conductance in siemens at each bias.
 * positionsV : readonly number[]
 *     Peak positions in volts, ascending (held fixed).
 * options : PeakAreasOptions
 *     fwhmV (the common FWHM, V, required); marginSigma (the fit's reach beyond the outer peaks
 *     in Gaussian standard deviations, default 3).
 *
 * Returns
 * -------
 * PeakAreasResult
 *     `{ amplitudesS, areasA, baseline }`: each peak's Gaussian amplitude (S, ≥ 0) and area (the
 *     current step it carries, A), and the baseline [b₀ (S), b₁ (S/V)] at the first peak. No
 *     positions give empty arrays; singular normal equations give zeros.
 *
 * Throws
 * ------
 * Nothing: the caller (the pipeline) passes checked arrays.
 *
 * Notes
 * -----
 * 1. Model: G(V) = b₀ + b₁·(V − V₁) + Σ_k A_k·exp(−(V − V_k)²/2σ²) over
 *    [min V_k − mσ, max V_k + mσ], σ = FWHM/2√(2 ln 2); the positions and σ are held fixed, so
 *    the amplitudes and baseline follow from the normal equations (K + 2 unknowns, inverted by
 *    Cholesky at unit diagonal). The Gaussians are tabulated ({@link gaussianFast}: within
 *    1.2e-7 of their top), each cut at ± PEAK_AREAS_DEFAULTS.basisReachSigma.
 * 2. Area = A_k·σ·√(2π): the current step under the peak. Overlapping peaks share their flanks
 *    correctly, which a prominence (height above the valley) does not.
 * 3. Negative amplitudes (a spurious peak, or a shoulder the model cannot place) are set to 0.
 * The constants are in {@link PEAK_AREAS_DEFAULTS}.
 *
 * References
 * ----------
 * G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed. (Johns Hopkins University Press,
 * 2013), §4.2 and §5.3 (Cholesky factorisation; linear least squares by the normal equations).
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 1001 }, (_, i) => i * 0.001);
 * const gauss = (v: number, at: number) => Math.exp(-0.5 * ((v - at) / 0.02) ** 2);
 * // Two peaks 2.5σ apart on a flat 0.1 nS baseline.
 * const didvS = biasV.map((v) => 1e-10 + 2e-9 * gauss(v, 0.45) + 1e-9 * gauss(v, 0.5));
 * const r = peakAreas(biasV, didvS, [0.45, 0.5], { fwhmV: 0.02 * 2.35482 });
 * r.amplitudesS; // => [2e-9, 1e-9] (S)
 * r.areasA;      // => [1.003e-10, 5.01e-11] (A: amplitude × σ√(2π))
 * r.baseline;    // => [1e-10, 0] (S, S/V)
 * ```
 */
export function peakAreas(biasV: Float64Array, didvS: Float64Array, positionsV: readonly number[], options: PeakAreasOptions): PeakAreasResult {
  const k = positionsV.length;
  if (k === 0) return { amplitudesS: [], areasA: [], baseline: [0, 0] };
  const sigma = options.fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
  const margin = (options.marginSigma ?? PEAK_AREAS_DEFAULTS.marginSigma) * sigma;
  const lo = positionsV[0] - margin, hi = positionsV[k - 1] + margin;
  const m = k + 2;
  const ata = new Float64Array(m * m);
  const atb = new Float64Array(m);
  const row = new Float64Array(m);
  const reach = PEAK_AREAS_DEFAULTS.basisReachSigma * sigma;
  // Only the basis functions within reach of a sample are non-zero: the Gram updates visit the
  // two baseline columns and that run of peaks, and skip the zero products, which leave every sum
  // unchanged. Bias and positions both ascend, so the run moves up with the sample: it starts at
  // the first peak not yet left behind (jFirst) and ends at the first peak out of reach above.
  // Entries of `row` outside the run are never read.
  let jFirst = 0;
  for (let i = 0; i < biasV.length; i++) {
    const v = biasV[i];
    if (v < lo || v > hi) continue;
    row[0] = 1;
    row[1] = v - positionsV[0];
    while (jFirst < k && v - positionsV[jFirst] >= reach) jFirst++;
    let first = m, last = 1;
    for (let j = jFirst; j < k; j++) {
      const d = v - positionsV[j];
      if (!(Math.abs(d) < reach)) break;
      row[j + 2] = gaussianFast(d / sigma);
      if (first === m) first = j + 2;
      last = j + 2;
    }
    const y = didvS[i];
    for (let a = 0; a < m; a++) {
      if (a === 2 && first > 2) a = first;
      if (a > last && a >= 2) break;
      const ra = row[a];
      if (ra === 0) continue;
      atb[a] += ra * y;
      ata[a * m + a] += ra * ra;
      for (let b = Math.max(a + 1, first); b <= last; b++) ata[a * m + b] += ra * row[b];
      if (a === 0) ata[1] += ra * row[1];
    }
  }
  for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) ata[a * m + b] = ata[b * m + a];
  const inv = scaledSymmetricInverse(ata, m);
  const x = inv ? Float64Array.from({ length: m }, (_, r) => atb.reduce((acc, t, c) => acc + inv[r * m + c] * t, 0)) : null;
  const amplitudesS = positionsV.map((_, j) => (x ? Math.max(0, x[j + 2]) : 0));
  return {
    amplitudesS,
    areasA: amplitudesS.map((a) => a * sigma * Math.sqrt(2 * Math.PI)),
    baseline: x ? [x[0], x[1]] : [0, 0],
  };
}
