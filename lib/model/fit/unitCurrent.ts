/**
 * The model current of the fit at unit rate scale, before offset and background.
 */
import { bandLadders, currentSteps, fastCurrent } from "../bandCurrent.ts";
import { parameterModel } from "./parameterModel.ts";
import type { LevelSeed } from "./levelsToFit.ts";

/**
 * Model current at unit rate scale (Γsub = 1/s), before offset and background, for one
 * parameter vector.
 *
 * Parameters
 * ----------
 * p : ArrayLike<number>
 *     The nonlinear parameters ({@link parameterIndex}): |ε_j| (eV), Ec (eV), log₁₀(Γtip/Γsub),
 *     log₁₀ σ (σ in eV).
 * seeds : readonly LevelSeed[]
 *     The levels being fitted, in the order of p.
 * eta : number
 *     Voltage-division factor η.
 * temperatureK : number
 *     Temperature in K.
 * biasV : ArrayLike<number>
 *     Sample biases in V.
 *
 * Returns
 * -------
 * Float64Array
 *     Current in A at each bias for Γsub = 1/s (multiply by the fitted Γsub).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The dot model of p ({@link parameterModel}).
 * 2. Its zero-temperature plateaus and steps ({@link currentSteps}).
 * 3. The steps broadened by σ/η in bias ({@link fastCurrent}).
 *
 * References
 * ----------
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * const seeds = [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 }] as const;
 * // One s level at 0.6 eV, Ec 0.1 eV, r = 10, σ = 10 meV, η = 0.85: steps at 0.765 and 0.882 V.
 * unitCurrent([0.6, 0.1, 1, -2], seeds, 0.85, 4.5, [0.7, 0.82, 1]);
 * // => [3.1e-27, 1.526e-19, 2.913e-19] (A at Γsub = 1/s: ≈ 0 below the first step, then
 * //    e·2r/(1 + 2r) and e·2r/(1 + r))
 * ```
 */
export function unitCurrent(p: ArrayLike<number>, seeds: readonly LevelSeed[], eta: number, temperatureK: number, biasV: ArrayLike<number>): Float64Array {
  const model = parameterModel(p, seeds, eta, temperatureK);
  return fastCurrent(currentSteps(model, bandLadders(model)), biasV, 10 ** p[seeds.length + 2] / eta);
}
