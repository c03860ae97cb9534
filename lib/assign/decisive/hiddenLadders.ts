/**
 * Two tests of `rulesDecisive` (its notes 25 and 26) on a charging ladder that the rules' reading
 * bends or hides: a charging peak kept under a resonance that lies off its sub-group's ladder, and
 * VB peaks read as single levels that come in charging pairs.
 */
import type { Peak } from "../../peaks/findPeaks.ts";
import { checkRange } from "../../util/check.ts";
import { medianInPlace } from "../../util/medianInPlace.ts";
import type { Assignment } from "../assignSpectrum.ts";
import { subgroupSpans, type Multiplet } from "../multiplets.ts";

/** Options of {@link hiddenLadderReasons}; every field optional (defaults in {@link HIDDEN_LADDER_DEFAULTS}). */
export interface HiddenLadderOptions {
  /**
   * Shell filling: a CB charging peak that the rules kept although a predicted second-junction
   * resonance overlaps it counts as pulled off its ladder when it lies further than this fraction
   * of its sub-group's spacing (the median over the sub-group's other spacings) from where its
   * neighbour and that spacing put it; dimensionless. Default 0.16.
   */
  pulledPeakTolerance?: number;
  /**
   * Shell tunnelling: two VB level spacings, one level apart, count as alike when they differ by
   * at most this fraction of their mean; dimensionless. Default 0.1.
   */
  pairSpacingTolerance?: number;
  /** … and as short when both are below this fraction of the spacing between them; dimensionless. Default 0.6. */
  pairGapRatioMax?: number;
}

/** Defaults of {@link hiddenLadderReasons} (locked by test/assign/decisive/hiddenLadders.test.ts). */
export const HIDDEN_LADDER_DEFAULTS = Object.freeze({
  /**
   * A kept charging peak further than this fraction of its sub-group's spacing from its place on
   * the ladder is pulled by the resonance that overlaps it (chosen on the accuracy benchmark, see
   * note 25 of rulesDecisive).
   */
  pulledPeakTolerance: 0.16,
  /** Two VB level spacings one level apart within this fraction of their mean are alike (chosen on the accuracy benchmark, see note 26 of rulesDecisive). */
  pairSpacingTolerance: 0.1,
  /** … and short when both are below this fraction of the spacing between them (chosen on the accuracy benchmark, see note 26 of rulesDecisive). */
  pairGapRatioMax: 0.6,
});

/** The codes of {@link hiddenLadderReasons}, by note of `rulesDecisive`: 25, 26. */
export type HiddenLadderCode = "pulled-charging-peak" | "vb-charging-pairs";

/** What {@link hiddenLadderReasons} reads of an assignment (`assignSpectrum`'s answer gives it all). */
export interface HiddenLadderAssignment {
  regime: Assignment["regime"];
  /** The multiplets, their peaks ordered from the gap edge outward. */
  multiplets: readonly Pick<Multiplet, "band" | "label" | "peaksV" | "subgroups" | "peakIndices">[];
  /** The rules' reasons, in words (a peak kept under a resonance is named there with its position to 1 mV). */
  evidence: { reasons: readonly string[] };
}

/** One reason of {@link hiddenLadderReasons}. */
export interface HiddenLadderReason {
  code: HiddenLadderCode;
  /** In words, with the numbers. */
  text: string;
}

/** The peaks the rules kept in a multiplet although a predicted resonance overlaps them, V (to 1 mV). */
function keptUnderResonanceV(reasons: readonly string[]): number[] {
  const out: number[] = [];
  for (const r of reasons) {
    const m = /^peak at (-?\d+\.\d+) V kept as a (charging peak|level)\b.*the resonance at -?\d+\.\d+ V overlaps it/.exec(r);
    if (m) out.push(Number(m[1]));
  }
  return out;
}

