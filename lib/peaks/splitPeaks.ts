/**
 * Merged peaks and shoulders: a conductance peak wider than the expected width by more than its
 * error on either side is tested for two current steps under it (findPeaks' note 7). Internal to
 * lib/peaks (not re-exported from the public entry).
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { gaussianFast, normalCdfFast } from "../util/special.ts";
import { scaledCholeskySolve } from "../util/smallSymmetric.ts";
import type { Peak } from "./findPeaks.ts";

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/** Defaults of {@link splitWidePeaks} (locked by test/peaks/splitPeaks.test.ts). */
export const SPLIT_PEAKS_DEFAULTS = Object.freeze({
  /**
   * A side of a peak (peak to its half-prominence crossing) longer than half the peaks' FWHM by
   * this many of its standard errors (0.72·FWHM/SNR, {@link halfWidthSE}) flags the peak.
   */
  gateSigma: 2,
  /**
   * Two steps are kept only this many expected FWHM apart or more: closer, two Gaussian-broadened
   * steps of a common width s differ from one step of width √(s² + d²/4) by their fourth moment
   * alone (excess kurtosis −2a⁴/(1 + a²)², a = d/2s: −0.13 at half a FWHM), a line-shape detail
   * rather than a second level.
   */
  minSeparationFwhm: 0.5,
  /** Half-width of the fit window around the peak, in expected FWHM (that of the step test). */
  windowFwhm: 3,
  /** The Gauss–Newton search stops when its step moves every position by less than this fraction of a FWHM (and the width by a quarter of that). */
  searchTolFwhm: 1 / 64,
  /**
   * The common width of the fitted steps stays within these multiples of the expected one: no
   * step is narrower than the gap-edge step the expected width is measured on (a tip-side level;
   * substrate-side steps are η/(1 − η) times wider for η > 0.5), less 20 % for the error of that
   * measurement; 2.5 covers a resonance at η = 0.55–0.65 (1.2–1.9 times) with room.
   */
  widthBounds: [0.8, 2.5] as readonly [number, number],
});

/**
 * Standard error of one side of a Gaussian peak measured at half prominence, V: the noise σ_G
 * over the slope there. For G = A·exp(−x²/2s²) the slope at the half-height point x = s·√(2 ln 2)
 * is A·√(2 ln 2)/(2s), so σ_x = 2s·σ_G/(√(2 ln 2)·A), and with FWHM = 2√(2 ln 2)·s,
 * σ_x = FWHM/(2 ln 2·SNR) ≈ 0.7213·FWHM/SNR (SNR = A/σ_G).
 */
export function halfWidthSE(fwhmV: number, snr: number): number {
  return fwhmV / (2 * Math.LN2 * snr);
}

/** What {@link fitSteps} returns: the residual sum of squares and, per free step, its height, variance and position shift. */
export interface StepsFit {
  /** Residual sum of squares, A². */
  ss: number;
  /** Rows fitted. */
  rows: number;
  /** Columns fitted. */
  columns: number;
  /** Heights of the free steps, A. */
  steps: number[];
  /** Var(step)/σ² of each free step. */
  stepVars: number[];
  /** With shifts: the Gauss–Newton shift of each free step, V, and Var(shift)/σ². */
  shifts: number[];
  shiftVars: number[];
  /** With a width column: the Gauss–Newton change of the common width, V (0 without). */
  widthShift: number;
}

/**
 * Scratch of {@link fitSteps}: the design matrix, and the fixed columns' sums of the last fit
 * (reused while the samples, the current and the neighbours stay the same).
 */
export interface StepsScratch {
  cols: number[];
  fixed?: { x: Float64Array; current: Float64Array; lo: number; hi: number; sigmaV: number; neighboursV: number[]; ata: number[]; atb: number[] };
}

