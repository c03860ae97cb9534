/**
 * Fitting the orthodox-theory model to a measured I–V curve, starting from the peak-based
 * assignment: level energies, charging energy, tip/substrate rate ratio, rate scale,
 * broadening, offset and a smooth background, with standard errors.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import { REGIME_LIMITS } from "../regimeLimits.ts";
import { checkEta, checkKnownKeys, checkPositive } from "../../util/check.ts";
import { DotspecError } from "../../util/errors.ts";
import { levelsToFit, type LevelSeed } from "./levelsToFit.ts";
import { startingValues, type StartingValues } from "./startingValues.ts";
import { parameterIndex } from "./parameterModel.ts";
import { unitCurrent } from "./unitCurrent.ts";
import { projectLinear } from "./projectLinear.ts";
import { levenbergMarquardtLoop, type LoopResult } from "./levenbergMarquardtLoop.ts";
import { fitStatus, FIT_STATUS_DEFAULTS, type FitStatus } from "./fitStatus.ts";
import { assignSpectrum } from "../../assign/assignSpectrum.ts";
import { SCENARIO_DEFAULTS } from "../scenario.ts";
import { standardErrors } from "./standardErrors.ts";
import { fitVerdict } from "./fitVerdict.ts";

/** Options of {@link fitCurve}. */
export interface FitOptions {
  /** Voltage-division factor η, 0 < η ≤ 1 (held fixed: one curve barely constrains it). Default: the analysis' η. */
  eta?: number;
  /** Temperature in K (sets the thermal step width; barely matters next to the broadening). Default: FIT_DEFAULTS.temperatureK (4.5). */
  temperatureK?: number;
  /** Most Levenberg–Marquardt iterations. Default: FIT_DEFAULTS.maxIterations (60). */
  maxIterations?: number;
  /** Wall-clock limit in ms; the fit stops and reports non-convergence after it. Default: FIT_DEFAULTS.timeLimitMs (5000). */
  timeLimitMs?: number;
  /** Most data points used (the curve is thinned evenly beyond this). Default: FIT_DEFAULTS.maxPoints (800). */
  maxPoints?: number;
  /** Starting charging energy in eV where the peaks do not give one (shell tunnelling). Default: FIT_DEFAULTS.chargingEnergyGuessEV (0.1). */
  chargingEnergyGuessEV?: number;
  /**
   * Also fit the other regimes' groupings of the same peaks (shell filling and shell tunnelling
   * forced), each from every rate-ratio start, and keep the best by BIC; without it only the
   * assignment's own grouping is fitted (from the whole rate-ratio grid when its first fit does not
   * describe the curve). Slower: a grouping with many single levels has a large state space.
   * Default: FIT_DEFAULTS.compareModels (false).
   */
  compareModels?: boolean;
}

/** Defaults and constants of {@link fitCurve} (locked by test/model/fit/fitCurve.test.ts). */
export const FIT_DEFAULTS = Object.freeze({
  temperatureK: 4.5,
  maxIterations: 60,
  timeLimitMs: 5000,
  maxPoints: 800,
  chargingEnergyGuessEV: 0.1,
  /** Relative χ² improvement over one chunk of iterations below which the fit has converged. */
  convergenceTolerance: 1e-5,
  /** Iterations per chunk between convergence checks. */
  chunkIterations: 4,
  /** Fitted Γtip/Γsub at or above which the curve is in shell filling ({@link REGIME_LIMITS}) … */
  fillingRatioMin: REGIME_LIMITS.fillingRateRatioMin,
  /** … and at or below which it is in shell tunnelling (in between: intermediate). */
  tunnelingRatioMax: REGIME_LIMITS.tunnelingRateRatioMax,
  /** A reduced χ² above this says the model does not describe the curve well (FIT_STATUS_DEFAULTS.poorChiSquare). */
  poorFitChiSquare: FIT_STATUS_DEFAULTS.poorChiSquare,
  compareModels: false,
  /** log₁₀ Γtip/Γsub of the extra starts, 0.01 to 100. */
  rateRatioStartsLog10: Object.freeze([-2, -1, 0, 1, 2]) as readonly number[],
  /** Iterations of each extra start; the best is then finished with maxIterations. */
  exploreIterations: 8,
});

