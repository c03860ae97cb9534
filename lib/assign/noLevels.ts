/**
 * Curves without dot features: the rule that says "no levels found", and why, before any
 * multiplet or gap is built.
 */

/** Why a curve shows no dot levels. */
export type NoLevelsCode = "no-peaks" | "no-gap" | "lone-peak" | "faint-peaks";

/** The verdict of {@link noLevels}: a stable code and the reason in words. */
export interface NoLevels {
  /**
   * "no-peaks": no peak passed the current-step test; "no-gap": the conductance at 0 V is above
   * its noise (no zero-conductance region: an ohmic or metallic contact); "lone-peak": a single
   * peak, on one side of the gap only, which a smooth background with noise can produce;
   * "faint-peaks": no peak stands out of the dI/dV by more than white noise alone reaches over a
   * curve (the current steps behind them can be the curvature of a smooth background).
   */
  code: NoLevelsCode;
  /** The reason in words, with the numbers it used. */
  reason: string;
}

/** Inputs of {@link noLevels}. */
export interface NoLevelsInput {
  /** Bias positions of the peaks that passed the current-step test, V (any order). */
  peaksV: readonly number[];
  /** The zero-conductance region [negative edge, positive edge] around 0 V, V; null when dI/dV at 0 V exceeds its noise or 0 V is outside the range. */
  gapEdgesV: [number, number] | null;
  /** Whether 0 V lies inside the bias range (a curve on one side of 0 V cannot show the gap). */
  zeroInRange: boolean;
  /**
   * Samples in the zero-current region around 0 V (where the current stays within its noise of
   * I(0 V); `prepareCurve`'s offset region); 0 when there is none.
   */
  zeroCurrentSamples: number;
  /**
   * Prominence of the strongest peak over the noise of dI/dV (the largest `Peak.snr`), in units
   * of that noise. Optional: without it the "faint-peaks" rule is not applied.
   */
  strongestProminenceSigma?: number;
  /**
   * FWHM of each peak, V, in the order of `peaksV`, and the bias range of the curve [first,
   * last], V. Optional (both or neither): with them, peaks within
   * NO_LEVELS_DEFAULTS.edgeFwhms FWHM of an end of the range do not count as levels (note 4).
   */
  peakFwhmV?: readonly number[];
  biasRangeV?: [number, number];
}

/** Constants of {@link noLevels} (locked by test/assign/noLevels.test.ts). */
export const NO_LEVELS_DEFAULTS = Object.freeze({
  /** A gap needs a zero-current region of at least this many samples when dI/dV at 0 V is above its noise. */
  minZeroCurrentSamples: 5,
  /**
   * The strongest peak must stand this many noise σ above its surroundings in dI/dV (note 3):
   * about the median of the largest prominence that smoothed white noise alone reaches over a
   * 2,001-sample curve (6.1–6.5 σ for windows of 10–80 mV, measured by simulation).
   */
  minStrongestProminenceSigma: 6,
  /** Peaks closer than this many FWHM to an end of the bias range do not count as levels (note 4). */
  edgeFwhms: 1,
});

