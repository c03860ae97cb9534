/**
 * From the peaks of one conductance curve to the assigned spectrum: regime, multiplets by
 * degeneracy, and the gap, charging energy and level spacings with uncertainties. The stages live
 * in their own modules; this one composes them.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { checkEta } from "../util/check.ts";
import { withValenceSpacedS } from "./valenceSpacedS.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import { assignWith } from "./assignWith.ts";
import { iterateResonances } from "./iterateResonances.ts";
import type { Multiplet } from "./multiplets.ts";
import type { NoLevels } from "./noLevels.ts";
import type { SpectrumQuantities, SpectrumUncertainties } from "./quantities.ts";
import type { SpectrumEnergies } from "./energies.ts";
import type { Regime, RegimeEvidence } from "./regime.ts";
import { secondJunctionResonances, type SecondJunctionResonance } from "./secondJunction.ts";
import { withoutOddValence } from "./oddValenceLevel.ts";
import { bandEdgeResonanceRatio, firstReading, underResonances, unforced, valenceDoublet, withoutExtraLevel, withoutOddLead, withSpinPairs } from "./substrateReadings.ts";

export { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
export type { Band } from "./bandPeaks.ts";
export type { EnergyValues, SpectrumEnergies } from "./energies.ts";
export type { Multiplet } from "./multiplets.ts";
export type { SpectrumQuantities, SpectrumUncertainties } from "./quantities.ts";
export type { Regime, RegimeEvidence } from "./regime.ts";
export { secondJunctionResonances, SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";

/** Options of {@link assignSpectrum}. */
export interface AssignOptions {
  /** Voltage-division factor η in (0, 1]. Default 1 (energies = bias values, noted in warnings). */
  eta?: number;
  /**
   * Force a regime instead of classifying; shell tunnelling given this way keeps every main CB
   * peak as a level (no charging peaks split off by a satellite's Ec). Default: classify.
   */
  regime?: Regime;
  /**
   * Set aside the peaks that are second-junction resonances of other peaks (needs η given and
   * below 1; see {@link secondJunctionResonances}). Default true.
   */
  secondJunction?: boolean;
}

/** Assigned spectrum of one curve. */
export interface Assignment {
  regime: Regime;
  evidence: RegimeEvidence;
  /** CB shells (s, p, …) then VB groups (v1, v2, …); each names its peaks by index in the peak list given. */
  multiplets: Multiplet[];
  quantities: SpectrumQuantities;
  uncertainties: SpectrumUncertainties;
  energies: SpectrumEnergies;
  /**
   * Set when the curve shows no dot levels ({@link noLevels}): the code and reason; then
   * `multiplets` is empty and every quantity null. Null otherwise (always null from
   * assignSpectrum itself: the decision needs the conductance, so `analyzeCurve` makes it).
   */
  noLevels: NoLevels | null;
  warnings: string[];
}

