/**
 * Single-particle levels of a carrier confined in a sphere: infinite wall, finite wall
 * (BenDaniel–Duke matching) and non-parabolic bands.
 */
import { checkInteger, checkNonNegative, checkOneOf, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { bracketRoot } from "./bracketRoot.ts";
import { scaledModifiedSphericalBesselK, sphericalBesselJ } from "./sphericalBessel.ts";
import { sphericalBesselZero } from "./sphericalBesselZeros.ts";
import { HBAR2_OVER_2ME_EV_NM2 } from "./sizeConstants.ts";

/** Options of {@link sphereLevelEV}. */
export interface SphereLevelOptions {
  /** Angular momentum l (0 = S, 1 = P, 2 = D…), integer 0…10. Default 0. */
  l?: number;
  /** Radial index n (1 = lowest level of that l), integer 1…20. Default 1. */
  n?: number;
  /** "infinite" (ψ(R) = 0) or "finite" (a step of `barrierEV` at R). Default "infinite". */
  wall?: "infinite" | "finite";
  /** Height of the step at R for the finite wall, eV. Required when wall = "finite". */
  barrierEV?: number;
  /** Effective mass outside the sphere for the finite wall, in mₑ. Default 1 (free electron). */
  barrierMassE?: number;
  /** Non-parabolicity α of E(1 + αE) = ħ²k²/(2m*), 1/eV. Default 0 (parabolic band). */
  nonParabolicityPerEV?: number;
}

/** Defaults of {@link sphereLevelEV} (locked by test/sizes/defaults.test.ts). */
export const SPHERE_LEVEL_DEFAULTS = Object.freeze({
  l: 0,
  n: 1,
  wall: "infinite" as const,
  barrierMassE: 1,
  nonParabolicityPerEV: 0,
});

/** Energy (eV) of a band with mass m* (mₑ) and non-parabolicity α (1/eV) at wave number k (1/nm). */
function kaneEnergyEV(kPerNM: number, massE: number, alpha: number): number {
  const e0 = (HBAR2_OVER_2ME_EV_NM2 * kPerNM * kPerNM) / massE;
  // E(1 + αE) = E0  ⇒  E = 2E0 / (1 + √(1 + 4αE0)), the root that tends to E0 as α → 0 (no cancellation).
  return (2 * e0) / (1 + Math.sqrt(1 + 4 * alpha * e0));
}

/**
 * Energy of the level (n, l) of a carrier of effective mass m* in a sphere of radius R,
 * measured from the band edge (positive into the band), eV.
 *
 * Parameters
 * ----------
 * radiusNM : number
 *     Sphere radius R, nm (> 0).
 * massE : number
 *     Effective mass m* inside, in mₑ (> 0).
 * options : SphereLevelOptions, optional
 *     Level, wall and band options ({@link SphereLevelOptions}); default {}: the 1S level (n = 1,
 *     l = 0) of an infinite wall with parabolic bands.
 *
 * Returns
 * -------
 * number | null
 *     The level's energy above the band edge, eV; null when the finite well binds no such level.
 *
 * Throws
 * ------
 * DotspecError
 *     For invalid options (codes `options/*`, `sizes/missing-barrier`).
 *
 * Notes
 * -----
 * 1. Infinite wall: k = x_nl/R with x_nl the n-th zero of j_l ({@link sphericalBesselZero}),
 *    E = ħ²k²/(2m*); with non-parabolicity, E solves E(1 + αE) = ħ²k²/(2m*):
 *    E = 2E₀/(1 + √(1 + 4αE₀)), E₀ = ħ²k²/(2m*).
 * 2. Finite wall of height V₀ and outside mass m_b: inside ψ = j_l(kr), outside ψ = k_l(κr)
 *    with ħ²κ²/(2m_b) = V₀ − E; the BenDaniel–Duke condition (1/m)·ψ'/ψ continuous at R,
 *    written without poles as F(x) = (k/m_in)·j_l'(x)·k_l(κR) − (κ/m_b)·k_l'(κR)·j_l(x) = 0,
 *    x = kR.
 * 3. The n-th root lies between the (n−1)-th and n-th zeros of j_l (F changes sign there, as
 *    j_l' does; the finite-wall level lies below the infinite-wall one), cut at the x where
 *    E = V₀; it is found with {@link bracketRoot}. No sign change below E = V₀ means no bound
 *    state: null.
 * 4. Finite wall with non-parabolicity: k from the Kane dispersion inside and the
 *    energy-dependent mass m_in = m*(1 + αE) in the matching (so that E = ħ²k²/(2m_in)); the
 *    barrier stays parabolic. As V₀ → ∞ this tends to step 1's non-parabolic result.
 *
 * References
 * ----------
 * S. Flügge, Practical Quantum Mechanics (Springer, 1971), problems 62–64 (particle in a spherical box
 * and well) — from memory; D. J. BenDaniel and C. B. Duke, Phys. Rev. 152, 683 (1966) (the matching
 * condition); E. O. Kane, J. Phys. Chem. Solids 1, 249 (1957) (non-parabolic dispersion); D. F.
 * Nelson, R. C. Miller and D. A. Kleinman, Phys. Rev. B 35, 7770 (1987) (energy-dependent mass at a
 * heterointerface) — from memory.
 *
 * Example
 * -------
 * ```ts
 * sphereLevelEV(2, 0.1); // => 0.9401 (ħ²π²/(2·0.1·mₑ·(2 nm)²))
 * ```
 */
export function sphereLevelEV(radiusNM: number, massE: number, options: SphereLevelOptions = {}): number | null {
  checkPositive("radiusNM", radiusNM);
  checkPositive("massE", massE);
  const l = checkInteger("l", options.l ?? SPHERE_LEVEL_DEFAULTS.l, 0, 10);
  const n = checkInteger("n", options.n ?? SPHERE_LEVEL_DEFAULTS.n, 1, 20);
  const wall = checkOneOf("wall", options.wall ?? SPHERE_LEVEL_DEFAULTS.wall, ["infinite", "finite"] as const);
  const alpha = checkNonNegative("nonParabolicityPerEV", options.nonParabolicityPerEV ?? SPHERE_LEVEL_DEFAULTS.nonParabolicityPerEV);
  const xInf = sphericalBesselZero(l, n);
  if (wall === "infinite") return kaneEnergyEV(xInf / radiusNM, massE, alpha);

  if (options.barrierEV === undefined) {
    throw new DotspecError("sizes/missing-barrier", `barrierEV is required for wall = "finite"; give the step height in eV (e.g. material.barrierEV)`);
  }
  const v0 = checkPositive("barrierEV", options.barrierEV);
  const mb = checkPositive("barrierMassE", options.barrierMassE ?? SPHERE_LEVEL_DEFAULTS.barrierMassE);
  const R = radiusNM;
  // x at which E = V0: ħ²k²/(2m*) = V0(1 + αV0).
  const xMax = R * Math.sqrt((massE * v0 * (1 + alpha * v0)) / HBAR2_OVER_2ME_EV_NM2);
  const xLow = n === 1 ? 1e-6 * xInf : sphericalBesselZero(l, n - 1);
  if (xMax <= xLow) return null;
  const xHigh = Math.min(xInf, xMax * (1 - 1e-12));
  const energyAt = (x: number) => kaneEnergyEV(x / R, massE, alpha);
  const F = (x: number): number => {
    const e = energyAt(x);
    const mIn = massE * (1 + alpha * e);
    const kappa = Math.sqrt((mb * Math.max(v0 - e, 0)) / HBAR2_OVER_2ME_EV_NM2);
    const z = Math.max(kappa * R, 1e-300);
    const K = scaledModifiedSphericalBesselK(l, z);
    const kValue = K.value, kSlope = K.slope - K.value; // both × e^z; k_l'(z) = (K' − K)·e^(−z)
    const J = sphericalBesselJ(l, x);
    return (x / (R * mIn)) * J.slope * kValue - (kappa / mb) * kSlope * J.value;
  };
  const fLow = F(xLow), fHigh = F(xHigh);
  if (fHigh === 0) return energyAt(xHigh);
  if (Math.sign(fLow) === Math.sign(fHigh)) return null;
  return energyAt(bracketRoot(F, xLow, xHigh));
}
