/**
 * Where the CB side of a fit ends: below the first VB level's crossing of the substrate's Fermi
 * level, which at low η falls at positive bias, among the CB steps.
 */

/** What {@link cbSideEndV} reads of each analysed peak. */
export interface CbSideEndPeak {
  /** Position, V. */
  biasV: number;
  /** Full width at half maximum, V. */
  fwhmV: number;
  /** The peak's role in the assignment; only `"level"` peaks count. */
  role: string;
}

/**
 * The highest bias of the CB side of a fit (whose model holds the CB levels only).
 *
 * Parameters
 * ----------
 * peaks : readonly CbSideEndPeak[]
 *     The analysed peaks (bias V, FWHM V, role).
 * eta : number
 *     Voltage-division factor η, 0 < η ≤ 1.
 * marginFwhm : number
 *     Distance kept below the crossing, in FWHM of the VB peak (FIT_DEFAULTS.cbSideResonanceMarginFwhm, 2).
 *
 * Returns
 * -------
 * number
 *     η·|V₁|/(1 − η) − marginFwhm·FWHM₁ for the VB level peak V₁ nearest 0 V (V); Infinity with
 *     no VB level peak, at η = 1, or where that end would leave out the second CB level peak
 *     (one FWHM beyond it: the s doublet's two steps are what the groupings are told apart by).
 *
 * Notes
 * -----
 * 1. A fraction η of the bias drops across the tip junction and 1 − η across the substrate
 *    junction. A VB level whose tip-side step lies at V₁ < 0 sits |ε| ≈ η·|V₁| below the Fermi
 *    level; at positive bias V the dot's levels move up by (1 − η)·V against the substrate, so
 *    the level crosses the substrate's Fermi level at V ≈ |ε|/(1 − η) = η·|V₁|/(1 − η) (up to the
 *    charging terms, which the margin covers): a step of hole current through the substrate
 *    junction on the CB side.
 * 2. At η ≥ 0.65 and the usual windows that crossing lies beyond the curve; at η 0.55–0.65 it
 *    falls among the CB levels (at η = 0.6 and V₁ = −1.5 V: 2.25 V). A CB-side model without the
 *    VB levels cannot describe the steps beyond it, and every grouping of the CB peaks fits badly
 *    there; the whole-curve fit, with the VB levels, still sees every point.
 *
 * References
 * ----------
 * E. P. A. M. Bakkers, Z. Hens, A. Zunger, A. Franceschetti, L. P. Kouwenhoven, L. Gurevich and
 * D. Vanmaekelbergh, Nano Lett. 1, 551 (2001) (double-barrier tunnelling junction, voltage division;
 * from memory).
 *
 * Example
 * -------
 * ```ts
 * cbSideEndV([{ biasV: -1.5, fwhmV: 0.05, role: "level" }, { biasV: 1.2, fwhmV: 0.05, role: "level" }], 0.6, 2);
 * // => 2.15 (0.6·1.5/0.4 − 2·0.05)
 * ```
 */
export function cbSideEndV(peaks: readonly CbSideEndPeak[], eta: number, marginFwhm: number): number {
  if (!(eta < 1)) return Infinity;
  let first: CbSideEndPeak | null = null;
  for (const p of peaks) if (p.biasV < 0 && p.role === "level" && (!first || p.biasV > first.biasV)) first = p;
  if (!first) return Infinity;
  const endV = (eta * -first.biasV) / (1 - eta) - marginFwhm * first.fwhmV;
  // A CB side without the first two CB steps (the s doublet's) could not tell any grouping apart:
  // then the whole positive side, as at high η.
  const cb = peaks.filter((p) => p.biasV > 0 && p.role === "level").sort((a, b) => a.biasV - b.biasV);
  const needV = cb.length >= 2 ? cb[1].biasV + cb[1].fwhmV : cb.length ? cb[0].biasV + cb[0].fwhmV : -Infinity;
  return endV > needV ? endV : Infinity;
}
