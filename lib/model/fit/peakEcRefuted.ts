/**
 * Whether the peak-based Ec is refuted by the model itself: the rules' grouping of the peaks,
 * fitted to the whole curve, does not describe it while another grouping does. The status then
 * does not hold the fit's Ec against the peak-based one ({@link fitStatus}'s Ec check: "one of
 * the two readings of the peaks is wrong"): the model has already shown which one.
 */
import type { fitStatus } from "./fitStatus.ts";

/** Limits of {@link peakEcRefuted} (locked by test/model/fit/peakEcRefuted.test.ts). */
export const PEAK_EC_REFUTED_DEFAULTS = Object.freeze({
  /**
   * Reduced χ² of the assignment's whole-curve fit above which its reading of the peaks does not
   * describe the curve: the status's limit of poor (FIT_STATUS_DEFAULTS.poorChiSquare, 3). Chosen
   * on the accuracy benchmark (low-η mix with the comparison, where second-junction resonances
   * and merged peaks move the rules' Ec while a ladder read from the empty dot fits the curve to
   * the noise).
   */
  assignedChiSquare: 3,
  /**
   * … and at least this many times the reduced χ² of the fit whose Ec is checked: a clear margin,
   * not a tie between two readings that describe the curve alike (chosen on the same benchmark).
   */
  assignedRatio: 3,
});

/** What {@link peakEcRefuted} weighs. */
export interface PeakEcRefutedInput {
  /** Reduced χ² of the assignment's own grouping fitted to the whole curve; null when it was not fitted. */
  assignedReducedChiSquare: number | null;
  /** Reduced χ² of the fit whose Ec would be compared with the peak-based Ec. */
  fitReducedChiSquare: number;
  /** Whether that fit is the assignment's own grouping (then the two readings are one). */
  fitIsAssigned: boolean;
}

/**
 * Whether the rules' reading of the peaks, and so the peak-based Ec, is refuted by the model fit.
 *
 * Parameters
 * ----------
 * input : PeakEcRefutedInput
 *     The assignment's whole-curve reduced χ² (null when not fitted), the checked fit's reduced χ²
 *     and whether that fit is the assignment's grouping.
 * limits : typeof PEAK_EC_REFUTED_DEFAULTS, optional
 *     assignedChiSquare (3) and assignedRatio (3).
 *
 * Returns
 * -------
 * boolean
 *     True when the checked fit is another grouping and the assignment's whole-curve fit has a
 *     reduced χ² above assignedChiSquare and above assignedRatio times the checked fit's.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The peak-based Ec is the rules' reading of the peak positions (the s doublet's and p's
 *    charging spacings in shell filling). Fitting the rules' own grouping with the orthodox model
 *    tests that reading against the whole curve: where it stays above the status's limit of poor
 *    while another grouping reaches a reduced χ² a clear factor lower, the rules picked the wrong
 *    peaks (a second-junction resonance or two merged steps read as a charging peak), and an Ec
 *    that differs from theirs is no sign that the fit is wrong.
 * 2. Where the assignment was not fitted (too many states), or the checked fit is the
 *    assignment's own, nothing is refuted and the Ec check stands.
 *
 * Example
 * -------
 * ```ts
 * peakEcRefuted({ assignedReducedChiSquare: 32, fitReducedChiSquare: 0.99, fitIsAssigned: false }); // => true
 * peakEcRefuted({ assignedReducedChiSquare: 1.4, fitReducedChiSquare: 0.99, fitIsAssigned: false }); // => false
 * ```
 */
export function peakEcRefuted(input: PeakEcRefutedInput, limits: typeof PEAK_EC_REFUTED_DEFAULTS = PEAK_EC_REFUTED_DEFAULTS): boolean {
  const a = input.assignedReducedChiSquare;
  if (input.fitIsAssigned || a === null || !Number.isFinite(input.fitReducedChiSquare)) return false;
  return a > limits.assignedChiSquare && a > limits.assignedRatio * input.fitReducedChiSquare;
}
