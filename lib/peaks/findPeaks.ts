/**
 * Peaks of a tunnelling-conductance curve: where a new dot level starts to carry current.
 */
import { DotspecError } from "../util/errors.ts";
import { checkNonNegative, checkPositive } from "../util/check.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { scaledSymmetricInverse } from "../util/smallSymmetric.ts";
import { localStepFit, stepSignificance, type FitWorkspace } from "./localStepFit.ts";
import { splitMerged } from "./splitPeaks.ts";
import { retestShortSteps, type ShortStep } from "./retestShortSteps.ts";
import { addShoulders } from "./shoulderSteps.ts";

/** One peak of dI/dV. */
export interface Peak {
  /** Refined position (vertex of a least-squares parabola through the top of the peak), V. */
  biasV: number;
  /** One-standard-deviation uncertainty of biasV from the noise, V (see {@link findPeaks} notes). */
  biasUncertaintyV: number;
  /** Sample index of the highest point. */
  index: number;
  /** dI/dV at the refined position, S. */
  heightS: number;
  /** Height above the higher of the two surrounding minima (topographic prominence), S. */
  prominenceS: number;
  /** Full width at half prominence, V; from the top curvature when a neighbour hides a half-height crossing. */
  fwhmV: number;
  /** Current step carried by the peak ≈ prominence × FWHM × 1.0645 (Gaussian area), A. */
  stepA: number;
  /** Signal-to-noise ratio: prominence over the noise of the conductance curve. */
  snr: number;
  /**
   * Significance of the current step under the peak: the step height of a local least-squares
   * fit (line + Gaussian-broadened step) to the current over its standard error; null when no
   * current was given.
   */
  stepSignificance: number | null;
}

/** Options of {@link findPeaks}. */
export interface FindPeaksOptions {
  /** Standard deviation of the noise of the (smoothed) conductance curve, S (> 0). Required. */
  noiseS: number;
  /**
   * Minimum prominence in units of noiseS. Default: FIND_PEAKS_DEFAULTS.minProminenceSigma (3)
   * with `current` (the step test then rejects noise), FIND_PEAKS_DEFAULTS.minProminenceSigmaAlone (8) without.
   */
  minProminenceSigma?: number;
  /**
   * The (unsmoothed) current the conductance came from, in A, on the same bias points, and its
   * white noise per sample, A. Enables the step-significance test, which rejects noise peaks far
   * better than prominence alone. Default: none (prominence alone).
   */
  current?: { currentA: Float64Array; noiseA: number };
  /**
   * Expected FWHM of the peaks, V: sets the width of the fitted steps and the fit window of the
   * step test. Default: each peak's own width at half prominence.
   */
  expectedFwhmV?: number;
  /**
   * Refine positions by fitting the step model to the current (with `current`).
   * Default: FIND_PEAKS_DEFAULTS.refineOnCurrent (true); false keeps the parabola through the top
   * of the conductance peak (use it when the conductance is a measured signal of its own, e.g. a
   * lock-in).
   */
  refineOnCurrent?: boolean;
  /**
   * Minimum step significance (with `current`), in standard errors of the step.
   * Default: FIND_PEAKS_DEFAULTS.minStepSigma (5) (≈ 0 false peaks per 2,000 samples of white
   * noise; 4 gives ≈ 0.02).
   */
  minStepSigma?: number;
  /** Peaks closer than this keep only the more prominent one, mV. Default: FIND_PEAKS_DEFAULTS.minSeparationMV (20). */
  minSeparationMV?: number;
  /**
   * White noise of the measured signal before smoothing, for the position uncertainty: a
   * current noise (when dI/dV was computed from I) or a conductance noise (a measured dI/dV),
   * per sample (A or S). Default: none; the uncertainty then comes from the parabola fit alone.
   */
  rawNoise?: { quantity: "current"; sigmaA: number } | { quantity: "conductance"; sigmaS: number };
  /**
   * Samples on each side used for the parabola at most. Default: FIND_PEAKS_DEFAULTS.fitLevel
   * (0.7): as many as lie above that fraction of the prominence, at least 2.
   */
  maxFitHalfWidthSamples?: number;
}

