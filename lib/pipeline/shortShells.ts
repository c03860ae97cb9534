/**
 * Charging peaks a filling shell lacks: where the assignment reads shell filling with Ec and a CB
 * shell is short of its degeneracy, the current one Ec beyond its last peak (or before its first)
 * is tested for a step, and a step that passes joins the peak list.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { predictedStep } from "../peaks/predictedStep.ts";
import type { Assignment } from "../assign/assignSpectrum.ts";
import { stepPeak, type FlankCurve } from "./flankLevels.ts";
import { subgroupSpans } from "../assign/multiplets.ts";

/** Limits of {@link shortShellPredictions} and {@link shortShellSteps} (locked by test/pipeline/shortShells.test.ts). */
export const SHORT_SHELL_DEFAULTS = Object.freeze({
  /** The missing peak may lie this fraction of Ec_V from its prediction (the ladder's spacing varies by a few % of Ec and its sub-groups by Δ). */
  reachEc: 0.25,
  /** A prediction nearer than this fraction of Ec_V to the neighbouring shell's peak is not tested (completeShells' bound). */
  shellGapEc: 0.5,
  /** A prediction within this many expected FWHM of a predicted second-junction resonance is not tested (the resonance's step would pass for the level's). */
  resonanceFwhm: 1,
  /** The step test's threshold there, as a fraction of minStepSigma (the position is predicted: the test looks at a few dozen positions, not the whole curve). */
  minStepFraction: 0.8,
});

/** Where a short shell's next charging peak is expected. */
export interface ShortShellPrediction {
  /** The shell's label ("s", "p", …). */
  label: string;
  /** +1: beyond its last peak; −1: before its first. */
  side: 1 | -1;
  /** The predicted position, V. */
  predictedV: number;
  /**
   * Set for a full shell whose first peak lies at a predicted second-junction resonance: the index
   * of that peak, which the peak found would take the shell's place of (note 2 of
   * {@link shortShellPredictions}).
   */
  replaces?: number;
}

/**
 * The positions where the CB shells short of their degeneracy expect their next charging peak.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV">[]
 *     The assignment's peak list.
 * assignment : Pick<Assignment, "regime" | "multiplets" | "quantities">
 *     The assignment; only shell filling with a positive Ec gives predictions.
 * biasRangeV : readonly [number, number]
 *     The bias window, V.
 * resonances : { resonancesV: readonly number[]; toleranceV: number }, optional
 *     The predicted resonances, V (`predictedResonancesV`), and how near a shell's first peak
 *     must lie to one, V. Default: none (no prediction of note 2).
 *
 * Returns
 * -------
 * ShortShellPrediction[]
 *     For each CB shell with a degeneracy and fewer peaks, and each of its sub-groups (the whole
 *     shell where it is not split): the sub-group's last peak + Ec_V and first peak − Ec_V, where
 *     inside the window, above 0 V, and at least `SHORT_SHELL_DEFAULTS.shellGapEc`·Ec_V from the
 *     neighbouring shells' peaks; and for each full shell of more than two states led by a peak
 *     at a resonance, its last peak + Ec_V with `replaces` (note 2), under the same bounds above.
 *
 * Notes
 * -----
 * 1. In shell filling the charging peaks of one (sub-)level are Ec_V apart (Ec/η in bias;
 *    sub-groups of a split shell add their level spacing between them), so a shell that shows
 *    fewer peaks than it holds carriers lacks one at an end of one of its sub-groups: a sub-group
 *    read short (a peak missing inside the shell splits or shortens one) is looked at on both
 *    sides.
 * 2. A full shell (more than two states) whose first peak lies within `resonances.toleranceV` of
 *    a predicted second-junction resonance may have taken that resonance for its first charging
 *    peak because its last one was not found: one Ec_V beyond its last peak is predicted too,
 *    with `replaces` naming the first peak (a found step there takes its place).
 *
 * Example
 * -------
 * ```ts
 * // Ec_V = 0.2 V; s doublet at 1.0, 1.2 V; p read as 2.0, 2.2, 2.4, 2.6, 2.8 V (one short).
 * const peaks = [1.0, 1.2, 2.0, 2.2, 2.4, 2.6, 2.8].map((biasV) => ({ biasV }));
 * const shell = (label: string, degeneracy: number, peakIndices: number[]) => ({ band: "CB" as const, label, degeneracy, peakIndices, subgroups: [peakIndices.length] });
 * shortShellPredictions(peaks, { regime: "shell-filling", multiplets: [shell("s", 2, [0, 1]), shell("p", 6, [2, 3, 4, 5, 6])], quantities: { chargingEnergyV: 0.2 } } as never, [-3, 3.5])
 *   .map((p) => p.predictedV.toFixed(1));  // => ["3.0", "1.8"]
 * ```
 */
