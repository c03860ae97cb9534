/**
 * The s doublet of a shell-filling reading placed one VB doublet spacing apart, where the
 * second-junction resonances set aside hid it; and a reading that is not shell filling read so
 * from that pair where the VB reads as a charging doublet.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { Assignment, AssignOptions } from "./assignSpectrum.ts";
import { assignWith } from "./assignWith.ts";
import { iterateResonances } from "./iterateResonances.ts";
import type { SecondJunctionResonance } from "./secondJunction.ts";
import { strongValenceDoublet, unforced, valenceDoubletSpacingV } from "./substrateReadings.ts";

/** Defaults of {@link withValenceSpacedS}. */
export const VALENCE_SPACED_S_DEFAULTS = {
  /** Largest |CB pair spacing − VB doublet spacing| over the VB doublet spacing for the pair to be the s doublet. */
  spacingTolerance: ASSIGN_DEFAULTS.valenceChargingTolerance,
  /**
   * Largest |the held reading's fitted Ec (bias-referred) − VB doublet spacing| over the VB
   * doublet spacing for a shell-filling reading held from the VB-spaced pair to stand with its
   * full ladder (note 8); chosen on the accuracy benchmark (low η).
   */
  fullLadderSpacingTolerance: 0.1,
};

/**
 * A shell-filling assignment with its s doublet moved to the lowest CB pair one VB doublet
 * spacing apart that holds a peak set aside as a second-junction resonance; another reading
 * made shell filling from the lowest such pair of ladder peaks where the VB reads as a charging
 * doublet (or, failing that, where the CB then reads as the whole ladder of the VB's spacing,
 * note 8); the assignment unchanged where there is none or the rules do not read that pair as s.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peaks of one curve (`biasV` in V, `stepA` in A), as given to `assignSpectrum`.
 * a : Assignment
 *     `assignSpectrum`'s reading of them.
 * options : AssignOptions
 *     As given to `assignSpectrum`.
 *
 * Returns
 * -------
 * Assignment
 *     The reading with the s doublet at that pair, or `a`.
 *
 * Notes
 * -----
 * 1. In shell filling the tip junction sets both bands' charging ladders: the VB's first two
 *    peaks and the CB's s doublet are both one Ec/η apart in bias. The VB doublet spacing is that
 *    of the two VB peaks nearest 0 V not set aside as resonances.
 * 2. A plain resonance −η·V/(1 − η) of a VB edge level can fall on an s charging peak; the
 *    summed peak is then set aside whole and s is read from the next peaks (often p's), which
 *    lie above the first CB peak. So where the lowest CB pair (every CB peak counted, the set-aside
 *    ones too) spaced one VB doublet spacing apart within
 *    `VALENCE_SPACED_S_DEFAULTS.spacingTolerance` starts below the reading's s and holds a peak set
 *    aside as a resonance, those peaks go back to the ladder and the rules read the spectrum again
 *    in shell filling. The new reading stands only if its s is that pair.
 * 3. The pair's partner is the peak whose spacing is nearest the VB doublet's; the pair's first
 *    peak is the lowest CB peak that has one. A pure resonance one spacing below a correctly read
 *    s doublet makes such a pair too (its second peak then s's first): where the reading's s is
 *    itself two peaks one spacing apart (same tolerance) starting at the pair's second peak, both
 *    readings fit the VB doublet and the reading stands, the lower peak staying a resonance (its
 *    step, up to g = 2 × its source's for a doublet, does not tell a level under it apart).
 * 4. The new reading is that of `assignWith` with the regime set to shell filling and the pair
 *    kept out of the resonances, then the rounds of `iterateResonances` (its ladder's resonances
 *    set aside, the pair always kept on the ladder); the regime is then the reading's own
 *    (`unforced`).
 * 5. Where the pair's first peak was set aside as a resonance, it must step at least
 *    `ASSIGN_DEFAULTS.fillingResonanceStepMin` × its source ((g·r + 1)/(g + r) for g = 2 at
 *    r = 3): a resonance alone of a weakly filling ladder steps less than that, and a charging
 *    step under it adds about one source step (both bands' edge levels charge through the same
 *    junctions). A weaker peak is read as the resonance alone and the reading stands.
 * 6. A reading that is not shell filling (s's second peak merged with a resonance beside it, or
 *    weak beside one, so that the next strong peak read as p at many times s's step) is read
 *    again in shell filling where the VB's main peaks read as a charging doublet
 *    (`valenceFillingDoublet`) whose second step is at least
 *    `ASSIGN_DEFAULTS.valenceDoubletStepRatioMin` × the first (r/(1 + r) at r = 3, the bar
 *    `assignSpectrum` sets where the VB doublet alone says shell filling). The pair is the lowest
 *    CB peak not set aside as a resonance that has a partner one VB doublet spacing apart (as in
 *    note 3), with that partner; from the shell-filling reading with the pair kept out of the
 *    resonances, the rounds of `iterateResonances` run with the rules unasked (the pair always
 *    kept on the ladder), and the new reading stands only if those rules read shell filling with
 *    s at that pair.
 * 7. With the second-junction stage off (`options.secondJunction` false) the reading is returned
 *    unchanged: both steps read peaks against that stage's resonances.
 * 8. Where in note 6 the rules, unasked, do not read shell filling with s at the pair, the reading held
 *    in shell filling through the rounds of `iterateResonances` (the pair kept on the ladder)
 *    stands if it is the whole shell-filling ladder of the VB's spacing: s starts at the pair's
 *    first peak with its second one VB doublet spacing above (within
 *    `VALENCE_SPACED_S_DEFAULTS.spacingTolerance`), p holds all six charging peaks (three
 *    orbitals of two spins, one carrier at a time), and the fitted Ec (bias-referred) is the VB
 *    doublet spacing within `VALENCE_SPACED_S_DEFAULTS.fullLadderSpacingTolerance`: in shell
 *    filling the tip junction sets both bands' ladders, while shell tunnelling's CB levels are
 *    single peaks and hold no such ladder. The s pair's second step must be at least
 *    `ASSIGN_DEFAULTS.fillingStepRatio[0]` × its first (r/(1 + r) at r = 1.5; a second peak
 *    merged with a resonance only steps more): a weaker one is a crossover doublet, whose ladder
 *    is also one Ec/η apart. The regime is then the reading's own (`unforced`).
 *
 * Example
 * -------
 * ```ts
 * // assignSpectrum applies it to its own reading (its note 9); on a reading made otherwise:
 * withValenceSpacedS(peaks, reading, { eta: 0.6 }).multiplets.find((m) => m.label === "s")?.peaksV;
 * ```
 */