/** The settings findPeaks used and what it saw. */
export interface FindPeaksRecord {
  /** Noise of the conductance curve used, S. */
  noiseS: number;
  /** Prominence threshold used, in units of noiseS. */
  minProminenceSigma: number;
  /** Minimum peak separation used, mV. */
  minSeparationMV: number;
  /** Local maxima examined. */
  candidates: number;
  /** Rejected for low prominence. */
  belowProminence: number;
  /** Rejected for a current step within the noise. */
  belowStepSignificance: number;
  /** Rejected as too close to a more prominent peak. */
  tooClose: number;
  /** Step-significance threshold used; null without the current (no step test). */
  minStepSigma: number | null;
  /** What the user should know. */
  warnings: string[];
}

/** Defaults and constants of {@link findPeaks} (locked by test/peaks/findPeaks.test.ts). */
export const FIND_PEAKS_DEFAULTS = Object.freeze({
  /** With the step test, prominence only screens candidates. */
  minProminenceSigma: 3,
  /** Without the step test, prominence alone must keep noise out (≈ 0.05 false peaks per 2,000 samples of smoothed white noise). */
  minProminenceSigmaAlone: 8,
  minStepSigma: 5,
  /** Refine positions on the current when it is given. */
  refineOnCurrent: true,
  /**
   * Pre-screen of the step test: the mean current over one half-width beyond ±1.5 FWHM must rise by
   * this many σ; also the t a step must reach over ±3 FWHM to be tested again over the moved window
   * (note 3).
   */
  preScreenSigma: 2,
  /** Gauss–Newton iterations of the position refinement on the current. */
  refineIterations: 1,
  /**
   * Floor of the position uncertainty as a fraction of the FWHM, added in quadrature: the
   * effect of overlap and line-shape mismatch that the local fit's covariance does not see.
   * Chosen so that about 95 % of errors lie within 2σ on the accuracy benchmark's spectra.
   */
  positionFloorPerFwhm: 0.02,
  /**
   * The same floor for positions from the parabola through a conductance peak (a measured dI/dV,
   * not refined on the current), chosen the same way on the benchmark's simulated lock-in
   * spectra (`npm run bench:accuracy -- --path measured`).
   */
  positionFloorPerFwhmParabola: 0.008,
  minSeparationMV: 20,
  /** The parabola uses the points above this fraction of the prominence. */
  fitLevel: 0.7,
});

