/**
 * Two tests of `rulesDecisive` (its notes 23 and 24) on steps too large for a shell-filling
 * charging ladder: a charging peak merged with another peak (its position pulled, or not the
 * level's at all), and a band's first charging peak merged with a resonance and set aside as it.
 */
import type { Peak } from "../../peaks/findPeaks.ts";
import { checkRange } from "../../util/check.ts";
import type { Assignment } from "../assignSpectrum.ts";
import { subgroupSpans, type Multiplet } from "../multiplets.ts";
import { peakRoles } from "../peakMultiplets.ts";

/** Options of {@link mergedStepReasons}; every field optional (defaults in {@link MERGED_STEP_DEFAULTS}). */
export interface MergedStepOptions {
  /**
   * Shell filling: the second charging peak of a sub-group of a CB multiplet counts as stepping
   * too little after the first when its step is below this fraction of the first's;
   * dimensionless. Default 0.35.
   */
  subgroupFallRatio?: number;
  /**
   * Shell filling: a peak the rules set aside counts as lying one Ec before the first charging
   * peak of s (or of the first VB multiplet) when its distance from it is within this fraction of
   * Ec (`quantities.chargingEnergyV`, in bias) of Ec; dimensionless. Default 0.175.
   */
  edgePeakTolerance?: number;
  /**
   * … and counts only when it steps at least this multiple of that first charging peak;
   * dimensionless. Default 2.
   */
  edgePeakStepMin?: number;
}

/** Defaults of {@link mergedStepReasons} (locked by test/assign/decisive/mergedSteps.test.ts). */
export const MERGED_STEP_DEFAULTS = Object.freeze({
  /**
   * A sub-group's second charging step below this fraction of its first: the first holds another
   * peak's step (a level's second charging step is at least 0.6 × its first at Γtip/Γsub ≥ 1.5;
   * chosen on the accuracy benchmark, see note 23 of rulesDecisive).
   */
  subgroupFallRatio: 0.35,
  /** A set-aside peak within this fraction of Ec of one Ec before a band's first charging peak lies there (chosen on the accuracy benchmark, see note 24 of rulesDecisive). */
  edgePeakTolerance: 0.175,
  /**
   * … and stepping at least this multiple of that first charging peak holds a charging peak
   * merged with a resonance (chosen on the accuracy benchmark, see note 24 of rulesDecisive).
   */
  edgePeakStepMin: 2,
});

/** The codes of {@link mergedStepReasons}, by note of `rulesDecisive`: 23, 24. */
export type MergedStepCode = "subgroup-fall" | "edge-peak-set-aside";

/** What {@link mergedStepReasons} reads of an assignment (`assignSpectrum`'s answer gives it all). */
export interface MergedStepAssignment {
  regime: Assignment["regime"];
  /** The multiplets, their peaks ordered from the gap edge outward. */
  multiplets: readonly Pick<Multiplet, "band" | "label" | "peakIndices" | "peaksV" | "subgroups">[];
  /** Ec in bias, V (`quantities.chargingEnergyV`); null when not measured. */
  quantities: { chargingEnergyV: number | null };
  /** The peaks set aside as charging satellites or noise, and as second-junction resonances. */
  evidence: { satellitePeakIndices: readonly number[]; secondJunction: readonly { index: number }[] };
}

