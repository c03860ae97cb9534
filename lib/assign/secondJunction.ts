/**
 * Resonances through the second (dot–substrate) junction: at low η a level that the tip junction
 * shows at bias V also lines up with the substrate's Fermi level at the opposite bias
 * −η·V/(1 − η). Those peaks are real but are not new levels; this stage finds them so that the
 * assignment leaves them out of the ladders.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { REGIME_LIMITS, substrateToTipStepRatio } from "../model/regimeLimits.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";

/** Tolerances of {@link secondJunctionResonances} (locked by test/assign/secondJunction.test.ts). */
export const SECOND_JUNCTION_DEFAULTS = Object.freeze({
  /** A peak within this many combined σ of a predicted resonance is taken as that resonance … */
  toleranceSigma: 3,
  /** … or within this fraction of its own FWHM, whichever is larger (η is rarely known better than a few %). */
  toleranceFwhmFraction: 0.5,
  /**
   * {@link substrateChargingPeaks}: the charging energy the spacing of a resonance and its
   * companion implies is at most this fraction of the gap (in energy).
   */
  companionChargingFractionMax: 0.25,
  /**
   * {@link substrateChargingPeaks}: the companion lies more than this many of the resonance's
   * FWHM beyond it. The substrate side's doublet is Ec/(1 − η) apart, more than the tip side's
   * Ec/η for η > 1/2; a peak within one width of the resonance is a part of the same peak split
   * by the search (a level under the resonance, or the resonance itself), not its second
   * charging peak.
   */
  companionSpacingFwhmMin: 1,
  /**
   * {@link substrateChargingPeaks} note 5: where a level of the source's band shows its charging
   * satellite (a peak beyond it stepping `satelliteStepFractionRange` of its step), Ec = η × their
   * spacing (`satelliteChargingEV`), and the
   * companion lies Ec/(1 − η) beyond its resonance (orthodox theory); a peak nearer than
   * (1 − this) × Ec/(1 − η) is not it. Chosen on the accuracy benchmark (low-η shell-tunnelling
   * draws whose p level lies between a resonance and its companion).
   */
  companionChargingSpacingTolerance: 0.3,
  /**
   * {@link substrateChargingPeaks} note 5: the range of a peak's step over the level's before
   * it that reads as that level's charging satellite (`ASSIGN_DEFAULTS.satelliteEvidenceMin` and
   * `satelliteStepRatioMax`: 0.1 to 0.5). Common practice (no source).
   */
  satelliteStepFractionRange: [ASSIGN_DEFAULTS.satelliteEvidenceMin, ASSIGN_DEFAULTS.satelliteStepRatioMax] as readonly [number, number],
  /**
   * {@link substrateChargingPeaks}: the resonance's step over its source's is at most this:
   * (g·r + 1)/(g + r) for g = 2 at the shell-tunnelling limit r = Γtip/Γsub = 3/7
   * (`substrateToTipStepRatio` and `REGIME_LIMITS` in lib/model/regimeLimits.ts): 13/17 ≈ 0.765.
   */
  companionSourceStepRatioMax: substrateToTipStepRatio(2, REGIME_LIMITS.tunnelingRateRatioMax),
  /**
   * {@link substrateChargingPeaks} judged from the source (its note 4): the least a resonance
   * alone steps over its source where the tip side tunnels, (g·r + 1)/(g + r) for g = 2 as
   * r = Γtip/Γsub → 0 (`substrateToTipStepRatio`): 1/2. Closed form; its use (with
   * `companionSourceStepRatioMax` as the other end, by `underResonances` only where the VB reads
   * shell tunnelling) was chosen on the accuracy benchmark (low-η shell-tunnelling draws whose
   * p or s lies under a VB level's resonance).
   */
  ownShareSourceStepRatioMin: substrateToTipStepRatio(2, 0),
  /**
   * {@link overlappedResonances}: where the tip side is not shell filling, a resonance stepping at
   * least this multiple of its source's step holds a level too: (g·r + 1)/(g + r) < 1 for every
   * g ≥ 2 and r = Γtip/Γsub < 1 (`substrateToTipStepRatio` at r = 1 is 1 for every g).
   */
  overlapSourceStepRatioMin: substrateToTipStepRatio(2, 1),
  /**
   * {@link deeperChargingResonances}: a deeper level's resonances are looked for up to this many
   * substrate-side charging steps Ec/(1 − η) beyond its plain prediction: the carriers the
   * gap-edge level's two spin states can hold.
   */
  deeperChargingMax: 2,
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
 *    Each position's σ is at most half its FWHM: a maximum of the conductance lies within half a
 *    width of the component that makes it, whatever a weak step's local fit reports (its
 *    Gauss–Newton variance can exceed the bias range, and scaled by η/(1 − η) ≈ 11 at η = 0.92
 *    it would make every peak on the other side "the resonance").
 * 3. Resonances predict no further resonances. Charging peaks that appear only through the
 *    substrate junction (the dot filling from the substrate in shell tunnelling) are not
 *    predicted.
 * 4. Nor does a peak without a current step (`stepA` ≤ 0: the step fit found none, a maximum of
 *    the conductance's noise): a resonance steps in proportion to its source's tip-side step
 *    ((g·r + 1)/(g + r) of it, `substrateToTipStepRatio` in lib/model/regimeLimits.ts), so none is
 *    expected from it, and a level near its predicted position would be lost to it.
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
      const miss = Math.abs(p.biasV - predictedV);
      if (miss <= matchToleranceV(src, p, gain) && miss < bestMiss) {
        best = { index: k, sourceIndex: s, predictedV };
        bestMiss = miss;
      }
    }
    if (best) found.push(best);
    else if (p.stepA > 0) sources.push(k); // note 4: no step, no resonance
  }
  return found;
}