export function shortShellPredictions(
  peaks: readonly Pick<Peak, "biasV">[],
  assignment: Pick<Assignment, "regime" | "multiplets" | "quantities">,
  biasRangeV: readonly [number, number],
  resonances: { resonancesV: readonly number[]; toleranceV: number } = { resonancesV: [], toleranceV: 0 },
): ShortShellPrediction[] {
  const ecV = assignment.quantities.chargingEnergyV;
  if (assignment.regime !== "shell-filling" || ecV === null || !(ecV > 0)) return [];
  const gap = SHORT_SHELL_DEFAULTS.shellGapEc * ecV;
  const shells = assignment.multiplets.filter((m) => m.band === "CB" && m.peakIndices.length > 0);
  const out: ShortShellPrediction[] = [];
  shells.forEach((m, k) => {
    const xs = m.peakIndices.map((i) => peaks[i].biasV);
    const after = k + 1 < shells.length ? Math.min(...shells[k + 1].peakIndices.map((i) => peaks[i].biasV)) : Infinity;
    if (m.degeneracy !== null && m.peakIndices.length === m.degeneracy && m.degeneracy > 2) {
      // A full shell led by a peak at a predicted resonance: its place may belong to a step one
      // Ec_V beyond the shell's last peak (note 2).
      const lead = m.peakIndices[0];
      const up = Math.max(...xs) + ecV;
      const atResonance = resonances.resonancesV.some((r) => Math.abs(r - peaks[lead].biasV) <= resonances.toleranceV);
      if (atResonance && up <= biasRangeV[1] && up <= after - gap) out.push({ label: m.label, side: 1, predictedV: up, replaces: lead });
    }
    if (m.degeneracy === null || m.peakIndices.length >= m.degeneracy) return;
    const before = k > 0 ? Math.max(...shells[k - 1].peakIndices.map((i) => peaks[i].biasV)) : 0;
    const ends: [number, number][] = [];
    for (const { indices } of subgroupSpans(m)) {
      const g = indices.map((i) => peaks[i].biasV);
      if (g.length) ends.push([Math.min(...g), Math.max(...g)]);
    }
    for (const [first, last] of ends) {
      const up = last + ecV, down = first - ecV;
      if (up <= biasRangeV[1] && up <= after - gap) out.push({ label: m.label, side: 1, predictedV: up });
      if (down >= biasRangeV[0] && down > 0 && down >= before + gap) out.push({ label: m.label, side: -1, predictedV: down });
    }
  });
  return out;
}

/**
 * The charging peaks found where short shells expect them, as peaks, strongest step first.
 *
 * Parameters
 * ----------
 * curve : FlankCurve
 *     Bias, raw current, conductance and their noise.
 * peaks : readonly Peak[]
 *     The peaks of the curve, ascending (those the assignment was made on).
 * predictions : readonly ShortShellPrediction[]
 *     Where to look ({@link shortShellPredictions}).
 * resonancesV : readonly number[]
 *     The second-junction resonances the assignment predicts, V (`predictedResonancesV`).
 * chargingEnergyV : number
 *     Ec_V, the ladder's spacing in bias, V.
 * expectedFwhmV : number
 *     The expected FWHM of a step, V.
 * minStepSigma : number
 *     The step test's threshold of findPeaks.
 *
 * Returns
 * -------
 * { peak: Peak; label: string; replaces?: number }[]
 *     Each step found as a peak, with the label of the shell that predicted it (and the
 *     prediction's `replaces`), by descending t;
 *     each is found against `peaks` alone (not against the others).
 *
 * Notes
 * -----
 * With w the expected FWHM and D = `SHORT_SHELL_DEFAULTS`:
 * 1. A prediction within D.resonanceFwhm·w of a predicted resonance is passed over: a step there
 *    would be the resonance's as well as (or instead of) the level's.
 * 2. Within D.reachEc·Ec_V of the prediction, the strongest current step that passes the step
 *    test at D.minStepFraction·minStepSigma ({@link predictedStep}) is taken, fitted against the
 *    peaks kept and the predicted resonances that no peak stands for (steps all), at least one w
 *    from each: no prominence of its own is asked for, a weak step in a dense ladder often has
 *    none over the conductance's noise.
 * 3. It is made a peak as flankLevelPeaks makes a level (`stepPeak`: the expected width, the
 *    Gaussian prominence of its step, its t and its position σ with the floor in quadrature).
 */