export function withValenceSpacedS(peaks: readonly Peak[], a: Assignment, options: AssignOptions): Assignment {
  if (options.regime !== undefined || !(options.secondJunction ?? ASSIGN_DEFAULTS.secondJunction)) return a;
  const eta = a.energies.eta;
  if (!(eta < 1) || !a.energies.etaGiven) return a;
  if (a.regime !== "shell-filling") return fillingFromValenceDoublet(peaks, a, options);
  const s = a.multiplets.find((m) => m.band === "CB" && m.label === "s");
  if (!s || !s.peakIndices.length) return a;
  const aside = new Set(a.evidence.secondJunction.map((r) => r.index));
  const spaced = valenceSpacing(peaks, aside);
  if (!spaced) return a;
  const { ecV, cb, partnerOf } = spaced;
  const sFirstV = Math.min(...s.peakIndices.map((i) => peaks[i].biasV));
  const tolV = VALENCE_SPACED_S_DEFAULTS.spacingTolerance * ecV;
  // Notes 2–3: the lowest CB peak below s with a partner one spacing above it.
  for (const first of cb) {
    if (first.v >= sFirstV) return a;
    const second = partnerOf(first);
    if (!second) continue;
    if (!aside.has(first.i) && !aside.has(second.i)) return a;
    // Note 5: a first peak set aside that steps no more than a resonance of a filling ladder.
    const firstAside = a.evidence.secondJunction.find((r) => r.index === first.i);
    if (firstAside && peaks[first.i].stepA < ASSIGN_DEFAULTS.fillingResonanceStepMin * peaks[firstAside.sourceIndex].stepA) return a;
    // Note 3: a reading whose s starts at the pair's second peak one spacing apart stands.
    if (s.peakIndices[0] === second.i && s.peakIndices.length === 2 && Math.abs(peaks[s.peakIndices[1]].biasV - second.v - ecV) <= tolV) return a;
    // Note 4: the pair stays on the ladder through the rounds that set its resonances aside.
    const onLadder = (r: SecondJunctionResonance) => r.index !== first.i && r.index !== second.i;
    const again = (p: readonly Peak[], r: readonly SecondJunctionResonance[]) => assignWith(p, eta, true, r.filter(onLadder), { ...options, regime: "shell-filling" });
    const out = iterateResonances(peaks, again(peaks, a.evidence.secondJunction), eta, again);
    unforced(out);
    const sOut = out.multiplets.find((m) => m.band === "CB" && m.label === "s");
    if (!sOut || sOut.peakIndices.length !== 2 || sOut.peakIndices[0] !== first.i || sOut.peakIndices[1] !== second.i) return a;
    out.evidence.reasons.unshift(
      `the peaks at ${first.v.toFixed(3)} and ${second.v.toFixed(3)} V, the lowest CB pair one VB doublet spacing (${ecV.toFixed(3)} V) apart, read as the s doublet: a second-junction resonance set aside there hid it (the reading had s from ${sFirstV.toFixed(3)} V)`,
    );
    return out;
  }
  return a;
}

