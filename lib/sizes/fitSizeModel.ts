/**
 * Weighted nonlinear least squares of a model y(R; p) against points measured at several dot
 * radii: damped Gauss–Newton (Levenberg–Marquardt) with bounds, and standard errors from the
 * Jacobian.
 */
import { DotspecError } from "../util/errors.ts";
import { checkFinite, checkInteger, checkPositive } from "../util/check.ts";
import { scaledSymmetricInverse } from "../util/smallSymmetric.ts";

/** One measured point: a value at a radius, with its 1σ uncertainty or null. */
export interface SizeModelPoint {
  /** Dot radius, nm. */
  radiusNM: number;
  /** Measured value (eV for the energies of this project). */
  value: number;
  /** 1σ uncertainty of `value` (same unit), or null when unknown. */
  sigma: number | null;
}

/** One free parameter of the model. */
export interface SizeModelParameter {
  /** Name (the key in the result's records). */
  name: string;
  /** Starting value. */
  initial: number;
  /** Lower bound. Default −∞. */
  min?: number;
  /** Upper bound. Default +∞. */
  max?: number;
}

/** Options of {@link fitSizeModel}. */
export interface FitSizeModelOptions {
  /** The model: value at `radiusNM` (nm) for parameters in the order of `parameters`. */
  model: (radiusNM: number, params: readonly number[]) => number;
  /** The free parameters, 1…10 of them. */
  parameters: readonly SizeModelParameter[];
  /** Cap on Levenberg–Marquardt iterations. Default 200. */
  maxIterations?: number;
  /** Converged when an accepted step lowers χ² by less than this fraction. Default 1e-12. */
  tolerance?: number;
  /** Relative step of the central-difference Jacobian. Default 1e-6. */
  differenceStep?: number;
}

/** Defaults of {@link fitSizeModel} (locked by test/sizes/defaults.test.ts). */
export const FIT_SIZE_MODEL_DEFAULTS = Object.freeze({
  maxIterations: 200,
  tolerance: 1e-12,
  differenceStep: 1e-6,
  initialDamping: 1e-3,
});

/** Result of {@link fitSizeModel}. */
export interface SizeModelFit {
  /** Best-fit values by parameter name. */
  params: Record<string, number>;
  /** 1σ standard errors by name; null where the covariance could not be formed. */
  stderr: Record<string, number | null>;
  /** χ² = Σ ((y − f)/σ)² (σ = 1 for every point when no σ was given). */
  chiSquare: number;
  /** χ²/(N − M); null with no degrees of freedom. */
  reducedChiSquare: number | null;
  /** Points that entered the fit. */
  pointsUsed: number;
  /** Indices (into the input) of the points used. */
  indicesUsed: number[];
  /** N − M. */
  degreesOfFreedom: number;
  /** How the weights were set: "given" (every point had σ), "median" (missing σ replaced by the median of the given), "none" (no σ: unit weights). */
  weighting: "given" | "median" | "none";
  /** True when the standard errors were multiplied by √χ²_red (done when no σ was given). */
  stderrScaledByReducedChiSquare: boolean;
  /** Whether the iteration met the convergence test. */
  converged: boolean;
  /** Iterations taken. */
  iterations: number;
  /** Names of parameters that ended on a bound. */
  atBound: string[];
  /** What went wrong or was assumed, in words. */
  warnings: string[];
}

/**
 * Fits y(R; p) to points {R_i, y_i, σ_i} by weighted nonlinear least squares.
 *
 * Parameters
 * ----------
 * points : readonly SizeModelPoint[]
 *     The measurements ({@link SizeModelPoint}).
 * options : FitSizeModelOptions
 *     The model, its parameters and the iteration settings.
 *
 * Returns
 * -------
 * SizeModelFit
 *     Values, standard errors, χ² and the record ({@link SizeModelFit}).
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/bad-parameter` for a parameter list that is empty, too long, or whose start lies outside
 *     its bounds; `options/*` for invalid settings.
 *
 * Notes
 * -----
 * 1. Points with a non-finite or non-positive radius or a non-finite value are left out (a
 *    warning says how many). A σ that is null, ≤ 0 or not finite counts as missing. With every
 *    σ missing, all points get σ = 1 and the standard errors are scaled by √χ²_red (the scatter
 *    sets the error bars); with some missing, those points get the median of the given σ.
 * 2. Levenberg–Marquardt, our own implementation: residuals r = (y − f)/σ, central-difference
 *    Jacobian J (one-sided at a bound), step δ from (JᵀJ + λ·diag JᵀJ)·δ = Jᵀr, clipped to the
 *    bounds; a step that lowers χ² is taken and λ divided by 10, otherwise λ is multiplied by
 *    10. Converged when an accepted step lowers χ² by less than `tolerance` (relative), when
 *    χ² is zero to rounding, or when λ exceeds 1e12 (no direction lowers χ² any more).
 * 3. Covariance (JᵀWJ)⁻¹ at the solution (unit-diagonal scaled Cholesky inverse); standard
 *    errors are the square roots of its diagonal (× √χ²_red when no σ was given).
 * 4. Warnings: too few points (N < M: no fit; N = M: no χ²_red), a parameter on its bound, no
 *    convergence, a singular covariance.
 *
 * References
 * ----------
 * K. Levenberg, Q. Appl. Math. 2, 164 (1944); D. W. Marquardt, J. Soc. Ind. Appl. Math. 11, 431
 * (1963); W. H. Press et al., Numerical Recipes, 3rd ed. (Cambridge, 2007), §15.5; P. R. Bevington and
 * D. K. Robinson, Data Reduction and Error Analysis for the Physical Sciences, 3rd ed. (McGraw-Hill,
 * 2003), ch. 6–8.
 *
 * Example
 * -------
 * ```ts
 * fitSizeModel([{ radiusNM: 1, value: 3, sigma: null }, { radiusNM: 2, value: 5, sigma: null },
 *   { radiusNM: 3, value: 7, sigma: null }],
 *   { model: (r, [a, b]) => a + b * r, parameters: [{ name: "a", initial: 0 }, { name: "b", initial: 0 }] }).params;
 * // => { a: 1, b: 2 }
 * ```
 */
