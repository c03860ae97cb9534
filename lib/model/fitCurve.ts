/**
 * Fitting the orthodox-theory model to a measured I–V curve, starting from the peak-based
 * assignment: level energies, charging energy, tip/substrate rate ratio, rate scale,
 * broadening, offset and a smooth background, with standard errors.
 */
import { levenbergMarquardt } from "ml-levenberg-marquardt";
import { Matrix, inverse, solve } from "ml-matrix";
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import type { Level } from "./scenario.ts";
import { bandLadders, currentSteps, fastCurrent, type DotModel } from "./bandCurrent.ts";
import { checkKnownKeys, checkPositive, checkRange } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";

/** Options of {@link fitCurve}. */
export interface FitOptions {
  /** Voltage-division factor η (held fixed: one curve barely constrains it). Default: the analysis' η. */
  eta?: number;
  /** Temperature in K (sets the thermal step width; barely matters next to the broadening). Default 4.5. */
  temperatureK?: number;
  /** Most Levenberg–Marquardt iterations. Default 60. */
  maxIterations?: number;
  /** Wall-clock limit in ms; the fit stops and reports non-convergence after it. Default 5000. */
  timeLimitMs?: number;
  /** Most data points used (the curve is thinned evenly beyond this). Default 800. */
  maxPoints?: number;
  /** Starting charging energy in eV where the peaks do not give one (shell tunnelling). Default 0.1. */
  chargingEnergyGuessEV?: number;
}

export const FIT_DEFAULTS = {
  temperatureK: 4.5,
  maxIterations: 60,
  timeLimitMs: 5000,
  maxPoints: 800,
  chargingEnergyGuessEV: 0.1,
  /** Relative χ² improvement over one chunk of iterations below which the fit has converged. */
  convergenceTolerance: 1e-5,
  /** Iterations per chunk between convergence checks. */
  chunkIterations: 4,
  /** Fitted Γtip/Γsub at or above which the curve is in shell filling … */
  fillingRatioMin: 1.5,
  /** … and at or below which it is in shell tunnelling (in between: intermediate). */
  tunnelingRatioMax: 0.1,
  /** A reduced χ² above this says the model, as started from the assignment, does not describe the curve. */
  poorFitChiSquare: 10,
} as const;

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

