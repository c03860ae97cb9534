/**
 * The second step test of findPeaks: candidates whose current step fell short of the test while
 * every prominent maximum around them stood in as a neighbour step are tested again against the
 * peaks kept. Internal to lib/peaks (not re-exported from the public entry).
 */
import { STEP_TEST_WINDOW, stepSignificance, type FitWorkspace } from "./localStepFit.ts";

/** A candidate the first step test rejected: its sample index, prominence (S) and half the expected FWHM (samples). */
export interface ShortStep {
  index: number;
  prominence: number;
  halfWidth: number;
}

/**
 * Tests again, against the peaks kept, the candidates whose current step fell short of the step
 * test.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias in volts, uniformly spaced, ascending.
 * currentA : Float64Array
 *     The unsmoothed current, A, on the same points.
 * noiseA : number
 *     White noise of the current per sample, A.
 * rejected : readonly ShortStep[]
 *     The candidates that passed the pre-screen but not the step test.
 * candidateIndices : readonly number[]
 *     Sample indices of every candidate of the first test (the neighbours it fitted).
 * keptIndices : readonly number[]
 *     Sample indices of the peaks kept (passed the test and the minimum separation), ascending.
 * minStepSigma : number
 *     The step test's threshold, in standard errors of the step.
 * minPlainSigma : number
 *     The level over ±3 FWHM from which the test is repeated over the moved window (see
 *     {@link stepSignificance}).
 * minSeparationV : number
 *     Minimum separation of two peaks, V.
 * work : FitWorkspace
 *     Scratch of the local fits.
 *
 * Returns
 * -------
 * { index: number; significance: number }[]
 *     The candidates that now pass, with their t, strongest (most prominent) first.
 *
 * Notes
 * -----
 * 1. The first test fits a step at every prominent maximum near the candidate (prominence ≥ 3σ of
 *    the conductance's noise): most of those are noise. A noise maximum 1–3 FWHM away adds a
 *    column nearly collinear with the candidate's own step over the window, and the candidate's
 *    standard error grows with that collinearity (the variance of a coefficient is σ² over the
 *    residual sum of squares of its column regressed on the others): a real step inside a dense
 *    ladder falls short although the current holds it.
 * 2. So each rejected candidate, most prominent first, is tested again with steps at the peaks
 *    kept and at the rejected candidates more prominent than it (accepted before it in this pass or
 *    not): the weaker maxima, mostly noise, are dropped from its model, while a stronger step the
 *    first test happened to reject still stands in it (left out, the candidate's step would take
 *    it up). Same windows, same threshold (minStepSigma); the neighbours within 2 FWHM have their
 *    positions and widths free to first order (φ and z·φ columns): a strong neighbour's position
 *    or width error would otherwise leave a residual of that shape which the candidate takes up.
 * 3. Not tested again: a candidate within one expected FWHM or minSeparationV of a kept peak (it
 *    sits on that peak's step: the step test fits no neighbour within one FWHM, and the
 *    candidate's column would take that step's share), and one whose first test had no neighbour
 *    that is not kept within the test's furthest reach (6 FWHM window and 1 FWHM beyond it): its
 *    second test would be the first one again.
 * 4. A noise maximum still meets the same threshold on the same white-noise error; the false-peak
 *    rate of the test on white noise stays that of the first test (≈ 0 per 2,000 samples at 5σ).
 */
export function retestShortSteps(
  biasV: Float64Array,
  currentA: Float64Array,
  noiseA: number,
  rejected: readonly ShortStep[],
  candidateIndices: readonly number[],
  keptIndices: readonly number[],
  minStepSigma: number,
  minPlainSigma: number,
  minSeparationV: number,
  work: FitWorkspace,
): { index: number; significance: number }[] {
  const n = biasV.length;
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const kept = new Set(keptIndices);
  const keptV = keptIndices.map((i) => biasV[i]);
  const reachFwhm = STEP_TEST_WINDOW.maxHalfWidthFwhm + STEP_TEST_WINDOW.straddleFwhm;
  const accepted: { index: number; significance: number }[] = [];
  const order = rejected.slice().sort((a, b) => b.prominence - a.prominence);
  // Rejected again, but more prominent than those after them: still fitted as their neighbours.
  const stronger: number[] = [];
  for (const c of order) {
    const x0 = biasV[c.index];
    const fwhmV = 2 * c.halfWidth * stepV;
    const near = Math.max(fwhmV, minSeparationV);
    const reach = reachFwhm * fwhmV;
    if (keptV.some((v) => Math.abs(v - x0) < near) || !candidateIndices.some((i) => i !== c.index && !kept.has(i) && Math.abs(biasV[i] - x0) <= reach)) {
      stronger.push(x0);
      continue;
    }
    const neighbours = stronger.length ? [...keptV, ...stronger].sort((a, b) => a - b) : keptV;
    const t = stepSignificance(biasV, currentA, c.index, neighbours, c.halfWidth, noiseA, minStepSigma, minPlainSigma, work, STEP_TEST_WINDOW.freeNeighbourFwhm * fwhmV);
    if (!(t >= minStepSigma)) {
      stronger.push(x0);
      continue;
    }
    accepted.push({ index: c.index, significance: t });
    let at = 0;
    while (at < keptV.length && keptV[at] < x0) at++;
    keptV.splice(at, 0, x0);
  }
  return accepted;
}
