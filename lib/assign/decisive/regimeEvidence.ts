/**
 * Two tests of `rulesDecisive` (its notes 2 and 11) on the evidence the rules read the regime
 * from: an s doublet's step ratio near a regime boundary, and a regime read from two CB peaks
 * alone.
 */
import { REGIME_LIMITS } from "../../model/regimeLimits.ts";
import type { RulesDecisiveInput } from "../rulesDecisive.ts";

/** The codes of this module's tests, by note of `rulesDecisive`: 2, 11. */
export type RegimeEvidenceCode = "step-ratio-band" | "two-cb-peaks";

/** One reason of {@link stepRatioBandReasons} or {@link twoCbPeakReasons}. */
export interface RegimeEvidenceReason {
  code: RegimeEvidenceCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reason to doubt a named regime whose s doublet steps near a regime boundary (note 2 of
 * `rulesDecisive`).
 *
 * Parameters
 * ----------
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (its `evidence.secondToFirstStepRatio` is read).
 * margin : number
 *     The margin on both sides of the crossover band, dimensionless (`stepRatioMargin` of
 *     `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * RegimeEvidenceReason[]
 *     One reason or none.
 *
 * Notes
 * -----
 * The second CB step over the first (`evidence.secondToFirstStepRatio`) lies within the crossover
 * band r/(1 + r) for Γtip/Γsub between 3/7 and 1.5 (0.3–0.6, `REGIME_LIMITS`) widened by `margin`
 * on both sides, while the rules named a regime: the s doublet's second step (or the satellite)
 * is close to a regime boundary. The step ratio r/(1 + r) of the s doublet: orthodox theory,
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991); E. Bonet, M. M. Deshmukh and D. C. Ralph,
 * Phys. Rev. B 65, 045317 (2002) (see `secondToFirstStepRatio`).
 */
export function stepRatioBandReasons(assignment: RulesDecisiveInput["assignment"], margin: number): RegimeEvidenceReason[] {
  const q = assignment.evidence.secondToFirstStepRatio;
  const low = REGIME_LIMITS.tunnelingStepRatioMax - margin;
  const high = REGIME_LIMITS.fillingStepRatioMin + margin;
  if (!(q !== null && q >= low && q <= high)) return [];
  return [{
    code: "step-ratio-band",
    text: `the second CB step is ${q.toFixed(2)} × the first, within the crossover band ${low.toFixed(2)}–${high.toFixed(2)} (r/(1 + r) for Γtip/Γsub from 3/7 to 1.5, ± ${margin}): the rate ratio may be near a regime boundary`,
  }];
}

/**
 * The reason to doubt a regime read from two CB peaks alone (note 11 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (its regime and `evidence.reasons` are read).
 *
 * Returns
 * -------
 * RegimeEvidenceReason[]
 *     One reason or none.
 *
 * Notes
 * -----
 * A regime read from two CB peaks alone (the rules' evidence says no third CB peak follows), the
 * VB deciding between an s doublet and the s level with a p sub-level: a merged p shows as one
 * peak and may be taken for s's second.
 */
export function twoCbPeakReasons(assignment: RulesDecisiveInput["assignment"]): RegimeEvidenceReason[] {
  const a = assignment;
  if (!a.evidence.reasons.some((r) => r.includes("no third CB peak follows"))) return [];
  return [{
    code: "two-cb-peaks",
    text: `${a.regime === "shell-filling" ? "shell filling" : "shell tunnelling"} read from two CB peaks alone (no third follows), the VB deciding between an s doublet and the s level with a p sub-level: the CB side holds too few peaks for the rules to tell`,
  }];
}
