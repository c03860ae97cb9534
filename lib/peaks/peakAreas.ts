/**
 * Areas of overlapping conductance peaks: the current step each peak carries, from a linear
 * least-squares decomposition into Gaussians at the found positions.
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";

/** Options of {@link peakAreas}. */
export interface PeakAreasOptions {
  /** Common Gaussian FWHM of the peaks, V. */
  fwhmV: number;
  /** The fit spans the peaks ± this many standard deviations. Default 3. */
  marginSigma?: number;
}

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
 * Notes:
 * 1. Model: G(V) = b₀ + b₁·(V − V₁) + Σ_k A_k·exp(−(V − V_k)²/2σ²) over
 *    [min V_k − mσ, max V_k + mσ], σ = FWHM/2√(2 ln 2); the positions and σ are held fixed, so
 *    the amplitudes and baseline follow from the normal equations (Cholesky-free Gaussian
 *    elimination with partial pivoting; K + 2 unknowns).
 * 2. Area = A_k·σ·√(2π): the current step under the peak. Overlapping peaks share their flanks
 *    correctly, which a prominence (height above the valley) does not.
 * 3. Negative amplitudes (a spurious peak, or a shoulder the model cannot place) are set to 0.
 *
 * @param biasV - ascending bias, V.
 * @param didvS - conductance, S.
 * @param positionsV - peak positions, V, ascending.
 */
export function peakAreas(biasV: Float64Array, didvS: Float64Array, positionsV: readonly number[], options: PeakAreasOptions): PeakAreasResult {
  const k = positionsV.length;
  if (k === 0) return { amplitudesS: [], areasA: [], baseline: [0, 0] };
  const sigma = options.fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
  const margin = (options.marginSigma ?? 3) * sigma;
  const lo = positionsV[0] - margin, hi = positionsV[k - 1] + margin;
  const m = k + 2;
  const ata = new Float64Array(m * m);
  const atb = new Float64Array(m);
  const row = new Float64Array(m);
  const reach = 6 * sigma;
  for (let i = 0; i < biasV.length; i++) {
    const v = biasV[i];
    if (v < lo || v > hi) continue;
    row[0] = 1;
    row[1] = v - positionsV[0];
    for (let j = 0; j < k; j++) {
      const d = v - positionsV[j];
      row[j + 2] = Math.abs(d) < reach ? Math.exp((-0.5 * d * d) / (sigma * sigma)) : 0;
    }
    const y = didvS[i];
    for (let a = 0; a < m; a++) {
      const ra = row[a];
      if (ra === 0) continue;
      atb[a] += ra * y;
      for (let b = a; b < m; b++) ata[a * m + b] += ra * row[b];
    }
  }
  for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) ata[a * m + b] = ata[b * m + a];
  const x = solve(ata, atb, m);
  const amplitudesS = positionsV.map((_, j) => (x ? Math.max(0, x[j + 2]) : 0));
  return {
    amplitudesS,
    areasA: amplitudesS.map((a) => a * sigma * Math.sqrt(2 * Math.PI)),
    baseline: x ? [x[0], x[1]] : [0, 0],
  };
}

/** Solves the m×m system in place by Gaussian elimination with partial pivoting; null if singular. */
function solve(a: Float64Array, b: Float64Array, m: number): Float64Array | null {
  for (let c = 0; c < m; c++) {
    let p = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(a[r * m + c]) > Math.abs(a[p * m + c])) p = r;
    if (!(Math.abs(a[p * m + c]) > 0)) return null;
    if (p !== c) {
      for (let j = 0; j < m; j++) [a[c * m + j], a[p * m + j]] = [a[p * m + j], a[c * m + j]];
      [b[c], b[p]] = [b[p], b[c]];
    }
    for (let r = c + 1; r < m; r++) {
      const f = a[r * m + c] / a[c * m + c];
      if (f === 0) continue;
      for (let j = c; j < m; j++) a[r * m + j] -= f * a[c * m + j];
      b[r] -= f * b[c];
    }
  }
  const x = new Float64Array(m);
  for (let r = m - 1; r >= 0; r--) {
    let s = b[r];
    for (let j = r + 1; j < m; j++) s -= a[r * m + j] * x[j];
    x[r] = s / a[r * m + r];
  }
  return x;
}
