/**
 * Which peaks at a predicted second-junction resonance are also charging peaks of the tip-side
 * ladder: a level and a resonance that coincide make one peak, and the ladder needs it.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { LadderResonance } from "./ladderResonances.ts";
import type { Multiplet } from "./multiplets.ts";

/** Tolerance of {@link ladderLevels} (locked by test/assign/ladderLevels.test.ts). */
export const LADDER_LEVELS_DEFAULTS = Object.freeze({
  /**
   * Note 5: the least tolerance of "one Ec beyond a shell's last peak", as a fraction of Ec
   * (the shell's own spacings set it where they scatter more); peak positions at the benchmark's
   * noise scatter by a few % of Ec (common practice, no source). Note 8: two peaks whose
   * distances from one Ec off the ladder differ by less are not told apart by them.
   */
  continuationToleranceMin: 0.05,
  /**
   * Note 10: how much nearer than one Ec, as a fraction of Ec, a shell's next peak may lie to a
   * peak kept as the shell's first (its spin partner lies one Ec on); peak positions scatter by
   * a few % of Ec at the benchmark's noise (common practice, no source).
   */
  firstPairTolerance: 0.1,
  /**
   * Note 10: how far, as a fraction of Ec, a peak shared by a resonance and a level lying below
   * it is drawn below the predicted resonance at the least; predictions carry the scatter of
   * their source peaks × η/(1 − η), a few % of Ec (common practice, no source).
   */
  sharedPullMin: 0.03,
});

/** What {@link ladderLevels} reads from a shell-filling assignment. */
export interface LadderLevelInputs {
  /** The assignment's multiplets (CB shells, VB groups), peaks named by index. */
  multiplets: readonly Pick<Multiplet, "band" | "label" | "degeneracy" | "peakIndices">[];
  /** Ec in bias (the ladder's spacing), V; > 0. */
  chargingEnergyV: number;
}

/** Result of {@link ladderLevels}. */
export interface LadderLevels {
  /** The predicted resonances that stand (set aside from the ladders). */
  resonances: LadderResonance[];
  /**
   * The peaks kept as levels although a resonance was predicted there: the peak, the label of the
   * multiplet it completes, its level's share of the summed step (A: the median step of that
   * multiplet's other peaks) and the reason in words.
   */
  levels: { resonance: LadderResonance; label: string; levelStepA: number; reason: string }[];
  /**
   * Weak peaks beside a kept level that are a part of its step (note 7): the peak, the kept peak
   * it belongs to (indices in the peak list) and the reason in words.
   */
  flanks: { index: number; sharedIndex: number; reason: string }[];
  /**
   * Peaks at predicted resonances left as resonances because another peak sits nearer on the
   * ladder (one beside them, note 6, or a later one for the same shell's last place, note 8): the
   * resonance, that peak's index in the peak list and the reason in words.
   */
  passedOver: { resonance: LadderResonance; levelIndex: number; reason: string }[];
}