/** One fitted parameter with its standard error. */
export interface FittedValue {
  value: number;
  standardError: number;
}

/** A fitted level. */
export interface FittedLevel {
  band: "CB" | "VB";
  /** Label of the multiplet it came from (s, p, d, v1, …), with a sub-group index when split. */
  label: string;
  degeneracy: number;
  /** Level energy relative to the Fermi level at zero bias, eV. */
  energyEV: FittedValue;
  /** The same referred to bias, ε/η, V. */
  energyV: FittedValue;
}

/** One start of one hypothesis that {@link fitCurve} tried. */
export interface FitAlternative {
  /** "assigned", or the regime forced on the same peaks. */
  hypothesis: "assigned" | "shell-filling" | "shell-tunneling";
  /** Regime of that grouping of the peaks. */
  regime: string;
  /** Levels fitted. */
  levels: number;
  /** Γtip/Γsub it started from and ended at. */
  rateRatioStart: number;
  rateRatio: number;
  reducedChiSquare: number;
  /** Bayesian information criterion χ² + k·ln n. */
  bic: number;
  /** exp(−ΔBIC/2), normalised over the alternatives: the relative weight of evidence. */
  weight: number;
}

/** Result of {@link fitCurve}. */
export interface CurveFit {
  source: string;
  converged: boolean;
  /** Why the fit stopped. */
  message: string;
  iterations: number;
  eta: number;
  /**
   * "good" (the model describes the curve and Ec and Γtip/Γsub are determined), "poor" (it
   * describes it only roughly, or a key parameter is poorly determined) or "failed" (no start
   * describes the curve: no fit; the values are not to be used). From the reduced χ² and the
   * parameter errors, not from the optimiser's convergence.
   */
  status: FitStatus;
  /** Why the status is what it is, in words. */
  statusReasons: string[];
  /** The hypothesis the values come from. */
  hypothesis: FitAlternative["hypothesis"];
  /** Every start of every hypothesis tried, with its score. */
  alternatives: FitAlternative[];
  levels: FittedLevel[];
  chargingEnergyEV: FittedValue;
  /** Ec/η, V. */
  chargingEnergyV: FittedValue;
  /** Γtip/Γsub. */
  rateRatio: FittedValue;
  /** Γsub, 1/s (the overall rate scale). */
  substrateRatePerS: FittedValue;
  /** Gaussian level broadening, eV. */
  broadeningEV: FittedValue;
  /** Current offset, A. */
  offsetA: FittedValue;
  /** Background I_bg = b1·V + b3·V³: b1 in S, b3 in A/V³. */
  backgroundLinearS: FittedValue;
  backgroundCubicAPerV3: FittedValue;
  /** χ² per degree of freedom, with the current noise of the analysis as σ. */
  reducedChiSquare: number;
  /** Regime implied by the fitted rate ratio. */
  regime: "shell-filling" | "shell-tunneling" | "intermediate";
  /** Bias, data, model and residual on the points used, for plotting. */
  residuals: { biasV: Float64Array; currentA: Float64Array; modelA: Float64Array; residualA: Float64Array };
  warnings: string[];
}