/**
 * Finds and refines the peaks of a conductance curve.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias in volts, uniformly spaced, ascending.
 * didvS : Float64Array
 *     Conductance in siemens at each bias (smoothed).
 * options : FindPeaksOptions
 *     noiseS (S, required); minProminenceSigma (default 3 with `current`, 8 without);
 *     current ({currentA (A), noiseA (A)}, default none); expectedFwhmV (V, default each peak's
 *     own width); refineOnCurrent (default true); minStepSigma (default 5); minSeparationMV (mV,
 *     default 20); rawNoise (default none); maxFitHalfWidthSamples (samples, default from the
 *     70 % level). Defaults in {@link FIND_PEAKS_DEFAULTS}.
 *
 * Returns
 * -------
 * { peaks: Peak[]; record: FindPeaksRecord }
 *     The peaks sorted by bias (position ± 1σ in V, height and prominence in S, FWHM in V, current
 *     step in A, SNR, step significance), and a record of the thresholds used and of how many
 *     candidates each test rejected.
 *
 * Throws
 * ------
 * DotspecError
 *     `peaks/length-mismatch` (biasV, didvS or current.currentA of different lengths),
 *     `peaks/too-few-points` (fewer than 3 points); `options/not-positive` (noiseS,
 *     expectedFwhmV), `options/negative` (minProminenceSigma, minStepSigma, minSeparationMV),
 *     `options/not-finite` for a non-number.
 *
 * Notes
 * -----
 * 1. Local maxima of `didvS` (the middle of a flat top).
 * 2. Prominence of each: from the peak, walk left and right until a higher point or the end;
 *    the prominence is the height above the higher of the two minima found on the way.
 * 3. Keep peaks with prominence ≥ minProminenceSigma·noiseS. With the current, also require a
 *    significant current step: fit I(x) = a + b·(x − x₀) + Σ_j c_j·Φ((x − x_j)/s) by linear
 *    least squares to the unsmoothed current within ±3·FWHM of the peak, with a step at this
 *    and every neighbouring candidate (s = FWHM/2.3548), and keep the peak if c/SE(c) ≥
 *    minStepSigma, SE from the current's white noise (after a cheap pre-screen: the mean current
 *    over one half-width at the far ends of ±3 half-widths must rise by
 *    FIND_PEAKS_DEFAULTS.preScreenSigma (2) σ). The line absorbs a smooth background
 *    conductance; the neighbours' steps are fitted rather than mistaken for background. Where
 *    c/SE(c) falls short of minStepSigma but reaches preScreenSigma, the fit is repeated with each
 *    edge of the window moved to 2 FWHM beyond any neighbour whose step it cuts (at most 6 FWHM
 *    out; `stepTestWindow` in lib/peaks/localStepFit.ts) and a u² term added to the background:
 *    a step cut by the edge has no plateau beyond it and is nearly collinear with the line, which
 *    in a charging ladder (steps 1–2 FWHM apart) inflates SE(c). A candidate with another within
 *    one FWHM keeps the plain window.
 *    Prominence of the derivative alone is a poor test: peak-to-valley swings of smoothed white
 *    noise exceed 5σ about 7 times per 2,000 samples. Then, strongest first, drop any peak
 *    within minSeparationMV of one already kept.
 * 4. Refine: least-squares parabola through the top points (above 70 % of the prominence,
 *    FIND_PEAKS_DEFAULTS.fitLevel, at least 2 either side): position = vertex, height = vertex
 *    value. With the current (and refineOnCurrent), the position is then moved by one
 *    Gauss–Newton step of the local step fit of note 3 with a shift term
 *    (FIND_PEAKS_DEFAULTS.refineIterations), by at most half a width and never past halfway to
 *    a neighbour.
 * 5. Width: full width at half prominence by linear interpolation; if a valley comes first on
 *    one side, the width is taken from the curvature at the top, FWHM = 2√(2 ln 2)·√(P/|G''|),
 *    exact for a Gaussian of prominence P.
 * 6. Position uncertainty (with the current: from the covariance of the local fit, widened by
 *    the residual RMS when that exceeds the noise, plus 2 % of the FWHM in quadrature,
 *    FIND_PEAKS_DEFAULTS.positionFloorPerFwhm).
 *    Without the current: for white current noise σ_I per sample of step h under a
 *    Gaussian-broadened current step of height ΔI and standard deviation s, the least-squares
 *    position has variance σ_x² = 2√π·h·s·σ_I²/ΔI² (Cramér–Rao bound from the Fisher
 *    information of the step position); for white conductance noise σ_G per sample under a
 *    Gaussian peak of height A, σ_x² = 2h·s·σ_G²/(√π·A²). Without `rawNoise`, the standard
 *    error of the parabola's vertex (noiseS taken as white) is reported instead. Either way a
 *    floor of FIND_PEAKS_DEFAULTS.positionFloorPerFwhmParabola (0.8 %) of the FWHM is added in
 *    quadrature (positionFloorPerFwhm when refined on the current).
 * 7. Merged peaks and shoulders (with the current and refineOnCurrent; `lib/peaks/splitPeaks.ts`):
 *    a peak one of whose sides (position to half-prominence crossing) is longer than half the
 *    peaks' FWHM by more than 2 of its standard errors (0.72·FWHM/SNR; the peaks' FWHM is the median
 *    of those found, at least expectedFwhmV) may hold two steps: a level and a resonance merged, or
 *    a weaker level with no maximum of its own beside a stronger one. Where one step at the peak
 *    with the expected width leaves at least minStepSigma² of χ² beyond its degrees of freedom,
 *    one step (position and width free) and two steps (positions and a common width free, the
 *    width 0.8–2.5 times the expected) are fitted to the current as in note 3, the neighbours'
 *    steps fitted at their positions; two peaks replace the one when both steps are positive, the
 *    weaker reaches minStepSigma, χ² drops by at least minStepSigma², and the steps lie at least
 *    half an expected FWHM apart (closer, two steps differ from one wider step by their fourth
 *    moment alone) and minSeparationMV from every other peak. Their positions are that fit's (not
 *    refined again), σ from its covariance with the floor of note 6.
 * 8. Candidates short of the step test, tested again (with the current and refineOnCurrent;
 *    `lib/peaks/retestShortSteps.ts`): the test of note 3 fits a step at every prominent maximum
 *    near a candidate, most of them noise, and each such column 1–3 FWHM away is nearly collinear
 *    with the candidate's step and inflates its standard error. After the selection, each rejected
 *    candidate (most prominent first) that had a neighbour not kept within the test's reach, and
 *    lies at least one FWHM and minSeparationMV from every peak kept, is tested again with steps at
 *    the kept peaks and at the rejected candidates more prominent than it (not at the weaker
 *    maxima, mostly noise), those within 2 FWHM with their position and width free to first order
 *    (φ and z·φ columns: a strong neighbour's position or width error would otherwise leave a
 *    residual the candidate's step takes up), at the same threshold; a candidate that passes is
 *    kept and counts as a neighbour of the next.
 * 9. Shoulders (with the current and refineOnCurrent and expectedFwhmV; `lib/peaks/shoulderSteps.ts`):
 *    a level with no maximum of its own beside a stronger neighbour still makes a minimum of the
 *    conductance's curvature. The second difference at lag FWHM/4 is searched for minima 1–2.5
 *    FWHM from the nearest peak (the larger of expectedFwhmV and the peaks' median FWHM) and below
 *    what a Gaussian of height minProminenceSigma·noiseS gives; the deepest in each interval
 *    between peaks is tested as in note 8 (with a u² background term as well) against the peaks
 *    refined on the current (note 4) and kept at t ≥ minStepSigma, then refined itself. Its height
 *    and step are those of a Gaussian with that curvature at the expected width, its prominence at
 *    most that of the peak beside it.
 * 10. Near an end of the curve, which cuts the ±3 FWHM window of notes 3, 8 and 9, the fit is also
 *    made over the end's last STEP_TEST_WINDOW.endWindowFwhm (6) FWHM and the larger t stands
 *    (a candidate with another within one FWHM excepted): cut, a real step's t falls to 2–4
 *    (`endWindow` in lib/peaks/localStepFit.ts).
 *
 * References
 * ----------
 * P. Virtanen et al., "SciPy 1.0: fundamental algorithms for scientific computing in Python",
 * Nat. Methods 17, 261 (2020) (prominence as in scipy.signal.peak_prominences);
 * S. M. Kay, Fundamentals of Statistical Signal Processing: Estimation Theory (Prentice Hall,
 * 1993), ch. 3 (Cramér–Rao bound).
 *
 * Example
 * -------
 * ```ts
 * const biasV = Float64Array.from({ length: 1001 }, (_, i) => i * 0.001);
 * const gauss = (v: number, at: number) => Math.exp(-0.5 * ((v - at) / 0.01) ** 2);
 * const didvS = biasV.map((v) => 2e-9 * gauss(v, 0.3) + 1e-9 * gauss(v, 0.6));
 * const { peaks } = findPeaks(biasV, didvS, { noiseS: 1e-12 });
 * peaks.map((p) => p.biasV); // => [0.3, 0.6] (V)
 * peaks.map((p) => p.fwhmV); // => [0.0236, 0.0236] (V; 2√(2 ln 2) × 10 mV = 23.5 mV)
 * peaks.map((p) => p.stepA); // => [5.01e-11, 2.51e-11] (A)
 * ```
 */
