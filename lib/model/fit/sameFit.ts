/**
 * Whether two runs of the model fit ended at the same fit: two hypotheses read from the peaks in
 * different ways (a ladder from the empty dot and one in filling order, say) often settle at one
 * minimum, and what is done next from one of them need not be done again from the other.
 */
import type { FitTrial } from "./fitTrial.ts";
import { parameterIndex } from "./parameterModel.ts";

/** Tolerance of {@link sameFit} (locked by test/model/fit/sameFit.test.ts). */
export const SAME_FIT_DEFAULTS = Object.freeze({
  /** Largest difference of any nonlinear parameter (|ε| and Ec in eV, log₁₀ Γtip/Γsub, log₁₀ σ) between two runs at the same fit. */
  parameterTolerance: 1e-4,
});

/**
 * Whether two runs describe the curve with the same levels and the same parameters.
 *
 * Parameters
 * ----------
 * a, b : FitTrial
 *     Two runs ({@link fitRunner}).
 * tolerance : number, optional
 *     Largest difference of a nonlinear parameter (eV for the level energies and Ec; log₁₀ units
 *     for Γtip/Γsub and σ). Default SAME_FIT_DEFAULTS.parameterTolerance (1e-4: 0.1 meV, 0.02 % in
 *     the rate ratio), far below any standard error of a fit to a noisy curve.
 *
 * Returns
 * -------
 * boolean
 *     True when both ran on the same points, their levels have the same bands and degeneracies
 *     in the same order, and every nonlinear parameter agrees within the tolerance.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Same data set (the whole curve or its CB side) and the same number of levels.
 * 2. Level by level: the same band and degeneracy.
 * 3. |p_a − p_b| ≤ tolerance for the level energies, Ec, log₁₀ Γtip/Γsub and log₁₀ σ (the linear
 *    parameters follow from them).
 *
 * Example
 * -------
 * ```ts
 * // The same 2+6 ladder reached from the empty dot and in filling order (Ec 111.40 and 111.41 meV):
 * sameFit(fromEmpty, inFillingOrder); // => true
 * ```
 */
export function sameFit(a: FitTrial, b: FitTrial, tolerance: number = SAME_FIT_DEFAULTS.parameterTolerance): boolean {
  const sa = a.hypothesis.seeds, sb = b.hypothesis.seeds;
  if (a.set !== b.set || sa.length !== sb.length) return false;
  if (sa.some((s, j) => s.band !== sb[j].band || s.degeneracy !== sb[j].degeneracy)) return false;
  const nonlinear = parameterIndex(sa.length).rateScale;
  for (let j = 0; j < nonlinear; j++) if (!(Math.abs(a.loop.parameters[j] - b.loop.parameters[j]) <= tolerance)) return false;
  return true;
}
