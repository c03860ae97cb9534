import type { DataSet, FitTrial } from "../../lib/model/fit/fitTrial.ts";
import type { FitHypothesis } from "../../lib/model/fit/fitHypotheses.ts";

/**
 * The fixed fields of the stand-in contexts with which the tests of the whole-curve stages
 * (peakStartWholeFits, wholeCurveSplits, structuredWholeSplit, laterEntryWholeFits,
 * unseenSPeakWholeFits, droppedPeakWholeFits, ecGridWholeFits, mergedPeakWholeFits) drive them without the model: a stand-in run's χ² is its reduced χ²,
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

/**
 * The stand-in context of the stages that only pick among readings of the peaks (unseen s peak,
 * dropped peak): every CB-side run reaches reduced χ² 1.1, a whole-curve run the χ² that `chiOf`
 * gives its hypothesis; parameters are the start given, else 1 per level, Ec `ecEV`, log₁₀ r 1 and
 * log₁₀ σ −1.7; no runs before; the fixed fields of {@link standInWholeFields}.
 */
export function standInPickingContext(chiOf: (h: FitHypothesis) => number, ecEV: number, eta: number, hypotheses: FitHypothesis[]) {
  return {
    trials: [] as FitTrial[],
    run: (h: FitHypothesis, _r: number | null, _iterations: number, from?: number[], set?: DataSet) => {
      const chi = set ? 1.1 : chiOf(h);
      return { hypothesis: h, bic: chi, side: set ? "CB" : "both", loop: { parameters: from ?? [...h.seeds.map(() => 1), ecEV, 1, -1.7], chiSquare: chi } } as unknown as FitTrial;
    },
    cbSide: { biasV: new Float64Array(0) } as unknown as DataSet,
    eta,
    ...standInWholeFields(),
    hypotheses,
  };
}