export function findPeaks(biasV: Float64Array, didvS: Float64Array, options: FindPeaksOptions): { peaks: Peak[]; record: FindPeaksRecord } {
  if (biasV.length !== didvS.length) {
    throw new DotspecError("peaks/length-mismatch", `biasV and didvS must have the same length; got ${biasV.length} and ${didvS.length}`);
  }
  const n = biasV.length;
  if (n < 3) throw new DotspecError("peaks/too-few-points", `findPeaks needs at least 3 points; got ${n}`);
  const noiseS = checkPositive("noiseS", options.noiseS);
  const current = options.current;
  if (current && current.currentA.length !== n) {
    throw new DotspecError("peaks/length-mismatch", `current.currentA must have one value per bias point (${n}); got ${current.currentA.length}`);
  }
  const minProminenceSigma = checkNonNegative(
    "minProminenceSigma",
    options.minProminenceSigma ?? (current ? FIND_PEAKS_DEFAULTS.minProminenceSigma : FIND_PEAKS_DEFAULTS.minProminenceSigmaAlone),
  );
  const minStepSigma = current ? checkNonNegative("minStepSigma", options.minStepSigma ?? FIND_PEAKS_DEFAULTS.minStepSigma) : null;
  const minSeparationMV = checkNonNegative("minSeparationMV", options.minSeparationMV ?? FIND_PEAKS_DEFAULTS.minSeparationMV);
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const warnings: string[] = [];

  // 1. Local maxima (middle of flat tops).
  const maxima: number[] = [];
  for (let i = 1; i < n - 1; i++) {
    if (didvS[i] > didvS[i - 1]) {
      let j = i;
      while (j < n - 1 && didvS[j + 1] === didvS[i]) j++;
      if (j < n - 1 && didvS[j + 1] < didvS[i]) maxima.push((i + j) >> 1);
      i = j;
    }
  }
  // 2–3. Prominence and selection.
  const threshold = minProminenceSigma * noiseS;
  let belowProminence = 0;
  let belowStepSignificance = 0;
  type Candidate = { index: number; prominence: number; floor: number; leftBase: number; rightBase: number; significance: number | null };
  const prominent: Candidate[] = [];
  for (const p of maxima) {
    const top = didvS[p];
    // Both sides are walked in step until one ends (at a higher point or the curve's end). When
    // the lowest point of the side that ended lies within the threshold of the top, the
    // prominence (top minus the higher of the two minima) falls short whatever the other side
    // holds, and the maximum is dropped there: most maxima are noise on a sloping conductance,
    // one side a few samples long and the other reaching across the curve. Each side is walked
    // in the same order as alone, so minima and bases are the same.
    let leftMin = top, leftBase = p, rightMin = top, rightBase = p;
    let l = p - 1, r = p + 1;
    let leftOpen = l >= 0 && didvS[l] <= top, rightOpen = r < n && didvS[r] <= top;
    while (leftOpen && rightOpen) {
      if (didvS[l] < leftMin) (leftMin = didvS[l]), (leftBase = l);
      if (didvS[r] < rightMin) (rightMin = didvS[r]), (rightBase = r);
      leftOpen = --l >= 0 && didvS[l] <= top;
      rightOpen = ++r < n && didvS[r] <= top;
    }
    const endedMin = leftOpen ? rightMin : leftMin;
    if (!(top - endedMin >= threshold && top - endedMin > 0)) {
      belowProminence++;
      continue;
    }
    for (; l >= 0 && didvS[l] <= top; l--) if (didvS[l] < leftMin) (leftMin = didvS[l]), (leftBase = l);
    for (; r < n && didvS[r] <= top; r++) if (didvS[r] < rightMin) (rightMin = didvS[r]), (rightBase = r);
    const floor = Math.max(leftMin, rightMin);
    const prominence = top - floor;
    if (prominence >= threshold && prominence > 0) prominent.push({ index: p, prominence, floor, leftBase, rightBase, significance: null });
    else belowProminence++;
  }
  const candidates: Candidate[] = [];
  const expectedHalfWidth = options.expectedFwhmV !== undefined ? checkPositive("expectedFwhmV", options.expectedFwhmV) / (2 * stepV) : null;
  // At most the curve's length: an expected width far beyond the bias range (a bias axis in the
  // wrong unit) must not make the loops below run over billions of samples.
  const halfWidths = prominent.map((c) =>
    Math.min(n, Math.max(1, Math.round(expectedHalfWidth ?? halfWidthSamples(didvS, c.index, c.floor + c.prominence / 2, c.leftBase, c.rightBase)))),
  );
  const indices = prominent.map((q) => q.index);
  const work: FitWorkspace = { cols: new Float64Array(0) };
  const shortOfStep: ShortStep[] = [];
  prominent.forEach((c, k) => {
    if (current) {
      // Cheap necessary condition first: the mean current must rise across the peak by more than
      // its noise (a falling or flat current cannot hold a step); only then the local fit.
      const hw = halfWidths[k];
      const lo = Math.max(0, c.index - 3 * hw), hi = Math.min(n - 1, c.index + 3 * hw);
      const m = Math.max(1, hw);
      let before = 0, after = 0;
      for (let i = 0; i < m; i++) {
        before += current.currentA[Math.min(n - 1, lo + i)];
        after += current.currentA[Math.max(0, hi - i)];
      }
      const rise = (after - before) / m / (current.noiseA * Math.sqrt(2 / m));
      if (!(rise >= FIND_PEAKS_DEFAULTS.preScreenSigma)) {
        belowStepSignificance++;
        return;
      }
      const neighbours = indices.filter((_, j) => j !== k).map((j) => biasV[j]);
      c.significance = stepSignificance(biasV, current.currentA, c.index, neighbours, halfWidths[k], current.noiseA, minStepSigma!, FIND_PEAKS_DEFAULTS.preScreenSigma, work);
      if (!(c.significance >= minStepSigma!)) {
        belowStepSignificance++;
        shortOfStep.push({ index: c.index, prominence: c.prominence, halfWidth: hw });
        return;
      }
    }
    candidates.push(c);
  });
  candidates.sort((a, b) => b.prominence - a.prominence);
  const kept: typeof candidates = [];
  let tooClose = 0;
  for (const c of candidates) {
    if (kept.some((k) => Math.abs(biasV[k.index] - biasV[c.index]) * 1000 < minSeparationMV)) tooClose++;
    else kept.push(c);
  }
  kept.sort((a, b) => a.index - b.index);
  // 3b. Candidates short of the step test tested again against the peaks kept (noise maxima no
  // longer fitted as neighbours); only where positions are refined on the current (note 8).
  const onCurrent = current !== undefined && (options.refineOnCurrent ?? FIND_PEAKS_DEFAULTS.refineOnCurrent);
  if (current && onCurrent && shortOfStep.length && kept.length) {
    const again = retestShortSteps(biasV, current.currentA, current.noiseA, shortOfStep, indices, kept.map((c) => c.index), minStepSigma!, FIND_PEAKS_DEFAULTS.preScreenSigma, minSeparationMV / 1000, work);
    for (const a of again) {
      const c = prominent.find((q) => q.index === a.index)!;
      c.significance = a.significance;
      kept.push(c);
      belowStepSignificance--;
    }
    if (again.length) kept.sort((a, b) => a.index - b.index);
  }

  // 4–6. Refinement.
  let peaks = kept.map((c) => refine(biasV, didvS, stepV, c, noiseS, options));
  // 7. Peaks wider than expected: two steps under one peak (positions from their own fit).
  let fromSplit: boolean[] | null = null;
  if (current && onCurrent && peaks.length) {
    const split = splitMerged(biasV, didvS, current, peaks, kept, options.expectedFwhmV, minStepSigma!, minSeparationMV, FIND_PEAKS_DEFAULTS.positionFloorPerFwhm);
    peaks = split.peaks;
    fromSplit = split.fromSplit;
  }
  if (current && onCurrent) {
    const halfWidthOf = (k: number) => Math.max(1, Math.round(expectedHalfWidth ?? peaks[k].fwhmV / (2 * stepV)));
    const refineSome = (which: number[]) => {
      for (let iteration = 0; iteration < FIND_PEAKS_DEFAULTS.refineIterations && which.length; iteration++) {
        const step = refineOnCurrent(biasV, current, peaks, which, halfWidthOf, work);
        peaks = step.peaks;
        which = which.filter((k) => !step.settled.includes(k));
      }
    };
    refineSome(peaks.map((_, k) => k).filter((k) => !fromSplit || !fromSplit[k]));
    // 9. Shoulders: minima of the curvature beside the refined peaks, confirmed by the step test,
    // then refined themselves.
    if (expectedHalfWidth !== null && peaks.length) {
      const floorV = FIND_PEAKS_DEFAULTS.positionFloorPerFwhm * options.expectedFwhmV!;
      const more = addShoulders(biasV, didvS, current, peaks, Math.max(1, Math.round(expectedHalfWidth)), noiseS, threshold, minStepSigma!, FIND_PEAKS_DEFAULTS.preScreenSigma, minSeparationMV / 1000, floorV, work);
      peaks = more.peaks;
      refineSome(more.added);
    }
  }
  return {
    peaks,
    record: { noiseS, minProminenceSigma, minStepSigma, minSeparationMV, candidates: maxima.length, belowProminence, belowStepSignificance, tooClose, warnings },
  };
}