/** A peak's position uncertainty for matching, V: its own, at most half its FWHM (note 2 of {@link secondJunctionResonances}). */
function positionSigma(p: Pick<Peak, "biasUncertaintyV" | "fwhmV">): number {
  return Math.min(p.biasUncertaintyV, p.fwhmV / 2);
}

/**
 * How far a peak may lie from the resonance a source predicts and still be taken for it, V:
 * max(toleranceSigma·σ, toleranceFwhmFraction·FWHM of the peak), σ combining the peak's position
 * σ with the source's scaled by `gain` = η/(1 − η), each at most half its FWHM, and with
 * `extraSigmaV` (V; default 0), the σ of any further term of the prediction
 * (`SECOND_JUNCTION_DEFAULTS`; note 2 of {@link secondJunctionResonances}).
 */
export function matchToleranceV(source: Pick<Peak, "biasUncertaintyV" | "fwhmV">, peak: Pick<Peak, "biasUncertaintyV" | "fwhmV">, gain: number, extraSigmaV = 0): number {
  const D = SECOND_JUNCTION_DEFAULTS;
  // Two terms where there is no third: Math.hypot's compensated sum can move the last bit with a 0 added.
  const sigma = extraSigmaV ? Math.hypot(gain * positionSigma(source), positionSigma(peak), extraSigmaV) : Math.hypot(gain * positionSigma(source), positionSigma(peak));
  return Math.max(D.toleranceSigma * sigma, D.toleranceFwhmFraction * peak.fwhmV);
}

/**
 * Whether a resonance's prediction is the plain −η·V/(1 − η) of its source at `sourceV` (V) (and
 * not one moved by the carriers below it), to round-off; `gain` = η/(1 − η).
 */
export function isPlainPrediction(r: Pick<SecondJunctionResonance, "predictedV">, sourceV: number, gain: number): boolean {
  return Math.abs(r.predictedV + gain * sourceV) <= 1e-9 * Math.max(1, Math.abs(r.predictedV));
}

