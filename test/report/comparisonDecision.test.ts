// comparisonDecision (and the decision fields of failedModelComparison) on constructed comparisons.
// Expected values: BIC weights exp(−ΔBIC/2) normalised (closed form; G. Schwarz, Ann. Stat. 6, 461
// (1978); the evidence scale of R. E. Kass and A. E. Raftery, J. Am. Stat. Assoc. 90, 773 (1995)),
// the regime boundaries 3/7 and 1.5 of REGIME_LIMITS (common practice (no source)), and the
// documented decision rule (MODEL_DECISION_DEFAULTS: common practice (no source)).
import { describe, expect, it } from "vitest";
import { comparisonDecision, MODEL_DECISION_DEFAULTS } from "../../lib/report/comparisonDecision.ts";
import { failedModelComparison, type ModelComparisonJson } from "../../lib/report/modelComparisonJson.ts";
import type { FitAlternative } from "../../lib/model/fit/curveFit.ts";
import { expectDocumentedDefaults } from "../helpers/documentedDefaults.ts";
import { standInAlternative, standInComparison } from "../helpers/standInAlternative.ts";

/** An alternative with the fields the decision reads; the rest neutral. */
const alt = (hypothesis: string, rateRatio: number, chargingEnergyEV: number, weight: number): FitAlternative => standInAlternative(hypothesis, rateRatio, chargingEnergyEV, weight);

/** Weights of two runs ΔBIC apart, exp(−ΔBIC/2) normalised (closed form). */
const pair = (deltaBic: number): [number, number] => [1 / (1 + Math.exp(-deltaBic / 2)), Math.exp(-deltaBic / 2) / (1 + Math.exp(-deltaBic / 2))];

/** A good shell-filling fit, Γtip/Γsub = 3 ± se, Ec = 0.1 eV, with these alternatives. */
const comparison = standInComparison;

