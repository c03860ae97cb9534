/**
 * From the peaks of one conductance curve to the assigned spectrum: regime, multiplets by
 * degeneracy, and the gap, charging energy and level spacings with uncertainties. The stages live
 * in their own modules; this one composes them.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { checkEta } from "../util/check.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import { bandPeaks, type BandPeak } from "./bandPeaks.ts";
import { spectrumEnergies, type SpectrumEnergies } from "./energies.ts";
import { fitLadderSpacing } from "./ladderFit.ts";
import { shellMultiplets, valenceMultiplets, type Multiplet } from "./multiplets.ts";
import { spectrumQuantities, type SpectrumQuantities, type SpectrumUncertainties } from "./quantities.ts";
import { classifyRegime, extraCbPeak, regimeRatios, valenceFillingDoublet, type Regime, type RegimeEvidence } from "./regime.ts";
import { splitSatellites } from "./satellites.ts";
import { isPlainPrediction, overlappedResonances, secondJunctionResonances, substrateChargingPeaks, type SecondJunctionResonance } from "./secondJunction.ts";
import { confirmResonances } from "./confirmResonances.ts";
import { earlierReasons, iterateResonances } from "./iterateResonances.ts";
import { completeShells, fillingShells, tunnelingShells } from "./shells.ts";
import { levelChargingPeaks, satelliteChargingEnergy } from "./levelCharging.ts";
import { valenceGroups } from "./valenceGroups.ts";
import { oddLeadingLevel } from "./oddLeadingLevel.ts";
import { deeperPlainResonances, substrateExtraLevel, SUBSTRATE_EXTRA_LEVEL_DEFAULTS } from "./substrateExtraLevel.ts";
import type { NoLevels } from "./noLevels.ts";

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
 *    (`completeShells`) and Ec is fitted again. Shell tunnelling: one peak per level
 *    (`tunnelingShells`), an extra second CB peak that the regime rules read as no level set
 *    aside (`extraCbPeak`); where a gap-edge level shows its charging satellite
 *    (`satelliteChargingEnergy`), their spacing is Ec and the CB peaks one Ec after the peak
 *    before them are charging peaks of that level (`levelChargingPeaks`).
 * 5. Valence groups (`valenceGroups`): charging multiplets within (1 ± `D.valenceChargingTolerance`)·Ec
 *    in shell filling, single levels otherwise; labels v1, v2, … from the gap edge.
 * 6. Quantities and uncertainties (`spectrumQuantities`), energies = η × bias-referred values
 *    (`spectrumEnergies`).
 * 7. Second-junction resonances (η given, below 1): candidates from `secondJunctionResonances`
 *    are set aside for steps 1–6; then they are checked against the shell-filling reading
 *    (`confirmResonances`: one resonance per level, a candidate that fills a charging step is a
 *    level) and, where the tip side is not shell filling, the substrate side's second charging
 *    peak of a band-edge level is looked for (`substrateChargingPeaks`); steps 1–6 run again
 *    with the resonances that stand, and the result is kept if its regime is consistent (shell
 *    filling after the check; the same or a newly named regime after the second). Where the
 *    band-edge resonances carry at least `D.fillingResonanceStepMin` × their levels' steps
 *    ((g·r + 1)/(g + r), `substrateToTipStepRatio`) the dot is in shell filling, and a candidate
 *    one VB doublet spacing above the first CB peak is the s doublet's second peak under a
 *    resonance (its step taken as r/(1 + r) of the first); failing that, a candidate one spacing
 *    below it stepping at least 2 + `D.fillingStepRatio[0]` × its source (a doublet's resonance
 *    alone steps less than 2×) is the s doublet's first peak under a resonance (its step taken as
 *    (1 + r)/r of the first CB peak's), the shell-filling reading then standing if the rules read
 *    it unasked with the resonances its ladder predicts set aside (`iterateResonances`), or if
 *    the VB reads as a charging doublet (`valenceFillingDoublet`, as in note 8).
 * 8. Rounds from the ladder (η given, below 1): a shell-filling result predicts the resonance of
 *    every charging peak, η/(1 − η)·(|V| − N·Ec_V) (`ladderResonances`), keeps a peak there as a
 *    CB level where the ladder expects a charging peak its shell lacks (`ladderLevels`), and
 *    steps 1–6 run again with exactly those resonances set aside until nothing changes
 *    (`iterateResonances`). Where p then opens with an odd sub-group at a VB peak's predicted
 *    resonance (`oddLeadingLevel`; a VB peak set aside as a CB level's resonance predicts too),
 *    that peak is set aside if the rules still read shell filling with an even first sub-group. A result that is not shell filling is tried the same way from the
 *    shell-filling reading when its band-edge resonances carry at least
 *    `D.fillingResonanceStepMin` × their levels' steps, and kept if the rules then read shell
 *    filling unasked, or if the VB's first main peaks read as a charging doublet by the CB's own
 *    rule (`valenceFillingDoublet`: alike steps, then a jump of at least `D.fillingJumpRatioMin`
 *    × their spacing), the rounds then run under shell filling (resonances of the higher VB
 *    levels, N·Ec/(1 − η) nearer 0 V than the plain guess, can keep the CB ladder from reading
 *    it: the VB has none of its own); otherwise a resonance stepping at least as much as its
 *    source goes back to the ladder as a level (`overlappedResonances`: (g·r + 1)/(g + r) < 1 for
 *    r < 1; not one with a peak that is no resonance within the smaller of their FWHMs: that
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
  if (first.regime === "shell-filling" || options.regime) return withoutOddLead(peaks, eta, etaGiven, iterateResonances(peaks, first, eta, again), options, true);
  // Another reading: the shell-filling one stands if the band-edge resonances are as strong as
  // shell filling makes them and, with the resonances its own ladder predicts set aside, the
  // rules read shell filling unasked (resonances counted as levels can hide it).
  const edge = bandEdgeResonanceRatio(peaks, plain);
  if (edge === null || edge.ratio < D.fillingResonanceStepMin) return withoutExtraLevel(peaks, eta, etaGiven, underResonances(peaks, eta, etaGiven, first, options), options);
  const forced = assignWith(peaks, eta, etaGiven, plain, { ...options, regime: "shell-filling" });
  const rounds = iterateResonances(peaks, forced, eta, again);
  const filling = rounds === forced ? forced : withoutOddLead(peaks, eta, etaGiven, rounds, { ...options, regime: undefined }, true);
  if (filling === forced) return valenceDoublet(peaks, eta, etaGiven, forced, first, options) ?? withoutExtraLevel(peaks, eta, etaGiven, underResonances(peaks, eta, etaGiven, first, options), options);
  // The rounds carry the forced reading's conclusions; the regime was not the user's.
  unforced(filling);
  filling.evidence.reasons.unshift(`read as shell filling: with the second-junction resonances that its ladder predicts set aside, the rules read shell filling (the first reading, ${first.regime}, counted resonances as levels)`);
  return filling;
}

/**
 * Shell filling where the band-edge resonances say so and the VB reads as a charging doublet
 * (`valenceFillingDoublet`) but the CB, with the resonances its ladder predicts set aside, does
 * not (notes 7 and 8 of `assignSpectrum`): the shell-filling reading from `forced` with the
 * rounds of `iterateResonances` run under that regime; null when the VB does not read so.
 */
