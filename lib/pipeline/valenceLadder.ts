/**
 * The valence ladder's second-junction resonances on the CB side, predicted as current: at low η
 * the VB levels' resonances through the substrate junction fall among the CB charging peaks;
 * the ladder read from the first assignment gives each resonance step's position and height,
 * and the predicted current is taken out of the measured one before the CB peaks are found again.
 */
import type { Assignment } from "../assign/assignSpectrum.ts";
import type { Peak } from "../peaks/findPeaks.ts";
import { bandLadders, currentSteps, fastCurrent, type CurrentStep, type DotModel } from "../model/bandCurrent.ts";
import { rateRatioFromStepRatio, REGIME_LIMITS } from "../model/regimeLimits.ts";
import { stateCount, type Level } from "../model/scenario.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { subgroupSpans } from "../assign/multiplets.ts";

/** Limits of {@link valenceLadderPrediction} (locked by test/pipeline/valenceLadder.test.ts). */
export const VALENCE_LADDER_DEFAULTS = Object.freeze({
  /** Lowest rate ratio Γtip/Γsub tried (the regime's lower bound: the assignment reads shell filling). */
  minRateRatio: REGIME_LIMITS.fillingRateRatioMin,
  /** Highest rate ratio tried (the resonances' heights hardly change beyond it). */
  maxRateRatio: 100,
  /** Rate ratios tried from minRateRatio to maxRateRatio, log-spaced, besides the s doublet's reading. */
  rateRatioGrid: 9,
  /** The model's rms misfit of the VB-side current may be at most this fraction of the mean measured VB step (a ladder that lacks or adds a level misfits by about a step). */
  maxMisfitPerStep: 0.12,
  /** Relaxation rate inside the dot, as a multiple of the faster tunnelling rate (carriers reach the lowest free level first). */
  relaxationRateFactor: 1000,
  /** The ladder is not built with more occupation states than this (product of g + 1 over the levels). */
  maxStates: 4096,
  /** Temperature of the model, K (the steps are zero-temperature plateaus: it sets only their thermal width, far below the peaks'). */
  temperatureK: 4.5,
});

/** The VB ladder read from an assignment and its resonance steps on the CB side. */
export interface ValenceLadderPrediction {
  /** The VB levels (hole energies as negative ε, nearest the gap first), eV; one state per charging peak of a sub-group. */
  levels: Level[];
  /** Charging energy Ec, eV (η × the VB ladder's charging spacing). */
  chargingEnergyEV: number;
  /** Γtip/Γsub whose VB steps fit the measured current best. */
  rateRatio: number;
  /** The factor the model's currents (at Γsub = 1/s) are scaled by to the measured current. */
  scale: number;
  /** rms misfit of the scaled model on the VB side over the mean measured VB step. */
  misfitPerStep: number;
  /** The resonance steps at positive bias inside the window, scaled: position (V), height (A), thermal width (V). */
  steps: CurrentStep[];
}

