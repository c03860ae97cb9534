/**
 * Shoulders of findPeaks: a level whose conductance peak has no maximum of its own beside a
 * stronger neighbour, found as a minimum of the conductance's curvature and confirmed by the step
 * test on the current. Internal to lib/peaks (not re-exported from the public entry).
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { STEP_TEST_WINDOW, stepSignificance, type FitWorkspace } from "./localStepFit.ts";
import type { Peak } from "./findPeaks.ts";

/** Limits of {@link shoulderSteps}, in expected FWHM (derived in its notes). */
export const SHOULDER_STEPS = Object.freeze({
  /** A shoulder lies at least this far from every peak kept (closer, the step test fits no neighbour). */
  minDistanceFwhm: 1,
  /** … and at most this far from one (beside a stronger neighbour; 2 FWHM is where a Gaussian of equal height leaves a valley of its own). */
  maxDistanceFwhm: 2.5,
  /**
   * A shoulder's Gaussian height read from the curvature is at least this fraction of the nearest
   * peak's prominence. The steps' model (Gaussian-broadened, position and width free to first
   * order) describes a real line shape (thermal or lifetime broadening) only to a small fraction
   * of a step (common practice, no source): below it a noise-free exact curve rounded to six
   * digits showed "shoulders" of 1e-4 of its strong peaks. The curvature reads a shoulder low (the
   * neighbour's convex tail adds to it: a 15 % step 1.1 FWHM beside a strong one reads 1.3 %),
   * hence a floor well below the shoulders sought.
   */
  minHeightPerNeighbour: 0.005,
});

/**
 * Steps hidden as shoulders of the peaks kept.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias in volts, uniformly spaced, ascending.
 * didvS : Float64Array
 *     The smoothed conductance, S.
 * currentA : Float64Array
 *     The unsmoothed current, A, on the same points.
 * noiseA : number
 *     White noise of the current per sample, A.
 * keptIndices : readonly number[]
 *     Sample indices of the peaks kept, ascending.
 * keptProminenceS : readonly number[]
 *     Their prominences, S.
 * halfWidth : number
 *     Half the expected FWHM, samples (≥ 1).
 * minHeightS : number
 *     The least height of a Gaussian peak the shoulder may be, S (findPeaks: its prominence
 *     threshold, minProminenceSigma × the conductance's noise).
 * peakFwhmV : number
 *     The FWHM of the peaks as the conductance shows them (the median of those found), V; the
 *     distances of note 2 are in the larger of this and the expected FWHM.
 * minStepSigma : number
 *     The step test's threshold, in standard errors of the step.
 * minPlainSigma : number
 *     The level over ±3 FWHM from which the test is repeated over the moved window.
 * minSeparationV : number
 *     Minimum separation of two peaks, V.
 * work : FitWorkspace
 *     Scratch of the local fits.
 *
 * Returns
 * -------
 * { index: number; significance: number }[]
 *     The shoulders confirmed, deepest curvature first, with their t.
 *
 * Notes
 * -----
 * 1. A Gaussian peak of height A and width s beside a stronger one has no maximum of its own once
 *    the stronger one's slope at it exceeds its own largest slope, A·e^(−1/2)/s; its curvature
 *    −A/s² at its centre still makes a local minimum of G'' there (the sum's second derivative
 *    at the shoulder is the neighbour's, smooth, plus −A/s²).
 * 2. G'' is read as the second difference G(i + k) − 2G(i) + G(i − k) at lag k = halfWidth/2
 *    (FWHM/4: the smoothed conductance is already averaged over about a FWHM, so a shorter lag adds
 *    noise and no resolution). Its local minima below 0 (concave) are candidates when they lie
 *    between SHOULDER_STEPS.minDistanceFwhm (1) and maxDistanceFwhm (2.5) FWHM from the nearest
 *    peak kept and at least minSeparationV from every one, and where the second difference is at
 *    most −2·minHeightS·(1 − e^(−(k·h)²/2s²)), its value at the centre of a Gaussian of height
 *    minHeightS (closed form; the screen of the maxima's prominence, applied to the curvature; a
 *    neighbour's convex tail only raises it), and at least SHOULDER_STEPS.minHeightPerNeighbour (0.5 %)
 *    of the nearest peak's prominence in the same measure. The FWHM there is the larger of the
 *    expected one and the peaks' median: where the expected width is measured short, a strong
 *    step wider than the fitted ones leaves residuals about one expected FWHM either side of it,
 *    which the first-order width columns of note 3 take up only in part.
 * 3. The deepest candidate in each interval between two peaks kept (and beyond the outer ones) is
 *    confirmed by the step test of findPeaks (note 3 there) with steps at the peaks kept, those
 *    within 2 FWHM with their positions and widths free to first order (as in retestShortSteps),
 *    and a u² background term over ±3 FWHM as well (a candidate found by curvature sits where a
 *    curved background, e.g. a steep exponential, bends most against the line: without the term
 *    such backgrounds gave "levels"), at the same threshold minStepSigma; one confirmed counts as
 *    a neighbour of the next. Noise minima of G'' carry no step and fail the test at the
 *    false-peak rate of the test itself.
 * 4. A shoulder's prominence (and with it its SNR) is the curvature's Gaussian height, at most the
 *    prominence of the peak beside it: it shows no maximum of its own there, so it stands out of
 *    the dI/dV no more than that peak (the "faint-peaks" rule of noLevels reads the largest SNR).
 */
