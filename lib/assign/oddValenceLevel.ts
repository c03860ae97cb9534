/**
 * A shell-filling VB group with an odd number of peaks, one of which lies where a CB level's
 * second-junction resonance is predicted: that peak is the resonance, not a charging peak of a
 * VB level.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { Assignment, AssignOptions } from "./assignSpectrum.ts";
import { assignWith } from "./assignWith.ts";
import { medianSpacingV } from "./iterateResonances.ts";
import { ladderPredictions } from "./ladderResonances.ts";
import type { Multiplet } from "./multiplets.ts";
import { medianInPlace } from "../util/medianInPlace.ts";
import { matchToleranceV, SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";
import { unforced } from "./substrateReadings.ts";

/** Limits of {@link oddValenceResonance} and {@link withoutOddValence} (locked by test/assign/oddValenceLevel.test.ts). */
export const ODD_VALENCE_LEVEL_DEFAULTS = Object.freeze({
  /**
   * A peak of an odd VB group is taken for a CB level's resonance within this fraction of
   * η/(1 − η)·Ec_V of its prediction (or the match tolerance of the other stages, if wider): a
   * quarter of Ec (the reach of the ladder's other matches, e.g. `completeShells`), of error on
   * the tip side (the source's shift under a neighbour, N times the error of Ec_V), moves the
   * prediction by η/(1 − η) times as much.
   */
  ladderReach: 0.25,
  /** At most this many peaks set aside, one per round (each round reads the VB again). */
  maxRounds: 2,
  /**
   * A peak found by {@link oddValenceResonance} that steps at least this × the median step of the
   * VB groups' peaks is set aside even where the VB reads as many odd groups after it
   * (`withoutOddValence` note 2): a VB charging peak steps about one carrier's step, a CB level's
   * resonance through the substrate junction in shell filling (g·r + 1)/(g + r) × its level's
   * step, 7/5 at g = 2, r = 3 (`ASSIGN_DEFAULTS.fillingResonanceStepMin`). Chosen on the
   * accuracy benchmark (low η), where a smaller multiple also set aside VB charging peaks.
   */
  resonanceStepMin: ASSIGN_DEFAULTS.fillingResonanceStepMin,
});

/**
 * The peak of an odd shell-filling VB group that lies nearest a CB level's predicted
 * second-junction resonance, within reach.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[]
 *     The peak list of the assignment (positions, 1σ and FWHM in V).
 * multiplets : readonly Pick<Multiplet, "band" | "degeneracy" | "peakIndices" | "subgroups">[]
 *     The shell-filling assignment's multiplets (CB shells, then VB groups from the gap edge).
 * resonances : readonly Pick<SecondJunctionResonance, "index">[]
 *     The peaks the assignment set aside as resonances.
 * chargingEnergyV : number
 *     Ec_V, the ladder's spacing in bias, V (> 0).
 * eta : number
 *     Voltage-division factor η in (0, 1).
 *
 * Returns
 * -------
 * SecondJunctionResonance | null
 *     The VB peak as the resonance of the CB charging peak whose prediction lies nearest it; null
 *     when every VB group is even or no prediction reaches a peak of an odd one.
 *
 * Notes
 * -----
 * 1. Every VB level holds two carriers per orbital (spin), so in shell filling its charging
 *    peaks come in an even group; an odd group holds a peak too many (or lacks one).
 * 2. A CB charging peak at V, N carriers in the CB levels below its own, predicts its level's
 *    resonance through the substrate junction at −η/(1 − η)·(|V| − N·Ec_V) (`ladderResonances`,
 *    note 2; `ladderPredictions` of the CB shells). The rounds of `iterateResonances` match it
 *    within max(3σ, FWHM/2) (`matchToleranceV`), which holds the peaks' own σ but not the ladder's
 *    error: a source shifted by a resonance or level under it, and N times the error of Ec_V,
 *    both multiplied by η/(1 − η) (1.2 to 1.9 for η from 0.55 to 0.65). A resonance just outside
 *    that tolerance is then counted in a VB group, often one Ec from a VB peak.
 * 3. Where a VB group is odd the parity already says that one of its peaks is not a charging peak
 *    of a VB level, so its peaks are matched within the wider
 *    max(`matchToleranceV`, `ladderReach`·η/(1 − η)·Ec_V); the nearest match is the resonance.
 *    A prediction with a peak set aside nearer it than the candidate already has its resonance,
 *    unless that peak lies within `SECOND_JUNCTION_DEFAULTS.companionSpacingFwhmMin` × the
 *    candidate's FWHM of it: then the two are one peak split in two by the search.
 *    The gap edge (the first peak of the first VB group) is never taken: the gap rests on it.
 * 4. Nor is a peak inside a group one Ec_V (± `ASSIGN_DEFAULTS.valenceChargingTolerance`) from
 *    both its neighbours: it is a charging step of the group's ladder, and a resonance there
 *    overlaps a level (as `confirmResonances` keeps it). A resonance at a group's end continues
 *    its ladder by one step or breaks it; one inside breaks a spacing in two.
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6 (gain 1.5), Ec_V = 0.2 V: s at 1.0, 1.2 V; p's first sub-level at 2.1, 2.3 V behind
 * // the s doublet (N = 2) predicts −1.5·(2.1 − 0.4) = −2.55 V; VB: −1.1, −1.3 V, then −2.62 V alone.
 * const at = (biasV: number) => ({ biasV, biasUncertaintyV: 0.002, fwhmV: 0.04 });
 * const peaks = [-2.62, -1.3, -1.1, 1.0, 1.2, 2.1, 2.3].map(at);
 * const cb = (peakIndices: number[], degeneracy: number) => ({ band: "CB" as const, degeneracy, peakIndices, subgroups: [2] });
 * const vb = (peakIndices: number[]) => ({ band: "VB" as const, degeneracy: null, peakIndices, subgroups: [peakIndices.length] });
 * oddValenceResonance(peaks, [cb([3, 4], 2), cb([5, 6], 6), vb([2, 1]), vb([0])], [], 0.2, 0.6);
 * // => { index: 0, sourceIndex: 5, predictedV: -2.55… } (70 mV off: beyond FWHM/2, within 0.25·1.5·0.2 V)
 * ```
 */
