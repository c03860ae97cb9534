// trialErrors on the example dot of fitCurve's doc comment (simulated by the fast model); the
// expected scaling is a closed form: with χ²_red ≤ 1, cov = (JᵀJ)⁻¹ on residuals scaled by 1/σ,
// so every standard error is proportional to the noise σ.
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { analysis, eta, settings } from "../../helpers/fitDemo.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses } from "../../../lib/model/fit/fitHypotheses.ts";
import { trialErrors } from "../../../lib/model/fit/trialErrors.ts";
import { bandStepsMemo } from "../../../lib/model/fit/bandStepsMemo.ts";

describe("trialErrors(t, current, noiseA, warnings)", () => {
  it("with χ²_red ≤ 1 scales every standard error with the noise σ (closed form: J ∝ 1/σ)", () => {
    const runner = fitRunner(analysis, settings);
    const [h] = fitHypotheses(analysis, eta, false);
    const t = runner.run(h, null, 60);
    const atNoise = { ...t, loop: { ...t.loop, chiSquare: 0 } };
    const current = bandStepsMemo(h.seeds, eta, 4.5, runner.bandStore);
    const one = trialErrors(atNoise, current, runner.noiseA, []);
    const two = trialErrors(atNoise, current, 2 * runner.noiseA, []);
    expect(one.se.length).toBe(t.loop.parameters.length + 4);
    expect(one.se.every((s) => s > 0)).toBe(true);
    expectClose(two.se, one.se.map((s) => 2 * s), { rtol: 1e-6, what: "standard errors at 2σ" });
  }, 60_000);
});