/**
 * Linear least squares of the current over samples [lo, hi]:
 * I = a + b·u + Σ_j c_j·Φ((x − n_j)/s₀) + Σ_k d_k·Φ((x − x_k)/s) [+ Σ_k e_k·φ((x − x_k)/s)/√(2π)],
 * u = x − x_ref: neighbours n_j at the expected width s₀, free steps x_k at a common width s.
 * With `withShift`, each φ column linearises a shift of x_k (δ_k = −e_k·s/d_k, as in
 * localStepFit). With `widthWeights` (the free steps' heights d_k of a fit at these positions) one
 * more column, Σ_k d_k·z_k·φ(z_k)/√(2π) with z_k = (x − x_k)/s, linearises a change of the common
 * width (Δs = −h·s for its coefficient h): the Gauss–Newton step of {@link stepSearch}.
 * `scratch` holds the design matrix (grown as needed; pass one to reuse it over many fits). Null
 * when the normal equations are singular.
 */
export function fitSteps(
  x: Float64Array,
  current: Float64Array,
  lo: number,
  hi: number,
  neighboursV: readonly number[],
  neighbourSigmaV: number,
  freeV: readonly number[],
  sigmaV: number,
  withShift: boolean,
  scratch: StepsScratch = { cols: [] },
  widthWeights?: readonly number[],
): StepsFit | null {
  const rows = hi - lo + 1;
  const nf = freeV.length;
  const self = 2 + neighboursV.length;
  const withWidth = withShift && widthWeights !== undefined;
  const wCol = self + 2 * nf;
  const m = self + nf * (withShift ? 2 : 1) + (withWidth ? 1 : 0);
  if (rows <= m) return null;
  const xRef = x[(lo + hi) >> 1];
  // Column by column in one plain scratch array (a typed array is allocated outside V8's heap, which
  // costs more than these sums). The fixed columns (background and neighbours) and their sums are
  // kept in the scratch between fits over the same samples and neighbours, which a search makes by
  // the hundred: computed once, they are the same numbers every fit would compute.
  if (scratch.cols.length < m * rows) {
    scratch.cols = new Array(2 * m * rows).fill(0);
    scratch.fixed = undefined;
  }
  const cols = scratch.cols;
  const kept = scratch.fixed;
  const reuse = kept !== undefined && kept.x === x && kept.current === current && kept.lo === lo && kept.hi === hi && kept.sigmaV === neighbourSigmaV && kept.neighboursV.length === neighboursV.length && kept.neighboursV.every((v, j) => v === neighboursV[j]);
  for (let i = 0; i < rows; i++) {
    const v = x[lo + i];
    if (!reuse) {
      cols[i] = 1;
      cols[rows + i] = v - xRef;
      for (let j = 0; j < neighboursV.length; j++) cols[(2 + j) * rows + i] = normalCdfFast((v - neighboursV[j]) / neighbourSigmaV);
    }
    let width = 0;
    for (let k = 0; k < nf; k++) {
      const z = (v - freeV[k]) / sigmaV;
      cols[(self + k) * rows + i] = normalCdfFast(z);
      if (withShift) {
        const g = gaussianFast(z) * INV_SQRT_2PI;
        cols[(self + nf + k) * rows + i] = g;
        if (withWidth) width += widthWeights[k] * z * g;
      }
    }
    if (withWidth) cols[wCol * rows + i] = width;
  }
  const ata: number[] = new Array(m * m).fill(0);
  const atb: number[] = new Array(m).fill(0);
  for (let r = 0; r < m; r++) {
    const a = r * rows;
    if (reuse && r < self) atb[r] = kept.atb[r];
    else {
      let sb = 0;
      for (let i = 0; i < rows; i++) sb += cols[a + i] * current[lo + i];
      atb[r] = sb;
    }
    for (let c = r; c < m; c++) {
      let sum: number;
      if (reuse && c < self) sum = kept.ata[r * self + c];
      else {
        const b = c * rows;
        sum = 0;
        for (let i = 0; i < rows; i++) sum += cols[a + i] * cols[b + i];
      }
      ata[r * m + c] = sum;
      ata[c * m + r] = sum;
    }
  }
  if (!reuse) {
    const fixedAta: number[] = new Array(self * self).fill(0);
    for (let r = 0; r < self; r++) for (let c = 0; c < self; c++) fixedAta[r * self + c] = ata[r * m + c];
    scratch.fixed = { x, current, lo, hi, sigmaV: neighbourSigmaV, neighboursV: neighboursV.slice(), ata: fixedAta, atb: atb.slice(0, self) };
  }
  const tail = m - self;
  const solved = scaledCholeskySolve(ata, atb, m, tail);
  if (!solved) return null;
  const coef = solved.x;
  let ss = 0;
  for (let i = 0; i < rows; i++) {
    let f = 0;
    for (let c = 0; c < m; c++) f += cols[c * rows + i] * coef[c];
    ss += (current[lo + i] - f) ** 2;
  }
  const inv = (r: number, c: number) => solved.tailInverse[(r - self) * tail + (c - self)];
  const steps: number[] = [], stepVars: number[] = [], shifts: number[] = [], shiftVars: number[] = [];
  for (let k = 0; k < nf; k++) {
    const c = coef[self + k];
    steps.push(c);
    stepVars.push(inv(self + k, self + k));
    if (withWidth) {
      // The search's step: linearised at the heights the shift columns were built for.
      shifts.push(widthWeights[k] !== 0 ? (-coef[self + nf + k] * sigmaV) / widthWeights[k] : 0);
      shiftVars.push(Infinity);
    } else if (withShift && c !== 0) {
      const d = coef[self + nf + k];
      const gC = (sigmaV * d) / (c * c), gD = -sigmaV / c;
      shifts.push((-d * sigmaV) / c);
      shiftVars.push(gC * gC * inv(self + k, self + k) + 2 * gC * gD * inv(self + k, self + nf + k) + gD * gD * inv(self + nf + k, self + nf + k));
    } else {
      shifts.push(0);
      shiftVars.push(Infinity);
    }
  }
  return { ss, rows, columns: m, steps, stepVars, shifts, shiftVars, widthShift: withWidth ? -coef[wCol] * sigmaV : 0 };
}