/**
 * Assign the peaks of one conductance curve.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peaks of one curve, ordered by ascending bias (positions `biasV` and 1σ
 *     `biasUncertaintyV` in V, current steps `stepA` in A). Multiplets and satellites name their
 *     peaks by index in this list.
 * options : AssignOptions, optional
 *     `eta` (η in (0, 1], default `ASSIGN_DEFAULTS.eta` = 1 with a warning), `regime` (force one
 *     instead of classifying).
 *
 * Returns
 * -------
 * Assignment
 *     Regime and its evidence, multiplets (with `peakIndices`), bias-referred quantities (V),
 *     their 1σ (V), energies (eV) and warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/out-of-range` (or another `options/*` code) for an η outside (0, 1].
 *
 * Notes
 * -----
 * With D = `ASSIGN_DEFAULTS`:
 * 1. Bands: CB peaks at positive bias, VB at negative, each from the gap edge outward
 *    (`bandPeaks`).
 * 2. Peaks whose step is below `D.noiseStepRatioMax` × the band's median step are noise and set
 *    aside; steps below `D.satelliteStepRatioMax` × the preceding main peak are charging
 *    satellites (`splitSatellites`), set aside in the VB always and in the CB outside shell
 *    filling.
 * 3. Regime from the first CB peaks (`regimeRatios`, `classifyRegime`), unless given.
 * 4. Shell filling: charging multiplets s, p, d (`fillingShells`); Ec = the common spacing of all
 *    groups by weighted least squares (`fitLadderSpacing`), sub-groups with their own
 *    intercepts; a shell short of its degeneracy takes a weak peak one Ec beyond its last
 *    (`completeShells`) and Ec is fitted again; a peak set aside as the s doublet's second
 *    peak's plain resonance that steps more than that resonance can (at most 0.4 × the first
 *    peak's resonance, `levelsAtDoubletResonance`) goes back to the ladder and steps 1–6 run
 *    again, if they still read shell filling. Shell tunnelling: one peak per level
 *    (`tunnelingShells`), an extra second CB peak that the regime rules read as no level set
 *    aside (`extraCbPeak`), and so is a first CB peak stepping less than half the next within
 *    one FWHM of it (`leadingShoulder`: a fragment of that peak, no level; not with a regime
 *    given); where a gap-edge level shows its charging satellite
 *    (`satelliteChargingEnergy`), their spacing is Ec and the CB peaks one Ec after the peak
 *    before them are charging peaks of that level (`levelChargingPeaks`).
 * 5. Valence groups (`valenceGroups`): charging multiplets within (1 ± `D.valenceChargingTolerance`)·Ec
 *    in shell filling, single levels otherwise; labels v1, v2, … from the gap edge. In shell
 *    filling a gap-edge group of one peak takes a peak set aside as a resonance one Ec nearer the
 *    gap as its first charging peak (`valenceEdgePartner`: spin puts two carriers on every level).
 * 6. Quantities and uncertainties (`spectrumQuantities`), energies = η × bias-referred values
 *    (`spectrumEnergies`).
 * 7. Second-junction resonances (η given, below 1): candidates from `secondJunctionResonances`
 *    are set aside for steps 1–6; then they are checked against the shell-filling reading
 *    (`confirmResonances`: one resonance per level, a candidate that fills a charging step is a
 *    level) and, where the tip side is not shell filling, the substrate side's second charging
 *    peak of a band-edge level is looked for (`substrateChargingPeaks`), and with its spacing
 *    Ec/(1 − η) the deeper levels' resonances k = 1, 2 spacings beyond their plain prediction
 *    that step like it (`deeperChargingResonances`); steps 1–6 run again
 *    with the resonances that stand, and the result is kept if its regime is consistent (shell
 *    filling after the check; the same or a newly named regime after the second). Where the
 *    band-edge resonances carry at least `D.fillingResonanceStepMin` × their levels' steps
 *    ((g·r + 1)/(g + r), `substrateToTipStepRatio`) the dot is in shell filling, and a candidate
 *    one VB doublet spacing above the first CB peak is the s doublet's second peak under a
 *    resonance (its step taken as r/(1 + r) of the first; where those resonances read weaker, if
 *    the VB's first main peaks read as a charging doublet, `valenceFillingDoublet`, whose second
 *    step is at least `D.valenceDoubletStepRatioMin` × the first, its step taken as that ratio of
 *    the first, and the reading standing too if the rules read it unasked after the rounds of
 *    note 8; the same for a hidden first peak); failing that, a candidate one spacing
 *    below it stepping at least 2 + `D.fillingStepRatio[0]` × its source (a doublet's resonance
 *    alone steps less than 2×) is the s doublet's first peak under a resonance (its step taken as
 *    (1 + r)/r of the first CB peak's), the shell-filling reading then standing if the rules read
 *    it unasked with the resonances its ladder predicts set aside (`iterateResonances`), or if
 *    the VB reads as a charging doublet (`valenceFillingDoublet`, as in note 8).
 * 8. Rounds from the ladder (η given, below 1): a shell-filling result predicts the resonance of
 *    every charging peak, η/(1 − η)·(|V| − N·Ec_V) (`ladderResonances`), keeps a peak there as a
 *    CB level where the ladder expects a charging peak its shell lacks, or as the VB's gap-edge
 *    level where that reads as one peak (spin puts two carriers on every level; `ladderLevels`),
 *    or two such peaks one Ec apart, clear of the ladder, where a shell lacks two (`ladderPairs`), and
 *    steps 1–6 run again with exactly those resonances set aside until nothing changes
 *    (`iterateResonances`; a round the rules do not read as shell filling is saved by setting
 *    aside again the first kept level that restores it). Where p then opens with an odd sub-group at a VB peak's predicted
 *    resonance (`oddLeadingLevel`; a VB peak set aside as a CB level's resonance predicts too),
 *    that peak is set aside if the rules still read shell filling with an even first sub-group. Where
 *    p is then not three pairs of charging peaks one Ec apart (spin puts two electrons on every
 *    orbital) and a resonance lies among the CB peaks beyond s, the six peaks that are three such
 *    pairs, every peak left out between them explained (`spinPairSet`), make p and steps 1–6 run
 *    again (`withSpinPairs`). Where a VB group then holds an odd number of peaks (every VB level
 *    holds two carriers per orbital), its peak nearest a CB level's predicted resonance, within
 *    the rounds' tolerance or a quarter of Ec times η/(1 − η) (`oddValenceResonance`), is set
 *    aside if the CB reading stays the same and fewer VB groups are odd (`withoutOddValence`). A result that is not shell filling is tried the same way from the
 *    shell-filling reading when its band-edge resonances carry at least
 *    `D.fillingResonanceStepMin` × their levels' steps, and kept if the rules then read shell
 *    filling unasked, or if the VB's first main peaks read as a charging doublet by the CB's own
 *    rule (`valenceFillingDoublet`: alike steps, then a jump of at least `D.fillingJumpRatioMin`
 *    × their spacing), the rounds then run under shell filling (resonances of the higher VB
 *    levels, N·Ec/(1 − η) nearer 0 V than the plain guess, can keep the CB ladder from reading
 *    it: the VB has none of its own), and its p is then read against an odd lead and as spin
 *    pairs like the first's (`oddLeadingLevel`, `spinPairSet`); otherwise a resonance stepping at
 *    least as much as its source goes back to the ladder as a level (`overlappedResonances`: (g·r + 1)/(g + r) < 1 for
 *    r < 1; so does one beside a nearer peak at the same prediction where the two step at least
 *    as much, `crowdedResonances`; not one with a peak that is no resonance within the smaller of their FWHMs: that
 *    peak is its level, split apart, the pair's summed step shared out by the split's fit; the
 *    farthest from its prediction first) where the regime stays the same, with a band-edge
 *    level's second charging peak through the substrate junction set aside too where that keeps
 *    the regime, or where the first reading named none and the second reads shell
 *    tunnelling with the VB's second step at least `D.tunnelingStepRatioMin` × its first (a VB
 *    level of more states: the VB, which no CB resonance touches, agrees). A shell-tunnelling
 *    reading gives back to the ladder a peak at the plain resonance of a level behind its band's
 *    edge level (`deeperPlainResonances`: the substrate side fills, so that resonance lies
 *    N·Ec/(1 − η) further out), if the rules still read shell tunnelling. A shell-tunnelling p
 *    then holding more than its three orbitals' levels sets aside its weakest peak where that
 *    steps like one carrier entering through the substrate junction (`substrateExtraLevel`),
 *    if the rules still read shell tunnelling.
 * 9. A shell-filling reading that the rules made unasked (η given, below 1) has its s doublet
 *    moved to the lowest CB pair one VB doublet spacing apart that starts below s and holds a
 *    peak set aside as a resonance (`withValenceSpacedS`: a VB edge level's resonance on an s
 *    charging peak hid it). Another reading is read again in shell filling where the VB's main
 *    peaks read as a charging doublet whose second step is at least
 *    `D.valenceDoubletStepRatioMin` × the first and, with the lowest pair of ladder CB peaks one
 *    VB doublet spacing apart kept as s, the rules read shell filling unasked with s there (s's
 *    second peak merged with, or weak beside, a resonance read the next peak as p); failing
 *    that, the reading held in shell filling from that pair stands where it is the whole ladder
 *    of the VB's spacing (s there with its second step at least `D.fillingStepRatio[0]` × its
 *    first, p's six charging peaks, the fitted Ec within 10 % of the VB doublet spacing).
 *
 * References
 * ----------
 * See the stage modules; Ec by weighted least squares: P. R. Bevington and D. K. Robinson, Data
 * Reduction and Error Analysis for the Physical Sciences, 3rd ed. (McGraw-Hill, 2003), ch. 6.
 *
 * Example
 * -------
 * ```ts
 * // ε_s = 0.5 eV, ε_p = 0.8 eV, ε_v = −0.6 eV, Ec = 0.1 eV, η = 0.8: peaks at ±(|ε| + Ec(n + ½))/η.
 * const peak = (biasV: number): Peak => ({ biasV, biasUncertaintyV: 0.001, index: 0, heightS: 1e-9,
 *   prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30 });
 * const a = assignSpectrum([-0.9375, -0.8125, 0.6875, 0.8125, 1.3125, 1.4375].map(peak), { eta: 0.8 });
 * a.regime;                                   // => "shell-filling"
 * a.multiplets.map((m) => m.peakIndices);     // => [[2, 3], [4, 5], [1, 0]]
 * a.energies.chargingEnergyEV;                // => 0.1
 * ```
 */
