/**
 * The linear coefficients, reduced χ² and standard errors of one run of the model fit.
 */
import { parameterIndex } from "./parameterModel.ts";
import { projectLinear, type LinearProjection } from "./projectLinear.ts";
import { standardErrors } from "./standardErrors.ts";
import type { FitTrial } from "./fitTrial.ts";

/** What {@link trialErrors} returns. */
export interface TrialErrors {
  /** The scale, offset and background solved at the run's parameters, and the model current (A). */
  final: LinearProjection;
  /** All parameters: the run's nonlinear ones, then scale, offset, b1, b3. */
  full: number[];
  /** One standard error per entry of `full`, in its unit (NaN where undetermined). */
  se: number[];
  /** χ² per degree of freedom, n − (nonlinear parameters + 4). */
  reducedChiSquare: number;
}

/**
 * Standard errors of every parameter of one run, on the points it was fitted to.
 *
 * Parameters
 * ----------
 * t : FitTrial
 *     The run: its points (bias in V, current in A), parameters and finite-difference steps.
 * current : (p: ArrayLike<number>, biasV: Float64Array) => Float64Array
 *     The model current at unit rate scale for the run's hypothesis (bandStepsMemo).
 * noiseA : number
 *     Current noise σ, A (> 0).
 * warnings : string[]
 *     Receives a warning when JᵀJ is singular.
 *
 * Returns
 * -------
 * TrialErrors
 *     The linear projection, all parameters, their standard errors and the reduced χ².
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Scale, offset and background by least squares at the run's nonlinear parameters.
 * 2. The standard errors of all parameters from the central-difference Jacobian of the
 *    noise-scaled model ({@link standardErrors}), scaled by max(1, χ²_red).
 * A run with held parameters gets errors for them too, from the same Jacobian: the curvature of
 * χ² along them at the held values.
 *
 * Example
 * -------
 * ```ts
 * trialErrors(run, bandStepsMemo(run.hypothesis.seeds, 0.85, 4.5), 1e-12, []).se.length;
 * // => run.loop.parameters.length + 4
 * ```
 */
export function trialErrors(t: FitTrial, current: (p: ArrayLike<number>, biasV: Float64Array) => Float64Array, noiseA: number, warnings: string[]): TrialErrors {
  const at = parameterIndex(t.hypothesis.seeds.length);
  const params = t.loop.parameters;
  const { biasV, dataA, v3, n } = t.set;
  const final = projectLinear(current(params, biasV), biasV, v3, dataA);
  const dof = Math.max(1, n - (params.length + 4));
  const reducedChiSquare = t.loop.chiSquare / dof;
  const full = [...params, ...final.coef];
  const fullModel = (q: number[]) => {
    const unit = current(q, biasV);
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = (q[at.rateScale] * unit[i] + q[at.offset] + q[at.backgroundLinear] * biasV[i] + q[at.backgroundCubic] * v3[i]) / noiseA;
    return out;
  };
  const steps = [...t.start.gradientDifference, ...final.coef.map((c, a) => Math.max(Math.abs(c) * 1e-4, [1e-30, noiseA * 1e-3, noiseA * 1e-3, noiseA * 1e-3][a]))];
  const se = standardErrors(fullModel, full, steps, reducedChiSquare, warnings);
  return { final, full, se, reducedChiSquare };
}