/** Result of {@link fitCurve}. */
export interface CurveFit {
  source: string;
  converged: boolean;
  /** Why the fit stopped. */
  message: string;
  iterations: number;
  eta: number;
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

/** A level the fit starts from (see {@link fitStart}). */
export interface LevelSeed {
  band: "CB" | "VB";
  label: string;
  degeneracy: number;
  /** Bias of the level's first charging peak, V (positive for CB, negative for VB). */
  firstPeakV: number;
  /** Carriers of the band already in the dot when this level takes its first. */
  before: number;
}

/** Levels to fit, from the assignment: one per multiplet sub-group (filling) or per peak (tunnelling). */
function seedLevels(analysis: CurveAnalysis): LevelSeed[] {
  const a = analysis.assignment;
  const seeds: LevelSeed[] = [];
  const filling = a.regime === "shell-filling";
  for (const band of ["CB", "VB"] as const) {
    let before = 0;
    for (const m of a.multiplets.filter((x) => x.band === band)) {
      if (filling) {
        let k = 0;
        const total = m.degeneracy ?? m.found;
        m.subgroups.forEach((size, j) => {
          const last = j === m.subgroups.length - 1;
          const used = m.subgroups.slice(0, j).reduce((s, x) => s + x, 0);
          const g = last ? Math.max(size, total - used) : size;
          seeds.push({ band, label: m.subgroups.length > 1 ? `${m.label}${j + 1}` : m.label, degeneracy: g, firstPeakV: m.peaksV[k], before });
          before += g;
          k += size;
        });
      } else {
        // Single levels, whose steps in shell tunnelling scale with the degeneracy: a split CB
        // shell shares its degeneracy out in proportion to the steps; a VB level is given
        // 2 × its step over the band's first step (degeneracy is not assumed there).
        const stepOf = (v: number) => analysis.peaks.find((p) => p.biasV === v)?.stepA ?? 0;
        const steps = m.peaksV.map(stepOf);
        const total = steps.reduce((a, b) => a + b, 0);
        m.peaksV.forEach((v, j) => {
          let g: number;
          if (band === "CB" && m.degeneracy) g = total > 0 ? Math.max(1, Math.round((m.degeneracy * steps[j]) / total)) : Math.max(1, Math.round(m.degeneracy / m.found));
          else {
            const first = stepOf(a.multiplets.find((x) => x.band === band)!.peaksV[0]);
            g = first > 0 ? Math.max(1, Math.round((2 * steps[j]) / first)) : 2;
          }
          seeds.push({ band, label: m.found > 1 ? `${m.label}${j + 1}` : m.label, degeneracy: g, firstPeakV: v, before: 0 });
        });
      }
    }
  }
  return seeds;
}

/** Where {@link fitCurve} starts: the levels and parameters read from the peak-based assignment. */
export interface FitStart {
  /** Levels in the order of the assignment (CB then VB), each with its band, label and degeneracy. */
  seeds: LevelSeed[];
  /** |ε| of each seed in eV, same order (CB levels at +ε, VB levels at −ε). */
  levelMagnitudesEV: number[];
  /** Starting charging energy Ec, eV. */
  chargingEnergyEV: number;
  /** Starting Γtip/Γsub. */
  rateRatio: number;
  /** Starting Gaussian level broadening σ, eV. */
  broadeningEV: number;
  /** η used (held fixed by the fit). */
  eta: number;
  /** Temperature, K. */
  temperatureK: number;
}

/**
 * The start of {@link fitCurve}: levels, Ec, rate ratio and broadening from an analysis.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     From {@link analyzeCurve}.
 * options : FitOptions, optional
 *     `eta` (default the analysis' η), `temperatureK` (default 4.5), `chargingEnergyGuessEV`
 *     (default 0.1 eV, used outside shell filling); other fields are ignored here.
 *
 * Returns
 * -------
 * FitStart
 *     See Notes 1 of {@link fitCurve} for the rules.
 *
 * Throws
 * ------
 * DotspecError
 *     `fit/no-levels` when the assignment gives no level; the checks of `eta` and `temperatureK`.
 *
 * Example
 * -------
 * fitStart(analyzeCurve(curve, { eta: 0.85 })).seeds.map((s) => s.label); // => ["s", "p", "v1"]
 */
export function fitStart(analysis: CurveAnalysis, options: FitOptions = {}): FitStart {
  const F = FIT_DEFAULTS;
  const eta = options.eta === undefined ? analysis.assignment.energies.eta : checkRange("eta", options.eta, 1e-6, 1);
  const temperatureK = checkPositive("temperatureK", options.temperatureK ?? F.temperatureK);
  const seeds = seedLevels(analysis);
  if (!seeds.length) {
    throw new DotspecError("fit/no-levels", `${analysis.source}: the assignment has no multiplets to start the fit from (regime ${analysis.assignment.regime}); nothing to fit`);
  }
  const filling = analysis.assignment.regime === "shell-filling";
  const ec0 = analysis.assignment.energies.chargingEnergyEV ?? (options.chargingEnergyGuessEV ?? F.chargingEnergyGuessEV);
  return {
    seeds,
    levelMagnitudesEV: seeds.map((s) => eta * Math.abs(s.firstPeakV) - ec0 * (s.before + 0.5)),
    chargingEnergyEV: ec0,
    rateRatio: filling ? 10 : analysis.assignment.regime === "shell-tunneling" ? 0.02 : 1,
    broadeningEV: Math.max(1e-4, ((analysis.settings.peakWidthMV / 1000) * eta) / 2.3548),
    eta,
    temperatureK,
  };
}

/**
 * Fits the model of a dot in a double-barrier junction to one measured curve.
 *
 * Notes:
 * 1. Start: the levels, their degeneracies and Ec from the assignment (shell filling: one level
 *    per multiplet or sub-group, ε = η·V_first − Ec·(N_before + ½); shell tunnelling: one level
 *    per peak, ε = η·V − Ec/2, Ec from `chargingEnergyGuessEV`); rate ratio 10 (filling),
 *    0.02 (tunnelling) or 1; broadening from the measured peak width.
 * 2. Model: the fast form of the orthodox master equation (zero-temperature plateaus joined by
 *    Gaussian-broadened steps, {@link fastCurrent}) plus offset + b1·V + b3·V³. The rate scale,
 *    offset and background enter linearly and are solved by least squares inside every model
 *    evaluation (variable projection); Levenberg–Marquardt adjusts the level energies, Ec,
 *    log₁₀(Γtip/Γsub) and the broadening on residuals scaled by the current noise.
 * 3. Stops when χ² improves by less than 1e-5 (relative) over 4 iterations, after maxIterations,
 *    or after timeLimitMs (then `converged` is false and the message says why).
 * 4. Standard errors from the Jacobian of all parameters at the optimum:
 *    cov = (JᵀJ)⁻¹·max(1, χ²_red) on noise-scaled residuals (common practice: scale by the
 *    reduced χ² when the model does not reach the noise).
 * η is not fitted: one curve barely constrains it (it trades off against every level energy).
 *
 * References: K. Levenberg, Q. Appl. Math. 2, 164 (1944); D. W. Marquardt, J. SIAM 11, 431
 * (1963); G. H. Golub and V. Pereyra, SIAM J. Numer. Anal. 10, 413 (1973) (variable projection).
 *
 * @param analysis - the peak-based analysis of the curve (analyzeCurve).
 * @throws DotspecError when the assignment gives no level to fit.
 */
export function fitCurve(analysis: CurveAnalysis, options: FitOptions = {}): CurveFit {
  checkKnownKeys("fit options", options, ["eta", "temperatureK", "maxIterations", "timeLimitMs", "maxPoints", "chargingEnergyGuessEV"]);
  const F = FIT_DEFAULTS;
  const start = fitStart(analysis, options);
  const { seeds, eta, temperatureK } = start;
  const maxIterations = checkPositive("maxIterations", options.maxIterations ?? F.maxIterations);
  const timeLimitMs = checkPositive("timeLimitMs", options.timeLimitMs ?? F.timeLimitMs);
  const maxPoints = checkPositive("maxPoints", options.maxPoints ?? F.maxPoints);
  const warnings: string[] = [];
  if (!analysis.assignment.energies.etaGiven && options.eta === undefined) warnings.push("eta not given: the fit used η = 1");
  if (analysis.assignment.regime === "undetermined") warnings.push("regime undetermined: the fit starts from single levels");

  // Data, thinned evenly.
  const sig = analysis.conductance;
  const stride = Math.max(1, Math.ceil(sig.biasV.length / maxPoints));
  const biasV = sig.biasV.filter((_, i) => i % stride === 0);
  const dataA = sig.currentA.filter((_, i) => i % stride === 0);
  const noiseA = Math.max(sig.record.noiseCurrentA, Number.MIN_VALUE);
  const n = biasV.length;

  // Start values.
  const levels0 = start.levelMagnitudesEV;
  const ec0 = start.chargingEnergyEV;
  const ratio0 = start.rateRatio;
  const sigma0 = start.broadeningEV;
  // Nonlinear parameters: |ε| per level, Ec, log10 r, log10 σ.
  const p0 = [...levels0, ec0, Math.log10(ratio0), Math.log10(sigma0)];
  const nl = seeds.length;

  const build = (p: ArrayLike<number>): DotModel => {
    const cb: Level[] = [], vb: Level[] = [];
    seeds.forEach((s, j) => (s.band === "CB" ? cb : vb).push({ energyEV: s.band === "CB" ? p[j] : -p[j], degeneracy: s.degeneracy }));
    // The ladder code wants each band in filling order.
    cb.sort((a, b) => a.energyEV - b.energyEV);
    vb.sort((a, b) => b.energyEV - a.energyEV);
    const r = 10 ** p[nl + 1];
    return { cb, vb, chargingEnergyEV: p[nl], eta, tipRatePerS: r, substrateRatePerS: 1, relaxationRatePerS: 1000 * Math.max(r, 1), temperatureK };
  };
  const v3 = biasV.map((v) => v * v * v);
  /** Model current at unit rate scale (Γsub = 1/s), before offset and background. */
  const unitCurrent = (p: ArrayLike<number>) => {
    const model = build(p);
    return fastCurrent(currentSteps(model, bandLadders(model)), biasV, 10 ** p[nl + 2] / eta);
  };
  /** Unit-scale model current and the best linear coefficients [scale, offset, b1, b3]. */
  const evaluate = (p: ArrayLike<number>) => {
    const unit = unitCurrent(p);
    // Linear least squares for [scale, offset, b1, b3].
    const cols = [unit, new Float64Array(n).fill(1), biasV, v3];
    const ata = Matrix.zeros(4, 4), atb = Matrix.zeros(4, 1);
    for (let a = 0; a < 4; a++) {
      let sb = 0;
      for (let i = 0; i < n; i++) sb += cols[a][i] * dataA[i];
      atb.set(a, 0, sb);
      for (let b = a; b < 4; b++) {
        let s = 0;
        for (let i = 0; i < n; i++) s += cols[a][i] * cols[b][i];
        ata.set(a, b, s);
        ata.set(b, a, s);
      }
    }
    // Column scaling keeps the tiny normal equations well conditioned.
    const scale = [0, 1, 2, 3].map((a) => Math.sqrt(ata.get(a, a)) || 1);
    for (let a = 0; a < 4; a++) {
      atb.set(a, 0, atb.get(a, 0) / scale[a]);
      for (let b = 0; b < 4; b++) ata.set(a, b, ata.get(a, b) / (scale[a] * scale[b]));
    }
    let coef: number[];
    try {
      coef = solve(ata, atb).getColumn(0).map((c, a) => c / scale[a]);
    } catch {
      coef = [0, 0, 0, 0];
    }
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = coef[0] * unit[i] + coef[1] + coef[2] * biasV[i] + coef[3] * v3[i];
    return { out, coef };
  };
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
  const data = { x: Array.from({ length: n }, (_, i) => i), y: Array.from(dataA, (v) => v / noiseA) };
  // Each level stays within reach of its start, short of its neighbours in the same band, so
  // levels cannot swap places; the reach is a few peak widths.
  const reach = levels0.map((e, j) => {
    let room = 0.2;
    levels0.forEach((f, k) => {
      if (k !== j && seeds[k].band === seeds[j].band) room = Math.min(room, 0.45 * Math.abs(f - e));
    });
    return Math.max(room, 3 * sigma0);
  });
  const minValues = [...levels0.map((e, j) => e - reach[j]), 1e-4, -4, -4];
  const maxValues = [...levels0.map((e, j) => e + reach[j]), 2, 4, Math.log10(0.5)];
  const gradientDifference = [...levels0.map(() => 1e-4), 1e-4, 1e-3, 1e-3];

  // Levenberg–Marquardt in chunks, with our own convergence test and time limit.
  const started = Date.now();
  let params = p0;
  let chi2 = chiSquare(modelScaled(params), data.y);
  let iterations = 0;
  let converged = false;
  let message = "";
  while (iterations < maxIterations) {
    const chunk = Math.min(F.chunkIterations, maxIterations - iterations);
    let result;
    try {
      result = levenbergMarquardt(data, modelScaled, {
        initialValues: params,
        minValues,
        maxValues,
        gradientDifference,
        maxIterations: chunk,
        damping: 1e-2,
        errorTolerance: 1e-10,
        timeout: Math.max(0.001, (timeLimitMs - (Date.now() - started)) / 1000),
      });
    } catch (err) {
      message = `stopped at the time limit of ${timeLimitMs} ms`;
      break;
    }
    iterations += result.iterations;
    const next = chiSquare(modelScaled(result.parameterValues), data.y);
    const improvement = (chi2 - next) / Math.max(chi2, 1e-300);
    if (next <= chi2) params = result.parameterValues;
    chi2 = Math.min(chi2, next);
    if (improvement >= 0 && improvement < F.convergenceTolerance) {
      converged = true;
      message = `converged: χ² changed by ${improvement.toExponential(1)} over ${result.iterations} iterations`;
      break;
    }
    if (Date.now() - started > timeLimitMs) {
      message = `stopped at the time limit of ${timeLimitMs} ms`;
      break;
    }
  }
  if (!converged && !message) message = `stopped after ${iterations} iterations without converging`;
  if (!converged) warnings.push(`the fit did not converge (${message}); the values are the best found so far`);

  // Final linear coefficients and standard errors from the full Jacobian.
  const final = evaluate(params);
  const dof = Math.max(1, n - (params.length + 4));
  const reducedChiSquare = chi2 / dof;
  const full = [...params, ...final.coef];
  const fullModel = (q: number[]) => {
    const unit = unitCurrent(q);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = (q[nl + 3] * unit[i] + q[nl + 4] + q[nl + 5] * biasV[i] + q[nl + 6] * v3[i]) / noiseA;
    return out;
  };
  const steps = [...gradientDifference, ...final.coef.map((c, a) => Math.max(Math.abs(c) * 1e-4, [1e-30, noiseA * 1e-3, noiseA * 1e-3, noiseA * 1e-3][a]))];
  const se = standardErrors(fullModel, full, steps, reducedChiSquare, warnings);
  if (reducedChiSquare > F.poorFitChiSquare) {
    warnings.push(
      `reduced χ² = ${reducedChiSquare.toFixed(1)}: the model started from this assignment does not describe the curve (levels missing or mis-assigned); treat the fitted values with suspicion`,
    );
  }
  const value = (k: number): FittedValue => ({ value: full[k], standardError: se[k] });
  const ratio = 10 ** params[nl + 1];
  const ratioSE = Math.LN10 * ratio * se[nl + 1];
  const sigmaEV = 10 ** params[nl + 2];
  const scaleRate = final.coef[0];
  const regime = ratio >= F.fillingRatioMin ? "shell-filling" : ratio <= F.tunnelingRatioMax ? "shell-tunneling" : "intermediate";
  const modelA = final.out;
  return {
    source: analysis.source,
    converged,
    message,
    iterations,
    eta,
    levels: seeds.map((s, j) => ({
      band: s.band,
      label: s.label,
      degeneracy: s.degeneracy,
      energyEV: { value: s.band === "CB" ? params[j] : -params[j], standardError: se[j] },
      energyV: { value: (s.band === "CB" ? params[j] : -params[j]) / eta, standardError: se[j] / eta },
    })),
    chargingEnergyEV: value(nl),
    chargingEnergyV: { value: params[nl] / eta, standardError: se[nl] / eta },
    rateRatio: { value: ratio, standardError: ratioSE },
    substrateRatePerS: { value: scaleRate, standardError: se[nl + 3] },
    broadeningEV: { value: sigmaEV, standardError: Math.LN10 * sigmaEV * se[nl + 2] },
    offsetA: value(nl + 4),
    backgroundLinearS: value(nl + 5),
    backgroundCubicAPerV3: value(nl + 6),
    reducedChiSquare,
    regime,
    residuals: { biasV, currentA: dataA, modelA, residualA: dataA.map((v, i) => v - modelA[i]) },
    warnings,
  };
}

function chiSquare(f: (x: number) => number, y: number[]): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (y[i] - f(i)) ** 2;
  return s;
}