function valenceDoublet(peaks: readonly Peak[], eta: number, etaGiven: boolean, forced: Assignment, first: Assignment, options: AssignOptions): Assignment | null {
  // The first reading is not shell filling, so each of its VB groups is one main peak.
  const vb = first.multiplets
    .filter((m) => m.band === "VB")
    .flatMap((m) => m.peakIndices)
    .map((index) => ({ peak: peaks[index], x: -peaks[index].biasV, index }))
    .sort((a, b) => a.x - b.x);
  const doublet = valenceFillingDoublet(vb);
  if (doublet === null) return null;
  const regime = "shell-filling";
  const out = iterateResonances(peaks, forced, eta, (p, r) => assignWith(p, eta, etaGiven, r, { ...options, regime }));
  unforced(out);
  out.evidence.reasons.unshift(
    `read as shell filling: the band-edge resonances carry at least ${ASSIGN_DEFAULTS.fillingResonanceStepMin.toFixed(2)} × their levels' steps and the VB's first two main peaks step alike (ratio ${doublet.stepRatio.toFixed(2)} within ${ASSIGN_DEFAULTS.fillingStepRatio.join("–")}) with a jump of ${doublet.jumpRatio.toFixed(2)} × their spacing to the next (≥ ${ASSIGN_DEFAULTS.fillingJumpRatioMin}): a charging doublet; the CB ladder (the first reading, ${first.regime}) holds resonances of VB levels that its own prediction misses`,
  );
  return out;
}

