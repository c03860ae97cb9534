// fittedScenario: a fit as a scenario. Check values: the fit's own model (closed form: every
// current of the master equation scales with a common factor of all rates, so the scenario with
// the fitted rate scale reproduces the fitted model less its offset b0 and background b1·V + b3·V³),
// and the example scenario's parameters (levels 0.5/0.8 eV, Ec 0.1 eV, η 0.8, Γtip/Γsub 10).
import { describe, expect, it } from "vitest";
import { analyzeCurve, fitCurve, fittedScenario, simulateCurve } from "../../lib/index.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { errorOf } from "../helpers/errors.ts";

const sim = simulateCurve(EXAMPLE_SCENARIO, { method: "fast", conductance: false });
const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "example.csv", metadata: {} } };
const analysis = analyzeCurve(curve, { eta: EXAMPLE_SCENARIO.eta });
const fit = fitCurve(analysis);

describe("fittedScenario(fit, analysis)", () => {
  it("reproduces the fitted model, less its offset and background, with the fast form", () => {
    const s = fittedScenario(fit, analysis);
    const model = simulateCurve(s, { method: "fast", conductance: false });
    const { biasV, modelA } = fit.residuals;
    const at = new Map(Array.from(model.biasV, (v, i) => [v.toFixed(9), model.currentA[i]]));
    const dot = Array.from(biasV, (v) => at.get(v.toFixed(9))!);
    const expected = Array.from(biasV, (v, i) => modelA[i] - fit.offsetA.value - fit.backgroundLinearS.value * v - fit.backgroundCubicAPerV3.value * v ** 3);
    const fullScale = Math.max(...expected.map(Math.abs));
    expectClose(dot, expected, { atol: 1e-6 * fullScale, what: "scenario current vs fitted model (A)" });
  });

  it("carries the fitted levels, Ec, η and rate ratio, near the scenario the curve came from", () => {
    const s = fittedScenario(fit, analysis);
    expectClose(s.cb.map((l) => l.energyEV), [0.5, 0.8], { atol: 0.005 });
    expectClose(s.chargingEnergyEV, 0.1, { rtol: 0.03 });
    expect(s.eta).toBe(0.8);
    expectClose(s.tipRatePerS / s.substrateRatePerS, fit.rateRatio.value, { rtol: 1e-12 });
    expect(s.noise).toBeNull();
  });

  it("throws options/unknown-key for an option it does not take", () => {
    expect(errorOf(() => fittedScenario(fit, analysis, { eta: 0.7 } as never)).code).toBe("options/unknown-key");
  });
});
