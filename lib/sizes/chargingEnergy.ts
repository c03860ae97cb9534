/**
 * The charging (addition) energy of a sphere in a uniform dielectric: e²/(4πε₀·ε·R), plus an
 * optional constant.
 */
import { checkFinite, checkPositive } from "../util/check.ts";
import { COULOMB_EV_NM } from "./sizeConstants.ts";
import { VACUUM_PERMITTIVITY_F_PER_M } from "../util/constants.ts";

/** Options of {@link chargingEnergyEV}. */
export interface ChargingEnergyOptions {
  /** Effective relative dielectric constant of the surroundings ε_eff (≥ 1 in practice). Default 1. */
  dielectricConstant?: number;
  /** Constant added to the 1/R term, eV (the fitted intercept c₀). Default 0. */
  offsetEV?: number;
}

/** Defaults of {@link chargingEnergyEV} (locked by test/sizes/defaults.test.ts). */
export const CHARGING_ENERGY_DEFAULTS = Object.freeze({ dielectricConstant: 1, offsetEV: 0 });

/**
 * The self-capacitance of a sphere of radius R in a medium of relative permittivity ε:
 * C = 4πε₀·ε·R, in farads.
 *
 * Parameters
 * ----------
 * radiusNM : number
 *     Radius, nm (> 0).
 * dielectricConstant : number
 *     ε, the relative permittivity around the sphere (dimensionless, > 0).
 *
 * Returns
 * -------
 * number
 *     C in F.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-positive` for a radius or dielectric constant ≤ 0.
 *
 * Example
 * -------
 * ```ts
 * sphereCapacitanceF(2, 1); // => 2.2253e-19 (0.2225 aF)
 * ```
 */
export function sphereCapacitanceF(radiusNM: number, dielectricConstant: number): number {
  checkPositive("radiusNM", radiusNM);
  checkPositive("dielectricConstant", dielectricConstant);
  return 4 * Math.PI * VACUUM_PERMITTIVITY_F_PER_M * dielectricConstant * radiusNM * 1e-9;
}

/**
 * The addition energy of a sphere, Ec = e²/C = e²/(4πε₀·ε_eff·R) + c₀, eV.
 *
 * Parameters
 * ----------
 * radiusNM : number
 *     Radius R, nm (> 0).
 * options : ChargingEnergyOptions, optional
 *     ε_eff and c₀ ({@link ChargingEnergyOptions}); default {}: each field at its documented default.
 *
 * Returns
 * -------
 * number
 *     Ec, eV.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-positive` for a radius or dielectric constant ≤ 0, `options/not-finite` for an
 *     offset that is not finite.
 *
 * Notes
 * -----
 * 1. C = 4πε₀ε_eff·R is the self-capacitance of an isolated sphere (closed form); the addition
 *    energy of one more electron is e²/C (this project's convention: the spacing of successive
 *    charging peaks, not e²/2C).
 * 2. c₀ absorbs what the 1/R law misses (the image charges of tip and substrate, the
 *    polarisation of the ligand shell); fitted Ec(R) gives ε_eff and c₀.
 *
 * References
 * ----------
 * any electrostatics text, e.g. J. D. Jackson, Classical Electrodynamics, 3rd ed. (Wiley, 1999), §1.11
 * (capacitance of a sphere).
 *
 * Example
 * -------
 * ```ts
 * chargingEnergyEV(2); // => 0.71998 (e²/(4πε₀·2 nm))
 * ```
 */
export function chargingEnergyEV(radiusNM: number, options: ChargingEnergyOptions = {}): number {
  checkPositive("radiusNM", radiusNM);
  const eps = checkPositive("dielectricConstant", options.dielectricConstant ?? CHARGING_ENERGY_DEFAULTS.dielectricConstant);
  const c0 = checkFinite("offsetEV", options.offsetEV ?? CHARGING_ENERGY_DEFAULTS.offsetEV);
  return COULOMB_EV_NM / (eps * radiusNM) + c0;
}