/**
 * Note 1 of {@link withValenceSpacedS}: the VB doublet spacing `ecV` (V) of the two VB peaks
 * nearest 0 V not set aside, the CB peaks (all, from 0 V up) and each one's partner one spacing
 * above it (note 3); null with fewer than two such VB peaks.
 */
function valenceSpacing(peaks: readonly Peak[], aside: ReadonlySet<number>) {
  const ecV = valenceDoubletSpacingV(peaks, aside);
  if (ecV === null) return null;
  const tolV = VALENCE_SPACED_S_DEFAULTS.spacingTolerance * ecV;
  const cb = peaks.map((p, i) => ({ v: p.biasV, i })).filter(({ v }) => v > 0).sort((x, y) => x.v - y.v);
  const off = (c: { v: number }, first: { v: number }) => Math.abs(c.v - first.v - ecV);
  const partnerOf = (first: { v: number; i: number }) => cb.filter((c) => off(c, first) <= tolV).sort((x, y) => off(x, first) - off(y, first))[0];
  return { ecV, cb, partnerOf };
}

/**
 * Note 6 of {@link withValenceSpacedS}: a reading that is not shell filling, read in shell
 * filling from the lowest pair of ladder CB peaks one VB doublet spacing apart where the VB
 * reads as a charging doublet and the rules, unasked, read s there; otherwise `a`.
 */
