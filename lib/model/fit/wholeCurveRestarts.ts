/**
 * Further starts of the whole-curve fit where the CB side's values give none that fits: other
 * charging energies, read from the peaks, for the CB and VB levels together.
 */

/** Constants of {@link wholeCurveEcStarts}. */
export const WHOLE_CURVE_RESTART_DEFAULTS = Object.freeze({
  /** Multiples of the CB side's Ec also tried (a ladder read with one level too many or too few). */
  ecFactors: Object.freeze([0.5, 2 / 3, 1.5]),
  /** Starts closer than this fraction to the CB side's Ec or to one kept before are dropped. */
  minRelativeGap: 0.1,
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
