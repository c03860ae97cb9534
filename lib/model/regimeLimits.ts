/**
 * Where shell filling ends and shell tunnelling begins: the rate-ratio boundaries of the two
 * regimes, shared by the assignment (which reads them as step ratios), the model fit (which
 * classifies its fitted Γtip/Γsub) and the accuracy benchmark (whose intermediate spectra lie
 * between them).
 */

/**
 * Step of the second CB charging peak over the first for Γtip/Γsub = r, in orthodox theory.
 *
 * Parameters
 * ----------
 * rateRatio : number
 *     r = Γtip/Γsub, the tunnelling rate into the dot through the tip junction over the rate out
 *     through the substrate junction (both for one electron, one spin state), > 0.
 *
 * Returns
 * -------
 * number
 *     r/(1 + r), in (0, 1).
 *
 * Throws
 * ------
 * Nothing: callers pass constants or fitted ratios.
 *
 * Notes
 * -----
 * Derivation (closed form, master equation of a spin-degenerate level with strong charging):
 * electrons enter through the tip at Γt per spin state and leave through the substrate at Γs
 * per electron; r = Γt/Γs.
 * 1. First step (only the first electron fits): states 0 ⇄ 1 with rates 2Γt and Γs give
 *    I₁ = e·2ΓtΓs/(2Γt + Γs) = e·Γs·2r/(1 + 2r).
 * 2. Second step: 0 ⇄ 1 ⇄ 2 with 0→1 at 2Γt, 1→2 at Γt, 1→0 at Γs, 2→1 at 2Γs. Detailed balance
 *    of the chain gives P₁ = 2r·P₀, P₂ = r²·P₀, P₀ = 1/(1 + r)², and
 *    I₂ = e·Γs·(P₁ + 2P₂) = e·Γs·2r/(1 + r).
 * 3. (I₂ − I₁)/I₁ = (1 + 2r)/(1 + r) − 1 = r/(1 + r).
 * So the second step is about as high as the first deep in shell filling (r ≫ 1) and about r
 * times it deep in shell tunnelling (r ≪ 1), where the second peak is a weak charging satellite.
 * test/model/regimeLimits.test.ts checks it against the master equation of lib/model.
 *
 * References
 * ----------
 * E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002) (rate equations of a
 * spin-degenerate level); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * secondToFirstStepRatio(1.5); // => 0.6
 * ```
 */
export function secondToFirstStepRatio(rateRatio: number): number {
  return rateRatio / (1 + rateRatio);
}

/**
 * The rate ratio Γtip/Γsub whose second CB charging step is a given fraction of the first: the
 * inverse of {@link secondToFirstStepRatio}.
 *
 * Parameters
 * ----------
 * stepRatio : number
 *     q = (I₂ − I₁)/I₁, the second CB step over the first, in [0, 1).
 *
 * Returns
 * -------
 * number
 *     r = q/(1 − q) ≥ 0 (Infinity at q = 1).
 *
 * Throws
 * ------
 * Nothing: callers pass constants.
 *
 * Notes
 * -----
 * 1. Solve q = r/(1 + r) (note 3 of {@link secondToFirstStepRatio}) for r: r = q/(1 − q).
 *
 * References
 * ----------
 * E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002).
 *
 * Example
 * -------
 * ```ts
 * rateRatioFromStepRatio(0.6); // => 1.5
 * rateRatioFromStepRatio(0.3); // => 0.4286 (3/7)
 * ```
 */
export function rateRatioFromStepRatio(stepRatio: number): number {
  return stepRatio / (1 - stepRatio);
}

/**
 * Step of a second level over the first in shell tunnelling (one extra carrier at a time), for
 * Γtip/Γsub = r, in orthodox theory.
 *
 * Parameters
 * ----------
 * lowerDegeneracy : number
 *     g₁, states of the first level (spin included), ≥ 1.
 * upperDegeneracy : number
 *     g₂, states of the second level (spin included), ≥ 1.
 * rateRatio : number
 *     r = Γtip/Γsub (per state into the dot through the tip, per carrier out through the
 *     substrate), > 0.
 *
 * Returns
 * -------
 * number
 *     (I₂ − I₁)/I₁ = g₂/(g₁·(1 + (g₁ + g₂)·r)).
 *
 * Throws
 * ------
 * Nothing: callers pass constants or fitted values.
 *
 * Notes
 * -----
 * Derivation (closed form, master equation with at most one extra carrier, i.e. Ec larger than
 * the level spacing, and fast relaxation between levels):
 * 1. With G states open, the dot is empty (P₀) or holds one carrier (P₁): in at G·Γt, out at Γs,
 *    so P₁ = G·r/(1 + G·r) and I(G) = e·Γs·G·r/(1 + G·r).
 * 2. First level open: G = g₁; both open: G = g₁ + g₂.
 * 3. (I₂ − I₁)/I₁ = (g₁ + g₂)(1 + g₁r)/(g₁(1 + (g₁ + g₂)r)) − 1 = g₂/(g₁(1 + (g₁ + g₂)r)).
 * For r ≪ 1 the steps follow the degeneracies (g₂/g₁: 3 for s then a whole p shell); for s then
 * a doubly degenerate p sub-level the ratio is 1/(1 + 4r) ≈ 1, as alike as the two charging steps
 * of an s doublet in shell filling (r/(1 + r) ≈ 1 for r ≫ 1): step heights alone cannot tell
 * those two apart. test/model/regimeLimits.test.ts checks it against the master equation of
 * lib/model.
 *
 * References
 * ----------
 * E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002) (rate equations of
 * degenerate levels); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * levelStepRatio(2, 6, 0.01);  // => 2.7778 (3/1.08)
 * levelStepRatio(2, 2, 0.01);  // => 0.9615 (1/1.04)
 * ```
 */
