/**
 * A step looked for where a level is predicted but no peak was kept: the step test of findPeaks
 * at every sample within a reach of the prediction, against the peaks kept, with no prominence
 * required. Internal to lib/peaks (not re-exported from the public entry).
 */
import { localStepFit, stepSignificance, STEP_TEST_WINDOW, type FitWorkspace } from "./localStepFit.ts";
import { FIND_PEAKS_DEFAULTS } from "./findPeaks.ts";

/** A step found near a prediction. */
export interface PredictedStep {
  /** Position: the sample where the step test is strongest, V. */
  biasV: number;
  /** Its sample index. */
  index: number;
  /** Position σ from the fit with the step's shift linearised, V (Infinity where the fit gives none). */
  uncertaintyV: number;
  /** Current step of the step test's fit at that position (over ±3 FWHM), A. */
  stepA: number;
  /** Step height over its standard error (the step test's t). */
  significance: number;
}

/**
 * The strongest current step within a reach of a predicted position, where it passes the step
 * test.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias, V (uniform, ascending).
 * currentA : Float64Array
 *     Raw current, A, on the same points.
 * noiseA : number
 *     White noise of the current per sample, A (> 0).
 * predictedV : number
 *     The predicted position, V.
 * reachV : number
 *     The step may lie this far from the prediction, V.
 * neighboursV : readonly number[]
 *     Positions of the steps around it (the peaks kept, and any other steps predicted), V.
 * expectedFwhmV : number
 *     The expected FWHM of a step, V (> 0).
 * minStepSigma : number
 *     The step test's threshold, in standard errors of the step.
 *
 * Returns
 * -------
 * PredictedStep | null
 *     The step at the position with the largest t of the step test, if that t reaches
 *     minStepSigma and the step rises; null otherwise (also where no position is allowed).
 *
 * Notes
 * -----
 * 1. Allowed positions: the samples within reachV of the prediction, at least one expected FWHM
 *    inside the bias range and at least one expected FWHM from every neighbour (closer, the step
 *    test fits no step for the neighbour and the candidate would take that step's share).
 * 2. At each, the step test of findPeaks' second pass ({@link stepSignificance}: a line and
 *    Gaussian-broadened steps at the neighbours over ±3 FWHM, the window moved out of a
 *    neighbour's step that it cuts, the neighbours within `STEP_TEST_WINDOW.freeNeighbourFwhm`
 *    FWHM with position and width free to first order), with σ the current's white noise.
 * 3. The largest t over the allowed positions is kept when it reaches minStepSigma. The window
 *    and the neighbours fitted move with the position, so t peaks near, not at, the step (within
 *    a tenth of a FWHM where the current is noiseless; one Gauss–Newton step from there, tried,
 *    lost more spectra of the accuracy benchmark than it gained). A maximum
 *    over k positions of a test with Gaussian null has a tail at most k times the single test's
 *    (union bound), and k is a few dozen here: at 5σ (single-sided tail 2.9e-7) still below 1e-5.
 */
export function predictedStep(
  biasV: Float64Array,
  currentA: Float64Array,
  noiseA: number,
  predictedV: number,
  reachV: number,
  neighboursV: readonly number[],
  expectedFwhmV: number,
  minStepSigma: number,
): PredictedStep | null {
  const n = biasV.length;
  if (n < 16 || !(expectedFwhmV > 0) || !(noiseA > 0) || !(reachV >= 0)) return null;
  const h = (biasV[n - 1] - biasV[0]) / (n - 1);
  const w = expectedFwhmV;
  const halfWidth = Math.max(1, Math.round(w / (2 * h)));
  const neighbours = neighboursV.slice().sort((a, b) => a - b);
  const from = Math.max(Math.ceil((predictedV - reachV - biasV[0]) / h), Math.ceil(w / h));
  const to = Math.min(Math.floor((predictedV + reachV - biasV[0]) / h), n - 1 - Math.ceil(w / h));
  const work: FitWorkspace = { cols: new Float64Array(0) };
  const freeV = STEP_TEST_WINDOW.freeNeighbourFwhm * w;
  let best = -1, bestT = -Infinity;
  for (let i = from; i <= to; i++) {
    const x = biasV[i];
    if (neighbours.some((v) => Math.abs(v - x) < w)) continue;
    const t = stepSignificance(biasV, currentA, i, neighbours, halfWidth, noiseA, minStepSigma, FIND_PEAKS_DEFAULTS.preScreenSigma, work, freeV);
    if (t > bestT) {
      bestT = t;
      best = i;
    }
  }
  if (best < 0 || !(bestT >= minStepSigma)) return null;
  // The step there, and its position σ from the fit with the step's shift linearised.
  const plain = localStepFit(biasV, currentA, best, biasV[best], neighbours, halfWidth, false, work, undefined, freeV);
  const shifted = localStepFit(biasV, currentA, best, biasV[best], neighbours, halfWidth, true, work, undefined, freeV, true);
  if (!plain || !(plain.step > 0)) return null;
  const sigma = shifted ? Math.max(noiseA, shifted.rms) : noiseA;
  const uncertaintyV = shifted && Number.isFinite(shifted.shiftVar) && shifted.shiftVar > 0 ? sigma * Math.sqrt(shifted.shiftVar) : Infinity;
  return { biasV: biasV[best], index: best, uncertaintyV, stepA: plain.step, significance: bestT };
}
