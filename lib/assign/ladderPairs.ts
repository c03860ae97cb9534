/**
 * Two neighbouring peaks at predicted resonances that together are a charging pair of the
 * tip-side ladder: a sub-level (or the last two places of a shell) that resonances overlap on
 * both of its peaks, which `ladderLevels` judges one peak at a time and so leaves out.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { LadderLevelInputs, LadderLevels } from "./ladderLevels.ts";

/**
 * Keep as levels the pairs of peaks at predicted resonances that a short CB shell needs.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA">[]
 *     The peak list of the assignment (positions in V, current steps in A).
 * split : LadderLevels
 *     From `ladderLevels` on the same peaks and inputs: the resonances that stand, the levels
 *     kept, the flanks and the resonances passed over.
 * inputs : LadderLevelInputs
 *     The shell-filling assignment the predictions came from (multiplets, Ec in bias).
 *
 * Returns
 * -------
 * LadderLevels
 *     `split` with the pairs found moved from `resonances` to `levels` (each with the label of
 *     its shell, the shell's median step as its level's share and the reason in words); `split`
 *     itself when none is found.
 *
 * Notes
 * -----
 * With Ec_V the ladder's spacing in bias and t = `ASSIGN_DEFAULTS.valenceChargingTolerance`:
 * 1. In shell filling the two charging peaks of one orbital (a sub-level of a split p, or two
 *    places of a whole one) lie Ec_V apart, and the ladder peaks before and after them at least
 *    Ec_V away (orthodox theory: each added carrier costs Ec more, a new level Δ more).
 *    `ladderLevels` keeps a peak at a predicted resonance only one Ec from a ladder peak; where
 *    resonances overlap both peaks of a pair, neither has such a neighbour on the ladder (the
 *    other is a resonance too), and the shell is left short of two places.
 * 2. Two CB peaks at predicted resonances, with no ladder peak between them, are a charging pair
 *    when their spacing is within t·Ec_V of Ec_V, the ladder peaks before and after the pair are
 *    at least (1 − t)·Ec_V away (note 1 of `ladderLevels`), a shell beside them (that of the
 *    ladder peak before the pair, else of the one after it) holds at most its degeneracy less
 *    two, and each steps at least `ASSIGN_DEFAULTS.fillingStepRatio[0]` × the median step of
 *    that shell (a peak holding a level steps at least as much as the level, note 3 of
 *    `ladderLevels`). Both are kept as charging peaks of that shell; the resonances overlap them.
 * 3. The resonances that the model shows on the substrate side are mostly one per level
 *    (E = ε + Ec/2: the substrate side of a shell-filling dot is in shell tunnelling), while the
 *    ladder predicts one per charging peak; so peaks at predicted resonances are often levels
 *    alone. A pair of real resonances (a level's first two carriers through the substrate) lies
 *    Ec/(1 − η) apart in bias, farther than Ec_V = Ec/η for η > 1/2, and its second step is
 *    weak for a doublet; the shell's need and the step bound keep most of them out.
 * 4. Pairs are taken from the gap edge outward; a kept pair joins its shell before the next is
 *    judged.
 *
 * Example
 * -------
 * ```ts
 * // Ec_V = 0.2 V; s at 1.6, 1.8 V; p read as 3.0, 3.2, 3.5, 3.7 V (4 of 6) with resonances
 * // predicted at 2.4 and 2.6 V (its first sub-level, each peak also stepping a resonance).
 * const peaks = [1.6, 1.8, 2.4, 2.6, 3.0, 3.2, 3.5, 3.7].map((biasV) => ({ biasV, stepA: 1e-12 }));
 * const res = (index: number) => ({ index, sourceIndex: -1, predictedV: peaks[index].biasV, carriersBelow: 0 });
 * const s = { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] };
 * const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [4, 5, 6, 7] };
 * const split = { resonances: [res(2), res(3)], levels: [], flanks: [], passedOver: [] };
 * ladderPairs(peaks, split, { multiplets: [s, p], chargingEnergyV: 0.2 }).levels.map((l) => l.resonance.index);
 * // => [2, 3]
 * ```
 */