export function fitSizeModel(points: readonly SizeModelPoint[], options: FitSizeModelOptions): SizeModelFit {
  const maxIterations = checkInteger("maxIterations", options.maxIterations ?? FIT_SIZE_MODEL_DEFAULTS.maxIterations, 1, 100000);
  const tolerance = checkPositive("tolerance", options.tolerance ?? FIT_SIZE_MODEL_DEFAULTS.tolerance);
  const hRel = checkPositive("differenceStep", options.differenceStep ?? FIT_SIZE_MODEL_DEFAULTS.differenceStep);
  const pars = options.parameters;
  if (!Array.isArray(pars) || pars.length < 1 || pars.length > 10) {
    throw new DotspecError("sizes/bad-parameter", `parameters must list 1 to 10 free parameters; got ${Array.isArray(pars) ? pars.length : typeof pars}`);
  }
  const m = pars.length;
  const lo = pars.map((p) => p.min ?? -Infinity);
  const hi = pars.map((p) => p.max ?? Infinity);
  pars.forEach((p, j) => {
    checkFinite(`parameters[${j}].initial (${p.name})`, p.initial);
    if (!(lo[j] <= p.initial && p.initial <= hi[j])) {
      throw new DotspecError("sizes/bad-parameter", `parameter ${p.name}: initial value ${p.initial} lies outside its bounds [${lo[j]}, ${hi[j]}]; start inside them`);
    }
  });
  const warnings: string[] = [];

  // 1. Points and weights.
  const indicesUsed: number[] = [];
  points.forEach((p, i) => {
    if (Number.isFinite(p.radiusNM) && p.radiusNM > 0 && Number.isFinite(p.value)) indicesUsed.push(i);
  });
  if (indicesUsed.length < points.length) {
    warnings.push(`${points.length - indicesUsed.length} point(s) with a non-positive or missing radius or a non-finite value were left out`);
  }
  const n = indicesUsed.length;
  const R = indicesUsed.map((i) => points[i].radiusNM);
  const y = indicesUsed.map((i) => points[i].value);
  const given = indicesUsed.map((i) => {
    const s = points[i].sigma;
    return s !== null && Number.isFinite(s) && s > 0 ? s : null;
  });
  const known = given.filter((s): s is number => s !== null).sort((a, b) => a - b);
  let weighting: SizeModelFit["weighting"];
  let sigma: number[];
  if (known.length === n) {
    weighting = "given";
    sigma = given as number[];
  } else if (known.length === 0) {
    weighting = "none";
    sigma = given.map(() => 1);
    if (n > 0) warnings.push("no point has an uncertainty: unit weights, standard errors scaled by √χ²_red");
  } else {
    weighting = "median";
    const half = known.length >> 1;
    const median = known.length % 2 ? known[half] : 0.5 * (known[half - 1] + known[half]);
    sigma = given.map((s) => s ?? median);
    warnings.push(`${n - known.length} of ${n} points had no uncertainty; they were given the median of the others (${median.toPrecision(3)})`);
  }

  const names = pars.map((p) => p.name);
  const record = <T,>(values: readonly T[]): Record<string, T> => Object.fromEntries(names.map((nm, j) => [nm, values[j]]));
  const failed = (why: string): SizeModelFit => ({
    params: record(pars.map((p) => p.initial)),
    stderr: record<number | null>(pars.map(() => null)),
    chiSquare: NaN, reducedChiSquare: null, pointsUsed: n, indicesUsed, degreesOfFreedom: n - m,
    weighting, stderrScaledByReducedChiSquare: false, converged: false, iterations: 0, atBound: [],
    warnings: [...warnings, why],
  });
  if (n < m) return failed(`too few points: ${n} for ${m} free parameter(s); no fit`);

  const residuals = (p: readonly number[]): Float64Array => {
    const r = new Float64Array(n);
    for (let i = 0; i < n; i++) r[i] = (y[i] - options.model(R[i], p)) / sigma[i];
    return r;
  };
  const chi2Of = (r: Float64Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += r[i] * r[i];
    return s;
  };
  // Jacobian of the model divided by σ (i.e. −∂r/∂p), row-major n×m.
  const jacobian = (p: readonly number[]): Float64Array => {
    const J = new Float64Array(n * m);
    for (let j = 0; j < m; j++) {
      const h = hRel * Math.max(Math.abs(p[j]), 1e-3);
      const up = Math.min(p[j] + h, hi[j]);
      const down = Math.max(p[j] - h, lo[j]);
      const pu = p.slice(), pd = p.slice();
      pu[j] = up;
      pd[j] = down;
      for (let i = 0; i < n; i++) J[i * m + j] = (options.model(R[i], pu) - options.model(R[i], pd)) / ((up - down) * sigma[i]);
    }
    return J;
  };

  // 2. Levenberg–Marquardt.
  let p = pars.map((q) => q.initial);
  let r = residuals(p);
  let chi2 = chi2Of(r);
  if (!Number.isFinite(chi2)) return failed("the model is not finite at the starting values; give other initial values");
  let lambda: number = FIT_SIZE_MODEL_DEFAULTS.initialDamping;
  let converged = false;
  let iterations = 0;
  while (iterations < maxIterations && !converged) {
    iterations++;
    const J = jacobian(p);
    if (!J.every(Number.isFinite)) {
      warnings.push("the model is not finite next to the current values (a derivative could not be formed); stopped there");
      break;
    }
    const A = new Float64Array(m * m);
    const g = new Float64Array(m);
    for (let i = 0; i < n; i++) {
      for (let a = 0; a < m; a++) {
        g[a] += J[i * m + a] * r[i];
        for (let b = 0; b <= a; b++) A[a * m + b] += J[i * m + a] * J[i * m + b];
      }
    }
    for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) A[b * m + a] = A[a * m + b];
    let accepted = false;
    while (!accepted) {
      const D = Float64Array.from(A);
      for (let a = 0; a < m; a++) D[a * m + a] += lambda * (A[a * m + a] || 1);
      const inv = scaledSymmetricInverse(D, m);
      if (inv) {
        const trial = p.map((v, a) => {
          let d = 0;
          for (let b = 0; b < m; b++) d += inv[a * m + b] * g[b];
          return Math.min(hi[a], Math.max(lo[a], v + d));
        });
        const rt = residuals(trial);
        const c2 = chi2Of(rt);
        if (c2 < chi2) {
          const drop = (chi2 - c2) / Math.max(chi2, 1e-300);
          p = trial;
          r = rt;
          chi2 = c2;
          lambda = Math.max(lambda / 10, 1e-12);
          accepted = true;
          if (drop < tolerance || chi2 <= 1e-28 * n) converged = true;
          break;
        }
      }
      lambda *= 10;
      if (lambda > 1e12) {
        converged = true; // no direction lowers χ²: a minimum to working precision
        break;
      }
    }
  }
  if (!converged) warnings.push(`the fit did not converge in ${maxIterations} iterations; the values are the best found`);

  // 3. Covariance and standard errors.
  const dof = n - m;
  const reducedChiSquare = dof > 0 ? chi2 / dof : null;
  if (dof === 0) warnings.push(`as many points as free parameters (${n}): no reduced χ²`);
  const J = jacobian(p);
  const A = new Float64Array(m * m);
  for (let i = 0; i < n; i++) for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) A[a * m + b] += J[i * m + a] * J[i * m + b];
  const cov = scaledSymmetricInverse(A, m);
  const scaled = weighting === "none";
  const scale = scaled ? (reducedChiSquare === null ? NaN : Math.sqrt(reducedChiSquare)) : 1;
  if (!cov) warnings.push("the parameters are not all determined by the data (singular covariance): no standard errors");
  const stderr = names.map((_, j) => {
    if (!cov) return null;
    const v = Math.sqrt(cov[j * m + j]) * scale;
    return Number.isFinite(v) ? v : null;
  });
  const atBound = names.filter((_, j) => p[j] === lo[j] || p[j] === hi[j]);
  for (const name of atBound) warnings.push(`parameter ${name} ended on its bound; its value and error are not reliable`);
  return {
    params: record(p), stderr: record<number | null>(stderr), chiSquare: chi2, reducedChiSquare,
    pointsUsed: n, indicesUsed, degreesOfFreedom: dof, weighting, stderrScaledByReducedChiSquare: scaled,
    converged, iterations, atBound, warnings,
  };
}