/** The fit {@link stepSearch} moves: the samples, the neighbours and the scratch of {@link fitSteps}. */
export interface StepSearchProblem {
  x: Float64Array;
  current: Float64Array;
  lo: number;
  hi: number;
  neighboursV: readonly number[];
  neighbourSigmaV: number;
  scratch: StepsScratch;
}

/**
 * Least squares of free steps' positions and their common width (the linear parameters solved at
 * each point), by Gauss–Newton with step halving: at each iteration one fit with the shift and
 * width columns ({@link fitSteps} with `widthWeights`) gives the step, clamped to ±maxMove of each
 * parameter and to the bounds, and halved (up to `halvings` times) until the residual sum of
 * squares falls; the positions must stay `minGapV` apart (ascending). Stops when no halving helps,
 * or when the Gauss–Newton step moves every position by less than tolV and the width by less
 * than tolV/4. (A compass search to the same tolerance made about three times as many fits:
 * 148,828 against 47,020 over 300 curves of the batch benchmark analysed four times each.)
 * `start` and the bounds are [positions…, width]; returns the last point and its residual sum of
 * squares (Infinity where no fit could be made).
 */
export function stepSearch(
  problem: StepSearchProblem,
  start: readonly number[],
  lower: readonly number[],
  upper: readonly number[],
  maxMove: readonly number[],
  minGapV: number,
  tolV: number,
  iterations = 20,
  halvings = 5,
): { p: number[]; value: number } {
  const { x, current, lo, hi, neighboursV, neighbourSigmaV, scratch } = problem;
  const nf = start.length - 1;
  const plain = (q: readonly number[]) => fitSteps(x, current, lo, hi, neighboursV, neighbourSigmaV, q.slice(0, nf), q[nf], false, scratch);
  let p = start.slice();
  let at = plain(p);
  if (!at) return { p, value: Infinity };
  for (let it = 0; it < iterations; it++) {
    const lin = fitSteps(x, current, lo, hi, neighboursV, neighbourSigmaV, p.slice(0, nf), p[nf], true, scratch, at.steps);
    if (!lin) break;
    const move = [...lin.shifts, lin.widthShift].map((d, k) => (Number.isFinite(d) ? Math.max(-maxMove[k], Math.min(maxMove[k], d)) : 0));
    let accepted: { q: number[]; fit: StepsFit } | null = null;
    for (let h = 0, f = 1; h <= halvings && !accepted; h++, f /= 2) {
      const q = p.map((v, k) => Math.min(upper[k], Math.max(lower[k], v + f * move[k])));
      let ordered = true;
      for (let k = 1; k < nf; k++) if (q[k] - q[k - 1] < minGapV) ordered = false;
      if (!ordered) continue;
      const fit = plain(q);
      if (fit && fit.ss < at.ss) accepted = { q, fit };
    }
    if (!accepted) break;
    p = accepted.q;
    at = accepted.fit;
    if (move.every((d, k) => Math.abs(d) < (k < nf ? tolV : tolV / 4))) break;
  }
  return { p, value: at.ss };
}

