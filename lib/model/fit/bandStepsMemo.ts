/**
 * The model current of the fit at unit rate scale, with each band's steps remembered: a change of
 * one band's levels (or of the broadening alone) leaves the other band's master equation as it
 * was, so finite differences do not solve it again.
 */
import { currentSteps, fastCurrent, type CurrentStep, type DotModel } from "../bandCurrent.ts";
import { parameterModel } from "./parameterModel.ts";
import type { LevelSeed } from "./levelsToFit.ts";

/** Size of {@link bandStepsMemo}'s store (locked by test/model/fit/bandStepsMemo.test.ts). */
export const BAND_STEPS_MEMO_DEFAULTS = Object.freeze({
  /** Most band solutions kept per band; the oldest goes first. */
  entriesPerBand: 64,
});

type BandSteps = { baseA: number; steps: CurrentStep[] };

/**
 * A model-current function for one set of levels that solves each band's master equation once per
 * distinct (band levels, Ec, Γtip/Γsub).
 *
 * Parameters
 * ----------
 * seeds : readonly LevelSeed[]
 *     The levels being fitted, in the order of the parameter vector.
 * eta : number
 *     Voltage-division factor η.
 * temperatureK : number
 *     Temperature in K.
 *
 * Returns
 * -------
 * (p: ArrayLike<number>, biasV: ArrayLike<number>) => Float64Array
 *     The same current as {@link unitCurrent}(p, seeds, eta, temperatureK, biasV) (A at Γsub =
 *     1/s): the CB and VB steps are those of {@link currentSteps} on each band alone (the model
 *     sums independent electron and hole ladders), looked up by the band's own parameters.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The dot model of p ({@link parameterModel}).
 * 2. For each band, the key: its level energies and degeneracies, Ec and Γtip/Γsub; its steps from
 *    the store, else {@link currentSteps} of the band alone, stored (at most
 *    BAND_STEPS_MEMO_DEFAULTS.entriesPerBand per band, the oldest dropped).
 * 3. The two bands' steps merged and broadened by σ/η ({@link fastCurrent}).
 * The store belongs to the returned function alone (one per fitted hypothesis); nothing else
 * changes it.
 *
 * Example
 * -------
 * ```ts
 * const seeds = [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 }] as const;
 * const current = bandStepsMemo(seeds, 0.85, 4.5);
 * current([0.6, 0.1, 1, -2], [0.7, 0.82, 1]); // => [3.1e-27, 1.526e-19, 2.913e-19] (as unitCurrent)
 * current([0.6, 0.1, 1, -1.9], [0.7, 0.82, 1]); // the same steps, broadened by σ = 12.6 meV: no solve
 * ```
 */
export function bandStepsMemo(seeds: readonly LevelSeed[], eta: number, temperatureK: number): (p: ArrayLike<number>, biasV: ArrayLike<number>) => Float64Array {
  const stores = { cb: new Map<string, BandSteps>(), vb: new Map<string, BandSteps>() };
  const bandSteps = (model: DotModel, band: "cb" | "vb"): BandSteps => {
    const levels = model[band];
    if (!levels.length) return { baseA: 0, steps: [] };
    const key = `${levels.map((l) => `${l.energyEV}:${l.degeneracy}`).join(",")}|${model.chargingEnergyEV}|${model.tipRatePerS}`;
    const store = stores[band];
    const known = store.get(key);
    if (known) return known;
    const solved = currentSteps(band === "cb" ? { ...model, vb: [] } : { ...model, cb: [] });
    if (store.size >= BAND_STEPS_MEMO_DEFAULTS.entriesPerBand) store.delete(store.keys().next().value!);
    store.set(key, solved);
    return solved;
  };
  return (p, biasV) => {
    const model = parameterModel(p, seeds, eta, temperatureK);
    const cb = bandSteps(model, "cb");
    const vb = bandSteps(model, "vb");
    const steps = [...cb.steps, ...vb.steps].sort((a, b) => a.biasV - b.biasV);
    return fastCurrent({ baseA: cb.baseA + vb.baseA, steps }, biasV, 10 ** p[seeds.length + 2] / eta);
  };
}