export function shortShellSteps(
  curve: FlankCurve,
  peaks: readonly Peak[],
  predictions: readonly ShortShellPrediction[],
  resonancesV: readonly number[],
  chargingEnergyV: number,
  expectedFwhmV: number,
  minStepSigma: number,
): { peak: Peak; label: string; replaces?: number }[] {
  const D = SHORT_SHELL_DEFAULTS;
  const w = expectedFwhmV;
  if (!predictions.length || !(w > 0) || !(chargingEnergyV > 0)) return [];
  const kept = peaks.map((q) => q.biasV);
  const free = resonancesV.filter((r) => !kept.some((v) => Math.abs(v - r) < w));
  const found: { peak: Peak; label: string; replaces?: number }[] = [];
  for (const p of predictions) {
    if (resonancesV.some((r) => Math.abs(r - p.predictedV) < D.resonanceFwhm * w)) continue;
    const step = predictedStep(curve.biasV, curve.currentA, curve.noiseA, p.predictedV, D.reachEc * chargingEnergyV, [...kept, ...free], w, D.minStepFraction * minStepSigma);
    if (!step) continue;
    const peak = stepPeak(curve, step.biasV, step.stepA, step.significance, Number.isFinite(step.uncertaintyV) ? step.uncertaintyV : w / 2, w);
    found.push({ peak, label: p.label, ...(p.replaces === undefined ? {} : { replaces: p.replaces }) });
  }
  return found.sort((a, b) => (b.peak.stepSignificance ?? 0) - (a.peak.stepSignificance ?? 0));
}

/**
 * Whether the assignment re-read with a short shell's step among the peaks is kept.
 *
 * Parameters
 * ----------
 * label : string
 *     The label of the shell that predicted the step.
 * peak : T
 *     The step's peak (the same object in `after.list`).
 * before : { list: readonly T[]; assignment: Pick<Assignment, "regime" | "multiplets"> }
 *     The peak list and assignment without it.
 * after : { list: readonly T[]; assignment: Pick<Assignment, "regime" | "multiplets"> }
 *     The peak list with it, and the assignment re-read on that list.
 * replaces : number, optional
 *     The prediction's `replaces` (an index of `before.list`): that peak may leave the shell.
 *
 * Returns
 * -------
 * boolean
 *     True where the regime is unchanged, the peak joins the shell labelled `label`, and that
 *     shell either keeps all its other peaks (but `replaces`) or holds more peaks than before.
 *
 * Notes
 * -----
 * 1. The step is one rung of the shell's ladder, so the re-read must put it in that shell and
 *    leave the regime as it was.
 * 2. With the rung there, the ladder may be read anew: a peak of the shell that was a resonance
 *    taken for a level (the rung's place was empty) or a resonance's neighbour leaves the shell
 *    while another peak, one Ec_V from the new rung, joins it. Where the shell then holds more
 *    peaks than before, more of its states are accounted for and the new reading stands; where
 *    it holds as many or fewer, a peak was traded for a peak and the earlier reading stays.
 *
 * Example
 * -------
 * ```ts
 * const [a, b, c] = [{ biasV: 2.0 }, { biasV: 2.2 }, { biasV: 2.4 }];
 * const read = (list: { biasV: number }[], p: number[]) => ({ list, assignment: { regime: "shell-filling", multiplets: [{ label: "p", peakIndices: p }] } as never });
 * shortShellStepKept("p", c, read([a, b], [0, 1]), read([a, b, c], [0, 1, 2]));  // => true
 * shortShellStepKept("p", c, read([a, b], [0, 1]), read([a, b, c], [1, 2]));     // => false (b for a)
 * ```
 */
export function shortShellStepKept<T>(
  label: string,
  peak: T,
  before: { list: readonly T[]; assignment: Pick<Assignment, "regime" | "multiplets"> },
  after: { list: readonly T[]; assignment: Pick<Assignment, "regime" | "multiplets"> },
  replaces?: number,
): boolean {
  const shell = before.assignment.multiplets.find((m) => m.label === label)?.peakIndices ?? [];
  const was = shell.filter((i) => i !== replaces).map((i) => before.list[i]);
  const now = new Set(after.assignment.multiplets.find((m) => m.label === label)?.peakIndices.map((i) => after.list[i]));
  if (after.assignment.regime !== before.assignment.regime || !now.has(peak)) return false;
  return was.every((p) => now.has(p)) || now.size > shell.length;
}
