/**
 * A shell-filling p read again as spin pairs: each p orbital holds two electrons, whose charging
 * peaks lie exactly one Ec apart, so p's six charging peaks are three pairs one Ec wide.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { Multiplet } from "./multiplets.ts";

/** Limits of {@link spinPairSet} (locked by test/assign/spinPairs.test.ts). */
export const SPIN_PAIRS_DEFAULTS = Object.freeze({
  /**
   * p as read stands when each of its three pairs is one Ec_V wide to within this fraction of
   * Ec_V (note 2): peak positions at the benchmark's noise scatter by a few % of Ec, and a
   * neighbouring resonance pulls a merged peak by up to a fifth of Ec (common practice, no source).
   */
  readTolerance: 0.2,
  /** A set read again has each pair one Ec_V wide to within this fraction of Ec_V (note 3). */
  pairTolerance: 0.25,
  /**
   * A peak of the set that is no resonance steps at least this fraction of p's level step (note 4):
   * weaker, it is a flank of a neighbour's step or what a subtraction left, not a charging peak.
   * p's charging steps at low η spread to about half their median where peaks overlap; chosen on
   * the accuracy benchmark (0.3–0.4 alike, 0 and 0.6 worse).
   */
  memberStepMin: 0.4,
  /**
   * Note 4: a peak left out closer than this × Ec_V to a member of the set at a resonance is the
   * other half of a level and a resonance that the peak search split apart: no two charging peaks
   * lie that close (`ASSIGN_DEFAULTS.minLadderSpacingFraction`, the ladder's own limit).
   */
  splitHalfFraction: ASSIGN_DEFAULTS.minLadderSpacingFraction,
  /** At most this many CB peaks beyond s are candidates (C(12, 6) = 924 sets at most). */
  maxCandidates: 12,
  /**
   * `withSpinPairs`: a peak left out that steps like a level or more and that the ladder did not
   * predict is set aside as the resonance of the nearest prediction within this × Ec_V (a peak
   * pulled by its overlap with a level); farther from every prediction, it is left to the rules.
   */
  unpredictedReach: 0.5,
});

/** What {@link spinPairSet} reads from a shell-filling assignment. */
export interface SpinPairInputs {
  /** The assignment's multiplets (an s doublet and p are needed), peaks named by index. */
  multiplets: readonly Pick<Multiplet, "band" | "label" | "degeneracy" | "peakIndices">[];
  /** Peaks explained as second-junction resonances: set aside by the reading, or where its ladder predicts one. */
  resonant: ReadonlySet<number>;
}

/** Result of {@link spinPairSet}. */
export interface SpinPairSet {
  /** p's peaks read again (indices in the peak list, ascending bias). */
  members: number[];
  /** Peaks inside the new p's span left out of it (indices, ascending bias). */
  leftOut: number[];
  /** The s doublet's spacing, the Ec_V the pairs are measured against, V. */
  chargingEnergyV: number;
  /** Each pair's width less Ec_V, as a fraction of Ec_V (three values). */
  pairDeviations: number[];
  /** p's level step: the median step of p's peaks as read that are no resonance, A. */
  levelStepA: number;
}

/**
 * p's six charging peaks as three spin pairs, where the shell-filling reading's p is not.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA">[]
 *     The peak list of the assignment (positions in V, current steps in A).
 * inputs : SpinPairInputs
 *     The reading's multiplets and the peaks explained as resonances.
 *
 * Returns
 * -------
 * SpinPairSet | null
 *     The set read again, or null where p as read is three spin pairs, where the reading has no s
 *     doublet or p, or where no set of CB peaks makes three pairs.
 *
 * Notes
 * -----
 * With Ec_V the s doublet's spacing and t = `ASSIGN_DEFAULTS.valenceChargingTolerance`:
 * 1. In the constant-interaction model the two electrons of one orbital charge at ε and ε + Ec:
 *    their peaks lie exactly Ec_V apart, and the next orbital's first peak lies Ec_V + Δ/η beyond,
 *    Δ ≥ 0. So p's charging peaks, sorted, form three consecutive pairs each Ec_V wide, whatever
 *    the split of p (2 + 2 + 2, 2 + 4 or whole), with gaps of at least Ec_V between them; the
 *    s doublet is one such pair and gives Ec_V independently of p.
 * 2. p as read stands when it holds six peaks whose pairs are within
 *    `SPIN_PAIRS_DEFAULTS.readTolerance` × Ec_V of Ec_V, or when no CB peak beyond s is a
 *    resonance. At low η a second-junction resonance counted in p, or a p peak taken for one,
 *    breaks a pair (a run of an odd number of peaks); without resonances the rules' own reading
 *    of p (a level entered early, a dip, a charging satellite) stands, and near Γtip/Γsub = 1.5
 *    the weak early peak one Ec before p makes pairs one Ec too early as well as the true ones.
 * 3. Otherwise the CB peaks beyond s (the first `maxCandidates`) are searched for the six whose
 *    pairs lie within `pairTolerance` × Ec_V of Ec_V, whose gaps between pairs and after s are at
 *    least (1 − t)·Ec_V (no two charging peaks are closer than Ec_V), with the least sum of
 *    squared pair deviations.
 * 4. Each peak left out inside the set's span must be explained: a resonance, or stepping
 *    outside `ASSIGN_DEFAULTS.fillingStepRatio` × p's level step (the spread of one shell's
 *    charging steps): less holds no level (a flank or a satellite), more holds more than one
 *    (a resonance the ladder did not predict), or lying closer than
 *    `SPIN_PAIRS_DEFAULTS.splitHalfFraction` × Ec_V to a member of the set at a resonance: no two
 *    charging peaks lie that close (note 1), so the two are a level and a resonance that the
 *    peak search split apart, and the member stands for the level. So is p as read when it is one
 *    peak before the set: a lone peak is no orbital's charging pair (its spin partner would lie
 *    one Ec_V on), and a resonance read as p's first where p's true peaks went to the next
 *    shell leaves p as that one peak. A peak of the set at a
 *    resonance must step at least `fillingStepRatio[0]` × the level step: it holds a level and
 *    the resonance together. (Asking it to step the resonance's predicted share more, (g·r + 1)/(g + r) × its source, lost more
 *    spectra of the benchmark than it saved: the split of a shared step between overlapping
 *    peaks is too rough for that.)
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // Ec_V = 0.2 V: s at 2.0, 2.2 V; p pairs at 2.6/2.8, 3.1/3.3, 3.6/3.8 V, a resonance at 3.0 V read in p.
 * const xs = [2.0, 2.2, 2.6, 2.8, 3.0, 3.1, 3.3, 3.6, 3.8];
 * const peaks = xs.map((biasV, i) => ({ biasV, stepA: i === 4 ? 2e-12 : 1e-12 }));
 * const multiplets = [
 *   { band: "CB" as const, label: "s", degeneracy: 2, peakIndices: [0, 1] },
 *   { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [2, 3, 4, 5, 6, 7] },
 * ];
 * spinPairSet(peaks, { multiplets, resonant: new Set([4]) })?.members;   // => [2, 3, 5, 6, 7, 8]
 * ```
 */
