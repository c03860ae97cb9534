/**
 * The local step fit of findPeaks: a line plus Gaussian-broadened current steps fitted by linear
 * least squares to the unsmoothed current around one peak (the step test and the refinement on
 * the current). Internal to lib/peaks (not re-exported from the public entry).
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { normalCdfFast } from "../util/special.ts";
import { scaledCholeskySolve } from "../util/smallSymmetric.ts";

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/** Scratch space of the local step fits of one findPeaks call (the design matrix, grown as needed). */
export interface FitWorkspace {
  cols: Float64Array;
}

/** Result of {@link localStepFit}: coefficients and their covariance in units of the noise variance. */
export interface LocalStepFit {
  /** Height of the tested step, A. */
  step: number;
  /** Var(step)/σ². */
  stepVar: number;
  /** Shift of the step position, V (with `withShift`), and Var(shift)/σ². */
  shift: number;
  shiftVar: number;
  /** RMS residual of the fit, A (with `withShift`; 0 otherwise). */
  rms: number;
}

/**
 * Local linear least-squares fit of the unsmoothed current around one peak:
 * I = a + b·u + Σ_j c_j·Φ((x − x_j)/s) + c·Φ((x − x₀)/s) [+ d·φ((x − x₀)/s)], u = x − x₀,
 * over ±6·halfWidth samples (±3 FWHM) around sample p, with a step for every neighbour at least
 * one FWHM away that lies within the window or within 2·halfWidth of it, all of width
 * s = 2·halfWidth·h/2.3548. Neighbouring steps are fitted, not mistaken for background. With
 * `withShift`, the φ column linearises a shift of x₀: Φ((x − x₀ − δ)/s) ≈ Φ − (δ/s)·φ, so
 * δ = −d·s/c (one Gauss–Newton step).
 */
export function localStepFit(
  x: Float64Array,
  current: Float64Array,
  p: number,
  x0: number,
  neighboursV: readonly number[],
  halfWidth: number,
  withShift: boolean,
  work: FitWorkspace,
): LocalStepFit | null {
  const n = x.length;
  const lo = Math.max(0, p - 6 * halfWidth), hi = Math.min(n - 1, p + 6 * halfWidth);
  if (hi - lo < 5) return null;
  const h = (x[n - 1] - x[0]) / (n - 1);
  const s = (2 * halfWidth * h) / GAUSSIAN_FWHM_PER_SIGMA;
  // Neighbours closer than one FWHM are the same feature (noise on its flank), not another step.
  const reach = 2 * halfWidth * h;
  const steps = neighboursV.filter((v) => Math.abs(v - x0) >= reach && v >= x[lo] - reach && v <= x[hi] + reach);
  const self = 2 + steps.length;
  const m = self + 1 + (withShift ? 1 : 0);
  // Design matrix, column by column (each Φ evaluated once).
  const rows = hi - lo + 1;
  if (work.cols.length < m * rows) work.cols = new Float64Array(2 * m * rows);
  const cols = work.cols;
  for (let i = 0; i < rows; i++) {
    const u = x[lo + i] - x0;
    cols[i] = 1;
    cols[rows + i] = u;
    for (let j = 0; j < steps.length; j++) cols[(2 + j) * rows + i] = normalCdfFast((x[lo + i] - steps[j]) / s);
    cols[self * rows + i] = normalCdfFast(u / s);
    if (withShift) cols[(self + 1) * rows + i] = Math.exp((-0.5 * u * u) / (s * s)) * INV_SQRT_2PI;
  }
  // Normal equations column by column (contiguous dot products; the same sums in the same order).
  const ata = new Float64Array(m * m);
  const atb = new Float64Array(m);
  for (let r = 0; r < m; r++) {
    const a = r * rows;
    let sb = 0;
    for (let i = 0; i < rows; i++) sb += cols[a + i] * current[lo + i];
    atb[r] = sb;
    if (r === 0) {
      // The constant column: plain column sums.
      for (let c = 0; c < m; c++) {
        const b = c * rows;
        let sum = 0;
        for (let i = 0; i < rows; i++) sum += cols[b + i];
        ata[c] = sum;
        ata[c * m] = sum;
      }
      continue;
    }
    for (let c = r; c < m; c++) {
      const b = c * rows;
      let sum = 0;
      for (let i = 0; i < rows; i++) sum += cols[a + i] * cols[b + i];
      ata[r * m + c] = sum;
      ata[c * m + r] = sum;
    }
  }
  // The columns differ by orders of magnitude: solved at unit diagonal. Only the step's (and the
  // shift's) variances are needed, and their columns are the last: the trailing block of the inverse.
  const tail = withShift ? 2 : 1;
  const solved = scaledCholeskySolve(ata, atb, m, tail);
  if (!solved) return null;
  const coef = solved.x;
  const inv = (r: number, c: number) => solved.tailInverse[(r - self) * tail + (c - self)];
  let ss = 0;
  if (withShift) {
    // The residual RMS widens the position error; the significance test does not use it.
    for (let i = 0; i < rows; i++) {
      let f = 0;
      for (let r = 0; r < m; r++) f += cols[r * rows + i] * coef[r];
      ss += (current[lo + i] - f) ** 2;
    }
  }
  const rms = Math.sqrt(ss / Math.max(1, rows - m));
  const step = coef[self];
  let shift = 0, shiftVar = Infinity;
  if (withShift && step !== 0) {
    const d = coef[self + 1];
    shift = (-d * s) / step;
    // δ = −s·d/c: first-order propagation with the covariance of (c, d).
    const gC = (s * d) / (step * step), gD = -s / step;
    shiftVar = gC * gC * inv(self, self) + 2 * gC * gD * inv(self, self + 1) + gD * gD * inv(self + 1, self + 1);
  }
  return { step, stepVar: inv(self, self), shift, shiftVar, rms };
}

/** t-statistic of the step at candidate index p (neighbours at the other candidates). */
export function stepSignificance(x: Float64Array, current: Float64Array, indices: number[], k: number, halfWidth: number, noiseA: number, work: FitWorkspace): number {
  const fit = localStepFit(x, current, indices[k], x[indices[k]], indices.filter((_, j) => j !== k).map((j) => x[j]), halfWidth, false, work);
  if (!fit || !(fit.stepVar > 0)) return 0;
  return fit.step / (noiseA * Math.sqrt(fit.stepVar));
}