/**
 * The second charging peaks that only the substrate junction shows: where the tip side is in shell
 * tunnelling (Γtip ≪ Γsub), the substrate side fills the dot (rate ratio Γsub/Γtip ≫ 1), so the
 * resonance of a band's first level is a charging doublet there.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peaks of one curve (positions `biasV` and `fwhmV` in V, current steps `stepA` in A).
 * resonances : readonly SecondJunctionResonance[]
 *     From {@link secondJunctionResonances}.
 * eta : number
 *     Voltage-division factor η in (0, 1).
 * stepRatio : readonly [number, number]
 *     The range of the second step over the first that reads as a charging doublet
 *     (`ASSIGN_DEFAULTS.fillingStepRatio`).
 * fromSource : boolean
 *     Judge the companion against the resonance's own share of its source's step instead of the
 *     resonance's measured step (note 4); default false.
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     The companions found, each with the source of the resonance it follows and `predictedV` =
 *     its own position (the spacing is not known in advance).
 *
 * Notes
 * -----
 * 1. Only resonances of the gap-edge level of a band (the peak of that band nearest 0 V) have a
 *    companion: the dot then holds no carrier of that band before the level. The resonance's step
 *    must be at most `SECOND_JUNCTION_DEFAULTS.companionSourceStepRatioMax` × its source's: the
 *    ratio is (g·r + 1)/(g + r) (`substrateToTipStepRatio`), below 13/17 for g = 2 only on the
 *    tunnelling side of r = 3/7.
 * 2. Beyond the resonance (further from 0 V, same side), the first peak that is not a resonance
 *    and whose step lies within `stepRatio` × the resonance's is its companion, if the charging
 *    energy it implies, Ec = (1 − η)·|V₂ − V₁|, is at most
 *    `SECOND_JUNCTION_DEFAULTS.companionChargingFractionMax` × the gap in energy (η × the distance
 *    between the gap-edge peaks) and the spacing exceeds
 *    `SECOND_JUNCTION_DEFAULTS.companionSpacingFwhmMin` × the resonance's FWHM.
 * 3. Through the substrate junction of a shell-tunnelling dot the doublet's steps are alike: their
 *    ratio is r'/(1 + r') for r' = Γsub/Γtip ≫ 1 (the closed form of `secondToFirstStepRatio` with
 *    the junctions' roles swapped).
 * 4. With `fromSource`, where a tip-side level lies under the resonance its merged step says
 *    nothing of the resonance's, and the companion's step is compared with the resonance's own
 *    share of its source's instead: (g·r + 1)/(g + r) for g = 2 and r = Γtip/Γsub from 0 to the
 *    tunnelling limit 3/7, i.e. `SECOND_JUNCTION_DEFAULTS.ownShareSourceStepRatioMin` (1/2) to
 *    `companionSourceStepRatioMax` (13/17) of the source, widened by `stepRatio` at each end. The
 *    measured step of the resonance is not bounded then (it holds the level too).
 * 5. Where the source's band shows a level's charging satellite, Ec = η × their spacing
 *    (`satelliteChargingEV`), and the companion lies Ec/(1 − η) beyond the resonance; a first
 *    matching peak nearer than (1 − `SECOND_JUNCTION_DEFAULTS.companionChargingSpacingTolerance`)
 *    × Ec/(1 − η) is a level between them (its step alike by chance), not the companion, and none
 *    is taken for that resonance (the companion then lies under a later level).
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6; s at 0.9 V, v1 at −1.0 V; the resonance of v1 at 1.5 V, its companion at 1.75 V
 * // (Ec = 0.4 × 0.25 = 0.1 eV), each about half the v1 step; a p level at 1.6 V lies between them.
 * const peak = (biasV: number, stepA: number): Peak => ({ biasV, biasUncertaintyV: 0.002, index: 0, heightS: 1e-9,
 *   prominenceS: 1e-9, fwhmV: 0.04, stepA, snr: 20, stepSignificance: 30 });
 * const peaks = [peak(-1.0, 2e-12), peak(0.9, 2e-12), peak(1.5, 1e-12), peak(1.6, 6e-12), peak(1.75, 0.95e-12)];
 * substrateChargingPeaks(peaks, secondJunctionResonances(peaks, 0.6), 0.6, [0.6, 1.3]).map((r) => r.index);  // => [4]
 * ```
 */