/** √diag of (JᵀJ)⁻¹·max(1, χ²_red) with J by central differences of the noise-scaled model. */
function standardErrors(model: (q: number[]) => Float64Array, q: number[], steps: number[], reducedChiSquare: number, warnings: string[]): number[] {
  const m = q.length;
  const cols: Float64Array[] = [];
  for (let k = 0; k < m; k++) {
    const up = q.slice(), down = q.slice();
    up[k] += steps[k];
    down[k] -= steps[k];
    const a = model(up), b = model(down);
    cols.push(a.map((v, i) => (v - b[i]) / (2 * steps[k])));
  }
  const jtj = Matrix.zeros(m, m);
  for (let a = 0; a < m; a++) for (let b = a; b < m; b++) {
    let s = 0;
    for (let i = 0; i < cols[a].length; i++) s += cols[a][i] * cols[b][i];
    jtj.set(a, b, s);
    jtj.set(b, a, s);
  }
  const d = Array.from({ length: m }, (_, a) => Math.sqrt(jtj.get(a, a)) || 1);
  for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) jtj.set(a, b, jtj.get(a, b) / (d[a] * d[b]));
  try {
    const inv = inverse(jtj);
    const factor = Math.max(1, reducedChiSquare);
    return d.map((da, a) => {
      const v = inv.get(a, a) / (da * da);
      return v > 0 ? Math.sqrt(v * factor) : NaN;
    });
  } catch {
    warnings.push("the Jacobian at the optimum is singular: some parameters are not determined by this curve (standard errors NaN)");
    return new Array(m).fill(NaN);
  }
}
