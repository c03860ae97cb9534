/**
 * The substrate-side resonance of the s doublet's second charging peak, and the peaks that step
 * too much to be it alone.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { REGIME_LIMITS, secondToFirstStepRatio } from "../model/regimeLimits.ts";
import { isPlainPrediction, type SecondJunctionResonance } from "./secondJunction.ts";

/**
 * The s doublet's second charging peak's plain resonances (−η·V/(1 − η)) that hold a level.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peak list of the assignment (positions `biasV` in V, steps `stepA` in A).
 * resonances : readonly SecondJunctionResonance[]
 *     The peaks set aside as second-junction resonances.
 * sIndices : readonly number[]
 *     The s doublet's peaks (indices in `peaks`), from the gap edge; anything but two gives none.
 * gain : number
 *     η/(1 − η), > 0.
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     Those of `resonances` that should go back to the ladder as levels.
 *
 * Notes
 * -----
 * 1. Through the substrate junction the roles of the junctions swap: carriers enter at Γs and
 *    leave at Γt, so the doublet's second charging step there is r'/(1 + r') of its first with
 *    r' = Γs/Γt = 1/r (`secondToFirstStepRatio(1/r)` = 1/(1 + r); master equation of one doubly
 *    degenerate level): 3 % at r = 28, 17 % at r = 5, and at most 0.4 in shell filling
 *    (r ≥ `REGIME_LIMITS.fillingRateRatioMin` = 1.5).
 * 2. A peak set aside as the second peak's plain resonance that steps more than 0.4 × the first
 *    peak's resonance holds more than that resonance: a level (in the VB, where these fall). It
 *    goes back to the ladder. No first resonance set aside, no reading. The s doublet's own step
 *    ratio r/(1 + r) would give 1/(1 + r) itself, but near 1 deep in shell filling it scatters
 *    by more than 1/(1 + r), and a resonance split among two peaks puts a share of its step on
 *    each: only the bound holds.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids* (Elsevier, 1991);
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // s at 1.5 and 1.65 V stepping alike (q = 1: deep shell filling), η = 0.6 (gain 1.5): the
 * // second's resonance at −2.475 V steps 0.5 × the first's (at −2.25 V): a level.
 * const peak = (biasV: number, stepA: number) => ({ biasV, stepA }) as Peak;
 * const peaks = [peak(-2.475, 5e-12), peak(-2.25, 1e-11), peak(1.5, 5e-12), peak(1.65, 5e-12)];
 * const res = (index: number, sourceIndex: number) => ({ index, sourceIndex, predictedV: -1.5 * peaks[sourceIndex].biasV });
 * levelsAtDoubletResonance(peaks, [res(1, 2), res(0, 3)], [2, 3], 1.5).map((r) => r.index);  // => [0]
 * ```
 */
export function levelsAtDoubletResonance(peaks: readonly Pick<Peak, "biasV" | "stepA">[], resonances: readonly SecondJunctionResonance[], sIndices: readonly number[], gain: number): SecondJunctionResonance[] {
  if (sIndices.length !== 2 || !(gain > 0)) return [];
  const [s1, s2] = sIndices;
  const first = resonances.find((r) => r.sourceIndex === s1 && isPlainPrediction(r, peaks[s1].biasV, gain));
  if (!first || !(peaks[first.index].stepA > 0) || !(peaks[s1].stepA > 0)) return [];
  // At most 1/(1 + r) of the first's in shell filling, r ≥ REGIME_LIMITS.fillingRateRatioMin (note 1).
  const bound = secondToFirstStepRatio(1 / REGIME_LIMITS.fillingRateRatioMin) * peaks[first.index].stepA;
  return resonances.filter((r) => r.sourceIndex === s2 && isPlainPrediction(r, peaks[s2].biasV, gain) && peaks[r.index].stepA > bound);
}

