/**
 * The shell-filling assignment and its second-junction resonances made consistent: the ladder
 * predicts the resonances, they are set aside, and the ladder is assigned again.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import type { Assignment } from "./assignSpectrum.ts";
import { ladderLevels } from "./ladderLevels.ts";
import { ladderPairs } from "./ladderPairs.ts";
import { ladderResonances } from "./ladderResonances.ts";
import type { SecondJunctionResonance } from "./secondJunction.ts";
import { medianInPlace } from "../util/medianInPlace.ts";
import { subgroupSpans } from "./multiplets.ts";

/** Limits of {@link iterateResonances} (locked by test/assign/iterateResonances.test.ts). */
export const ITERATE_RESONANCES_DEFAULTS = Object.freeze({
  /** At most this many rounds of assign → predict → set aside (a round that changes nothing ends it). */
  maxRounds: 4,
});

/**
 * Rounds of assign → predict → set aside, from a shell-filling assignment.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     The peak list of the assignment.
 * base : Assignment
 *     The assignment to start from (its resonances a first guess).
 * eta : number
 *     Voltage-division factor η in (0, 1).
 * assign : (peaks: readonly Peak[], resonances: readonly SecondJunctionResonance[]) => Assignment
 *     The assignment with the given peaks (steps possibly adjusted) and resonances set aside.
 *
 * Returns
 * -------
 * Assignment
 *     The last round's assignment that is still shell filling, with the reasons of the peaks kept
 *     as levels in its evidence (after the reasons of `base` that are not about one peak); `base` itself when the first round changes nothing or `base` is
 *     not shell filling with an Ec.
 *
 * Notes
 * -----
 * 1. Ec_V is the median spacing of consecutive peaks within the sub-groups of the multiplets
 *    (robust to a resonance counted inside one; the ladder's fitted Ec with fewer than three).
 *    From the current shell-filling ladder, `ladderResonances` predicts every charging peak's
 *    resonance through the substrate junction, η/(1 − η)·(|V| − N·Ec_V) at the opposite bias, and
 *    names the peaks found there.
 * 2. `ladderLevels` keeps those that sit where the ladder expects a charging peak it lacks as
 *    levels (with their level's share of the step) and the rest as resonances; a weak peak it
 *    names as the flank of a kept (shared) peak's step is given a zero step, so that the noise
 *    rule sets it aside. The reasons of the levels and flanks go to the evidence, and that of a
 *    resonance passed over for a peak nearer on the ladder (`ladderLevels` notes 6 and 8) for as
 *    long as it stays a resonance. Two peaks at predicted resonances one Ec apart that a short
 *    shell needs both of are kept as a charging pair (`ladderPairs`), which `ladderLevels`,
 *    judging one peak at a time against the ladder, leaves out.
 * 3. The ladder is assigned again with exactly those resonances set aside (a first guess from
 *    the plain −η·V/(1 − η) of every peak, which misplaces the resonances of higher levels by
 *    N·Ec/(1 − η), is replaced). Rounds repeat until the resonances and levels no longer change,
 *    at most four; a round whose assignment is not shell filling ends them and the previous
 *    round's stands, unless note 4 saves it.
 * 4. A round whose assignment is not shell filling is tried again with each of its kept levels,
 *    in ladder order, set aside once more; the first that gives shell filling is vetoed: it stays a
 *    resonance for the remaining rounds (not judged again) and that assignment is the round's. The
 *    rules read the regime from the first CB peaks, so a resonance kept as a level where a shell
 *    opens (the band-edge level's resonance between s and p, one Ec before p's first peak) can
 *    leave them unable to read it, and the whole round, with the levels it rightly kept, was lost.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // Used by assignSpectrum; see test/assign/iterateResonances.test.ts for a constructed ladder.
 * iterateResonances(peaks, first, 0.6, (p, r) => assignWith(p, 0.6, true, r, {}));
 * ```
 */