function fillingFromValenceDoublet(peaks: readonly Peak[], a: Assignment, options: AssignOptions): Assignment {
  const eta = a.energies.eta;
  const doublet = strongValenceDoublet(peaks, a);
  if (!doublet) return a;
  const aside = new Set(a.evidence.secondJunction.map((r) => r.index));
  const spaced = valenceSpacing(peaks, aside);
  if (!spaced) return a;
  const first = spaced.cb.find((c) => !aside.has(c.i) && spaced.partnerOf(c));
  if (!first) return a;
  const second = spaced.partnerOf(first)!;
  const onLadder = (r: SecondJunctionResonance) => r.index !== first.i && r.index !== second.i;
  const forced = assignWith(peaks, eta, true, a.evidence.secondJunction.filter(onLadder), { ...options, regime: "shell-filling" });
  const out = iterateResonances(peaks, forced, eta, (p, r) => assignWith(p, eta, true, r.filter(onLadder), options));
  if (out === forced || out.regime !== "shell-filling" || !sAtPair(out, first.i, second.i)) return fullValenceLadder(peaks, a, options, first.i, spaced.ecV, onLadder) ?? a;
  unforced(out);
  out.evidence.reasons.unshift(
    `read as shell filling (the first reading, ${a.regime}): the VB's first two main peaks step alike (ratio ${doublet.stepRatio.toFixed(2)} ≥ ${ASSIGN_DEFAULTS.valenceDoubletStepRatioMin.toFixed(2)}) with a jump of ${doublet.jumpRatio.toFixed(2)} × their spacing to the next, a charging doublet, and with the peaks at ${first.v.toFixed(3)} and ${second.v.toFixed(3)} V, the lowest CB pair one VB doublet spacing (${spaced.ecV.toFixed(3)} V) apart, kept as the s doublet the rules read shell filling unasked`,
  );
  return out;
}

/** Whether the reading's CB s doublet is exactly the peaks `firstI`, `secondI`. */
function sAtPair(out: Assignment, firstI: number, secondI: number): boolean {
  const s = out.multiplets.find((m) => m.band === "CB" && m.label === "s");
  return !!s && s.peakIndices.length === 2 && s.peakIndices[0] === firstI && s.peakIndices[1] === secondI;
}

/**
 * Note 8 of {@link withValenceSpacedS}: the shell-filling reading held through the rounds from
 * the VB-spaced pair, where its s is that pair, its p holds all six charging peaks and its fitted
 * Ec is the VB doublet spacing (within `VALENCE_SPACED_S_DEFAULTS.fullLadderSpacingTolerance`);
 * null otherwise.
 */
function fullValenceLadder(
  peaks: readonly Peak[],
  a: Assignment,
  options: AssignOptions,
  firstI: number,
  valenceSpacingV: number,
  onLadder: (r: SecondJunctionResonance) => boolean,
): Assignment | null {
  const eta = a.energies.eta;
  const again = (p: readonly Peak[], r: readonly SecondJunctionResonance[]) => assignWith(p, eta, true, r.filter(onLadder), { ...options, regime: "shell-filling" });
  const held = iterateResonances(peaks, again(peaks, a.evidence.secondJunction), eta, again);
  const s = held.multiplets.find((m) => m.band === "CB" && m.label === "s");
  const tolV = VALENCE_SPACED_S_DEFAULTS.spacingTolerance * valenceSpacingV;
  if (!s || s.peakIndices.length !== 2 || s.peakIndices[0] !== firstI || Math.abs(peaks[s.peakIndices[1]].biasV - peaks[firstI].biasV - valenceSpacingV) > tolV) return null;
  // A second peak merged with a resonance steps more, never less, than r/(1 + r) of the first.
  if (peaks[s.peakIndices[1]].stepA < ASSIGN_DEFAULTS.fillingStepRatio[0] * peaks[firstI].stepA) return null;
  const p = held.multiplets.find((m) => m.band === "CB" && m.label === "p");
  const ecV = held.quantities.chargingEnergyV;
  if (!p || p.peakIndices.length !== 6 || ecV === null) return null;
  if (Math.abs(ecV - valenceSpacingV) > VALENCE_SPACED_S_DEFAULTS.fullLadderSpacingTolerance * valenceSpacingV) return null;
  unforced(held);
  held.evidence.reasons.unshift(
    `read as shell filling (the first reading, ${a.regime}): the VB's first two main peaks read as a charging doublet, and with the lowest CB pair one VB doublet spacing (${valenceSpacingV.toFixed(3)} V) apart kept as s the CB reads as s and p's six charging peaks on one ladder of spacing ${ecV.toFixed(3)} V, the VB doublet's: both bands charge one carrier at a time through the tip junction`,
  );
  return held;
}
