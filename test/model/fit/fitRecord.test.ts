// fitRecord on the example dot of fitCurve's doc comment (simulated by the fast model: Ec 0.1 eV,
// Γtip/Γsub 10, η 0.85). Checks: a level's bias is its energy over η (voltage division, the
// definition of the lever arm η); the rate ratio's error is ln 10 · r · σ(log₁₀ r) (first-order
// error propagation, closed form); the regime from r = 10 is shell filling (Γtip/Γsub ≫ 1: the dot
// fills faster than it empties, orthodox theory).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { analysis, eta, settings } from "../../helpers/fitDemo.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses } from "../../../lib/model/fit/fitHypotheses.ts";
import { trialErrors } from "../../../lib/model/fit/trialErrors.ts";
import { bandStepsMemo } from "../../../lib/model/fit/bandStepsMemo.ts";
import { fitRecord } from "../../../lib/model/fit/fitRecord.ts";
import { parameterIndex } from "../../../lib/model/fit/parameterModel.ts";
import { FIT_DEFAULTS } from "../../../lib/model/fit/fitDefaults.ts";

describe("fitRecord(input)", () => {
  it("reports levels in energy and bias, Ec, Γtip/Γsub with its propagated error, and the regime of the ratio", () => {
    const runner = fitRunner(analysis, settings);
    const [h] = fitHypotheses(analysis, eta, false);
    const best = runner.run(h, null, 60);
    const current = bandStepsMemo(h.seeds, eta, 4.5, runner.bandStore);
    const warnings: string[] = [];
    const errors = trialErrors(best, current, runner.noiseA, warnings);
    const work = { evaluations: 123, maxEvaluations: 22_000, timeLimitMs: null, stoppedBy: null };
    const fit = fitRecord({
      analysis, best, errors, eta, noiseA: runner.noiseA, assignedTrial: best, winner: best, plausible: [best], implausibleOf: () => [],
      reduced: (t) => t.loop.chiSquare / Math.max(1, t.set.biasV.length - t.loop.parameters.length - 4), run: runner.run, maxIterations: 60,
      limits: FIT_DEFAULTS, cutShort: null, evidence: ["stand-in evidence"], warnings, trials: [best], finalists: [best], weights: [1], wholeAnswers: new Map(), work: () => work,
    });
    const at = parameterIndex(h.seeds.length);
    const p = best.loop.parameters;
    expect(fit.status).toBe("good");
    expect(fit.regime).toBe("shell-filling");
    expect(fit.work).toEqual(work);
    expect(fit.evidence).toEqual(["stand-in evidence"]);
    expect(fit.alternatives).toHaveLength(1);
    expect(fit.alternatives[0].weight).toBe(1);
    expectClose(fit.chargingEnergyEV.value, 0.1, { rtol: 0.03, what: "Ec (simulated 0.1 eV)" });
    expectClose(fit.chargingEnergyV.value, p[at.chargingEnergy] / eta, { rtol: 1e-12, what: "Ec in bias = Ec / η" });
    for (const level of fit.levels) expectClose(level.energyV.value, level.energyEV.value / eta, { rtol: 1e-12, what: `${level.label} bias = energy / η` });
    const r = 10 ** p[at.logRateRatio];
    expectClose(fit.rateRatio.value, r, { rtol: 1e-12, what: "Γtip/Γsub" });
    expectClose(fit.rateRatio.standardError, Math.LN10 * r * errors.se[at.logRateRatio], { rtol: 1e-12, what: "σ(r) = ln 10 · r · σ(log₁₀ r)" });
    expect(fit.residuals.residualA.length).toBe(best.set.biasV.length);
  }, 60_000);
  it("is failed, with the regime undetermined, where no run is plausible", () => {
    const runner = fitRunner(analysis, settings);
    const [h] = fitHypotheses(analysis, eta, false);
    const best = runner.run(h, null, 20);
    const current = bandStepsMemo(h.seeds, eta, 4.5, runner.bandStore);
    const errors = trialErrors(best, current, runner.noiseA, []);
    const fit = fitRecord({
      analysis, best, errors, eta, noiseA: runner.noiseA, assignedTrial: best, winner: best, plausible: [], implausibleOf: () => ["stand-in: Ec above the gap"],
      reduced: () => 1, run: runner.run, maxIterations: 20, limits: FIT_DEFAULTS, cutShort: null, evidence: [], warnings: [], trials: [best], finalists: [best], weights: [1], wholeAnswers: new Map(),
      work: () => ({ evaluations: 1, maxEvaluations: 22_000, timeLimitMs: null, stoppedBy: null }),
    });
    expect(fit.status).toBe("failed");
    expect(fit.regime).toBe("undetermined");
    expect(fit.statusReasons[0]).toBe("no hypothesis is physically plausible");
  }, 60_000);
});