export function substrateChargingPeaks(peaks: readonly Peak[], resonances: readonly SecondJunctionResonance[], eta: number, stepRatio: readonly [number, number], fromSource = false): SecondJunctionResonance[] {
  if (!(eta > 0 && eta < 1)) return [];
  const taken = new Set(resonances.map((r) => r.index));
  const free = peaks.map((p, k) => ({ p, k })).filter(({ k }) => !taken.has(k));
  const edge = (sign: number) => free.filter(({ p }) => Math.sign(p.biasV) === sign).sort((a, b) => Math.abs(a.p.biasV) - Math.abs(b.p.biasV))[0];
  const cb = edge(1), vb = edge(-1);
  if (!cb || !vb) return [];
  const gapEV = eta * (cb.p.biasV - vb.p.biasV);
  const out: SecondJunctionResonance[] = [];
  for (const r of resonances) {
    const res = peaks[r.index];
    const source = r.sourceIndex === cb.k || r.sourceIndex === vb.k;
    const sourceStepA = peaks[r.sourceIndex].stepA;
    if (!source || (!fromSource && res.stepA > SECOND_JUNCTION_DEFAULTS.companionSourceStepRatioMax * sourceStepA)) continue;
    const beyond = free
      .filter(({ p }) => Math.sign(p.biasV) === Math.sign(res.biasV) && Math.abs(p.biasV) > Math.abs(res.biasV))
      .sort((a, b) => Math.abs(a.p.biasV) - Math.abs(b.p.biasV));
    const [lowA, highA] = fromSource
      ? [stepRatio[0] * SECOND_JUNCTION_DEFAULTS.ownShareSourceStepRatioMin * sourceStepA, stepRatio[1] * SECOND_JUNCTION_DEFAULTS.companionSourceStepRatioMax * sourceStepA]
      : [stepRatio[0] * res.stepA, stepRatio[1] * res.stepA];
    const next = beyond.find(({ p }) => p.stepA >= lowA && p.stepA <= highA);
    if (!next) continue;
    const spacingV = Math.abs(next.p.biasV - res.biasV);
    if (spacingV <= SECOND_JUNCTION_DEFAULTS.companionSpacingFwhmMin * res.fwhmV || (1 - eta) * spacingV > SECOND_JUNCTION_DEFAULTS.companionChargingFractionMax * gapEV) continue;
    const ecEV = satelliteChargingEV(free.map(({ p }) => p), eta, Math.sign(peaks[r.sourceIndex].biasV));
    if (ecEV !== null && (1 - eta) * spacingV < (1 - SECOND_JUNCTION_DEFAULTS.companionChargingSpacingTolerance) * ecEV) continue;
    if (out.some((o) => o.index === next.k)) continue;
    out.push({ index: next.k, sourceIndex: r.sourceIndex, predictedV: next.p.biasV });
  }
  return out;
}

/**
 * The charging energy a level's charging satellite measures, eV: in the band of `sign` (+1 CB,
 * −1 VB), the spacing of the first peak (from the gap edge outward) stepping
 * `SECOND_JUNCTION_DEFAULTS.satelliteStepFractionRange` of the peak before it, × η (the tip
 * junction's share of the bias: a level's tip-side charging peaks are Ec/η apart); null without one.
 *
 * Example
 * -------
 * ```ts
 * // η = 0.5: v1 at −1.0 V, v2 at −1.3 V and its satellite (a fifth of its step) 0.2 V beyond it.
 * const at = (biasV: number, stepA: number) => ({ biasV, stepA }) as Peak;
 * satelliteChargingEV([at(-1.0, 5e-13), at(-1.3, 9e-13), at(-1.5, 1.8e-13)], 0.5, -1);  // => 0.1
 * ```
 */