/** One peak tested by {@link splitPeak}: its position, FWHM, SNR and its sides to half prominence. */
export interface SplitInput {
  /** Position, V. */
  biasV: number;
  /** Distances from the position to the half-prominence crossings, V (left, right); null where a valley comes first. */
  sidesV: [number | null, number | null];
  /** Prominence over the conductance noise. */
  snr: number;
}

/** Two steps found under one peak. */
export interface SplitResult {
  /** Positions, V, ascending. */
  biasV: [number, number];
  /** Position σ of each from the noise (the fit's covariance, widened by the residual RMS when larger), V. */
  uncertaintyV: [number, number];
  /** Current step of each, A. */
  stepA: [number, number];
  /** Step significance (height over its standard error) of each. */
  significance: [number, number];
  /** FWHM of the fitted steps (common), V. */
  fwhmV: number;
}

/**
 * Whether a peak is wider than expected on either side by more than `gateSigma` of its error
 * (the only peaks {@link splitPeak} fits).
 */
export function isWide(peak: SplitInput, expectedFwhmV: number, gateSigma = SPLIT_PEAKS_DEFAULTS.gateSigma): boolean {
  const se = halfWidthSE(expectedFwhmV, peak.snr);
  const limit = expectedFwhmV / 2 + gateSigma * se;
  return (peak.sidesV[0] ?? 0) > limit || (peak.sidesV[1] ?? 0) > limit;
}

/**
 * Two Gaussian-broadened steps under one peak of the conductance, when the current shows them.
 *
 * Method: over ±windowFwhm expected FWHM around the peak (widened by the longer side), with the
 * neighbouring peaks' steps fitted at their positions as in the step test, (1) one step with its
 * position and width free and (2) two steps with both positions and a common width free are
 * fitted by Gauss–Newton over the nonlinear parameters ({@link stepSearch}; linear least squares
 * for the rest); (1) first, and where it leaves less than minStepSigma² of χ² beyond the degrees
 * of freedom of (2), no second step could be kept and (2) is not searched. (2) starts twice, astride
 * (1)'s position as far apart as (1)'s width asks and on the peak's longer side, and keeps the
 * better.
 * Two steps are returned when both heights are positive, the smaller one's height over its
 * standard error reaches `minStepSigma`, the drop of χ² from (1) to (2) reaches minStepSigma²
 * (σ: the noise, or the residual RMS of (2) where larger), and the steps lie at least
 * minSeparationFwhm expected FWHM apart and farther than that from any neighbour; null otherwise.
 */