/**
 * One refinement step of peak positions on the current: for each peak in `which`, one
 * Gauss–Newton step of the local step fit with a shift term, its neighbours at the positions the
 * peaks have on entry (so a peak's new position does not depend on which others are refined).
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias in volts, uniformly spaced, ascending.
 * current : { currentA: Float64Array; noiseA: number }
 *     The unsmoothed current (A) and its white-noise σ (A).
 * peaks : readonly Peak[]
 *     The peaks, sorted by bias; not modified.
 * which : readonly number[]
 *     Indices of the peaks to refine.
 * halfWidthOf : (k: number) => number
 *     Half the expected FWHM of peak k, in samples (≥ 1).
 * work : FitWorkspace
 *     Scratch of the local fits.
 *
 * Returns
 * -------
 * { peaks: Peak[]; settled: number[] }
 *     The peaks with those refined replaced by new objects (position moved by at most half a
 *     width and never past halfway to a neighbour; position σ from the fit's covariance, widened
 *     by the residual RMS when that exceeds the noise, with FIND_PEAKS_DEFAULTS.positionFloorPerFwhm
 *     of the FWHM in quadrature), and the indices that moved by less than 1 % of a half width.
 *     A peak whose fit fails (no positive step, no finite shift variance) keeps its position.
 */
