/**
 * Levels hidden on the flank of a second-junction resonance: where the assignment predicts a
 * resonance on a peak, the current there is refitted as the resonance and level steps beside it,
 * and the levels found join the peak list.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { GAUSSIAN_AREA_PER_HEIGHT_FWHM } from "../util/constants.ts";
import { resonanceFlankSteps } from "../peaks/resonanceFlankSteps.ts";
import { ladderPredictions } from "../assign/ladderResonances.ts";
import type { Assignment } from "../assign/assignSpectrum.ts";
import { ASSIGN_DEFAULTS } from "../assign/assignDefaults.ts";

/** Limits of {@link flankLevelPeaks}, in expected FWHM (locked by test/pipeline/flankLevels.test.ts). */
export const FLANK_LEVELS_DEFAULTS = Object.freeze({
  /** A peak within this many expected FWHM of a predicted resonance is taken as (or as holding) the resonance. */
  overlapFwhm: 0.75,
  /** Predictions closer than this many expected FWHM to an end of the bias range are not refitted (no stretch on one side). */
  edgeFwhm: 1,
  /** Two predictions closer than this many expected FWHM are one. */
  sameFwhm: 0.25,
  /**
   * The least step of the level placed beside a resonance in a shared peak, as a fraction of the
   * level's share (note 2 of {@link sharedLevelPeaks}): the fit's split of the summed step between
   * a level and a resonance less than a FWHM apart leans to the resonance (chosen on the accuracy
   * benchmark's low-η mix: 0.45–0.55 read the same).
   */
  sharedLevelStepRatio: 0.5,
  /**
   * A CB charging peak at no predicted resonance that steps more than this many times the level's
   * share holds a resonance beside its level (note 5 of {@link sharedLevelPeaks}): one level steps
   * at most `ASSIGN_DEFAULTS.fillingStepRatio[1]` (1.3) times it, and no two charging peaks of a
   * shell share a peak (they lie Ec_V apart), so more than a level's worth besides is something
   * else (chosen on the accuracy benchmark's low-η mix: 2–3 read the same).
   */
  unpredictedStepRatio: 2.5,
});

/**
 * The resonances an assignment predicts, V, ascending: those of its shell-filling ladder
 * (`ladderPredictions`: η/(1 − η)·(|V| − N·Ec_V) at the opposite bias for every charging peak) or,
 * outside shell filling, the plain −η·V/(1 − η) of every peak in a multiplet; with the
 * predictions of the resonances it set aside.
 */
export function predictedResonancesV(peaks: readonly Pick<Peak, "biasV">[], assignment: Pick<Assignment, "regime" | "multiplets" | "quantities" | "evidence">, eta: number, expectedFwhmV: number): number[] {
  if (!(eta > 0 && eta < 1)) return [];
  const ecV = assignment.quantities.chargingEnergyV;
  const out: number[] = assignment.evidence.secondJunction.map((r) => r.predictedV);
  if (assignment.regime === "shell-filling" && ecV !== null && ecV > 0) {
    for (const r of ladderPredictions(peaks, { multiplets: assignment.multiplets, chargingEnergyV: ecV, eta })) out.push(r.predictedV);
  } else {
    const gain = eta / (1 - eta);
    for (const m of assignment.multiplets) for (const i of m.peakIndices) out.push(-gain * peaks[i].biasV);
  }
  out.sort((a, b) => a - b);
  const same = FLANK_LEVELS_DEFAULTS.sameFwhm * expectedFwhmV;
  return out.filter((v, k) => k === 0 || v - out[k - 1] > same);
}

/** The curve as {@link flankLevelPeaks} reads it. */
export interface FlankCurve {
  /** Bias, V (uniform, ascending). */
  biasV: Float64Array;
  /** Raw current, A. */
  currentA: Float64Array;
  /** Conductance the peaks were found on, S. */
  didvS: Float64Array;
  /** Current noise σ, A. */
  noiseA: number;
  /** Conductance noise σ, S. */
  noiseS: number;
  /** Floor of the position uncertainty, V. */
  floorV: number;
}

