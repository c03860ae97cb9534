/**
 * The p shell split about the best whole-curve fit (then the next few, until one splits): at low η the VB side fixes Ec and the VB
 * levels, and the CB levels' substrate-junction steps among the VB peaks tell a split p shell
 * from a whole one where the CB side alone does not.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import { continueRun, type FitRun } from "./fitRunner.ts";
import type { DataSet, FitTrial } from "./fitTrial.ts";
import { parameterIndex } from "./parameterModel.ts";
import { refinementStarts } from "./refinementStarts.ts";
import { recentredSeeds } from "./wholeCurveRestarts.ts";
import { sameFit } from "./sameFit.ts";

/** Defaults of {@link wholeCurveSplits} (locked by test/model/fit/wholeCurveSplits.test.ts). */
export const WHOLE_CURVE_SPLIT_DEFAULTS = Object.freeze({
  /**
   * The best whole-curve fit so far is split only when its reduced χ² is at most this
   * (FIT_DEFAULTS.poorFitChiSquare): above it no VB reading came near, and its levels say little.
   * Chosen on the accuracy benchmark (low-η mix with the comparison).
   */
  maxStartChiSquare: 10,
  /** Explored split starts finished (the lowest BICs after their explore iterations). Chosen on the accuracy benchmark (low-η mix with the comparison). */
  finishedStarts: 2,
  /**
   * Whole-curve fits split in turn, the lowest reduced χ² first (one per distinct fit), until one
   * gives a split that describes the curve: on a CB side that ends before p the best whole-curve
   * fit may be a grouping whose p the split starts cannot reach (the rules' p one charging peak
   * off) while the next one's split lands on the right sub-levels. Chosen on the accuracy
   * benchmark (low-η mix with the comparison).
   */
  splitBases: 3,
});

/** What {@link wholeCurveSplits} works with. */
export interface WholeCurveSplitContext {
  /** Every run so far; the split runs are added. */
  trials: FitTrial[];
  /** One Levenberg–Marquardt run (whole curve unless a data set is given). */
  run: FitRun;
  /** The CB side of the curve. */
  cbSide: DataSet;
  /** Voltage-division factor η. */
  eta: number;
  /** Iterations of an explored start. */
  exploreIterations: number;
  /** Iterations of a finishing run. */
  maxIterations: number;
  /** Reduced χ² of a run. */
  reduced: (t: FitTrial) => number;
  /** Whether a whole-curve run (before its CB side is fitted) may describe the curve: its reduced χ² and residual structure. */
  describes: (whole: FitTrial) => boolean;
  /** Whether a whole-curve run and its CB-side run are acceptable together (plausible). */
  acceptable: (whole: FitTrial, cb: FitTrial) => boolean;
  /** The held VB levels of the CB-side hypotheses ({@link heldValenceLevels}), if any. */
  heldVb?: FitHypothesis["heldVb"];
  /** The whole-curve run to split. Default: those of `trials` with the lowest reduced χ², in turn (notes 4). */
  from?: FitTrial;
}

/**
 * The best whole-curve fit with its p shell split, fitted to the whole curve.
 *
 * Parameters
 * ----------
 * context : WholeCurveSplitContext
 *     The runs so far, the run function, the CB side, η, the iteration budgets, the tests and,
 *     optionally, the whole-curve run to split (`from`; default the best of the runs so far).
 * settings : typeof WHOLE_CURVE_SPLIT_DEFAULTS, optional
 *     maxStartChiSquare, finishedStarts and splitBases.
 *
 * Returns
 * -------
 * { cb: FitTrial; whole: FitTrial } | null
 *     The split whole-curve run with the lowest BIC that describes the curve and is acceptable,
 *     with its grouping fitted on the CB side from it; null when no whole-curve run tried (notes 4)
 *     is at most maxStartChiSquare with a p level to split and an acceptable split.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The splits of {@link refinementStarts} (p whole into 2+4 and 2+2+2, a sub-level of 4 into
 *    2+2, the degeneracy-weighted mean kept) applied to the CB levels of the best whole-curve run,
 *    its VB levels, Ec, Γtip/Γsub and broadening kept: each explored, the finishedStarts best
 *    finished.
 * 2. A split grouping's own whole-curve fit starts from its CB side's Ec, which for a split p
 *    shell may be 10–20 % off, and from its CB side's reading of the p peaks; the whole p level
 *    with a VB reading that fits sets Ec and the levels to within a few per cent.
 * 3. The CB side of the chosen split is fitted from its whole-curve values, so that the
 *    comparison of the two sides' Ec and Γtip/Γsub (fitCurve) is made within one grouping.
 * 4. Without `from`, the whole-curve runs of `trials` are tried in order of their reduced χ²,
 *    skipping one at the same fit as a run already tried ({@link sameFit}), at most
 *    splitBases of them, and the first that gives an acceptable split is returned (the first
 *    tried is the best, as with one). At η 0.55–0.65 the CB side may end before p, and every
 *    grouping's whole-curve fit from it misses: the best may hold the rules' p, one charging
 *    peak off where the rules set p's first peak aside, and its splits keep that first level,
 *    while a whole p read from the empty dot splits into the right sub-levels.
 *
 * Example
 * -------
 * ```ts
 * const found = wholeCurveSplits({ trials, run, cbSide, eta, exploreIterations: 8, maxIterations: 60, reduced, describes, acceptable });
 * if (found) [winner, whole] = [found.cb, found.whole];
 * ```
 */
