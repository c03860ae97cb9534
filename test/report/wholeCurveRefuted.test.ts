// wholeCurveRefuted, and step 7 of comparisonDecision that reads it, on constructed runs.
// Expected values: BIC weights exp(−ΔBIC/2) normalised (closed form; G. Schwarz, Ann. Stat. 6, 461
// (1978)), renormalised over the runs left (closed form); the bar a whole-curve fit must meet to
// describe the curve (reduced χ² ≤ 3, no residual structure: FIT_DEFAULTS.wholeCurveChiSquare) and
// the factor 2 (WHOLE_CURVE_REFUTED_DEFAULTS: common practice (no source)).
import { describe, expect, it } from "vitest";
import { wholeCurveRefuted, WHOLE_CURVE_REFUTED_DEFAULTS } from "../../lib/report/wholeCurveRefuted.ts";
import { comparisonDecision } from "../../lib/report/comparisonDecision.ts";
import type { ModelComparisonJson } from "../../lib/report/modelComparisonJson.ts";
import type { FitAlternative } from "../../lib/model/fit/curveFit.ts";
import { expectDocumentedDefaults } from "../helpers/documentedDefaults.ts";
import { standInAlternative, standInComparison } from "../helpers/standInAlternative.ts";

/** A CB-side run with its own whole-curve fit (or none). */
const run = (hypothesis: string, weight: number, rateRatio: number, chargingEnergyEV: number, whole?: NonNullable<FitAlternative["wholeCurve"]>): FitAlternative =>
  standInAlternative(hypothesis, rateRatio, chargingEnergyEV, weight, { reducedChiSquare: 0.89, ...(whole ? { wholeCurve: whole } : {}) });

// Shaped on the low-η benchmark's seed 5001 draw 5199 (shell filling, Ec 63.1 meV, Γtip/Γsub 21): the
// winner weighs 0.743 on the CB side and its whole-curve fit describes the curve at reduced χ² 1.00
// (Ec 64.0 meV, Γtip/Γsub 18.9); two rivals, 0.128 each, whose whole-curve fits stay at 8.88 and 9.09.
const own = run("ladder-filling 2+6", 0.743, 14.9, 0.0696, { rateRatio: 18.9, chargingEnergyEV: 0.064, reducedChiSquare: 1.0, describesCurve: true });
const rivalA = run("ladder-empty-1 2+2+4", 0.1285, 11.6, 0.0668, { rateRatio: 2.77, chargingEnergyEV: 0.0836, reducedChiSquare: 8.88, describesCurve: false });
const rivalB = run("ladder-empty-1 2+2+2", 0.1285, 11.6, 0.0668, { rateRatio: 3.23, chargingEnergyEV: 0.0691, reducedChiSquare: 9.09, describesCurve: false });

/** The fit's record: good, shell filling at the winner's whole-curve values. */
const comparison = (alternatives: FitAlternative[], ecEV = 0.064): ModelComparisonJson =>
  standInComparison(alternatives, {
    hypothesis: "ladder-filling 2+6",
    quantities: { gapEV: { value: 1.96, standardError: 0.001 }, chargingEnergyEV: { value: ecEV, standardError: 0.0004 }, levelSpacingSPEV: { value: 0.33, standardError: 0.002 } },
    rateRatio: { value: 18.9, standardError: 1.8 },
  });
const rules = { regime: "shell-filling", chargingEnergyEV: 0.0627 };

