/**
 * Whole-curve fits with the CB charging ladders matched to the peaks among resonances: at low η
 * the VB levels' second-junction resonances fall among the CB peaks, a charging peak and a
 * resonance within one FWHM of each other share one peak in the list, and a resonance alone may
 * lie below s; the rules then take resonances for s or p and label a level's entry a resonance.
 */
import type { FitTrial } from "./fitTrial.ts";
import type { LevelSeed } from "./levelsToFit.ts";
import { fillingOrderValenceReadings } from "./droppedPeakWholeFits.ts";
import { ladderHypotheses, peakStartWholeFits, type LadderReading } from "./peakStartWholeFits.ts";
import { steplessPeaksV, UNSEEN_S_PEAK_DEFAULTS, type UnseenSPeakContext } from "./unseenSPeakWholeFits.ts";
import { valenceSpacingEcEV } from "./wholeCurveRestarts.ts";

/** Defaults of {@link mergedPeakWholeFits} (locked by test/model/fit/mergedPeakWholeFits.test.ts). */
export const MERGED_PEAK_DEFAULTS = Object.freeze({
  /**
   * CB layouts after s (g = 2): p whole, p split 2+4, and p split 2+2+2 (whose middle sub-level may
   * show no peaks, note 2 of {@link matchedLadderReadings}). Chosen on the accuracy benchmark
   * (low-η mix with the comparison: seed 2001 draw 2021, p whole, and seed 1 draw 37, 2+2+2 with
   * p2 unseen); not tuned further.
   */
  pLayouts: Object.freeze([Object.freeze([6]), Object.freeze([2, 4]), Object.freeze([2, 2, 2])]) as readonly (readonly number[])[],
  /**
   * A predicted charging peak counts as seen where a CB peak (labelled a resonance or not) lies
   * within this fraction of Ec/η of it: a resonance merged with it pulls the peak found by up to
   * half a FWHM (about 0.2·Ec/η on the low-η mix). Chosen on the accuracy benchmark (low-η mix
   * with the comparison, seed 2001 draw 2021: merged s peaks 10 and 47 mV off, the nearest
   * wrong ladder's peak 71 mV off at Ec/η 195 mV); not tuned further.
   */
  matchFraction: 0.3,
  /** Most CB peaks passed over (read as resonances alone) before a level's entry: bounds the readings. Not tuned. */
  maxPassed: 3,
  /** Most readings fitted per layout (the fewest peaks passed over first, then the closest matched): bounds the work. Not tuned. */
  readingsPerLayout: 2,
  /**
   * fitCurve runs this stage only while at most this fraction of the fit's work budget is spent
   * (evaluations or elimination steps): a stage started later cannot finish its readings within
   * the budget and would only cut the fit short. Chosen on the accuracy benchmark (low-η mix with
   * the comparison, seed 2001 draw 2021: the stage starts at 76 %; its readings with p whole and 2+4
   * took 7 %).
   */
  maxBudgetSpent: 0.8,
});

/**
 * The CB peaks read as charging ladders in filling order whose every charging peak inside the
 * window is matched by a peak, peaks passed over read as resonances.
 *
 * Parameters
 * ----------
 * cbPeaksV : readonly number[]
 *     Every CB peak (V, positive), labelled resonances included, in any order.
 * layout : readonly number[]
 *     Degeneracies of the CB levels, s first (e.g. [2, 6]).
 * chargingEnergyV : number
 *     Ec/η in V: the spacing of a level's charging peaks.
 * topV : number
 *     The curve's highest bias (V): charging peaks beyond it are not looked for.
 * settings : typeof MERGED_PEAK_DEFAULTS, optional
 *     matchFraction and maxPassed.
 *
 * Returns
 * -------
 * { cb: LevelSeed[]; passed: number }[]
 *     Each reading's CB seeds (`before` the carriers below, levels past the last peak left out)
 *     and how many peaks it passes over: the fewest first, and among as many the one whose
 *     charging peaks lie closest to peaks found; none without peaks or a positive Ec/η.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * In filling order level j's n-th charging peak lies at (ε_j + Ec·(N_j + n − ½))/η (the closed
 * form of the orthodox ladder), so a level entered at V shows its g charging peaks at V + n·Ec/η,
 * n = 0 … g − 1.
 * 1. s enters at one of the first maxPassed + 1 peaks, each later level at one of the first
 *    maxPassed + 1 peaks more than ½·Ec/η beyond the last charging peak of the level below; a
 *    reading is kept where each of its levels' charging peaks below topV is matched within
 *    matchFraction·Ec/η. A peak passed over is a resonance alone; a matched peak may hold a
 *    resonance as well (the whole-curve model, which holds the VB levels, predicts both).
 * 2. Equal sub-levels of a split p enter equally spaced (entry j at (ε_p + j·Δ + Ec·(N_j + ½))/η,
 *    N_j = 2 + g·j: successive entries (Δ + g·Ec)/η apart), so a sub-level whose peaks are all
 *    unseen (weak steps, or each merged into a neighbour's resonance) lies midway between the
 *    entries of the equal sub-levels on either side: once per reading, such a level is placed
 *    there, between a p sub-level read and the next one entered as in 1.
 *
 * Example
 * -------
 * ```ts
 * matchedLadderReadings([1.845, 2.071, 2.307, 2.573, 2.838, 3.111, 3.314, 3.513, 3.708, 3.903, 4.105], [2, 6], 0.195, 4.49)
 *   .map((r) => r.cb.map((s) => s.firstPeakV));
 * // => [[1.845, 3.111], [2.071, 3.111]]
 * ```
 */
