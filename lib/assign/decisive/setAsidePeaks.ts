/**
 * Three tests of `rulesDecisive` (its notes 18–20) on the peaks the rules set aside or left
 * unread: a filling shell whose missing charging peak would sit where the rules set a peak aside,
 * and a tunnelling reading that leaves CB peaks beyond its last level unread.
 */
import type { Peak } from "../../peaks/findPeaks.ts";
import { checkRange } from "../../util/check.ts";
import type { Assignment } from "../assignSpectrum.ts";
import type { Multiplet } from "../multiplets.ts";
import { peakRoles } from "../peakMultiplets.ts";

/** Options of {@link setAsidePeakReasons}; every field optional (defaults in {@link SET_ASIDE_PEAK_DEFAULTS}). */
export interface SetAsidePeakOptions {
  /**
   * Shell filling: a peak the rules set aside counts as lying at a missing charging peak's place
   * when it is within this fraction of Ec (`quantities.chargingEnergyV`, in bias) of it; a gap
   * between two charging peaks of a shell has room for one more when its half lies within this
   * fraction of Ec of Ec; dimensionless. Default 0.175.
   */
  missingPeakTolerance?: number;
  /**
   * Shell filling: a peak set aside before a short shell counts only when it steps at least this
   * multiple of the shell's first charging peak, and one in a gap with room for one charging peak
   * only when it steps at least this multiple of the lower of the two charging peaks around it;
   * dimensionless. Default 1.
   */
  missingPeakStepMin?: number;
  /** Shell tunnelling: at least this many CB peaks beyond the last level left unread. Default 1. */
  unreadPeaksMin?: number;
  /**
   * Shell filling: a peak set aside before a short shell overlaps a peak labelled a second-junction
   * resonance when that one lies within this many of its FWHM; the step test (`missingPeakStepMin`)
   * is then waived, in FWHM. Default 1.
   */
  overlapFwhms?: number;
}

/** Defaults of {@link setAsidePeakReasons} (locked by test/assign/decisive/setAsidePeaks.test.ts). */
export const SET_ASIDE_PEAK_DEFAULTS = Object.freeze({
  /**
   * A set-aside peak within this fraction of Ec of a missing charging peak's place lies there; a
   * gap whose half lies within it of Ec has room for one charging peak (chosen on the accuracy
   * benchmark, see notes 18 and 19 of rulesDecisive).
   */
  missingPeakTolerance: 0.175,
  /**
   * A set-aside peak before a short shell steps at least this multiple of the shell's first
   * charging peak, one in such a gap at least this multiple of the lower charging peak around it:
   * a charging peak steps like its level's others (merged with a resonance, more), whereas the
   * charging satellite that a filling shell shows one Ec before its first peak (the level entered
   * before the shell below is full) steps a fraction of them (chosen on the accuracy benchmark,
   * see notes 18 and 19 of rulesDecisive).
   */
  missingPeakStepMin: 1,
  /** Unread CB peaks beyond the last tunnelling level that leave the reading open (chosen on the accuracy benchmark, see note 20 of rulesDecisive). */
  unreadPeaksMin: 1,
  /**
   * A peak set aside before a short shell with a second-junction resonance within this many of its
   * FWHM overlaps it: the two share one step between them in the peak list, so its own step does
   * not tell a charging peak from a satellite and the step test is waived (chosen on the accuracy
   * benchmark, see note 18 of rulesDecisive).
   */
  overlapFwhms: 1,
});

/** The codes of {@link setAsidePeakReasons}, by note of `rulesDecisive`: 18, 19, 20. */
export type SetAsidePeakCode = "first-peak-set-aside" | "gap-peak-set-aside" | "unread-cb-peaks";

/** What {@link setAsidePeakReasons} reads of an assignment (`assignSpectrum`'s answer gives it all). */
export interface SetAsidePeakAssignment {
  regime: Assignment["regime"];
  /** The multiplets, their peaks ordered from the gap edge outward. */
  multiplets: readonly Pick<Multiplet, "band" | "label" | "degeneracy" | "found" | "peakIndices" | "peaksV">[];
  /** Ec in bias, V (`quantities.chargingEnergyV`); null when not measured. */
  quantities: { chargingEnergyV: number | null };
  /** The peaks set aside as charging satellites or noise, and as second-junction resonances. */
  evidence: { satellitePeakIndices: readonly number[]; secondJunction: readonly { index: number }[] };
}