/**
 * The reasons to doubt a reading whose charging ladder a resonance bends, or which reads a
 * charging ladder as single levels.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV">[]
 *     The peaks the assignment names by index (`biasV` in V).
 * assignment : HiddenLadderAssignment
 *     The rules' assignment of those peaks (regime, multiplets, reasons).
 * options : HiddenLadderOptions, optional
 *     `pulledPeakTolerance` (default 0.16), `pairSpacingTolerance` (default 0.1) and
 *     `pairGapRatioMax` (default 0.6), all dimensionless.
 *
 * Returns
 * -------
 * HiddenLadderReason[]
 *     Each with its code and its words; empty when none applies.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an option that is not a finite number in its range.
 *
 * Notes
 * -----
 * One level's charging peaks lie one Ec apart in bias, (ε + Ec(n + ½))/η, whatever the rates; a
 * resonance through the substrate junction lies elsewhere, and where the two overlap the peak
 * list holds one peak between them.
 * 1. (note 25) Shell filling with a CB charging peak that the rules kept although a predicted
 *    resonance overlaps it, in a sub-group of at least three, lying further than
 *    `pulledPeakTolerance` × the sub-group's spacing (the median of its spacings not touching that
 *    peak) from the place its neighbour on the gap side's far side (the next peak; the one before
 *    for the last) and that spacing give: the resonance pulls the merged peak off the level's
 *    position, so the positions read (and the Ec and Δsp taken from them) are not safe.
 * 2. (note 26) Shell tunnelling with VB levels (each VB multiplet's first peak, from the gap
 *    outward) whose spacings k and k + 2 are alike (within `pairSpacingTolerance` of their mean)
 *    and both below `pairGapRatioMax` × spacing k + 1: the VB reads as pairs of peaks a like
 *    distance apart, which is how the two charging peaks of spin-degenerate levels, one Ec apart,
 *    show in shell filling; single levels' spacings have no reason to repeat around a wider one.
 * On the low-η benchmark (fast model, 200 spectra per regime, 2026-12-05) 25 sends 33 (seed 1),
 * 2120 (seed 2001) and the passing 1077 (seed 1001) to the fit, which then reads all three right;
 * the passing readings it left alone lie within 0.14 of their ladder (33 and 2120 at 0.21 and
 * 0.20). 26 sends 1117 (seed 1001, shell filling read as tunnelling, its p/s step ratio leaning on
 * a peak under a resonance) to the fit, then right; it fires on no shell-tunnelling draw of seeds
 * 1 … 4001. Neither sends a spectrum more on the held-out seeds 3001 and 4001, the default mix
 * seed 1 or the crossover seeds 1, 1001 and 2001.
 *
 * Example
 * -------
 * ```ts
 * // VB peaks (gap outward) −1.8, −2.1, −2.8, −3.1 read as four single levels: spacings 0.3, 0.7, 0.3.
 * const v = (label: string, biasV: number, i: number) => ({ band: "VB" as const, label, peaksV: [biasV], subgroups: [1], peakIndices: [i] });
 * hiddenLadderReasons([{ biasV: -1.8 }, { biasV: -2.1 }, { biasV: -2.8 }, { biasV: -3.1 }], { regime: "shell-tunneling",
 *   multiplets: [v("v1", -1.8, 0), v("v2", -2.1, 1), v("v3", -2.8, 2), v("v4", -3.1, 3)], evidence: { reasons: [] } })
 *   .map((r) => r.code);  // => ["vb-charging-pairs"]
 * ```
 */
export function hiddenLadderReasons(
  peaks: readonly Pick<Peak, "biasV">[],
  assignment: HiddenLadderAssignment,
  options: HiddenLadderOptions = {},
): HiddenLadderReason[] {
  const D = HIDDEN_LADDER_DEFAULTS;
  const pulled = checkRange("pulledPeakTolerance", options.pulledPeakTolerance ?? D.pulledPeakTolerance, 0, 1);
  const pairTol = checkRange("pairSpacingTolerance", options.pairSpacingTolerance ?? D.pairSpacingTolerance, 0, 1);
  const gapMax = checkRange("pairGapRatioMax", options.pairGapRatioMax ?? D.pairGapRatioMax, 0, 1);
  const a = assignment;
  const out: HiddenLadderReason[] = [];
  if (a.regime === "shell-filling") {
    // 1. A charging peak kept under a resonance, off its sub-group's ladder.
    const kept = keptUnderResonanceV(a.evidence.reasons);
    for (const m of a.multiplets.filter((x) => x.band === "CB")) {
      for (const { start, size } of subgroupSpans(m)) {
        if (size < 3) continue;
        const end = start + size;
        for (let j = start; j < end; j++) {
          const v = m.peaksV[j];
          if (!kept.some((k) => Math.abs(k - v) < 5e-4)) continue;
          const gaps: number[] = [];
          for (let k = start + 1; k < end; k++) if (k !== j && k !== j + 1) gaps.push(m.peaksV[k] - m.peaksV[k - 1]);
          if (gaps.length === 0) continue;
          const spacingV = medianInPlace(Float64Array.from(gaps));
          const expectedV = j + 1 < end ? m.peaksV[j + 1] - spacingV : m.peaksV[j - 1] + spacingV;
          const off = Math.abs(v - expectedV) / Math.abs(spacingV);
          if (!(off > pulled)) continue;
          out.push({
            code: "pulled-charging-peak",
            text: `shell filling with ${m.label}'s charging peak at ${v.toFixed(3)} V kept although a resonance through the substrate junction overlaps it, ${(off).toFixed(2)} × its sub-group's spacing (${(spacingV * 1e3).toFixed(0)} mV) from where the ladder puts it (${expectedV.toFixed(3)} V; > ${pulled}), whereas one level's charging peaks lie one Ec apart: the resonance pulls the merged peak, and the positions read are not safe`,
          });
        }
      }
    }
  }
  if (a.regime === "shell-tunneling") {
    // 2. VB levels in pairs a like distance apart: charging pairs of spin-degenerate levels.
    const vb = a.multiplets
      .filter((m) => m.band === "VB" && m.peakIndices.length > 0)
      .map((m) => Math.abs(peaks[m.peakIndices[0]].biasV))
      .sort((x, y) => x - y);
    const gaps = vb.slice(1).map((v, i) => v - vb[i]);
    for (let k = 0; k + 2 < gaps.length; k++) {
      const [g1, wide, g2] = [gaps[k], gaps[k + 1], gaps[k + 2]];
      const mean = (g1 + g2) / 2;
      if (Math.abs(g1 - g2) <= pairTol * mean && Math.max(g1, g2) < gapMax * wide) {
        out.push({
          code: "vb-charging-pairs",
          text: `shell tunnelling with VB levels in pairs ${(g1 * 1e3).toFixed(0)} and ${(g2 * 1e3).toFixed(0)} mV apart (alike within ${pairTol}), ${(wide * 1e3).toFixed(0)} mV between the pairs (both < ${gapMax} ×): the two charging peaks of spin-degenerate levels one Ec apart, as in shell filling, rather than four single levels`,
        });
        break;
      }
    }
  }
  return out;
}
