/**
 * The empirical sizing curve of CdSe crystallites (diameter from the first-exciton absorption
 * wavelength) and the deviation of the Brus optical gap from it.
 */
import { checkPositive, checkRange } from "../util/check.ts";
import { bracketRoot } from "./bracketRoot.ts";
import { brusGap } from "./brus.ts";
import { MATERIALS, type Material } from "./materials.ts";
import { HC_EV_NM } from "./sizeConstants.ts";

/**
 * Coefficients of D(λ) = c4·λ⁴ + c3·λ³ + c2·λ² + c1·λ + c0 (D and λ in nm), highest power
 * first. W. W. Yu, L. Qu, W. Guo and X. Peng, Chem. Mater. 15, 2854 (2003), eq. for CdSe —
 * from memory, not re-read.
 */
export const CDSE_SIZING_COEFFICIENTS = Object.freeze([1.6122e-9, -2.6575e-6, 1.6242e-3, -0.4277, 41.57]);

/** Wavelength range (nm) over which the polynomial is inverted: about 1.5–10 nm in diameter. */
const WAVELENGTH_RANGE_NM = [400, 680] as const;

/**
 * The CdSe diameter (nm) for a first-exciton absorption peak at `wavelengthNM`, from the
 * empirical polynomial of Yu et al. ({@link CDSE_SIZING_COEFFICIENTS}).
 *
 * Parameters
 * ----------
 * wavelengthNM : number
 *     First-exciton absorption wavelength, nm (400–680).
 *
 * Returns
 * -------
 * number
 *     Diameter, nm.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/out-of-range` for a wavelength outside 400–680 nm, the range of the sizing curve.
 *
 * Example
 * -------
 * ```ts
 * cdseDiameterNM(600); // => 4.583
 * ```
 */
export function cdseDiameterNM(wavelengthNM: number): number {
  checkRange("wavelengthNM", wavelengthNM, WAVELENGTH_RANGE_NM[0], WAVELENGTH_RANGE_NM[1]);
  return CDSE_SIZING_COEFFICIENTS.reduce((acc, c) => acc * wavelengthNM + c, 0);
}

/**
 * The first-exciton wavelength (nm) of a CdSe crystallite of diameter D: the inverse of
 * {@link cdseDiameterNM}, which increases monotonically over 400–680 nm, found with a bracketed
 * root finder.
 *
 * Parameters
 * ----------
 * diameterNM : number
 *     Diameter, nm (within the curve's range, about 1.55–10.9 nm).
 *
 * Returns
 * -------
 * number
 *     Wavelength, nm.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/out-of-range` outside the curve's range.
 *
 * Example
 * -------
 * ```ts
 * cdseFirstExcitonWavelengthNM(4); // => 585.3
 * ```
 */
export function cdseFirstExcitonWavelengthNM(diameterNM: number): number {
  checkPositive("diameterNM", diameterNM);
  const [lo, hi] = WAVELENGTH_RANGE_NM;
  const dLo = cdseDiameterNM(lo), dHi = cdseDiameterNM(hi);
  if (diameterNM < dLo || diameterNM > dHi) {
    checkRange("diameterNM (CdSe sizing curve)", diameterNM, Number(dLo.toFixed(2)), Number(dHi.toFixed(2)));
  }
  return bracketRoot((l) => cdseDiameterNM(l) - diameterNM, lo, hi);
}

/** One row of {@link brusVersusCdSeSizing}. */
export interface BrusDeviationRow {
  /** Diameter, nm. */
  diameterNM: number;
  /** First-exciton wavelength from the empirical curve, nm. */
  wavelengthNM: number;
  /** Empirical first-exciton energy hc/λ, eV. */
  empiricalEV: number;
  /** Brus optical gap at R = D/2, eV. */
  brusEV: number;
  /** brusEV − empiricalEV, eV (positive: the model overestimates). */
  deviationEV: number;
}

/**
 * The Brus optical gap ({@link brusGap}) beside the empirical CdSe sizing curve, per diameter.
 *
 * Parameters
 * ----------
 * diametersNM : readonly number[]
 *     Diameters, nm (each within the sizing curve's range).
 * material : Material, optional
 *     The parameters for the Brus model. Default: the built-in CdSe.
 *
 * Returns
 * -------
 * BrusDeviationRow[]
 *     One row per diameter.
 *
 * Example
 * -------
 * ```ts
 * brusVersusCdSeSizing([2])[0].deviationEV; // => 2.58 (eV; 5.29 against 2.72)
 * ```
 */
export function brusVersusCdSeSizing(diametersNM: readonly number[], material: Material = MATERIALS.CdSe): BrusDeviationRow[] {
  return diametersNM.map((diameterNM) => {
    const wavelengthNM = cdseFirstExcitonWavelengthNM(diameterNM);
    const empiricalEV = HC_EV_NM / wavelengthNM;
    const brusEV = brusGap(diameterNM / 2, material).gapEV;
    return { diameterNM, wavelengthNM, empiricalEV, brusEV, deviationEV: brusEV - empiricalEV };
  });
}