/** The assignment with the plain −η·V/(1 − η) candidates as the first guess of the resonances (steps 1–7). */
function firstReading(peaks: readonly Peak[], eta: number, etaGiven: boolean, candidates: readonly SecondJunctionResonance[], options: AssignOptions): Assignment {
  // Resonances through the substrate junction are not levels of the tip-junction ladder; the
  // candidates are checked against an assignment made without them.
  const first = assignWith(peaks, eta, etaGiven, candidates, options);
  if (!candidates.length) return first;
  const filling = fillingResonances(peaks, eta, etaGiven, candidates, first, options) ?? hiddenDoublet(peaks, eta, etaGiven, candidates, first, options);
  if (filling) return filling;
  if (first.regime === "shell-filling" || options.regime) return first;
  // Where the tip side is not shell filling, the substrate side may fill: the resonance of a
  // band's first level is then a charging doublet. The second peak goes too, if that leaves a
  // regime the rules can name (and the same one, when they named one before).
  const companions = substrateChargingPeaks(peaks, candidates, eta, ASSIGN_DEFAULTS.fillingStepRatio);
  if (!companions.length) return first;
  const third = assignWith(peaks, eta, etaGiven, [...candidates, ...companions], options);
  if (third.regime === "undetermined" || (first.regime !== "undetermined" && third.regime !== first.regime)) return first;
  third.evidence.reasons.unshift(...companionReasons(peaks, companions));
  return third;
}

/** The reasons of the substrate side's second charging peaks set aside (`substrateChargingPeaks`). */
function companionReasons(peaks: readonly Peak[], companions: readonly SecondJunctionResonance[]): string[] {
  return companions.map((c) => `peak at ${peaks[c.index].biasV.toFixed(3)} V set aside: the second charging peak, through the substrate junction, of the level at ${peaks[c.sourceIndex].biasV.toFixed(3)} V (the substrate side fills where the tip side tunnels)`);
}

/**
 * A shell-filling reading whose p opens with an odd sub-group at a VB peak's predicted resonance
 * (`oddLeadingLevel`): that peak is set aside and the rules run again; the result stands if it is
 * still shell filling and p's first sub-group is then even.
 */
function withoutOddLead(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions, forced = false): Assignment {
  if (a.regime !== "shell-filling" || options.regime || a.quantities.chargingEnergyV === null) return a;
  const lead = oddLeadingLevel(peaks, a.multiplets, a.evidence.secondJunction, a.quantities.chargingEnergyV, eta);
  if (!lead) return a;
  // A reading the rounds made from the forced shell-filling one is read again under it.
  const next = assignWith(peaks, eta, etaGiven, [...a.evidence.secondJunction.filter((r) => r.index !== lead.index), lead], forced ? { ...options, regime: "shell-filling" } : options);
  // The regime was the rules' reading, not the user's.
  if (forced) unforced(next);
  const p = next.multiplets.find((m) => m.band === "CB" && m.label === "p");
  if (next.regime !== "shell-filling" || !p || (p.subgroups[0] ?? p.peakIndices.length) % 2 !== 0) return a;
  const earlier = a.evidence.reasons.filter((r) => !next.evidence.reasons.includes(r) && !r.startsWith("the first two CB steps"));
  next.evidence.reasons.unshift(
    ...earlier,
    `peak at ${peaks[lead.index].biasV.toFixed(3)} V set aside: it opened p with an odd sub-group or a ladder of more than six (each p orbital holds two electrons) and lies at the second-junction resonance of the peak at ${peaks[lead.sourceIndex].biasV.toFixed(3)} V (expected at ${lead.predictedV.toFixed(3)} V)`,
  );
  return next;
}

/**
 * A shell-tunnelling reading with the peaks at the plain resonance of a deeper level given back
 * to the ladder (`deeperPlainResonances`), if the rules still read shell tunnelling.
 */