export function matchedLadderReadings(cbPeaksV: readonly number[], layout: readonly number[], chargingEnergyV: number, topV: number, settings = MERGED_PEAK_DEFAULTS): { cb: LevelSeed[]; passed: number }[] {
  const peaks = cbPeaksV.filter((v) => v > 0).sort((a, b) => a - b);
  if (!peaks.length || !(chargingEnergyV > 0)) return [];
  const tolV = settings.matchFraction * chargingEnergyV;
  // How far the nearest peak lies from a predicted charging peak (0 past the window's end).
  const offV = (v: number) => (v > topV - tolV ? 0 : Math.min(...peaks.map((x) => Math.abs(x - v))));
  const ladderOffV = (entryV: number, g: number) => Array.from({ length: g - 1 }, (_, n) => offV(entryV + (n + 1) * chargingEnergyV));
  const label = (j: number) => (j === 0 ? "s" : layout.length === 2 ? "p" : `p${j}`);
  const out: { cb: LevelSeed[]; passed: number; offV: number }[] = [];
  // Level j entered at one of the candidates beyond `fromV`; the reading so far in `seeds`, its peaks passed over, its summed offsets, and whether a level without peaks was placed.
  const extend = (j: number, fromV: number, before: number, seeds: LevelSeed[], passed: number, sumOffV: number, unseen: boolean): void => {
    const candidates = peaks.filter((v) => v > fromV);
    if (j === layout.length || !candidates.length) {
      if (seeds.length === layout.length || (seeds.length >= 2 && !candidates.length)) out.push({ cb: seeds, passed, offV: sumOffV });
      return;
    }
    const level = (i: number, entryV: number, b: number): LevelSeed => ({ band: "CB", label: label(i), degeneracy: layout[i], firstPeakV: entryV, before: b });
    candidates.slice(0, settings.maxPassed + 1).forEach((entryV, k) => {
      const offs = ladderOffV(entryV, layout[j]);
      if (offs.some((o) => o > tolV)) return;
      const lastV = entryV + (layout[j] - 1) * chargingEnergyV;
      extend(j + 1, lastV + 0.5 * chargingEnergyV, before + layout[j], [...seeds, level(j, entryV, before)], passed + k, sumOffV + offs.reduce((a, b) => a + b, 0), unseen);
    });
    // A sub-level without peaks between two equal ones (note 2): placed midway between their entries.
    const g = layout[j];
    if (unseen || j < 2 || layout[j - 1] !== g || layout[j + 1] !== g) return;
    const prevV = seeds[j - 1].firstPeakV;
    candidates.slice(0, settings.maxPassed + 1).forEach((entryV, k) => {
      const midV = (prevV + entryV) / 2;
      const offs = ladderOffV(entryV, g);
      if (midV <= fromV || offs.some((o) => o > tolV)) return;
      const lastV = entryV + (g - 1) * chargingEnergyV;
      extend(j + 2, lastV + 0.5 * chargingEnergyV, before + 2 * g, [...seeds, level(j, midV, before), level(j + 1, entryV, before + g)], passed + k, sumOffV + offs.reduce((a, b) => a + b, 0), true);
    });
  };
  extend(0, 0, 0, [], 0, 0, false);
  return out.sort((a, b) => a.passed - b.passed || a.offV - b.offV).map(({ cb, passed }) => ({ cb, passed }));
}

