// startingScenario: the fit's start as a scenario whose rates match the measured current.
// Check values: the example scenario's own parameters (levels 0.5/0.8 eV, Ec 0.1 eV, η 0.8,
// Γtip/Γsub = 1e9/1e8 = 10). Inverting the closed-form peak position V = (ε + Ec(n + ½))/η of
// orthodox theory gives ε back from the first peak of each level; every current of the master
// equation is proportional to a common factor of all rates (closed form: the rates enter the
// stationary equations linearly), so least squares for that factor recovers Γsub.
import { describe, expect, it } from "vitest";
import { analyzeCurve, simulateCurve, startingScenario, STARTING_SCENARIO_DEFAULTS, fitStart } from "../../lib/index.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { errorOf } from "../helpers/errors.ts";

const sim = simulateCurve(EXAMPLE_SCENARIO, { method: "fast", conductance: false });
const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "example.csv", metadata: {} } };
const analysis = analyzeCurve(curve, { eta: EXAMPLE_SCENARIO.eta });

describe("startingScenario(analysis)", () => {
  it("STARTING_SCENARIO_DEFAULTS is locked", () => {
    expect(STARTING_SCENARIO_DEFAULTS).toEqual({ relaxationRateFactor: 1000, fallbackSubstrateRatePerS: 1e8 });
    expect(Object.isFrozen(STARTING_SCENARIO_DEFAULTS)).toBe(true);
  });

  it("recovers the levels, Ec and η of the scenario the curve came from", () => {
    const s = startingScenario(analysis);
    expect(analysis.assignment.regime).toBe("shell-filling");
    expect(s.cb.map((l) => l.degeneracy)).toEqual([2, 6]);
    expectClose(s.cb.map((l) => l.energyEV), [0.5, 0.8], { atol: 0.005, what: "CB levels (eV)" });
    expectClose(s.vb[0].energyEV, -0.6, { atol: 0.005, what: "first VB level (eV)" });
    expectClose(s.chargingEnergyEV, 0.1, { rtol: 0.02, what: "Ec (eV)" });
    expect(s.eta).toBe(0.8);
  });

  it("scales the rates to the measured current: Γsub ≈ 1e8/s and Γtip/Γsub = the start ratio 10", () => {
    const s = startingScenario(analysis);
    expectClose(s.substrateRatePerS, EXAMPLE_SCENARIO.substrateRatePerS, { rtol: 0.1, what: "Γsub (1/s)" });
    expectClose(s.tipRatePerS / s.substrateRatePerS, fitStart(analysis).rateRatio, { rtol: 1e-12 });
  });

  it("uses the bias axis of the analysed curve and adds no noise", () => {
    const s = startingScenario(analysis);
    expect(s.bias.fromV).toBe(analysis.conductance.biasV[0]);
    expect(s.bias.stepV).toBe(analysis.conductance.stepV);
    expect(s.noise).toBeNull();
    expect(simulateCurve(s, { method: "fast", conductance: false }).biasV.length).toBe(analysis.conductance.biasV.length);
  });

  it("throws options/unknown-key for an option it does not take", () => {
    expect(errorOf(() => startingScenario(analysis, { maxIterations: 3 } as never)).code).toBe("options/unknown-key");
  });
});