export function ladderPairs(peaks: readonly Pick<Peak, "biasV" | "stepA">[], split: LadderLevels, inputs: LadderLevelInputs): LadderLevels {
  const ecV = inputs.chargingEnergyV;
  const t = ASSIGN_DEFAULTS.valenceChargingTolerance;
  const [minRatio, maxRatio] = ASSIGN_DEFAULTS.fillingStepRatio;
  const at = (i: number) => peaks[i].biasV;
  const resonant = new Set(split.resonances.map((r) => r.index));
  const flank = new Set(split.flanks.map((f) => f.index));
  // The CB ladder after `ladderLevels`: each shell's peaks less the resonances and flanks, with its kept levels.
  const shells = inputs.multiplets
    .filter((m) => m.band === "CB" && m.degeneracy !== null)
    .map((m) => ({ m, peaks: new Set([...m.peakIndices.filter((i) => !resonant.has(i) && !flank.has(i)), ...split.levels.filter((l) => l.label === m.label).map((l) => l.resonance.index)]) }));
  // A resonance passed over for a peak nearer on the ladder stays one (note 6 of `ladderLevels`).
  const passed = new Set(split.passedOver.map((o) => o.resonance.index));
  const candidates = split.resonances.filter((r) => at(r.index) > 0 && !passed.has(r.index)).sort((a, b) => at(a.index) - at(b.index));
  // CB peaks in no multiplet, at no resonance and no flank: a rival beside a pair peak (note 6).
  const member = new Set(inputs.multiplets.flatMap((m) => m.peakIndices));
  const free = peaks.map((_, i) => i).filter((i) => at(i) > 0 && !resonant.has(i) && !member.has(i) && !flank.has(i) && !split.levels.some((l) => l.resonance.index === i));
  const pairs: typeof split.levels = [];
  const dropped: typeof split.levels = [];
  const clear = (g: number | null) => g === null || g >= (1 - t) * ecV;
  for (let k = 0; k + 1 < candidates.length; k++) {
    const [a, b] = [candidates[k], candidates[k + 1]];
    // Note 5: single levels kept this round that crowd the pair give way to it.
    const crowd = split.levels.filter((l) => !dropped.includes(l) && [a, b].some((r) => Math.abs(at(l.resonance.index) - at(r.index)) < (1 - t) * ecV));
    const out = new Set(crowd.map((l) => l.resonance.index));
    const ladder = shells.flatMap((h) => [...h.peaks]).filter((i) => !out.has(i)).sort((x, y) => at(x) - at(y));
    const before = ladder.filter((i) => at(i) < at(a.index)).pop();
    const after = ladder.find((i) => at(i) > at(a.index));
    if (after !== undefined && at(after) < at(b.index)) continue;
    if (Math.abs(at(b.index) - at(a.index) - ecV) > t * ecV) continue;
    if (!clear(before === undefined ? null : at(a.index) - at(before)) || !clear(after === undefined ? null : at(after) - at(b.index))) continue;
    const of = (i: number | undefined) => (i === undefined ? undefined : shells.find((h) => h.peaks.has(i)));
    const size = (h: (typeof shells)[number]) => [...h.peaks].filter((i) => !out.has(i)).length;
    const home = [of(before), of(after)].find((h) => h !== undefined && size(h) + 2 <= h.m.degeneracy!);
    if (!home) continue;
    const steps = [...home.peaks].filter((i) => !out.has(i)).map((i) => peaks[i].stepA).sort((x, y) => x - y);
    const levelStepA = steps[steps.length >> 1];
    if (peaks[a.index].stepA < minRatio * levelStepA || peaks[b.index].stepA < minRatio * levelStepA) continue;
    const likeLevel = (i: number) => peaks[i].stepA >= minRatio * levelStepA && peaks[i].stepA <= maxRatio * levelStepA;
    if (free.some((i) => likeLevel(i) && [a, b].some((r) => Math.abs(at(i) - at(r.index)) < (1 - t) * ecV))) continue;
    for (const l of crowd) {
      for (const h of shells) h.peaks.delete(l.resonance.index);
      dropped.push(l);
    }
    for (const r of [a, b]) {
      home.peaks.add(r.index);
      const other = r === a ? b : a;
      pairs.push({
        resonance: r,
        label: home.m.label,
        levelStepA,
        reason: `peak at ${at(r.index).toFixed(3)} V kept as a charging peak of ${home.m.label}: with the peak at ${at(other.index).toFixed(3)} V, one Ec away and also at a predicted resonance, it makes a charging pair clear of the ladder (none closer than ${(1 - t).toFixed(1)} Ec) that ${home.m.label} needs; the resonance at ${r.predictedV.toFixed(3)} V overlaps it`,
      });
    }
    k++;
  }
  if (!pairs.length) return split;
  const taken = new Set(pairs.map((l) => l.resonance.index));
  const gone = new Set(dropped.map((l) => l.resonance.index));
  return {
    resonances: [...split.resonances.filter((r) => !taken.has(r.index)), ...dropped.map((l) => l.resonance)],
    levels: [...split.levels.filter((l) => !dropped.includes(l)), ...pairs],
    flanks: split.flanks.filter((f) => !gone.has(f.sharedIndex)),
    passedOver: [
      ...split.passedOver,
      ...dropped.map((l) => ({
        resonance: l.resonance,
        levelIndex: pairs.find((p) => Math.abs(at(p.resonance.index) - at(l.resonance.index)) < (1 - t) * ecV)!.resonance.index,
        reason: `peak at ${at(l.resonance.index).toFixed(3)} V left a resonance (expected at ${l.resonance.predictedV.toFixed(3)} V): it crowds a charging pair of ${l.label} at predicted resonances, which the shell needs whole (each orbital holds two carriers)`,
      })),
    ],
  };
}