export function shoulderSteps(
  biasV: Float64Array,
  didvS: Float64Array,
  currentA: Float64Array,
  noiseA: number,
  keptIndices: readonly number[],
  keptProminenceS: readonly number[],
  halfWidth: number,
  peakFwhmV: number,
  minHeightS: number,
  minStepSigma: number,
  minPlainSigma: number,
  minSeparationV: number,
  work: FitWorkspace,
): { index: number; significance: number }[] {
  const n = biasV.length;
  if (!keptIndices.length || n < 5) return [];
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const k = Math.max(1, Math.round(halfWidth / 2));
  // Distances in the peaks' own width where that is the larger (a step width measured short).
  const fwhmV = Math.max(2 * halfWidth * stepV, peakFwhmV);
  const keptV = keptIndices.map((i) => biasV[i]);
  const nearest = (v: number) => {
    let d = Infinity;
    for (const w of keptV) d = Math.min(d, Math.abs(w - v));
    return d;
  };
  const d2 = (i: number) => didvS[i + k] - 2 * didvS[i] + didvS[i - k];
  // The second difference at the centre of a Gaussian of height A: −2A·(1 − e^(−(k·h)²/2s²)).
  const s = (2 * halfWidth * stepV) / GAUSSIAN_FWHM_PER_SIGMA;
  const perHeight = 2 * (1 - Math.exp(-((k * stepV) ** 2) / (2 * s * s)));
  const maxD2 = -minHeightS * perHeight;
  const candidates: { index: number; depth: number }[] = [];
  const lo = k + 1, hi = n - k - 2;
  let prev = lo - 1 >= k ? d2(lo - 1) : Infinity;
  let here = d2(lo);
  for (let i = lo; i <= hi; i++) {
    const next = d2(i + 1);
    if (here <= maxD2 && here < 0 && here < prev && here <= next) {
      const d = nearest(biasV[i]);
      if (d >= Math.max(SHOULDER_STEPS.minDistanceFwhm * fwhmV, minSeparationV) && d <= SHOULDER_STEPS.maxDistanceFwhm * fwhmV) {
        // At least a line-shape floor of the nearest peak's height (note 2).
        let j = 0;
        for (let q = 1; q < keptV.length; q++) if (Math.abs(keptV[q] - biasV[i]) < Math.abs(keptV[j] - biasV[i])) j = q;
        if (-here >= SHOULDER_STEPS.minHeightPerNeighbour * keptProminenceS[j] * perHeight) candidates.push({ index: i, depth: here });
      }
    }
    prev = here;
    here = next;
  }
  if (!candidates.length) return [];
  // The deepest in each interval between two peaks kept (and beyond the outer ones): one test each.
  const deepest = new Map<number, { index: number; depth: number }>();
  let gap = 0;
  for (const c of candidates) {
    while (gap < keptV.length && keptV[gap] < biasV[c.index]) gap++;
    const had = deepest.get(gap);
    if (!had || c.depth < had.depth) deepest.set(gap, c);
  }
  candidates.length = 0;
  candidates.push(...deepest.values());
  candidates.sort((a, b) => a.depth - b.depth);
  const accepted: { index: number; significance: number }[] = [];
  for (const c of candidates) {
    const x0 = biasV[c.index];
    if (nearest(x0) < Math.max(SHOULDER_STEPS.minDistanceFwhm * fwhmV, minSeparationV)) continue;
    const t = stepSignificance(biasV, currentA, c.index, keptV, halfWidth, noiseA, minStepSigma, minPlainSigma, work, STEP_TEST_WINDOW.freeNeighbourFwhm * 2 * halfWidth * stepV, true);
    if (!(t >= minStepSigma)) continue;
    accepted.push({ index: c.index, significance: t });
    let at = 0;
    while (at < keptV.length && keptV[at] < x0) at++;
    keptV.splice(at, 0, x0);
  }
  return accepted;
}

