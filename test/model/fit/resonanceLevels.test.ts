// CB peaks labelled second-junction resonances that may also hold a level's charging peak. The
// predicted position is a closed form from the bias division of the double-barrier junction: a
// fraction η of the bias drops across the tip junction and 1 − η across the substrate junction,
// so a hole addition seen through the tip at V_v < 0 opens through the substrate at
// η·|V_v|/(1 − η) (η = 0.6, V_v = −1.26 V: 0.756/0.4 = 1.89 V). Two features closer than their
// width merge into one peak between them (common practice (no source)). The constants are the
// project's own, chosen on the low-η benchmark and locked here.
import { describe, it, expect } from "vitest";
import { resonanceLevels, RESONANCE_LEVEL_DEFAULTS } from "../../../lib/model/fit/resonanceLevels.ts";
import type { CurveAnalysis } from "../../../lib/pipeline/analyzeCurve.ts";

const mirrorV = (eta: number, vbV: number) => (eta * -vbV) / (1 - eta);

/** A minimal analysis: peaks at these biases (FWHM 60 mV); `labelled` maps a peak's index to the VB peak index predicting it. */
function analysisOf(biasesV: number[], labelled: Record<number, number>, eta: number): CurveAnalysis {
  const peaks = biasesV.map((biasV) => ({ biasV, fwhmV: 0.06, stepA: 1e-11 }));
  const secondJunction = Object.entries(labelled).map(([i, src]) => ({ index: Number(i), sourceIndex: src, predictedV: mirrorV(eta, biasesV[src]) }));
  return { peaks, assignment: { evidence: { secondJunction } } } as unknown as CurveAnalysis;
}

describe("resonanceLevels(analysis, eta)", () => {
  it("returns a labelled resonance that is the CB side's first peak (η = 0.6, V_v = −1.26 V: 1.89 V)", () => {
    const a = analysisOf([-1.26, 1.89, 2.1, 2.65], { 1: 0 }, 0.6);
    expect(resonanceLevels(a, 0.6)).toEqual([1.89]);
  });

  it("returns one merged with s's second peak (second CB peak, 25 mV from its prediction, within a FWHM)", () => {
    const v = mirrorV(0.6, -1.35) - 0.025; // 2.0 V
    const a = analysisOf([-1.35, 1.8, v, 2.35], { 2: 0 }, 0.6);
    expect(resonanceLevels(a, 0.6)).toEqual([v]);
  });

  it("leaves a labelled resonance beyond the RESONANCE_LEVEL_DEFAULTS.lowestPeaks CB peaks nearest the gap", () => {
    const v = mirrorV(0.6, -1.7); // 2.55 V, the third CB peak
    const a = analysisOf([-1.7, 1.8, 2.1, v], { 3: 0 }, 0.6);
    expect(RESONANCE_LEVEL_DEFAULTS.lowestPeaks).toBe(2);
    expect(resonanceLevels(a, 0.6)).toEqual([]);
  });

  it("leaves one farther than RESONANCE_LEVEL_DEFAULTS.toleranceFwhm × its FWHM from its prediction", () => {
    const tol = RESONANCE_LEVEL_DEFAULTS.toleranceFwhm * 0.06;
    const near = analysisOf([-1.26, 1.89 + 0.9 * tol, 2.1], { 1: 0 }, 0.6);
    const far = analysisOf([-1.26, 1.89 + 1.1 * tol, 2.1], { 1: 0 }, 0.6);
    expect(resonanceLevels(near, 0.6)).toHaveLength(1);
    expect(resonanceLevels(far, 0.6)).toHaveLength(0);
  });

  it("returns nothing at η ≥ 1 or without labelled CB resonances", () => {
    expect(resonanceLevels(analysisOf([-1.26, 1.89, 2.1], { 1: 0 }, 0.6), 1)).toEqual([]);
    expect(resonanceLevels(analysisOf([-1.26, 1.89, 2.1], {}, 0.6), 0.6)).toEqual([]);
  });

  it("RESONANCE_LEVEL_DEFAULTS are locked", () => {
    expect(Object.isFrozen(RESONANCE_LEVEL_DEFAULTS)).toBe(true);
    expect(RESONANCE_LEVEL_DEFAULTS).toEqual({ lowestPeaks: 2, toleranceFwhm: 1 });
  });
});