export function wholeCurveSplits(context: WholeCurveSplitContext, settings = WHOLE_CURVE_SPLIT_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  if (context.from) return splitAbout(context.from, context, settings);
  // The whole-curve runs in order of their reduced χ², one per fit, until one splits (notes 4).
  const bases: FitTrial[] = [];
  for (const t of context.trials.filter((x) => x.side === "both").sort((x, y) => context.reduced(x) - context.reduced(y))) {
    if (bases.length === settings.splitBases) break;
    if (bases.some((b) => sameFit(b, t))) continue;
    bases.push(t);
    const found = splitAbout(t, context, settings);
    if (found) return found;
  }
  return null;
}

/** One whole-curve run's p split (notes 1–3). */
function splitAbout(top: FitTrial, context: WholeCurveSplitContext, settings: typeof WHOLE_CURVE_SPLIT_DEFAULTS): { cb: FitTrial; whole: FitTrial } | null {
  const { trials, run, reduced } = context;
  if (!(reduced(top) <= settings.maxStartChiSquare)) return null;
  const seeds = top.hypothesis.seeds;
  const ncb = seeds.filter((s) => s.band === "CB").length;
  if (seeds.slice(0, ncb).some((s) => s.band !== "CB")) return null;
  const p = top.loop.parameters;
  const at = parameterIndex(seeds.length);
  const rest = p.slice(at.chargingEnergy, at.rateScale);
  const vbSeeds = seeds.slice(ncb);
  const vbEnergies = p.slice(ncb, seeds.length);
  const starts = refinementStarts(seeds.slice(0, ncb), [...p.slice(0, ncb), ...rest], context.eta).filter((r) => r.seeds.length !== ncb);
  const explored: FitTrial[] = [];
  for (const r of starts) {
    const hv: FitHypothesis = { ...top.hypothesis, name: `${top.hypothesis.name.replace(/,.*$/, "")}, refined to ${r.layout} on the whole curve (${r.change})`, label: `${top.hypothesis.label}, ${r.change} on the whole curve`, seeds: recentredSeeds([...r.seeds, ...vbSeeds], [...r.parameters.slice(0, r.seeds.length), ...vbEnergies], context.eta, rest[0]), chargingEnergyStartEV: rest[0], cbDegeneracies: r.seeds.map((x) => x.degeneracy) };
    const t = continueRun(run, top, context.exploreIterations, undefined, { hypothesis: hv, from: [...r.parameters.slice(0, r.seeds.length), ...vbEnergies, ...rest] });
    trials.push(t);
    explored.push(t);
  }
  const finished = finishBest(explored, settings.finishedStarts, run, context.maxIterations, trials);
  for (const w of finished.filter(context.describes).sort((x, y) => x.bic - y.bic)) {
    const nw = w.hypothesis.seeds.filter((s) => s.band === "CB").length;
    const atW = parameterIndex(w.hypothesis.seeds.length);
    const hc: FitHypothesis = { ...w.hypothesis, seeds: w.hypothesis.seeds.slice(0, nw), vbReadings: [[]], ...(context.heldVb ? { heldVb: context.heldVb } : {}) };
    const cb = continueRun(run, w, context.maxIterations, context.cbSide, { hypothesis: hc, from: [...w.loop.parameters.slice(0, nw), ...w.loop.parameters.slice(atW.chargingEnergy, atW.rateScale)] });
    trials.push(cb);
    if (context.acceptable(w, cb)) return { cb, whole: w };
  }
  return null;
}

/**
 * The `count` explored runs with the lowest BIC, each finished with `maxIterations` from where it
 * stopped (its start's rate ratio kept); the finished runs are added to `trials` and returned,
 * best explored first.
 */
export function finishBest(explored: readonly FitTrial[], count: number, run: FitRun, maxIterations: number, trials: FitTrial[]): FitTrial[] {
  return [...explored]
    .sort((x, y) => x.bic - y.bic)
    .slice(0, count)
    .map((t) => {
      const done = continueRun(run, t, maxIterations);
      trials.push(done);
      return done;
    });
}
