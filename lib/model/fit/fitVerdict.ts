/**
 * What the fitted model says about the curve: the regime its rate ratio implies, and whether it
 * describes the curve at all.
 */

import type { RateRatioLimit } from "./rateRatioLimit.ts";

/** The limits {@link fitVerdict} applies (from FIT_DEFAULTS). */
export interface FitVerdictLimits {
  /** Γtip/Γsub at or above which the curve is in shell filling. */
  fillingRatioMin: number;
  /** Γtip/Γsub at or below which it is in shell tunnelling. */
  tunnelingRatioMax: number;
  /** Reduced χ² above which the model does not describe the curve. */
  poorFitChiSquare: number;
  /** Standard errors either side of the fitted log₁₀ Γtip/Γsub that the regime must hold over. */
  regimeSigmas: number;
}

/** What {@link fitVerdict} returns. */
export interface FitVerdict {
  /** Regime of the fitted rate ratio; "undetermined" when its error spans both regimes or is unknown. */
  regime: "shell-filling" | "shell-tunneling" | "intermediate" | "undetermined";
  /** Why, in words, with the ratio and its error. */
  regimeReason: string;
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
 *     fillingRatioMin, tunnelingRatioMax (the {@link REGIME_LIMITS} boundaries),
 *     poorFitChiSquare and regimeSigmas.
 * logRateRatioSE : number, optional
 *     Standard error of log₁₀ Γtip/Γsub (default 0: the value alone decides).
 * limit : RateRatioLimit | null, optional
 *     The one-sided limit the curve sets where Γtip/Γsub ran onto a bound (default null).
 *
 * Returns
 * -------
 * FitVerdict
 *     `{ regime, regimeReason, warning }`.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The interval r·10^(±k·SE), k = regimeSigmas, SE the error of log₁₀ r. When the error is not
 *    finite, or the interval reaches both the tunnelling side (≤ tunnelingRatioMax) and the
 *    filling side (≥ fillingRatioMin), the curve cannot tell: undetermined.
 * 2. Otherwise the value decides: shell filling at r ≥ fillingRatioMin, shell tunnelling at
 *    r ≤ tunnelingRatioMax, intermediate in between (the step-ratio reading of these boundaries
 *    is in {@link REGIME_LIMITS}).
 * 3. Where Γtip/Γsub ran onto a bound of the fit and the curve sets a one-sided limit on it
 *    ({@link rateRatioLimit}) inside one regime (≥ fillingRatioMin from the upper bound, ≤
 *    tunnelingRatioMax from the lower), that regime: deep in it, the value is not measured.
 * 4. A reduced χ² above poorFitChiSquare says the model, as started from the assignment, leaves
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
 * const limits = { fillingRatioMin: 1.5, tunnelingRatioMax: 3 / 7, poorFitChiSquare: 10, regimeSigmas: 2 };
 * fitVerdict(10, 0.9, limits).regime;     // => "shell-filling"
 * fitVerdict(1, 25, limits).regime;       // => "intermediate" (and a warning about χ² = 25.0)
 * fitVerdict(1, 1, limits, 0.3).regime;   // => "undetermined" (1 × 4.0^±1 spans 0.25 … 4)
 * ```
 */
export function fitVerdict(rateRatio: number, reducedChiSquare: number, limits: FitVerdictLimits, logRateRatioSE = 0, limit: RateRatioLimit | null = null): FitVerdict {
  const warning =
    reducedChiSquare > limits.poorFitChiSquare
      ? `reduced χ² = ${reducedChiSquare.toFixed(1)}: the model started from this assignment does not describe the curve (levels missing or mis-assigned); treat the fitted values with suspicion`
      : null;
  if (limit) {
    const [sign, where] = limit.kind === "lower" ? ["≥", "upper"] : ["≤", "lower"];
    const shown = `Γtip/Γsub ran onto the fit's ${where} bound (${rateRatio.toPrecision(2)}); the curve sets Γtip/Γsub ${sign} ${limit.rateRatio.toPrecision(3)} (one-sided 95 %, χ² +${limit.chiSquareRise})`;
    if (limit.kind === "lower" && limit.rateRatio >= limits.fillingRatioMin) return { regime: "shell-filling", regimeReason: `${shown} ≥ ${limits.fillingRatioMin}: shell filling`, warning };
    if (limit.kind === "upper" && limit.rateRatio <= limits.tunnelingRatioMax) return { regime: "shell-tunneling", regimeReason: `${shown} ≤ ${limits.tunnelingRatioMax.toPrecision(2)}: shell tunnelling`, warning };
  }
  const factor = 10 ** (limits.regimeSigmas * logRateRatioSE);
  const shown = `Γtip/Γsub = ${rateRatio.toPrecision(3)}`;
  if (!Number.isFinite(factor)) {
    return { regime: "undetermined", regimeReason: `${shown} has no finite error: the curve does not determine the rate ratio (a second charging step of s, or the s/p step ratio, is missing)`, warning };
  }
  const range = `${shown} (${limits.regimeSigmas}σ range ${(rateRatio / factor).toPrecision(2)}–${(rateRatio * factor).toPrecision(2)})`;
  if (rateRatio / factor <= limits.tunnelingRatioMax && rateRatio * factor >= limits.fillingRatioMin) {
    return { regime: "undetermined", regimeReason: `${range} reaches both shell tunnelling (≤ ${limits.tunnelingRatioMax.toPrecision(2)}) and shell filling (≥ ${limits.fillingRatioMin}): the curve cannot tell (the s doublet's second step is not resolved)`, warning };
  }
  if (rateRatio >= limits.fillingRatioMin) return { regime: "shell-filling", regimeReason: `${range} ≥ ${limits.fillingRatioMin}: shell filling`, warning };
  if (rateRatio <= limits.tunnelingRatioMax) return { regime: "shell-tunneling", regimeReason: `${range} ≤ ${limits.tunnelingRatioMax.toPrecision(2)}: shell tunnelling`, warning };
  return { regime: "intermediate", regimeReason: `${range} between ${limits.tunnelingRatioMax.toPrecision(2)} and ${limits.fillingRatioMin}: intermediate (charging and level steps both show)`, warning };
}
