/**
 * Physical constants, CODATA 2018 (SI). e, kB and h are exact by definition of the SI since 2019;
 * ħ = h/2π; mₑ and ε₀ are measured values. Checked against mathjs's physical constants in
 * test/util/constants.test.ts.
 *
 * Reference: E. Tiesinga et al., "CODATA recommended values of the fundamental physical constants:
 * 2018", Rev. Mod. Phys. 93, 025010 (2021).
 */

/** Elementary charge, C (exact). */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Boltzmann constant, J/K (exact). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Boltzmann constant in eV/K (exact ratio kB/e). */
export const BOLTZMANN_EV_PER_K = BOLTZMANN_J_PER_K / ELEMENTARY_CHARGE_C;
/** Planck constant, J·s (exact). */
export const PLANCK_J_S = 6.62607015e-34;
/** Reduced Planck constant ħ = h/2π, J·s. */
export const HBAR_J_S = PLANCK_J_S / (2 * Math.PI);
/** Electron mass, kg. */
export const ELECTRON_MASS_KG = 9.1093837015e-31;
/** Vacuum electric permittivity ε₀, F/m. */
export const VACUUM_PERMITTIVITY_F_PER_M = 8.8541878128e-12;

/**
 * FWHM of the derivative of the Fermi function, in units of kB·T: 2·ln(3 + 2√2) = 3.5255…
 * (closed form: −df/dE = sech²(E/2kT)/4kT, half maximum where cosh(E/2kT) = √2).
 */
export const FERMI_DERIVATIVE_FWHM_KT = 2 * Math.log(3 + 2 * Math.SQRT2);

/** FWHM/σ of a Gaussian, 2√(2 ln 2). */
export const GAUSSIAN_FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);

/**
 * Area of a Gaussian over its height × FWHM: √(2π)/(2√(2 ln 2)) ≈ 1.0645 (closed form), so that a
 * conductance peak of prominence P (S) and FWHM w (V) carries a current step P·w·this (A).
 */
export const GAUSSIAN_AREA_PER_HEIGHT_FWHM = Math.sqrt(2 * Math.PI) / GAUSSIAN_FWHM_PER_SIGMA;
