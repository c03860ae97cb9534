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
 * holdHole : boolean, optional
 *     Whether the CB-side model holds the first hole's entry ({@link heldHoleEntry},
 *     {@link heldValenceLevels}): where the peaks show one, the side ends below the crossing of
 *     the next peak below 0 V instead, marginFwhm of its FWHM·η/(1 − η) (the width of its
 *     substrate-side step), if the held entry's own crossing lies below that end. Default false.
 *
 * Returns
 * -------
 * number
 *     η·|V₁|/(1 − η) − marginFwhm·FWHM₁ for the VB level peak V₁ nearest 0 V (V; with a hole
 *     held, for the next peak below 0 V, as above); Infinity with no such peak, at η = 1, or where that end would leave out the second CB level peak
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
 * cbSideEndV([{ biasV: -1.5, fwhmV: 0.05, role: "level" }, { biasV: -1.7, fwhmV: 0.05, role: "satellite" }, { biasV: 1.2, fwhmV: 0.05, role: "level" }], 0.6, 2, true);
 * // => 2.4 (0.6·1.7/0.4 − 2·0.05·0.6/0.4: the first hole's crossing held)
 * ```
 */
export function cbSideEndV(peaks: readonly CbSideEndPeak[], eta: number, marginFwhm: number, holdHole = false): number {
  if (!(eta < 1)) return Infinity;
  // With the first hole's entry held, below the next entry's crossing (its step through the
  // substrate junction is η/(1 − η) times wider than the peak); else below the first VB level peak's.
  const crossingV = (p: CbSideEndPeak) => (eta * -p.biasV) / (1 - eta);
  const cb = peaks.filter((p) => p.biasV > 0 && p.role === "level").sort((a, b) => a.biasV - b.biasV);
  const levelEnd = (() => {
    const v = peaks.filter((p) => p.biasV < 0 && p.role === "level").sort((a, b) => b.biasV - a.biasV)[0];
    return v ? crossingV(v) - marginFwhm * v.fwhmV : Infinity;
  })();
  // The hole is held only where the first VB level peak's end would leave out p (its first step: the third CB peak).
  const pFirst = cb[2] ? cb[2].biasV + cb[2].fwhmV : Infinity;
  let held = holdHole && levelEnd < pFirst ? heldHoleEntry(peaks, eta) : null;
  // A held entry must lie below the end (else nothing is held: the first VB level peak's rule).
  const heldEndV = held?.next ? crossingV(held.next) - (marginFwhm * held.next.fwhmV * eta) / (1 - eta) : Infinity;
  if (held && crossingV(held.entry) >= heldEndV) held = null;
  const endV = held ? heldEndV : levelEnd;
  if (endV === Infinity) return Infinity;
  // A CB side without the first two CB steps (the s doublet's) could not tell any grouping apart:
  // then the whole positive side, as at high η.
  const needV = cb.length >= 2 ? cb[1].biasV + cb[1].fwhmV : cb.length ? cb[0].biasV + cb[0].fwhmV : -Infinity;
  return endV > needV ? endV : Infinity;
}

/**
 * The first hole's entry through the tip junction, where the peaks show it: the peak nearest
 * 0 V at negative bias, unless that one is a CB level's crossing of the substrate's Fermi level.
 *
 * Parameters
 * ----------
 * peaks : readonly CbSideEndPeak[]
 *     The analysed peaks (bias V, FWHM V, role).
 * eta : number
 *     Voltage-division factor η, 0 < η ≤ 1.
 *
 * Returns
 * -------
 * { entry: CbSideEndPeak; next: CbSideEndPeak | null } | null
 *     The peak nearest 0 V below it, whatever its role (at low η the VB peaks are crowded by
 *     resonances and a hole's entry may be read as a satellite), and the next one (the next
 *     hole's entry, or null); null at η = 1, without a peak below 0 V, or where that peak lies
 *     within its FWHM (or the CB peak's, if wider) of −η·V_k/(1 − η) for a peak V_k > 0 (any
 *     role but "second-junction": the rules may leave the CB peaks unassigned).
 *
 * Notes
 * -----
 * 1. A CB level whose tip-side step lies at V_k > 0 has the addition energy η·V_k; through the
 *    substrate junction it is reached at V = −η·V_k/(1 − η) (the electron ladder's substrate
 *    crossing), which at η 0.55–0.65 falls among the first VB peaks: a peak there may be either,
 *    and no hole is read from it.
 *
 * Example
 * -------
 * ```ts
 * heldHoleEntry([{ biasV: -1.66, fwhmV: 0.07, role: "level" }, { biasV: -1.82, fwhmV: 0.07, role: "satellite" },
 *   { biasV: 1.30, fwhmV: 0.07, role: "unassigned" }], 0.56);
 * // => null (−1.66 V is the CB peak's crossing, −0.56·1.30/0.44 = −1.655 V)
 * heldHoleEntry([{ biasV: -1.5, fwhmV: 0.05, role: "level" }, { biasV: -1.7, fwhmV: 0.05, role: "satellite" }], 0.6)?.next?.biasV;
 * // => -1.7
 * ```
 */
export function heldHoleEntry(peaks: readonly CbSideEndPeak[], eta: number): { entry: CbSideEndPeak; next: CbSideEndPeak | null } | null {
  if (!(eta < 1)) return null;
  const below = peaks.filter((p) => p.biasV < 0).sort((a, b) => b.biasV - a.biasV);
  const entry = below[0];
  if (!entry) return null;
  const cbCrossing = peaks.some((p) => p.biasV > 0 && p.role !== "second-junction" && Math.abs(entry.biasV + (eta * p.biasV) / (1 - eta)) <= Math.max(entry.fwhmV, p.fwhmV));
  return cbCrossing ? null : { entry, next: below[1] ?? null };
}