/**
 * Split the peaks at predicted resonances into resonances and levels of the charging ladder.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA">[]
 *     The peak list of the assignment (positions in V, current steps in A).
 * predicted : readonly LadderResonance[]
 *     From `ladderResonances`: the peaks found at the resonances the ladder predicts.
 * inputs : LadderLevelInputs
 *     The shell-filling assignment the predictions came from.
 *
 * Returns
 * -------
 * LadderLevels
 *     The resonances that stand, the peaks kept as levels and the weak peaks beside them that
 *     are part of their step.
 *
 * Notes
 * -----
 * With Ec_V the ladder's spacing in bias and t = `ASSIGN_DEFAULTS.valenceChargingTolerance`:
 * 1. In shell filling consecutive charging peaks of one level lie Ec_V apart, and the first peak
 *    of the next level (or sub-level) lies Ec_V + Δ/η beyond the last of the one before, Δ ≥ 0
 *    the level spacing (orthodox theory: each added carrier costs Ec more). So no two charging
 *    peaks of a band are closer than Ec_V, and a peak closer than (1 − t)·Ec_V to the ladder
 *    peak before or after it is not a charging peak: it stays a resonance.
 * 2. A peak at a predicted resonance whose distances to the ladder peaks before and after it
 *    (the multiplets' peaks other than itself) are both at least (1 − t)·Ec_V, one of them
 *    within t·Ec_V of Ec_V (a charging step of a level), is where the ladder expects a charging
 *    peak. It is kept as a level — the resonance overlaps it and cannot be told apart — when the
 *    ladder needs it: the shell whose charging ladder it extends (that of the peak one Ec
 *    before it, else of the peak one Ec after it, the first shell at the gap edge; a new shell
 *    starts Ec + Δ/η beyond the last peak of the one before, not one Ec) holds fewer peaks than
 *    its degeneracy without it (note 5). VB groups carry no degeneracy, so nothing says their ladder
 *    needs a peak: in the VB a peak at a predicted resonance stays a resonance (a VB ladder
 *    bridged by resonances reads as one long group otherwise), except at the gap edge (note 9).
 * 3. The kept peak's step is the sum of the level's and the resonance's; the level's share is
 *    taken as the median step of the multiplet's other peaks (charging steps of one shell in
 *    shell filling are alike, each limited by the slow junction). A peak stepping less than
 *    `ASSIGN_DEFAULTS.fillingStepRatio[0]` × that share holds no level: it stays a resonance.
 * 4. Peaks are judged from the gap edge outward against the multiplets' peaks less the
 *    resonances already found; a kept peak joins its multiplet. A peak further out that crowds
 *    the one judged and is itself at a predicted resonance is passed over (it is judged next,
 *    against the ladder that then holds the first).
 * 5. A shell that the next shell's first peak continues does not need the peak: when that peak
 *    (the band's first ladder peak beyond the shell's last, not itself at a predicted resonance
 *    still to be judged) lies one Ec beyond the shell's last peak, to within the scatter of the
 *    shell's own Ec spacings (at least `LADDER_LEVELS_DEFAULTS.continuationToleranceMin` × Ec),
 *    it is the shell's own charging peak — the next shell would start Ec + Δ/η beyond — and
 *    counts toward the degeneracy. A resonance just below a shell's first peak would otherwise
 *    pass for that first peak and push the shell's last one into the next shell.
 * 6. A peak at a predicted resonance is not kept as a level where another peak, within
 *    (1 − t)·Ec_V of it, in no multiplet and at no predicted resonance, lies nearer one Ec from
 *    the ladder peak before or after it and steps like a level of the shell alone (within
 *    `ASSIGN_DEFAULTS.fillingStepRatio` × the level's share, note 3; a peak stepping more
 *    holds a resonance too): only one of two peaks that close can be a charging peak (note 1),
 *    and the one on the ladder is the level; the peak at the resonance stays a resonance.
 * 7. A kept peak holds the level and the resonance together (a shared peak). Another peak closer
 *    to it than `ASSIGN_DEFAULTS.minLadderSpacingFraction` × Ec_V, in no multiplet and at no
 *    predicted resonance, stepping less than `ASSIGN_DEFAULTS.fillingStepRatio[0]` × the level's
 *    share, holds no level (note 3) and cannot be a charging peak beside the shared one (note 1):
 *    it is the flank of the shared peak's step, split off by the peak search where the level and
 *    the resonance lie a fraction of a width apart. It is named in `flanks` (the caller sets it
 *    aside), so that the ladder takes the shared peak rather than the flank.
 * 8. Judged from the gap edge outward, the first peak that passes notes 2–3 takes a shell's last
 *    free place whatever its fit (a resonance 0.7–1.3 Ec before the shell's first peak passes
 *    note 2). A later peak that passes them but for the shell's need, and lies nearer one Ec
 *    from its ladder neighbours than a peak kept earlier for that shell by more than
 *    `LADDER_LEVELS_DEFAULTS.continuationToleranceMin` × Ec_V (the scatter of peak positions),
 *    takes the place: it is kept, and the earlier one (with its flanks) stays a resonance.
 * 9. Spin alone puts two carriers on every level, so in shell filling each level shows at least
 *    two charging peaks Ec_V apart. The VB's gap-edge group read as one peak lacks one, and it
 *    cannot lie further out (a peak one Ec_V beyond would have joined the group): a peak at a
 *    predicted resonance one Ec_V nearer the gap (notes 2–3, nothing nearer the gap than it in
 *    the VB) is kept as that group's first charging peak. Where a CB level's resonance falls on
 *    the VB edge level, setting the shared peak aside had moved the VB edge one Ec_V out and
 *    widened the gap by as much. No VB group further out is completed this way: the window or
 *    a resonance bridging two groups can leave one peak there. (`valenceEdgePartner` reads the
 *    same for resonances set aside before the rounds, without the ladder's step share.)
 * 10. A CB shell's first two charging peaks put two electrons on its first orbital (spin), so
 *    they lie Ec_V apart; the shell's first peak follows the shell before at Ec_V + Δ/η, not at
 *    one Ec. A peak to be kept as the first of a shell with a degeneracy (no peak of that shell
 *    before it) whose next ladder peak lies nearer than
 *    (1 − `LADDER_LEVELS_DEFAULTS.firstPairTolerance`) × Ec_V is no level alone: were it shared,
 *    the level would lie one Ec_V before that next peak, below the kept peak, and would draw the
 *    shared peak below the predicted resonance. A peak not at least
 *    `LADDER_LEVELS_DEFAULTS.sharedPullMin` × Ec_V below its predicted resonance is then the
 *    resonance alone and stays one: the shell's true first peak is the next one. Where the shell
 *    lacks a peak elsewhere, such a resonance 0.7–0.9 Ec_V before the shell's first peak passes
 *    note 2 and would shift the shell by one place.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // Ec_V = 0.3 V; p read as 2.9, 3.6, 3.9, 4.6 V (4 of 6) with resonances predicted at 3.2 V
 * // (one Ec after 2.9, 0.4 V before 3.6: a charging step) and 4.1 V (0.2 V after 3.9: too close).
 * const peaks = [2.9, 3.2, 3.6, 3.9, 4.1, 4.6].map((biasV) => ({ biasV, stepA: 1e-12 }));
 * const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [0, 2, 3, 5] };
 * const at = (index: number) => ({ index, sourceIndex: -1, predictedV: peaks[index].biasV, carriersBelow: 0 });
 * const out = ladderLevels(peaks, [at(1), at(4)], { multiplets: [p], chargingEnergyV: 0.3 });
 * out.levels.map((l) => l.resonance.index);     // => [1]
 * out.resonances.map((r) => r.index);           // => [4]
 * ```
 */