/**
 * The peak list with the levels found beside predicted resonances, or null where none is found.
 *
 * Parameters
 * ----------
 * curve : FlankCurve
 *     Bias, current, conductance and their noise.
 * peaks : readonly Peak[]
 *     The peaks of the curve, ascending.
 * predictedV : readonly number[]
 *     The predicted resonances, V ({@link predictedResonancesV}).
 * expectedFwhmV : number
 *     The expected FWHM of a step, V.
 * minStepSigma : number
 *     The step test's threshold.
 *
 * Returns
 * -------
 * Peak[] | null
 *     A new ascending list: each peak taken as a resonance moved to its prediction (its step the
 *     refit's), and the levels beside it added; null when no prediction gave a level.
 *
 * Notes
 * -----
 * With w the expected FWHM and D = `FLANK_LEVELS_DEFAULTS`:
 * 1. Each prediction at least D.edgeFwhm·w inside the bias range takes the nearest peak within
 *    D.overlapFwhm·w as the resonance (none there: the prediction is passed over).
 * 2. The current around it is refitted with the resonance's step held at the prediction and
 *    the other peaks' steps at their positions ({@link resonanceFlankSteps}); the resonance's
 *    step must pass the step test too (a prediction where no resonance steps says nothing).
 * 3. The peak is moved to the prediction with the expected width, and each level found is added
 *    as a peak: at its fitted position, with the expected width, the Gaussian prominence of its
 *    step (step/(1.0645·w)), its significance and its position σ (the fit's, with the floor in
 *    quadrature). Later predictions see the peaks added by earlier ones.
 */
export function flankLevelPeaks(curve: FlankCurve, peaks: readonly Peak[], predictedV: readonly number[], expectedFwhmV: number, minStepSigma: number): Peak[] | null {
  const D = FLANK_LEVELS_DEFAULTS;
  const { biasV, currentA, noiseA } = curve;
  const n = biasV.length;
  if (n < 2 || !predictedV.length) return null;
  const w = expectedFwhmV;
  let list = peaks.slice();
  let changed = false;
  const moved = new Set<Peak>();
  for (const r of predictedV) {
    if (r < biasV[0] + D.edgeFwhm * w || r > biasV[n - 1] - D.edgeFwhm * w) continue;
    let k = -1;
    for (let i = 0; i < list.length; i++) if (Math.abs(list[i].biasV - r) <= D.overlapFwhm * w && (k < 0 || Math.abs(list[i].biasV - r) < Math.abs(list[k].biasV - r))) k = i;
    if (k < 0 || moved.has(list[k])) continue;
    const neighbours = list.filter((_, i) => i !== k).map((p) => p.biasV);
    const fit = resonanceFlankSteps(biasV, currentA, noiseA, r, neighbours, w, minStepSigma);
    if (!fit || !(fit.resonanceSignificance >= minStepSigma)) continue;
    const asPeak = (v: number, stepA: number, significance: number, sigmaV: number) => stepPeak(curve, v, stepA, significance, sigmaV, w);
    const resonance = asPeak(r, fit.resonanceStepA, fit.resonanceSignificance, list[k].biasUncertaintyV);
    moved.add(resonance);
    const levels = fit.levels.map((l) => asPeak(l.biasV, l.stepA, l.significance, l.uncertaintyV));
    levels.forEach((p) => moved.add(p));
    list = [...list.filter((_, i) => i !== k), resonance, ...levels].sort((a, b) => a.biasV - b.biasV);
    changed = true;
  }
  return changed ? list : null;
}

