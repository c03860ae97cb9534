/**
 * The levels the model fit starts from, read off the peak-based assignment.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";

/** One level to fit, as the assignment gives it. */
export interface LevelSeed {
  band: "CB" | "VB";
  /** Label of the multiplet it came from (s, p, d, v1, …), with a sub-group index when split. */
  label: string;
  /** Carriers the level holds. */
  degeneracy: number;
  /** Bias of the level's first charging peak, V (positive for CB, negative for VB). */
  firstPeakV: number;
  /** Carriers of the band already in the dot when this level takes its first. */
  before: number;
}

/**
 * Identifies a list of seeds (band, degeneracy, first peak to 10 µV, carriers before), so that the
 * same reading reached by two paths is fitted once.
 */
export function seedKey(seeds: readonly LevelSeed[]): string {
  return seeds.map((s) => `${s.band}${s.degeneracy}@${s.firstPeakV.toFixed(5)}/${s.before}`).join(" ");
}

/**
 * The readings without repeats (the same {@link seedKey}), each kept where it first comes.
 *
 * Example
 * -------
 * ```ts
 * const v = { band: "VB" as const, label: "v1", degeneracy: 2, firstPeakV: -1.4, before: 0 };
 * distinctReadings([[v], [], [v]]).length; // => 2
 * ```
 */
export function distinctReadings(readings: Iterable<LevelSeed[]>): LevelSeed[][] {
  const seen = new Set<string>();
  const out: LevelSeed[][] = [];
  for (const r of readings) if (!seen.has(seedKey(r))) (seen.add(seedKey(r)), out.push(r));
  return out;
}

/**
 * Levels to fit, from the assignment: one per multiplet sub-group (shell filling) or one per
 * peak (shell tunnelling and undetermined).
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis of the curve: its regime, multiplets (band, label, degeneracy,
 *     peaks in V, sub-groups) and peaks (position in V, current step in A).
 *
 * Returns
 * -------
 * LevelSeed[]
 *     CB levels first, then VB, each band in filling order: band, label, degeneracy, the bias of
 *     its first charging peak (V) and the carriers of its band before it. Empty when the
 *     assignment has no multiplets.
 *
 * Throws
 * ------
 * Nothing: the analysis comes from {@link analyzeCurve}.
 *
 * Notes
 * -----
 * 1. Shell filling: one level per sub-group of each multiplet; its degeneracy is the sub-group's
 *    size, the last sub-group taking whatever of the multiplet's degeneracy (or peak count) is
 *    left; its first peak is the sub-group's first; `before` counts the band's carriers so far.
 * 2. Otherwise, single levels, one per peak, whose steps in shell tunnelling scale with the
 *    degeneracy: a split CB shell shares its degeneracy out in proportion to the steps in spin
 *    pairs (2 each at least, largest remainders first, a tie to the higher sub-level: a p shell
 *    split by shape is 2+4 or 2+2+2, never 3+3) when it has no more peaks than pairs, else in
 *    single carriers (at least 1 each); a VB level is given 2 × its step over the band's first
 *    step, rounded (degeneracy is not assumed there; 2 without steps). `before` is 0.
 *
 * Example
 * -------
 * ```ts
 * // analysis: the analyzeCurve result of the fitCurve example (shell filling: s doublet, p sextet,
 * // one VB doublet, simulated).
 * levelsToFit(analysis).map((s) => [s.label, s.degeneracy, s.before]);
 * // => [["s", 2, 0], ["p", 6, 2], ["v1", 2, 0]]
 * ```
 */
