/**
 * The second-junction resonances that a shell-filling ladder predicts: every charging peak of
 * every assigned level, entered through the substrate junction into an otherwise empty dot.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import type { Multiplet } from "./multiplets.ts";
import { SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";

/** What {@link ladderResonances} reads from a shell-filling assignment. */
export interface LadderResonanceInputs {
  /** The assignment's multiplets (CB shells with their sub-groups, VB groups), peaks named by index. */
  multiplets: readonly Pick<Multiplet, "band" | "degeneracy" | "peakIndices" | "subgroups">[];
  /** Ec in bias (the spacing of the tip-side charging ladder), V; > 0. */
  chargingEnergyV: number;
  /** Voltage-division factor η in (0, 1). */
  eta: number;
}

/** One resonance predicted by the ladder, and the peak found there (if any). */
export interface LadderResonance extends SecondJunctionResonance {
  /** Carriers of the band in lower levels (sub-levels) of the ladder at the source's charging peak. */
  carriersBelow: number;
}

/**
 * Predict, from a shell-filling ladder, where each charging peak's level enters through the
 * substrate junction, and name the peak found there.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[]
 *     The peak list of the assignment (positions and 1σ uncertainties in V, FWHM in V).
 * inputs : LadderResonanceInputs
 *     The multiplets, Ec in bias and η.
 *
 * Returns
 * -------
 * LadderResonance[]
 *     One entry per charging peak of the ladder whose prediction has a peak within tolerance on
 *     the other side of 0 V (each peak named once, by the nearest prediction), in ladder order.
 *     `index` is that peak, `sourceIndex` the charging peak, `predictedV` the prediction (V).
 *     Empty for η outside (0, 1) or Ec not positive.
 *
 * Notes
 * -----
 * 1. Tip side in shell filling (Γtip ≫ Γsub): the j-th charging peak (j = 0 … g − 1) of a level
 *    ε with N carriers of the band in the lower levels lies at η·|V| = ε + Ec·(N + j + ½)
 *    (orthodox theory; |ε| for a VB level).
 * 2. Substrate side: the rate ratio is Γsub/Γtip ≪ 1, so the dot is empty between tunnelling
 *    events and the lower levels hold no carrier. The level takes its (j + 1)-th carrier at
 *    (1 − η)·|V′| = ε + Ec·(j + ½), the opposite bias. Eliminating ε:
 *    |V′| = η/(1 − η) · (|V| − N·Ec_V), Ec_V = Ec/η the ladder's spacing in bias. For the band's
 *    first level (N = 0) this is the plain −η·V/(1 − η) of `secondJunctionResonances`; for a
 *    higher level it lies N·Ec/(1 − η) nearer 0 V.
 * 3. N counts the states below each sub-level: a CB shell read whole adds its degeneracy, a split
 *    shell each sub-group's peaks, a VB group its peaks (no degeneracy assumed).
 * 4. Each prediction takes the nearest peak of the other side within max(3σ, FWHM/2)
 *    (`SECOND_JUNCTION_DEFAULTS`; σ combines the peak's with the source's scaled by η/(1 − η));
 *    a peak closer to another prediction goes to that one.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991) (the two junctions of a double-barrier structure);
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991) (charging of discrete levels).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6 (gain 1.5), Ec_V = 0.2 V; v1 doublet at −1.0 and −1.2 V, v2 at −1.6 and −1.8 V (N = 2):
 * // predictions 1.5, 1.8 (v1) and 1.5·(1.6 − 0.4) = 1.8, 1.5·(1.8 − 0.4) = 2.1 (v2).
 * const peak = (biasV: number) => ({ biasV, biasUncertaintyV: 0.002, fwhmV: 0.04 });
 * const peaks = [-1.8, -1.6, -1.2, -1.0, 1.5, 2.1].map(peak);
 * const v = (peakIndices: number[]) => ({ band: "VB" as const, degeneracy: null, peakIndices, subgroups: [peakIndices.length] });
 * ladderResonances(peaks, { multiplets: [v([3, 2]), v([1, 0])], chargingEnergyV: 0.2, eta: 0.6 })
 *   .map((r) => r.index);  // => [4, 5]
 * ```
 */
export function ladderResonances(peaks: readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[], inputs: LadderResonanceInputs): LadderResonance[] {
  const { eta } = inputs;
  const predictions = ladderPredictions(peaks, inputs);
  if (!predictions.length) return [];
  const D = SECOND_JUNCTION_DEFAULTS;
  const gain = eta / (1 - eta);
  // Each peak goes to its nearest prediction within tolerance; each prediction to one peak.
  const miss = (r: LadderResonance, i: number) => {
    const p = peaks[i];
    if (Math.sign(p.biasV) === Math.sign(peaks[r.sourceIndex].biasV) || p.biasV === 0) return Infinity;
    const src = peaks[r.sourceIndex];
    const sigma = Math.hypot(gain * src.biasUncertaintyV, p.biasUncertaintyV);
    const d = Math.abs(p.biasV - r.predictedV);
    return d <= Math.max(D.toleranceSigma * sigma, D.toleranceFwhmFraction * p.fwhmV) ? d : Infinity;
  };
  const pairs: { r: LadderResonance; i: number; d: number }[] = [];
  for (const r of predictions) peaks.forEach((_, i) => {
    const d = miss(r, i);
    if (Number.isFinite(d)) pairs.push({ r, i, d });
  });
  pairs.sort((a, b) => a.d - b.d);
  const usedPeak = new Set<number>();
  const usedPrediction = new Set<LadderResonance>();
  for (const { r, i } of pairs) {
    if (usedPeak.has(i) || usedPrediction.has(r)) continue;
    usedPeak.add(i);
    usedPrediction.add(r);
    r.index = i;
  }
  return predictions.filter((r) => r.index >= 0);
}

/**
 * Every resonance a shell-filling ladder predicts (note 2 of {@link ladderResonances}), with
 * `index` −1 (no peak named): one per charging peak of the multiplets, at
 * −sign(V)·η/(1 − η)·(|V| − N·Ec_V), V. Empty for η outside (0, 1) or Ec not positive.
 */
export function ladderPredictions(peaks: readonly Pick<Peak, "biasV">[], inputs: LadderResonanceInputs): LadderResonance[] {
  const { eta, chargingEnergyV: ecV } = inputs;
  if (!(eta > 0 && eta < 1) || !(ecV > 0)) return [];
  const gain = eta / (1 - eta);
  const below = { CB: 0, VB: 0 };
  const predictions: LadderResonance[] = [];
  for (const m of inputs.multiplets) {
    const whole = m.band === "CB" && m.degeneracy !== null && m.subgroups.length <= 1;
    let start = 0;
    for (const size of m.subgroups.length ? m.subgroups : [m.peakIndices.length]) {
      const n = below[m.band];
      for (const source of m.peakIndices.slice(start, start + size)) {
        const v = peaks[source].biasV;
        predictions.push({ index: -1, sourceIndex: source, predictedV: -Math.sign(v) * gain * (Math.abs(v) - n * ecV), carriersBelow: n });
      }
      start += size;
      below[m.band] += whole ? 0 : size;
    }
    if (whole) below[m.band] += m.degeneracy!;
  }
  return predictions;
}
