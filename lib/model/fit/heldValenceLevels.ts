/**
 * The VB level a CB-side fit holds in its model: at low η the first hole's step through the
 * substrate junction falls among the CB steps, and a model of the CB levels alone cannot describe it.
 */
import type { LevelSeed } from "./levelsToFit.ts";
import type { heldHoleEntry } from "./cbSideEnd.ts";
import type { crossedCbSide } from "./blindCbSide.ts";
import { shellValenceReading } from "./shellValenceReading.ts";

/**
 * The VB level a CB-side fit holds: the first hole's entry, where its step through the substrate
 * junction falls on the CB side.
 *
 * Parameters
 * ----------
 * seeds : readonly LevelSeed[]
 *     A hypothesis' levels (its first VB level gives the degeneracy; 2 without one).
 * holeEntryV : number | null
 *     The peak of the first hole's entry through the tip junction, V < 0 ({@link heldHoleEntry}),
 *     or null.
 * eta : number
 *     Voltage-division factor η, 0 < η ≤ 1.
 * topV : number
 *     The highest bias of the CB side, V.
 *
 * Returns
 * -------
 * LevelSeed[]
 *     One VB seed ("v1 (held)", first peak holeEntryV, no hole before it) when
 *     η·|holeEntryV|/(1 − η) ≤ topV; none otherwise, without a peak, or at η = 1.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A fraction η of the bias drops across the tip junction, 1 − η across the substrate
 *    junction. The first hole enters through the tip at V₁ < 0, where η·|V₁| is its addition
 *    energy E; at positive bias the same addition opens through the substrate junction at
 *    V = E/(1 − η) = η·|V₁|/(1 − η) (the hole ladder's substrate crossing −E/(1 − η) of
 *    {@link ladderCrossings}, mirrored to sample bias).
 * 2. At η = 0.6 and V₁ = −1.5 V that is 2.25 V, among the CB steps; at η ≥ 0.65 and the usual
 *    windows it lies beyond the curve and nothing is held.
 * 3. Only the first entry: the CB side ends below the next one ({@link cbSideEndV} with one
 *    crossing held), whose reading (the first level's second hole, or a new level) the peaks
 *    do not settle.
 *
 * References
 * ----------
 * E. P. A. M. Bakkers, Z. Hens, A. Zunger, A. Franceschetti, L. P. Kouwenhoven, L. Gurevich and
 * D. Vanmaekelbergh, Nano Lett. 1, 551 (2001) (double-barrier tunnelling junction, voltage division;
 * from memory).
 *
 * Example
 * -------
 * ```ts
 * heldValenceLevels([{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 1.2, before: 0 }], -1.5, 0.6, 2.8);
 * // => [{ band: "VB", label: "v1 (held)", degeneracy: 2, firstPeakV: -1.5, before: 0 }] (crossing at 2.25 V)
 * heldValenceLevels([], -1.5, 0.6, 2.2); // => [] (2.25 V lies beyond the CB side)
 * ```
 */
export function heldValenceLevels(seeds: readonly LevelSeed[], holeEntryV: number | null, eta: number, topV: number): LevelSeed[] {
  if (!(eta < 1) || holeEntryV === null || (eta * Math.abs(holeEntryV)) / (1 - eta) > topV) return [];
  const degeneracy = seeds.find((s) => s.band === "VB")?.degeneracy ?? 2;
  return [{ band: "VB", label: "v1 (held)", degeneracy, firstPeakV: holeEntryV, before: 0 }];
}

