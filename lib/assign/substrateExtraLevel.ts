/**
 * The substrate side of a shell-tunnelling dot, which fills where the tip side tunnels: a p read
 * with more levels than p has orbitals holds a charging peak through the substrate junction, and
 * a deeper level's resonance does not lie at the plain −η·V/(1 − η).
 */
import type { Peak } from "../peaks/findPeaks.ts";
import type { Multiplet } from "./multiplets.ts";
import { isPlainPrediction, SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";
import { medianInPlace } from "../util/medianInPlace.ts";

/** Limits of {@link substrateExtraLevel} (locked by test/assign/substrateExtraLevel.test.ts). */
export const SUBSTRATE_EXTRA_LEVEL_DEFAULTS = Object.freeze({
  /** Spatial orbitals of a p shell: at most this many p levels in shell tunnelling (2 spin states each). */
  pOrbitals: 3,
  /**
   * The extra peak steps at most this multiple of the median step of the other p levels and of the
   * VB gap-edge level's: `SECOND_JUNCTION_DEFAULTS.companionSourceStepRatioMax`, (g·r + 1)/(g + r)
   * for g = 2 at the shell-tunnelling limit r = 3/7 (13/17 ≈ 0.765).
   */
  stepRatioMax: SECOND_JUNCTION_DEFAULTS.companionSourceStepRatioMax,
});

/**
 * The peak that a shell-tunnelling p with more levels than orbitals holds beyond them: a second
 * charging peak entered through the substrate junction.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA" | "fwhmV">[]
 *     The peak list of the assignment (positions and FWHM in V, current steps in A).
 * multiplets : readonly Pick<Multiplet, "band" | "label" | "peakIndices">[]
 *     The shell-tunnelling assignment's multiplets (CB shells s, p, …; VB groups v1, v2, … from
 *     the gap edge).
 * eta : number
 *     Voltage-division factor η in (0, 1).
 *
 * Returns
 * -------
 * SecondJunctionResonance | null
 *     The peak to set aside (`index`), the VB gap-edge peak whose substrate-side ladder it belongs
 *     to (`sourceIndex`) and its own position as `predictedV` (the charging energy that would
 *     place it is not known in shell tunnelling); null when p holds at most
 *     `SUBSTRATE_EXTRA_LEVEL_DEFAULTS.pOrbitals` peaks, η is outside (0, 1), or no p peak qualifies.
 *
 * Notes
 * -----
 * 1. In shell tunnelling each p orbital is one level of two spin states: p has at most three
 *    levels, so a fourth peak read into p is not a p level.
 * 2. Where the tip side tunnels (Γtip ≪ Γsub) the substrate side fills: every hole level of the VB
 *    enters through the substrate junction one carrier at a time, at positive bias beyond the
 *    gap-edge level's resonance −η·V/(1 − η) (V that level's peak), Ec/(1 − η) apart. Each such
 *    step is one carrier entering, about half that of a two-state level through the tip junction:
 *    (g·r + 1)/(g + r) × its source's (g = 2), below 13/17 for r below the tunnelling limit 3/7
 *    (`substrateToTipStepRatio`; 1/2 deep in the regime).
 * 3. So the weakest p peak is set aside if it lies beyond the gap-edge level's resonance (less
 *    half its FWHM) and steps at most `SUBSTRATE_EXTRA_LEVEL_DEFAULTS.stepRatioMax` × both the
 *    median step of the other p peaks and the gap-edge VB peak's step.
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
 * // η = 0.6: v1 at −1.5 V (resonance at 2.25 V), p levels at 2.3, 2.4, 2.5 V and a weak peak at 2.7 V.
 * const peaks = [[-1.5, 2e-13], [1.8, 2e-13], [2.3, 2e-13], [2.4, 2e-13], [2.5, 2e-13], [2.7, 1e-13]]
 *   .map(([biasV, stepA]) => ({ biasV, stepA, fwhmV: 0.05 }));
 * const multiplets = [{ band: "CB" as const, label: "s", peakIndices: [1] }, { band: "CB" as const, label: "p", peakIndices: [2, 3, 4, 5] },
 *   { band: "VB" as const, label: "v1", peakIndices: [0] }];
 * substrateExtraLevel(peaks, multiplets, 0.6);  // => { index: 5, sourceIndex: 0, predictedV: 2.7 }
 * ```
 */
export function substrateExtraLevel(
  peaks: readonly Pick<Peak, "biasV" | "stepA" | "fwhmV">[],
  multiplets: readonly Pick<Multiplet, "band" | "label" | "peakIndices">[],
  eta: number,
): SecondJunctionResonance | null {
  const D = SUBSTRATE_EXTRA_LEVEL_DEFAULTS;
  if (!(eta > 0 && eta < 1)) return null;
  const p = multiplets.find((m) => m.band === "CB" && m.label === "p");
  const v1 = multiplets.find((m) => m.band === "VB");
  if (!p || !v1 || p.peakIndices.length <= D.pOrbitals || !v1.peakIndices.length) return null;
  const source = v1.peakIndices[0];
  const sourceStepA = peaks[source].stepA;
  if (!(sourceStepA > 0)) return null;
  const resonanceV = (-eta / (1 - eta)) * peaks[source].biasV;
  const weakest = p.peakIndices.reduce((a, b) => (peaks[b].stepA < peaks[a].stepA ? b : a));
  const others = Float64Array.from(p.peakIndices.filter((i) => i !== weakest).map((i) => peaks[i].stepA));
  const w = peaks[weakest];
  const beyond = w.biasV >= resonanceV - w.fwhmV / 2;
  const weak = w.stepA <= D.stepRatioMax * medianInPlace(others) && w.stepA <= D.stepRatioMax * sourceStepA;
  return beyond && weak ? { index: weakest, sourceIndex: source, predictedV: w.biasV } : null;
}

/**
 * The candidate resonances of a shell-tunnelling reading that lie at the plain −η·V/(1 − η) of a
 * level deeper than its band's edge level: no step lies there.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "fwhmV">[]
 *     The peak list of the assignment (positions and FWHM in V).
 * resonances : readonly SecondJunctionResonance[]
 *     The resonances the reading set aside.
 * eta : number
 *     Voltage-division factor η in (0, 1).
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     Those whose `predictedV` is the plain −η·V/(1 − η) of their source, whose source is not
 *     the peak of its band nearest 0 V among the peaks that are not resonances, and with no such
 *     peak of their own sign within the smaller of the two FWHMs (note 3).
 *
 * Notes
 * -----
 * 1. Where the tip side tunnels (Γtip ≪ Γsub), carriers entering through the substrate junction
 *    leave through the slow tip junction: the substrate side fills the band's edge level first (its
 *    resonance and, one Ec/(1 − η) further, its second charging peak). A deeper level then takes
 *    its first carrier through the substrate with the N carriers of the levels below it in the
 *    dot, at |V′| = η·|V|/(1 − η) + N·Ec/(1 − η) (V its tip-side peak; N = 2 behind a doublet),
 *    not at the plain η·|V|/(1 − η); the empty dot, which that needs, is rare, and its step there
 *    is a fraction Γtip/Γsub of the others (orthodox master equation).
 * 2. So a peak at the plain prediction of a deeper level is not that resonance; the caller gives
 *    it back to the ladder where the regime stays shell tunnelling.
 * 3. Unless a peak that is no resonance lies within the smaller of their FWHMs: with no step at
 *    the plain prediction, the two are one level that the peak search split at the predicted
 *    resonance (two levels closer than a width would not be told apart), so the part at the
 *    prediction stays set aside and the level is read once, from the other.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6 (gain 1.5): v1 at −1.5 V (edge), v2 at −2.0 V; candidates at 2.25 V (v1) and 3.0 V (v2).
 * const peaks = [-2.0, -1.5, 2.25, 3.0].map((biasV) => ({ biasV, fwhmV: 0.05 }));
 * const set = [{ index: 2, sourceIndex: 1, predictedV: 2.25 }, { index: 3, sourceIndex: 0, predictedV: 3.0 }];
 * deeperPlainResonances(peaks, set, 0.6).map((r) => r.index);  // => [3]
 * ```
 */
export function deeperPlainResonances(peaks: readonly Pick<Peak, "biasV" | "fwhmV">[], resonances: readonly SecondJunctionResonance[], eta: number): SecondJunctionResonance[] {
  if (!(eta > 0 && eta < 1)) return [];
  const gain = eta / (1 - eta);
  const resonant = new Set(resonances.map((r) => r.index));
  const edge = (sign: number) => {
    let best = -1;
    peaks.forEach((p, i) => {
      if (!resonant.has(i) && Math.sign(p.biasV) === sign && (best < 0 || Math.abs(p.biasV) < Math.abs(peaks[best].biasV))) best = i;
    });
    return best;
  };
  const edges = new Set([edge(1), edge(-1)]);
  // Note 3: a level split at the prediction by the peak search.
  const splitLevel = (r: SecondJunctionResonance) => {
    const p = peaks[r.index];
    return peaks.some((q, i) => !resonant.has(i) && Math.sign(q.biasV) === Math.sign(p.biasV) && Math.abs(q.biasV - p.biasV) <= Math.min(p.fwhmV, q.fwhmV));
  };
  return resonances.filter((r) => {
    const v = peaks[r.sourceIndex].biasV;
    return isPlainPrediction(r, v, gain) && !edges.has(r.sourceIndex) && !splitLevel(r);
  });
}
