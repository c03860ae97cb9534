/**
 * Further starts of the whole-curve fit where the CB side's values give none that fits: other
 * charging energies, read from the peaks, for the CB and VB levels together; and the levels'
 * reach moved to where such a fit left them when one ended on its edge.
 */
import type { LevelSeed } from "./levelsToFit.ts";
import type { StartingValues } from "./startingValues.ts";
import { BOUND_FRACTION, onBound, type FitTrial } from "./fitTrial.ts";

/** Constants of {@link wholeCurveEcStarts}. */
export const WHOLE_CURVE_RESTART_DEFAULTS = Object.freeze({
  /** Multiples of the CB side's Ec also tried (a ladder read with one level too many or too few). */
  ecFactors: Object.freeze([0.5, 2 / 3, 1.5]),
  /** Starts closer than this fraction to the CB side's Ec or to one kept before are dropped. */
  minRelativeGap: 0.1,
  /**
   * A whole-curve fit from another Ec start whose level ended on the edge of its reach is run on
   * from there with every level's reach centred on its fitted value, at most this many times
   * ({@link recentredSeeds}). Chosen on the accuracy benchmark (low-η mix with the comparison).
   */
  reachRecentrings: 2,
  /** A parameter lies on a bound when within this fraction of its bounds' span of one (as `plausibilityInput`). */
  boundFraction: BOUND_FRACTION,
});

/**
 * The charging energies from which the whole curve is fitted again when the CB side's Ec gives
 * no whole-curve fit that describes the curve.
 *
 * Parameters
 * ----------
 * cbSideEcEV : number
 *     The CB side's fitted Ec, eV.
 * rulesEcEV : number | null
 *     The peak-based (rules') Ec, eV, or null.
 * vbPeaksV : readonly number[]
 *     Biases of the VB peaks (V, negative).
 * eta : number
 *     Voltage-division factor η.
 * settings : typeof WHOLE_CURVE_RESTART_DEFAULTS, optional
 *     ecFactors and minRelativeGap.
 *
 * Returns
 * -------
 * number[]
 *     Ec starts in eV, in this order: the rules' Ec, the VB peaks' own charging spacing (η times
 *     the spacing of the two VB peaks nearest the gap: the first VB level's two charging peaks),
 *     then the CB side's Ec times each factor; a start within minRelativeGap of the CB side's Ec
 *     or of an earlier one is left out.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. At low η the CB side may end right after the s doublet, and a wrong ladder over it fits
 *    to the noise (Ec up to about 3 times the simulated one). Every whole-curve reading started
 *    from that Ec then stays far from the curve, and the result would come from the CB side
 *    alone. The VB peaks carry their own Ec: a start from it (or from the rules', or a ladder
 *    with one level more or fewer) reaches the whole curve's optimum instead.
 *
 * Example
 * -------
 * ```ts
 * wholeCurveEcStarts(0.285, 0.1, [-2.5, -2.67, -3.1], 0.6);
 * // => [0.1, 0.1425, 0.19, 0.4275] (eV; the VB spacing 0.102 is within 10 % of the rules' 0.1)
 * ```
 */
export function wholeCurveEcStarts(cbSideEcEV: number, rulesEcEV: number | null, vbPeaksV: readonly number[], eta: number, settings = WHOLE_CURVE_RESTART_DEFAULTS): number[] {
  const candidates = [rulesEcEV, valenceSpacingEcEV(vbPeaksV, eta), ...settings.ecFactors.map((f) => f * cbSideEcEV)];
  const kept: number[] = [];
  for (const ec of candidates) {
    if (ec === null || !(ec > 0) || !Number.isFinite(ec)) continue;
    if ([cbSideEcEV, ...kept].some((k) => Math.abs(ec - k) < settings.minRelativeGap * k)) continue;
    kept.push(ec);
  }
  return kept;
}

/**
 * The charging energy the VB peaks show on their own: η times the spacing of the two VB peaks
 * nearest the gap (the first VB level's two charging peaks).
 *
 * Parameters
 * ----------
 * vbPeaksV : readonly number[]
 *     Biases of the VB peaks (V; only the negative ones count), second-junction resonances left out.
 * eta : number
 *     Voltage-division factor η.
 *
 * Returns
 * -------
 * number | null
 *     η·(V₁ − V₂) in eV for the two negative peaks V₁ > V₂ nearest 0 V; null with fewer than two.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. At η 0.55–0.65 the VB peaks nearest the gap lie on the negative side, far from every CB
 *    resonance and crossing, and the first VB level is a doublet in the simulated dots: its two
 *    charging peaks are Ec/η apart. Where the s doublet's second peak is unseen on the CB side or
 *    taken for a resonance, η times the first two CB peaks' spacing is off by ×0.4–5 and this
 *    spacing is the better start ({@link compareGroupings}, crossed sides).
 * 2. A first VB level whose second peak is unseen gives the spacing to the next level instead;
 *    it is a start, chosen among others by the fits' BIC and plausibility.
 *
 * Example
 * -------
 * ```ts
 * valenceSpacingEcEV([-2.5, -2.67, -3.1, 0.4], 0.6);
 * // => 0.102 (eV: 0.6 × 0.17 V)
 * ```
 */