export function refineOnCurrent(
  biasV: Float64Array,
  current: { currentA: Float64Array; noiseA: number },
  peaks: readonly Peak[],
  which: readonly number[],
  halfWidthOf: (k: number) => number,
  work: FitWorkspace,
): { peaks: Peak[]; settled: number[] } {
  const n = biasV.length;
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const positions = peaks.map((p) => p.biasV);
  const out = peaks.slice();
  const settled: number[] = [];
  for (const k of which) {
    const peak = peaks[k];
    const neighbours = positions.filter((_, j) => j !== k);
    const index = Math.min(n - 1, Math.max(0, Math.round((peak.biasV - biasV[0]) / stepV)));
    const fit = localStepFit(biasV, current.currentA, index, peak.biasV, neighbours, halfWidthOf(k), true, work);
    if (!fit || !(fit.step > 0) || !Number.isFinite(fit.shiftVar) || !(fit.shiftVar > 0)) continue;
    // At most half a width per step, and never past halfway to a neighbour.
    let lo = -halfWidthOf(k) * stepV, hi = halfWidthOf(k) * stepV;
    if (k > 0) lo = Math.max(lo, (positions[k - 1] - positions[k]) / 2);
    if (k < peaks.length - 1) hi = Math.min(hi, (positions[k + 1] - positions[k]) / 2);
    const shift = Math.max(lo, Math.min(hi, fit.shift));
    if (Math.abs(shift) < 0.01 * halfWidthOf(k) * stepV) settled.push(k);
    // Noise from the current's white noise, widened when the local model leaves larger
    // residuals, plus a floor for what the model leaves out (overlap, line shape).
    const sigma = Math.max(current.noiseA, fit.rms);
    out[k] = {
      ...peak,
      biasV: peak.biasV + shift,
      biasUncertaintyV: Math.hypot(sigma * Math.sqrt(fit.shiftVar), FIND_PEAKS_DEFAULTS.positionFloorPerFwhm * 2 * halfWidthOf(k) * stepV),
    };
  }
  return { peaks: out, settled };
}