/** One reason of {@link setAsidePeakReasons}. */
export interface SetAsidePeakReason {
  code: SetAsidePeakCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reasons to doubt a reading that the peaks the rules set aside or left unread give.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "stepA" | "fwhmV">[]
 *     The peaks the assignment names by index (`biasV` and `fwhmV` in V, `stepA` in A).
 * assignment : SetAsidePeakAssignment
 *     The rules' assignment of those peaks (regime, multiplets, Ec in bias, the peaks set aside).
 * options : SetAsidePeakOptions, optional
 *     `missingPeakTolerance` (default 0.175), `missingPeakStepMin` (default 1), both
 *     dimensionless, `unreadPeaksMin` (peaks, default 1) and `overlapFwhms` (FWHM, default 1).
 *
 * Returns
 * -------
 * SetAsidePeakReason[]
 *     Each with its code and its words; empty when none applies.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an option that is not a finite number in its range.
 *
 * Notes
 * -----
 * A peak is set aside when the rules put it in no multiplet (a charging satellite, a noise peak, a
 * resonance through the substrate junction, or unassigned; `peakRoles`). One level's charging
 * peaks lie one Ec apart in bias, (ε + Ec(n + ½))/η, whatever the rates.
 * 1. (note 18) Shell filling with a shell after s short of its degeneracy while a set-aside peak
 *    stepping at least `missingPeakStepMin` × the shell's first charging peak lies within
 *    `missingPeakTolerance` × Ec of one Ec before that peak (and after the previous shell's last):
 *    the shell's first charging peak may be that peak, set aside as a resonance or satellite it
 *    overlaps, and the shell read from its second. A weaker peak there is the shell's own charging
 *    satellite (its level entered before the shell below is full), which lies one Ec before its
 *    first charging peak on any filling curve that shows it, unless a peak labelled a
 *    second-junction resonance lies within `overlapFwhms` of its FWHM: two peaks that close
 *    overlap, and the peak list shares their combined step between them however it is split, so
 *    the set-aside peak's own step tells nothing and the step test is waived.
 * 2. (note 19) Shell filling with two successive charging peaks of a shell (in one sub-group or
 *    across two) whose gap has room for one more, half of it within `missingPeakTolerance` × Ec of
 *    Ec, while a set-aside peak stepping at least `missingPeakStepMin` × the lower of the two lies
 *    within `missingPeakTolerance` × Ec of its middle: a charging step merged with a resonance is
 *    at least as large as the level's own, so the peak may be the shell's charging peak set aside,
 *    and the shell's peaks grouped one off around the gap (the gap read as a sub-level spacing).
 * 3. (note 20) Shell tunnelling with at least `unreadPeaksMin` CB peaks beyond the last level read
 *    that are set aside as nothing (neither a satellite, noise nor a resonance): the rules open a
 *    new shell at each peak spaced like a level from the one before (as along a charging ladder one
 *    Ec apart) and stop after the last shell they name (f), so the reading leaves part of the CB
 *    side unexplained.
 *
 * Example
 * -------
 * ```ts
 * // No multiplet short, no gap and no peak left: nothing to say.
 * setAsidePeakReasons([], { regime: "shell-filling", multiplets: [], quantities: { chargingEnergyV: 0.1 },
 *   evidence: { satellitePeakIndices: [], secondJunction: [] } });  // => []
 * ```
 */
export function setAsidePeakReasons(
  peaks: readonly Pick<Peak, "biasV" | "stepA" | "fwhmV">[],
  assignment: SetAsidePeakAssignment,
  options: SetAsidePeakOptions = {},
): SetAsidePeakReason[] {
  const D = SET_ASIDE_PEAK_DEFAULTS;
  const tolerance = checkRange("missingPeakTolerance", options.missingPeakTolerance ?? D.missingPeakTolerance, 0, 0.5);
  const stepMin = checkRange("missingPeakStepMin", options.missingPeakStepMin ?? D.missingPeakStepMin, 0, 100);
  const unreadMin = checkRange("unreadPeaksMin", options.unreadPeaksMin ?? D.unreadPeaksMin, 1, 1000);
  const overlapFwhms = checkRange("overlapFwhms", options.overlapFwhms ?? D.overlapFwhms, 0, 100);
  const a = assignment;
  const out: SetAsidePeakReason[] = [];
  const roles = peakRoles(peaks.length, a);
  const setAside = peaks.map((_, i) => i).filter((i) => roles[i] !== "level");
  const cb = a.multiplets.filter((m) => m.band === "CB");
  const ecV = a.quantities.chargingEnergyV;
  if (a.regime === "shell-filling" && ecV !== null && ecV > 0) {
    /** Whether a peak labelled a second-junction resonance, other than peak `i`, overlaps it (within `overlapFwhms` of its FWHM). */
    const overlapped = (i: number) => peaks.some((q, j) => j !== i && roles[j] === "second-junction" && Math.abs(q.biasV - peaks[i].biasV) <= overlapFwhms * peaks[i].fwhmV);
    /** The set-aside peak nearest `atV` within the tolerance and stepping at least `minStepA` (any step when `waiveOverlapped` and it overlaps a resonance), or undefined. */
    const near = (atV: number, fromV: number, minStepA: number, waiveOverlapped = false) =>
      setAside
        .filter((i) => peaks[i].biasV > fromV && Math.abs(peaks[i].biasV - atV) <= tolerance * ecV && (peaks[i].stepA >= minStepA || (waiveOverlapped && overlapped(i))))
        .sort((x, y) => Math.abs(peaks[x].biasV - atV) - Math.abs(peaks[y].biasV - atV))[0];
    cb.forEach((m, k) => {
      // 1. A short shell whose first charging peak may have been set aside.
      if (k === 0 || m.degeneracy === null || m.found === 0 || m.found >= m.degeneracy) return;
      const before = cb[k - 1].peaksV;
      const i = near(m.peaksV[0] - ecV, before.length ? before[before.length - 1] : 0, stepMin * peaks[m.peakIndices[0]].stepA, true);
      if (i === undefined) return;
      const ratio = peaks[i].stepA / peaks[m.peakIndices[0]].stepA;
      const stepText = ratio >= stepMin
        ? `stepping ${ratio.toFixed(2)} × it (≥ ${stepMin})`
        : `stepping ${ratio.toFixed(2)} × it but overlapping a peak labelled a second-junction resonance (within ${overlapFwhms} FWHM), which shares its step`;
      out.push({
        code: "first-peak-set-aside",
        text: `shell filling with ${m.found} of the ${m.label} multiplet's ${m.degeneracy} charging peaks, while the peak at ${peaks[i].biasV.toFixed(3)} V, ${((m.peaksV[0] - peaks[i].biasV) / ecV).toFixed(2)} × Ec (${(ecV * 1e3).toFixed(0)} mV) before its first and ${stepText}, was set aside: ${m.label}'s first charging peak may be that one (overlapping a resonance or a satellite), and the shell read from its second`,
      });
    });
    for (const m of cb) {
      // 2. A gap with room for one charging peak, a peak as strong as the shell's set aside in it.
      for (let j = 1; j < m.peaksV.length; j++) {
        const gapV = m.peaksV[j] - m.peaksV[j - 1];
        if (Math.abs(gapV / 2 - ecV) > tolerance * ecV) continue;
        const lowA = Math.min(peaks[m.peakIndices[j - 1]].stepA, peaks[m.peakIndices[j]].stepA);
        const i = near((m.peaksV[j] + m.peaksV[j - 1]) / 2, m.peaksV[j - 1], stepMin * lowA);
        if (i === undefined) continue;
        out.push({
          code: "gap-peak-set-aside",
          text: `shell filling with ${m.label}'s charging peaks at ${m.peaksV[j - 1].toFixed(3)} and ${m.peaksV[j].toFixed(3)} V ${(gapV / ecV).toFixed(2)} × Ec apart (room for one more), while the peak at ${peaks[i].biasV.toFixed(3)} V between them, stepping ${(peaks[i].stepA / lowA).toFixed(2)} × the lower of the two (≥ ${stepMin}), was set aside: it may be ${m.label}'s charging peak merged with a resonance, and ${m.label}'s peaks grouped one off around the gap`,
        });
      }
    }
  }
  if (a.regime === "shell-tunneling") {
    // 3. CB peaks beyond the last level that the reading leaves unread.
    const levelsV = cb.flatMap((m) => m.peaksV);
    const lastV = levelsV.length ? Math.max(...levelsV) : Infinity;
    const unread = peaks.filter((p, i) => roles[i] === "unassigned" && p.biasV > lastV);
    if (unread.length >= unreadMin) {
      out.push({
        code: "unread-cb-peaks",
        text: `shell tunnelling with ${unread.length} CB peak(s) beyond the last level read (${cb[cb.length - 1].label}, ${lastV.toFixed(3)} V) read as nothing (neither level, satellite nor resonance; from ${unread[0].biasV.toFixed(3)} V): the rules ran out of shells, as they do along a charging ladder read level by level`,
      });
    }
  }
  return out;
}