export function satelliteChargingEV(peaks: readonly Pick<Peak, "biasV" | "stepA">[], eta: number, sign: number): number | null {
  const vb = peaks.filter((p) => Math.sign(p.biasV) === sign).sort((a, b) => Math.abs(a.biasV) - Math.abs(b.biasV));
  const [lo, hi] = SECOND_JUNCTION_DEFAULTS.satelliteStepFractionRange;
  for (let k = 1; k < vb.length; k++) {
    const ratio = vb[k].stepA / vb[k - 1].stepA;
    if (vb[k - 1].stepA > 0 && ratio >= lo && ratio <= hi) return eta * Math.abs(vb[k].biasV - vb[k - 1].biasV);
  }
  return null;
}

/**
 * The resonances that step too much to be resonances alone where the tip side does not fill the
 * dot: a level of the tip-side ladder lies under them.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "stepA">[]
 *     The peaks of one curve (current steps `stepA` in A).
 * resonances : readonly SecondJunctionResonance[]
 *     Peaks taken as resonances (from {@link secondJunctionResonances} or a later stage).
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     Those whose step is at least `SECOND_JUNCTION_DEFAULTS.overlapSourceStepRatioMin` × their
 *     source's step (a source without a positive step tells nothing and releases none).
 *
 * Notes
 * -----
 * 1. A level of g states entered into the empty dot steps the current by e·g·Γt·Γs/(g·Γt + Γs)
 *    through the tip junction and by e·g·Γs·Γt/(g·Γs + Γt) through the substrate junction: the
 *    resonance over its source is (g·r + 1)/(g + r), r = Γtip/Γsub (`substrateToTipStepRatio`).
 * 2. That ratio is below 1 for every g ≥ 2 when r < 1 (13/17 for g = 2 at the tunnelling limit
 *    r = 3/7, about 1/g deep in shell tunnelling). So where the tip side is in shell tunnelling
 *    or the crossover's lower half, a peak at a predicted resonance that steps at least as much
 *    as its source carries another step: a tip-side level at the same bias, which the ladder
 *    needs. The caller applies it only where the regime read is not shell filling.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev.
 * B 65, 045317 (2002).
 *
 * Example
 * -------
 * ```ts
 * // v1 at −1.70 V steps 0.43 pA; peaks at its resonance 2.175 V step 1.0 pA (a p level under
 * // it) or 0.25 pA (the resonance alone, about half the source as deep in shell tunnelling).
 * const at = { index: 1, sourceIndex: 0, predictedV: 2.175 };
 * overlappedResonances([{ stepA: 0.43e-12 }, { stepA: 1.0e-12 }], [at]).length;   // => 1
 * overlappedResonances([{ stepA: 0.43e-12 }, { stepA: 0.25e-12 }], [at]).length;  // => 0
 * ```
 */
export function overlappedResonances(peaks: readonly Pick<Peak, "stepA">[], resonances: readonly SecondJunctionResonance[]): SecondJunctionResonance[] {
  const min = SECOND_JUNCTION_DEFAULTS.overlapSourceStepRatioMin;
  return resonances.filter((r) => peaks[r.sourceIndex].stepA > 0 && peaks[r.index].stepA >= min * peaks[r.sourceIndex].stepA);
}