export function levelStepRatio(lowerDegeneracy: number, upperDegeneracy: number, rateRatio: number): number {
  return upperDegeneracy / (lowerDegeneracy * (1 + (lowerDegeneracy + upperDegeneracy) * rateRatio));
}

/**
 * First step of a level through the substrate junction (its second-junction resonance) over its
 * first step through the tip junction, for Γtip/Γsub = r, in orthodox theory.
 *
 * Parameters
 * ----------
 * degeneracy : number
 *     g, states of the level (spin included), ≥ 1; the level is the first of its band (the dot
 *     holds no carrier of that band before it).
 * rateRatio : number
 *     r = Γtip/Γsub (per state into the dot, per carrier out), > 0.
 *
 * Returns
 * -------
 * number
 *     (g·r + 1)/(g + r): g deep in shell filling, 1/g deep in shell tunnelling, 1 at r = 1.
 *
 * Throws
 * ------
 * Nothing: callers pass constants or fitted values.
 *
 * Notes
 * -----
 * Derivation (closed form, master equation with one extra carrier):
 * 1. Through the tip junction (positive bias for the CB) the carrier enters from the tip at g·Γt
 *    and leaves to the substrate at Γs: I_tip = e·g·Γt·Γs/(g·Γt + Γs).
 * 2. Through the substrate junction (opposite bias) the roles swap: in at g·Γs, out at Γt:
 *    I_sub = e·g·Γs·Γt/(g·Γs + Γt).
 * 3. I_sub/I_tip = (g·Γt + Γs)/(g·Γs + Γt) = (g·r + 1)/(g + r).
 * So the resonance of the s level (g = 2) carries about twice the first s step in shell filling
 * and about half of it in shell tunnelling: its height tells the regime even where the tip side
 * cannot. test/model/regimeLimits.test.ts checks it against the master equation of lib/model.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids* (Elsevier, 1991) (the two
 * junctions of a double-barrier structure); E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B
 * 65, 045317 (2002).
 *
 * Example
 * -------
 * ```ts
 * substrateToTipStepRatio(2, 10);    // => 1.75 (21/12)
 * substrateToTipStepRatio(2, 0.01);  // => 0.5075 (1.02/2.01)
 * ```
 */
export function substrateToTipStepRatio(degeneracy: number, rateRatio: number): number {
  return (degeneracy * rateRatio + 1) / (degeneracy + rateRatio);
}

/**
 * The regime boundaries in Γtip/Γsub and their reading as second/first CB step ratios.
 * Common practice (no source) for where to draw them; their step-ratio reading is the closed form
 * of {@link secondToFirstStepRatio}.
 */
export const REGIME_LIMITS = Object.freeze({
  /**
   * Shell filling at Γtip/Γsub ≥ 1.5: the second charging peak of s carries at least 60 % of the
   * first step (r/(1 + r) ≥ 0.6), so the doublet reads as two peaks of similar height.
   */
  fillingRateRatioMin: 1.5,
  /**
   * Shell tunnelling at Γtip/Γsub ≤ 3/7 ≈ 0.43: the second peak carries at most 30 % of the first
   * (r/(1 + r) ≤ 0.3), weak enough to be told from a level as a charging satellite.
   */
  tunnelingRateRatioMax: 3 / 7,
  /** {@link secondToFirstStepRatio} at fillingRateRatioMin: 0.6. */
  fillingStepRatioMin: secondToFirstStepRatio(1.5),
  /** {@link secondToFirstStepRatio} at tunnelingRateRatioMax: 0.3. */
  tunnelingStepRatioMax: secondToFirstStepRatio(3 / 7),
});
