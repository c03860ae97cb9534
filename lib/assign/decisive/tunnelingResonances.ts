/**
 * Two tests of `rulesDecisive` (its notes 28 and 29) on a shell-tunnelling reading made among
 * second-junction resonances: a CB peak set aside as a resonance that may hold a p sub-level, and
 * VB levels read beyond a CB level's resonance, where that level's charging peaks through the
 * substrate junction follow.
 */
import type { Peak } from "../../peaks/findPeaks.ts";
import { checkRange } from "../../util/check.ts";
import type { Assignment } from "../assignSpectrum.ts";
import type { Multiplet } from "../multiplets.ts";
import type { SecondJunctionResonance } from "../secondJunction.ts";

/** Options of {@link tunnelingResonanceReasons}; every field optional (defaults in {@link TUNNELING_RESONANCE_DEFAULTS}). */
export interface TunnelingResonanceOptions {
  /**
   * A CB peak set aside as a resonance may hold a level when it steps at least this multiple of
   * its source peak's step (a resonance alone steps (g·r + 1)/(g + r) < 1 × its source for
   * Γtip/Γsub = r < 1); dimensionless. Default 1.
   */
  heldLevelStepMin?: number;
  /**
   * … unless another peak lies within this many FWHM (the larger of the two peaks') of it:
   * overlapping peaks share one step in the peak list; in FWHM. Default 1.
   */
  overlapFwhms?: number;
  /**
   * A VB level read beyond a CB level's resonance counts when the VB reads at least this many
   * levels; dimensionless count. Default 3.
   */
  valenceLevelsMin?: number;
}

/** Defaults of {@link tunnelingResonanceReasons} (locked by test/assign/decisive/tunnelingResonances.test.ts). */
export const TUNNELING_RESONANCE_DEFAULTS = Object.freeze({
  /** A set-aside CB resonance stepping at least this × its source may hold a level ((g·r + 1)/(g + r) < 1 for r < 1). */
  heldLevelStepMin: 1,
  /** … unless another peak lies within this many FWHM of it (overlapping peaks share one step). */
  overlapFwhms: 1,
  /** A VB level beyond a CB level's resonance counts where the VB reads at least this many levels (chosen on the accuracy benchmark, see note 29 of rulesDecisive). */
  valenceLevelsMin: 3,
});

/** The codes of {@link tunnelingResonanceReasons}, by note of `rulesDecisive`: 28, 29. */
export type TunnelingResonanceCode = "resonance-held-level" | "vb-beyond-resonance";

/** What {@link tunnelingResonanceReasons} reads of an assignment (`assignSpectrum`'s answer gives it all). */
export interface TunnelingResonanceAssignment {
  regime: Assignment["regime"];
  /** The multiplets (in shell tunnelling one peak per level), their peaks ordered from the gap edge outward. */
  multiplets: readonly Pick<Multiplet, "band" | "label" | "peakIndices">[];
  /** The peaks set aside as second-junction resonances, with the peak that predicts each. */
  evidence: { secondJunction: readonly Pick<SecondJunctionResonance, "index" | "sourceIndex" | "predictedV">[] };
}

