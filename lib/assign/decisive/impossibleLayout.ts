/**
 * Two tests of `rulesDecisive` (its notes 21 and 22) on the layout a shell-filling reading
 * implies: an s–p spacing below zero, and a charging energy that is a large part of the gap.
 */
import { checkRange } from "../../util/check.ts";
import type { Assignment } from "../assignSpectrum.ts";

/** Options of {@link impossibleLayoutReasons}; every field optional (defaults in {@link IMPOSSIBLE_LAYOUT_DEFAULTS}). */
export interface ImpossibleLayoutOptions {
  /**
   * Shell filling: Ec counts as too large a part of the gap when it exceeds this fraction of the
   * single-particle gap (gap − Ec, both in bias, so η cancels); dimensionless. Default 0.25.
   */
  maxChargingFractionOfGap?: number;
}

/** Defaults of {@link impossibleLayoutReasons} (locked by test/assign/decisive/impossibleLayout.test.ts). */
export const IMPOSSIBLE_LAYOUT_DEFAULTS = Object.freeze({
  /**
   * Ec above this fraction of the single-particle gap is a layout no few-nm dot has (common
   * practice, no source: Ec is a tenth of the gap or so; chosen on the accuracy benchmark, see
   * note 22 of rulesDecisive).
   */
  maxChargingFractionOfGap: 0.25,
});

/** The codes of {@link impossibleLayoutReasons}, by note of `rulesDecisive`: 21, 22. */
export type ImpossibleLayoutCode = "negative-sp-spacing" | "ec-of-gap";

/** One reason of {@link impossibleLayoutReasons}. */
export interface ImpossibleLayoutReason {
  code: ImpossibleLayoutCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reasons to doubt a shell-filling reading that the layout it implies gives.
 *
 * Parameters
 * ----------
 * assignment : Pick<Assignment, "regime" | "quantities">
 *     The rules' assignment: its regime, and Δsp, Ec and the gap in bias (V).
 * options : ImpossibleLayoutOptions, optional
 *     `maxChargingFractionOfGap` (dimensionless, default 0.25).
 *
 * Returns
 * -------
 * ImpossibleLayoutReason[]
 *     Each with its code and its words; empty when none applies (and in shell tunnelling).
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an option that is not a finite number in its range.
 *
 * Notes
 * -----
 * In shell filling the last charging peak of s and the first of p lie Δsp + Ec apart in energy
 * ((ε + Ec(n + ½))/η for each; `spectrumQuantities` note 3).
 * 1. (note 21) Δsp (`quantities.levelSpacingSPV`) below zero: p lies above s in every confinement
 *    potential, so a negative spacing says the peaks taken for s and p are not theirs (s's first
 *    charging peak unseen and p's first read as s's second, which also inflates Ec), however
 *    clean the peaks are.
 * 2. (note 22) Ec above `maxChargingFractionOfGap` × the single-particle gap (gap − Ec): Ec is the
 *    Coulomb energy of one more electron on the dot, a tenth of its gap or so in few-nm dots; a
 *    larger one is the spacing of peaks that are not one level's charging peaks.
 *
 * Example
 * -------
 * ```ts
 * // s read at 1.77 and 2.68 V, p from 3.32 V: Ec 0.83 V, Δsp = (3.32 − 2.68) − 0.83 < 0.
 * impossibleLayoutReasons({ regime: "shell-filling", quantities: { gapV: 3.2, chargingEnergyV: 0.83,
 *   levelSpacingSPV: -0.19 } }).map((r) => r.code);  // => ["negative-sp-spacing", "ec-of-gap"]
 * ```
 */
export function impossibleLayoutReasons(
  assignment: { regime: Assignment["regime"]; quantities: Pick<Assignment["quantities"], "gapV" | "chargingEnergyV" | "levelSpacingSPV"> },
  options: ImpossibleLayoutOptions = {},
): ImpossibleLayoutReason[] {
  const D = IMPOSSIBLE_LAYOUT_DEFAULTS;
  const maxFraction = checkRange("maxChargingFractionOfGap", options.maxChargingFractionOfGap ?? D.maxChargingFractionOfGap, 0, 10);
  const out: ImpossibleLayoutReason[] = [];
  if (assignment.regime !== "shell-filling") return out;
  const { gapV, chargingEnergyV: ecV, levelSpacingSPV: spV } = assignment.quantities;
  // 1. p below s.
  if (spV !== null && spV < 0) {
    out.push({
      code: "negative-sp-spacing",
      text: `shell filling with an s–p spacing of ${(spV * 1e3).toFixed(0)} mV (in bias), below zero although p lies above s: the peaks read as s and p may not be theirs (s's first charging peak unseen, p's first read as s's second)`,
    });
  }
  // 2. Ec a large part of the gap.
  if (ecV !== null && ecV > 0 && gapV !== null && gapV > ecV && ecV > maxFraction * (gapV - ecV)) {
    out.push({
      code: "ec-of-gap",
      text: `shell filling with Ec ${(ecV * 1e3).toFixed(0)} mV (in bias), ${(ecV / (gapV - ecV)).toFixed(2)} × the single-particle gap ${((gapV - ecV) * 1e3).toFixed(0)} mV (> ${maxFraction}), whereas Ec is a tenth of the gap or so: the spacing read as Ec may not be one level's charging`,
    });
  }
  return out;
}