function withDeeperLevels(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions): Assignment {
  const set = a.evidence.secondJunction;
  const back = deeperPlainResonances(peaks, set, eta);
  if (!back.length) return a;
  const next = assignWith(peaks, eta, etaGiven, set.filter((r) => !back.includes(r)), options);
  if (next.regime !== "shell-tunneling") return a;
  const earlier = earlierReasons(a, next);
  next.evidence.reasons.unshift(
    ...back.map((r) => `peak at ${peaks[r.index].biasV.toFixed(3)} V kept as a level: the plain resonance of the peak at ${peaks[r.sourceIndex].biasV.toFixed(3)} V, a level behind its band's edge level, has no step where the substrate side fills (it lies N·Ec/(1 − η) further out)`),
    ...earlier,
    ...a.evidence.reasons.filter((r) => /^peak at .* (kept as a level|set aside: the second charging peak)/.test(r) && !next.evidence.reasons.includes(r)),
  );
  return next;
}

/**
 * A shell-tunnelling p with more levels than orbitals: its weak extra peak, a charging peak
 * through the substrate junction (`substrateExtraLevel`), is set aside; the result stands if it
 * is still shell tunnelling.
 */
function withoutExtraLevel(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions): Assignment {
  if (a.regime !== "shell-tunneling" || options.regime) return a;
  a = withDeeperLevels(peaks, eta, etaGiven, a, options);
  const extra = substrateExtraLevel(peaks, a.multiplets, eta);
  if (!extra) return a;
  const next = assignWith(peaks, eta, etaGiven, [...a.evidence.secondJunction, extra], options);
  if (next.regime !== "shell-tunneling") return a;
  const earlier = earlierReasons(a, next);
  const keptLevels = a.evidence.reasons.filter((r) => / kept as a level: /.test(r));
  next.evidence.reasons.unshift(
    `peak at ${peaks[extra.index].biasV.toFixed(3)} V set aside: p held more levels than its three orbitals, and this one steps like a single carrier entering through the substrate junction (at most ${SUBSTRATE_EXTRA_LEVEL_DEFAULTS.stepRatioMax.toFixed(2)} × the other p levels and the VB edge level at ${peaks[extra.sourceIndex].biasV.toFixed(3)} V), beyond that level's resonance`,
    ...earlier,
    ...keptLevels,
  );
  return next;
}

/**
 * Where the tip side is not shell filling: the resonances that step at least as much as their
 * sources (`overlappedResonances`) go back to the ladder as levels; the result stands if it names
 * the same regime, or shell tunnelling where the first named none and the VB's second step is at
 * least `ASSIGN_DEFAULTS.tunnelingStepRatioMin` × its first (its levels, untouched by the CB
 * resonances, say shell tunnelling too). A shared p peak set aside as a resonance leaves s and
 * an unpredicted resonance stepping in the intermediate band, so the first reading names none.
 */
function underResonances(peaks: readonly Peak[], eta: number, etaGiven: boolean, first: Assignment, options: AssignOptions): Assignment {
  const set = first.evidence.secondJunction;
  const under = levelsUnder(peaks, set);
  if (!under.length) return first;
  const kept = set.filter((r) => !under.includes(r));
  const second = assignWith(peaks, eta, etaGiven, kept, options);
  // Where the first reading named no regime, shell tunnelling stands if the VB shows it too.
  const opened = first.regime === "undetermined" && second.regime === "shell-tunneling" && (second.evidence.valenceStepRatio ?? 0) >= ASSIGN_DEFAULTS.tunnelingStepRatioMin;
  if (second.regime !== first.regime && !opened) return first;
  // With those levels back, a band-edge level's second charging peak through the substrate junction
  // goes too where the regime stays (set aside with every resonance, it left too few CB peaks to
  // name one).
  const companions = substrateChargingPeaks(peaks, set, eta, ASSIGN_DEFAULTS.fillingStepRatio).filter((c) => !set.some((r) => r.index === c.index));
  const third = companions.length ? assignWith(peaks, eta, etaGiven, [...kept, ...companions], options) : null;
  const result = third && third.regime === second.regime ? third : second;
  result.evidence.reasons.unshift(
    ...(result === third ? companionReasons(peaks, companions) : []),
    ...under.map((r) => `peak at ${peaks[r.index].biasV.toFixed(3)} V kept as a level: it steps ${(peaks[r.index].stepA / peaks[r.sourceIndex].stepA).toFixed(2)} × the peak at ${peaks[r.sourceIndex].biasV.toFixed(3)} V whose resonance it overlaps (a resonance alone steps less than its source where the tip side does not fill the dot)`),
  );
  return result;
}

