/**
 * Whole-curve fits with one of the s doublet's two charging peaks unseen: at low η a weak or
 * noise-split dI/dV peak at the CB edge may be missing from the peak list, and every ladder then
 * starts s (and each level after it) one charging peak off.
 */
import type { FitTrial } from "./fitTrial.ts";
import { distinctReadings, type LevelSeed } from "./levelsToFit.ts";
import { laterFourEntryReadings } from "./laterEntryWholeFits.ts";
import { ladderHypotheses, peakStartWholeFits, type LadderReading, type PeakStartWholeContext } from "./peakStartWholeFits.ts";
import { valenceSpacingEcEV } from "./wholeCurveRestarts.ts";

/** Defaults of {@link unseenSPeakWholeFits} (locked by test/model/fit/unseenSPeakWholeFits.test.ts). */
export const UNSEEN_S_PEAK_DEFAULTS = Object.freeze({
  /**
   * CB layouts after s (g = 2) read with an unseen s peak: p whole and p split 2+4 (a 2+2+2 split
   * adds a level the few peaks left rarely fix). Chosen on the accuracy benchmark (low-η mix with
   * the comparison: draw 46 of seed 1, p split 2+4, and 2181 of seed 2001, p whole); not tuned further.
   */
  pLayouts: Object.freeze([Object.freeze([6]), Object.freeze([2, 4])]) as readonly (readonly number[])[],
  /**
   * A level's entry is the first CB peak more than this many Ec/η beyond the last charging peak
   * of the level below (its entry plus (g − 1)·Ec/η): peaks closer are that level's charging peaks
   * or resonances. Half a spacing (the midpoint); not tuned.
   */
  entryGap: 0.5,
  /** VB readings with the level of four entered later ({@link laterFourEntryReadings}) also tried: entries at the third … (2 + this) peak from the gap. */
  laterVbEntries: 2,
  /**
   * Where a ladder runs out of peaks before a level, each of the first this many peaks set aside
   * as second-junction resonances beyond the level below is tried as its entry (note 4 of
   * {@link unseenSPeakWholeFits}). Chosen on the accuracy benchmark (low-η mix with the
   * comparison, seed 2001 draw 2176: p's entry the second resonance past s); not tuned further.
   */
  resonanceEntries: 3,
  /**
   * A peak whose current step is below this fraction of the largest peak's is neither a level's
   * entry nor one end of the VB spacing that starts Ec (note 4): every charging peak carries a
   * step. Chosen on the accuracy benchmark (low-η mix with the comparison, seed 2001 draw 2176:
   * two such peaks, each below 0.1 % of the largest step, beside 13–83 pA charging steps); not
   * tuned further.
   */
  minStepFraction: 0.01,
});

/** What {@link unseenSPeakWholeFits} works with: that of {@link peakStartWholeFits}, and the VB peaks. */
export interface UnseenSPeakContext extends PeakStartWholeContext {
  /** Every VB peak's bias (V, negative), in any order (their first spacing starts Ec). */
  vbPeaksV: readonly number[];
}

/**
 * The CB peaks read as a charging ladder in filling order with one of s's two charging peaks unseen.
 *
 * Parameters
 * ----------
 * cbPeaksV : readonly number[]
 *     The CB peaks seen (V, positive; labelled resonances left out), in any order.
 * layout : readonly number[]
 *     Degeneracies of the CB levels, s first (e.g. [2, 6] or [2, 2, 4]).
 * chargingEnergyV : number
 *     Ec/η in V: the spacing of a level's charging peaks.
 * resonancesV : readonly number[], optional
 *     The CB peaks set aside as second-junction resonances (V); default none.
 * resonanceEntry : number, optional
 *     Where no peak seen lies beyond a level's reach, the level enters at this one (0 the first)
 *     of the resonances beyond it; default 0.
 *
 * Returns
 * -------
 * LevelSeed[][]
 *     Two readings (none without peaks or a positive Ec/η): (a) the first peak seen is s's second
 *     (s's `before` 1, its first peak unseen one Ec/η below it), and (b) it is s's first (`before`
 *     0), its second unseen. Each further level enters at the first peak more than
 *     UNSEEN_S_PEAK_DEFAULTS.entryGap·Ec/η beyond the last charging peak of the level below (its
 *     entry + (g − 1)·Ec/η), `before` the carriers below it, or else at the resonanceEntry-th
 *     resonance beyond that; levels past the last peak are left out.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * In filling order level j's n-th charging peak lies at (ε_j + Ec·(N_j + n − ½))/η with N_j the
 * carriers of the levels below it (the closed form of the orthodox ladder); s's two peaks lie
 * Ec/η apart. With one of them unseen, counting peaks puts every level one charging peak off;
 * read from the spacing instead, the start ε = η·V − Ec·(before + ½) sits on each level.
 *
 * Example
 * -------
 * ```ts
 * unseenSPeakReadings([1.774, 2.675, 3.32], [2, 6], 0.248).map((r) => r.map((s) => `${s.firstPeakV}/${s.before}`));
 * // => [["1.774/1", "2.675/2"], ["1.774/0", "2.675/2"]]
 * ```
 */