export function iterateResonances(
  peaks: readonly Peak[],
  base: Assignment,
  eta: number,
  assign: (peaks: readonly Peak[], resonances: readonly SecondJunctionResonance[]) => Assignment,
): Assignment {
  let current = base;
  let lastKey = "";
  const passed = new Map<number, string>();
  const vetoed = new Set<number>();
  const vetoReasons = new Map<number, string>();
  for (let round = 0; round < ITERATE_RESONANCES_DEFAULTS.maxRounds; round++) {
    if (current.regime !== "shell-filling" || current.quantities.chargingEnergyV === null) break;
    const ecV = medianSpacingV(peaks, current) ?? current.quantities.chargingEnergyV;
    if (!(ecV > 0)) break;
    const all = ladderResonances(peaks, { multiplets: current.multiplets, chargingEnergyV: ecV, eta });
    // A level vetoed in an earlier round (note 4) stays a resonance and is not judged again.
    const predicted = all.filter((r) => !vetoed.has(r.index));
    const inputs = { multiplets: current.multiplets, chargingEnergyV: ecV };
    const judged = ladderPairs(peaks, ladderLevels(peaks, predicted, inputs), inputs);
    const split = { ...judged, resonances: [...judged.resonances, ...all.filter((r) => vetoed.has(r.index))] };
    const key = `${split.resonances.map((r) => r.index).sort((a, b) => a - b)}|${split.levels.map((l) => l.resonance.index).sort((a, b) => a - b)}|${split.flanks.map((f) => f.index).sort((a, b) => a - b)}`;
    const now = `${current.evidence.secondJunction.map((r) => r.index).sort((a, b) => a - b)}`;
    if (key === lastKey || (round === 0 && key === `${now}||`)) break;
    lastKey = key;
    // A kept level keeps its share of the step; a flank of a shared peak steps nothing of its own.
    const share = new Map([...split.levels.map((l) => [l.resonance.index, l.levelStepA] as const), ...split.flanks.map((f) => [f.index, 0] as const)]);
    const adjusted = share.size ? peaks.map((p, i) => (share.has(i) ? { ...p, stepA: share.get(i)! } : p)) : peaks;
    // A resonance passed over for a peak on the ladder keeps its reason while it stays a resonance.
    for (const o of split.passedOver) passed.set(o.resonance.index, o.reason);
    const stillPassed = split.resonances.filter((r) => passed.has(r.index)).map((r) => passed.get(r.index)!);
    let next = assign(adjusted, split.resonances);
    if (next.regime !== "shell-filling") {
      // Note 4: the first kept level whose return to the resonances gives shell filling is vetoed.
      let veto: { l: (typeof split.levels)[number]; a: Assignment } | undefined;
      for (const l of split.levels) {
        const a = assign(adjusted, [...split.resonances, l.resonance]);
        if (a.regime === "shell-filling") {
          veto = { l, a };
          break;
        }
      }
      if (!veto) break;
      vetoed.add(veto.l.resonance.index);
      split.levels = split.levels.filter((l) => l !== veto.l);
      next = veto.a;
      vetoReasons.set(veto.l.resonance.index, `peak at ${peaks[veto.l.resonance.index].biasV.toFixed(3)} V left a resonance (expected at ${veto.l.resonance.predictedV.toFixed(3)} V): kept as a charging peak of ${veto.l.label}, it left the rules unable to read shell filling`);
    }
    // The earlier stages' conclusions stand (per-peak notes are redone by the new assignment).
    const earlier = earlierReasons(base, next);
    next.evidence.reasons.unshift(...earlier, ...split.levels.map((l) => l.reason), ...stillPassed, ...vetoReasons.values(), ...split.flanks.map((f) => f.reason));
    current = next;
  }
  return current;
}

/**
 * The median spacing of consecutive peaks within each sub-group of the multiplets (V), or null
 * with fewer than three spacings: every such pair is one Ec_V apart in shell filling; a resonance
 * counted inside a sub-group splits one spacing into two shorter ones and a missed peak doubles
 * one, so the median holds while fewer than half the pairs are disturbed (the ladder's
 * least-squares spacing does not). Also the Ec_V of `withoutOddValence`.
 */
export function medianSpacingV(peaks: readonly Peak[], a: Assignment): number | null {
  const spacings: number[] = [];
  for (const m of a.multiplets) {
    for (const { indices } of subgroupSpans(m)) {
      const xs = indices.map((i) => Math.abs(peaks[i].biasV));
      for (let k = 1; k < xs.length; k++) spacings.push(Math.abs(xs[k] - xs[k - 1]));
    }
  }
  return spacings.length < 3 ? null : medianInPlace(Float64Array.from(spacings));
}

/**
 * The reasons of an earlier reading that a later one, made from it, carries over: those not about
 * one peak (the later reading says its own of those) and not already among the later's.
 */
export function earlierReasons(from: Pick<Assignment, "evidence">, into: Pick<Assignment, "evidence">): string[] {
  return from.evidence.reasons.filter((r) => !r.startsWith("peak at") && !into.evidence.reasons.includes(r));
}