/**
 * The VB ladder of a shell-filling assignment and the steps its second-junction resonances add
 * at positive bias, scaled to the measured current.
 *
 * Parameters
 * ----------
 * peaks : readonly { biasV: number; stepA: number }[]
 *     The assignment's peak list: positions (V) and current steps (A).
 * assignment : Pick<Assignment, "regime" | "multiplets" | "quantities" | "evidence">
 *     The assignment; only shell filling with a positive Ec, VB multiplets of whole levels and
 *     the s doublet's step ratio gives a prediction.
 * eta : number
 *     η in (0, 1).
 * biasRangeV : readonly [number, number]
 *     The bias window, V: only steps inside it are returned.
 * current : { biasV: Float64Array; currentA: Float64Array; fwhmV: number }
 *     The measured current (offset-corrected, A) on its bias (V, ascending) and the expected
 *     FWHM of a peak, V: the model is scaled and checked on it.
 *
 * Returns
 * -------
 * ValenceLadderPrediction | null
 *     The ladder and its resonance steps inside the window at positive bias; null where the
 *     assignment gives no ladder, the first resonance lies beyond the window, or the model does
 *     not describe the VB side (note 4).
 *
 * Notes
 * -----
 * With D = `VALENCE_LADDER_DEFAULTS`:
 * 1. Levels: each sub-group of each VB multiplet (nearest the gap first) is one level holding one
 *    hole per charging peak; a sub-group of an odd number of peaks gives no prediction (every
 *    orbital holds two carriers: a peak is missing or extra, and the ladder is not known). Ec is
 *    η times the mean spacing of the peaks inside the VB sub-groups (the CB's Ec_V where no
 *    sub-group has two): a resonance of the k-th hole lies at (|ε| + Ec·(k − ½))/(1 − η) from its
 *    level's first, so an error of Ec moves it by k/(1 − η) times the error, and the VB ladder's
 *    own spacing is the one its holes see. In shell filling the k-th hole added (N holes before
 *    it) steps at |V| = (|ε| + Ec·(N + ½))/η, so |ε| is the mean over the sub-group's peaks of
 *    η·|V| − Ec·(N + ½).
 * 2. Rates: every current of the master equation scales with a common factor of the rates, so
 *    the model runs at Γsub = 1/s and is scaled afterwards. Which resonance steps carry the
 *    current, and how much, depends on Γtip/Γsub; the s doublet's step ratio q gives it only
 *    roughly (q/(1 − q), `rateRatioFromStepRatio`, is steep near q = 1). So that reading and
 *    D.rateRatioGrid ratios from D.minRateRatio to D.maxRateRatio are tried, and the one whose
 *    VB steps fit the measured current best is kept.
 * 3. Scale: least squares of the measured current on the model's ({@link stepsCurrent} of its
 *    steps at negative bias, less its value at 0 V) from 0 V to a FWHM past the outermost VB
 *    peak. The raw current is fitted, not the peaks' steps (which read about 14 % above the
 *    current's: the conductance filter), so the same factor carries the resonance steps. The
 *    s level's resonances through the substrate junction (the CB's nearest the gap) often fall
 *    on that stretch at low η: the s level, read from its charging peaks like a VB level, is
 *    modelled with the same rates, and its steps at negative bias join the fitted current.
 * 4. The fit's rms misfit must stay within D.maxMisfitPerStep of the mean measured VB step: a
 *    ladder read with a level too few or too many misfits by about a step, and its resonances
 *    would be wrong.
 * 5. The model's zero-temperature steps ({@link currentSteps}) at positive bias are the VB
 *    ladder's crossings through the substrate junction (a hole ladder runs at −V).
 *
 * Example
 * -------
 * ```ts
 * const pred = valenceLadderPrediction(analysis.peaks, analysis.assignment, 0.6, [-2.5, 3.5],
 *   { biasV: analysis.conductance.biasV, currentA: analysis.conductance.currentA, fwhmV: 0.07 });
 * pred?.steps.map((s) => s.biasV); // => the resonances (|ε| + Ec·(N + ½))/(1 − η) inside the window
 * ```
 */