export function levelsToFit(analysis: CurveAnalysis): LevelSeed[] {
  const a = analysis.assignment;
  const seeds: LevelSeed[] = [];
  const filling = a.regime === "shell-filling";
  for (const band of ["CB", "VB"] as const) {
    let before = 0;
    for (const m of a.multiplets.filter((x) => x.band === band)) {
      if (filling) {
        let k = 0;
        const total = m.degeneracy ?? m.found;
        m.subgroups.forEach((size, j) => {
          const last = j === m.subgroups.length - 1;
          const used = m.subgroups.slice(0, j).reduce((s, x) => s + x, 0);
          const g = last ? Math.max(size, total - used) : size;
          seeds.push({ band, label: m.subgroups.length > 1 ? `${m.label}${j + 1}` : m.label, degeneracy: g, firstPeakV: m.peaksV[k], before });
          before += g;
          k += size;
        });
      } else {
        // Single levels, whose steps in shell tunnelling scale with the degeneracy: a split CB
        // shell shares its degeneracy out in proportion to the steps; a VB level is given
        // 2 × its step over the band's first step (degeneracy is not assumed there).
        const stepOf = (i: number) => analysis.peaks[i].stepA;
        const steps = m.peakIndices.map(stepOf);
        const total = steps.reduce((a, b) => a + b, 0);
        const paired = band === "CB" && m.degeneracy && total > 0 ? spinPairShares(m.degeneracy, steps) : null;
        m.peaksV.forEach((v, j) => {
          let g: number;
          if (paired) g = paired[j];
          else if (band === "CB" && m.degeneracy) g = total > 0 ? Math.max(1, Math.round((m.degeneracy * steps[j]) / total)) : Math.max(1, Math.round(m.degeneracy / m.found));
          else {
            const first = stepOf(a.multiplets.find((x) => x.band === band)!.peakIndices[0]);
            g = first > 0 ? Math.max(1, Math.round((2 * steps[j]) / first)) : 2;
          }
          seeds.push({ band, label: m.found > 1 ? `${m.label}${j + 1}` : m.label, degeneracy: g, firstPeakV: v, before: 0 });
        });
      }
    }
  }
  return seeds;
}

/**
 * A CB shell's degeneracy shared out over its peaks in spin pairs, in proportion to their steps.
 *
 * Parameters
 * ----------
 * degeneracy : number
 *     The shell's carriers (2, 6, 10).
 * steps : readonly number[]
 *     The current step of each peak, A (positive sum).
 *
 * Returns
 * -------
 * number[] | null
 *     Even degeneracies summing to `degeneracy`, one per peak; null when the degeneracy is odd or
 *     there are more peaks than pairs.
 *
 * Notes
 * -----
 * 1. U = degeneracy / 2 pairs; peak j's share U·s_j/Σs; each peak at least one pair, the rest by
 *    largest remainder (a tie to the later peak).
 *
 * Example
 * -------
 * ```ts
 * spinPairShares(6, [1, 1.2]); // => [2, 4]
 * spinPairShares(6, [1, 1]);   // => [2, 4] (the tie to the higher sub-level)
 * ```
 */
export function spinPairShares(degeneracy: number, steps: readonly number[]): number[] | null {
  const pairs = degeneracy / 2;
  if (!Number.isInteger(pairs) || steps.length > pairs) return null;
  const total = steps.reduce((a, b) => a + b, 0);
  const ideal = steps.map((x) => (pairs * x) / total);
  const share = ideal.map((x) => Math.max(1, Math.floor(x)));
  const order = ideal.map((x, j) => j).sort((a, b) => ideal[b] - share[b] - (ideal[a] - share[a]) || b - a);
  let left = pairs - share.reduce((a, b) => a + b, 0);
  for (let k = 0; left > 0; k = (k + 1) % order.length, left--) share[order[k]]++;
  // Too many after the minimum of one pair each: take back from the largest shares over their ideal.
  const over = ideal.map((x, j) => j).sort((a, b) => share[b] - ideal[b] - (share[a] - ideal[a]));
  for (let k = 0; left < 0; k = (k + 1) % over.length) if (share[over[k]] > 1) share[over[k]]--, left++;
  return share.map((x) => 2 * x);
}