/**
 * The VB levels a CB-side fit holds where its side runs to the curve's end across their crossings
 * ({@link crossedCbSide}): the VB peaks read as a doublet and a level of four.
 *
 * Parameters
 * ----------
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V, negative; second-junction resonances left out), in any order.
 * chargingEnergyV : number
 *     Ec/η in V: the hypothesis' starting Ec over η (the spacing of a level's charging peaks).
 * eta : number
 *     Voltage-division factor η, 0 < η ≤ 1.
 * topV : number
 *     The highest bias of the CB side, V.
 *
 * Returns
 * -------
 * LevelSeed[]
 *     The levels of {@link shellValenceReading} (each entered from the empty dot, `before` 0),
 *     labelled "v1 (held)", "v2 (held)", whose first crossing η·|V₁|/(1 − η) lies at or below topV;
 *     none at η = 1 or without peaks.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. On a side that runs to the curve's end every VB level whose crossing lies in the window
 *    puts its steps there (g of them, spaced by Ec/(1 − η)), not only the first hole's: the first
 *    level alone ({@link heldValenceLevels}) leaves the rest to be fitted as CB levels.
 * 2. Which VB reading: the rules' grouping between the regimes reads resonances and single
 *    levels among the VB peaks; the shell reading (the degeneracies the model's VB holds) is the
 *    same for every grouping. Each held level keeps the addition energy its first peak gives as
 *    Ec moves ({@link withHeldLevels}); the whole-curve fits then fit every VB reading freely.
 * 3. Measured on the low-η mix with the comparison (its intermediate draws 24, 48, 70 and 121,
 *    seeds 1–200): the CB-side groupings otherwise settled at reduced χ² 8–43 with Ec up to 3.5
 *    times the simulated one; held, the right grouping reaches the noise.
 *
 * Example
 * -------
 * ```ts
 * heldShellLevels([-0.876, -0.969, -1.105, -1.189, -1.29, -1.365], 0.0853, 0.6, 2).map((s) => `${s.label} ${s.degeneracy}@${s.firstPeakV}`);
 * // => ["v1 (held) 2@-0.876", "v2 (held) 4@-1.105"] (crossings 1.31 and 1.66 V)
 * ```
 */
export function heldShellLevels(vbPeaksV: readonly number[], chargingEnergyV: number, eta: number, topV: number): LevelSeed[] {
  if (!(eta < 1)) return [];
  return shellValenceReading(vbPeaksV, chargingEnergyV)
    .filter((s) => (eta * Math.abs(s.firstPeakV)) / (1 - eta) <= topV)
    .map((s) => ({ ...s, label: `${s.label} (held)` }));
}

/**
 * A parameter vector with the held VB levels' energies put in after the fitted levels.
 *
 * Parameters
 * ----------
 * p : ArrayLike<number>
 *     The fitted nonlinear parameters: |ε| of the `fitted` levels (eV), then Ec (eV),
 *     log₁₀ Γtip/Γsub and log₁₀ σ ({@link parameterIndex}).
 * fitted : number
 *     The number of fitted levels.
 * held : readonly LevelSeed[]
 *     The held levels ({@link heldValenceLevels}).
 * eta : number
 *     Voltage-division factor η.
 *
 * Returns
 * -------
 * number[]
 *     [|ε| of the fitted levels, |ε_j| = η·|V₁,j| − Ec·(N_before,j + ½) of each held level, Ec,
 *     log₁₀ Γtip/Γsub, log₁₀ σ]: the layout of {@link parameterIndex} for the fitted and the held
 *     levels together.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A held level keeps its first addition energy ε + Ec·(N_before + ½) = η·|V₁| (the tip-side
 *    step where its first peak was measured) as Ec moves: the same start as {@link startingValues}
 *    at the current Ec, so its substrate-junction step stays at η·|V₁|/(1 − η).
 *
 * Example
 * -------
 * ```ts
 * withHeldLevels([0.6, 0.1, 0, -2], 1, [{ band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.5, before: 0 }], 0.6);
 * // => [0.6, 0.85, 0.1, 0, -2] (0.6·1.5 − 0.1/2)
 * ```
 */
export function withHeldLevels(p: ArrayLike<number>, fitted: number, held: readonly LevelSeed[], eta: number): number[] {
  const all = Array.from(p);
  if (!held.length) return all;
  const ec = all[fitted];
  return [...all.slice(0, fitted), ...held.map((s) => eta * Math.abs(s.firstPeakV) - ec * (s.before + 0.5)), ...all.slice(fitted)];
}