function refine(
  biasV: Float64Array,
  g: Float64Array,
  stepV: number,
  c: { index: number; prominence: number; leftBase: number; rightBase: number; significance: number | null },
  noiseS: number,
  options: FindPeaksOptions,
): Peak {
  const n = g.length;
  const p = c.index;
  const top = g[p];
  const floor = top - c.prominence;
  const level = floor + FIND_PEAKS_DEFAULTS.fitLevel * c.prominence;
  const cap = options.maxFitHalfWidthSamples ?? Infinity;
  let l = p, r = p;
  while (l > 0 && p - l < cap && g[l - 1] >= level && l - 1 >= c.leftBase) l--;
  while (r < n - 1 && r - p < cap && g[r + 1] >= level && r + 1 <= c.rightBase) r++;
  // At least two points each side when the data allow.
  l = Math.max(0, Math.min(l, p - 2));
  r = Math.min(n - 1, Math.max(r, p + 2));
  const fit = parabola(biasV, g, l, r, biasV[p]);
  let position = biasV[p];
  let height = top;
  let curvature = NaN; // second derivative G'' at the vertex, S/V²
  let vertexSE = stepV / Math.sqrt(12); // no usable parabola: the sampling resolution
  if (fit && fit.a < 0) {
    const x0 = -fit.b / (2 * fit.a);
    if (Math.abs(x0) <= (r - l) * stepV) {
      position = biasV[p] + x0;
      height = fit.c - (fit.b * fit.b) / (4 * fit.a);
      curvature = 2 * fit.a;
      // Standard error of the vertex −b/2a from the fit covariance with the curve's noise.
      const dA = fit.b / (2 * fit.a * fit.a), dB = -1 / (2 * fit.a);
      const v = noiseS * noiseS * (dA * dA * fit.cov[0] + 2 * dA * dB * fit.cov[1] + dB * dB * fit.cov[3]);
      if (v > 0) vertexSE = Math.sqrt(v);
    }
  }
  const prominence = Math.max(height - floor, c.prominence);
  // Width at half prominence.
  const half = floor + prominence / 2;
  const crossing = (dir: -1 | 1): number | null => {
    let i = p;
    const stop = dir < 0 ? c.leftBase : c.rightBase;
    while (i !== stop && g[i + dir] > half) i += dir;
    if (i === stop) return null;
    const j = i + dir;
    return biasV[i] + ((half - g[i]) / (g[j] - g[i])) * (biasV[j] - biasV[i]);
  };
  const left = crossing(-1), right = crossing(1);
  let fwhmV: number;
  if (left !== null && right !== null) fwhmV = right - left;
  else if (Number.isFinite(curvature)) fwhmV = GAUSSIAN_FWHM_PER_SIGMA * Math.sqrt(prominence / -curvature);
  else if (left !== null) fwhmV = 2 * (position - left);
  else if (right !== null) fwhmV = 2 * (right - position);
  else fwhmV = (c.rightBase - c.leftBase) * stepV;
  const sigmaX = fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
  const stepA = prominence * sigmaX * Math.sqrt(2 * Math.PI);
  let bound = 0;
  const raw = options.rawNoise;
  if (raw && raw.quantity === "current" && stepA > 0) bound = Math.sqrt((2 * Math.sqrt(Math.PI) * stepV * sigmaX * raw.sigmaA ** 2) / (stepA * stepA));
  else if (raw && raw.quantity === "conductance" && prominence > 0) bound = Math.sqrt((2 * stepV * sigmaX * raw.sigmaS ** 2) / (Math.sqrt(Math.PI) * prominence ** 2));
  // The same floor as the refinement on the current (overlap and line shape the bound does not see).
  const onCurrent = options.current !== undefined && (options.refineOnCurrent ?? FIND_PEAKS_DEFAULTS.refineOnCurrent);
  const floorPerFwhm = onCurrent ? FIND_PEAKS_DEFAULTS.positionFloorPerFwhm : FIND_PEAKS_DEFAULTS.positionFloorPerFwhmParabola;
  const floorV = floorPerFwhm * (options.expectedFwhmV ?? fwhmV);
  return {
    biasV: position,
    biasUncertaintyV: Math.hypot(bound > 0 ? bound : vertexSE, floorV),
    index: p,
    heightS: height,
    prominenceS: prominence,
    fwhmV,
    stepA,
    snr: prominence / noiseS,
    stepSignificance: c.significance,
  };
}