export function oddValenceResonance(
  peaks: readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[],
  multiplets: readonly Pick<Multiplet, "band" | "degeneracy" | "peakIndices" | "subgroups">[],
  resonances: readonly Pick<SecondJunctionResonance, "index">[],
  chargingEnergyV: number,
  eta: number,
): SecondJunctionResonance | null {
  if (!(eta > 0 && eta < 1) || !(chargingEnergyV > 0)) return null;
  const gain = eta / (1 - eta);
  const vb = multiplets.filter((m) => m.band === "VB");
  const edge = vb[0]?.peakIndices[0];
  const predictions = ladderPredictions(peaks, { multiplets: multiplets.filter((m) => m.band === "CB"), chargingEnergyV, eta }).filter((r) => r.predictedV < 0);
  const reach = ODD_VALENCE_LEVEL_DEFAULTS.ladderReach * gain * chargingEnergyV;
  const split = SECOND_JUNCTION_DEFAULTS.companionSpacingFwhmMin;
  let best: SecondJunctionResonance | null = null;
  let bestMiss = Infinity;
  for (const m of vb) {
    if (m.peakIndices.length % 2 === 0) continue;
    for (const [k, index] of m.peakIndices.entries()) {
      if (index === edge || onLadder(peaks, m.peakIndices, k, chargingEnergyV)) continue;
      const peak = peaks[index];
      for (const { sourceIndex, predictedV } of predictions) {
        const miss = Math.abs(peak.biasV - predictedV);
        // A prediction with a peak already set aside nearer it has its resonance, unless the two
        // are one peak split in two by the search.
        const taken = (r: Pick<SecondJunctionResonance, "index">) => Math.abs(peaks[r.index].biasV - predictedV) < miss && Math.abs(peaks[r.index].biasV - peak.biasV) > split * peak.fwhmV;
        if (resonances.some(taken)) continue;
        if (miss <= Math.max(matchToleranceV(peaks[sourceIndex], peak, gain), reach) && miss < bestMiss) {
          best = { index, sourceIndex, predictedV };
          bestMiss = miss;
        }
      }
    }
  }
  return best;
}

/**
 * Whether the k-th peak of a VB group lies one Ec_V (± `ASSIGN_DEFAULTS.valenceChargingTolerance`)
 * from both its neighbours in the group: a charging peak of the group's ladder (a resonance there
 * overlaps a level; note 4 of {@link oddValenceResonance}).
 */
