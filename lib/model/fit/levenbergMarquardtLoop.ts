/**
 * The Levenberg–Marquardt iterations of the model fit, in chunks, with the fit's own convergence
 * test, a work budget counted in model evaluations and an optional wall-clock limit.
 */
import type * as MlLevenbergMarquardt from "ml-levenberg-marquardt";
import { lazyModule } from "../../util/lazyModule.ts";

// Loaded at the first fit, not at start-up (lazyModule; an ES module, so `require` needs Node ≥ 20.19).
const solver = await lazyModule<typeof MlLevenbergMarquardt>("ml-levenberg-marquardt", "module", () => import("ml-levenberg-marquardt"));

/** Settings of {@link levenbergMarquardtLoop}. */
export interface LoopSettings {
  /** Start of the parameters (their own units). */
  initialValues: number[];
  /** Lower and upper bound of each parameter. */
  minValues: number[];
  maxValues: number[];
  /** Finite-difference step of each parameter. */
  gradientDifference: number[];
  /** Most iterations in all. */
  maxIterations: number;
  /**
   * Most model evaluations the iterations may ask for (each one model curve over all points; the
   * loop's own χ² checks are not counted): the deterministic work budget. Default: no limit.
   */
  maxEvaluations?: number;
  /**
   * A further part of the work budget, asked before every evaluation: when it returns true the
   * evaluation is refused as at maxEvaluations (the loop stops with `stoppedBy` "budget"). For a
   * budget of work the caller counts itself (fitRunner: the master-equation work). Default: none.
   */
  spent?: () => boolean;
  /** Wall-clock limit, ms (machine-dependent: opt-in). Default: none (undefined or null). */
  timeLimitMs?: number | null;
  /** Iterations per chunk between convergence checks. */
  chunkIterations: number;
  /** Relative χ² improvement over one chunk below which the fit has converged. */
  convergenceTolerance: number;
}

/** What {@link levenbergMarquardtLoop} returns. */
export interface LoopResult {
  /** The best parameters found. */
  parameters: number[];
  /** χ² at those parameters (residuals in units of the noise). */
  chiSquare: number;
  /** Iterations run. */
  iterations: number;
  /** Whether the convergence test was met. */
  converged: boolean;
  /** Model evaluations the iterations asked for (at most maxEvaluations). */
  evaluations: number;
  /** What ended the loop: its convergence test, maxIterations, the work budget or the time limit. */
  stoppedBy: "converged" | "iterations" | "budget" | "time";
  /** Why the loop stopped. */
  message: string;
}

/** Thrown by the counting model when the work budget is spent (caught by the loop). */
const BUDGET_SPENT = Symbol("budget spent");

/** Σ (y_i − f(i))². */
function chiSquare(f: (x: number) => number, y: number[]): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (y[i] - f(i)) ** 2;
  return s;
}

/**
 * Minimises χ² of a model over bounded parameters by Levenberg–Marquardt, in chunks of a few
 * iterations, keeping the best parameters seen.
 *
 * Parameters
 * ----------
 * data : { x: number[]; y: number[] }
 *     Point indices and data, the data divided by their noise σ (dimensionless).
 * model : (p: number[]) => (x: number) => number
 *     The model at parameters p, as a function of the point index, in the units of data.y.
 * settings : LoopSettings
 *     Start, bounds and difference steps; maxIterations; maxEvaluations (default no limit);
 *     spent (the caller's further budget, default none); timeLimitMs (ms, default none); chunkIterations; convergenceTolerance (relative).
 *
 * Returns
 * -------
 * LoopResult
 *     `{ parameters, chiSquare, iterations, converged, evaluations, stoppedBy, message }`.
 *
 * Throws
 * ------
 * Nothing: an error of the iterations (the budget spent, the library's timeout) ends the loop
 * with a message.
 *
 * Notes
 * -----
 * 1. Run up to chunkIterations iterations of ml-levenberg-marquardt (damping 1e-2, bounded,
 *    with the time left as its timeout when a time limit is given). Every model evaluation the
 *    iterations ask for is counted; the one that would exceed maxEvaluations is refused, which
 *    ends the chunk: its parameters are dropped and the loop stops with exactly maxEvaluations
 *    evaluations, on every machine the same. So is one asked for once `spent()` says the
 *    caller's own budget is used up.
 * 2. Keep the new parameters only if χ² did not grow.
 * 3. Converged when χ² improved by less than convergenceTolerance (relative) over the chunk;
 *    stop after maxIterations, at the budget or at the time limit otherwise (converged false,
 *    `stoppedBy` and the message say why).
 *
 * References
 * ----------
 * K. Levenberg, "A method for the solution of certain non-linear problems in least squares",
 * Q. Appl. Math. 2, 164 (1944); D. W. Marquardt, "An algorithm for least-squares estimation of
 * nonlinear parameters", J. SIAM 11, 431 (1963).
 *
 * Example
 * -------
 * ```ts
 * // y = 2·exp(−0.3·x) on x = 0 … 19, started from (1, 0.1).
 * const x = Array.from({ length: 20 }, (_, i) => i);
 * const r = levenbergMarquardtLoop({ x, y: x.map((v) => 2 * Math.exp(-0.3 * v)) }, (p) => (v) => p[0] * Math.exp(-p[1] * v), {
 *   initialValues: [1, 0.1], minValues: [0, 0], maxValues: [10, 1], gradientDifference: [1e-6, 1e-6],
 *   maxIterations: 100, chunkIterations: 4, convergenceTolerance: 1e-5 });
 * r.parameters; // => [2.000, 0.300]
 * r.converged;  // => true
 * r.stoppedBy;  // => "converged"
 * ```
 */