export function splitPeak(
  x: Float64Array,
  current: Float64Array,
  noiseA: number,
  peak: SplitInput,
  neighboursV: readonly number[],
  expectedFwhmV: number,
  minStepSigma: number,
): SplitResult | null {
  const D = SPLIT_PEAKS_DEFAULTS;
  const n = x.length;
  const h = (x[n - 1] - x[0]) / (n - 1);
  const w = expectedFwhmV;
  const s0 = w / GAUSSIAN_FWHM_PER_SIGMA;
  const x0 = peak.biasV;
  const left = Math.max(peak.sidesV[0] ?? 0, w / 2), right = Math.max(peak.sidesV[1] ?? 0, w / 2);
  const lo = Math.max(0, Math.round((x0 - left - (D.windowFwhm - 0.5) * w - x[0]) / h));
  const hi = Math.min(n - 1, Math.round((x0 + right + (D.windowFwhm - 0.5) * w - x[0]) / h));
  if (hi - lo < 12) return null;
  const near = neighboursV.filter((v) => v >= x[lo] - w && v <= x[hi] + w);
  // The free steps stay between the peak's neighbours, minSeparationFwhm clear of them.
  let below = x[lo], above = x[hi];
  for (const v of near) {
    if (v < x0) below = Math.max(below, v + D.minSeparationFwhm * w);
    else above = Math.min(above, v - D.minSeparationFwhm * w);
  }
  if (!(above - below > D.minSeparationFwhm * w)) return null;
  const sLo = D.widthBounds[0] * s0, sHi = D.widthBounds[1] * s0;
  const scratch: StepsScratch = { cols: [] };
  const ss = (free: number[], s: number) => fitSteps(x, current, lo, hi, near, s0, free, s, false, scratch)?.ss ?? Infinity;
  // A cheap screen first (one linear fit): a second step worth keeping lowers χ² by at least
  // minStepSigma², so one step at the peak with the expected width must leave at least that much
  // χ² beyond its degrees of freedom (the χ² the two-step fit has on average).
  const dof = hi - lo + 1 - (2 + near.length + 1);
  if (!(ss([x0], s0) / (noiseA * noiseA) - dof >= minStepSigma * minStepSigma)) return null;
  const tol = D.searchTolFwhm * w;
  // The one-step fit (position and width free) next, the same screen sharper: a wide single step
  // (a resonance, a width measured low) leaves no χ² beyond the two-step fit's average (its
  // degrees of freedom, four fewer: one more step and three free positions and width), and then
  // the three-parameter search is not made.
  const problem: StepSearchProblem = { x, current, lo, hi, neighboursV: near, neighbourSigmaV: s0, scratch };
  const one = stepSearch(problem, [x0, s0], [below, sLo], [above, sHi], [w / 2, s0 / 2], 0, tol);
  if (!(one.value / (noiseA * noiseA) - (dof - 4) >= minStepSigma * minStepSigma)) return null;
  // Two steps, from two starts (the better kept): astride the one-step fit's position, as far
  // apart as its width asks (two steps of width s₀ at ±d/2 have the variance s₀² + d²/4 of one
  // step of width s₁, so d = 2√(s₁² − s₀²), at least half a FWHM), and on the peak's longer side
  // (a shoulder) or astride its top (merged).
  const longer = right - left;
  const d = Math.max(2 * Math.sqrt(Math.max(0, one.p[1] ** 2 - s0 * s0)), w / 2);
  const sideStart = Math.abs(longer) > halfWidthSE(w, peak.snr) ? (longer > 0 ? [x0, x0 + w] : [x0 - w, x0]) : [x0 - w / 2, x0 + w / 2];
  const clamp = (v: number) => Math.min(above, Math.max(below, v));
  let two = { p: [] as number[], value: Infinity };
  for (const start of [[one.p[0] - d / 2, one.p[0] + d / 2], sideStart]) {
    const found = stepSearch(problem, [clamp(start[0]), clamp(start[1]), s0], [below, below, sLo], [above, above, sHi], [w / 2, w / 2, s0 / 2], D.minSeparationFwhm * w * 0.5, tol);
    if (found.value < two.value) two = found;
  }
  const [x1, x2, s] = two.p;
  if (!(x2 - x1 >= D.minSeparationFwhm * w) || !Number.isFinite(two.value)) return null;
  const fit = fitSteps(x, current, lo, hi, near, s0, [x1, x2], s, true, scratch);
  if (!fit) return null;
  const sigma = Math.max(noiseA, Math.sqrt(fit.ss / Math.max(1, fit.rows - fit.columns)));
  const t = fit.steps.map((c, k) => (fit.stepVars[k] > 0 ? c / (sigma * Math.sqrt(fit.stepVars[k])) : 0));
  if (!(Math.min(t[0], t[1]) >= minStepSigma)) return null;
  if (!((one.value - two.value) / (sigma * sigma) >= minStepSigma * minStepSigma)) return null;
  const se = fit.shiftVars.map((v) => (Number.isFinite(v) && v > 0 ? sigma * Math.sqrt(v) : w / 2));
  return {
    biasV: [x1, x2],
    uncertaintyV: [se[0], se[1]],
    stepA: [fit.steps[0], fit.steps[1]],
    significance: [t[0], t[1]],
    fwhmV: s * GAUSSIAN_FWHM_PER_SIGMA,
  };
}