/**
 * The resonances that go back to the ladder as levels (`overlappedResonances`), except one with a
 * peak that is no resonance (or one released before it) within the smaller of their FWHMs (a
 * merged peak's own width would reach the next level): that peak is the level,
 * found apart, and the summed step was shared out between the two by the split's fit. Those
 * farthest from their predicted positions go first.
 */
function levelsUnder(peaks: readonly Peak[], set: readonly SecondJunctionResonance[]): SecondJunctionResonance[] {
  const miss = (r: SecondJunctionResonance) => Math.abs(peaks[r.index].biasV - r.predictedV);
  const resonant = new Set(set.map((r) => r.index));
  const released: SecondJunctionResonance[] = [];
  for (const r of [...overlappedResonances(peaks, set)].sort((a, b) => miss(b) - miss(a))) {
    const p = peaks[r.index];
    const levelBeside = peaks.some((q, i) => i !== r.index && Math.sign(q.biasV) === Math.sign(p.biasV) && Math.abs(q.biasV - p.biasV) <= Math.min(p.fwhmV, q.fwhmV) && !resonant.has(i));
    if (levelBeside) continue;
    released.push(r);
    resonant.delete(r.index);
  }
  return released;
}

/**
 * The assignment with the resonances of a shell-filling reading (see `confirmResonances`), or null
 * when that reading changes nothing or does not give shell filling.
 */
function fillingResonances(peaks: readonly Peak[], eta: number, etaGiven: boolean, candidates: readonly SecondJunctionResonance[], first: Assignment, options: AssignOptions): Assignment | null {
  // Check the candidates against the first assignment, or, when that is not shell filling, against
  // the shell-filling reading (a resonance on an s peak hides the doublet); the result stands only
  // if the regime it gives is shell filling.
  const basis = first.regime === "shell-filling" || options.regime ? first : assignWith(peaks, eta, etaGiven, candidates, { ...options, regime: "shell-filling" });
  const { kept, released } = confirmResonances(candidates, peaks, { regime: basis.regime, multiplets: basis.multiplets, chargingEnergyV: basis.quantities.chargingEnergyV, eta });
  const same = kept.length === candidates.length && kept.every((k) => candidates.some((c) => c.index === k.index));
  if (same) return null;
  // A level that a resonance overlaps keeps its own share of the summed step.
  const share = new Map(released.filter((r) => r.levelStepA !== null).map((r) => [r.resonance.index, r.levelStepA!]));
  const adjusted = share.size ? peaks.map((p, i) => (share.has(i) ? { ...p, stepA: share.get(i)! } : p)) : peaks;
  const second = assignWith(adjusted, eta, etaGiven, kept, options);
  if (second.regime !== "shell-filling") return null;
  second.evidence.reasons.unshift(...released.map((r) => r.reason));
  return second;
}

/**
 * Shell filling read from the height of a band-edge level's resonance, where a resonance hides the
 * s doublet's second peak or its first (note 7 of `assignSpectrum`); null when the heights do not
 * say shell filling or the reading fails.
 */