describe("wholeCurveRefuted(input, options)", () => {
  it("WHOLE_CURVE_REFUTED_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(WHOLE_CURVE_REFUTED_DEFAULTS).toEqual({ chiSquareRatio: 2, sameEcFraction: 0.03 });
    expectDocumentedDefaults(new URL("../../lib/report/wholeCurveRefuted.ts", import.meta.url), "WholeCurveRefutedOptions", WHOLE_CURVE_REFUTED_DEFAULTS);
  });

  it("refutes the rivals whose whole-curve fits do not describe the curve, at least twice the fit's reduced χ²", () => {
    expect(wholeCurveRefuted({ rivals: [rivalA, rivalB], own, fitChargingEnergyEV: 0.064 })).toEqual([rivalA, rivalB]);
    // 1.9 × the fit's (below the factor 2), or describing the curve (2.9 ≤ 3), or not fitted to the whole curve: kept.
    const near = run("near", 0.1, 11, 0.067, { rateRatio: 3, chargingEnergyEV: 0.07, reducedChiSquare: 1.9, describesCurve: false });
    const describes = run("describes", 0.1, 11, 0.067, { rateRatio: 3, chargingEnergyEV: 0.07, reducedChiSquare: 2.9, describesCurve: true });
    const unfitted = run("unfitted", 0.1, 11, 0.067);
    expect(wholeCurveRefuted({ rivals: [near, describes, unfitted], own, fitChargingEnergyEV: 0.064 })).toEqual([]);
    // A weightless rival is nothing to set aside.
    expect(wholeCurveRefuted({ rivals: [{ ...rivalA, weight: 0 }], own, fitChargingEnergyEV: 0.064 })).toEqual([]);
  });

  it("refutes nothing where the fit's answer is not its own grouping's whole-curve fit describing the curve", () => {
    // No own run, an own run without a whole-curve fit, one that does not describe the curve, or one whose Ec lies 5 % from the fit's (> 3 %).
    for (const o of [null, run("own", 0.743, 14.9, 0.0696), { ...own, wholeCurve: { ...own.wholeCurve!, reducedChiSquare: 3.5, describesCurve: false } }, { ...own, wholeCurve: { ...own.wholeCurve!, chargingEnergyEV: 0.0672 } }]) {
      expect(wholeCurveRefuted({ rivals: [rivalA, rivalB], own: o, fitChargingEnergyEV: 0.064 })).toEqual([]);
    }
    expect(wholeCurveRefuted({ rivals: [rivalA], own, fitChargingEnergyEV: null })).toEqual([]);
  });

  it("honours its options: a factor 10 keeps rivals at 8.9 and 9.1 × the fit's reduced χ²", () => {
    expect(wholeCurveRefuted({ rivals: [rivalA, rivalB], own, fitChargingEnergyEV: 0.064 }, { chiSquareRatio: 10 })).toEqual([]);
  });
});

describe("comparisonDecision step 7: rivals the whole curve refutes", () => {
  it("lets the fit decide once the refuted rivals are set aside: 0.743 / (1 − 0.257) = 1.00 ≥ 0.9", () => {
    const d = comparisonDecision(comparison([own, rivalA, rivalB]), rules);
    expect(d.decides).toBe(true);
    expect(d.decision).toContain("carry 1.00 of the BIC weight (≥ 0.9) once the rival groupings whose own whole-curve fits do not describe the curve (0.26 of the weight) are set aside");
  });

  it("weighs the rivals left: with a third rival that describes the curve (weight 0.1), 0.643 / (1 − 0.257) = 0.865 < 0.9", () => {
    const describes = run("describes", 0.1, 3, 0.09, { rateRatio: 3, chargingEnergyEV: 0.09, reducedChiSquare: 1.1, describesCurve: true });
    const d = comparisonDecision(comparison([{ ...own, weight: 0.643 }, rivalA, rivalB, describes]), rules);
    expect(d.decides).toBe(false);
    expect(d.decision).toContain(`carry ${(0.643 / (1 - 0.257)).toFixed(2)} of the BIC weight (< 0.9)`);
  });

  it("leaves the weights as they were where the fit's own whole-curve fit does not describe the curve: 0.74 < 0.9", () => {
    const poorOwn = { ...own, wholeCurve: { ...own.wholeCurve!, reducedChiSquare: 4, describesCurve: false } };
    const d = comparisonDecision(comparison([poorOwn, rivalA, rivalB]), rules);
    expect(d.decides).toBe(false);
    expect(d.decision).toContain("carry 0.74 of the BIC weight (< 0.9)");
  });
});