export function valenceLadderPrediction(
  peaks: readonly { biasV: number; stepA: number }[],
  assignment: Pick<Assignment, "regime" | "multiplets" | "quantities" | "evidence">,
  eta: number,
  biasRangeV: readonly [number, number],
  current: { biasV: Float64Array; currentA: Float64Array; fwhmV: number },
): ValenceLadderPrediction | null {
  const D = VALENCE_LADDER_DEFAULTS;
  const ecV = assignment.quantities.chargingEnergyV;
  const q = assignment.evidence.secondToFirstStepRatio;
  if (assignment.regime !== "shell-filling" || !(eta > 0 && eta < 1) || ecV === null || !(ecV > 0) || q === null || !(q > 0)) return null;
  if (biasRangeV[1] <= 0) return null;
  // The VB sub-groups (peak indices), nearest the gap first.
  const groups: number[][] = [];
  for (const m of assignment.multiplets) {
    if (m.band !== "VB") continue;
    for (const { indices } of subgroupSpans(m)) if (indices.length) groups.push(indices);
  }
  if (!groups.length || groups.some((g) => g.length % 2)) return null;
  let spanV = 0, gaps = 0;
  for (const g of groups) {
    spanV += Math.abs(peaks[g[g.length - 1]].biasV - peaks[g[0]].biasV);
    gaps += g.length - 1;
  }
  const ecEV = eta * (gaps ? spanV / gaps : ecV);
  const levels: Level[] = [];
  let holes = 0, measuredA = 0, outerV = 0;
  for (const g of groups) {
    let sum = 0;
    g.forEach((i, k) => {
      sum += eta * Math.abs(peaks[i].biasV) - ecEV * (holes + k + 0.5);
      measuredA += Math.max(0, peaks[i].stepA);
      outerV = Math.min(outerV, peaks[i].biasV);
    });
    levels.push({ energyEV: -sum / g.length, degeneracy: g.length });
    holes += g.length;
  }
  if (stateCount(levels) > D.maxStates || !(measuredA > 0)) return null;
  // The lowest resonance: the first hole of the level nearest the gap, through the substrate junction.
  if ((-levels[0].energyEV + ecEV / 2) / (1 - eta) > biasRangeV[1]) return null;
  const { biasV, currentA, fwhmV } = current;
  // The fitted stretch [lo, hi): from a FWHM past the outermost VB peak to 0 V.
  let lo = 0, hi = 0;
  while (lo < biasV.length && biasV[lo] < outerV - fwhmV) lo++;
  for (hi = lo; hi < biasV.length && biasV[hi] <= 0; ) hi++;
  const fitV = biasV.subarray(lo, hi);
  // The s level (electron energy), read like the VB's from its charging peaks: its resonances
  // through the substrate junction are the CB's nearest the gap and add to the VB side's current.
  const sShell = assignment.multiplets.find((m) => m.band === "CB" && m.label === "s" && m.peakIndices.length);
  const cbLevels: Level[] = sShell ? [{ energyEV: sShell.peakIndices.reduce((a, i, k) => a + eta * peaks[i].biasV - ecEV * (k + 0.5), 0) / sShell.peakIndices.length, degeneracy: sShell.peakIndices.length }] : [];
  const grid = Array.from({ length: D.rateRatioGrid }, (_, k) => D.minRateRatio * (D.maxRateRatio / D.minRateRatio) ** (k / (D.rateRatioGrid - 1)));
  let best: { rateRatio: number; scale: number; misfitA: number; all: CurrentStep[] } | null = null;
  for (const r of [q < 1 ? rateRatioFromStepRatio(q) : D.maxRateRatio, ...grid]) {
    const rateRatio = Math.min(D.maxRateRatio, Math.max(D.minRateRatio, r));
    const model: DotModel = { cb: [], vb: levels, chargingEnergyEV: ecEV, eta, tipRatePerS: rateRatio, substrateRatePerS: 1, relaxationRatePerS: D.relaxationRateFactor * Math.max(rateRatio, 1), temperatureK: D.temperatureK };
    const all = currentSteps(model, bandLadders(model)).steps;
    const sModel = { ...model, cb: cbLevels, vb: [] };
    const sBelow = cbLevels.length ? currentSteps(sModel, bandLadders(sModel)).steps.filter((st) => st.biasV < 0) : [];
    const below = [...all.filter((st) => st.biasV < 0), ...sBelow].sort((a, b) => a.biasV - b.biasV);
    const u = stepsCurrent(below, fitV, fwhmV);
    const topA = below.reduce((a, st) => a + st.heightA, 0);
    let uu = 0, ui = 0, ii = 0;
    for (let k = 0; k < u.length; k++) {
      const x = u[k] - topA, y = currentA[lo + k];
      uu += x * x;
      ui += x * y;
      ii += y * y;
    }
    const scale = ui / uu;
    const misfitA = Math.sqrt(Math.max(0, ii - scale * ui) / Math.max(1, u.length));
    if (scale > 0 && Number.isFinite(scale) && (!best || misfitA < best.misfitA)) best = { rateRatio, scale, misfitA, all };
  }
  if (!best) return null;
  const misfitPerStep = best.misfitA / (measuredA / holes);
  if (!(misfitPerStep <= D.maxMisfitPerStep)) return null;
  const { rateRatio, scale } = best;
  const steps = best.all.filter((s) => s.biasV > 0 && s.biasV >= biasRangeV[0] && s.biasV <= biasRangeV[1]).map((s) => ({ ...s, heightA: s.heightA * scale }));
  if (!steps.length) return null;
  return { levels, chargingEnergyEV: ecEV, rateRatio, scale, misfitPerStep, steps };
}