export function levenbergMarquardtLoop(data: { x: number[]; y: number[] }, model: (p: number[]) => (x: number) => number, settings: LoopSettings): LoopResult {
  const { maxIterations } = settings;
  const maxEvaluations = settings.maxEvaluations ?? Infinity;
  const timeLimitMs = settings.timeLimitMs ?? null;
  const spent = settings.spent ?? (() => false);
  const started = Date.now();
  let params = settings.initialValues;
  let chi2 = chiSquare(model(params), data.y);
  let iterations = 0;
  let evaluations = 0;
  const counted = (p: number[]) => {
    if (evaluations >= maxEvaluations || spent()) throw BUDGET_SPENT;
    evaluations++;
    return model(p);
  };
  let stoppedBy: LoopResult["stoppedBy"] = "iterations";
  let message = "";
  const timeUp = () => timeLimitMs !== null && Date.now() - started > timeLimitMs;
  while (iterations < maxIterations) {
    if (evaluations >= maxEvaluations || spent()) {
      stoppedBy = "budget";
      break;
    }
    const chunk = Math.min(settings.chunkIterations, maxIterations - iterations);
    let result;
    try {
      result = solver().levenbergMarquardt(data, counted, {
        initialValues: params,
        minValues: settings.minValues,
        maxValues: settings.maxValues,
        gradientDifference: settings.gradientDifference,
        maxIterations: chunk,
        damping: 1e-2,
        errorTolerance: 1e-10,
        ...(timeLimitMs !== null ? { timeout: Math.max(0.001, (timeLimitMs - (Date.now() - started)) / 1000) } : {}),
      });
    } catch (err) {
      if (err === BUDGET_SPENT) stoppedBy = "budget";
      else if (timeLimitMs !== null) stoppedBy = "time";
      else message = `stopped by an error of the iterations: ${err instanceof Error ? err.message : String(err)}`;
      break;
    }
    iterations += result.iterations;
    const next = chiSquare(model(result.parameterValues), data.y);
    const improvement = (chi2 - next) / Math.max(chi2, 1e-300);
    if (next <= chi2) params = result.parameterValues;
    chi2 = Math.min(chi2, next);
    if (improvement >= 0 && improvement < settings.convergenceTolerance) {
      stoppedBy = "converged";
      message = `converged: χ² changed by ${improvement.toExponential(1)} over ${result.iterations} iterations`;
      break;
    }
    if (timeUp()) {
      stoppedBy = "time";
      break;
    }
  }
  if (stoppedBy === "budget") message = evaluations >= maxEvaluations ? `stopped at the work budget of ${maxEvaluations} model evaluations` : "stopped at the caller's work budget";
  if (stoppedBy === "time") message = `stopped at the time limit of ${timeLimitMs} ms`;
  if (!message) message = `stopped after ${iterations} iterations without converging`;
  return { parameters: params, chiSquare: chi2, iterations, converged: stoppedBy === "converged", evaluations, stoppedBy, message };
}