export function valenceSpacingEcEV(vbPeaksV: readonly number[], eta: number): number | null {
  const vb = [...vbPeaksV].filter((v) => v < 0).sort((a, b) => b - a);
  return vb.length >= 2 ? eta * (vb[0] - vb[1]) : null;
}

/**
 * Whether a fit ended with one of its levels on the edge of its reach: the bound, not the curve,
 * stopped it.
 *
 * Parameters
 * ----------
 * parameters : readonly number[]
 *     The fitted nonlinear parameters ({@link parameterIndex} layout: the levels first).
 * start : StartingValues
 *     The run's bounds.
 * levelCount : number
 *     Number of levels (the first entries of `parameters`).
 * settings : typeof WHOLE_CURVE_RESTART_DEFAULTS, optional
 *     boundFraction.
 *
 * Returns
 * -------
 * boolean
 *     True where a level lies within boundFraction of its bounds' span of either bound.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Example
 * -------
 * ```ts
 * levelAtReachEdge([1.2, 1.3983, 0.14, 0, -2], { minValues: [1.1, 1.27, 1e-4, -4, -4], maxValues: [1.3, 1.3983, 2, 4, -0.3], initialValues: [], gradientDifference: [] }, 2);
 * // => true (p on its upper bound)
 * ```
 */
export function levelAtReachEdge(parameters: readonly number[], start: Pick<StartingValues, "minValues" | "maxValues">, levelCount: number, settings = WHOLE_CURVE_RESTART_DEFAULTS): boolean {
  for (let j = 0; j < levelCount; j++) if (onBound(parameters, start, j, settings.boundFraction)) return true;
  return false;
}

/**
 * The levels re-anchored so that their starts (and the reach about them) lie at given energies:
 * each level's first charging peak placed where the starting rule puts that energy.
 *
 * Parameters
 * ----------
 * seeds : readonly LevelSeed[]
 *     The levels of a hypothesis.
 * levelsEV : readonly number[]
 *     |ε_j| for each level, eV (a fit's values).
 * eta : number
 *     Voltage-division factor η.
 * chargingEnergyStartEV : number
 *     The hypothesis' starting Ec, eV (the one its starting values use).
 *
 * Returns
 * -------
 * LevelSeed[]
 *     The same levels with firstPeakV = ±(|ε_j| + Ec₀·(N_before + ½))/η (+ for CB, − for VB), so
 *     that {@link startingValues} starts level j at |ε_j|, its reach centred there.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A level's reach is at most 0.45 × the distance between its start and its neighbour's
 *    (`startingValues` note 5). Started from an Ec far from the optimum, a level placed one peak
 *    off (a p level from s's second charging peak, low-η draw 93: the optimum 80 meV above the
 *    start, the reach 62 meV from Ec 0.069 eV) ends on the edge of its reach while Ec
 *    moves to the right value, and the fit stays above the noise with residual structure at that
 *    level's peaks. Run on with the reach centred on the fitted levels, it reaches the optimum
 *    (93: reduced χ² 1.97 → about 1, Ec and Γtip/Γsub the simulated ones).
 *
 * Example
 * -------
 * ```ts
 * recentredSeeds([{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 2.0, before: 0 }], [1.2], 0.6, 0.1);
 * // => [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 2.0833, before: 0 }] (V: (1.2 + 0.05)/0.6)
 * ```
 */
export function recentredSeeds(seeds: readonly LevelSeed[], levelsEV: readonly number[], eta: number, chargingEnergyStartEV: number): LevelSeed[] {
  return seeds.map((s, j) => ({ ...s, firstPeakV: ((s.band === "CB" ? 1 : -1) * (Math.abs(levelsEV[j]) + chargingEnergyStartEV * (s.before + 0.5))) / eta }));
}

/**
 * The whole curve fitted again from other Ec starts: the fit of lowest BIC among those the caller
 * accepts (in fitCurve: plausible, and describing the curve: reduced χ² at most
 * FIT_DEFAULTS.wholeCurveChiSquare and no residual structure).
 *
 * Parameters
 * ----------
 * startsEV : readonly number[]
 *     Ec starts in eV ({@link wholeCurveEcStarts}), each fitted in turn.
 * fitFrom : (ecStartEV: number) => FitTrial
 *     Fits the whole curve from one Ec start.
 * accepts : (t: FitTrial) => boolean
 *     Whether a whole-curve fit may replace the one from the CB side's Ec.
 *
 * Returns
 * -------
 * FitTrial | null
 *     The accepted fit of lowest BIC, or null when none is accepted (or there is no start).
 *
 * Examples
 * --------
 * ecRestartedWhole([], fit, () => true); // => null (nothing fitted)
 */
export function ecRestartedWhole(startsEV: readonly number[], fitFrom: (ecStartEV: number) => FitTrial, accepts: (t: FitTrial) => boolean): FitTrial | null {
  let better: FitTrial | null = null;
  for (const ec of startsEV) {
    const t = fitFrom(ec);
    if (accepts(t) && (!better || t.bic < better.bic)) better = t;
  }
  return better;
}
