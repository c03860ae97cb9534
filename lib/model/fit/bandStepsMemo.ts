/**
 * The model current of the fit at unit rate scale, with each band's steps remembered: a change of
 * one band's levels (or of the broadening alone) leaves the other band's master equation as it
 * was, so finite differences do not solve it again.
 */
import { currentSteps, fastCurrent, type CurrentStep, type DotModel } from "../bandCurrent.ts";
import { buildLadder, ladderStructureKey, ladderWithEnergies, ladderWorkspace, type Ladder, type LadderWorkspace } from "../ladder.ts";
import type { Level } from "../scenario.ts";
import { BOLTZMANN_EV_PER_K } from "../../util/constants.ts";
import { parameterModel } from "./parameterModel.ts";
import type { LevelSeed } from "./levelsToFit.ts";
import { ladderSolveWork } from "./solveWork.ts";

/** Size of {@link bandStepsMemo}'s store (locked by test/model/fit/bandStepsMemo.test.ts). */
export const BAND_STEPS_MEMO_DEFAULTS = Object.freeze({
  /** Most band solutions kept per band; the oldest goes first. */
  entriesPerBand: 256,
  /** V added to the reach of the broadened steps (9σ) either side of the data when a band's steps are solved over the data's bias range only. */
  windowMarginV: 0.05,
  /** Most zero-temperature plateau currents kept per ladder structure (the store is emptied when full). */
  plateausPerStructure: 20000,
});

/** One band's steps over a window of sample bias (V): steps outside it are in baseA or left out. */
type BandSteps = { baseA: number; steps: CurrentStep[]; fromV: number; toV: number };

/**
 * The solutions {@link bandStepsMemo} keeps: each band's steps by its parameters (and η, T),
 * and each ladder structure with its zero-temperature plateaus; and the master-equation work
 * done to find them. One store may serve the memos of several sets of levels (the hypotheses of
 * one fit): a band solution depends only on the band's own levels, Ec, Γtip/Γsub, η and T.
 */
export interface BandStepsStore {
  bands: { cb: Map<string, BandSteps>; vb: Map<string, BandSteps> };
  structures: Map<string, { ladder: Ladder; plateaus: Map<string, number>; workspace: LadderWorkspace; solveWork: number }>;
  /**
   * The work of every memo on this store so far: zero-temperature plateaus solved (master
   * equations; a plateau found stored costs none) and their elimination steps summed
   * ({@link ladderSolveWork} of the ladder per solve). The fit's work budget counts it.
   */
  work: { solves: number; eliminationSteps: number };
}

/**
 * An empty {@link BandStepsStore}.
 *
 * Returns
 * -------
 * BandStepsStore
 *     Empty maps and no work done; {@link bandStepsMemo} fills them and counts its solves.
 *
 * Example
 * -------
 * ```ts
 * const store = bandStepsStore();
 * const a = bandStepsMemo(seedsA, 0.85, 4.5, store), b = bandStepsMemo(seedsB, 0.85, 4.5, store);
 * // b finds the CB solutions a stored when the two share their CB levels.
 * ```
 */