describe("comparisonDecision(comparison, rules, options)", () => {
  it("MODEL_DECISION_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(MODEL_DECISION_DEFAULTS).toEqual({ minWeight: 0.9, rateRatioSigmas: 1, agreeEcFraction: 0.1, sameAnswerEcFraction: 0.03, sameAnswerRateSigmas: 2 });
    expectDocumentedDefaults(new URL("../../lib/report/comparisonDecision.ts", import.meta.url), "ComparisonDecisionOptions", MODEL_DECISION_DEFAULTS);
  });

  it("lets a good fit decide where the rules are undetermined, when ΔBIC to the rival answer is 6 (weight 0.95 ≥ 0.9), not when it is 2 (0.73)", () => {
    const [w6, r6] = pair(6);
    const yes = comparisonDecision(comparison([alt("a", 3, 0.1, w6), alt("b", 0.3, 0.2, r6)]), { regime: "undetermined", chargingEnergyEV: null });
    expect(yes.decides).toBe(true);
    expect(yes.agreesWithRules).toBe(false);
    expect(yes.decision).toContain(`carry ${w6.toFixed(2)} of the BIC weight`);
    const [w2, r2] = pair(2);
    const no = comparisonDecision(comparison([alt("a", 3, 0.1, w2), alt("b", 0.3, 0.2, r2)]), { regime: "undetermined", chargingEnergyEV: null });
    expect(no.decides).toBe(false);
    expect(no.decision).toContain("0.73 of the BIC weight (< 0.9)");
  });

  it("adds the weights of groupings that give the same answer (same regime, Ec within 3 %): three equal runs of one model, 1/3 each, decide together", () => {
    const d = comparisonDecision(comparison([alt("assigned", 3, 0.1, 1 / 3), alt("shell-filling", 3.1, 0.1005, 1 / 3), alt("ladder-filling 2+6", 2.9, 0.0995, 1 / 3)]), { regime: "shell-filling", chargingEnergyEV: 0.1 });
    expect(d).toMatchObject({ decides: true, agreesWithRules: true });
    // The same split between answers that differ (another regime, Ec 20 % off) does not decide.
    const split = comparisonDecision(comparison([alt("assigned", 3, 0.1, 1 / 3), alt("x", 0.3, 0.1, 1 / 3), alt("y", 3, 0.12, 1 / 3)]), { regime: "shell-filling", chargingEnergyEV: 0.1 });
    expect(split.decides).toBe(false);
  });

  it("counts runs whose Γtip/Γsub lies across a regime boundary within 2 of the fit's standard errors as the same answer: 1.497 against 1.51 ± 0.014 yes, ± 0.004 no", () => {
    // The fit reads shell filling at 1.51 (≥ 1.5), its own run too; two runs of the same grouping ended at 1.497
    // (intermediate by the boundary), the same Ec. |ln(1.497/1.51)| = 0.0086 (closed form) against
    // 2 × 0.014/1.51 = 0.0185 (inside) and 2 × 0.004/1.51 = 0.0053 (outside).
    const runs = [alt("a", 1.51, 0.077, 1 / 3), alt("b", 1.497, 0.077, 1 / 3), alt("c", 1.497, 0.077, 1 / 3)];
    const undetermined = { regime: "undetermined", chargingEnergyEV: null };
    const near = { regime: "shell-filling", rateRatio: { value: 1.51, standardError: 0.014 }, quantities: { gapEV: null, chargingEnergyEV: { value: 0.077, standardError: 0.001 }, levelSpacingSPEV: null } } as Partial<ModelComparisonJson>;
    expect(comparisonDecision(comparison(runs, near), undetermined)).toMatchObject({ decides: true });
    const tight = { ...near, rateRatio: { value: 1.51, standardError: 0.004 } };
    const no = comparisonDecision(comparison(runs, tight), undetermined);
    expect(no.decides).toBe(false);
    // The winning grouping's own run (a) counts; b and c, across the boundary, do not.
    expect(no.decision).toContain("carry 0.33 of the BIC weight");
  });

  it("counts the winning grouping's own run, and compares the others with its Ec, where the fit reports its whole curve's values", () => {
    // The groupings were compared on the CB side: the winner ended at Ec 111.7 meV (weight 0.84), a
    // rival grouping at 109.8 meV (1.7 % from it, 0.16), both shell tunnelling; the whole curve
    // moved the winner's Ec to 122.4 meV (8.7 % from its CB side). Same answer: 0.84 + 0.16.
    const runs = [alt("winner", 0.232, 0.1117, 0.84), alt("rival", 0.331, 0.1098, 0.16), alt("other", 0.33, 0.15, 0)];
    const whole = { regime: "shell-tunneling", hypothesis: "winner", rateRatio: { value: 0.211, standardError: 0.004 }, quantities: { gapEV: null, chargingEnergyEV: { value: 0.1224, standardError: 0.0013 }, levelSpacingSPEV: null } } as Partial<ModelComparisonJson>;
    const d = comparisonDecision(comparison(runs, whole), { regime: "undetermined", chargingEnergyEV: null });
    expect(d.decides).toBe(true);
    expect(d.decision).toContain("carry 1.00 of the BIC weight");
    // Without a weighted run of the winning grouping the others are compared with the reported Ec (none within 3 %).
    const none = comparisonDecision(comparison(runs, { ...whole, hypothesis: "not among the runs" }), { regime: "undetermined", chargingEnergyEV: null });
    expect(none.decision).toContain("carry 0.00 of the BIC weight");
  });

  it("counts the runs at the winning grouping's own run's Γtip/Γsub where the whole curve moved the fit across a regime boundary from it", () => {
    // The CB side's winner ended at Γtip/Γsub 2.157 (shell filling by the boundary 1.5), Ec 179.5
    // meV, and the same grouping from a start × 0.32 at the same values: one model, weight 1/2 each
    // (closed form: equal BIC). The whole curve moved the fit to 1.447 ± 0.011 (intermediate).
    // |ln(2.157/2.157)| = 0 ≤ 2 × 0.011/1.447 (closed form): the same answer, 0.5 + 0.5.
    const runs = [alt("winner", 2.157, 0.1795, 0.5), alt("winner, refined (Γtip/Γsub × 0.32)", 2.1572, 0.1795, 0.5)];
    const whole = { regime: "intermediate", hypothesis: "winner", rateRatio: { value: 1.447, standardError: 0.011 }, quantities: { gapEV: null, chargingEnergyEV: { value: 0.1695, standardError: 0.0003 }, levelSpacingSPEV: null } } as Partial<ModelComparisonJson>;
    const d = comparisonDecision(comparison(runs, whole), { regime: "undetermined", chargingEnergyEV: null });
    expect(d.decides).toBe(true);
    expect(d.decision).toContain("carry 1.00 of the BIC weight");
    // A rival grouping at another Γtip/Γsub (|ln(2.6/2.157)| = 0.187 > 0.0152) with the same weight does not count.
    const rival = comparisonDecision(comparison([runs[0], alt("rival", 2.6, 0.1795, 0.5)], whole), { regime: "undetermined", chargingEnergyEV: null });
    expect(rival.decision).toContain("carry 0.50 of the BIC weight");
  });

  it("counts a rival grouping whose own whole-curve fit describes the curve and lands on the fit's answer, however far its CB-side Ec lay", () => {
    // The groupings were weighed on the CB side: the winner at Ec 140.7 meV (weight 0.65), a ladder
    // entered one carrier later at 161.1 meV (14.5 % off, 0.35), both intermediate. The fit's whole
    // curve: Ec 143.8 meV, Γtip/Γsub 0.571 ± 0.004. The rival's own whole-curve fit, started from its
    // CB-side values, reaches 143.9 meV (0.07 % from the fit's, inside 3 %) and 0.572 (intermediate):
    // the same answer, 0.65 + 0.35 (the documented rule, step 6).
    const whole = { regime: "intermediate", hypothesis: "winner", rateRatio: { value: 0.571, standardError: 0.004 }, quantities: { gapEV: null, chargingEnergyEV: { value: 0.1438, standardError: 0.0003 }, levelSpacingSPEV: null } } as Partial<ModelComparisonJson>;
    const undetermined = { regime: "undetermined", chargingEnergyEV: null };
    const rivalWhole = (chargingEnergyEV: number, rateRatio: number, describesCurve: boolean): FitAlternative => ({ ...alt("rival", 0.617, 0.1611, 0.35), wholeCurve: { rateRatio, chargingEnergyEV, reducedChiSquare: describesCurve ? 0.93 : 4, describesCurve } });
    const same = comparisonDecision(comparison([alt("winner", 0.561, 0.1407, 0.65), rivalWhole(0.1439, 0.572, true)], whole), undetermined);
    expect(same.decides).toBe(true);
    expect(same.decision).toContain("carry 1.00 of the BIC weight");
    // Its whole-curve fit elsewhere (Ec 5 % off the fit's), in another regime (Γtip/Γsub 2, shell
    // filling), or not describing the curve: another answer, 0.65 alone.
    for (const rival of [rivalWhole(0.151, 0.572, true), rivalWhole(0.1439, 2, true), rivalWhole(0.1439, 0.572, false)]) {
      const d = comparisonDecision(comparison([alt("winner", 0.561, 0.1407, 0.65), rival], whole), undetermined);
      expect(d.decides).toBe(false);
      expect(d.decision).toContain("carry 0.65 of the BIC weight");
    }
  });

  it("keeps the rules' reading of the same regime when the fit leaves a quantity undetermined (Δsp with a NaN error, or one larger than Δsp), and still answers where the rules are undetermined", () => {
    // The documented rule (step 4): a level beyond the points fitted is not determined; the rules place it.
    const blind = { quantities: { gapEV: null, chargingEnergyEV: { value: 0.1, standardError: 0.001 }, levelSpacingSPEV: { value: 0.6, standardError: NaN } } } as Partial<ModelComparisonJson>;
    const runs = [alt("assigned", 3, 0.1, 1)];
    const same = comparisonDecision(comparison(runs, blind), { regime: "shell-filling", chargingEnergyEV: 0.1 });
    expect(same).toMatchObject({ decides: false, agreesWithRules: true });
    expect(same.decision).toContain("leaves levelSpacingSPEV undetermined");
    expect(comparisonDecision(comparison(runs, blind), { regime: "undetermined", chargingEnergyEV: null }).decides).toBe(true);
    // A finite error larger than the value is no better: Δsp 0.6 ± 2×10⁶ eV does not know its own size.
    const huge = { quantities: { gapEV: null, chargingEnergyEV: { value: 0.1, standardError: 0.001 }, levelSpacingSPEV: { value: 0.6, standardError: 2e6 } } } as Partial<ModelComparisonJson>;
    expect(comparisonDecision(comparison(runs, huge), { regime: "shell-filling", chargingEnergyEV: 0.1 })).toMatchObject({ decides: false, agreesWithRules: true });
    // An error below the value (0.6 ± 0.5 eV) is determined, if loosely: the fit confirms the rules.
    const loose = { quantities: { gapEV: null, chargingEnergyEV: { value: 0.1, standardError: 0.001 }, levelSpacingSPEV: { value: 0.6, standardError: 0.5 } } } as Partial<ModelComparisonJson>;
    expect(comparisonDecision(comparison(runs, loose), { regime: "shell-filling", chargingEnergyEV: 0.1 }).decides).toBe(true);
    // Every quantity determined: the same fit confirms the rules.
    expect(comparisonDecision(comparison(runs), { regime: "shell-filling", chargingEnergyEV: 0.1 }).decides).toBe(true);
  });

  it("keeps the rules' answer when the fit is poor or failed, or its regime undetermined", () => {
    const alts = [alt("a", 3, 0.1, 1)];
    expect(comparisonDecision(comparison(alts, { status: "poor" }), { regime: "shell-filling", chargingEnergyEV: 0.1 })).toMatchObject({ decides: false, agreesWithRules: true });
    expect(comparisonDecision(comparison(alts, { regime: "undetermined" }), { regime: "shell-filling", chargingEnergyEV: 0.1 })).toMatchObject({ decides: false, agreesWithRules: null });
    const failed = failedModelComparison("no multiplets to start the fit from", "undecided", ["the rules left the regime undetermined"]);
    expect(failed).toMatchObject({ decides: false, agreesWithRules: null, ranBecause: ["the rules left the regime undetermined"] });
  });

  it("overrides a named regime only when Γtip/Γsub ± 1 SE (r·exp(±SE/r)) stays inside the fit's regime: 1.0 ± 0.1 yes, 1.3 ± 0.3 no (1.3·e^0.23 = 1.64 ≥ 1.5)", () => {
    const rules = { regime: "shell-filling", chargingEnergyEV: 0.1 };
    const inside = comparisonDecision(comparison([alt("a", 1, 0.1, 1)], { regime: "intermediate", rateRatio: { value: 1, standardError: 0.1 } }), rules);
    expect(inside).toMatchObject({ decides: true, agreesWithRules: false });
    expect(inside.decision).toContain("reads intermediate where the rules read shell-filling");
    const straddles = comparisonDecision(comparison([alt("a", 1.3, 0.1, 1)], { regime: "intermediate", rateRatio: { value: 1.3, standardError: 0.3 } }), rules);
    expect(straddles.decides).toBe(false);
    expect(straddles.decision).toContain("does not stay inside intermediate over ± 1 standard error");
  });

  it("says the fit disagrees on Ec when the two differ by more than 10 % of the rules' Ec", () => {
    const d = comparisonDecision(comparison([alt("a", 3, 0.1, 1)]), { regime: "shell-filling", chargingEnergyEV: 0.115 });
    expect(d.agreesWithRules).toBe(false);
    expect(d.decides).toBe(true);
    expect(d.decision).toContain("not on Ec (100.0 against 115.0 meV)");
  });
  it("a shell-tunnelling fit with Ec undetermined (error NaN, ecProfile): the rules' tunnelling reading stands; where the rules left the regime undetermined, or read filling, the fit still gives the regime (documented decision rule, note 4)", () => {
    const tunnelling = { ...alt("a", 0.005, 0.17, 1), regime: "shell-tunneling" };
    const undeterminedEc = { regime: "shell-tunneling" as const, rateRatio: { value: 0.005, standardError: 0.001 }, quantities: { gapEV: { value: 1.2, standardError: NaN }, chargingEnergyEV: { value: 0.17, standardError: NaN }, levelSpacingSPEV: { value: 0.3, standardError: 0.001 } } };
    const same = comparisonDecision(comparison([tunnelling], undeterminedEc), { regime: "shell-tunneling", chargingEnergyEV: null });
    expect(same).toMatchObject({ decides: false, agreesWithRules: true });
    expect(same.decision).toMatch(/leaves gapEV, chargingEnergyEV undetermined/);
    expect(comparisonDecision(comparison([tunnelling], undeterminedEc), { regime: "undetermined", chargingEnergyEV: null })).toMatchObject({ decides: true });
    expect(comparisonDecision(comparison([tunnelling], undeterminedEc), { regime: "shell-filling", chargingEnergyEV: 0.1 })).toMatchObject({ decides: true, agreesWithRules: false });
  });
});
