/**
 * Collapsed pairs: two peaks that the position refinement on the current brings closer than the
 * selection's minimum separation (findPeaks' note 11). Internal to lib/peaks (not re-exported
 * from the public entry).
 */
import { splitPeak } from "./splitPeaks.ts";
import type { Peak } from "./findPeaks.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";

/** Defaults of {@link collapsedPairs} (locked by test/peaks/collapsedPairs.test.ts). */
export const COLLAPSED_PAIRS_DEFAULTS = Object.freeze({
  /**
   * Two neighbouring peaks count as a collapsed pair where the refinement leaves them closer than
   * this fraction of minSeparationMV (1: the selection's own bar, which both passed before it).
   * Chosen on the accuracy benchmark (low η, rules alone; 0.5 was measured too).
   */
  separationFraction: 1,
});

/**
 * Two neighbouring peaks closer than `minSeparationMV` after the refinement on the current,
 * resolved on the current: replaced by the two steps {@link splitPeak} finds under them (its
 * tests, as for a merged peak), or else by one peak.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias, V, uniformly spaced, ascending.
 * current : { currentA, noiseA }
 *     The raw current on the same grid, A, and its white noise per sample, A.
 * peaks : readonly Peak[]
 *     The peaks after the refinement, ascending in bias.
 * expectedFwhmV : number | undefined
 *     The expected FWHM of a level's step, V; without it nothing is done.
 * minStepSigma, minSeparationMV, positionFloorPerFwhm : number
 *     findPeaks' step-test threshold, its minimum separation (mV) and its position floor.
 *
 * Returns
 * -------
 * { peaks, merged } | null
 *     The new list (ascending) and the indices in it of the peaks that stand for a pair (to be
 *     refined again by the caller); null where no pair is closer than separationFraction ×
 *     minSeparationMV.
 *
 * Notes
 * -----
 * 1. The selection keeps no two maxima within minSeparationMV; the refinement (one Gauss–Newton
 *    step of each peak's local step fit, its neighbours held) may move two peaks towards each
 *    other up to halfway, and where both fits ask for more they meet in the middle.
 * 2. Such a pair is one of two things. Two maxima of the smoothed conductance closer than 2σ of
 *    the line (0.85 FWHM) cannot be two levels of one width (a sum of two Gaussians of a common σ
 *    has a single maximum for any weights when they lie within 2σ): noise on one peak's top, one
 *    step. Or two levels farther apart whose linearised shifts, each fitted with the other held
 *    at a wrong place, overshot.
 * 3. The current decides: around the pair's step-weighted middle the one-step and two-step fits
 *    of {@link splitPeak} are made, the other peaks' steps held; two steps replace the pair where
 *    they pass its tests (both positive, the weaker at minStepSigma, the χ² drop at
 *    minStepSigma², at least half an expected FWHM apart) and lie minSeparationMV from each other
 *    and every other peak. Otherwise, where the two maxima of the conductance (the peaks'
 *    `index`) lie within 2σ of the expected width, one peak stands for both: the more prominent
 *    one, at the step-weighted mean of the two positions, with the summed step; maxima farther
 *    apart may be two levels, or a level and a resonance beside it, and the pair is kept as the
 *    refinement left it.
 * 4. The one peak keeps a maximum of the conductance (`index`, `heightS`): the one nearer 0 V,
 *    where the pair's flank facing the gap begins. A band's width is read on that flank, walking
 *    from the edge peak's maximum towards 0 V to half its height (`gapSideFwhm` in
 *    lib/pipeline/bandAreas.ts); the dip between the two maxima (noise on one line's top) can lie
 *    below half the height, and a walk started in it, or at the maximum beyond it, ends there and
 *    reads a width of a few mV.
 *
 * Example
 * -------
 * ```ts
 * // One level's step at 0.5 V found as two maxima at 0.488 and 0.512 V (steps 4e-12, 6e-12 A):
 * collapsedPairs(biasV, current, peaks, 0.0706, 5, 40, 0.02)!.peaks.map((p) => p.biasV);
 * // => [0.2, 0.5024, 0.8] (the middle one with the summed step, 1e-11 A)
 * ```
 */
export function collapsedPairs(
  biasV: Float64Array,
  current: { currentA: Float64Array; noiseA: number },
  peaks: readonly Peak[],
  expectedFwhmV: number | undefined,
  minStepSigma: number,
  minSeparationMV: number,
  positionFloorPerFwhm: number,
): { peaks: Peak[]; merged: number[] } | null {
  const minSepV = minSeparationMV / 1000;
  const collapsedV = COLLAPSED_PAIRS_DEFAULTS.separationFraction * minSepV;
  if (expectedFwhmV === undefined || !(minSepV > 0)) return null;
  // Two maxima of one Gaussian line of σ = FWHM/2√(2 ln 2) lie within 2σ of each other (note 2).
  const oneLineV = (2 * expectedFwhmV) / GAUSSIAN_FWHM_PER_SIGMA;
  const n = biasV.length;
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const out: { peak: Peak; merged: boolean }[] = [];
  let changed = false;
  for (let k = 0; k < peaks.length; k++) {
    const a = peaks[k], b = peaks[k + 1];
    if (!b || !(b.biasV - a.biasV < collapsedV)) {
      out.push({ peak: a, merged: false });
      continue;
    }
    changed = true;
    k++;
    const neighbours = peaks.filter((_, j) => j !== k && j !== k - 1).map((p) => p.biasV);
    const wa = Math.max(0, a.stepA), wb = Math.max(0, b.stepA);
    const mid = wa + wb > 0 ? (wa * a.biasV + wb * b.biasV) / (wa + wb) : (a.biasV + b.biasV) / 2;
    const snr = Math.max(a.snr, b.snr);
    const two = splitPeak(biasV, current.currentA, current.noiseA, { biasV: mid, sidesV: [null, null], snr }, neighbours, expectedFwhmV, minStepSigma);
    const clear = (v: number) => neighbours.every((q) => Math.abs(q - v) >= minSepV);
    if (two && two.biasV[1] - two.biasV[0] >= minSepV && two.biasV.every(clear)) {
      const total = two.stepA[0] + two.stepA[1];
      for (const i of [0, 1]) {
        const share = two.stepA[i] / total;
        const index = Math.min(n - 1, Math.max(0, Math.round((two.biasV[i] - biasV[0]) / stepV)));
        const from = i === 0 ? a : b;
        out.push({
          peak: { ...from, biasV: two.biasV[i], biasUncertaintyV: Math.hypot(two.uncertaintyV[i], positionFloorPerFwhm * expectedFwhmV), index, fwhmV: two.fwhmV, stepA: two.stepA[i], snr: snr * share, prominenceS: Math.max(a.prominenceS, b.prominenceS) * share, stepSignificance: two.significance[i] },
          merged: false,
        });
      }
      continue;
    }
    // Maxima farther apart than 2σ can be two levels: kept as they are (note 3).
    if (Math.abs(biasV[b.index] - biasV[a.index]) > oneLineV) {
      out.push({ peak: a, merged: false }, { peak: b, merged: false });
      continue;
    }
    const kept = a.prominenceS >= b.prominenceS ? a : b;
    // The conductance maximum it keeps is the one nearer 0 V (note 4).
    const inner = Math.abs(biasV[a.index]) <= Math.abs(biasV[b.index]) ? a : b;
    out.push({ peak: { ...kept, biasV: mid, index: inner.index, heightS: inner.heightS, stepA: wa + wb }, merged: true });
  }
  if (!changed) return null;
  return { peaks: out.map((o) => o.peak), merged: out.flatMap((o, k) => (o.merged ? [k] : [])) };
}