/** Samples from the peak to where the curve first drops below `level` (the nearer side), bounded by the bases. */
function halfWidthSamples(g: Float64Array, p: number, level: number, leftBase: number, rightBase: number): number {
  let l = p, r = p;
  while (l > leftBase && g[l] > level) l--;
  while (r < rightBase && g[r] > level) r++;
  return Math.max(1, Math.min(p - l, r - p));
}

/** Least-squares parabola a·x² + b·x + c in x = biasV − x0 over [l, r], with (XᵀX)⁻¹ (row-major 3×3). */
function parabola(x: Float64Array, y: Float64Array, l: number, r: number, x0: number): { a: number; b: number; c: number; cov: number[] } | null {
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let i = l; i <= r; i++) {
    const u = x[i] - x0, u2 = u * u;
    s0 += 1, s1 += u, s2 += u2, s3 += u2 * u, s4 += u2 * u2;
    t0 += y[i], t1 += y[i] * u, t2 += y[i] * u2;
  }
  if (s0 < 3) return null;
  // Solve [[s4 s3 s2][s3 s2 s1][s2 s1 s0]] [a b c]ᵀ = [t2 t1 t0]ᵀ.
  const inv = scaledSymmetricInverse([s4, s3, s2, s3, s2, s1, s2, s1, s0], 3);
  if (!inv) return null;
  const a = inv[0] * t2 + inv[1] * t1 + inv[2] * t0;
  const b = inv[3] * t2 + inv[4] * t1 + inv[5] * t0;
  const c = inv[6] * t2 + inv[7] * t1 + inv[8] * t0;
  // Covariance of (a, b) in units of the noise variance: [[Vaa, Vab], [Vba, Vbb]].
  return { a, b, c, cov: [inv[0], inv[1], inv[3], inv[4]] };
}
