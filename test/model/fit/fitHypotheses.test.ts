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

  it("at low η reads a labelled resonance merged with s's second peak as that charging peak too (on-resonance ladders)", () => {
    // η = 0.6, ε_s = 1.075 eV, Ec = 0.1 eV: s opens at (ε_s + Ec/2)/η = 1.875 V and (ε_s + 3Ec/2)/η =
    // 2.042 V; the VB level ε_v = −0.767 eV opens at −(|ε_v| + Ec/2)/η = −1.362 V through the tip and
    // through the substrate at (|ε_v| + Ec/2)/(1 − η) = 2.042 V, on s's second peak. The rules
    // reading that peak as the resonance alone is constructed by labelling it so.
    const lowEta = 0.6;
    const low = simulateCurve({ cb: [{ energyEV: 1.075, degeneracy: 2 }, { energyEV: 1.45, degeneracy: 6 }], vb: [{ energyEV: -0.767, degeneracy: 2 }, { energyEV: -1.1, degeneracy: 4 }], chargingEnergyEV: 0.1, eta: lowEta,
      tipRatePerS: 5e8, substrateRatePerS: 5e7, temperatureK: 4.5, broadeningEV: 0.01, bias: { fromV: -3, toV: 3.3, stepV: 0.002 }, noise: { relative: 0.003, seed: 1 } }, { method: "fast" });
    const a = analyzeCurve({ biasV: low.biasV, currentA: low.currentA, sweeps: [low.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta: lowEta });
    const at = (v: number) => a.peaks.findIndex((p) => Math.abs(p.biasV - v) < 0.02);
    const [merged, source] = [at(1.225 / 0.6), at(-0.817 / 0.6)];
    expect(merged).toBeGreaterThanOrEqual(0);
    expect(source).toBeGreaterThanOrEqual(0);
    const ev = a.assignment.evidence;
    const labelled = { ...a, assignment: { ...a.assignment, evidence: { ...ev, secondJunction: [...ev.secondJunction, { index: merged, sourceIndex: source, predictedV: 0.817 / 0.4 }] } } };
    const on = fitHypotheses(labelled, lowEta, true).find((h) => h.name === "ladder-filling 2+6 on-resonance")!;
    expect(on).toBeDefined();
    expectClose(on.seeds[0].firstPeakV, 1.125 / 0.6, { atol: 0.01, what: "s at (ε_s + Ec/2)/η (closed form)" });
    // The VB doublet opens at −(|ε_v| + Ec/2)/η and −(|ε_v| + 3Ec/2)/η: η × its spacing is Ec.
    expectClose(on.chargingEnergyStartEV!, 0.1, { rtol: 0.05, what: "Ec₀ = η·(spacing of the VB's first two peaks)" });
    // Without it, the rules' own reading has no such ladder.
    expect(fitHypotheses(a, lowEta, true).some((h) => h.name.endsWith("on-resonance"))).toBe(ev.secondJunction.some((r) => r.index === merged));
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
      resonanceLevelFamily: true,
    });
  });
});
