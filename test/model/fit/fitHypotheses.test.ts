// The hypotheses the fit compares, on a curve simulated at Γtip/Γsub = 0.5 (the truth is the
// model's own parameters: ε_s = 0.6 eV, ε_p = 0.9 eV, ε_v = −1.2 eV, Ec = 0.1 eV, η = 0.85). The
// expected seed positions are closed forms of orthodox theory: a level ε entered with n carriers
// already in the dot opens at (ε + Ec·(n + ½))/η.
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { fitHypotheses, FIT_HYPOTHESES_DEFAULTS } from "../../../lib/model/fit/fitHypotheses.ts";
import { simulateCurve } from "../../../lib/model/simulate.ts";
import { analyzeCurve } from "../../../lib/pipeline/analyzeCurve.ts";

const eta = 0.85;
const sim = simulateCurve({ cb: [{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }], vb: [{ energyEV: -1.2, degeneracy: 2 }], chargingEnergyEV: 0.1, eta,
  tipRatePerS: 5e7, substrateRatePerS: 1e8, temperatureK: 4.5, broadeningEV: 0.01, bias: { fromV: -2, toV: 2.2, stepV: 0.002 }, noise: { relative: 0.003, seed: 1 } }, { method: "fast" });
const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta });

describe("fitHypotheses(analysis, eta, all)", () => {
  it("gives only the assignment when not comparing", () => {
    expect(fitHypotheses(analysis, eta, false).map((h) => h.name)).toEqual(["assigned"]);
  });

  it("reads the ladder from the empty dot: s at (ε_s + Ec/2)/η, p at (ε_p + Ec/2)/η, Ec₀ from the s doublet", () => {
    const all = fitHypotheses(analysis, eta, true);
    const names = all.map((h) => h.name);
    expect(names).toContain("ladder-empty 2+6");
    expect(names).toContain("ladder-filling 2+6");
    const empty = all.find((h) => h.name === "ladder-empty 2+6")!;
    const cb = empty.seeds.filter((s) => s.band === "CB");
    expect(cb.map((s) => [s.label, s.degeneracy, s.before])).toEqual([["s", 2, 0], ["p", 6, 0]]);
    expectClose(cb[0].firstPeakV, (0.6 + 0.05) / eta, { atol: 0.01, what: "s from the empty dot (closed form)" });
    expectClose(cb[1].firstPeakV, (0.9 + 0.05) / eta, { atol: 0.01, what: "p from the empty dot (closed form)" });
    expectClose(empty.chargingEnergyStartEV!, 0.1, { rtol: 0.05, what: "Ec₀ = η·(second s peak − first)" });
    expect(empty.cbDegeneracies).toEqual([2, 6]);
    // Every hypothesis other than the assignment keeps its master equation small.
    for (const h of all.slice(1)) expect(h.states).toBeLessThanOrEqual(FIT_HYPOTHESES_DEFAULTS.maxStatesPerBand);
  });

  it("offers p whole, 2+4 and 2+2+2 (the window permitting)", () => {
    const layouts = new Set(fitHypotheses(analysis, eta, true).filter((h) => h.kind === "ladder-filling").map((h) => h.cbDegeneracies.join("+")));
    expect(layouts.has("2+6")).toBe(true);
    expect(layouts.has("2+2+4")).toBe(true);
  });

  it("at η = 0.85 no VB peak's substrate-junction mirror falls in the window: no off-resonance ladders", () => {
    // The VB peak near −1.47 V mirrors to 0.85·1.47/0.15 ≈ 8.3 V, far beyond the CB side.
    expect(fitHypotheses(analysis, eta, true).some((h) => h.name.endsWith("off-resonance"))).toBe(false);
  });

  it("FIT_HYPOTHESES_DEFAULTS are locked", () => {
    expect(Object.isFrozen(FIT_HYPOTHESES_DEFAULTS)).toBe(true);
    expect(FIT_HYPOTHESES_DEFAULTS).toEqual({
      pLayouts: [[6], [2, 4], [2, 2, 2]],
      maxStatesPerBand: 100,
      fillingStartLog10: Math.log10(5),
      emptyStartLog10: Math.log10(0.5),
      emptyEntryElectrons: [0, 1],
      ladderTolerance: 0.25,
      ladderNoiseRatio: 0.05,
      resonanceFamily: true,
    });
  });
});