/**
 * The peak list with the level of each shared peak placed on the current: a charging peak of a
 * shell-filling CB shell that holds a predicted resonance too (or, note 5, steps as a level and
 * a resonance none predicts), refitted as the resonance and the level beside it; null where no
 * peak is shared or no fit places the level.
 *
 * Parameters
 * ----------
 * curve : FlankCurve
 *     Bias, current, conductance and their noise.
 * peaks : readonly Peak[]
 *     The peaks of the curve, ascending (those the assignment named by index).
 * stepsA : readonly number[]
 *     The current step of each peak as the assignment read it, A.
 * assignment : Pick<Assignment, "regime" | "multiplets"> & { evidence?: … }
 *     The assignment of the peaks (with `evidence.secondJunction`, the resonances it set aside:
 *     note 4).
 * predictedV : readonly number[]
 *     The predicted resonances, V ({@link predictedResonancesV}).
 * expectedFwhmV : number
 *     The expected FWHM of a step, V.
 * minStepSigma : number
 *     The step test's threshold.
 *
 * Returns
 * -------
 * { peaks: Peak[]; levels: { peak: Peak; label: string; alternate?: Peak }[] } | null
 *     A new ascending list, each shared peak replaced by the resonance (at its fitted position)
 *     and the level; the level peaks with the label of the shell the shared peak was in (or is
 *     short of, note 4) and, for a peak set aside as a resonance, the resonance's peak as the
 *     `alternate` that may hold the level instead.
 *
 * Notes
 * -----
 * With w the expected FWHM, D = `FLANK_LEVELS_DEFAULTS` and r = `ASSIGN_DEFAULTS.fillingStepRatio`:
 * 1. In shell filling, a CB charging peak within D.overlapFwhm·w of a predicted resonance (and
 *    at least D.edgeFwhm·w inside the bias range) is shared where its step exceeds r[1] times
 *    the level's share, the median step of its shell's other peaks: the charging steps of one
 *    shell are alike to within r, so a peak stepping more holds the resonance too.
 * 2. The current around it is refitted as the resonance's step held near the prediction and a
 *    level step on one side ({@link resonanceFlankSteps} with `shared`): the level's step at
 *    least D.sharedLevelStepRatio times the share. A level and a resonance within a FWHM make one
 *    peak whose position lies between them; the fit puts the level where it steps. The two steps'
 *    heights are strongly anticorrelated there, and the fit gives the resonance (its position
 *    held near the prediction, its width shared with the level) more than its part: on the
 *    benchmark's low-η draws where the bound decides, levels half a FWHM to a FWHM from a
 *    resonance stepping as much or more fit at 0.55–0.6 of the share. The bound asks for half the
 *    share, below the r[0] a peak of its own must reach; the peak was already found to hold more
 *    than one level's step (note 1).
 * 3. The resonance and the level become peaks as in {@link flankLevelPeaks} (note 3).
 * 4. A peak the assignment set aside as a resonance (`evidence.secondJunction`) that lies past the
 *    first peak of a CB shell with a degeneracy, and before the next CB shell's first peak, is
 *    judged as a charging peak of that shell (notes 1–3): a level within a FWHM of the
 *    resonance draws the two into one peak between them, which the ladder then finds too close
 *    to its neighbours to be a charging peak, and the shell is left short or filled with a
 *    resonance or a flank in its place. The prediction carries its source's scatter ×
 *    η/(1 − η), often half a FWHM, so the fit may put the resonance on the level's side: which
 *    of the two peaks is the level is left to the ladder (`alternate`; the reading is judged by
 *    {@link sharedReadingStands}).
 * 5. Where no peak at a predicted resonance was refitted, a CB charging peak of a shell (not one
 *    set aside) that lies at no predicted resonance and steps more than D.unpredictedStepRatio
 *    times the level's share is refitted as in notes 2–3 with the resonance held near the peak
 *    itself: a resonance the ladder does not predict (its source outside the window or read as
 *    no level) still adds its step to the level it lies on, and draws the peak off the level as
 *    a predicted one does. The refits of note 1 come first and alone: the new list is judged as
 *    a whole ({@link sharedReadingStands}), and a guess at an unpredicted resonance must not cost
 *    a predicted one its reading.
 */
