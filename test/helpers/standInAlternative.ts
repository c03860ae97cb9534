// A stand-in FitAlternative for tests of the comparison's decision: a good CB-side shell-filling
// run with the fields the decision reads set, the rest neutral.
import type { FitAlternative } from "../../lib/model/fit/curveFit.ts";

/** A CB-side run with this Γtip/Γsub, Ec (eV) and BIC weight; `extra` overrides any other field (its whole-curve fit, reduced χ²). */
export const standInAlternative = (hypothesis: string, rateRatio: number, chargingEnergyEV: number, weight: number, extra: Partial<FitAlternative> = {}): FitAlternative => ({
  hypothesis,
  regime: "shell-filling",
  levels: 4,
  cbDegeneracies: [2, 6],
  rateRatioStart: rateRatio,
  rateRatio,
  chargingEnergyEV,
  reducedChiSquare: 1,
  side: "CB",
  bic: 0,
  finished: true,
  implausible: [],
  weight,
  ...extra,
});
