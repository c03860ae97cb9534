/**
 * The runs of one model fit: the points it fits (the whole curve and its CB side, thinned evenly)
 * and one Levenberg–Marquardt run of one hypothesis from one start, with any parameters held.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import { startingValues } from "./startingValues.ts";
import { parameterIndex } from "./parameterModel.ts";
import { bandStepsMemo, bandStepsStore, type BandStepsStore } from "./bandStepsMemo.ts";
import { linearProjector } from "./projectLinear.ts";
import { levenbergMarquardtLoop } from "./levenbergMarquardtLoop.ts";
import { bayesianInformationCriterion } from "./informationCriterion.ts";
import type { FitHypothesis } from "./fitHypotheses.ts";
import type { DataSet, FitTrial } from "./fitTrial.ts";
import { cbSideEndV } from "./cbSideEnd.ts";
import type { ladderSolveWork } from "./solveWork.ts";
import { withHeldLevels, type heldValenceLevels } from "./heldValenceLevels.ts";

/** Settings of {@link fitRunner} (fitCurve's, checked there). */
export interface FitRunnerSettings {
  /** Voltage-division factor η (0, 1]. No default: fitCurve's. */
  eta: number;
  /** Temperature, K. No default: fitCurve's. */
  temperatureK: number;
  /** Most data points (the curve is thinned evenly beyond this). No default: fitCurve's. */
  maxPoints: number;
  /** Most model evaluations of all runs together (the work budget). No default: fitCurve's. */
  maxEvaluations: number;
  /**
   * Most master-equation elimination steps of all runs together (the work budget's other part:
   * the plateaus solved, each weighed by its ladder's {@link ladderSolveWork}). Default: no
   * limit (fitCurve passes FIT_DEFAULTS.maxEliminationSteps).
   */
  maxEliminationSteps?: number;
  /** Wall-clock limit of all runs together, ms, counted from the call of fitRunner; null: none. No default: fitCurve's. */
  timeLimitMs: number | null;
  /** Iterations that count as the full budget (a run with as many is `finished`). No default. */
  maxIterations: number;
  /** Starting charging energy where the peaks do not give one, eV. No default: fitCurve's. */
  chargingEnergyGuessEV: number;
  /** Iterations per chunk between convergence checks. No default: FIT_DEFAULTS.chunkIterations. */
  chunkIterations: number;
  /** Relative χ² improvement over one chunk below which a run has converged. No default: FIT_DEFAULTS.convergenceTolerance. */
  convergenceTolerance: number;
  /** The CB side ends this many FWHM below the first VB level's substrate-junction crossing ({@link cbSideEndV}). No default: FIT_DEFAULTS.cbSideResonanceMarginFwhm. */
  cbSideMarginFwhm: number;
  /**
   * Whether the CB-side hypotheses hold the first hole's entry in their model
   * ({@link heldValenceLevels}): the CB side then ends below the next entry's crossing
   * ({@link cbSideEndV}'s holdHole). Default false (fitCurve passes FIT_DEFAULTS.cbSideHeldHole).
   */
  cbSideHeldHole?: boolean;
}

/** One start of one hypothesis: Levenberg–Marquardt from log₁₀ r = logRatio0 (or from `from`), on `set` (default the whole curve), the parameters at the indices `held` kept at their start. */
export type FitRun = (h: FitHypothesis, logRatio0: number | null, iterations: number, from?: number[], set?: DataSet, held?: readonly number[]) => FitTrial;

