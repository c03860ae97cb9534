/**
 * The readings of `assignSpectrum`'s steps 7–8 where η is given and below 1: each sets aside, or
 * gives back to the ladder, peaks that the second junction explains and runs steps 1–6
 * (`assignWith`) again, keeping the result only where the regime it reads is consistent (see
 * the Notes of `assignSpectrum`).
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { BandPeak } from "./bandPeaks.ts";
import type { Assignment, AssignOptions } from "./assignSpectrum.ts";
import { assignWith } from "./assignWith.ts";
import { confirmResonances } from "./confirmResonances.ts";
import { earlierReasons, iterateResonances } from "./iterateResonances.ts";
import { ladderPredictions, ladderResonances } from "./ladderResonances.ts";
import { oddLeadingLevel } from "./oddLeadingLevel.ts";
import { spinPairSet, SPIN_PAIRS_DEFAULTS } from "./spinPairs.ts";
import { valenceFillingDoublet } from "./regime.ts";
import { crowdedResonances, deeperChargingResonances, overlappedResonances, substrateChargingPeaks, type SecondJunctionResonance } from "./secondJunction.ts";
import { deeperPlainResonances, substrateExtraLevel, SUBSTRATE_EXTRA_LEVEL_DEFAULTS } from "./substrateExtraLevel.ts";

/**
 * Shell filling where the band-edge resonances say so and the VB reads as a charging doublet
 * (`valenceFillingDoublet`) but the CB, with the resonances its ladder predicts set aside, does
 * not (notes 7 and 8 of `assignSpectrum`): the shell-filling reading from `forced` with the
 * rounds of `iterateResonances` run under that regime; null when the VB does not read so.
 */
export function valenceDoublet(peaks: readonly Peak[], eta: number, etaGiven: boolean, forced: Assignment, first: Assignment, options: AssignOptions): Assignment | null {
  const doublet = valenceFillingDoublet(firstValencePeaks(peaks, first));
  if (doublet === null) return null;
  const regime = "shell-filling";
  const out = iterateResonances(peaks, forced, eta, (p, r) => assignWith(p, eta, etaGiven, r, { ...options, regime }));
  unforced(out);
  out.evidence.reasons.unshift(
    `read as shell filling: the band-edge resonances carry at least ${ASSIGN_DEFAULTS.fillingResonanceStepMin.toFixed(2)} × their levels' steps and the VB's first two main peaks step alike (ratio ${doublet.stepRatio.toFixed(2)} within ${ASSIGN_DEFAULTS.fillingStepRatio.join("–")}) with a jump of ${doublet.jumpRatio.toFixed(2)} × their spacing to the next (≥ ${ASSIGN_DEFAULTS.fillingJumpRatioMin}): a charging doublet; the CB ladder (the first reading, ${first.regime}) holds resonances of VB levels that its own prediction misses`,
  );
  return out;
}

/**
 * The VB main peaks of a reading that is not shell filling (each of its VB groups is one main
 * peak), from the gap edge outward (`x` = |bias|, V).
 */
function firstValencePeaks(peaks: readonly Peak[], first: Assignment): BandPeak[] {
  return first.multiplets
    .filter((m) => m.band === "VB")
    .flatMap((m) => m.peakIndices)
    .map((index) => ({ peak: peaks[index], x: -peaks[index].biasV, index }))
    .sort((a, b) => a.x - b.x);
}

/**
 * The VB's first main peaks of a reading that is not shell filling as a charging doublet
 * (`valenceFillingDoublet`) whose second step is at least `ASSIGN_DEFAULTS.valenceDoubletStepRatioMin`
 * × its first (r/(1 + r) at r = 3, twice the filling limit): the bar where the VB doublet alone
 * says shell filling; null where the VB does not read so.
 */
export function strongValenceDoublet(peaks: readonly Peak[], first: Assignment): { stepRatio: number; jumpRatio: number } | null {
  const doublet = valenceFillingDoublet(firstValencePeaks(peaks, first));
  return doublet === null || doublet.stepRatio < ASSIGN_DEFAULTS.valenceDoubletStepRatioMin ? null : doublet;
}

/**
 * The VB doublet spacing, V: the bias between the two VB peaks nearest 0 V whose indices are not
 * in `aside` (the peaks set aside as resonances); null with fewer than two.
 */