/** One reason of {@link mergedStepReasons}. */
export interface MergedStepReason {
  code: MergedStepCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reasons to doubt a shell-filling reading that steps too large for its charging ladder give.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA">[]
 *     The peaks the assignment names by index (`biasV` in V, `stepA` in A).
 * assignment : MergedStepAssignment
 *     The rules' assignment of those peaks (regime, multiplets, Ec in bias, the peaks set aside).
 * options : MergedStepOptions, optional
 *     `subgroupFallRatio` (default 0.35), `edgePeakTolerance` (default 0.175) and
 *     `edgePeakStepMin` (default 2), all dimensionless.
 *
 * Returns
 * -------
 * MergedStepReason[]
 *     Each with its code and its words; empty when none applies (and in shell tunnelling).
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an option that is not a finite number in its range.
 *
 * Notes
 * -----
 * A level of g states filled from the tip (Γtip/Γsub = r) has P(N) ∝ C(g, N)·r^N on each plateau,
 * and the plateau currents rise by steps that fall one after another, slowly at first: the second
 * is r/(1 + r) × the first for g = 2 and more for larger g (at r = 1.5, the edge of shell filling,
 * 0.60, 0.88 and 0.94 for g = 2, 4 and 6; `rulesDecisive` note 15).
 * One level's charging peaks lie one Ec apart in bias, (ε + Ec(n + ½))/η, whatever the rates.
 * 1. (note 23) A sub-group of a CB multiplet whose second charging step is below
 *    `subgroupFallRatio` × its first: the first peak carries another peak's step besides its own (at
 *    low η a resonance through the substrate junction), whose position pulls it off the level's,
 *    or it is that other peak alone, the level's first charging peak lying elsewhere.
 * 2. (note 24) A peak set aside (in no multiplet) between zero bias and the first charging peak of
 *    s (or of the first VB multiplet), one Ec (± `edgePeakTolerance` × Ec) before it and stepping at
 *    least `edgePeakStepMin` × it: the band's first charging peak merged with a resonance (their
 *    steps add), set aside as that resonance, and the band read from its second charging peak,
 *    every peak after it one off. No charging satellite precedes a band's first level.
 *
 * Example
 * -------
 * ```ts
 * // s's two charging peaks, the second stepping 0.2 × the first.
 * mergedStepReasons([{ biasV: 1, stepA: 5e-11 }, { biasV: 1.1, stepA: 1e-11 }], { regime: "shell-filling",
 *   multiplets: [{ band: "CB", label: "s", peakIndices: [0, 1], peaksV: [1, 1.1], subgroups: [2] }],
 *   quantities: { chargingEnergyV: 0.1 }, evidence: { satellitePeakIndices: [], secondJunction: [] } })
 *   .map((r) => r.code);  // => ["subgroup-fall"]
 * ```
 */
export function mergedStepReasons(
  peaks: readonly Pick<Peak, "biasV" | "stepA">[],
  assignment: MergedStepAssignment,
  options: MergedStepOptions = {},
): MergedStepReason[] {
  const D = MERGED_STEP_DEFAULTS;
  const fall = checkRange("subgroupFallRatio", options.subgroupFallRatio ?? D.subgroupFallRatio, 0, 1);
  const tolerance = checkRange("edgePeakTolerance", options.edgePeakTolerance ?? D.edgePeakTolerance, 0, 0.5);
  const stepMin = checkRange("edgePeakStepMin", options.edgePeakStepMin ?? D.edgePeakStepMin, 0, 100);
  const a = assignment;
  const out: MergedStepReason[] = [];
  if (a.regime !== "shell-filling") return out;
  // 1. A sub-group's second charging step far below its first.
  for (const m of a.multiplets.filter((x) => x.band === "CB")) {
    for (const { start, size, indices } of subgroupSpans(m)) {
      const [first, second] = indices.map((i) => peaks[i].stepA);
      if (size < 2 || !(first > 0) || second >= fall * first) continue;
      out.push({
        code: "subgroup-fall",
        text: `shell filling with ${m.label}'s charging peak at ${m.peaksV[start + 1].toFixed(3)} V stepping ${(second / first).toFixed(2)} × the one before it, the first of its sub-group (< ${fall}), whereas a level's second charging step is at least r/(1 + r) ≥ 0.6 × its first in shell filling: the first peak carries another peak's step (a resonance through the substrate junction), which pulls its position, or is that peak alone`,
      });
    }
  }
  // 2. A strong set-aside peak one Ec before the first charging peak of s or of the VB.
  const ecV = a.quantities.chargingEnergyV;
  if (ecV === null || !(ecV > 0)) return out;
  const roles = peakRoles(peaks.length, a);
  const edges = [a.multiplets.find((m) => m.band === "CB" && m.label === "s"), a.multiplets.find((m) => m.band === "VB")];
  for (const m of edges) {
    if (!m || m.peakIndices.length === 0) continue;
    const first = peaks[m.peakIndices[0]];
    const side = Math.sign(first.biasV);
    const i = peaks.findIndex((p, k) => roles[k] !== "level" && Math.sign(p.biasV) === side && Math.abs(p.biasV) < Math.abs(first.biasV) &&
      Math.abs(Math.abs(first.biasV - p.biasV) - ecV) <= tolerance * ecV && p.stepA >= stepMin * first.stepA);
    if (i < 0) continue;
    out.push({
      code: "edge-peak-set-aside",
      text: `shell filling with the peak at ${peaks[i].biasV.toFixed(3)} V, ${(Math.abs(first.biasV - peaks[i].biasV) / ecV).toFixed(2)} × Ec (${(ecV * 1e3).toFixed(0)} mV) before ${m.label}'s first charging peak and stepping ${(peaks[i].stepA / first.stepA).toFixed(2)} × it (≥ ${stepMin}), set aside: ${m.label}'s first charging peak may be that one, merged with a resonance, and ${m.label} read from its second`,
    });
  }
  return out;
}