export function unseenSPeakReadings(cbPeaksV: readonly number[], layout: readonly number[], chargingEnergyV: number, resonancesV: readonly number[] = [], resonanceEntry = 0): LevelSeed[][] {
  const peaks = cbPeaksV.filter((v) => v > 0).sort((a, b) => a - b);
  const resonances = resonancesV.filter((v) => v > 0).sort((a, b) => a - b);
  if (!peaks.length || !(chargingEnergyV > 0)) return [];
  const label = (j: number) => (j === 0 ? "s" : layout.length === 2 ? "p" : `p${j}`);
  const read = (sBefore: number): LevelSeed[] => {
    const seeds: LevelSeed[] = [{ band: "CB", label: "s", degeneracy: layout[0], firstPeakV: peaks[0], before: sBefore }];
    // The level's last charging peak: s's second, seen (sBefore 1) or one Ec/η above its first.
    let lastV = peaks[0] + (layout[0] - 1 - sBefore) * chargingEnergyV;
    let before = layout[0];
    for (let j = 1; j < layout.length; j++) {
      const beyondV = lastV + UNSEEN_S_PEAK_DEFAULTS.entryGap * chargingEnergyV;
      const entry = peaks.find((v) => v > beyondV) ?? resonances.filter((v) => v > beyondV)[resonanceEntry];
      if (entry === undefined) break;
      seeds.push({ band: "CB", label: label(j), degeneracy: layout[j], firstPeakV: entry, before });
      lastV = entry + (layout[j] - 1) * chargingEnergyV;
      before += layout[j];
    }
    return seeds;
  };
  return [read(1), read(0)];
}

/**
 * The positions of the peaks that carry almost no current step: below `minStepFraction` of the
 * largest peak's (a peak with no step measured counts as carrying the largest). Every charging
 * peak carries a step, so such a peak is neither a level's entry nor one end of the VB spacing
 * that starts Ec (note 4 of {@link unseenSPeakWholeFits}; also read by `mergedPeakWholeFits`).
 *
 * Example
 * -------
 * ```ts
 * steplessPeaksV([{ biasV: 1, stepA: 1e-11 }, { biasV: 1.2, stepA: 5e-15 }], 0.01); // => Set {1.2}
 * ```
 */
export function steplessPeaksV(peaks: readonly { biasV: number; stepA?: number | null }[], minStepFraction: number): Set<number> {
  const largestStepA = Math.max(0, ...peaks.map((x) => x.stepA ?? 0));
  return new Set(peaks.filter((x) => (x.stepA ?? largestStepA) < minStepFraction * largestStepA).map((x) => x.biasV));
}

/**
 * The CB peaks a filling-order ladder is read from and the resonances it may enter at: the peaks
 * above zero bias, those the rules labelled second-junction resonances
 * (`assignment.evidence.secondJunction`) apart. Shared by `unseenSPeakWholeFits` and
 * `ecGridWholeFits`.
 *
 * Parameters
 * ----------
 * analysis : { peaks, assignment }
 *     The peaks (`biasV` in V) and the rules' second-junction resonances (indices into them).
 * setAsideV : ReadonlySet<number>, optional
 *     Positions (V) of peaks also left out of the ladder's peaks (not of the resonances), e.g.
 *     {@link steplessPeaksV}'s; default none.
 *
 * Returns
 * -------
 * { cbPeaksV: number[]; resonancesV: number[] }
 *     The ladder's CB peaks and the CB resonances, V, in the peaks' order.
 *
 * Example
 * -------
 * ```ts
 * cbLadderPeaksV({ peaks: [{ biasV: -1 }, { biasV: 1 }, { biasV: 1.2 }], assignment: { evidence: { secondJunction: [{ index: 2 }] } } });
 * // => { cbPeaksV: [1], resonancesV: [1.2] }
 * ```
 */
export function cbLadderPeaksV(
  analysis: { peaks: readonly { biasV: number }[]; assignment: { evidence: { secondJunction: readonly { index: number }[] } } },
  setAsideV: ReadonlySet<number> = new Set(),
): { cbPeaksV: number[]; resonancesV: number[] } {
  const resonant = new Set(analysis.assignment.evidence.secondJunction.map((r) => r.index));
  const cbPeaksV = analysis.peaks.filter((x, i) => x.biasV > 0 && !resonant.has(i) && !setAsideV.has(x.biasV)).map((x) => x.biasV);
  const resonancesV = analysis.peaks.filter((x, i) => x.biasV > 0 && resonant.has(i)).map((x) => x.biasV);
  return { cbPeaksV, resonancesV };
}