/**
 * The filling-order ladders matched to the peaks among resonances ({@link matchedLadderReadings})
 * fitted to the whole curve.
 *
 * Parameters
 * ----------
 * context : UnseenSPeakContext
 *     That of {@link peakStartWholeFits}, and the VB peaks.
 * settings : typeof MERGED_PEAK_DEFAULTS, optional
 *     pLayouts, matchFraction, maxPassed and readingsPerLayout.
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
 * 1. Run only where no grouping's whole-curve fit describes the curve, after every other such
 *    stage (fitCurve): the model holds every VB level and so predicts its resonances, so a peak
 *    passed over that is no resonance, or a resonance read as a charging peak, keeps χ² high.
 * 2. The CB peaks are all of the ladders' analysis, labelled resonances included (a level's entry
 *    may be labelled one), less those that carry almost no current step
 *    (UNSEEN_S_PEAK_DEFAULTS.minStepFraction of the largest: a noise-split flank). Ec/η starts
 *    from the first VB spacing (in shell filling the VB doublet's two peaks lie Ec/η apart), else
 *    the ladder's. The first readingsPerLayout readings of each layout not already compared are
 *    fitted with the VB peaks read as a doublet and a level of four in filling order
 *    ({@link shellValenceReading}, {@link inFillingOrder}) and the ladders' readings.
 * 3. On the low-η mix with the comparison (seed 2001 draw 2021, η 0.55: the first VB level's
 *    first resonance at 1.845 V taken for s, s's two charging peaks each merged with a resonance
 *    into one peak, p's entry labelled a resonance) the rules left the regime undetermined and
 *    every grouping's whole-curve fit stayed poor; s read at the two merged peaks and p at the
 *    labelled one describes the curve. On seed 1 draw 37 (η 0.62, p split 2+2+2, p2's peaks
 *    unseen, a resonance counted in p) the 2+2+2+2 reading with p2 midway between p1 and p3
 *    describes it, where the rules' reading and every other stage's did not.
 *
 * Example
 * -------
 * ```ts
 * const found = mergedPeakWholeFits({ ...context, hypotheses, vbPeaksV });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function mergedPeakWholeFits(context: UnseenSPeakContext, settings = MERGED_PEAK_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const ecEV = mergedPeakEcEV(context);
  return ecEV === null ? null : matchedLadderWholeFits(context, ecEV, settings);
}

/**
 * The Ec (eV) {@link mergedPeakWholeFits} matches its ladders with: from the first VB spacing of
 * the peaks that carry a step, else the first filling-order ladder's start; null where there is no
 * filling-order ladder or no positive Ec.
 */
export function mergedPeakEcEV(context: UnseenSPeakContext): number | null {
  const base = context.hypotheses.find((h) => h.kind === "ladder-filling");
  if (!base) return null;
  const stepless = steplessPeaksV(base.analysis.peaks, UNSEEN_S_PEAK_DEFAULTS.minStepFraction);
  const ecEV = valenceSpacingEcEV(context.vbPeaksV.filter((v) => !stepless.has(v)), context.eta) ?? base.chargingEnergyStartEV;
  return ecEV !== null && ecEV > 0 ? ecEV : null;
}

/**
 * As {@link mergedPeakWholeFits}, with the ladders matched and started at a given Ec (eV), and
 * with the given VB readings where they are given (else {@link fillingOrderValenceReadings} at that Ec).
 */
export function matchedLadderWholeFits(context: UnseenSPeakContext, ecEV: number, settings = MERGED_PEAK_DEFAULTS, vbReadingsGiven?: LevelSeed[][]): { cb: FitTrial; whole: FitTrial } | null {
  const ladders = context.hypotheses.filter((h) => h.kind === "ladder-filling");
  if (!ladders.length || !(ecEV > 0)) return null;
  const base = ladders[0];
  const peaks = base.analysis.peaks;
  const stepless = steplessPeaksV(peaks, UNSEEN_S_PEAK_DEFAULTS.minStepFraction);
  const cbPeaksV = peaks.filter((x) => x.biasV > 0 && !stepless.has(x.biasV)).map((x) => x.biasV);
  const bias = base.analysis.conductance.biasV;
  const topV = Math.max(bias[0], bias[bias.length - 1]);
  const vbReadings = vbReadingsGiven ?? fillingOrderValenceReadings(ladders, ecEV / context.eta);
  const hypotheses = settings.pLayouts.flatMap((p) => {
    const readings: LadderReading[] = matchedLadderReadings(cbPeaksV, [2, ...p], ecEV / context.eta, topV, settings).map(({ cb, passed }) => ({
      cb,
      name: `ladder-filling ${cb.map((s) => s.degeneracy).join("+")} (s at ${cb[0].firstPeakV.toFixed(3)} V, ${passed} CB peak${passed === 1 ? "" : "s"} resonances alone${cb.some((x) => !cbPeaksV.includes(x.firstPeakV)) ? ", a sub-level without peaks" : ""})`,
      label: `charging ladder in filling order matched to the CB peaks with ${passed} read as resonances alone${cb.some((x) => !cbPeaksV.includes(x.firstPeakV)) ? " and a sub-level without peaks" : ""}`,
    }));
    return ladderHypotheses(base, context.hypotheses, readings, vbReadings, ecEV).slice(0, settings.readingsPerLayout);
  });
  return hypotheses.length ? peakStartWholeFits({ ...context, hypotheses }) : null;
}