/**
 * The resonances of a band's deeper levels once the substrate side is seen to fill: with a
 * gap-edge level's resonance and its second charging peak (`substrateChargingPeaks`) one
 * Ec/(1 − η) apart, a deeper level of the same band steps through the substrate junction
 * k·Ec/(1 − η) beyond its own plain −η·V/(1 − η), k = 1 … `SECOND_JUNCTION_DEFAULTS.deeperChargingMax`.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peaks of one curve (positions `biasV`, `biasUncertaintyV` and `fwhmV` in V, steps `stepA` in A).
 * resonances : readonly SecondJunctionResonance[]
 *     The resonances set aside (from {@link secondJunctionResonances}).
 * companions : readonly SecondJunctionResonance[]
 *     The second charging peaks found beyond them (from {@link substrateChargingPeaks}).
 * levels : readonly number[]
 *     Indices of the peaks a reading took as levels (its multiplets' peaks): the only sources.
 * eta : number
 *     Voltage-division factor η in (0, 1).
 * stepRatio : readonly [number, number]
 *     The range of a peak's step over the companion's that reads as another carrier entering
 *     through the substrate junction (`ASSIGN_DEFAULTS.fillingStepRatio`, as for the companion).
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     The peaks found there, each with its source (the deeper level's tip-side peak) and the
 *     position predicted for it, V; empty without companions.
 *
 * Notes
 * -----
 * 1. The spacing of a resonance and its companion is the substrate side's charging step,
 *    Ec/(1 − η) in bias; where there are several, the mean is used.
 * 2. Where the tip side tunnels (Γtip ≪ Γsub) the substrate side keeps the dot charged: a
 *    deeper level takes its carrier through the substrate junction with the k carriers of the
 *    levels before it that the slow tip side has not yet drained, at
 *    |V′| = η·|V|/(1 − η) + k·Ec/(1 − η) (V its tip-side peak; orthodox master equation with
 *    fast relaxation inside the dot). k = 0 is the plain prediction, already a candidate; k runs
 *    up to the gap-edge level's two spin states (`deeperChargingMax` = 2).
 * 3. Sources are the band's levels beyond its edge level (the resonance's source), those of
 *    `levels` (no noise peak or charging satellite) that are not resonances and step (`stepA` > 0, as in note 4 of {@link secondJunctionResonances}); a free
 *    peak of the other side within {@link matchToleranceV} of a prediction (the nearest) is that
 *    resonance.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6 (gain 1.5): v1 at −1.0 V, its resonance at 1.5 V and companion at 1.7 V (Ec/(1 − η) = 0.2 V);
 * // v2 at −1.3 V: plain 1.95 V, then 2.15 V and 2.35 V; a peak at 2.35 V is its resonance.
 * const peak = (biasV: number): Peak => ({ biasV, biasUncertaintyV: 0.002, index: 0, heightS: 1e-9,
 *   prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-12, snr: 20, stepSignificance: 30 });
 * const peaks = [-1.3, -1.0, 0.9, 1.5, 1.7, 2.35].map(peak);
 * deeperChargingResonances(peaks, [{ index: 3, sourceIndex: 1, predictedV: 1.5 }], [{ index: 4, sourceIndex: 1, predictedV: 1.7 }], [0, 1, 2], 0.6, [0.6, 1.3]);
 * // => [{ index: 5, sourceIndex: 0, predictedV: 2.35 }]
 * ```
 */
export function deeperChargingResonances(peaks: readonly Peak[], resonances: readonly SecondJunctionResonance[], companions: readonly SecondJunctionResonance[], levels: readonly number[], eta: number, stepRatio: readonly [number, number]): SecondJunctionResonance[] {
  if (!(eta > 0 && eta < 1)) return [];
  const gain = eta / (1 - eta);
  const taken = new Set([...resonances, ...companions].map((r) => r.index));
  const out: SecondJunctionResonance[] = [];
  for (const c of companions) {
    const first = resonances.find((r) => r.sourceIndex === c.sourceIndex);
    if (!first) continue;
    const ecV = Math.abs(peaks[c.index].biasV - peaks[first.index].biasV);
    const edge = peaks[c.sourceIndex];
    const side = Math.sign(peaks[c.index].biasV);
    peaks.forEach((src, s) => {
      if (taken.has(s) || !levels.includes(s) || Math.sign(src.biasV) !== Math.sign(edge.biasV) || Math.abs(src.biasV) <= Math.abs(edge.biasV) || !(src.stepA > 0)) return;
      for (let k = 1; k <= SECOND_JUNCTION_DEFAULTS.deeperChargingMax; k++) {
        const predictedV = -gain * src.biasV + side * k * ecV;
        const spacingSigmaV = k * Math.hypot(positionSigma(peaks[c.index]), positionSigma(peaks[first.index]));
        let best = -1;
        peaks.forEach((p, i) => {
          const tolV = matchToleranceV(src, p, gain, spacingSigmaV);
          if (taken.has(i) || Math.sign(p.biasV) !== side || Math.abs(p.biasV - predictedV) > tolV) return;
          if (p.stepA < stepRatio[0] * peaks[c.index].stepA || p.stepA > stepRatio[1] * peaks[c.index].stepA) return;
          if (best < 0 || Math.abs(p.biasV - predictedV) < Math.abs(peaks[best].biasV - predictedV)) best = i;
        });
        if (best < 0) continue;
        taken.add(best);
        out.push({ index: best, sourceIndex: s, predictedV });
      }
    });
  }
  return out;
}