/**
 * The peaks with the shoulders of {@link shoulderSteps} added (findPeaks note 9), sorted by bias,
 * and the indices of those added.
 *
 * Parameters: the curve (biasV, V; didvS, S; current, A), the peaks (refined), half the expected
 * FWHM (samples), the conductance's noise (S), the least height (S), the step test's thresholds,
 * the minimum separation (V), the position floor (V) and the fits' scratch.
 */
export function addShoulders(
  biasV: Float64Array,
  didvS: Float64Array,
  current: { currentA: Float64Array; noiseA: number },
  peaks: Peak[],
  halfWidth: number,
  noiseS: number,
  minHeightS: number,
  minStepSigma: number,
  minPlainSigma: number,
  minSeparationV: number,
  floorV: number,
  work: FitWorkspace,
): { peaks: Peak[]; added: number[] } {
  const n = biasV.length;
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const at = (v: number) => Math.min(n - 1, Math.max(0, Math.round((v - biasV[0]) / stepV)));
  const widths = peaks.map((p) => p.fwhmV).sort((a, b) => a - b);
  const peakFwhmV = peaks.length >= 3 ? widths[widths.length >> 1] : 0;
  const found = shoulderSteps(biasV, didvS, current.currentA, current.noiseA, peaks.map((p) => at(p.biasV)), peaks.map((p) => p.prominenceS), halfWidth, peakFwhmV, minHeightS, minStepSigma, minPlainSigma, minSeparationV, work);
  if (!found.length) return { peaks, added: [] };
  const all = peaks.map((peak) => ({ peak, added: false }));
  for (const f of found) {
    // No higher than the peak whose flank it sits on (it shows no maximum of its own beside it):
    // the curvature's estimate is capped at that peak's prominence.
    let nearest = peaks[0];
    for (const p of peaks) if (Math.abs(p.biasV - biasV[f.index]) < Math.abs(nearest.biasV - biasV[f.index])) nearest = p;
    all.push({ peak: shoulderPeak(biasV, didvS, stepV, f.index, f.significance, halfWidth, noiseS, floorV, nearest.prominenceS), added: true });
  }
  all.sort((a, b) => a.peak.biasV - b.peak.biasV);
  const added: number[] = [];
  all.forEach((o, k) => o.added && added.push(k));
  return { peaks: all.map((o) => o.peak), added };
}

/**
 * A shoulder as a peak: at its sample, the expected width, the height of a Gaussian from the
 * second difference at lag k = halfWidth/2 (closed form: D₂ = −2A·(1 − e^(−(k·h)²/2s²)) at the
 * centre of A·e^(−u²/2s²)), at most maxProminenceS (S, default no cap: addShoulders passes the
 * prominence of the peak the shoulder sits beside), the step A·s·√(2π); the position σ the
 * sampling's h/√12 with the floor (V) in quadrature, until the refinement on the current replaces
 * it.
 */
export function shoulderPeak(biasV: Float64Array, g: Float64Array, stepV: number, index: number, significance: number, halfWidth: number, noiseS: number, floorV: number, maxProminenceS = Infinity): Peak {
  const k = Math.max(1, Math.round(halfWidth / 2));
  const fwhmV = 2 * halfWidth * stepV;
  const s = fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
  const d2 = g[index + k] - 2 * g[index] + g[index - k];
  const prominence = Math.min(maxProminenceS, Math.max(0, -d2 / (2 * (1 - Math.exp(-((k * stepV) ** 2) / (2 * s * s))))));
  return {
    biasV: biasV[index],
    biasUncertaintyV: Math.hypot(stepV / Math.sqrt(12), floorV),
    index,
    heightS: g[index],
    prominenceS: prominence,
    fwhmV,
    stepA: prominence * s * Math.sqrt(2 * Math.PI),
    snr: prominence / noiseS,
    stepSignificance: significance,
  };
}