export function valenceDoubletSpacingV(peaks: readonly Peak[], aside: ReadonlySet<number>): number | null {
  const vb = peaks.filter((p, i) => p.biasV < 0 && !aside.has(i)).map((p) => p.biasV).sort((x, y) => y - x);
  return vb.length < 2 ? null : vb[0] - vb[1];
}

/** The assignment with the plain −η·V/(1 − η) candidates as the first guess of the resonances (steps 1–7). */
export function firstReading(peaks: readonly Peak[], eta: number, etaGiven: boolean, candidates: readonly SecondJunctionResonance[], options: AssignOptions): Assignment {
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
  const stands = (x: Assignment) => x.regime !== "undetermined" && (first.regime === "undetermined" || x.regime === first.regime);
  // The companions' spacing places the deeper levels' resonances too (`deeperChargingResonances`);
  // without them where that reading does not stand.
  const deeper = deeperChargingResonances(peaks, candidates, companions, first.multiplets.flatMap((m) => m.peakIndices), eta, ASSIGN_DEFAULTS.fillingStepRatio);
  const withDeeper = deeper.length ? assignWith(peaks, eta, etaGiven, [...candidates, ...companions, ...deeper], options) : null;
  const third = withDeeper && stands(withDeeper) ? withDeeper : assignWith(peaks, eta, etaGiven, [...candidates, ...companions], options);
  if (!stands(third)) return first;
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
 * still shell filling and p's first sub-group is then even. Where it is still odd, the ladder's
 * rounds (`iterateResonances`) run from it with the peak kept aside: a level of p that the reading
 * set aside as a predicted resonance is one p's ladder may now need (`ladderLevels`).
 */
export function withoutOddLead(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions, forced = false): Assignment {
  if (a.regime !== "shell-filling" || options.regime || a.quantities.chargingEnergyV === null) return a;
  const lead = oddLeadingLevel(peaks, a.multiplets, a.evidence.secondJunction, a.quantities.chargingEnergyV, eta);
  if (!lead) return a;
  // A reading the rounds made from the forced shell-filling one is read again under it.
  const opts = forced ? { ...options, regime: "shell-filling" as const } : options;
  const aside = (set: readonly SecondJunctionResonance[]) => [...set.filter((r) => r.index !== lead.index), lead];
  const evenP = (x: Assignment) => {
    const p = x.multiplets.find((m) => m.band === "CB" && m.label === "p");
    return x.regime === "shell-filling" && p !== undefined && (p.subgroups[0] ?? p.peakIndices.length) % 2 === 0;
  };
  let next = assignWith(peaks, eta, etaGiven, aside(a.evidence.secondJunction), opts);
  // Still odd: a level of p set aside as a resonance before may be one its ladder now needs; the
  // rounds judge the predicted resonances again against it, the lead kept aside.
  if (!evenP(next) && next.regime === "shell-filling") next = iterateResonances(peaks, next, eta, (q, r) => assignWith(q, eta, etaGiven, aside(r), opts));
  // The regime was the rules' reading, not the user's.
  if (forced) unforced(next);
  if (!evenP(next)) return a;
  const earlier = a.evidence.reasons.filter((r) => !next.evidence.reasons.includes(r) && !r.startsWith("the first two CB steps"));
  next.evidence.reasons.unshift(
    ...earlier,
    `peak at ${peaks[lead.index].biasV.toFixed(3)} V set aside: it opened p with an odd sub-group or a ladder of more than six (each p orbital holds two electrons) and lies at the second-junction resonance of the peak at ${peaks[lead.sourceIndex].biasV.toFixed(3)} V (expected at ${lead.predictedV.toFixed(3)} V)`,
  );
  return next;
}

/**
 * A shell-filling reading whose p is not three spin pairs (`spinPairSet`) read again with the six
 * peaks that are: the peaks left out inside p's span that step like a level or more are set aside
 * as second-junction resonances (a resonance of the ladder, or, unpredicted, of the nearest
 * prediction on their side within `SPIN_PAIRS_DEFAULTS.unpredictedReach` × Ec_V), the multiplets' peaks at a resonance take their level's share of the
 * step (p's level step; elsewhere the median of the multiplet's other peaks, as in the rounds of
 * `iterateResonances`), and the rules run again under shell filling with p made of that set; the
 * result stands if its p is exactly that set.
 */
export function withSpinPairs(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions): Assignment {
  const ecV = a.quantities.chargingEnergyV;
  if (a.regime !== "shell-filling" || options.regime || !(eta < 1) || ecV === null) return a;
  const inputs = { multiplets: a.multiplets, chargingEnergyV: ecV, eta };
  const predicted = ladderResonances(peaks, inputs);
  const setAside = a.evidence.secondJunction;
  const resonant = new Set([...setAside, ...predicted].map((r) => r.index));
  const set = spinPairSet(peaks, { multiplets: a.multiplets, resonant });
  if (!set) return a;
  const members = new Set(set.members);
  const predictions = ladderPredictions(peaks, inputs).filter((r) => r.predictedV > 0);
  const records: SecondJunctionResonance[] = [];
  for (const i of set.leftOut) {
    if (setAside.some((r) => r.index === i) || peaks[i].stepA < ASSIGN_DEFAULTS.fillingStepRatio[0] * set.levelStepA) continue;
    const known = predicted.find((r) => r.index === i);
    const nearest = known ?? [...predictions].sort((x, y) => Math.abs(x.predictedV - peaks[i].biasV) - Math.abs(y.predictedV - peaks[i].biasV))[0];
    // An unpredicted one is the resonance of a prediction only near it; else the rules decide.
    if (!nearest || (!known && Math.abs(nearest.predictedV - peaks[i].biasV) > SPIN_PAIRS_DEFAULTS.unpredictedReach * set.chargingEnergyV)) continue;
    records.push({ index: i, sourceIndex: nearest.sourceIndex, predictedV: nearest.predictedV });
  }
  const resonances = [...setAside.filter((r) => !members.has(r.index)), ...records];
  // A peak holding a level and a resonance keeps the level's share of the step, as in the rounds:
  // p's level step, or the median step of its multiplet's other peaks.
  const share = new Map<number, number>();
  for (const m of a.multiplets) {
    for (const i of m.peakIndices) {
      const others = m.peakIndices.filter((j) => j !== i && !resonant.has(j)).map((j) => peaks[j].stepA).sort((x, y) => x - y);
      if (resonant.has(i) && others.length) share.set(i, others[others.length >> 1]);
    }
  }
  for (const i of members) if (resonant.has(i)) share.set(i, set.levelStepA);
  const adjusted = peaks.map((q, i) => (share.has(i) ? { ...q, stepA: share.get(i)! } : q));
  const next = assignWith(adjusted, eta, etaGiven, resonances, { ...options, regime: "shell-filling" }, members);
  unforced(next);
  const p = next.multiplets.find((m) => m.band === "CB" && m.label === "p");
  if (!p || [...p.peakIndices].sort((x, y) => x - y).join() !== [...set.members].sort((x, y) => x - y).join()) return a;
  // Only p is read again: s stays the doublet it was (a reading's own s, such as the VB doublet's
  // kept second peak, is not remade by the rules, and a member of p must not fill it).
  const sOf = (x: Assignment) => x.multiplets.find((m) => m.band === "CB" && m.label === "s")?.peakIndices.join();
  if (sOf(next) !== sOf(a)) return a;
  const list = (xs: readonly number[]) => xs.map((i) => peaks[i].biasV.toFixed(3)).join(", ");
  next.evidence.reasons.unshift(
    ...earlierReasons(a, next),
    `p read again as three spin pairs (each orbital's two electrons charge one Ec apart; Ec = ${set.chargingEnergyV.toFixed(3)} V, the s doublet's spacing): peaks at ${list(set.members)} V, pairs within ${Math.round(100 * Math.max(...set.pairDeviations.map(Math.abs)))} % of Ec${set.leftOut.length ? `; peaks at ${list(set.leftOut)} V left out of p` : ""}`,
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
export function withoutExtraLevel(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions): Assignment {
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
 * Where the first reading was shell tunnelling and the released levels alone name another
 * regime, the band-edge level's substrate-side second charging peak, judged against the
 * resonance's own share of its source's step (`substrateChargingPeaks` note 4), is set aside
 * too: the reading stands if it is shell tunnelling with the VB's second step at least
 * `ASSIGN_DEFAULTS.tunnelingStepRatioMin` × its first (that peak, counted as a level, had taken
 * the place of the one under the resonance).
 */
export function underResonances(peaks: readonly Peak[], eta: number, etaGiven: boolean, first: Assignment, options: AssignOptions): Assignment {
  const set = first.evidence.secondJunction;
  const under = levelsUnder(peaks, set);
  if (!under.length) return first;
  const kept = set.filter((r) => !under.includes(r));
  const second = assignWith(peaks, eta, etaGiven, kept, options);
  // Where the first reading named no regime, shell tunnelling stands if the VB shows it too.
  const opened = first.regime === "undetermined" && second.regime === "shell-tunneling" && (second.evidence.valenceStepRatio ?? 0) >= ASSIGN_DEFAULTS.tunnelingStepRatioMin;
  const stands = second.regime === first.regime || opened;
  // With those levels back, a band-edge level's second charging peak through the substrate junction
  // goes too where the regime stays (set aside with every resonance, it left too few CB peaks to
  // name one). Where the regime does not stay, a shell-tunnelling reading is kept if that peak,
  // judged against the resonance's own share of its source's step (note 4 of
  // `substrateChargingPeaks`: a level under the resonance inflates the merged step, and the
  // companion was counted in the ladder), goes and the VB's levels read shell tunnelling too.
  const companions = substrateChargingPeaks(peaks, set, eta, ASSIGN_DEFAULTS.fillingStepRatio, !stands).filter((c) => !set.some((r) => r.index === c.index));
  const third = companions.length ? assignWith(peaks, eta, etaGiven, [...kept, ...companions], options) : null;
  const tunnels = (x: Assignment) => first.regime === "shell-tunneling" && x.regime === "shell-tunneling" && (x.evidence.valenceStepRatio ?? 0) >= ASSIGN_DEFAULTS.tunnelingStepRatioMin;
  if (!stands && !(third && tunnels(third))) return first;
  const result = third && (!stands || third.regime === second.regime) ? third : second;
  result.evidence.reasons.unshift(
    ...(result === third ? companionReasons(peaks, companions) : []),
    ...under.map((r) =>
      overlappedResonances(peaks, [r]).length
        ? `peak at ${peaks[r.index].biasV.toFixed(3)} V kept as a level: it steps ${(peaks[r.index].stepA / peaks[r.sourceIndex].stepA).toFixed(2)} × the peak at ${peaks[r.sourceIndex].biasV.toFixed(3)} V whose resonance it overlaps (a resonance alone steps less than its source where the tip side does not fill the dot)`
        : `peak at ${peaks[r.index].biasV.toFixed(3)} V kept as a level: a nearer peak is the resonance of the peak at ${peaks[r.sourceIndex].biasV.toFixed(3)} V, and the two step at least as much as that peak (one resonance alone steps less than its source where the tip side does not fill the dot)`,
    ),
  );
  return result;
}

/**
 * The resonances that go back to the ladder as levels (`overlappedResonances`, and those beside a
 * nearer resonance of the same source, `crowdedResonances`), except one with a
 * peak that is no resonance (or one released before it) within the smaller of their FWHMs (a
 * merged peak's own width would reach the next level): that peak is the level,
 * found apart, and the summed step was shared out between the two by the split's fit. Those
 * farthest from their predicted positions go first.
 */
function levelsUnder(peaks: readonly Peak[], set: readonly SecondJunctionResonance[]): SecondJunctionResonance[] {
  const miss = (r: SecondJunctionResonance) => Math.abs(peaks[r.index].biasV - r.predictedV);
  const resonant = new Set(set.map((r) => r.index));
  const released: SecondJunctionResonance[] = [];
  const crowded = crowdedResonances(peaks, set).filter((r) => !overlappedResonances(peaks, [r]).length);
  for (const r of [...overlappedResonances(peaks, set), ...crowded].sort((a, b) => miss(b) - miss(a))) {
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
 * s doublet's second peak or its first (note 7 of `assignSpectrum`), or from the VB's charging
 * doublet where it hides the second; null when neither says shell filling or the reading fails.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peaks of one curve (`biasV` in V, `stepA` in A).
 * eta : number
 *     Voltage-division factor η in (0, 1).
 * etaGiven : boolean
 *     Whether the user gave η.
 * candidates : readonly SecondJunctionResonance[]
 *     The plain −η·V/(1 − η) candidates (`secondJunctionResonances`).
 * first : Assignment
 *     The reading with the candidates set aside.
 * options : AssignOptions
 *     As given to `assignSpectrum`.
 *
 * Returns
 * -------
 * Assignment | null
 *     The shell-filling reading with the hidden peak kept as an s peak, or null.
 *
 * Notes
 * -----
 * 1. Where the band-edge resonances carry at least `ASSIGN_DEFAULTS.fillingResonanceStepMin` ×
 *    their levels' steps ((g·r + 1)/(g + r) at r = 3, `bandEdgeResonanceRatio`), a candidate
 *    one VB doublet spacing (Ec) above the first CB peak is the s doublet's second peak, its step
 *    taken as r/(1 + r) of the first for the r those resonances give; one spacing below, its
 *    first.
 * 2. That ratio is the smallest over the band-edge resonances, and it reads low where a band's
 *    edge level lies under a resonance (the next peak of the band, then taken for the edge, is
 *    a second charging peak, whose resonance carries 1/(1 + r) of the first's: note 1 of
 *    `levelsAtDoubletResonance`) or where a resonance is split in two. So where it is lower, a
 *    candidate one spacing above the first CB peak is still read as the s doublet's second peak,
 *    and one below it (stepping as note 1 asks) as its first, if the VB's first two main peaks
 *    read as a charging doublet (`valenceFillingDoublet`:
 *    alike steps, then a jump of at least `ASSIGN_DEFAULTS.fillingJumpRatioMin` × their spacing
 *    to the next level) whose second step is at least `ASSIGN_DEFAULTS.valenceDoubletStepRatioMin`
 *    × the first: r/(1 + r) at r = 3, the margin of note 1 over the filling limit r = 1.5 (the
 *    doublet at the limit steps 0.6, in the crossover less). The CB doublet's step ratio is
 *    then taken as the VB doublet's (at most 1): both bands' edge levels charge through
 *    the same junctions, so one r gives both. The VB main peaks are those of the first reading,
 *    with the CB levels' plain resonances set aside (and none of the VB levels' own, which fall
 *    at positive bias: note 3 of `valenceFillingDoublet`); the CB's second s peak, under a VB
 *    level's resonance, steps as s and that resonance together, and reads as p in shell
 *    tunnelling without this.
 * 3. With the hidden peak's step so set, a resonance of a higher VB level close after the s
 *    doublet (those fall N·Ec/(1 − η) nearer 0 V than the plain −η·V/(1 − η) that set the
 *    candidates aside) still makes the pair read as the s level and a p level. The reading of
 *    note 2 then stands if, from the shell-filling reading with the resonances its ladder
 *    predicts set aside (`iterateResonances`), the rules read shell filling unasked, as a hidden
 *    first peak's of note 1 does (the VB doublet, which opened the reading, is not asked again).
 */
function hiddenDoublet(peaks: readonly Peak[], eta: number, etaGiven: boolean, candidates: readonly SecondJunctionResonance[], first: Assignment, options: AssignOptions): Assignment | null {
  if (first.regime === "shell-filling" || options.regime) return null;
  const D = ASSIGN_DEFAULTS;
  const resonance = bandEdgeResonanceRatio(peaks, candidates);
  const strong = resonance !== null && resonance.ratio >= D.fillingResonanceStepMin;
  // Note 2: without strong resonances, the VB's charging doublet must say shell filling.
  const doublet = strong ? null : strongValenceDoublet(peaks, first);
  if (!strong && doublet === null) return null;
  // Ec from the VB doublet (the gap-edge pair of VB peaks that are not resonances).
  const taken = new Set(candidates.map((c) => c.index));
  const cb = peaks.map((p, i) => ({ p, i })).filter(({ p, i }) => p.biasV > 0 && !taken.has(i)).sort((a, b) => a.p.biasV - b.p.biasV);
  const ecV = valenceDoubletSpacingV(peaks, taken);
  if (ecV === null || !cb.length) return null;
  const tol = ASSIGN_DEFAULTS.valenceChargingTolerance * ecV;
  const near = (v: number) => candidates.find((c) => Math.abs(peaks[c.index].biasV - v) <= tol);
  // The s doublet's second peak one Ec above the first CB peak, else its first one Ec below it.
  const second = near(cb[0].p.biasV + ecV);
  const hidden = second ?? (cb[0].p.biasV - ecV > 0 ? near(cb[0].p.biasV - ecV) : undefined);
  if (!hidden) return null;
  // The s doublet's second step over its first: from the resonances (note 1) or the VB doublet (note 2).
  const doubletStepRatio = strong ? resonance!.doubletStepRatio : Math.min(1, doublet!.stepRatio);
  // Below the first CB peak, the resonance of a doublet alone steps less than 2 × its source
  // ((2r + 1)/(2 + r) < 2); a charging step under it adds at least the least filling step ratio.
  if (!second && peaks[hidden.index].stepA < (2 + ASSIGN_DEFAULTS.fillingStepRatio[0]) * peaks[hidden.sourceIndex].stepA) return null;
  const hiddenStepA = second ? peaks[cb[0].i].stepA * doubletStepRatio : peaks[cb[0].i].stepA / doubletStepRatio;
  const adjusted = peaks.map((p, i) => (i === hidden.index ? { ...p, stepA: hiddenStepA } : p));
  const rest = candidates.filter((c) => c !== hidden);
  let out = assignWith(adjusted, eta, etaGiven, rest, options);
  if (out.regime !== "shell-filling" && (!second || !strong)) {
    // A hidden first peak leaves the resonances of the higher VB levels in the CB ladder: the
    // shell-filling reading stands if, with those its ladder predicts set aside, the rules read it
    // unasked, or if the VB reads as a charging doublet (its own ladder has no such resonances).
    // So may a hidden peak read from the VB doublet (note 3), by the rules alone.
    const forced = assignWith(adjusted, eta, etaGiven, rest, { ...options, regime: "shell-filling" });
    out = iterateResonances(adjusted, forced, eta, (p, r) => assignWith(p, eta, etaGiven, r, options));
    if (out === forced && !second && strong) out = valenceDoublet(adjusted, eta, etaGiven, forced, first, options) ?? forced;
    if (out === forced) return null;
    unforced(out);
  }
  if (out.regime !== "shell-filling") return null;
  // The rounds (note 3) may have placed s elsewhere: the reason says what the reading holds.
  const inS = out.multiplets.some((m) => m.band === "CB" && m.label === "s" && m.peakIndices.includes(hidden.index));
  const kept = `the peak at ${peaks[hidden.index].biasV.toFixed(3)} V, one VB doublet spacing ${second ? "above" : "below"} the first CB peak, ${inS ? "is kept" : "was read first"} as the s doublet's ${second ? "second" : "first"} peak (the resonance at ${hidden.predictedV.toFixed(3)} V overlaps it)${inS ? "" : ", the rounds from that reading then placing s"}`;
  out.evidence.reasons.unshift(
    strong
      ? `the resonance of the band-edge level at ${peaks[resonance!.sourceIndex].biasV.toFixed(3)} V carries ${resonance!.ratio.toFixed(2)} × its step (≥ ${D.fillingResonanceStepMin.toFixed(2)}, (g·r + 1)/(g + r) for g = 2 at r = 3, twice the filling limit): shell filling; ${kept}`
      : `the VB's first two main peaks step alike (ratio ${doublet!.stepRatio.toFixed(2)} ≥ ${D.valenceDoubletStepRatioMin.toFixed(2)}, r/(1 + r) at r = 3, twice the filling limit) with a jump of ${doublet!.jumpRatio.toFixed(2)} × their spacing to the next (≥ ${D.fillingJumpRatioMin}): a charging doublet, so shell filling; ${kept}, its step set by the VB doublet's step ratio (the band-edge resonances, ${resonance ? `${resonance.ratio.toFixed(2)} × their levels' steps,` : "none found,"} read low where a resonance hides an edge level or is split)`,
  );
  return out;
}

/**
 * The smallest step ratio of a resonance over its source among the sources that are their band's
 * gap-edge peak (an overlapping peak only adds to a resonance's step, so the smallest is the
 * safest reading).
 */
export function bandEdgeResonanceRatio(peaks: readonly Peak[], candidates: readonly SecondJunctionResonance[]): { ratio: number; sourceIndex: number; doubletStepRatio: number } | null {
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
export function unforced(a: Assignment): void {
  a.evidence.reasons = a.evidence.reasons.filter((r) => !r.startsWith("regime shell-filling given by the user"));
}