/**
 * The current of steps at each bias, each broadened like a measured peak of the given FWHM:
 * 0 below every step.
 *
 * Parameters
 * ----------
 * steps : readonly CurrentStep[]
 *     The steps (position V, height A, thermal width V).
 * biasV : ArrayLike<number>
 *     Sample biases, V.
 * fwhmV : number
 *     FWHM of a step's conductance peak, V (the Gaussian σ is FWHM/(2·√(2 ln 2))).
 *
 * Returns
 * -------
 * Float64Array
 *     Current in A ({@link fastCurrent} of the steps on a zero base).
 *
 * Example
 * -------
 * ```ts
 * stepsCurrent([{ biasV: 1, heightA: 1e-11, thermalWidthV: 0 }], [0, 1, 2], 0.05); // => [0, 5e-12, 1e-11]
 * ```
 */
export function stepsCurrent(steps: readonly CurrentStep[], biasV: ArrayLike<number>, fwhmV: number): Float64Array {
  return fastCurrent({ baseA: 0, steps: steps.slice() }, biasV, fwhmV / GAUSSIAN_FWHM_PER_SIGMA);
}

/**
 * The CB side found again on the current less the VB ladder's predicted resonances: the peak
 * list and the remainder it was found on; null where the assignment gives no prediction.
 *
 * Parameters
 * ----------
 * currentA : Float64Array
 *     The measured current (offset-corrected), A.
 * didvS : Float64Array
 *     The conductance the peaks were found on, S.
 * biasV : Float64Array
 *     Bias, V (uniform, ascending).
 * peaks : readonly Peak[]
 *     The peaks of the curve, ascending (those the assignment named by index).
 * stepsA : readonly number[]
 *     The current step of each peak as the assignment read it, A.
 * assignment : Pick<Assignment, "regime" | "multiplets" | "quantities" | "evidence">
 *     The assignment of the peaks.
 * eta : number
 *     η in (0, 1).
 * expectedFwhmV : number
 *     The expected FWHM of a peak, V.
 * reread : { differentiate(currentA): Float64Array; findPeaks(currentA, didvS): readonly Peak[] }
 *     The pipeline's own conductance filter and peak search, applied to the remainder.
 *
 * Returns
 * -------
 * { peaks: Peak[]; currentA: Float64Array; didvS: Float64Array; prediction: ValenceLadderPrediction } | null
 *     A new ascending list (the peaks at negative bias as they were, those at positive bias
 *     found on the remainder), the remainder's current and conductance, and the prediction.
 *
 * Example
 * -------
 * ```ts
 * // Inside analyzeCurve: the pipeline's filter and peak search applied to the remainder.
 * const vb = valenceResonancePeaks(currentA, didvS, biasV, list, stepsA, assignment, eta, w,
 *   { differentiate: (y) => savitzkyGolayUnchecked(y, windowSamples, order, 1, stepV), findPeaks: (i, g) => findPeaks(biasV, g, options).peaks });
 * vb?.peaks.filter((p) => p.biasV > 0); // => the CB peaks found with the VB ladder's resonances taken out
 * ```
 *
 * Notes
 * -----
 * 1. The prediction ({@link valenceLadderPrediction}) over the positive bias range.
 * 2. Its current ({@link stepsCurrent}, Gaussian steps of the expected FWHM: the fast model
 *    broadens both junctions' steps alike in bias) is subtracted from the measured current, and
 *    its derivative through the same filter from the conductance (the filter is linear: the
 *    remainder's conductance is the filter of the remainder's current).
 * 3. The peak search runs on the remainder; its peaks at positive bias replace the list's. The
 *    resonances are not added as peaks: the assignment would read them by their positions
 *    alone, and a charging peak on a predicted resonance is then kept or set aside by its own
 *    rules.
 */