function hiddenDoublet(peaks: readonly Peak[], eta: number, etaGiven: boolean, candidates: readonly SecondJunctionResonance[], first: Assignment, options: AssignOptions): Assignment | null {
  if (first.regime === "shell-filling" || options.regime) return null;
  const edge = bandEdgeResonanceRatio(peaks, candidates);
  if (edge === null || edge.ratio < ASSIGN_DEFAULTS.fillingResonanceStepMin) return null;
  // Ec from the VB doublet (the gap-edge pair of VB peaks that are not resonances).
  const taken = new Set(candidates.map((c) => c.index));
  const vb = peaks.map((p, i) => ({ p, i })).filter(({ p, i }) => p.biasV < 0 && !taken.has(i)).sort((a, b) => b.p.biasV - a.p.biasV);
  const cb = peaks.map((p, i) => ({ p, i })).filter(({ p, i }) => p.biasV > 0 && !taken.has(i)).sort((a, b) => a.p.biasV - b.p.biasV);
  if (vb.length < 2 || !cb.length) return null;
  const ecV = vb[0].p.biasV - vb[1].p.biasV;
  const tol = ASSIGN_DEFAULTS.valenceChargingTolerance * ecV;
  const near = (v: number) => candidates.find((c) => Math.abs(peaks[c.index].biasV - v) <= tol);
  // The s doublet's second peak one Ec above the first CB peak, else its first one Ec below it.
  const second = near(cb[0].p.biasV + ecV);
  const hidden = second ?? (cb[0].p.biasV - ecV > 0 ? near(cb[0].p.biasV - ecV) : undefined);
  if (!hidden) return null;
  // Below the first CB peak, the resonance of a doublet alone steps less than 2 × its source
  // ((2r + 1)/(2 + r) < 2); a charging step under it adds at least the least filling step ratio.
  if (!second && peaks[hidden.index].stepA < (2 + ASSIGN_DEFAULTS.fillingStepRatio[0]) * peaks[hidden.sourceIndex].stepA) return null;
  const hiddenStepA = second ? peaks[cb[0].i].stepA * edge.doubletStepRatio : peaks[cb[0].i].stepA / edge.doubletStepRatio;
  const adjusted = peaks.map((p, i) => (i === hidden.index ? { ...p, stepA: hiddenStepA } : p));
  const rest = candidates.filter((c) => c !== hidden);
  let out = assignWith(adjusted, eta, etaGiven, rest, options);
  if (out.regime !== "shell-filling" && !second) {
    // A hidden first peak leaves the resonances of the higher VB levels in the CB ladder: the
    // shell-filling reading stands if, with those its ladder predicts set aside, the rules read it
    // unasked, or if the VB reads as a charging doublet (its own ladder has no such resonances).
    const forced = assignWith(adjusted, eta, etaGiven, rest, { ...options, regime: "shell-filling" });
    out = iterateResonances(adjusted, forced, eta, (p, r) => assignWith(p, eta, etaGiven, r, options));
    if (out === forced) out = valenceDoublet(adjusted, eta, etaGiven, forced, first, options) ?? forced;
    if (out === forced) return null;
    unforced(out);
  }
  if (out.regime !== "shell-filling") return null;
  out.evidence.reasons.unshift(
    `the resonance of the band-edge level at ${peaks[edge.sourceIndex].biasV.toFixed(3)} V carries ${edge.ratio.toFixed(2)} × its step (≥ ${ASSIGN_DEFAULTS.fillingResonanceStepMin.toFixed(2)}, (g·r + 1)/(g + r) for g = 2 at r = 3, twice the filling limit): shell filling; the peak at ${peaks[hidden.index].biasV.toFixed(3)} V, one VB doublet spacing ${second ? "above" : "below"} the first CB peak, is kept as the s doublet's ${second ? "second" : "first"} peak (the resonance at ${hidden.predictedV.toFixed(3)} V overlaps it)`,
  );
  return out;
}

/**
 * The smallest step ratio of a resonance over its source among the sources that are their band's
 * gap-edge peak (an overlapping peak only adds to a resonance's step, so the smallest is the
 * safest reading).
 */
function bandEdgeResonanceRatio(peaks: readonly Peak[], candidates: readonly SecondJunctionResonance[]): { ratio: number; sourceIndex: number; doubletStepRatio: number } | null {
  const taken = new Set(candidates.map((c) => c.index));
  const edgeOf = (sign: number) => {
    let best = -1;
    peaks.forEach((p, i) => {
      if (taken.has(i) || Math.sign(p.biasV) !== sign) return;
      if (best < 0 || Math.abs(p.biasV) < Math.abs(peaks[best].biasV)) best = i;
    });
    return best;
  };
  const edges = new Set([edgeOf(1), edgeOf(-1)]);
  let out: { ratio: number; sourceIndex: number; doubletStepRatio: number } | null = null;
  for (const c of candidates) {
    if (!edges.has(c.sourceIndex)) continue;
    const ratio = peaks[c.index].stepA / peaks[c.sourceIndex].stepA;
    // The resonance of a doubly degenerate level carries (2r + 1)/(2 + r) of its first step; solved
    // for r, the s doublet's second step is r/(1 + r) of the first.
    const r = ratio < 2 ? (2 * ratio - 1) / (2 - ratio) : Infinity;
    if (!out || ratio < out.ratio) out = { ratio, sourceIndex: c.sourceIndex, doubletStepRatio: Number.isFinite(r) ? r / (1 + r) : 1 };
  }
  return out;
}

