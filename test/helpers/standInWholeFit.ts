import type { FitTrial } from "../../lib/model/fit/fitTrial.ts";

/**
 * The fixed fields of the stand-in contexts with which the tests of the whole-curve stages
 * (peakStartWholeFits, wholeCurveSplits, structuredWholeSplit, laterEntryWholeFits,
 * unseenSPeakWholeFits) drive them without the model: a stand-in run's χ² is its reduced χ²,
 * reduced χ² ≤ 3 describes the curve (the fit's wholeCurveChiSquare), exploratory runs take 8
 * iterations and finishing runs 60, and every grouping is acceptable. Each test adds its own
 * `run`, `cbSide`, η and whatever it overrides.
 */
export function standInWholeFields() {
  return {
    exploreIterations: 8,
    maxIterations: 60,
    reduced: (t: FitTrial) => t.loop.chiSquare,
    describes: (t: FitTrial) => t.loop.chiSquare <= 3,
    acceptable: (_whole: FitTrial, _cb: FitTrial) => true,
  };
}
