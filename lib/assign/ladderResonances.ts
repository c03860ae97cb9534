/**
 * The second-junction resonances that a shell-filling ladder predicts: every charging peak of
 * every assigned level, entered through the substrate junction into an otherwise empty dot.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { substrateToTipStepRatio } from "../model/regimeLimits.ts";
import { subgroupSpans, type Multiplet } from "./multiplets.ts";
import { SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";

/** Choice among the peaks at one prediction in {@link ladderResonances} (locked by test/assign/ladderResonances.test.ts). */
export const LADDER_RESONANCES_DEFAULTS = Object.freeze({
  /**
   * Note 5: a peak named for the resonance of a level's first charging peak steps at least this
   * multiple of that source's step, where one within tolerance does: (g·r + 1)/(g + r) ≥ 1 for
   * every degeneracy g when Γtip/Γsub = r ≥ 1 (`substrateToTipStepRatio` at r = 1 is 1; shell
   * filling has r ≥ 1.5). Chosen on the accuracy benchmark (low-η mix, rules alone): 1 and
   * `ASSIGN_DEFAULTS.fillingResonanceStepMin` (1.4) read the same on seeds 1, 1001 and 2001; the
   * bound that holds at every r ≥ 1 is kept.
   */
  firstResonanceStepMin: substrateToTipStepRatio(2, 1),
});

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
 *     the other side of 0 V (each peak named once, by the nearest prediction; a weak one last, note 5),
 *     in ladder order.
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
 * 5. The resonance of a level's first charging peak (the first peak of a sub-group, of a VB group
 *    or of a CB shell read whole) carries (g·r + 1)/(g + r) of that peak's step through the
 *    substrate junction, at least its step for r ≥ 1 (the later charging peaks' resonances carry
 *    far less). A peak stepping less than `LADDER_RESONANCES_DEFAULTS.firstResonanceStepMin` × the
 *    source's step is named for such a prediction only where no peak stepping enough is within
 *    tolerance: a level's weak flank beside a merged resonance lay nearer a prediction shifted by
 *    its source's scatter, and the summed peak was read as the level.
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
export function ladderResonances(peaks: readonly (Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV"> & Partial<Pick<Peak, "stepA">>)[], inputs: LadderResonanceInputs): LadderResonance[] {
  const { eta } = inputs;
  const predictions = ladderPredictions(peaks, inputs);
  if (!predictions.length) return [];
  // Note 5: the sources that are a level's (sub-level's, VB group's) first charging peak.
  const firsts = levelFirstPeaks(inputs.multiplets);
  const weak = (r: LadderResonance, i: number) => {
    const src = peaks[r.sourceIndex].stepA;
    const step = peaks[i].stepA;
    return firsts.has(r.sourceIndex) && src !== undefined && step !== undefined && src > 0 && step < LADDER_RESONANCES_DEFAULTS.firstResonanceStepMin * src;
  };
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
  const pairs: { r: LadderResonance; i: number; d: number; w: boolean }[] = [];
  for (const r of predictions) peaks.forEach((_, i) => {
    const d = miss(r, i);
    if (Number.isFinite(d)) pairs.push({ r, i, d, w: weak(r, i) });
  });
  // Note 5: a peak too weak for a first charging peak's resonance is named only after the others.
  pairs.sort((a, b) => Number(a.w) - Number(b.w) || a.d - b.d);
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
 * The peaks that open a level of the ladder (note 5 of {@link ladderResonances}): the first peak
 * of each sub-group of a split CB shell or VB group, the first of a CB shell read whole.
 */
function levelFirstPeaks(multiplets: LadderResonanceInputs["multiplets"]): Set<number> {
  const out = new Set<number>();
  for (const m of multiplets) {
    const whole = m.band === "CB" && m.degeneracy !== null && m.subgroups.length <= 1;
    for (const { indices } of subgroupSpans(whole ? { peakIndices: m.peakIndices, subgroups: [] } : m)) if (indices.length) out.add(indices[0]);
  }
  return out;
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
    for (const { size, indices } of subgroupSpans(m)) {
      const n = below[m.band];
      for (const source of indices) {
        const v = peaks[source].biasV;
        predictions.push({ index: -1, sourceIndex: source, predictedV: -Math.sign(v) * gain * (Math.abs(v) - n * ecV), carriersBelow: n });
      }
      below[m.band] += whole ? 0 : size;
    }
    if (whole) below[m.band] += m.degeneracy!;
  }
  return predictions;
}
