// CB peaks lying at a VB peak's substrate-junction resonance. Expected positions are a closed form
// derived from the bias division of the double-barrier junction: a fraction η of the bias drops
// across the tip junction and 1 − η across the substrate junction, so a hole addition seen through
// the tip at V_v < 0 (energy η·|V_v|) opens through the substrate at V = η·|V_v|/(1 − η) (η = 0.6,
// V_v = −1.5 V: 0.9/0.4 = 2.25 V; η = 0.85: 1.275/0.15 = 8.5 V). The tolerance is the project's
// own constant, chosen on the low-η benchmark and locked here.
import { describe, it, expect } from "vitest";
import { resonanceSuspects, RESONANCE_SUSPECT_DEFAULTS } from "../../../lib/model/fit/resonanceSuspects.ts";
import type { CurveAnalysis } from "../../../lib/pipeline/analyzeCurve.ts";

/** A minimal analysis: peaks at these biases (FWHM 40 mV), the given indices labelled resonances. */
function analysisOf(biasesV: number[], labelled: number[] = []): CurveAnalysis {
  const peaks = biasesV.map((biasV) => ({ biasV, fwhmV: 0.04, stepA: 1e-11 }));
  return { peaks, assignment: { evidence: { secondJunction: labelled.map((index) => ({ index })) } } } as unknown as CurveAnalysis;
}

describe("resonanceSuspects(analysis, eta)", () => {
  it("finds the CB peak at η·|V_v|/(1 − η) (η = 0.6, V_v = −1.5 V: 2.25 V)", () => {
    const got = resonanceSuspects(analysisOf([-1.5, 1.8, 2.25, 2.6]), 0.6);
    expect([...got]).toEqual([2.25]);
  });

  it("allows RESONANCE_SUSPECT_DEFAULTS.toleranceFwhm × the peak's FWHM and no more", () => {
    const tol = RESONANCE_SUSPECT_DEFAULTS.toleranceFwhm * 0.04;
    expect([...resonanceSuspects(analysisOf([-1.5, 1.8, 2.25 + 0.9 * tol]), 0.6)]).toHaveLength(1);
    expect([...resonanceSuspects(analysisOf([-1.5, 1.8, 2.25 + 1.1 * tol]), 0.6)]).toHaveLength(0);
  });

  it("never takes the CB side's first peak, nor mirrors a VB peak the rules labelled a resonance", () => {
    expect(resonanceSuspects(analysisOf([-1.2, 1.8, 2.6]), 0.6).size).toBe(0); // mirror 1.8 V is the first CB peak
    expect(resonanceSuspects(analysisOf([-1.5, 1.8, 2.25], [0]), 0.6).size).toBe(0);
  });

  it("finds nothing at η = 1 (no substrate-junction drop) or where the mirrors lie beyond the window", () => {
    expect(resonanceSuspects(analysisOf([-1.5, 1.8, 2.25]), 1).size).toBe(0);
    expect(resonanceSuspects(analysisOf([-1.5, 1.8, 2.25]), 0.85).size).toBe(0); // mirror at 8.5 V
  });

  it("RESONANCE_SUSPECT_DEFAULTS are locked", () => {
    expect(Object.isFrozen(RESONANCE_SUSPECT_DEFAULTS)).toBe(true);
    expect(RESONANCE_SUSPECT_DEFAULTS).toEqual({ toleranceFwhm: 0.5 });
  });
});
