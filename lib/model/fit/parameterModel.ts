/**
 * The parameter vector of the model fit and the dot model it stands for.
 */
import type { DotModel } from "../bandCurrent.ts";
import type { Level } from "../scenario.ts";
import type { LevelSeed } from "./levelsToFit.ts";

/** Where each parameter sits in the vector of a fit with a given number of levels. */
export interface ParameterIndex {
  /** Ec, eV. */
  chargingEnergy: number;
  /** log₁₀(Γtip/Γsub). */
  logRateRatio: number;
  /** log₁₀ σ, σ the Gaussian level broadening in eV. */
  logBroadening: number;
  /** Γsub, 1/s (the rate scale: the model current at Γsub = 1/s times this). */
  rateScale: number;
  /** Current offset, A. */
  offset: number;
  /** Background b1 in I_bg = b1·V + b3·V³, S. */
  backgroundLinear: number;
  /** Background b3, A/V³. */
  backgroundCubic: number;
}

/**
 * The layout of the parameter vector: the nonlinear parameters that Levenberg–Marquardt adjusts,
 * then the linear ones solved inside every model evaluation.
 *
 * Parameters
 * ----------
 * levelCount : number
 *     Number of fitted levels L (entries 0 … L − 1 are the level energies |ε_j| in eV, each
 *     measured from the Fermi level at zero bias on its band's side).
 *
 * Returns
 * -------
 * ParameterIndex
 *     The index of each further parameter: Ec (L), log₁₀ r (L + 1), log₁₀ σ (L + 2), then Γsub
 *     (L + 3), offset (L + 4), b1 (L + 5), b3 (L + 6).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The first L + 3 entries are nonlinear (they move, broaden or reshape the steps); the last 4
 *    enter the current linearly (variable projection, {@link projectLinear}).
 * 2. Logarithms keep the rate ratio and the broadening positive and their steps relative.
 *
 * Example
 * -------
 * ```ts
 * parameterIndex(3).logRateRatio;   // => 4
 * parameterIndex(3).backgroundCubic; // => 9
 * ```
 */
export function parameterIndex(levelCount: number): ParameterIndex {
  const nl = levelCount;
  return {
    chargingEnergy: nl,
    logRateRatio: nl + 1,
    logBroadening: nl + 2,
    rateScale: nl + 3,
    offset: nl + 4,
    backgroundLinear: nl + 5,
    backgroundCubic: nl + 6,
  };
}

/**
 * The dot model a parameter vector stands for, at unit rate scale (Γsub = 1/s).
 *
 * Parameters
 * ----------
 * p : ArrayLike<number>
 *     The nonlinear parameters, laid out as {@link parameterIndex} says: |ε_j| per level (eV),
 *     Ec (eV), log₁₀(Γtip/Γsub), log₁₀ σ (σ in eV; not used here).
 * seeds : readonly LevelSeed[]
 *     The levels being fitted (band and degeneracy), in the order of p.
 * eta : number
 *     Voltage-division factor η (held fixed).
 * temperatureK : number
 *     Temperature in K.
 *
 * Returns
 * -------
 * DotModel
 *     CB levels at +|ε| sorted ascending, VB levels at −|ε| sorted descending (the ladders want
 *     each band in filling order), Ec, η, Γtip = r/s, Γsub = 1/s, Γrelax = 1000·max(r, 1)/s, T.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Level j goes to its seed's band with energy +p[j] (CB) or −p[j] (VB).
 * 2. Sort each band into filling order (levels may cross during the fit only within their
 *    bounds, which keep them apart; the sort makes any order valid).
 * 3. Rates at unit scale: the current is proportional to Γsub at a fixed ratio, so the scale is
 *    a linear parameter solved later; relaxation 1000 × the faster rate (fast relaxation).
 *
 * Example
 * -------
 * ```ts
 * const seeds = [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 }] as const;
 * const m = parameterModel([0.6, 0.1, 1, -2], seeds, 0.85, 4.5);
 * [m.cb[0].energyEV, m.chargingEnergyEV, m.tipRatePerS, m.relaxationRatePerS];
 * // => [0.6, 0.1, 10, 10000]
 * ```
 */
export function parameterModel(p: ArrayLike<number>, seeds: readonly LevelSeed[], eta: number, temperatureK: number): DotModel {
  const nl = seeds.length;
  const cb: Level[] = [], vb: Level[] = [];
  seeds.forEach((s, j) => (s.band === "CB" ? cb : vb).push({ energyEV: s.band === "CB" ? p[j] : -p[j], degeneracy: s.degeneracy }));
  // The ladder code wants each band in filling order.
  cb.sort((a, b) => a.energyEV - b.energyEV);
  vb.sort((a, b) => b.energyEV - a.energyEV);
  const r = 10 ** p[nl + 1];
  return { cb, vb, chargingEnergyEV: p[nl], eta, tipRatePerS: r, substrateRatePerS: 1, relaxationRatePerS: 1000 * Math.max(r, 1), temperatureK };
}
