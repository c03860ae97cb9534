/**
 * CB peaks that the VB peaks predict as their own second-junction resonances: at low η a hole's
 * addition through the tip junction at V_v < 0 opens through the substrate junction at
 * η·|V_v|/(1 − η) > 0, among the CB peaks, where a charging ladder may take it for a level.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import type { heldValenceLevels } from "./heldValenceLevels.ts";
import type { fitHypotheses } from "./fitHypotheses.ts";

/** Constants of {@link resonanceSuspects} (locked by test/model/fit/resonanceSuspects.test.ts). */
export const RESONANCE_SUSPECT_DEFAULTS = Object.freeze({
  /**
   * A CB peak within this fraction of its FWHM of a VB peak's substrate-junction mirror is taken
   * as that resonance (chosen on the low-η accuracy benchmark with the comparison: the mirrors
   * of the unlabelled resonances fell within 0.3 FWHM of their peaks).
   */
  toleranceFwhm: 0.5,
});

/**
 * The CB peaks (bias, V) that lie where a VB peak's substrate-junction resonance falls.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis: peaks (bias in V, FWHM in V) and the second-junction resonances the
 *     rules labelled (evidence.secondJunction).
 * eta : number
 *     Voltage-division factor η, 0 < η < 1 (none at η ≥ 1).
 *
 * Returns
 * -------
 * Set<number>
 *     The biases of the CB peaks (positive bias, not labelled) within
 *     RESONANCE_SUSPECT_DEFAULTS.toleranceFwhm × their FWHM of η·|V_v|/(1 − η) for some VB peak V_v
 *     the rules did not label a resonance; the CB side's first peak is never one (nothing can
 *     open before the gap's first level).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A fraction η of the bias drops across the tip junction and 1 − η across the substrate
 *    junction. A hole added through the tip at V_v < 0 costs E = η·|V_v|; at positive bias the
 *    same addition opens through the substrate junction when (1 − η)·V = E, at η·|V_v|/(1 − η)
 *    (as {@link heldValenceLevels} for the first hole; here every VB peak).
 * 2. Only a suspicion: a level may lie there too, so the hypotheses that set these peaks aside
 *    compete with those that keep them ({@link fitHypotheses} note 7).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6, VB peak at −1.5 V (mirror 2.25 V), CB peaks at 1.8, 2.25 and 2.6 V, FWHM 40 mV.
 * resonanceSuspects(analysis, 0.6); // => Set { 2.25 }
 * ```
 */
export function resonanceSuspects(analysis: CurveAnalysis, eta: number): Set<number> {
  const out = new Set<number>();
  if (!(eta > 0 && eta < 1)) return out;
  const labelled = new Set(analysis.assignment.evidence.secondJunction.map((r) => r.index));
  const mirrorsV = analysis.peaks.filter((p, i) => p.biasV < 0 && !labelled.has(i)).map((p) => (eta * -p.biasV) / (1 - eta));
  const cb = analysis.peaks.map((p, i) => ({ p, i })).filter(({ p, i }) => p.biasV > 0 && !labelled.has(i)).sort((a, b) => a.p.biasV - b.p.biasV);
  for (const { p } of cb.slice(1)) {
    const tol = RESONANCE_SUSPECT_DEFAULTS.toleranceFwhm * p.fwhmV;
    if (mirrorsV.some((m) => Math.abs(m - p.biasV) <= tol)) out.add(p.biasV);
  }
  return out;
}