export function valenceResonancePeaks(
  currentA: Float64Array,
  didvS: Float64Array,
  biasV: Float64Array,
  peaks: readonly Peak[],
  stepsA: readonly number[],
  assignment: Pick<Assignment, "regime" | "multiplets" | "quantities" | "evidence">,
  eta: number,
  expectedFwhmV: number,
  reread: { differentiate: (currentA: Float64Array) => Float64Array; findPeaks: (currentA: Float64Array, didvS: Float64Array) => readonly Peak[] },
): { peaks: Peak[]; currentA: Float64Array; didvS: Float64Array; prediction: ValenceLadderPrediction } | null {
  const n = biasV.length;
  if (n < 2) return null;
  const input = peaks.map((p, k) => ({ biasV: p.biasV, stepA: stepsA[k] }));
  const prediction = valenceLadderPrediction(input, assignment, eta, [Math.max(0, biasV[0]), biasV[n - 1]], { biasV, currentA, fwhmV: expectedFwhmV });
  if (!prediction) return null;
  const predA = stepsCurrent(prediction.steps, biasV, expectedFwhmV);
  const predS = reread.differentiate(predA);
  const restA = new Float64Array(n), restS = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    restA[i] = currentA[i] - predA[i];
    restS[i] = didvS[i] - predS[i];
  }
  const cb = reread.findPeaks(restA, restS).filter((p) => p.biasV > 0);
  const list = [...peaks.filter((p) => p.biasV <= 0), ...cb].sort((a, b) => a.biasV - b.biasV);
  return { peaks: list, currentA: restA, didvS: restS, prediction };
}

/**
 * Whether a CB shell of an assignment holds as many peaks as it expects.
 *
 * Parameters
 * ----------
 * assignment : Pick<Assignment, "multiplets">
 *     The assignment.
 * label : string
 *     The shell ("s", "p", …).
 *
 * Returns
 * -------
 * boolean
 *     True where the shell is there with an expected count and found equals it.
 *
 * Example
 * -------
 * ```ts
 * fullShell({ multiplets: [{ band: "CB", label: "p", found: 6, expected: 6 } as Multiplet] }, "p"); // => true
 * ```
 */
export function fullShell(assignment: Pick<Assignment, "multiplets">, label: string): boolean {
  const m = assignment.multiplets.find((x) => x.band === "CB" && x.label === label);
  return m !== undefined && m.expected !== null && m.found === m.expected;
}

/** The VB ladder's second-junction resonances taken out of the current before the CB peaks were found (analyzeCurve note 9). */
export interface SubtractedResonances {
  /** The resonance steps subtracted, at positive bias: position (V), height (A), thermal width (V). */
  steps: CurrentStep[];
  /** Γtip/Γsub of the VB ladder's model. */
  rateRatio: number;
  /** Charging energy of the VB ladder's model, eV. */
  chargingEnergyEV: number;
}

/**
 * The warning that names the resonances taken out of the current (they are then no peaks of the list).
 *
 * Parameters
 * ----------
 * subtracted : SubtractedResonances
 *     What was taken out.
 *
 * Returns
 * -------
 * string
 *     One line: the steps' positions (V, three decimals), Γtip/Γsub and Ec of the ladder's model.
 *
 * Example
 * -------
 * ```ts
 * subtractionWarning({ steps: [{ biasV: 2.3231, heightA: 4e-12, thermalWidthV: 1e-3 }], rateRatio: 12.5, chargingEnergyEV: 0.1 });
 * // => "CB peaks found on the current less the VB ladder's predicted second-junction resonances (steps at 2.323 V; Γtip/Γsub 12.5, Ec 0.100 eV): those resonances are not in the peak list"
 * ```
 */
export function subtractionWarning(subtracted: SubtractedResonances): string {
  const at = subtracted.steps.map((q) => q.biasV.toFixed(3)).join(", ");
  return `CB peaks found on the current less the VB ladder's predicted second-junction resonances (steps at ${at} V; Γtip/Γsub ${subtracted.rateRatio.toPrecision(3)}, Ec ${subtracted.chargingEnergyEV.toFixed(3)} eV): those resonances are not in the peak list`;
}
