/**
 * Whole-curve fits from a short grid of charging-energy starts, the CB and VB peaks read at each
 * by the ladder that Ec implies: where neither the CB nor the VB peaks show a level's two charging
 * peaks, no peak spacing starts Ec near the curve's optimum, and every other stage starts far from it.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { FitTrial } from "./fitTrial.ts";
import { distinctReadings, type LevelSeed } from "./levelsToFit.ts";
import { inFillingOrder, shellValenceReading } from "./shellValenceReading.ts";
import { cbLadderPeaksV, unseenSPeakReadings } from "./unseenSPeakWholeFits.ts";
import { valencePeaksV } from "./droppedPeakWholeFits.ts";
import { peakStartWholeFits, type PeakStartWholeContext } from "./peakStartWholeFits.ts";
import { stateCount } from "../scenario.ts";

/** Defaults of {@link ecGridWholeFits} (locked by test/model/fit/ecGridWholeFits.test.ts). */
export const EC_GRID_DEFAULTS = Object.freeze({
  /**
   * Ec starts lie at or below this fraction of the gap η·(V_CB,first − V_VB,first), eV (the bound
   * rulesDecisive also puts on a plausible Ec; common practice, no source).
   */
  gapFraction: 0.25,
  /** Ec starts: gapFraction × gap × k / gridSteps for k = 1 … gridSteps (an eighth of the range apart). Not tuned. */
  gridSteps: 8,
  /** CB layouts after s (g = 2) read at each Ec: p whole, split 2+4 and 2+2+2 (as the compared ladders, fitHypotheses). */
  pLayouts: Object.freeze([Object.freeze([6]), Object.freeze([2, 4]), Object.freeze([2, 2, 2])]) as readonly (readonly number[])[],
  /** Levenberg–Marquardt iterations each start is screened for. Not tuned. */
  screenIterations: 2,
  /** Screened starts of lowest BIC passed on to be explored and finished ({@link peakStartWholeFits}). Not tuned. */
  exploredStarts: 4,
  /** Most charge states of a start's CB levels and of its VB reading (as PEAK_START_WHOLE_DEFAULTS.maxReadingStates). */
  maxReadingStates: 100,
  /**
   * fitCurve runs this stage only while at most this fraction of the fit's work budget is spent
   * (evaluations or elimination steps), as DROPPED_PEAK_DEFAULTS.maxBudgetSpent: a last stage started
   * late cannot finish and would only cut the fit short. Not tuned.
   */
  maxBudgetSpent: 0.75,
});

/**
 * The grid of Ec starts: evenly spaced up to a fraction of the gap.
 *
 * Parameters
 * ----------
 * cbPeaksV : readonly number[]
 *     The CB peaks' biases (V; only the positive ones count), in any order.
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V; only the negative ones count), in any order.
 * eta : number
 *     Voltage-division factor η.
 * settings : typeof EC_GRID_DEFAULTS, optional
 *     gapFraction and gridSteps.
 *
 * Returns
 * -------
 * number[]
 *     gapFraction·gap·k/gridSteps for k = 1 … gridSteps, eV, with gap = η·(lowest CB peak −
 *     highest VB peak); empty without a peak on either side.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The gap between the first CB and the first VB peak holds the single-particle gap plus one Ec,
 *    so Ec is below it; dots whose Ec is above a quarter of it are not among those the rules accept
 *    (rulesDecisive's maxChargingFractionOfGap), and the grid stops there.
 *
 * Example
 * -------
 * ```ts
 * ecGridStartsEV([1.859, 2.904], [-1.316, -2.638], 0.63, { ...EC_GRID_DEFAULTS, gridSteps: 4 });
 * // => [0.1250, 0.2500, 0.3750, 0.5001] (eV: the gap 2.0003 eV)
 * ```
 */
export function ecGridStartsEV(cbPeaksV: readonly number[], vbPeaksV: readonly number[], eta: number, settings: { gapFraction: number; gridSteps: number } = EC_GRID_DEFAULTS): number[] {
  const cb = cbPeaksV.filter((v) => v > 0);
  const vb = vbPeaksV.filter((v) => v < 0);
  if (!cb.length || !vb.length) return [];
  const gapEV = eta * (Math.min(...cb) - Math.max(...vb));
  const out: number[] = [];
  for (let k = 1; k <= settings.gridSteps; k++) out.push((settings.gapFraction * gapEV * k) / settings.gridSteps);
  return out;
}

/**
 * The VB readings one Ec implies: the peaks read as a doublet and a level of four by the ladder of
 * that Ec, in filling order, and the same with each level's first charging peak unseen.
 *
 * Parameters
 * ----------
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V, negative), in any order.
 * chargingEnergyV : number
 *     Ec/η in V: the spacing of a level's charging peaks.
 *
 * Returns
 * -------
 * LevelSeed[][]
 *     The reading of {@link shellValenceReading} in filling order ({@link inFillingOrder}), then
 *     for each of its levels the same reading with that level's `before` one larger (the first
 *     peak seen is its second charging peak); none without peaks or a positive Ec/η.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. In filling order a VB level's n-th charging peak lies at −(|ε| + Ec·(N + n − ½))/η with N
 *    the holes of the full levels nearer the gap (the closed form of the orthodox ladder). Where
 *    its first peak is unseen, the first seen is the n = 2 one, and the start ε = η·|V| −
 *    Ec·(N + 1 + ½) sits on the level; read as its first, the level starts one Ec off, beyond
 *    the reach its bounds allow.
 *
 * Example
 * -------
 * ```ts
 * ecValenceReadings([-1.316, -2.638, -3.148], 0.305).map((r) => r.map((s) => `${s.degeneracy}@${s.firstPeakV}/${s.before}`));
 * // => [["2@-1.316/0", "4@-2.638/2"], ["2@-1.316/1", "4@-2.638/2"], ["2@-1.316/0", "4@-2.638/3"]]
 * ```
 */