export function ladderLevels(peaks: readonly Pick<Peak, "biasV" | "stepA">[], predicted: readonly LadderResonance[], inputs: LadderLevelInputs): LadderLevels {
  const ecV = inputs.chargingEnergyV;
  const t = ASSIGN_DEFAULTS.valenceChargingTolerance;
  const out: LadderLevels = { resonances: [], levels: [], flanks: [], passedOver: [] };
  const minRatio = ASSIGN_DEFAULTS.fillingStepRatio[0];
  const at = (i: number) => Math.abs(peaks[i].biasV);
  // The ladder: each multiplet's peaks other than the resonances found so far (a kept level joins).
  const pending = new Set(predicted.map((r) => r.index));
  const atResonance = new Set(predicted.map((r) => r.index));
  const members = inputs.multiplets.map((m) => ({ m, peaks: new Set(m.peakIndices) }));
  const member = (i: number) => members.some(({ peaks: s }) => s.has(i));
  // Peaks of the same side in no multiplet and at no predicted resonance (notes 6–7).
  const free = (side: number) => peaks.map((_, i) => i).filter((i) => Math.sign(peaks[i].biasV) === side && !atResonance.has(i) && !member(i));
  const order = [...predicted].sort((a, b) => at(a.index) - at(b.index));
  // Each kept level's distance from one Ec off its ladder neighbours, V (note 8).
  const kept = new Map<number, number>();
  const clear = (g: number | null) => g === null || g >= (1 - t) * ecV;
  const step = (g: number | null) => g !== null && Math.abs(g - ecV) <= t * ecV;
  for (const r of order) {
    pending.delete(r.index);
    const x = at(r.index);
    const side = Math.sign(peaks[r.index].biasV);
    const band = members.filter(({ m }) => m.peakIndices.length && Math.sign(peaks[m.peakIndices[0]].biasV) === side);
    const ladder = band.flatMap(({ peaks: s }) => [...s]).filter((i) => i !== r.index).sort((a, b) => at(a) - at(b));
    const before = ladder.filter((i) => at(i) < x).pop();
    let after = ladder.find((i) => at(i) > x);
    // A crowding peak further out that is itself at a predicted resonance is judged after this one.
    if (after !== undefined && pending.has(after) && !clear(at(after) - x)) after = ladder.find((i) => at(i) > x && !pending.has(i));
    const gapBefore = before === undefined ? null : x - at(before);
    const gapAfter = after === undefined ? null : at(after) - x;
    // The multiplet whose charging ladder it extends: that of the peak one Ec before it, else of
    // the peak one Ec after it (the band's first multiplet at the gap edge).
    const of = (i: number | undefined) => (i === undefined ? undefined : band.find(({ peaks: s }) => s.has(i)));
    const needs = (h: (typeof band)[number] | undefined) => {
      if (h === undefined) return false;
      const own = [...h.peaks].filter((i) => i !== r.index).map(at).sort((a, b) => a - b);
      // A VB group has no degeneracy but spin's: the gap-edge group of one peak needs one (note 9).
      if (h.m.band === "VB") return h === band[0] && own.length === 1;
      if (h.m.degeneracy === null) return false;
      // The band's next peak beyond the shell (in another multiplet; not itself still to be judged).
      const next = own.length ? ladder.find((i) => at(i) > own[own.length - 1]) : undefined;
      const continues = next !== undefined && !pending.has(next) && continuesShell(own, at(next), ecV);
      return own.length + (continues ? 1 : 0) < h.m.degeneracy;
    };
    const homes = [step(gapBefore) ? of(before) : undefined, step(gapAfter) ? of(after) : undefined, before === undefined ? band[0] : undefined];
    let home = homes.find(needs);
    // How far a position lies from one Ec after the ladder peak before it or before the one after it.
    const offLadder = (v: number) => Math.min(...[before, after].filter((i) => i !== undefined).map((i) => Math.abs(Math.abs(v - at(i!)) - ecV)));
    // Note 8: a shell made full by a level kept further from the ladder gives that place up.
    let displaced: (typeof out.levels)[number] | undefined;
    if (!home && clear(gapBefore) && clear(gapAfter)) {
      for (const h of homes) {
        if (!h || home) continue;
        // Not a neighbour of this peak: the gaps above were measured from it.
        const worst = out.levels.filter((l) => h.peaks.has(l.resonance.index) && l.resonance.index !== before && l.resonance.index !== after).sort((a, b) => (kept.get(b.resonance.index) ?? 0) - (kept.get(a.resonance.index) ?? 0))[0];
        if (!worst || (kept.get(worst.resonance.index) ?? 0) - offLadder(x) <= LADDER_LEVELS_DEFAULTS.continuationToleranceMin * ecV) continue;
        h.peaks.delete(worst.resonance.index);
        if (needs(h)) {
          home = h;
          displaced = worst;
        } else h.peaks.add(worst.resonance.index);
      }
    }
    const others = home ? [...home.peaks].filter((i) => i !== r.index).map((i) => peaks[i].stepA).sort((a, b) => a - b) : [];
    const levelStepA = others.length ? others[others.length >> 1] : peaks[r.index].stepA;
    // A peak holding a level steps at least as much as the level (note 3), to within the spread of
    // one shell's charging steps.
    const holdsLevel = peaks[r.index].stepA >= minRatio * levelStepA;
    // Note 6: a peak beside it, nearer one Ec from the ladder and stepping like a level, is the level.
    const likeLevel = (i: number) => peaks[i].stepA >= minRatio * levelStepA && peaks[i].stepA <= ASSIGN_DEFAULTS.fillingStepRatio[1] * levelStepA;
    const beside = free(side);
    const rival = beside.find((i) => Math.abs(at(i) - x) < (1 - t) * ecV && offLadder(at(i)) < offLadder(x) && likeLevel(i));
    // The shell it would be kept in (notes 1–3), were there no rival.
    // Note 10: a shell's first peak lies one Ec before its spin partner; nearer, it is shared or a resonance.
    const firstOfShell = home !== undefined && home.m.band !== "VB" && home.m.degeneracy !== null && [...home.peaks].every((i) => i === r.index || at(i) > x);
    const short = firstOfShell && gapAfter !== null && gapAfter < (1 - LADDER_LEVELS_DEFAULTS.firstPairTolerance) * ecV;
    const pairOk = !short || x - Math.abs(r.predictedV) <= -LADDER_LEVELS_DEFAULTS.sharedPullMin * ecV;
    const keepIn = clear(gapBefore) && clear(gapAfter) && (step(gapBefore) || step(gapAfter)) && holdsLevel && pairOk ? home : undefined;
    if (keepIn && rival === undefined) {
      if (displaced) {
        out.levels.splice(out.levels.indexOf(displaced), 1);
        out.flanks = out.flanks.filter((f) => f.sharedIndex !== displaced!.resonance.index);
        out.resonances.push(displaced.resonance);
        out.passedOver.push({
          resonance: displaced.resonance,
          levelIndex: r.index,
          reason: `peak at ${peaks[displaced.resonance.index].biasV.toFixed(3)} V left a resonance (expected at ${displaced.resonance.predictedV.toFixed(3)} V): the peak at ${peaks[r.index].biasV.toFixed(3)} V lies nearer one Ec on the ladder of ${keepIn.m.label}, which holds one of them`,
        });
      }
      kept.set(r.index, offLadder(x));
      keepIn.peaks.add(r.index);
      out.levels.push({
        resonance: r,
        label: keepIn.m.label,
        levelStepA,
        reason: `peak at ${peaks[r.index].biasV.toFixed(3)} V kept as a charging peak of ${keepIn.m.label}: it lies where the ladder expects one (one Ec from a neighbour, none closer than ${(1 - t).toFixed(1)} Ec) and ${keepIn.m.label} needs it; the resonance at ${r.predictedV.toFixed(3)} V overlaps it`,
      });
      // Note 7: a weak peak crowding the shared peak is a flank of its step.
      for (const i of beside) {
        if (Math.abs(at(i) - x) >= ASSIGN_DEFAULTS.minLadderSpacingFraction * ecV || peaks[i].stepA >= minRatio * levelStepA || out.flanks.some((f) => f.index === i)) continue;
        out.flanks.push({
          index: i,
          sharedIndex: r.index,
          reason: `peak at ${peaks[i].biasV.toFixed(3)} V set aside: closer than ${ASSIGN_DEFAULTS.minLadderSpacingFraction} Ec to the peak at ${peaks[r.index].biasV.toFixed(3)} V that holds a level of ${keepIn.m.label} and a resonance, and stepping less than ${minRatio} × the level's, it is a flank of that peak's step (no charging peak)`,
        });
      }
    } else {
      if (displaced) home!.peaks.add(displaced.resonance.index);
      for (const h of members) h.peaks.delete(r.index);
      out.resonances.push(r);
      if (rival !== undefined && keepIn) {
        out.passedOver.push({
          resonance: r,
          levelIndex: rival,
          reason: `peak at ${peaks[r.index].biasV.toFixed(3)} V left a resonance (expected at ${r.predictedV.toFixed(3)} V): the peak at ${peaks[rival].biasV.toFixed(3)} V beside it lies nearer one Ec on the ladder of ${keepIn.m.label} and steps like its level`,
        });
      }
    }
  }
  return out;
}

/**
 * Whether a peak at |bias| `nextV` (V; the band's first ladder peak beyond a shell, in another
 * multiplet) continues the shell's charging ladder (note 5 of {@link ladderLevels}): it lies one Ec beyond
 * the shell's last peak to within the scatter of the shell's own Ec spacings about Ec (those
 * within `ASSIGN_DEFAULTS.valenceChargingTolerance` of it), at least
 * `LADDER_LEVELS_DEFAULTS.continuationToleranceMin` × Ec. `own` holds the shell's |bias| values, V, ascending.
 */
function continuesShell(own: readonly number[], nextV: number, ecV: number): boolean {
  if (!own.length) return false;
  const t = ASSIGN_DEFAULTS.valenceChargingTolerance;
  const deviations = own.slice(1).map((x, k) => Math.abs(x - own[k] - ecV)).filter((d) => d <= t * ecV);
  const tolerance = Math.max(LADDER_LEVELS_DEFAULTS.continuationToleranceMin * ecV, ...deviations);
  return Math.abs(nextV - own[own.length - 1] - ecV) <= tolerance;
}
