/**
 * What the fitted model says about the curve: the regime its rate ratio implies, and whether it
 * describes the curve at all.
 */

/** The limits {@link fitVerdict} applies (from FIT_DEFAULTS). */
export interface FitVerdictLimits {
  /** Γtip/Γsub at or above which the curve is in shell filling. */
  fillingRatioMin: number;
  /** Γtip/Γsub at or below which it is in shell tunnelling. */
  tunnelingRatioMax: number;
  /** Reduced χ² above which the model does not describe the curve. */
  poorFitChiSquare: number;
}

/** What {@link fitVerdict} returns. */
export interface FitVerdict {
  regime: "shell-filling" | "shell-tunneling" | "intermediate";
  /** A warning when the reduced χ² is above the limit; null otherwise. */
  warning: string | null;
}

/**
 * The regime implied by a fitted rate ratio, and a warning when the fit does not describe the
 * curve.
 *
 * Parameters
 * ----------
 * rateRatio : number
 *     Fitted Γtip/Γsub.
 * reducedChiSquare : number
 *     χ² per degree of freedom, with the current noise as σ.
 * limits : FitVerdictLimits
 *     fillingRatioMin, tunnelingRatioMax (the {@link REGIME_LIMITS} boundaries) and
 *     poorFitChiSquare.
 *
 * Returns
 * -------
 * FitVerdict
 *     `{ regime, warning }`.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Shell filling at r ≥ fillingRatioMin, shell tunnelling at r ≤ tunnelingRatioMax,
 *    intermediate in between (the step-ratio reading of these boundaries is in
 *    {@link REGIME_LIMITS}).
 * 2. A reduced χ² above poorFitChiSquare says the model, as started from the assignment, leaves
 *    residuals far above the noise: levels missing or mis-assigned.
 *
 * References
 * ----------
 * E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002) (the step ratio
 * r/(1 + r) the boundaries are read from).
 *
 * Example
 * -------
 * ```ts
 * const limits = { fillingRatioMin: 1.5, tunnelingRatioMax: 3 / 7, poorFitChiSquare: 10 };
 * fitVerdict(10, 0.9, limits);  // => { regime: "shell-filling", warning: null }
 * fitVerdict(1, 25, limits).regime; // => "intermediate" (and a warning about χ² = 25.0)
 * ```
 */
export function fitVerdict(rateRatio: number, reducedChiSquare: number, limits: FitVerdictLimits): FitVerdict {
  const warning =
    reducedChiSquare > limits.poorFitChiSquare
      ? `reduced χ² = ${reducedChiSquare.toFixed(1)}: the model started from this assignment does not describe the curve (levels missing or mis-assigned); treat the fitted values with suspicion`
      : null;
  const regime = rateRatio >= limits.fillingRatioMin ? "shell-filling" : rateRatio <= limits.tunnelingRatioMax ? "shell-tunneling" : "intermediate";
  return { regime, warning };
}
