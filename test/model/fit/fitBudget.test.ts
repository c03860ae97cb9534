// The fit's work budget (FitOptions.maxEvaluations): checks that are exact by construction, not
// against a reference value. Two fits of one curve with the same budget give the same numbers
// bit for bit (the fit is deterministic: no clock, no random start); the evaluations counted at
// the stop equal the budget exactly; a budget the fit does not reach changes nothing (exact
// equality with an unlimited budget). The curve is the demo dot of test/helpers/fitDemo.ts
// (the simulation's own parameters as truth, closed form only in the sense that they are given).
import { describe, it, expect } from "vitest";
import { fitCurve, FIT_DEFAULTS } from "../../../lib/model/fit/fitCurve.ts";
import { DotspecError } from "../../../lib/util/errors.ts";
import { analysis } from "../../helpers/fitDemo.ts";

describe("fitCurve(analysis, { maxEvaluations })", () => {
  const free = fitCurve(analysis, { compareModels: true, maxEvaluations: Number.MAX_SAFE_INTEGER });

  it("a fit far from its budget is unchanged by it (exact) and says nothing cut it", () => {
    expect(free.work.stoppedBy).toBeNull();
    expect(free.work.evaluations).toBeLessThan(FIT_DEFAULTS.maxEvaluations);
    const bounded = fitCurve(analysis, { compareModels: true });
    expect(bounded.work).toEqual({ ...free.work, maxEvaluations: FIT_DEFAULTS.maxEvaluations });
    expect({ ...bounded, work: null }).toEqual({ ...free, work: null });
    expect(bounded.warnings.join(" ")).not.toMatch(/cut short/);
  });

  const budget = Math.floor(free.work.evaluations / 3);

  it("stops at exactly its budget, says so, and is at best poor", () => {
    const fit = fitCurve(analysis, { compareModels: true, maxEvaluations: budget });
    expect(fit.work).toEqual({ evaluations: budget, maxEvaluations: budget, timeLimitMs: null, stoppedBy: "budget" });
    expect(fit.warnings.join(" ")).toContain(`work budget of ${budget} model evaluations (the same on every machine)`);
    expect(fit.status).not.toBe("good");
    expect(fit.statusReasons.join(" ")).toMatch(/cut short/);
  });

  it("the same budget twice gives the same fit, bit for bit (exact)", () => {
    const a = fitCurve(analysis, { compareModels: true, maxEvaluations: budget });
    const b = fitCurve(analysis, { compareModels: true, maxEvaluations: budget });
    expect(b).toEqual(a);
    expect(b.chargingEnergyEV.value).toBe(a.chargingEnergyEV.value);
    expect(b.reducedChiSquare).toBe(a.reducedChiSquare);
  });

  it("a budget of one evaluation still returns a record (the starts), cut short", () => {
    const fit = fitCurve(analysis, { maxEvaluations: 1 });
    expect(fit.work.evaluations).toBe(1);
    expect(fit.work.stoppedBy).toBe("budget");
    expect(fit.status).not.toBe("good");
  });

  it("refuses a budget that is not a whole number of at least 1, and a time limit that is not positive", () => {
    for (const bad of [0, -5, 2.5, Number.NaN, Infinity]) {
      expect(() => fitCurve(analysis, { maxEvaluations: bad })).toThrow(DotspecError);
    }
    try {
      fitCurve(analysis, { maxEvaluations: 2.5 });
    } catch (err) {
      expect((err as DotspecError).code).toBe("options/not-integer");
      expect((err as Error).message).toMatch(/maxEvaluations must be an integer of at least 1; got 2\.5/);
    }
    expect(() => fitCurve(analysis, { timeLimitMs: 0 })).toThrow(/timeLimitMs/);
    expect(() => fitCurve(analysis, { maxEvaluation: 100 } as never)).toThrow(/maxEvaluation/);
  });

  it("a time limit is opt-in: without one, none is recorded", () => {
    expect(free.work.timeLimitMs).toBeNull();
  });
});