function onLadder(peaks: readonly Pick<Peak, "biasV">[], group: readonly number[], k: number, chargingEnergyV: number): boolean {
  if (k === 0 || k === group.length - 1) return false;
  const tol = ASSIGN_DEFAULTS.valenceChargingTolerance * chargingEnergyV;
  const near = (i: number, j: number) => Math.abs(Math.abs(peaks[group[i]].biasV - peaks[group[j]].biasV) - chargingEnergyV) <= tol;
  return near(k - 1, k) && near(k, k + 1);
}

/**
 * A shell-filling reading with an odd VB group read again with its peak at a CB level's
 * resonance (`oddValenceResonance`) set aside: the rules run under shell filling with p kept as
 * it was, and the result stands if its CB multiplets are the same and it has fewer odd VB groups
 * (at most `ODD_VALENCE_LEVEL_DEFAULTS.maxRounds` rounds). The reading itself otherwise. Ec_V
 * is that of the rounds' predictions (`iterateResonances`, note 1): the median spacing within the
 * multiplets' sub-groups, robust to a resonance counted in one (the ladder's fitted Ec with fewer
 * than three spacings).
 *
 * Notes
 * -----
 * 1. Fewer odd groups is the parity's own test that the peak was the one too many.
 * 2. A peak that steps at least `ODD_VALENCE_LEVEL_DEFAULTS.resonanceStepMin` × the median step of
 *    the VB groups' peaks needs only as many odd groups, not fewer: it steps like a CB level's
 *    resonance through the substrate junction ((g·r + 1)/(g + r) × a level's step in shell
 *    filling), not like a VB charging peak, and the VB read without it can stay odd elsewhere (a
 *    VB charging peak under another resonance, or set aside as one).
 */
export function withoutOddValence(peaks: readonly Peak[], eta: number, etaGiven: boolean, a: Assignment, options: AssignOptions): Assignment {
  let current = a;
  for (let round = 0; round < ODD_VALENCE_LEVEL_DEFAULTS.maxRounds; round++) {
    if (current.regime !== "shell-filling" || options.regime || !(eta < 1) || current.quantities.chargingEnergyV === null) break;
    const ecV = medianSpacingV(peaks, current) ?? current.quantities.chargingEnergyV;
    const found = oddValenceResonance(peaks, current.multiplets, current.evidence.secondJunction, ecV, eta);
    if (!found) break;
    // Note 2: a peak stepping like a CB level's resonance may go even where the VB stays as odd.
    const strong = peaks[found.index].stepA >= ODD_VALENCE_LEVEL_DEFAULTS.resonanceStepMin * valenceMedianStepA(peaks, current);
    const p = current.multiplets.find((m) => m.band === "CB" && m.label === "p");
    const next = assignWith(peaks, eta, etaGiven, [...current.evidence.secondJunction, found], { ...options, regime: "shell-filling" }, p ? new Set(p.peakIndices) : undefined);
    unforced(next);
    if (next.regime !== "shell-filling" || cbKey(next) !== cbKey(current) || oddGroups(next) > oddGroups(current) - (strong ? 0 : 1)) break;
    const earlier = current.evidence.reasons.filter((r) => !next.evidence.reasons.includes(r));
    next.evidence.reasons.unshift(
      ...earlier,
      `peak at ${peaks[found.index].biasV.toFixed(3)} V set aside: it made a VB group odd (each VB level holds two carriers per orbital) and lies at the second-junction resonance of the CB level whose charging peak is at ${peaks[found.sourceIndex].biasV.toFixed(3)} V (expected at ${found.predictedV.toFixed(3)} V)`,
    );
    current = next;
  }
  return current;
}

/** The CB multiplets' labels, peaks and sub-groups, as one string. */
function cbKey(a: Assignment): string {
  return a.multiplets
    .filter((m) => m.band === "CB")
    .map((m) => `${m.label}:${m.peakIndices.join(",")}/${m.subgroups.join("+")}`)
    .join(" ");
}

/** The median step of the peaks in the VB groups (A); 0 without any. */
function valenceMedianStepA(peaks: readonly Peak[], a: Assignment): number {
  const steps = a.multiplets.filter((m) => m.band === "VB").flatMap((m) => m.peakIndices.map((i) => peaks[i].stepA));
  return steps.length ? medianInPlace(Float64Array.from(steps)) : 0;
}

/** The number of VB groups with an odd number of peaks. */
function oddGroups(a: Assignment): number {
  return a.multiplets.filter((m) => m.band === "VB" && m.peakIndices.length % 2 !== 0).length;
}
