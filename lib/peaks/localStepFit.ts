/**
 * The local step fit of findPeaks: a line plus Gaussian-broadened current steps fitted by linear
 * least squares to the unsmoothed current around one peak (the step test and the refinement on
 * the current). Internal to lib/peaks (not re-exported from the public entry).
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { gaussianFast, normalCdfFast } from "../util/special.ts";
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
  /** RMS residual of the fit, A (with `withShift` or `rmsToo`; 0 otherwise). */
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
 *
 * `windowV` (V), where given, widens the window to it ({@link stepTestWindow}) and adds a
 * quadratic term c₂·u² to the background (unless `quadraticBackground` is false; without
 * `windowV` it is true only when set). `freeWithinV` (V, default 0: none) adds a φ and a z·φ
 * column for every neighbour's step within that distance of x₀ (its position and width free to
 * first order: ∂Φ/∂x_j = −φ/s, ∂Φ/∂s = −z·φ/s, z = (x − x_j)/s).
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
  windowV?: readonly [number, number],
  freeWithinV = 0,
  rmsToo = false,
  quadraticBackground = windowV !== undefined,
): LocalStepFit | null {
  const n = x.length;
  const h = (x[n - 1] - x[0]) / (n - 1);
  let lo = Math.max(0, p - 6 * halfWidth), hi = Math.min(n - 1, p + 6 * halfWidth);
  if (windowV) {
    lo = Math.max(0, Math.min(lo, Math.round((windowV[0] - x[0]) / h)));
    hi = Math.min(n - 1, Math.max(hi, Math.round((windowV[1] - x[0]) / h)));
  }
  if (hi - lo < 5) return null;
  const s = (2 * halfWidth * h) / GAUSSIAN_FWHM_PER_SIGMA;
  // Neighbours closer than one FWHM are the same feature (noise on its flank), not another step.
  const reach = 2 * halfWidth * h;
  const steps = neighboursV.filter((v) => Math.abs(v - x0) >= reach && v >= x[lo] - reach && v <= x[hi] + reach);
  // Over a moved (longer) window the background gets its next Taylor term, u²: a curved background
  // (an exponential rise) that a line follows over ±3 FWHM does not stay straight over ±6.
  const bg = quadraticBackground ? 3 : 2;
  // Each neighbour within `freeWithinV` also gets its φ and z·φ columns: its position and width
  // free to first order (∂Φ/∂x_j = −φ/s, ∂Φ/∂s = −z·φ/s).
  const free = freeWithinV > 0 ? steps.filter((v) => Math.abs(v - x0) <= freeWithinV) : [];
  const nStepCols = steps.length + 2 * free.length;
  const self = bg + nStepCols;
  const m = self + 1 + (withShift ? 1 : 0);
  // Design matrix, column by column (each Φ evaluated once).
  const rows = hi - lo + 1;
  if (work.cols.length < m * rows) work.cols = new Float64Array(2 * m * rows);
  const cols = work.cols;
  for (let i = 0; i < rows; i++) {
    const u = x[lo + i] - x0;
    cols[i] = 1;
    cols[rows + i] = u;
    if (bg === 3) cols[2 * rows + i] = u * u;
    for (let j = 0; j < steps.length; j++) cols[(bg + j) * rows + i] = normalCdfFast((x[lo + i] - steps[j]) / s);
    for (let j = 0; j < free.length; j++) {
      const z = (x[lo + i] - free[j]) / s;
      const density = gaussianFast(z) * INV_SQRT_2PI;
      cols[(bg + steps.length + j) * rows + i] = density;
      cols[(bg + steps.length + free.length + j) * rows + i] = z * density;
    }
    cols[self * rows + i] = normalCdfFast(u / s);
    if (withShift) cols[(self + 1) * rows + i] = gaussianFast(u / s) * INV_SQRT_2PI;
  }
  // Normal equations column by column (contiguous dot products; the same sums in the same order).
  // Plain arrays: a typed array of more than a few numbers is allocated outside V8's heap, which
  // costs more than these sums.
  const ata: number[] = new Array(m * m).fill(0);
  const atb: number[] = new Array(m).fill(0);
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
  if (withShift || rmsToo) {
    // The residual RMS widens the position error; the first step test does not use it.
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

/** Limits of {@link stepTestWindow}, in FWHM (derived in its notes). */
export const STEP_TEST_WINDOW = Object.freeze({
  /** The window's half-width before any edge moves. */
  halfWidthFwhm: 3,
  /**
   * Length of the window at an end of the curve, in FWHM: a plain window that an end cuts is also
   * fitted over this stretch at that end, shifted inward (the plain window's length, 2 × 3 FWHM;
   * findPeaks note 10). Chosen on the accuracy benchmark's cut-window mix (the last p peak half a
   * spacing before the window's end).
   */
  endWindowFwhm: 6,
  /** A neighbour within this distance of an edge straddles it: its step rises from 0.9 % to 99.1 % over ±1 FWHM (Φ(∓2.355)). */
  straddleFwhm: 1,
  /** The edge moves this far beyond such a neighbour: its rise (1 FWHM) and as long a plateau after it. */
  beyondFwhm: 2,
  /** The edge never moves further than this from the tested peak (twice the plain window). */
  maxHalfWidthFwhm: 6,
  /**
   * A second test (of a candidate short of the first, or of a shoulder) frees the position and
   * width of each neighbour within this distance to first order: a neighbour's misfit leaves a
   * residual of φ or z·φ shape within about ±1 FWHM of it (|z| ≲ 2.4), which a step 1–2 FWHM away
   * would take up.
   */
  freeNeighbourFwhm: 2,
});

/**
 * The window of the step test around a candidate at x0, V: ±3 FWHM, with each edge moved out of
 * any neighbour's step that it cuts.
 *
 * Parameters
 * ----------
 * x0V : number
 *     The candidate's position, V.
 * neighboursV : readonly number[]
 *     The other candidates' positions, V, ascending.
 * fwhmV : number
 *     The expected FWHM of a step, V (> 0).
 *
 * Returns
 * -------
 * [number, number]
 *     The left and right edges, V.
 *
 * Notes
 * -----
 * 1. The local fit (line + Gaussian-broadened steps) tells a step from the line only through the
 *    plateaus on both sides of it. A neighbour whose step straddles an edge of the window
 *    (within 1 FWHM of it: its step is between 0.9 % and 99.1 % complete there, Φ(∓2.355) for a
 *    Gaussian broadening) has no plateau beyond it inside the window, so its column is nearly
 *    collinear with the line and the constant, and its uncertainty spreads to the tested step
 *    (the standard error of c grows, the test loses power, most in a charging ladder whose
 *    steps are 1–2 FWHM apart).
 * 2. So each edge, walking outward from x0 ± 3 FWHM through the neighbours in order, moves to
 *    2 FWHM beyond any neighbour that straddles it (the neighbour's rise, 1 FWHM, and as long a
 *    plateau after it); the moved edge may in turn be straddled by the next neighbour.
 * 3. No edge moves further than 6 FWHM from x0. The window only grows: a neighbour beyond the
 *    plain window that is not fitted gains no column.
 *
 * Example
 * -------
 * ```ts
 * stepTestWindow(0, [0.1, 0.28], 0.1); // => [-0.3, 0.48] (the neighbour at 2.8 FWHM cuts the right edge)
 * ```
 */
export function stepTestWindow(x0V: number, neighboursV: readonly number[], fwhmV: number): [number, number] {
  const W = STEP_TEST_WINDOW;
  const sorted = neighboursV;
  let right = x0V + W.halfWidthFwhm * fwhmV;
  for (const v of sorted) {
    if (v <= x0V) continue;
    if (v > right + W.straddleFwhm * fwhmV) break;
    if (v >= right - W.straddleFwhm * fwhmV) right = Math.min(x0V + W.maxHalfWidthFwhm * fwhmV, Math.max(right, v + W.beyondFwhm * fwhmV));
  }
  let left = x0V - W.halfWidthFwhm * fwhmV;
  for (let j = sorted.length - 1; j >= 0; j--) {
    const v = sorted[j];
    if (v >= x0V) continue;
    if (v < left - W.straddleFwhm * fwhmV) break;
    if (v <= left + W.straddleFwhm * fwhmV) left = Math.max(x0V - W.maxHalfWidthFwhm * fwhmV, Math.min(left, v - W.beyondFwhm * fwhmV));
  }
  return [left, right];
}

/**
 * The step test's window at an end of the curve: where an end cuts the plain window (±3 FWHM,
 * `STEP_TEST_WINDOW.halfWidthFwhm`) around sample `index`, the last (or first)
 * `STEP_TEST_WINDOW.endWindowFwhm` FWHM of the curve, V.
 *
 * Parameters
 * ----------
 * x : Float64Array
 *     Bias, V, uniformly spaced, ascending.
 * index : number
 *     The candidate's sample.
 * halfWidth : number
 *     Half the expected FWHM, in samples (≥ 1).
 *
 * Returns
 * -------
 * [number, number] | null
 *     The window's edges, V; null where the plain window lies inside the curve, or the curve is
 *     no longer than the end window.
 *
 * Notes
 * -----
 * 1. Cut by the end, the plain window keeps less than 3 FWHM on that side: the step's plateau
 *    beyond the candidate is short or missing, so its column is nearly collinear with the line
 *    and its standard error grows (a step 0.5–1 FWHM before the end reads t ≈ 2–4 where the
 *    same step inside the curve reads 10–20). Shifted inward to its full length, the window
 *    has the same number of samples as a plain one: the line is set by the plateaus the
 *    window gains on the inner side (their steps fitted as neighbours).
 * 2. The end window's t is an alternative to the plain one, the larger standing: where the shift
 *    brings a strong neighbour's step to the window's inner edge (its column then collinear with
 *    the constant), the plain window can be the better test. A candidate with another within one
 *    FWHM keeps the plain window: the two share one step, and a second window would let both pass.
 * 3. The background terms are those of the plain test (a line; u² where the caller asks for it):
 *    the window is no longer than the plain one. The moved window of {@link stepTestWindow} adds
 *    u², which over a window that ends just past the step takes up the step's cut rise (t < 0
 *    seen for a real step); it is tried only where both fall short.
 *
 * Example
 * -------
 * ```ts
 * const x = Float64Array.from({ length: 1001 }, (_, i) => i * 0.001);
 * endWindow(x, 980, 25); // => [0.7, 1] (the last 6 FWHM of 50 mV)
 * endWindow(x, 500, 25); // => null
 * ```
 */
export function endWindow(x: Float64Array, index: number, halfWidth: number): [number, number] | null {
  const n = x.length;
  const reach = STEP_TEST_WINDOW.halfWidthFwhm * 2 * halfWidth; // samples either side of the plain window
  const length = STEP_TEST_WINDOW.endWindowFwhm * 2 * halfWidth; // samples of the end window
  if (n - 1 <= length) return null;
  if (index + reach > n - 1) return [x[n - 1 - length], x[n - 1]];
  if (index - reach < 0) return [x[0], x[length]];
  return null;
}

/**
 * t-statistic of the step at sample `index` with steps at `neighboursV` (V, ascending, the
 * candidate itself not among them; those within `freeWithinV` with their positions and widths
 * free to first order; with `quadratic` a u² background term over ±3 FWHM too; with `rmsSigma`
 * (default: as `quadratic`) σ the larger of noiseA and the fit's residual RMS):
 * over ±3 FWHM (where an end of the curve cuts that window, the larger t of it and of the
 * window of {@link endWindow}), and where that falls short of minStepSigma but reaches
 * minPlainSigma, over the window of {@link stepTestWindow}.
 */
export function stepSignificance(
  x: Float64Array,
  current: Float64Array,
  index: number,
  neighbours: readonly number[],
  halfWidth: number,
  noiseA: number,
  minStepSigma: number,
  minPlainSigma: number,
  work: FitWorkspace,
  freeWithinV = 0,
  quadratic = false,
  rmsSigma = quadratic,
): number {
  const x0 = x[index];
  const fitOver = (windowV?: readonly [number, number]) => localStepFit(x, current, index, x0, neighbours, halfWidth, false, work, windowV, freeWithinV, rmsSigma);
  // With `rmsSigma`, σ is the larger of the noise and the fit's residual RMS: where the local
  // model misfits (a line shape or background it does not describe, seen at a low noise), the
  // misfit is no step.
  const z = (fit: LocalStepFit | null) => (fit && fit.stepVar > 0 ? fit.step / ((rmsSigma ? Math.max(noiseA, fit.rms) : noiseA) * Math.sqrt(fit.stepVar)) : 0);
  const fwhmV = 2 * halfWidth * ((x[x.length - 1] - x[0]) / (x.length - 1));
  const W = STEP_TEST_WINDOW.halfWidthFwhm * fwhmV;
  // With `quadratic` the plain window has the u² background term as well (a windowV of ±3 FWHM).
  let plain = z(quadratic ? fitOver([x0 - W, x0 + W]) : fitOver());
  // A plain window cut by an end of the curve is also fitted over the end window (shifted inward
  // to its full length, the same background terms), and the larger t stands; not for a candidate
  // with a neighbour inside one FWHM, whose step it shares (as below). findPeaks note 10.
  const shared = neighbours.some((v) => Math.abs(v - x0) < fwhmV);
  const atEnd = shared ? null : endWindow(x, index, halfWidth);
  if (atEnd) plain = Math.max(plain, z(localStepFit(x, current, index, x0, neighbours, halfWidth, false, work, atEnd, freeWithinV, rmsSigma, quadratic)));
  // A step significant over ±3 FWHM needs no longer window; one that does not stand at
  // minPlainSigma there (the pre-screen's level) is not tried again. A candidate with a neighbour
  // inside one FWHM shares that neighbour's (unfitted) step: a longer window would credit more of
  // it to the candidate, so its test stays plain.
  if (plain >= minStepSigma || !(plain >= minPlainSigma) || shared) return plain;
  const windowV = stepTestWindow(x0, neighbours, fwhmV);
  // Only where an edge moved (by more than a sample) is there a second fit.
  const sample = fwhmV / (2 * halfWidth);
  if (windowV[0] > x0 - W - sample && windowV[1] < x0 + W + sample) return plain;
  return z(fitOver(windowV));
}