/**
 * The resonances that share their source's prediction with a nearer one and together step too
 * much to be parts of one resonance: the farther holds a tip-side level.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA">[]
 *     The peaks of one curve (positions in V, current steps `stepA` in A).
 * resonances : readonly SecondJunctionResonance[]
 *     Peaks taken as resonances (from {@link secondJunctionResonances} or a later stage).
 *
 * Returns
 * -------
 * SecondJunctionResonance[]
 *     For each prediction (source and predicted position) matched by several peaks whose summed step is at least
 *     `SECOND_JUNCTION_DEFAULTS.overlapSourceStepRatioMin` × the source's, all but the one nearest
 *     the prediction.
 *
 * Notes
 * -----
 * 1. A level has one resonance: two peaks within the match tolerance of one prediction are that
 *    resonance split by the peak search, sharing its step, or the resonance and a level beside it.
 * 2. Where the tip side does not fill the dot a resonance steps less than its source
 *    ((g·r + 1)/(g + r) < 1 for r < 1, note 2 of {@link overlappedResonances}), so parts summing
 *    to at least the source's step are not one resonance: the peak nearest the prediction is
 *    taken for it and the others hold levels. The caller applies it only where the regime read
 *    is not shell filling.
 *
 * Example
 * -------
 * ```ts
 * // v1 at −1.77 V steps 0.40 pA; its resonance predicted at 2.841 V: peaks at 2.841 V (0.16 pA) and 2.854 V (0.39 pA).
 * const set = [{ index: 1, sourceIndex: 0, predictedV: 2.841 }, { index: 2, sourceIndex: 0, predictedV: 2.841 }];
 * crowdedResonances([{ biasV: -1.77, stepA: 0.4e-12 }, { biasV: 2.841, stepA: 0.16e-12 }, { biasV: 2.854, stepA: 0.39e-12 }], set).map((r) => r.index);  // => [2]
 * ```
 */
export function crowdedResonances(peaks: readonly Pick<Peak, "biasV" | "stepA">[], resonances: readonly SecondJunctionResonance[]): SecondJunctionResonance[] {
  const miss = (r: SecondJunctionResonance) => Math.abs(peaks[r.index].biasV - r.predictedV);
  const out: SecondJunctionResonance[] = [];
  for (const one of resonances) {
    const source = one.sourceIndex;
    // One prediction: the same source and predicted position (a companion or a deeper charging
    // resonance of the same source is another one). Each group once, from its nearest peak.
    const parts = resonances.filter((r) => r.sourceIndex === source && Math.abs(r.predictedV - one.predictedV) <= 1e-9 * Math.max(1, Math.abs(one.predictedV))).sort((a, b) => miss(a) - miss(b));
    if (parts[0] !== one) continue;
    const summedA = parts.reduce((sum, r) => sum + peaks[r.index].stepA, 0);
    if (parts.length < 2 || !(peaks[source].stepA > 0) || summedA < SECOND_JUNCTION_DEFAULTS.overlapSourceStepRatioMin * peaks[source].stepA) continue;
    out.push(...parts.slice(1));
  }
  return out;
}