export function bandStepsStore(): BandStepsStore {
  return { bands: { cb: new Map(), vb: new Map() }, structures: new Map(), work: { solves: 0, eliminationSteps: 0 } };
}

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
 * store : BandStepsStore, optional
 *     Where the solutions are kept; pass one store to the memos of several sets of levels to share
 *     them. Default: a new store ({@link bandStepsStore}).
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
 * 2. The reach of the broadened steps, R = 9·√(σ_b² + σ_T²) + BAND_STEPS_MEMO_DEFAULTS.windowMarginV
 *    (σ_b = σ/η; σ_T = π·kB·T/(√3·e·min(η, 1 − η)), the widest thermal step): a step farther than
 *    R from every data point adds exactly 0 or its full height there ({@link fastCurrent}).
 * 3. For each band, the key: its level energies and degeneracies, Ec and Γtip/Γsub; its steps from
 *    the store when they cover the data's bias range ± R, else {@link currentSteps} of the band
 *    alone over that range ± 2R (the substrate-junction crossings far outside and the highest
 *    charge states are not solved), stored (at most BAND_STEPS_MEMO_DEFAULTS.entriesPerBand per
 *    band, the oldest dropped). The band's ladder is built once per structure (degeneracies and
 *    order, {@link ladderStructureKey}) and given new energies ({@link ladderWithEnergies}); its
 *    zero-temperature plateaus are kept by {@link zeroTemperaturePattern} (currentSteps'
 *    plateauStore, at most BAND_STEPS_MEMO_DEFAULTS.plateausPerStructure), so that moving a level
 *    or Ec without reordering any crossing solves no master equation at all; the solves of one
 *    structure share one set of buffers ({@link ladderWorkspace}).
 * 4. The two bands' steps merged and broadened by σ/η ({@link fastCurrent}).
 * 5. Every plateau solved (not found in the plateau store) is counted in store.work, with its
 *    ladder's elimination steps ({@link ladderSolveWork}, computed once per structure).
 * Nothing outside the memos given the store changes it.
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
export function bandStepsMemo(
  seeds: readonly LevelSeed[],
  eta: number,
  temperatureK: number,
  store: BandStepsStore = bandStepsStore(),
): (p: ArrayLike<number>, biasV: ArrayLike<number>) => Float64Array {
  const { structures, work } = store;
  const stores = store.bands;
  const ladderOf = (levels: readonly Level[], chargingEnergyEV: number) => {
    const key = ladderStructureKey(levels);
    const known = structures.get(key);
    if (known) {
      if (known.plateaus.size > BAND_STEPS_MEMO_DEFAULTS.plateausPerStructure) known.plateaus.clear();
      return { ladder: ladderWithEnergies(known.ladder, levels, chargingEnergyEV), plateaus: known.plateaus, workspace: known.workspace, solveWork: known.solveWork };
    }
    const ladder = buildLadder(levels, chargingEnergyEV);
    const built = { ladder, plateaus: new Map<string, number>(), workspace: ladderWorkspace(ladder), solveWork: ladderSolveWork(ladder) };
    structures.set(key, built);
    return built;
  };
  // Each band's last key and the numbers it was made of: an evaluation that leaves a band's
  // parameters as they were (most columns of a finite-difference Jacobian) reuses its string.
  const lastKey = { cb: { numbers: [] as number[], key: "" }, vb: { numbers: [] as number[], key: "" } };
  const keyOf = (model: DotModel, band: "cb" | "vb"): string => {
    const levels = model[band];
    const last = lastKey[band];
    const numbers = last.numbers;
    let same = numbers.length === 2 * levels.length + 2 && numbers[0] === model.chargingEnergyEV && numbers[1] === model.tipRatePerS;
    for (let j = 0; same && j < levels.length; j++) same = numbers[2 + 2 * j] === levels[j].energyEV && numbers[3 + 2 * j] === levels[j].degeneracy;
    if (same) return last.key;
    last.numbers = [model.chargingEnergyEV, model.tipRatePerS, ...levels.flatMap((l) => [l.energyEV, l.degeneracy])];
    last.key = `${levels.map((l) => `${l.energyEV}:${l.degeneracy}`).join(",")}|${model.chargingEnergyEV}|${model.tipRatePerS}|${eta}|${temperatureK}`;
    return last.key;
  };
  const bandSteps = (model: DotModel, band: "cb" | "vb", fromV: number, toV: number, reachV: number): BandSteps => {
    const levels = model[band];
    if (!levels.length) return { baseA: 0, steps: [], fromV: -Infinity, toV: Infinity };
    const key = keyOf(model, band);
    const store = stores[band];
    const known = store.get(key);
    if (known && known.fromV <= fromV && known.toV >= toV) return known;
    // Solved with twice the reach needed, so that a broader σ later finds it stored.
    const wide = { fromV: fromV - reachV, toV: toV + reachV };
    const alone = band === "cb" ? { ...model, vb: [] } : { ...model, cb: [] };
    // The hole ladder is the mirrored one (bandLadders).
    const own = ladderOf(band === "cb" ? levels : levels.map((l) => ({ energyEV: -l.energyEV, degeneracy: l.degeneracy })), model.chargingEnergyEV);
    const ladders = band === "cb" ? { cb: own.ladder, vb: null } : { cb: null, vb: own.ladder };
    const storedBefore = own.plateaus.size;
    const solved = { ...currentSteps(alone, ladders, { ...wide, plateauStore: { cb: own.plateaus, vb: own.plateaus }, workspaces: { [band]: own.workspace } }), ...wide };
    // Each plateau not found stored was solved once and stored (currentSteps' plateauStore).
    const solves = own.plateaus.size - storedBefore;
    work.solves += solves;
    work.eliminationSteps += solves * own.solveWork;
    if (known) store.delete(key);
    else if (store.size >= BAND_STEPS_MEMO_DEFAULTS.entriesPerBand) store.delete(store.keys().next().value!);
    store.set(key, solved);
    return solved;
  };
  let rangeOf: ArrayLike<number> | null = null;
  let lowV = 0, highV = 0;
  return (p, biasV) => {
    if (biasV !== rangeOf) {
      rangeOf = biasV;
      lowV = Infinity;
      highV = -Infinity;
      for (let i = 0; i < biasV.length; i++) {
        lowV = Math.min(lowV, biasV[i]);
        highV = Math.max(highV, biasV[i]);
      }
    }
    const model = parameterModel(p, seeds, eta, temperatureK);
    const broadeningV = 10 ** p[seeds.length + 2] / eta;
    // The steps that reach the data: within 9σ of it, σ² = σ_b² + σ_T² (fastCurrent), with a
    // margin; steps farther out add exactly 0 or their full height there.
    const thermalSigmaV = ((Math.PI / Math.sqrt(3)) * BOLTZMANN_EV_PER_K * temperatureK) / Math.min(eta, 1 - eta || 1);
    const reachV = 9 * Math.sqrt(broadeningV * broadeningV + thermalSigmaV * thermalSigmaV) + BAND_STEPS_MEMO_DEFAULTS.windowMarginV;
    const fromV = lowV - reachV, toV = highV + reachV;
    const cb = bandSteps(model, "cb", fromV, toV, reachV);
    const vb = bandSteps(model, "vb", fromV, toV, reachV);
    return fastCurrent({ baseA: cb.baseA + vb.baseA, steps: mergeByBias(cb.steps, vb.steps) }, biasV, broadeningV);
  };
}

/**
 * Two lists of steps, each sorted by bias, as one sorted list: what a stable sort of a followed by
 * b gives (on equal biases, a's steps first). A list alone is returned as it is.
 */
function mergeByBias(a: readonly CurrentStep[], b: readonly CurrentStep[]): CurrentStep[] {
  if (!b.length) return a as CurrentStep[];
  if (!a.length) return b as CurrentStep[];
  const out = new Array<CurrentStep>(a.length + b.length);
  let i = 0, j = 0, k = 0;
  while (i < a.length && j < b.length) out[k++] = b[j].biasV < a[i].biasV ? b[j++] : a[i++];
  while (i < a.length) out[k++] = a[i++];
  while (j < b.length) out[k++] = b[j++];
  return out;
}
