/**
 * Resonances through the second (dot–substrate) junction: at low η a level that the tip junction
 * shows at bias V also lines up with the substrate's Fermi level at the opposite bias
 * −η·V/(1 − η). Those peaks are real but are not new levels; this stage finds them so that the
 * assignment leaves them out of the ladders.
 */
import type { Peak } from "../peaks/findPeaks.ts";

/** Tolerances of {@link secondJunctionResonances} (locked by test/assign/secondJunction.test.ts). */
export const SECOND_JUNCTION_DEFAULTS = Object.freeze({
  /** A peak within this many combined σ of a predicted resonance is taken as that resonance … */
  toleranceSigma: 3,
  /** … or within this fraction of its own FWHM, whichever is larger (η is rarely known better than a few %). */
  toleranceFwhmFraction: 0.5,
});

/** One peak taken as a second-junction resonance. */
export interface SecondJunctionResonance {
  /** Index of the resonance in the peak list. */
  index: number;
  /** Index of the tip-junction peak (opposite bias, nearer 0 V) that predicts it. */
  sourceIndex: number;
  /** The predicted position −η·V_source/(1 − η), V. */
  predictedV: number;
}

/**
 * Peaks that are second-junction resonances of other peaks.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peaks of one curve (positions `biasV` and 1σ `biasUncertaintyV` in V, `fwhmV` in V).
 * eta : number
 *     Voltage-division factor η in (0, 1): the fraction of the bias across the tip junction.
 *     With η = 1 no bias reaches the substrate junction and the result is empty.
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     The resonances found, ordered by |bias|.
 *
 * Notes
 * -----
 * 1. A carrier level at energy E above the Fermi level (E = η·e·V₁ for a peak at V₁ through the
 *    tip junction, the addition energy including its charging term) crosses the substrate's Fermi
 *    level when (1 − η)·e·|V| = E, at the opposite bias V₂ = −η·V₁/(1 − η): a CB level gives a
 *    step at negative bias, a VB level at positive bias (orthodox theory of the double-barrier
 *    junction with a capacitive divider).
 * 2. |V₂| ≥ |V₁| for η ≥ 1/2, so the peaks are walked from 0 V outward: each peak is first
 *    compared with the resonances predicted by the tip-junction peaks already accepted on the
 *    other side; within max(3·σ, FWHM/2) of one (σ the combined uncertainty, the source's scaled
 *    by η/(1 − η)) it is that resonance, otherwise it is a tip-junction peak and predicts its own.
 * 3. Resonances predict no further resonances. Charging peaks that appear only through the
 *    substrate junction (the dot filling from the substrate in shell tunnelling) are not
 *    predicted.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991) (the two junctions of a double-barrier structure);
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991) (discrete levels).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.62: a CB peak at 0.9 V predicts a resonance at −0.62·0.9/0.38 = −1.468 V.
 * const peak = (biasV: number): Peak => ({ biasV, biasUncertaintyV: 0.002, index: 0, heightS: 1e-9,
 *   prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30 });
 * secondJunctionResonances([-1.47, -1.0, 0.9].map(peak), 0.62);
 * // => [{ index: 0, sourceIndex: 2, predictedV: -1.468… }]
 * ```
 */
export function secondJunctionResonances(peaks: readonly Peak[], eta: number): SecondJunctionResonance[] {
  if (!(eta > 0 && eta < 1)) return [];
  const D = SECOND_JUNCTION_DEFAULTS;
  const gain = eta / (1 - eta);
  const order = peaks.map((_, k) => k).sort((a, b) => Math.abs(peaks[a].biasV) - Math.abs(peaks[b].biasV));
  const sources: number[] = [];
  const found: SecondJunctionResonance[] = [];
  for (const k of order) {
    const p = peaks[k];
    if (p.biasV === 0) continue; // in neither band: neither a source nor a resonance
    let best: SecondJunctionResonance | null = null;
    let bestMiss = Infinity;
    for (const s of sources) {
      const src = peaks[s];
      if (Math.sign(src.biasV) === Math.sign(p.biasV)) continue;
      const predictedV = -gain * src.biasV;
      const sigma = Math.hypot(gain * src.biasUncertaintyV, p.biasUncertaintyV);
      const tolerance = Math.max(D.toleranceSigma * sigma, D.toleranceFwhmFraction * p.fwhmV);
      const miss = Math.abs(p.biasV - predictedV);
      if (miss <= tolerance && miss < bestMiss) {
        best = { index: k, sourceIndex: s, predictedV };
        bestMiss = miss;
      }
    }
    if (best) found.push(best);
    else sources.push(k);
  }
  return found;
}