export function spinPairSet(peaks: readonly Pick<Peak, "biasV" | "stepA">[], inputs: SpinPairInputs): SpinPairSet | null {
  const D = SPIN_PAIRS_DEFAULTS;
  const t = ASSIGN_DEFAULTS.valenceChargingTolerance;
  const s = inputs.multiplets.find((m) => m.band === "CB" && m.label === "s");
  const p = inputs.multiplets.find((m) => m.band === "CB" && m.label === "p");
  if (!s || !p || s.peakIndices.length !== 2 || p.degeneracy !== 6) return null;
  const at = (i: number) => peaks[i].biasV;
  const [s1, s2] = s.peakIndices.map(at).sort((a, b) => a - b);
  const ecV = s2 - s1;
  if (!(ecV > 0) || s1 <= 0) return null;
  // Each pair's deviation from Ec_V, or null when the set breaks note 1 (or 3's spacing).
  const deviations = (xs: readonly number[], tolerance: number): number[] | null => {
    if (xs.length !== 6 || xs[0] - s2 < (1 - t) * ecV) return null;
    const out: number[] = [];
    for (let k = 0; k < 5; k++) {
      const g = xs[k + 1] - xs[k];
      if (k % 2 === 1) {
        if (g < (1 - t) * ecV) return null;
        continue;
      }
      const d = (g - ecV) / ecV;
      if (Math.abs(d) > tolerance) return null;
      out.push(d);
    }
    return out;
  };
  const read = [...p.peakIndices].sort((a, b) => at(a) - at(b));
  if (deviations(read.map(at), D.readTolerance)) return null;
  const plain = read.filter((i) => !inputs.resonant.has(i)).map((i) => peaks[i].stepA).sort((a, b) => a - b);
  if (!plain.length) return null;
  const levelStepA = plain[plain.length >> 1];
  const [minRatio, maxRatio] = ASSIGN_DEFAULTS.fillingStepRatio;
  const holdsLevel = (i: number) => peaks[i].stepA >= (inputs.resonant.has(i) ? minRatio : D.memberStepMin) * levelStepA;
  const pool = peaks
    .map((_, i) => i)
    .filter((i) => at(i) > s2 + (1 - t) * ecV)
    .sort((a, b) => at(a) - at(b))
    .slice(0, D.maxCandidates);
  // Note 2: without a resonance among the CB peaks beyond s, nothing is there to break a pair.
  if (!pool.some((i) => inputs.resonant.has(i))) return null;
  // Note 4: a resonance, no level's step, the other half of a member at a resonance split apart,
  // or p as read of one peak before the set.
  const explained = (i: number, members: readonly number[]) =>
    inputs.resonant.has(i) ||
    peaks[i].stepA < minRatio * levelStepA ||
    peaks[i].stepA > maxRatio * levelStepA ||
    members.some((j) => inputs.resonant.has(j) && Math.abs(at(i) - at(j)) < D.splitHalfFraction * ecV) ||
    (read.length === 1 && read[0] === i && at(i) < at(members[0]));
  let best: { members: number[]; deviations: number[]; cost: number } | null = null;
  for (const members of choose(pool, 6)) {
    const dev = deviations(members.map(at), D.pairTolerance);
    if (!dev) continue;
    if (!members.every(holdsLevel)) continue;
    const last = at(members[5]);
    if (pool.some((i) => at(i) < last && !members.includes(i) && !explained(i, members))) continue;
    const cost = dev.reduce((sum, d) => sum + d * d, 0);
    if (!best || cost < best.cost) best = { members, deviations: dev, cost };
  }
  if (!best || best.members.join() === read.join()) return null;
  const last = at(best.members[5]);
  const leftOut = pool.filter((i) => at(i) < last && !best!.members.includes(i));
  return { members: best.members, leftOut, chargingEnergyV: ecV, pairDeviations: best.deviations, levelStepA };
}

/** Every k-element subset of `items`, in order. */
function* choose(items: readonly number[], k: number, start = 0, acc: number[] = []): Generator<number[]> {
  if (acc.length === k) {
    yield [...acc];
    return;
  }
  for (let i = start; i <= items.length - (k - acc.length); i++) {
    acc.push(items[i]);
    yield* choose(items, k, i + 1, acc);
    acc.pop();
  }
}