export function sharedLevelPeaks(curve: FlankCurve, peaks: readonly Peak[], stepsA: readonly number[], assignment: Pick<Assignment, "regime" | "multiplets"> & { evidence?: Pick<Assignment["evidence"], "secondJunction"> }, predictedV: readonly number[], expectedFwhmV: number, minStepSigma: number): { peaks: Peak[]; levels: { peak: Peak; label: string; alternate?: Peak }[] } | null {
  if (assignment.regime !== "shell-filling" || !predictedV.length) return null;
  const D = FLANK_LEVELS_DEFAULTS;
  const highRatio = ASSIGN_DEFAULTS.fillingStepRatio[1];
  const { biasV, currentA, noiseA } = curve;
  const n = biasV.length;
  const w = expectedFwhmV;
  const replaced = new Map<number, Peak[]>();
  const levels: { peak: Peak; label: string; alternate?: Peak }[] = [];
  const aside = new Set((assignment.evidence?.secondJunction ?? []).map((r) => r.index));
  // The CB shells in ladder order, and each peak set aside as a resonance inside one (note 4).
  const shells = assignment.multiplets.filter((m) => m.band === "CB" && m.peakIndices.length).sort((a, b) => peaks[a.peakIndices[0]].biasV - peaks[b.peakIndices[0]].biasV);
  const setAside = (m: (typeof shells)[number]) => {
    if (m.degeneracy === null) return [];
    const k = shells.indexOf(m);
    const lo = peaks[m.peakIndices[0]].biasV;
    const hi = k + 1 < shells.length ? peaks[shells[k + 1].peakIndices[0]].biasV : Infinity;
    return [...aside].filter((i) => peaks[i].biasV > lo && peaks[i].biasV < hi);
  };
  const inside = (x: number) => x >= biasV[0] + D.edgeFwhm * w && x <= biasV[n - 1] - D.edgeFwhm * w;
  // Peaks at a predicted resonance first; a peak stepping like no level and a resonance beside it
  // only where none of those was refitted (note 5).
  for (const unpredicted of [false, true]) {
    if (replaced.size) break;
    for (const m of shells) {
      for (const i of [...m.peakIndices, ...setAside(m)]) {
        const v = peaks[i].biasV;
        const near = predictedV.filter((r) => Math.abs(r - v) <= D.overlapFwhm * w && inside(r));
        const others = m.peakIndices.filter((j) => j !== i).map((j) => stepsA[j]).sort((a, b) => a - b);
        if (!others.length || replaced.has(i)) continue;
        const share = others[others.length >> 1];
        if (unpredicted ? near.length || aside.has(i) || !inside(v) || !(stepsA[i] > D.unpredictedStepRatio * share) : !near.length || !(stepsA[i] > highRatio * share)) continue;
        const r = unpredicted ? v : near.reduce((a, b) => (Math.abs(b - v) < Math.abs(a - v) ? b : a));
        const neighbours = peaks.filter((_, j) => j !== i).map((p) => p.biasV);
        const fit = resonanceFlankSteps(biasV, currentA, noiseA, r, neighbours, w, minStepSigma, { levelStepMinA: D.sharedLevelStepRatio * share });
        if (!fit) continue;
        const resonance = stepPeak(curve, fit.resonanceV, fit.resonanceStepA, fit.resonanceSignificance, peaks[i].biasUncertaintyV, w);
        const level = fit.levels.map((l) => stepPeak(curve, l.biasV, l.stepA, l.significance, l.uncertaintyV, w));
        replaced.set(i, [resonance, ...level]);
        for (const p of level) levels.push(aside.has(i) ? { peak: p, label: m.label, alternate: resonance } : { peak: p, label: m.label });
      }
    }
  }
  if (!replaced.size) return null;
  const list = peaks.flatMap((p, i) => replaced.get(i) ?? [p]).sort((a, b) => a.biasV - b.biasV);
  return { peaks: list, levels };
}

