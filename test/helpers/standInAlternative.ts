// Stand-in FitAlternatives and fit records for tests of the comparison's decision: a good CB-side shell-filling
// run with the fields the decision reads set, the rest neutral.
import type { FitAlternative } from "../../lib/model/fit/curveFit.ts";
import type { ModelComparisonJson } from "../../lib/report/modelComparisonJson.ts";

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

/** A good shell-filling fit's record (Γtip/Γsub = 3 ± 0.3, Ec = 0.1 eV) with these alternatives, its hypothesis the first's; `overrides` replace any field. */
export const standInComparison = (alternatives: FitAlternative[], overrides: Partial<ModelComparisonJson> = {}): ModelComparisonJson => ({
  scope: "undecided",
  status: "good",
  statusReasons: [],
  regime: "shell-filling",
  regimeReason: "",
  hypothesis: alternatives[0].hypothesis,
  evidence: [],
  alternatives,
  quantities: { gapEV: { value: 1.2, standardError: 0.001 }, chargingEnergyEV: { value: 0.1, standardError: 0.001 }, levelSpacingSPEV: { value: 0.3, standardError: 0.001 } },
  rateRatio: { value: 3, standardError: 0.3 },
  rateRatioLimit: null,
  reducedChiSquare: 1,
  warnings: [],
  ...overrides,
});