/**
 * Fits the model of a dot in a double-barrier junction to one measured curve, starting from its
 * peak-based analysis.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis of the curve ({@link analyzeCurve}): its conductance record (bias in
 *     V, current in A, current noise in A), assignment and settings.
 * options : FitOptions, optional
 *     eta (default the analysis' η); temperatureK (K, default 4.5); maxIterations (default 60);
 *     timeLimitMs (ms, default 5000); maxPoints (default 800); chargingEnergyGuessEV (eV, default
 *     0.1). Defaults in {@link FIT_DEFAULTS}.
 *
 * Returns
 * -------
 * CurveFit
 *     Each fitted level (energy in eV and referred to bias in V), Ec (eV and V), Γtip/Γsub, Γsub
 *     (1/s), the broadening (eV), offset (A) and background, all with standard errors; the
 *     reduced χ², the regime the fitted rate ratio implies, the residuals, whether it converged
 *     and why it stopped, and warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `fit/no-levels` when the assignment gives no level to fit; `options/unknown-key`,
 *     `options/not-positive`, `options/not-finite`, `options/out-of-range` (η outside (0, 1])
 *     for a bad option.
 *
 * Notes
 * -----
 * The stages are the modules of lib/model/fit (its index.ts lists them in this order).
 * 1. Start ({@link levelsToFit}, {@link startingValues}): the levels, their degeneracies and Ec from the assignment (shell filling: one level
 *    per multiplet or sub-group, ε = η·V_first − Ec·(N_before + ½); shell tunnelling: one level
 *    per peak, ε = η·V − Ec/2, Ec from `chargingEnergyGuessEV`); rate ratio 10 (filling),
 *    0.02 (tunnelling) or 1; broadening from the measured peak width.
 * 2. Model ({@link parameterModel}, {@link unitCurrent}, {@link projectLinear}): the fast form of the orthodox master equation (zero-temperature plateaus joined by
 *    Gaussian-broadened steps, {@link fastCurrent}) plus offset + b1·V + b3·V³. The rate scale,
 *    offset and background enter linearly and are solved by least squares inside every model
 *    evaluation (variable projection); Levenberg–Marquardt adjusts the level energies, Ec,
 *    log₁₀(Γtip/Γsub) and the broadening on residuals scaled by the current noise.
 * 3. Iterations ({@link levenbergMarquardtLoop}): stops when χ² improves by less than 1e-5 (relative) over 4 iterations, after maxIterations,
 *    or after timeLimitMs (then `converged` is false and the message says why).
 * 4. Standard errors ({@link standardErrors}) from the Jacobian of all parameters at the optimum:
 *    cov = (JᵀJ)⁻¹·max(1, χ²_red) on noise-scaled residuals (common practice: scale by the
 *    reduced χ² when the model does not reach the noise).
 * 5. Verdict ({@link fitVerdict}): regime from the fitted Γtip/Γsub: shell filling at ≥ FIT_DEFAULTS.fillingRatioMin (1.5),
 *    shell tunnelling at ≤ FIT_DEFAULTS.tunnelingRatioMax (3/7), intermediate between
 *    ({@link REGIME_LIMITS}); a reduced χ² above FIT_DEFAULTS.poorFitChiSquare (10) gives a
 *    warning.
 * η is not fitted: one curve barely constrains it (it trades off against every level energy).
 *
 * References
 * ----------
 * K. Levenberg, "A method for the solution of certain non-linear problems in least squares",
 * Q. Appl. Math. 2, 164 (1944); D. W. Marquardt, "An algorithm for least-squares estimation of
 * nonlinear parameters", J. SIAM 11, 431 (1963); G. H. Golub and V. Pereyra, "The
 * differentiation of pseudo-inverses and nonlinear least squares problems whose variables
 * separate", SIAM J. Numer. Anal. 10, 413 (1973) (variable projection).
 *
 * Example
 * -------
 * ```ts
 * const sim = simulateCurve({ cb: [{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }],
 *   vb: [{ energyEV: -1.2, degeneracy: 2 }], chargingEnergyEV: 0.1, eta: 0.85, tipRatePerS: 1e9,
 *   substrateRatePerS: 1e8, temperatureK: 4.5, broadeningEV: 0.01,
 *   bias: { fromV: -2, toV: 2.2, stepV: 0.002 }, noise: { relative: 0.003, seed: 1 } }, { method: "fast" });
 * const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "demo", metadata: {} } };
 * const fit = fitCurve(analyzeCurve(curve, { eta: 0.85 }));
 * fit.regime;                       // => "shell-filling"
 * fit.chargingEnergyEV;             // => { value: 0.1000, standardError: 0.00009 } (eV; simulated 0.1)
 * fit.rateRatio.value;              // => 10.1 (± 0.15; simulated 10)
 * fit.levels.map((l) => l.energyEV.value); // => [0.6001, 0.9001, -1.2000] (eV; simulated 0.6, 0.9, −1.2)
 * ```
 */