/**
 * Whether the reading of a {@link sharedLevelPeaks} list stands against the reading before it.
 *
 * Parameters
 * ----------
 * before : { assignment: Pick<Assignment, "multiplets">; peaks: readonly Peak[] }
 *     The assignment before the refit and the peaks it named by index.
 * after : { assignment: Pick<Assignment, "multiplets">; peaks: readonly Peak[] }
 *     The assignment of the refitted list and that list.
 * levels : readonly { peak: Peak; label: string; alternate?: Peak }[]
 *     The levels {@link sharedLevelPeaks} placed.
 *
 * Returns
 * -------
 * boolean
 *     True where each level (or its alternate) joins the shell it was placed for, and every CB
 *     charging peak of `before` still in the list keeps its shell — or moves from a later shell
 *     into a shell that a level from a set-aside peak joined, or leaves such a shell (at most
 *     one peak per level placed there).
 *
 * Notes
 * -----
 * 1. A refit that moves the ladder's other peaks reads something the fit did not show; it is
 *    not taken. The moves it allows: a shell short of peaks because one of them was set
 *    aside as a resonance (note 4 of {@link sharedLevelPeaks}) read its peaks beyond the gap
 *    as the next shell (a shell's next orbital starts Ec + Δ/η on, a missing peak leaves a gap
 *    as wide); with the level back, those peaks return to it. And a shell that had filled the
 *    place with the peak nearest it on the ladder — a resonance or a flank — gives one peak up
 *    for each such level: a shell holds no more charging peaks than its degeneracy.
 */
export function sharedReadingStands(before: { assignment: Pick<Assignment, "multiplets">; peaks: readonly Peak[] }, after: { assignment: Pick<Assignment, "multiplets">; peaks: readonly Peak[] }, levels: readonly { peak: Peak; label: string; alternate?: Peak }[]): boolean {
  const cb = (a: Pick<Assignment, "multiplets">) => a.multiplets.filter((m) => m.band === "CB");
  const labels = (a: Pick<Assignment, "multiplets">, of: readonly Peak[]) => new Map(cb(a).flatMap((m) => m.peakIndices.map((i) => [of[i], m.label] as const)));
  const was = labels(before.assignment, before.peaks), now = labels(after.assignment, after.peaks);
  const order = cb(before.assignment).map((m) => m.label);
  if (!levels.every(({ peak, label, alternate }) => now.get(peak) === label || (alternate !== undefined && now.get(alternate) === label))) return false;
  // The shells a level from a set-aside peak joined, with how many peaks each may give up.
  const opened = new Map<string, number>();
  for (const l of levels) if (l.alternate !== undefined) opened.set(l.label, (opened.get(l.label) ?? 0) + 1);
  return [...was].every(([p, label]) => {
    const to = now.get(p);
    if (!after.peaks.includes(p) || to === label) return true;
    if (to === undefined) {
      const left = opened.get(label) ?? 0;
      opened.set(label, left - 1);
      return left > 0;
    }
    return opened.has(to) && order.indexOf(to) < order.indexOf(label);
  });
}

/**
 * A step found on the current as a peak: at `biasV` (V), with the expected FWHM `expectedFwhmV`
 * (V), the Gaussian prominence of its step (stepA/(FWHM × `GAUSSIAN_AREA_PER_HEIGHT_FWHM`)), its t (`significance`), and
 * its position σ (`sigmaV`, V) with the curve's floor in quadrature; height and index those of the
 * nearest sample.
 */
export function stepPeak(curve: Pick<FlankCurve, "biasV" | "didvS" | "noiseS" | "floorV">, biasV: number, stepA: number, significance: number, sigmaV: number, expectedFwhmV: number): Peak {
  const x = curve.biasV;
  const n = x.length;
  const h = n > 1 ? (x[n - 1] - x[0]) / (n - 1) : 1;
  const index = Math.min(n - 1, Math.max(0, Math.round((biasV - x[0]) / h)));
  const prominenceS = stepA / (expectedFwhmV * GAUSSIAN_AREA_PER_HEIGHT_FWHM);
  return { biasV, biasUncertaintyV: Math.hypot(sigmaV, curve.floorV), index, heightS: curve.didvS[index], prominenceS, fwhmV: expectedFwhmV, stepA, snr: prominenceS / curve.noiseS, stepSignificance: significance };
}