export function assignSpectrum(peaks: readonly Peak[], options: AssignOptions = {}): Assignment {
  return withValenceSpacedS(peaks, readingWithResonances(peaks, options), options);
}

/**
 * Notes 1–8 of {@link assignSpectrum}: its reading before the s doublet is placed against the VB
 * doublet (note 9). Not part of the public API; exported for the tests of that step.
 */
export function readingWithResonances(peaks: readonly Peak[], options: AssignOptions): Assignment {
  const D = ASSIGN_DEFAULTS;
  const etaGiven = options.eta !== undefined;
  const eta = etaGiven ? checkEta("eta", options.eta) : D.eta;
  const resonances = etaGiven && eta < 1 && (options.secondJunction ?? D.secondJunction);
  // The plain −η·V/(1 − η) candidates: the first reading's guess, and the shell-filling one's below.
  const plain = resonances ? secondJunctionResonances(peaks, eta) : [];
  const first = firstReading(peaks, eta, etaGiven, plain, options);
  if (!resonances) return first;
  // A shell-filling ladder predicts its own resonances: assign → predict → set aside → assign.
  const again = (adjusted: readonly Peak[], r: readonly SecondJunctionResonance[]) => assignWith(adjusted, eta, etaGiven, r, options);
  if (first.regime === "shell-filling" || options.regime) return withoutOddValence(peaks, eta, etaGiven, withSpinPairs(peaks, eta, etaGiven, withoutOddLead(peaks, eta, etaGiven, iterateResonances(peaks, first, eta, again), options, true), options), options);
  // Another reading: the shell-filling one stands if the band-edge resonances are as strong as
  // shell filling makes them and, with the resonances its own ladder predicts set aside, the
  // rules read shell filling unasked (resonances counted as levels can hide it).
  const edge = bandEdgeResonanceRatio(peaks, plain);
  if (edge === null || edge.ratio < D.fillingResonanceStepMin) return withoutExtraLevel(peaks, eta, etaGiven, underResonances(peaks, eta, etaGiven, first, options), options);
  const forced = assignWith(peaks, eta, etaGiven, plain, { ...options, regime: "shell-filling" });
  const rounds = iterateResonances(peaks, forced, eta, again);
  const filling = rounds === forced ? forced : withoutOddLead(peaks, eta, etaGiven, rounds, { ...options, regime: undefined }, true);
  if (filling === forced) {
    // The VB's charging doublet reads shell filling: its p is checked as in the rounds' reading.
    const doublet = valenceDoublet(peaks, eta, etaGiven, forced, first, options);
    if (doublet) return withoutOddValence(peaks, eta, etaGiven, withSpinPairs(peaks, eta, etaGiven, withoutOddLead(peaks, eta, etaGiven, doublet, options, true), options), options);
    return withoutExtraLevel(peaks, eta, etaGiven, underResonances(peaks, eta, etaGiven, first, options), options);
  }
  // The rounds carry the forced reading's conclusions; the regime was not the user's.
  unforced(filling);
  filling.evidence.reasons.unshift(`read as shell filling: with the second-junction resonances that its ladder predicts set aside, the rules read shell filling (the first reading, ${first.regime}, counted resonances as levels)`);
  return withoutOddValence(peaks, eta, etaGiven, withSpinPairs(peaks, eta, etaGiven, filling, options), options);
}