/**
 * The filling-order ladders fitted to the whole curve with one of s's charging peaks unseen.
 *
 * Parameters
 * ----------
 * context : UnseenSPeakContext
 *     That of {@link peakStartWholeFits}, and the VB peaks.
 * settings : typeof UNSEEN_S_PEAK_DEFAULTS, optional
 *     pLayouts, laterVbEntries, resonanceEntries and minStepFraction.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     As {@link peakStartWholeFits}: the whole-curve run that describes the curve and is
 *     acceptable, with its grouping fitted on the CB side; null when none is.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Run only where no grouping's whole-curve fit describes the curve (fitCurve): the model
 *    predicts the unseen peak's step, so a wrong reading keeps χ² high and is not taken.
 * 2. The CB peaks are those of the filling-order ladders' analysis less its labelled
 *    resonances; each layout's readings of {@link unseenSPeakReadings} not already compared are
 *    fitted from their peaks ({@link peakStartWholeFits}) with the ladders' VB readings and those
 *    with the VB level of four entered later ({@link laterFourEntryReadings}), Ec started from the
 *    first VB spacing (in shell filling the VB doublet's two peaks lie Ec/η apart) or else the
 *    ladder's.
 * 3. On the low-η mix (seed 1 draw 46) the first CB charging step is about ten times the current
 *    noise, yet its smoothed dI/dV peak is jagged by the noise to about three times the
 *    conductance noise, below the peak list's limits, and the zero-current region the offset is
 *    read from reaches onto its rise.
 * 4. At low η a CB level may enter right at a second-junction resonance of a VB level (the
 *    resonance of a VB peak V_v lies at −η·V_v/(1 − η), and at η near 0.6 these fall among the
 *    p peaks): the rules then set aside every p peak and the ladder ends at s. Where no peak seen
 *    lies beyond the level below, each of the first resonanceEntries resonances beyond it is tried
 *    as the entry (the model predicts that level's other charging peaks, so a wrong entry keeps
 *    χ² high). Peaks that carry almost no current step (below minStepFraction of the largest
 *    peak's: a noise-split flank, not a charging peak) are left out of both the entries and the
 *    VB spacing that starts Ec: such a peak 9 mV from the first VB peak started Ec at 5 meV on
 *    low-η seed 2001 draw 2176 (simulated 80 meV), and another, past s, took p's entry.
 *
 * Example
 * -------
 * ```ts
 * const found = unseenSPeakWholeFits({ ...context, hypotheses, vbPeaksV });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function unseenSPeakWholeFits(context: UnseenSPeakContext, settings = UNSEEN_S_PEAK_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const ladders = context.hypotheses.filter((h) => h.kind === "ladder-filling");
  if (!ladders.length) return null;
  const base = ladders[0];
  // Peaks that carry almost no current step set aside (note 4): neither an entry nor a VB spacing.
  const stepless = steplessPeaksV(base.analysis.peaks, settings.minStepFraction);
  const { cbPeaksV, resonancesV } = cbLadderPeaksV(base.analysis, stepless);
  const mainVbV = context.vbPeaksV.filter((v) => !stepless.has(v));
  const later = laterFourEntryReadings(context.vbPeaksV, 2 + settings.laterVbEntries);
  const vbReadings = distinctReadings([...ladders.flatMap((h) => h.vbReadings), ...later]);
  const ecEV = valenceSpacingEcEV(mainVbV, context.eta) ?? base.chargingEnergyStartEV;
  if (ecEV === null || !(ecEV > 0)) return null;
  const readings: LadderReading[] = [];
  for (const p of settings.pLayouts) {
    const layout = [2, ...p];
    for (let k = 0; k < Math.max(1, settings.resonanceEntries); k++)
      unseenSPeakReadings(cbPeaksV, layout, ecEV / context.eta, resonancesV, k).forEach((cb, i) => {
        const atResonance = cb.some((s) => resonancesV.includes(s.firstPeakV));
        readings.push({
          cb,
          name: `ladder-filling ${cb.map((s) => s.degeneracy).join("+")} (s ${i === 0 ? "first" : "second"} peak unseen${atResonance ? ", a level entered at a resonance" : ""})`,
          label: `charging ladder in filling order with s's ${i === 0 ? "first" : "second"} charging peak unseen`,
        });
      });
  }
  const hypotheses = ladderHypotheses(base, context.hypotheses, readings, vbReadings, ecEV);
  return hypotheses.length ? peakStartWholeFits({ ...context, hypotheses }) : null;
}