export function fitCurve(analysis: CurveAnalysis, options: FitOptions = {}): CurveFit {
  checkKnownKeys("fit options", options, ["eta", "temperatureK", "maxIterations", "timeLimitMs", "maxPoints", "chargingEnergyGuessEV", "compareModels"]);
  const F = FIT_DEFAULTS;
  const eta = options.eta === undefined ? analysis.assignment.energies.eta : checkEta("eta", options.eta);
  const temperatureK = checkPositive("temperatureK", options.temperatureK ?? F.temperatureK);
  const maxIterations = checkPositive("maxIterations", options.maxIterations ?? F.maxIterations);
  const timeLimitMs = checkPositive("timeLimitMs", options.timeLimitMs ?? F.timeLimitMs);
  const maxPoints = checkPositive("maxPoints", options.maxPoints ?? F.maxPoints);
  const compareModels = options.compareModels ?? F.compareModels;
  const guessEC = options.chargingEnergyGuessEV ?? F.chargingEnergyGuessEV;
  const warnings: string[] = [];
  if (!analysis.assignment.energies.etaGiven && options.eta === undefined) warnings.push("eta not given: the fit used η = 1");

  // 1. Hypotheses: the assignment as it stands, and the other regimes' groupings of the same peaks.
  const hypotheses = fitHypotheses(analysis, eta, compareModels);
  if (!hypotheses.length) {
    throw new DotspecError("fit/no-levels", `${analysis.source}: the assignment has no multiplets to start the fit from (regime ${analysis.assignment.regime}); nothing to fit`);
  }

  // Data, thinned evenly.
  const sig = analysis.conductance;
  const stride = Math.max(1, Math.ceil(sig.biasV.length / maxPoints));
  const biasV = sig.biasV.filter((_, i) => i % stride === 0);
  const dataA = sig.currentA.filter((_, i) => i % stride === 0);
  const noiseA = Math.max(sig.record.noiseCurrentA, Number.MIN_VALUE);
  const n = biasV.length;
  const v3 = biasV.map((v) => v * v * v);
  const data = { x: Array.from({ length: n }, (_, i) => i), y: Array.from(dataA, (v) => v / noiseA) };
  const started = Date.now();

  /** One start of one hypothesis: Levenberg–Marquardt from log₁₀ r = logRatio0 (or from `from`). */
  const run = (h: FitHypothesis, logRatio0: number | null, iterations: number, from?: number[]): FitTrial => {
    const start = startingValues(h.analysis, h.seeds, eta, guessEC);
    const at = parameterIndex(h.seeds.length);
    const initialValues = from ? [...from] : [...start.initialValues];
    if (!from && logRatio0 !== null) initialValues[at.logRateRatio] = logRatio0;
    const evaluate = (p: ArrayLike<number>) => projectLinear(unitCurrent(p, h.seeds, eta, temperatureK, biasV), biasV, v3, dataA);
    let cacheKey = "";
    let cacheOut = new Float64Array(n);
    const modelScaled = (p: number[]) => {
      const key = p.join(",");
      if (key !== cacheKey) {
        cacheKey = key;
        cacheOut = evaluate(p).out.map((v) => v / noiseA);
      }
      const out = cacheOut;
      return (x: number) => out[x];
    };
    const loop = levenbergMarquardtLoop(data, modelScaled, {
      ...start,
      initialValues,
      maxIterations: iterations,
      timeLimitMs: Math.max(1, timeLimitMs - (Date.now() - started)),
      chunkIterations: F.chunkIterations,
      convergenceTolerance: F.convergenceTolerance,
    });
    // k: the nonlinear parameters and the four linear ones (scale, offset, b1, b3).
    const k = loop.parameters.length + 4;
    return { hypothesis: h, rateRatio0: 10 ** initialValues[at.logRateRatio], loop, start, k, bic: loop.chiSquare + k * Math.log(n) };
  };

  // 2. Starts: the assignment's hypothesis from its own rate ratio first; then, when that does not
  // describe the curve or the regime is undetermined, the same hypothesis from a grid of rate
  // ratios; the other hypotheses (the regimes forced on the same peaks) only when asked to compare.
  const trials: FitTrial[] = [run(hypotheses[0], null, maxIterations)];
  const reduced = (t: FitTrial) => t.loop.chiSquare / Math.max(1, n - t.k);
  const decisive = analysis.assignment.regime !== "undetermined" && reduced(trials[0]) <= F.poorFitChiSquare;
  const startLog0 = trials[0].start.initialValues[parameterIndex(hypotheses[0].seeds.length).logRateRatio];
  for (const h of compareModels ? hypotheses : decisive ? [] : [hypotheses[0]]) {
    for (const logRatio of F.rateRatioStartsLog10) {
      if (h === hypotheses[0] && Math.abs(logRatio - startLog0) < 0.5) continue;
      trials.push(run(h, logRatio, Math.min(maxIterations, F.exploreIterations)));
    }
  }
  // The best start by BIC, finished with the full iteration budget if it was only explored.
  let best = trials.reduce((a, b) => (b.bic < a.bic ? b : a));
  if (best !== trials[0]) {
    const finished = run(best.hypothesis, null, maxIterations, best.loop.parameters);
    best = { ...finished, rateRatio0: best.rateRatio0 };
  }
  const { hypothesis } = best;
  const { seeds } = hypothesis;
  const at = parameterIndex(seeds.length);
  const { parameters: params, chiSquare: chi2, iterations, converged, message } = best.loop;
  if (!converged) warnings.push(`the fit did not converge (${message}); the values are the best found so far`);
  if (hypothesis.name !== "assigned") warnings.push(`the ${hypothesis.label} describes the curve better than the assignment it started from (BIC lower by ${(trials[0].bic - best.bic).toFixed(0)})`);
  if (analysis.assignment.regime === "undetermined" && hypothesis.name === "assigned") warnings.push("regime undetermined: the fit starts from single levels");

  // 3. Final linear coefficients and standard errors from the full Jacobian.
  const final = projectLinear(unitCurrent(params, seeds, eta, temperatureK, biasV), biasV, v3, dataA);
  const dof = Math.max(1, n - (params.length + 4));
  const reducedChiSquare = chi2 / dof;
  const full = [...params, ...final.coef];
  const fullModel = (q: number[]) => {
    const unit = unitCurrent(q, seeds, eta, temperatureK, biasV);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = (q[at.rateScale] * unit[i] + q[at.offset] + q[at.backgroundLinear] * biasV[i] + q[at.backgroundCubic] * v3[i]) / noiseA;
    return out;
  };
  const steps = [...best.start.gradientDifference, ...final.coef.map((c, a) => Math.max(Math.abs(c) * 1e-4, [1e-30, noiseA * 1e-3, noiseA * 1e-3, noiseA * 1e-3][a]))];
  const se = standardErrors(fullModel, full, steps, reducedChiSquare, warnings);

  // 4. The verdict, the status and the result.
  const ratio = 10 ** params[at.logRateRatio];
  const verdict = fitVerdict(ratio, reducedChiSquare, F);
  if (verdict.warning) warnings.push(verdict.warning);
  const status = fitStatus({
    reducedChiSquare,
    regime: verdict.regime,
    chargingEnergyEV: params[at.chargingEnergy],
    chargingEnergySE: se[at.chargingEnergy],
    logRateRatioSE: se[at.logRateRatio],
    atBound: [at.chargingEnergy, at.logRateRatio].filter((j) => {
      const span = best.start.maxValues[j] - best.start.minValues[j];
      return params[j] - best.start.minValues[j] < 1e-3 * span || best.start.maxValues[j] - params[j] < 1e-3 * span;
    }).map((j) => (j === at.chargingEnergy ? "Ec" : "Γtip/Γsub")),
  });
  const value = (k: number): FittedValue => ({ value: full[k], standardError: se[k] });
  const ratioSE = Math.LN10 * ratio * se[at.logRateRatio];
  const sigmaEV = 10 ** params[at.logBroadening];
  const scaleRate = final.coef[0];
  const modelA = final.out;
  const minBic = Math.min(...trials.map((t) => t.bic), best.bic);
  const weightSum = trials.reduce((s, t) => s + Math.exp(-(t.bic - minBic) / 2), 0);
  return {
    source: analysis.source,
    converged,
    message,
    iterations,
    eta,
    status: status.status,
    statusReasons: status.reasons,
    hypothesis: hypothesis.name,
    alternatives: trials.map((t) => ({
      hypothesis: t.hypothesis.name,
      regime: t.hypothesis.analysis.assignment.regime,
      levels: t.hypothesis.seeds.length,
      rateRatioStart: t.rateRatio0,
      rateRatio: 10 ** t.loop.parameters[parameterIndex(t.hypothesis.seeds.length).logRateRatio],
      reducedChiSquare: t.loop.chiSquare / Math.max(1, n - t.k),
      bic: t.bic,
      weight: Math.exp(-(t.bic - minBic) / 2) / weightSum,
    })),
    levels: seeds.map((s, j) => ({
      band: s.band,
      label: s.label,
      degeneracy: s.degeneracy,
      energyEV: { value: s.band === "CB" ? params[j] : -params[j], standardError: se[j] },
      energyV: { value: (s.band === "CB" ? params[j] : -params[j]) / eta, standardError: se[j] / eta },
    })),
    chargingEnergyEV: value(at.chargingEnergy),
    chargingEnergyV: { value: params[at.chargingEnergy] / eta, standardError: se[at.chargingEnergy] / eta },
    rateRatio: { value: ratio, standardError: ratioSE },
    substrateRatePerS: { value: scaleRate, standardError: se[at.rateScale] },
    broadeningEV: { value: sigmaEV, standardError: Math.LN10 * sigmaEV * se[at.logBroadening] },
    offsetA: value(at.offset),
    backgroundLinearS: value(at.backgroundLinear),
    backgroundCubicAPerV3: value(at.backgroundCubic),
    reducedChiSquare,
    regime: verdict.regime,
    residuals: { biasV, currentA: dataA, modelA, residualA: dataA.map((v, i) => v - modelA[i]) },
    warnings,
  };
}