/**
 * Decide whether a curve shows dot levels at all.
 *
 * Parameters
 * ----------
 * input : NoLevelsInput
 *     The accepted peak positions (V), the zero-conductance region (V) and whether 0 V is in the
 *     bias range.
 *
 * Returns
 * -------
 * NoLevels | null
 *     Null when the curve may hold levels (the assignment goes on); otherwise the code and reason,
 *     and the assignment reports no multiplets, no gap and no quantities.
 *
 * Notes
 * -----
 * A dot between two tunnel barriers has a region of zero conductance around 0 V (the gap:
 * Coulomb blockade plus the single-particle gap) with current steps, dI/dV peaks, outside it.
 * The rules, in order:
 * 1. 0 V inside the range but no zero-conductance region there: "no-gap" (an ohmic or metallic
 *    contact; peaks on such a background are not levels of an isolated dot). Both signs must
 *    agree: dI/dV at 0 V above its noise (`gapEdgesV` null) and a zero-current region of fewer
 *    than NO_LEVELS_DEFAULTS.minZeroCurrentSamples (5) samples, so that one noisy sample of
 *    dI/dV at 0 V does not discard a dot.
 * 2. No accepted peak: "no-peaks" (a curve of noise, an open circuit, or a smooth exponential,
 *    e.g. tunnelling straight into the substrate).
 * 3. The strongest peak's prominence below NO_LEVELS_DEFAULTS.minStrongestProminenceSigma (6)
 *    noise σ of dI/dV: "faint-peaks". Every peak then is a bump no larger than smoothed white
 *    noise produces somewhere on a curve anyway, and the current step that let it pass the step
 *    test can be the curvature of a smooth background: a steep exponential (tunnelling into the
 *    substrate, or an ohmic leak through a thin shell) recorded with little noise bends more
 *    within a fit window than a line follows, and every noise bump on it gets a "significant"
 *    step. A dot's levels stand far above that (on the project's synthetic benchmark spectra the
 *    strongest peak is at least 7.8 σ, 13 σ at the 5th percentile).
 * 4. Exactly one peak: "lone-peak" (a single level cannot be told from a bump of a smooth
 *    background, and no gap between a CB and a VB peak can be formed).
 * Otherwise null. Rules 2 and 4 count only the peaks at least NO_LEVELS_DEFAULTS.edgeFwhms (1)
 * FWHM inside the bias range when the widths and the range are given: at the end of the range
 * the smoothing filter works from one side and the current-step test sees less than one width
 * beyond the peak, so a steep background cut off by the range (tunnelling into the substrate at
 * the largest biases) makes a "peak" there that nothing else confirms. Such peaks still count
 * for a curve that has levels elsewhere.
 *
 * Example
 * -------
 * ```ts
 * noLevels({ peaksV: [], gapEdgesV: [-0.7, 0.7], zeroInRange: true, zeroCurrentSamples: 700 });
 * // => { code: "no-peaks", reason: "no peak passed the current-step test ..." }
 * noLevels({ peaksV: [-0.9, 0.8], gapEdgesV: [-0.8, 0.7], zeroInRange: true, zeroCurrentSamples: 750 });  // => null
 * ```
 */
export function noLevels(input: NoLevelsInput): NoLevels | null {
  const { peaksV, gapEdgesV, zeroInRange } = input;
  if (zeroInRange && gapEdgesV === null && input.zeroCurrentSamples < NO_LEVELS_DEFAULTS.minZeroCurrentSamples) {
    return {
      code: "no-gap",
      reason: `dI/dV at 0 V is above its noise and the current leaves its noise within ${input.zeroCurrentSamples} sample${input.zeroCurrentSamples === 1 ? "" : "s"} of 0 V, so there is no zero-conductance region (an ohmic or metallic contact, not a dot between two barriers); the ${peaksV.length} peak${peaksV.length === 1 ? "" : "s"} found are not taken as levels`,
    };
  }
  const range = input.biasRangeV;
  const widths = input.peakFwhmV;
  const reach = NO_LEVELS_DEFAULTS.edgeFwhms;
  const inside = range && widths ? peaksV.filter((v, k) => v - range[0] >= reach * widths[k] && range[1] - v >= reach * widths[k]) : peaksV;
  const atEdge = peaksV.length - inside.length;
  const edgeWords = atEdge ? ` away from the ends of the bias range (${atEdge} within ${reach === 1 ? "one FWHM" : `${reach} FWHM`} of an end, where the filter and the step test see one side only, are not counted)` : "";
  if (inside.length === 0) {
    return {
      code: "no-peaks",
      reason: `no peak passed the current-step test${edgeWords}: the curve shows no dot levels (noise only, an open circuit, or a smooth background such as tunnelling into the substrate)`,
    };
  }
  const strongest = input.strongestProminenceSigma;
  if (strongest !== undefined && strongest < NO_LEVELS_DEFAULTS.minStrongestProminenceSigma) {
    return {
      code: "faint-peaks",
      reason: `the strongest of the ${peaksV.length} peak${peaksV.length === 1 ? "" : "s"} stands only ${Number(strongest.toPrecision(2))}σ above its surroundings in dI/dV, less than white noise alone reaches somewhere on a curve (${NO_LEVELS_DEFAULTS.minStrongestProminenceSigma}σ); their current steps can be the curvature of a smooth background (such as an exponential rise from tunnelling into the substrate) rather than levels`,
    };
  }
  if (inside.length === 1) {
    return {
      code: "lone-peak",
      reason: `only one peak (at ${Number(inside[0].toPrecision(4))} V) passed the current-step test${edgeWords}: one bump on a smooth background is not a ladder of levels, and no gap between a CB and a VB peak can be formed`,
    };
  }
  return null;
}
