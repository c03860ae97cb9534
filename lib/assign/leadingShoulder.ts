/**
 * A weak shoulder split off the first CB level's peak by the peak search: in shell tunnelling the
 * first CB peak is read as the s level, so a fragment before it would take s's place.
 */
import type { BandPeak } from "./bandPeaks.ts";

/** Limits of {@link leadingShoulder} (locked by test/assign/leadingShoulder.test.ts). */
export const LEADING_SHOULDER_DEFAULTS = Object.freeze({
  /**
   * The first CB peak lies at most this many of the smaller FWHM of the two from the second
   * (note 1 of {@link leadingShoulder}). Chosen on the accuracy benchmark (low η), below the
   * spacing (≈ 1.08 FWHM) from which two thermally broadened peaks at these heights show two maxima.
   */
  spacingFwhmMax: 1,
  /**
   * … and steps less than this fraction of the second's (the charging satellites' bound,
   * `ASSIGN_DEFAULTS.satelliteStepRatioMax`). Chosen on the accuracy benchmark (low η).
   */
  stepRatioMax: 0.5,
});

/**
 * The first CB peak of a shell-tunnelling reading when it is a shoulder of the second, not a level.
 *
 * Parameters
 * ----------
 * cb : readonly BandPeak[]
 *     The CB peaks the ladder would use, from the gap edge outward (`x` = |bias| and the peak's
 *     `fwhmV` in V, current step `stepA` in A).
 *
 * Returns
 * -------
 * BandPeak | null
 *     The first peak, to be set aside; null with fewer than two peaks or where it does not qualify.
 *
 * Notes
 * -----
 * 1. A level's conductance peak is the derivative of a broadened current step (sech² for a
 *    thermally broadened Fermi step). The sum of two such peaks of one width whose smaller is at
 *    most half the larger shows two maxima only when they are more than about 1.08 FWHM apart
 *    (1.12 for Gaussians). Two maxima found closer than one FWHM (the smaller of the two peaks'),
 *    the first stepping less than `LEADING_SHOULDER_DEFAULTS.stepRatioMax` × the second, are
 *    therefore not two levels of that width: the search split one peak (a level with a resonance
 *    or a noise wiggle on its flank), and its weak part is no level.
 * 2. Only the first CB peak is tested: the shell-tunnelling reading takes it for s and the next
 *    for p, so a fragment there moves every level by one. A weak peak after a main one is already
 *    set aside as a charging satellite (`splitSatellites`).
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, fwhmV: number, index: number): BandPeak =>
 *   ({ x, index, peak: { biasV: x, stepA, fwhmV } as Peak });
 * // 0.03 pA at 2.345 V beside 0.13 pA at 2.383 V (FWHM 67 and 100 mV): a shoulder.
 * leadingShoulder([at(2.345, 0.03e-12, 0.067, 3), at(2.383, 0.13e-12, 0.1, 4), at(2.953, 0.37e-12, 0.069, 5)])?.index;  // => 3
 * ```
 */
export function leadingShoulder(cb: readonly BandPeak[]): BandPeak | null {
  if (cb.length < 2) return null;
  const [first, second] = cb;
  const D = LEADING_SHOULDER_DEFAULTS;
  const close = second.x - first.x <= D.spacingFwhmMax * Math.min(first.peak.fwhmV, second.peak.fwhmV);
  return close && first.peak.stepA < D.stepRatioMax * second.peak.stepA ? first : null;
}