/** One grouping of the peaks into levels that the fit tries. */
interface FitHypothesis {
  /** "assigned" (the analysis' own assignment) or the regime forced on the same peaks. */
  name: "assigned" | "shell-filling" | "shell-tunneling";
  /** In words, for warnings. */
  label: string;
  /** The analysis with that assignment. */
  analysis: CurveAnalysis;
  seeds: LevelSeed[];
}

/** One Levenberg–Marquardt run of one hypothesis from one start. */
interface FitTrial {
  hypothesis: FitHypothesis;
  rateRatio0: number;
  loop: LoopResult;
  start: StartingValues;
  /** Free parameters, nonlinear and linear. */
  k: number;
  /** Bayesian information criterion χ² + k·ln n (σ known). */
  bic: number;
}

/**
 * The groupings of the peaks the fit compares: the assignment, then shell filling and shell
 * tunnelling forced on the same peaks where they differ from it (as level lists).
 */
function fitHypotheses(analysis: CurveAnalysis, eta: number, alternatives: boolean): FitHypothesis[] {
  const out: FitHypothesis[] = [];
  const seen = new Set<string>();
  const add = (name: FitHypothesis["name"], label: string, a: CurveAnalysis) => {
    const seeds = levelsToFit(a);
    const key = seeds.map((s) => `${s.band}${s.degeneracy}@${s.firstPeakV}/${s.before}`).join(" ");
    if (!seeds.length || seen.has(key)) return;
    // An alternative grouping whose master equation would be too large to solve is not tried.
    for (const band of name === "assigned" ? [] : (["CB", "VB"] as const)) {
      const states = seeds.filter((x) => x.band === band).reduce((n, x) => n * (x.degeneracy + 1), 1);
      if (states > SCENARIO_DEFAULTS.maxStates) return;
    }
    seen.add(key);
    out.push({ name, label, analysis: a, seeds });
  };
  add("assigned", "assignment", analysis);
  if (!alternatives) return out;
  const etaOption = analysis.assignment.energies.etaGiven ? { eta } : {};
  for (const regime of ["shell-filling", "shell-tunneling"] as const) {
    if (analysis.assignment.regime === regime) continue;
    const assignment = assignSpectrum(analysis.peaks, { ...etaOption, regime });
    add(regime, `${regime === "shell-filling" ? "shell-filling" : "shell-tunnelling"} grouping of the same peaks`, { ...analysis, assignment });
  }
  return out;
}