export function ecValenceReadings(vbPeaksV: readonly number[], chargingEnergyV: number): LevelSeed[][] {
  const base = inFillingOrder(shellValenceReading(vbPeaksV, chargingEnergyV));
  if (!base.length) return [];
  return distinctReadings([base, ...base.map((_, j) => base.map((s, i) => (i === j ? { ...s, before: s.before + 1 } : { ...s })))]);
}

/**
 * The filling-order ladders fitted to the whole curve from each Ec of a grid, the peaks read by
 * the ladder of that Ec.
 *
 * Parameters
 * ----------
 * context : PeakStartWholeContext
 *     That of {@link peakStartWholeFits}: the runs so far, the run function, the CB side, η, the
 *     iteration budgets, the tests, and the groupings compared (the first filling-order ladder's
 *     analysis gives the peaks).
 * settings : typeof EC_GRID_DEFAULTS, optional
 *     gapFraction, gridSteps, pLayouts, screenIterations, exploredStarts and maxReadingStates.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     As {@link peakStartWholeFits}: the whole-curve run that describes the curve and is
 *     acceptable, with its grouping fitted on the CB side; null when none is (or no ladder in
 *     filling order was compared).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Run only where no grouping's whole-curve fit describes the curve and every earlier stage
 *    found nothing (fitCurve), while at most maxBudgetSpent of the work budget is spent.
 * 2. For each Ec of {@link ecGridStartsEV}: the CB peaks (labelled second-junction resonances set
 *    aside, each level entering at the first peak past half an Ec/η beyond the last charging
 *    peak of the level below, or at the first resonance there) read in filling order for each
 *    layout ({@link unseenSPeakReadings}, the reading with s's first peak seen), and the VB peaks
 *    read by {@link ecValenceReadings}; every pair within maxReadingStates is run from that Ec for
 *    screenIterations, and the exploredStarts of lowest BIC are explored and finished, and their
 *    CB side fitted ({@link peakStartWholeFits}).
 * 3. Read at the wrong Ec the CB peaks enter levels at a level's charging peaks (or skip
 *    entries), so each Ec brings its own CB reading as well as its VB one: the model predicts
 *    the steps of the peaks unseen, and a wrong reading or Ec keeps χ² high.
 * 4. On the low-η mix with the comparison (seed 2001 draw 2009: Ec 192 meV, η 0.63, s's second
 *    charging peak, both VB levels' second and the level of four's first unseen), no spacing of
 *    the peaks seen gives an Ec near the truth (the VB doublet's spacing reads 0.83 eV) and every
 *    whole-curve fit stayed at reduced χ² 9–12; from the grid's 187 meV the 2+2+2+2 ladder with
 *    the level of four's first peak unseen reaches 1.01 with Ec 192.9 meV.
 *
 * Example
 * -------
 * ```ts
 * const found = ecGridWholeFits(context);
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function ecGridWholeFits(context: PeakStartWholeContext, settings = EC_GRID_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const base = context.hypotheses.find((h) => h.kind === "ladder-filling");
  if (!base) return null;
  const { eta, run, trials } = context;
  const { cbPeaksV, resonancesV } = cbLadderPeaksV(base.analysis);
  const vbPeaksV = valencePeaksV(base.analysis.peaks);
  const screened: { t: FitTrial; h: FitHypothesis }[] = [];
  for (const ecEV of ecGridStartsEV(cbPeaksV, vbPeaksV, eta, settings)) {
    const vbReadings = ecValenceReadings(vbPeaksV, ecEV / eta).filter((r) => stateCount(r) <= settings.maxReadingStates);
    const cbReadings = distinctReadings(settings.pLayouts.map((p) => unseenSPeakReadings(cbPeaksV, [2, ...p], ecEV / eta, resonancesV)[1] ?? []));
    for (const cb of cbReadings.filter((r) => r.length >= 2 && stateCount(r) <= settings.maxReadingStates)) {
      const layout = cb.map((x) => x.degeneracy);
      for (const vb of vbReadings) {
        const h: FitHypothesis = { ...base, name: `ladder-filling ${layout.join("+")} (Ec start ${(ecEV * 1000).toFixed(0)} meV)`, label: `charging ladder in filling order read at Ec ${(ecEV * 1000).toFixed(0)} meV`, seeds: [...cb, ...vb], vbReadings: [vb], cbDegeneracies: layout, chargingEnergyStartEV: ecEV };
        const t = run(h, null, settings.screenIterations);
        trials.push(t);
        screened.push({ t, h });
      }
    }
  }
  const best = screened.sort((x, y) => x.t.bic - y.t.bic).slice(0, settings.exploredStarts).map((s) => s.h);
  return best.length ? peakStartWholeFits({ ...context, hypotheses: best }) : null;
}
