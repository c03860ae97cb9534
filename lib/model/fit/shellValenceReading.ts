/**
 * A reading of the VB peaks as a charging ladder entered from the empty dot with the shell
 * degeneracies of the dot's model (a doublet, then a level of four), and the same levels in
 * filling order: the readings the whole-curve stage falls back on when none of a grouping's own
 * readings fits together with its CB values.
 */
import type { LevelSeed } from "./levelsToFit.ts";

/** Defaults of {@link shellValenceReading} (locked by test/model/fit/shellValenceReading.test.ts). */
export const SHELL_VALENCE_DEFAULTS = Object.freeze({
  /** Degeneracies of the VB levels from the gap outward: the doublet and the level of four the model's VB holds. */
  layout: Object.freeze([2, 4]) as readonly number[],
  /** A peak lies on a lower level's charging ladder when within this fraction of Ec/η of one of its charging peaks. */
  tolerance: 0.15,
});

/**
 * The VB peaks read as levels of the given degeneracies, each entered from the empty dot.
 *
 * Parameters
 * ----------
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V, negative), in any order.
 * chargingEnergyV : number
 *     Ec/η in V (the CB side's fitted Ec over η): the spacing of a level's charging peaks.
 * layout : readonly number[], optional
 *     Degeneracies of the levels from the gap outward. Default [2, 4].
 * tolerance : number, optional
 *     Fraction of Ec/η within which a peak counts as a charging peak of a lower level. Default 0.15.
 *
 * Returns
 * -------
 * LevelSeed[]
 *     VB seeds labelled v1, v2, …, from the gap outward, each with `before` 0 (entered with no hole
 *     in the dot); fewer than the layout when the peaks run out; empty without peaks or with a
 *     charging energy that is not positive.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * From the empty dot a level of degeneracy g with H holes already in the levels nearer the gap
 * shows charging peaks at its entry V₀ and beyond it at V₀ − n·Ec/η for n = 1 … H + g − 1 (each hole
 * added costs one more Ec). Walking the peaks outward from the gap, a peak on such a ladder of a
 * level already read (within `tolerance`·Ec/η) is its charging peak; the first one that is not is
 * the next level's entry. Between the regimes this is how the VB reads; the degeneracies are those
 * the CB layouts assume for s and the first sub-levels of p, and whether they hold is left to the
 * fit's χ² (the reading replaces another only where it fits the whole curve as well as the CB side).
 *
 * Example
 * -------
 * ```ts
 * shellValenceReading([-0.876, -0.969, -1.105, -1.189, -1.29, -1.365], 0.0853).map((s) => `${s.degeneracy}@${s.firstPeakV}`);
 * // => ["2@-0.876", "4@-1.105"]
 * ```
 */
export function shellValenceReading(vbPeaksV: readonly number[], chargingEnergyV: number, layout: readonly number[] = SHELL_VALENCE_DEFAULTS.layout, tolerance: number = SHELL_VALENCE_DEFAULTS.tolerance): LevelSeed[] {
  if (!(chargingEnergyV > 0)) return [];
  const outward = vbPeaksV.filter((v) => v < 0).sort((a, b) => b - a);
  const seeds: LevelSeed[] = [];
  let holes = 0;
  for (const v of outward) {
    if (seeds.length === layout.length) break;
    // On the ladder of a level read: V₀ − n·Ec/η for n = 1 … (holes in the levels read) − 1.
    const onLadder = seeds.some((s) => {
      const n = Math.round((s.firstPeakV - v) / chargingEnergyV);
      return n >= 1 && n < holes && Math.abs(s.firstPeakV - v - n * chargingEnergyV) < tolerance * chargingEnergyV;
    });
    if (onLadder) continue;
    const g = layout[seeds.length];
    seeds.push({ band: "VB", label: `v${seeds.length + 1}`, degeneracy: g, firstPeakV: v, before: 0 });
    holes += g;
  }
  return seeds;
}

/**
 * The same levels entered in filling order: each after the levels nearer the gap are full.
 *
 * Parameters
 * ----------
 * reading : readonly LevelSeed[]
 *     VB seeds from the gap outward (as {@link shellValenceReading} returns them).
 *
 * Returns
 * -------
 * LevelSeed[]
 *     The seeds with `before` the holes the levels before each hold (0, 2, … for a doublet first).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * In shell filling a level's first step lies at (|ε| + Ec·(N + ½))/η with N the holes of the full
 * levels nearer the gap; from the empty dot N = 0. The walk of {@link shellValenceReading} finds
 * the same first peak for the level in both orders where the levels nearer the gap show all their
 * charging peaks first; which entry holds is left to the fit.
 *
 * Example
 * -------
 * ```ts
 * inFillingOrder(shellValenceReading([-1.288, -1.499, -1.726, -1.929], 0.205)).map((s) => s.before);
 * // => [0, 2]
 * ```
 */
export function inFillingOrder(reading: readonly LevelSeed[]): LevelSeed[] {
  let before = 0;
  return reading.map((s) => {
    const out = { ...s, before };
    before += s.degeneracy;
    return out;
  });
}

/**
 * The same reading with the second level entered at the first level's second peak: where the
 * second level's entry lies within a peak's width of the first level's second charging peak, the
 * two show as one peak, and the walk of {@link shellValenceReading} takes it for a charging peak.
 *
 * Parameters
 * ----------
 * reading : readonly LevelSeed[]
 *     VB seeds from the gap outward (as {@link shellValenceReading} returns them).
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V, negative), in any order.
 *
 * Returns
 * -------
 * LevelSeed[] | null
 *     The reading with the second level's first peak at the second peak from the gap; null with
 *     fewer than two levels or two peaks, or where that is already the second level's first peak.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Example
 * -------
 * ```ts
 * hiddenEntryReading(shellValenceReading([-1.288, -1.499, -1.726, -1.929], 0.205), [-1.288, -1.499, -1.726, -1.929])?.[1].firstPeakV;
 * // => -1.499
 * ```
 */
export function hiddenEntryReading(reading: readonly LevelSeed[], vbPeaksV: readonly number[]): LevelSeed[] | null {
  const outward = vbPeaksV.filter((v) => v < 0).sort((a, b) => b - a);
  if (reading.length < 2 || outward.length < 2 || reading[1].firstPeakV === outward[1]) return null;
  return reading.map((s, j) => (j === 1 ? { ...s, firstPeakV: outward[1] } : { ...s }));
}