/** A peak as {@link splitWidePeaks} reads it (findPeaks' Peak and the bases of its prominence). */
export interface WidePeakInput {
  biasV: number;
  index: number;
  heightS: number;
  prominenceS: number;
  snr: number;
  /** Sample indices of the minima bounding the peak's prominence. */
  leftBase: number;
  rightBase: number;
}

/**
 * The distances from a peak's position to its half-prominence crossings, V (left, right), by
 * linear interpolation; null on a side where the curve reaches the base first. A side is walked
 * no further than `maxV` from the position (V, default unbounded): one longer is Infinity.
 */
export function halfProminenceSides(biasV: Float64Array, g: Float64Array, peak: WidePeakInput, maxV = Infinity): [number | null, number | null] {
  return [sideLength(biasV, g, peak, -1, maxV), sideLength(biasV, g, peak, 1, maxV)];
}

/** One side of {@link halfProminenceSides} (a plain function: no closure per call). */
function sideLength(biasV: Float64Array, g: Float64Array, peak: WidePeakInput, dir: -1 | 1, maxV: number): number | null {
  const half = peak.heightS - peak.prominenceS / 2;
  const p = peak.index;
  const stop = dir < 0 ? peak.leftBase : peak.rightBase;
  let i = p;
  while (i !== stop && g[i + dir] > half) {
    i += dir;
    if (Math.abs(biasV[i] - peak.biasV) > maxV) return Infinity;
  }
  if (i === stop) return null;
  const j = i + dir;
  const at = biasV[i] + ((half - g[i]) / (g[j] - g[i])) * (biasV[j] - biasV[i]);
  return Math.abs(at - peak.biasV);
}

/**
 * Every peak wider than expected ({@link isWide}) tested for two steps ({@link splitPeak}), its
 * neighbours at the other peaks' positions: for each peak, null (kept as it is) or the two steps
 * found under it.
 */
export function splitWidePeaks(
  biasV: Float64Array,
  didvS: Float64Array,
  current: { currentA: Float64Array; noiseA: number },
  peaks: readonly WidePeakInput[],
  widths: { stepFwhmV: number; peakFwhmV: number },
  minStepSigma: number,
  minSeparationV: number,
): (SplitResult | null)[] {
  const out: (SplitResult | null)[] = new Array(peaks.length).fill(null);
  // Left to right, each peak's neighbours where the splits before it put them (two splits never
  // claim the same stretch between their peaks).
  let positions: number[][] | null = null;
  for (let k = 0; k < peaks.length; k++) {
    const p = peaks[k];
    // The gate needs each side only as far as its limit; a flagged peak's sides are then measured whole.
    const limitV = widths.peakFwhmV / 2 + SPLIT_PEAKS_DEFAULTS.gateSigma * halfWidthSE(widths.peakFwhmV, p.snr);
    if (!isWide({ biasV: p.biasV, sidesV: halfProminenceSides(biasV, didvS, p, limitV), snr: p.snr }, widths.peakFwhmV)) continue;
    const input = { biasV: p.biasV, sidesV: halfProminenceSides(biasV, didvS, p), snr: p.snr };
    positions ??= peaks.map((q) => [q.biasV]);
    const neighbours = positions.filter((_, j) => j !== k).flat();
    const r = splitPeak(biasV, current.currentA, current.noiseA, input, neighbours, widths.stepFwhmV, minStepSigma);
    if (!r || r.biasV[1] - r.biasV[0] < minSeparationV || r.biasV.some((v) => neighbours.some((q) => Math.abs(q - v) < minSeparationV))) continue;
    positions[k] = [...r.biasV];
    out[k] = r;
  }
  return out;
}

