/**
 * The bias-referred quantities as energies after voltage division.
 */
import type { SpectrumQuantities, SpectrumUncertainties } from "./quantities.ts";

/** The quantities as energies after voltage division, eV (null where the regime does not define them). */
export interface EnergyValues {
  gapEV: number | null;
  chargingEnergyEV: number | null;
  singleParticleGapEV: number | null;
  levelSpacingSPEV: number | null;
  levelSpacingPDEV: number | null;
  valenceSpacingsEV: number[];
}

/** The same quantities as energies after voltage division (eV), with the η used and 1σ uncertainties. */
export interface SpectrumEnergies extends EnergyValues {
  eta: number;
  /** Whether η came from the user (false: the default 1 was used and energies equal bias values). */
  etaGiven: boolean;
  uncertainties: EnergyValues;
}

/**
 * Convert bias-referred quantities to energies.
 *
 * Parameters
 * ----------
 * quantities : SpectrumQuantities
 *     Bias-referred values, V.
 * uncertainties : SpectrumUncertainties
 *     Their 1σ, V.
 * eta : number
 *     Voltage-division factor η in (0, 1]: eV of level shift per V of sample bias. Checked by the
 *     caller.
 * etaGiven : boolean
 *     Whether η came from the user (recorded as is).
 *
 * Returns
 * -------
 * SpectrumEnergies
 *     Every value and uncertainty multiplied by η, in eV; nulls kept.
 *
 * Notes
 * -----
 * 1. E = η·V: the share η of the bias drops across the tip junction and shifts the levels
 *    relative to the tip's Fermi level. η is taken as exact (its own uncertainty is not
 *    propagated).
 *
 * Example
 * -------
 * ```ts
 * const q = { gapV: 1.5, chargingEnergyV: 0.125, singleParticleGapV: 1.375, levelSpacingSPV: 0.375,
 *   levelSpacingPDV: null, valenceSpacingsV: [] };
 * spectrumEnergies(q, { ...q, gapV: 0.001 }, 0.8, true).chargingEnergyEV;  // => 0.1
 * ```
 */
export function spectrumEnergies(quantities: SpectrumQuantities, uncertainties: SpectrumUncertainties, eta: number, etaGiven: boolean): SpectrumEnergies {
  const q = quantities, u = uncertainties;
  const scale = (v: number | null) => (v === null ? null : v * eta);
  return {
    eta,
    etaGiven,
    gapEV: scale(q.gapV),
    chargingEnergyEV: scale(q.chargingEnergyV),
    singleParticleGapEV: scale(q.singleParticleGapV),
    levelSpacingSPEV: scale(q.levelSpacingSPV),
    levelSpacingPDEV: scale(q.levelSpacingPDV),
    valenceSpacingsEV: q.valenceSpacingsV.map((v) => v * eta),
    uncertainties: {
      gapEV: scale(u.gapV),
      chargingEnergyEV: scale(u.chargingEnergyV),
      singleParticleGapEV: scale(u.singleParticleGapV),
      levelSpacingSPEV: scale(u.levelSpacingSPV),
      levelSpacingPDEV: scale(u.levelSpacingPDV),
      valenceSpacingsEV: u.valenceSpacingsV.map((v) => v * eta),
    },
  };
}