/** What {@link fitRunner} returns. */
export interface FitRunner {
  /** The whole curve, thinned evenly. */
  all: DataSet;
  /** Its CB side (bias > 0, below the first VB level's substrate-junction crossing: {@link cbSideEndV}). */
  cbSide: DataSet;
  /** The current noise σ the residuals are scaled by, A. */
  noiseA: number;
  /** One run (see {@link FitRun}). */
  run: FitRun;
  /**
   * A run of a search for a better fit (see {@link FitRun}, notes 6): as `run`, but its stop at
   * the work budget is the search's and does not count as the fit's.
   */
  search: FitRun;
  /** The linear projection (scale, offset, background) onto a data set, formed once per set. */
  projectorOf: (set: DataSet) => ReturnType<typeof linearProjector>;
  /** Band solutions shared by every run. */
  bandStore: BandStepsStore;
  /** The model current of a hypothesis at unit rate scale (A), from its fitted parameters: its levels and any held VB levels ({@link withHeldLevels}), on the shared store. */
  currentOf: (h: FitHypothesis) => (p: ArrayLike<number>, biasV: ArrayLike<number>) => Float64Array;
  /** Reduced χ² of a run, χ²/(n − k). */
  reduced: (t: FitTrial) => number;
  /**
   * Model evaluations and master-equation elimination steps of all runs so far, what first cut a
   * run short (null: nothing yet) and, when it was the budget, which part of it.
   */
  work: () => { evaluations: number; eliminationSteps: number; stoppedBy: "budget" | "time" | null; budgetPart: "evaluations" | "elimination-steps" | null; searchStopped: boolean };
}

/**
 * The data sets and the run function of one model fit.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis: its conductance record (bias in V, current in A, noise in A).
 * settings : FitRunnerSettings
 *     η, temperature (K), point limit, work budget (model evaluations and elimination steps), time limit (ms or null),
 *     iteration budget, Ec guess (eV), chunk size and convergence tolerance.
 *
 * Returns
 * -------
 * FitRunner
 *     The whole curve and its CB side (every stride-th point, stride = ⌈points / maxPoints⌉), the
 *     noise σ (A), the run function, the projector per set, the shared band store, the reduced χ²
 *     and the work done.
 *
 * Throws
 * ------
 * Nothing (the settings are checked by fitCurve).
 *
 * Notes
 * -----
 * 1. The same points and the same noise σ serve every hypothesis, so that their χ² compare.
 * 2. A run starts from the hypothesis' starting values (its rate ratio replaced by logRatio0 when
 *    given) or from `from`; the parameters at `held` stay at their start: the Levenberg–Marquardt
 *    loop sees only the free ones, and k (for the BIC) counts only those and the four linear ones.
 * 3. The model is evaluated once per parameter vector (the loop asks for it point by point).
 *    A hypothesis with held VB levels (`heldVb`) has them in its model at the energies their
 *    first peaks give with the current Ec ({@link withHeldLevels}); they are not fitted and not
 *    counted in k.
 * 4. The runs share one work budget: each run's loop may ask for the evaluations left of
 *    maxEvaluations, so the whole fit asks for at most maxEvaluations; once it is spent, later
 *    runs return their start (stoppedBy "budget"). The same on every machine, unlike the
 *    optional time limit.
 * 5. The budget's other part counts what an evaluation costs: the master-equation elimination
 *    steps of the shared band store ({@link bandStepsMemo}'s store.work, each plateau solved
 *    weighed by {@link ladderSolveWork}); no evaluation is started once maxEliminationSteps are
 *    spent (the one under way finishes). An evaluation whose plateaus are all stored costs
 *    none; one of a wide low-η window with both bands' ladders costs thousands of times more
 *    than one on the crossover's curves, so evaluations alone do not bound the time.
 * 6. `search` runs as `run` does, on the same budget, but a stop at the budget leaves `work()`'s
 *    stoppedBy as it was (its message says so, and `work()`'s searchStopped turns true): a stage
 *    that only looks for a better fit than the one found, and finds none before the budget is
 *    spent, has not cut the fit short (the fit still says the search stopped). Runs after it find
 *    the budget spent and stop as any run does, setting stoppedBy.
 *
 * Example
 * -------
 * ```ts
 * const { run, all } = fitRunner(analysis, settings);
 * run(hypothesis, null, 60).n === all.n; // => true
 * ```
 */