/**
 * Note 7 of findPeaks: each peak wider than expected replaced by the two steps the
 * current shows under it ({@link splitWidePeaks}), sorted by bias, with which came from a split
 * (null where none did). A split peak's position σ is the fit's, with positionFloorPerFwhm of the
 * expected FWHM in quadrature; its prominence and SNR are the peak's shared in proportion to the
 * two steps, its height the conductance at its sample.
 */
export function splitMerged(
  biasV: Float64Array,
  didvS: Float64Array,
  current: { currentA: Float64Array; noiseA: number },
  peaks: Peak[],
  kept: readonly { leftBase: number; rightBase: number }[],
  expectedFwhmV: number | undefined,
  minStepSigma: number,
  minSeparationMV: number,
  positionFloorPerFwhm: number,
): { peaks: Peak[]; fromSplit: boolean[] | null } {
  const n = biasV.length;
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const widths: number[] = [];
  for (let k = 0; k < peaks.length; k++) widths.push(peaks[k].fwhmV);
  widths.sort((a, b) => a - b);
  // The steps' width on the current; the peaks' width as the (smoothed) conductance shows it, which
  // the filter widens: the median of the peaks found (of three or more; one or two peaks are their
  // own median), never below the steps' own.
  const medianV = widths[widths.length >> 1];
  const referenceV = expectedFwhmV ?? medianV;
  const peakFwhmV = expectedFwhmV !== undefined && peaks.length < 3 ? expectedFwhmV : Math.max(referenceV, medianV);
  const input: WidePeakInput[] = [];
  for (let k = 0; k < peaks.length; k++) {
    const p = peaks[k];
    input.push({ biasV: p.biasV, index: p.index, heightS: p.heightS, prominenceS: p.prominenceS, snr: p.snr, leftBase: kept[k].leftBase, rightBase: kept[k].rightBase });
  }
  const splits = splitWidePeaks(biasV, didvS, current, input, { stepFwhmV: referenceV, peakFwhmV }, minStepSigma, minSeparationMV / 1000);
  if (splits.every((r) => r === null)) return { peaks, fromSplit: null };
  const out: { peak: Peak; split: boolean }[] = [];
  peaks.forEach((p, k) => {
    const r = splits[k];
    if (!r) {
      out.push({ peak: p, split: false });
      return;
    }
    const total = r.stepA[0] + r.stepA[1];
    for (const i of [0, 1]) {
      const index = Math.min(n - 1, Math.max(0, Math.round((r.biasV[i] - biasV[0]) / stepV)));
      const share = r.stepA[i] / total;
      out.push({
        peak: {
          biasV: r.biasV[i],
          biasUncertaintyV: Math.hypot(r.uncertaintyV[i], positionFloorPerFwhm * referenceV),
          index,
          heightS: didvS[index],
          prominenceS: p.prominenceS * share,
          fwhmV: r.fwhmV,
          stepA: r.stepA[i],
          snr: p.snr * share,
          stepSignificance: r.significance[i],
        },
        split: true,
      });
    }
  });
  out.sort((a, b) => a.peak.biasV - b.peak.biasV);
  return { peaks: out.map((o) => o.peak), fromSplit: out.map((o) => o.split) };
}