/**
 * Drop the note that the user gave the regime from a reading the rules forced to shell filling
 * and then kept (in place): the regime was not the user's.
 */
function unforced(a: Assignment): void {
  a.evidence.reasons = a.evidence.reasons.filter((r) => !r.startsWith("regime shell-filling given by the user"));
}

/** The assignment with the given peaks set aside as second-junction resonances. */
function assignWith(peaks: readonly Peak[], eta: number, etaGiven: boolean, resonances: readonly SecondJunctionResonance[], options: AssignOptions): Assignment {
  const D = ASSIGN_DEFAULTS;
  const warnings: string[] = [];
  if (!etaGiven) warnings.push("eta not given: energies equal the bias-referred values (η = 1); pass the voltage-division factor to convert");

  // 1–2. Bands; peaks at the noise level of their band go first; charging satellites (weak peaks
  // after a main peak) are told apart only once the regime is known.
  const resonant = new Set(resonances.map((r) => r.index));
  const bands = bandPeaks(peaks);
  const cbAll = bands.cb.filter((p) => !resonant.has(p.index));
  const vbAll = bands.vb.filter((p) => !resonant.has(p.index));
  const cbNoise = splitSatellites(cbAll, D.noiseStepRatioMax, 0);
  const vbNoise = splitSatellites(vbAll, D.noiseStepRatioMax, 0);
  const cbClean = cbNoise.main;
  const cbSplit = splitSatellites(cbClean, 0, D.satelliteStepRatioMax);
  const vbSplit = splitSatellites(vbNoise.main, 0, D.satelliteStepRatioMax);
  const vb = vbSplit.main;

  // 3. Regime.
  const evidence: RegimeEvidence = { ...regimeRatios(cbClean, vb), satellitePeaksV: [], satellitePeakIndices: [], secondJunction: [...resonances], reasons: [] };
  const gain = eta < 1 ? eta / (1 - eta) : 0;
  for (const r of resonances) {
    const at = peaks[r.index].biasV.toFixed(3), source = peaks[r.sourceIndex].biasV;
    const plain = isPlainPrediction(r, source, gain);
    evidence.reasons.push(
      plain
        ? `peak at ${at} V set aside: the second-junction resonance −η·V/(1 − η) = ${r.predictedV.toFixed(3)} V of the peak at ${source.toFixed(3)} V`
        : `peak at ${at} V set aside: a second-junction resonance of the level whose first peak is at ${source.toFixed(3)} V (expected at ${r.predictedV.toFixed(3)} V)`,
    );
  }
  const regime: Regime = options.regime ?? classifyRegime(cbClean, cbSplit.main, evidence);
  const cb = regime === "shell-filling" ? cbClean : cbSplit.main;
  let setAside: BandPeak[] = [...cbNoise.satellites, ...vbNoise.satellites, ...vbSplit.satellites, ...(regime === "shell-filling" ? [] : cbSplit.satellites)];
  if (options.regime) evidence.reasons.push(`regime ${options.regime} given by the user`);

  // 4. CB shells and Ec.
  let ecV: number | null = null;
  let ecSE: number | null = null;
  const cbGroups: BandPeak[][][] = []; // per shell: its sub-groups
  if (regime === "shell-filling") {
    const built = fillingShells(cb);
    if (built.offLadder.length) {
      setAside = [...setAside, ...built.offLadder];
      evidence.reasons.push(`${built.offLadder.length} CB peak(s) closer than ${D.minLadderSpacingFraction} × Ec to the previous charging peak set aside`);
    }
    const ladderFit = (shells: BandPeak[][][]) =>
      fitLadderSpacing(shells.flat().map((g) => ({ positionsV: g.map((p) => p.x), sigmasV: g.map((p) => p.peak.biasUncertaintyV) })));
    let shells = built.shells;
    let fit = ladderFit(shells);
    // The last charging peaks of a shell near the filling limit fall below the noise rule.
    const completed = fit ? completeShells(shells, cbNoise.satellites, fit.spacingV) : null;
    if (completed?.added.length) {
      shells = completed.shells;
      fit = ladderFit(shells);
      setAside = setAside.filter((p) => !completed.added.includes(p));
      evidence.reasons.push(`${completed.added.length} weak CB peak(s) one Ec beyond a shell's last peak taken as its next charging peak(s)`);
    }
    cbGroups.push(...shells);
    if (fit) {
      ecV = fit.spacingV;
      ecSE = fit.spacingSEV;
    }
    if (built.leftover.length) warnings.push(`${built.leftover.length} CB peak(s) beyond the assigned shells were left unassigned`);
  } else if (regime === "shell-tunneling") {
    // Near the crossover a level charges; a charging satellite of a gap-edge level gives Ec. Not
    // with a regime given: that asks for single levels (the model fit's single-level hypothesis).
    const satelliteEc = options.regime ? null : satelliteChargingEnergy([cbSplit, vbSplit]);
    // An extra peak between s and p that the rules read as no level (`extraCbPeak`) goes the way
    // of a weaker one, which is a charging satellite of s.
    const extra = options.regime ? null : extraCbPeak(cbClean, evidence);
    const tip = extra && cb.includes(extra) ? cb.filter((p) => p !== extra) : cb;
    if (tip !== cb) {
      setAside = [...setAside, extra!];
      evidence.reasons.push(`CB peak at ${extra!.peak.biasV.toFixed(3)} V set aside: the extra peak between s and p, no level of the ladder`);
    }
    let levels = tip;
    if (satelliteEc !== null) {
      ecV = satelliteEc.chargingEnergyV;
      ecSE = satelliteEc.sigmaV;
      const split = levelChargingPeaks(tip, ecV);
      if (split.charging.length) {
        levels = split.levels;
        setAside = [...setAside, ...split.charging];
        evidence.reasons.push(`${split.charging.length} CB peak(s) one Ec (${ecV.toFixed(3)} V, from a charging satellite) after the peak before them set aside as charging peaks of that level`);
      }
    }
    // Deep in the regime (no CB charging satellite of 0.1 × the s step: Γtip/Γsub ≤ 1/9) p's steps
    // tell a split p from a whole one.
    const deep = levels.length > 0 && !cbSplit.satellites.some((p) => p.peak.stepA >= D.tunnelingDeepSatelliteMax * levels[0].peak.stepA);
    cbGroups.push(...tunnelingShells(levels, deep).map((shell) => shell.map((p) => [p])));
  }
  const satellites = [...setAside].sort((a, b) => a.peak.biasV - b.peak.biasV);
  evidence.satellitePeaksV = satellites.map((p) => p.peak.biasV);
  evidence.satellitePeakIndices = satellites.map((p) => p.index);

  // 5. Multiplets: CB shells, then VB groups.
  const vbGroups = valenceGroups(vb, ecV, regime);
  const multiplets: Multiplet[] = [...shellMultiplets(cbGroups, regime, warnings), ...valenceMultiplets(vbGroups)];

  // 6. Quantities and energies.
  const { quantities, uncertainties } = spectrumQuantities({ regime, cb, vb, cbGroups, vbGroups, chargingEnergyV: ecV, chargingEnergySEV: ecSE }, warnings);
  if (regime === "shell-tunneling") {
    warnings.push(
      ecV === null
        ? "shell tunnelling: Ec is not measurable from the CB ladder (reported as null); the gap still contains one Ec"
        : "shell tunnelling: Ec is the spacing of a gap-edge level and its charging satellite (one pair of peaks, not a ladder fit); the gap contains one Ec",
    );
  }
  if (regime === "undetermined") warnings.push("regime undetermined: CB peaks are not grouped into shells; see the evidence");
  const energies = spectrumEnergies(quantities, uncertainties, eta, etaGiven);
  return { regime, evidence, multiplets, quantities, uncertainties, energies, noLevels: null, warnings };
}