/** One reason of {@link tunnelingResonanceReasons}. */
export interface TunnelingResonanceReason {
  code: TunnelingResonanceCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reasons to doubt a shell-tunnelling reading whose levels a second-junction resonance may
 * hide or stand in for.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "fwhmV" | "stepA">[]
 *     The peaks the assignment names by index (`biasV`, `fwhmV` in V; `stepA` in A).
 * assignment : TunnelingResonanceAssignment
 *     The rules' assignment of those peaks (regime, multiplets, the peaks set aside as
 *     resonances and their sources).
 * options : TunnelingResonanceOptions, optional
 *     `heldLevelStepMin` (dimensionless, default 1), `overlapFwhms` (FWHM, default 1),
 *     `valenceLevelsMin` (levels, default 3).
 *
 * Returns
 * -------
 * TunnelingResonanceReason[]
 *     Each with its code and its words; empty when none applies.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an option that is not a finite number in its range.
 *
 * Notes
 * -----
 * A level at ε (its first entry ε + Ec/2) shows through the tip junction at (ε + Ec/2)/η and
 * through the substrate junction at −(ε + Ec/2)/(1 − η), the plain resonance; in shell tunnelling
 * the substrate side fills the level, so its next charging peak through that junction follows one
 * Ec/(1 − η) further out, at −(ε + 3Ec/2)/(1 − η). A resonance alone steps (g·r + 1)/(g + r) × its
 * source (`substrateToTipStepRatio`; below 1 for r < 1).
 * 1. (note 28) Shell tunnelling with p read as fewer levels than its three orbitals and a CB peak
 *    after s set aside as a second-junction resonance that either steps at least
 *    `heldLevelStepMin` × its source with no other peak within `overlapFwhms` FWHM (the larger of
 *    the two), or shares its source's prediction with another peak set aside (one prediction, one
 *    resonance): the set-aside peak is too strong, or one too many, for a resonance alone, and may
 *    be the missing p sub-level merged with the resonance.
 * 2. (note 29) Shell tunnelling with a VB level read further out than a peak set aside as a CB
 *    level's resonance, the VB reading at least `valenceLevelsMin` levels: that level's next
 *    charging peak through the substrate junction lies Ec/(1 − η) beyond its resonance, and
 *    without Ec (tunnelling readings rarely have it) the rules cannot tell it from a VB level.
 *    Any VB level beyond such a resonance sends 22–33 of 200 low-η shell-tunnelling draws (seeds
 *    1, 1001, 2001, 5001), most of them right; requiring the third VB level (one more than the
 *    two whose peaks the synthetic window shows) leaves 1–2 per 200.
 * On the low-η benchmark (fast model, 200 spectra per regime, 2026-12-05) 28 sends 5102 and 5126
 * (seed 5001, p short of a sub-level) and the passing 5123 to the fit, the fit then right on all
 * three; without the overlap test it also sent six passing draws whose resonance overlaps p's
 * peak (one of them, 104, then broken). 29 sends 5104 and 5140 (seed 5001, s's second charging
 * peak through the substrate junction counted as a VB level) and the passing 106, 1044, 2052 and
 * 2177, the fit then right on all six. Together they send 1, 1, 3 and 5 spectra more to the fit on
 * seeds 1, 1001, 2001 and 5001 (the third on 2001 the intermediate 2065, read as tunnelling: the
 * fit then poor, the rules' reading stands) and shell tunnelling on seed 5001 goes from 194 to 198
 * of 200 all-correct, nothing lost on seeds 1, 1001, 2001; none on the default mix seed 1 or the
 * crossover seeds 1, 1001, 2001, 5001.
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6, Ec = 0.1 eV: s at ε = 1.15 eV (tip peak 2.0 V), a p level at 1.45 eV (2.5 V); VB
 * // level at −1.0 eV (−1.75 V), its plain resonance at 1.05/0.4 = 2.625 V, stepping 1.2 × it.
 * const pk = (biasV: number, stepA: number) => ({ biasV, fwhmV: 0.06, stepA });
 * tunnelingResonanceReasons([pk(-1.75, 1e-12), pk(2.0, 1e-12), pk(2.5, 1e-12), pk(2.625, 1.2e-12)], {
 *   regime: "shell-tunneling",
 *   multiplets: [{ band: "CB", label: "s", peakIndices: [1] }, { band: "CB", label: "p", peakIndices: [2] }, { band: "VB", label: "v1", peakIndices: [0] }],
 *   evidence: { secondJunction: [{ index: 3, sourceIndex: 0, predictedV: 2.625 }] },
 * }).map((r) => r.code);  // => ["resonance-held-level"]
 * ```
 */
export function tunnelingResonanceReasons(
  peaks: readonly Pick<Peak, "biasV" | "fwhmV" | "stepA">[],
  assignment: TunnelingResonanceAssignment,
  options: TunnelingResonanceOptions = {},
): TunnelingResonanceReason[] {
  const D = TUNNELING_RESONANCE_DEFAULTS;
  const stepMin = checkRange("heldLevelStepMin", options.heldLevelStepMin ?? D.heldLevelStepMin, 0, 100);
  const overlap = checkRange("overlapFwhms", options.overlapFwhms ?? D.overlapFwhms, 0, 100);
  const levelsMin = checkRange("valenceLevelsMin", options.valenceLevelsMin ?? D.valenceLevelsMin, 1, 100);
  const a = assignment;
  const out: TunnelingResonanceReason[] = [];
  if (a.regime !== "shell-tunneling") return out;
  const sj = a.evidence.secondJunction;
  // 1. A CB resonance after s that may hold a p sub-level.
  const s = a.multiplets.find((m) => m.band === "CB" && m.label === "s" && m.peakIndices.length > 0);
  const p = a.multiplets.find((m) => m.band === "CB" && m.label === "p");
  const pLevels = p?.peakIndices.length ?? 0;
  if (s && pLevels < 3) {
    const sV = peaks[s.peakIndices[0]].biasV;
    for (const r of sj) {
      const res = peaks[r.index];
      if (!(res.biasV > sV)) continue;
      const source = peaks[r.sourceIndex];
      const ratio = res.stepA / source.stepA;
      const near = peaks.some((q, i) => i !== r.index && Math.abs(q.biasV - res.biasV) <= overlap * Math.max(q.fwhmV, res.fwhmV));
      const twin = sj.some((o) => o.index !== r.index && o.sourceIndex === r.sourceIndex && Math.abs(o.predictedV - r.predictedV) < 1e-9);
      const strong = ratio >= stepMin && !near;
      if (!strong && !twin) continue;
      const why = strong
        ? `it steps ${ratio.toFixed(2)} × its source (≥ ${stepMin}; a resonance alone steps (g·r + 1)/(g + r) < 1 × it) with no peak within ${overlap} FWHM`
        : `another peak is set aside for the same prediction (${r.predictedV.toFixed(3)} V; one prediction, one resonance)`;
      out.push({
        code: "resonance-held-level",
        text: `shell tunnelling with p read as ${pLevels} level${pLevels === 1 ? "" : "s"} (fewer than its three orbitals) and the CB peak at ${res.biasV.toFixed(3)} V set aside as the resonance of the peak at ${source.biasV.toFixed(3)} V although ${why}: it may be a p sub-level merged with the resonance`,
      });
      break;
    }
  }
  // 2. A VB level beyond a CB level's resonance, where that level's substrate charging peaks follow.
  const vbV = a.multiplets.filter((m) => m.band === "VB" && m.peakIndices.length > 0).map((m) => peaks[m.peakIndices[0]].biasV);
  if (vbV.length >= levelsMin) {
    for (const r of sj) {
      const res = peaks[r.index];
      if (!(res.biasV < 0 && peaks[r.sourceIndex].biasV > 0)) continue;
      const beyond = vbV.filter((v) => v < res.biasV);
      if (beyond.length === 0) continue;
      out.push({
        code: "vb-beyond-resonance",
        text: `shell tunnelling with ${beyond.length} of ${vbV.length} VB levels read beyond ${res.biasV.toFixed(3)} V, a peak set aside as the resonance of the CB level at ${peaks[r.sourceIndex].biasV.toFixed(3)} V: that level's next charging peak through the substrate junction lies Ec/(1 − η) further out and, without Ec, reads like a VB level`,
      });
      break;
    }
  }
  return out;
}
