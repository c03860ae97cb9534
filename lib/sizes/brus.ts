/**
 * The optical gap of a spherical crystallite in the effective-mass approximation (Brus).
 */
import { checkPositive } from "../util/check.ts";
import type { Material } from "./materials.ts";
import { COULOMB_EV_NM, HBAR2_OVER_2ME_EV_NM2, RYDBERG_EV } from "./sizeConstants.ts";

/** The Brus optical gap and its terms, all in eV. */
export interface BrusGap {
  /** The optical (first-exciton) gap E, eV. */
  gapEV: number;
  /** Bulk band gap Eg, eV. */
  bulkGapEV: number;
  /** Confinement ħ²π²/(2R²)·(1/mₑ* + 1/m_h*), eV (positive). */
  confinementEV: number;
  /** Electron–hole Coulomb term 1.786·e²/(4πε₀εR), eV (positive; subtracted). */
  coulombEV: number;
  /** Correlation term 0.248·E*_Ry, eV (positive; subtracted). */
  correlationEV: number;
  /** Bulk exciton Rydberg E*_Ry = Ry·μ/ε², eV (μ the reduced mass in mₑ). */
  excitonRydbergEV: number;
}

/** Coefficients of the Brus expression (locked by test/sizes/defaults.test.ts). */
export const BRUS_DEFAULTS = Object.freeze({
  /** Coefficient of the electron–hole Coulomb term (Brus 1984). */
  coulombCoefficient: 1.786,
  /** Coefficient of the exciton Rydberg (Kayanuma 1988). */
  correlationCoefficient: 0.248,
});

/**
 * The optical gap of a spherical crystallite of radius R:
 * E = Eg + ħ²π²/(2R²)·(1/mₑ* + 1/m_h*) − 1.786·e²/(4πε₀·ε·R) − 0.248·E*_Ry.
 *
 * Parameters
 * ----------
 * radiusNM : number
 *     Crystallite radius R, nm (> 0).
 * material : Material
 *     Bulk gap, masses and static dielectric constant ({@link Material}).
 *
 * Returns
 * -------
 * BrusGap
 *     The gap and its terms ({@link BrusGap}).
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-positive` for a radius ≤ 0.
 *
 * Notes
 * -----
 * 1. Confinement: both carriers in their 1S level of an infinite spherical well.
 * 2. Coulomb: first-order electron–hole attraction in those states, 1.786·e²/(4πε₀εR).
 * 3. Correlation: 0.248 times the bulk exciton Rydberg E*_Ry = Ry·μ/ε², μ = mₑ·m_h/(mₑ + m_h).
 * 4. A comparison curve, not a fit: the simple model overestimates the gap of small crystallites
 *    (finite barriers and non-parabolic bands lower the confinement).
 *
 * References
 * ----------
 * L. E. Brus, J. Chem. Phys. 80, 4403 (1984); Y. Kayanuma, Phys. Rev. B 38, 9797 (1988) (the
 * 0.248·E*_Ry term).
 *
 * Example
 * -------
 * ```ts
 * brusGap(2, MATERIALS.CdSe).gapEV; // => 2.6329 (1.84 + 0.9320 − 0.1354 − 0.0038)
 * ```
 */
export function brusGap(radiusNM: number, material: Material): BrusGap {
  checkPositive("radiusNM", radiusNM);
  const { bandGapEV, electronMassE: me, holeMassE: mh, dielectricConstant: eps } = material;
  const confinementEV = (HBAR2_OVER_2ME_EV_NM2 * Math.PI ** 2 / radiusNM ** 2) * (1 / me + 1 / mh);
  const coulombEV = (BRUS_DEFAULTS.coulombCoefficient * COULOMB_EV_NM) / (eps * radiusNM);
  const mu = (me * mh) / (me + mh);
  const excitonRydbergEV = (RYDBERG_EV * mu) / (eps * eps);
  const correlationEV = BRUS_DEFAULTS.correlationCoefficient * excitonRydbergEV;
  return {
    gapEV: bandGapEV + confinementEV - coulombEV - correlationEV,
    bulkGapEV: bandGapEV, confinementEV, coulombEV, correlationEV, excitonRydbergEV,
  };
}
