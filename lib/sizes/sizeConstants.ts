/**
 * Combinations of CODATA 2018 constants in the units of the size models (energies in eV,
 * lengths in nm), derived from lib/util/constants.ts.
 */
import { ELECTRON_MASS_KG, ELEMENTARY_CHARGE_C, HBAR_J_S, PLANCK_J_S, VACUUM_PERMITTIVITY_F_PER_M } from "../util/constants.ts";

/** ħ²/(2mₑ) in eV·nm² (≈ 0.0380998): the kinetic energy of a free electron with k = 1/nm. */
export const HBAR2_OVER_2ME_EV_NM2 = (HBAR_J_S * HBAR_J_S) / (2 * ELECTRON_MASS_KG) / ELEMENTARY_CHARGE_C * 1e18;

/** e²/(4πε₀) in eV·nm (≈ 1.439965): the Coulomb energy of two elementary charges 1 nm apart in vacuum. */
export const COULOMB_EV_NM = ELEMENTARY_CHARGE_C / (4 * Math.PI * VACUUM_PERMITTIVITY_F_PER_M) * 1e9;

/** Rydberg energy mₑe⁴/(8ε₀²h²) in eV (≈ 13.605693). */
export const RYDBERG_EV =
  (ELECTRON_MASS_KG * ELEMENTARY_CHARGE_C ** 3) / (8 * VACUUM_PERMITTIVITY_F_PER_M ** 2 * PLANCK_J_S ** 2);

/** Planck constant × speed of light in eV·nm (≈ 1239.842): photon energy ↔ wavelength. */
export const HC_EV_NM = (PLANCK_J_S * 299792458) / ELEMENTARY_CHARGE_C * 1e9;