export function fitRunner(analysis: CurveAnalysis, settings: FitRunnerSettings): FitRunner {
  const { eta, temperatureK, maxPoints, maxEvaluations, timeLimitMs, maxIterations, chargingEnergyGuessEV: guessEC } = settings;
  const sig = analysis.conductance;
  const stride = Math.max(1, Math.ceil(sig.biasV.length / maxPoints));
  const noiseA = Math.max(sig.record.noiseCurrentA, Number.MIN_VALUE);
  const pointsOf = (keep: (v: number) => boolean): DataSet => {
    const index = Array.from(sig.biasV.keys()).filter((i) => i % stride === 0 && keep(sig.biasV[i]));
    const biasV = Float64Array.from(index, (i) => sig.biasV[i]);
    const dataA = Float64Array.from(index, (i) => sig.currentA[i]);
    return { biasV, dataA, v3: biasV.map((v) => v * v * v), n: index.length, data: { x: index.map((_, i) => i), y: Array.from(dataA, (v) => v / noiseA) } };
  };
  const all = pointsOf(() => true);
  const cbSideTopV = cbSideEndV(analysis.peaks, eta, settings.cbSideMarginFwhm, settings.cbSideHeldHole ?? false);
  const cbSide = pointsOf((v) => v > 0 && v < cbSideTopV);
  const started = Date.now();
  let evaluations = 0;
  let stoppedBy: "budget" | "time" | null = null;
  let budgetPart: "evaluations" | "elimination-steps" | null = null;
  let searchStopped = false;
  const projectors = new Map<DataSet, ReturnType<typeof linearProjector>>();
  const projectorOf = (set: DataSet) => (projectors.get(set) ?? projectors.set(set, linearProjector(set.biasV, set.v3, set.dataA)).get(set))!;
  const bandStore = bandStepsStore();
  const maxSteps = settings.maxEliminationSteps ?? Infinity;
  const stepsSpent = () => bandStore.work.eliminationSteps >= maxSteps;
  const currentOf = (h: FitHypothesis) => {
    const memo = bandStepsMemo(h.heldVb?.length ? [...h.seeds, ...h.heldVb] : h.seeds, eta, temperatureK, bandStore);
    const held = h.heldVb ?? [];
    return held.length ? (p: ArrayLike<number>, biasV: ArrayLike<number>) => memo(withHeldLevels(p, h.seeds.length, held, eta), biasV) : memo;
  };
  const runCounted = (counted: boolean): FitRun => (h, logRatio0, iterations, from, set = all, held = []) => {
    const start = startingValues(h.analysis, h.seeds, eta, guessEC, { chargingEnergyEV: h.chargingEnergyStartEV, rateRatioLog10: h.rateRatioStartLog10 });
    const at = parameterIndex(h.seeds.length);
    const initialValues = from ? [...from] : [...start.initialValues];
    if (!from && logRatio0 !== null) initialValues[at.logRateRatio] = logRatio0;
    const free = initialValues.map((_, j) => j).filter((j) => !held.includes(j));
    const pick = (a: number[]) => (held.length ? free.map((j) => a[j]) : a);
    const expand = (q: number[]) => {
      if (!held.length) return q;
      const p = [...initialValues];
      free.forEach((j, i) => (p[j] = q[i]));
      return p;
    };
    const current = currentOf(h);
    const project = projectorOf(set);
    let cacheQ: number[] | null = null;
    let cacheOut: Float64Array = new Float64Array(set.n);
    const modelScaled = (q: number[]) => {
      if (cacheQ === null || cacheQ.length !== q.length || q.some((v, j) => !Object.is(v, cacheQ![j]))) {
        cacheQ = q.slice();
        // The projection's output is a new array: scaled in place.
        cacheOut = project(current(expand(q), set.biasV)).out;
        for (let i = 0; i < cacheOut.length; i++) cacheOut[i] /= noiseA;
      }
      const out = cacheOut;
      return (x: number) => out[x];
    };
    const loop = levenbergMarquardtLoop(set.data, modelScaled, {
      initialValues: pick(initialValues),
      minValues: pick(start.minValues),
      maxValues: pick(start.maxValues),
      gradientDifference: pick(start.gradientDifference),
      maxIterations: iterations,
      maxEvaluations: maxEvaluations - evaluations,
      spent: stepsSpent,
      timeLimitMs: timeLimitMs === null ? null : Math.max(1, timeLimitMs - (Date.now() - started)),
      chunkIterations: settings.chunkIterations,
      convergenceTolerance: settings.convergenceTolerance,
    });
    evaluations += loop.evaluations;
    // A search's stop at the budget is not the fit's (notes 6).
    const searchStop = !counted && loop.stoppedBy === "budget";
    if (searchStop) searchStopped = true;
    if (loop.stoppedBy === "time" || (loop.stoppedBy === "budget" && !searchStop)) stoppedBy ??= loop.stoppedBy;
    if (loop.stoppedBy === "budget") {
      const part = evaluations >= maxEvaluations ? "evaluations" : "elimination-steps";
      if (!searchStop) budgetPart ??= part;
      loop.message = (part === "evaluations" ? `stopped at the fit's work budget of ${maxEvaluations} model evaluations (all runs together)` : `stopped at the fit's work budget of ${maxSteps.toExponential(1)} master-equation elimination steps (all runs together)`) + (searchStop ? "; a search's run: not the fit's stop" : "");
    }
    if (loop.stoppedBy === "time") loop.message = `stopped at the fit's time limit of ${timeLimitMs} ms (all runs together)`;
    const parameters = expand(loop.parameters);
    // k: the free nonlinear parameters and the four linear ones (scale, offset, b1, b3).
    const k = free.length + 4;
    const side = set === all ? "both" : "CB";
    return {
      hypothesis: h,
      side,
      n: set.n,
      set,
      rateRatio0: 10 ** initialValues[at.logRateRatio],
      loop: { ...loop, parameters },
      start,
      k,
      bic: bayesianInformationCriterion(loop.chiSquare, k, set.n),
      finished: iterations >= maxIterations,
      implausible: null,
    };
  };
  const run = runCounted(true);
  const search = runCounted(false);
  const reduced = (t: FitTrial) => t.loop.chiSquare / Math.max(1, t.n - t.k);
  return { all, cbSide, noiseA, run, search, projectorOf, bandStore, currentOf, reduced, work: () => ({ evaluations, eliminationSteps: bandStore.work.eliminationSteps, stoppedBy, budgetPart, searchStopped }) };
}

