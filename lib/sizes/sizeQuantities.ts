/**
 * The per-dot energies that the size models are fitted to.
 */

/** The size-series quantities, eV each (see {@link SizeQuantity}). */
export const SIZE_QUANTITIES = Object.freeze([
  "gapEV",
  "singleParticleGapEV",
  "chargingEnergyEV",
  "levelSpacingSPEV",
  "valenceSpacing1EV",
] as const);

/**
 * A quantity tabulated against dot radius: the tunnelling gap, the single-particle gap
 * (gap − Ec), the charging (addition) energy Ec, the CB s–p spacing Δsp, and the first VB
 * group spacing; all in eV.
 */
export type SizeQuantity = (typeof SIZE_QUANTITIES)[number];
