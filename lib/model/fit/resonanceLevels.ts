/**
 * CB peaks the rules set aside as second-junction resonances that may also be a level's charging
 * peak: at low η a VB peak's substrate-junction resonance can fall within a peak width of a CB
 * charging peak, and the two merge into one peak that the rules read as the resonance alone.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import type { fitHypotheses } from "./fitHypotheses.ts";

/** Constants of {@link resonanceLevels} (locked by test/model/fit/resonanceLevels.test.ts). */
export const RESONANCE_LEVEL_DEFAULTS = Object.freeze({
  /**
   * Only resonances among this many CB peaks nearest the gap (labelled ones included) are read
   * again as charging peaks: the hypotheses this adds grow with every one (chosen on the low-η
   * accuracy benchmark with the comparison: the merged peaks it found were the first or second).
   */
  lowestPeaks: 2,
  /**
   * A labelled resonance is read again only within this fraction of its FWHM of its predicted
   * position (a merged peak lies between the two; chosen on the low-η accuracy benchmark with
   * the comparison).
   */
  toleranceFwhm: 1,
});

/**
 * The biases of CB peaks labelled second-junction resonances that a charging ladder may read as
 * levels' charging peaks as well.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis: peaks (bias in V, FWHM in V) and the second-junction resonances the
 *     rules labelled (evidence.secondJunction, each with its predicted position in V).
 * eta : number
 *     Voltage-division factor η, 0 < η < 1 (none at η ≥ 1: no resonance falls on the CB side).
 *
 * Returns
 * -------
 * number[]
 *     Ascending: the biases of the labelled resonances at positive bias among the
 *     RESONANCE_LEVEL_DEFAULTS.lowestPeaks CB peaks nearest the gap, each within
 *     RESONANCE_LEVEL_DEFAULTS.toleranceFwhm × its FWHM of its predicted position.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Two features closer than their width make one peak at a position between them. A level's
 *    charging peak within a FWHM of a VB peak's substrate-junction resonance η·|V_v|/(1 − η) is
 *    then seen once, at the resonance's place, and labelled the resonance: the ladder loses a
 *    charging peak (s read with one peak, or its second peak taken from p).
 * 2. The model carries both contributions (the VB level's step through the substrate junction
 *    and the CB level's), so reading the peak as a charging peak too and fitting decides by BIC
 *    ({@link fitHypotheses} note 8). Only the peaks nearest the gap are read again: the shell's
 *    first peaks fix Ec₀ and the ladder's alignment, and each one read again adds a set of ladders.
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6: VB peak at −1.26 V (resonance predicted at 1.89 V), CB peaks at 1.89 (labelled the
 * // resonance), 2.10 and 2.65 V, FWHM 60 mV.
 * resonanceLevels(analysis, 0.6); // => [1.89]
 * ```
 */
export function resonanceLevels(analysis: CurveAnalysis, eta: number): number[] {
  const D = RESONANCE_LEVEL_DEFAULTS;
  if (!(eta > 0 && eta < 1)) return [];
  const lowest = analysis.peaks.map((p, i) => ({ p, i })).filter(({ p }) => p.biasV > 0).sort((a, b) => a.p.biasV - b.p.biasV).slice(0, D.lowestPeaks);
  const out: number[] = [];
  for (const r of analysis.assignment.evidence.secondJunction) {
    const hit = lowest.find(({ i }) => i === r.index);
    if (hit && Math.abs(hit.p.biasV - r.predictedV) <= D.toleranceFwhm * hit.p.fwhmV) out.push(hit.p.biasV);
  }
  return out.sort((a, b) => a - b);
}