/** What {@link continueRun} changes of the run it continues; every field optional. */
export interface ContinueRunChange {
  /** The hypothesis to run (default the continued run's). */
  hypothesis?: FitHypothesis;
  /** The parameters to start from (default the continued run's fitted parameters). */
  from?: number[];
  /** Indices of parameters kept at their start (default none). */
  held?: readonly number[];
}

/**
 * Continues a run (an explored one, mostly, to the full iteration budget): a run from the
 * continued run's fitted parameters (or from values made of them) that keeps its `rateRatio0`,
 * the rate ratio the search started from, rather than the one it reached.
 *
 * Parameters
 * ----------
 * run : FitRun
 *     The run function ({@link fitRunner}'s `run` or `search`).
 * explored : FitTrial
 *     The run continued: its hypothesis, fitted parameters and `rateRatio0`.
 * iterations : number
 *     Iterations of the new run.
 * set : DataSet, optional
 *     The points fitted (default the whole curve, as `run`'s).
 * change : ContinueRunChange, optional
 *     Another hypothesis, start or held parameters (defaults: the continued run's hypothesis and
 *     fitted parameters, nothing held).
 *
 * Returns
 * -------
 * FitTrial
 *     The new run, its `rateRatio0` that of `explored`.
 *
 * Notes
 * -----
 * A run from given parameters records the rate ratio of those parameters as its start
 * (`rateRatio0`); the trial it continues started elsewhere, and the fit's record names the start
 * of the search (`rateRatioStart`), so the continued run carries the first run's.
 *
 * Example
 * -------
 * ```ts
 * const explored = run(hypothesis, -1, 20);
 * continueRun(run, explored, 200).rateRatio0 === explored.rateRatio0; // => true
 * ```
 */
export function continueRun(run: FitRun, explored: FitTrial, iterations: number, set?: DataSet, change: ContinueRunChange = {}): FitTrial {
  const from = change.from ?? explored.loop.parameters;
  return { ...run(change.hypothesis ?? explored.hypothesis, null, iterations, from, set, change.held), rateRatio0: explored.rateRatio0 };
}
