// syntheticSpectrum: the truth it lists against the model's own parameters (simulated truth: the
// scenario's levels, Ec, η and rates) and the orthodox-theory current steps of lib/model
// (currentSteps, whose plateaus test/model/ladder.test.ts checks against closed forms). Second-
// junction resonances: closed form V = −E/(1 − η) for a CB addition energy E (+E/(1 − η) for the VB;
// D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena in Solids (Elsevier, 1991)).
import { describe, it, expect } from "vitest";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRanges, type SyntheticRegime } from "../../lib/model/syntheticSpectrum.ts";
import { currentSteps } from "../../lib/model/bandCurrent.ts";
import { simulateCurve } from "../../lib/model/simulate.ts";
import { expectClose } from "../helpers/expectClose.ts";

const lowEta: SyntheticRanges = { ...SYNTHETIC_DEFAULTS, eta: [0.55, 0.65], secondJunction: "keep" };

describe("SYNTHETIC_DEFAULTS", () => {
  it("are locked (the accuracy benchmark's ranges: common practice (no source))", () => {
    expect(Object.isFrozen(SYNTHETIC_DEFAULTS)).toBe(true);
    expect(SYNTHETIC_DEFAULTS.secondJunction).toBe("redraw");
    expect([SYNTHETIC_DEFAULTS.eta, SYNTHETIC_DEFAULTS.resolvability, SYNTHETIC_DEFAULTS.points]).toEqual([[0.65, 0.95], 0.7, 2000]);
  });
});

describe("syntheticSpectrum(seed, regime, ranges) with secondJunction: \"keep\"", () => {
  for (const regime of ["shell-filling", "shell-tunneling", "intermediate"] as SyntheticRegime[]) {
    it(`${regime}: every listed resonance is a substrate-side step of the model at −E/(1 − η), and a step of the simulated current`, () => {
      let listed = 0;
      for (let seed = 1; seed <= 25; seed++) {
        const { scenario, truth } = syntheticSpectrum(seed, regime, lowEta);
        const model = { ...scenario, relaxationRatePerS: scenario.relaxationRatePerS! };
        // One band at a time: CB steps at negative bias and VB steps at positive bias are the
        // substrate junction's.
        const cbSteps = currentSteps({ ...model, vb: [] }).steps;
        const vbSteps = currentSteps({ ...model, cb: [] }).steps;
        const substrate = [...cbSteps.filter((s) => s.biasV < 0), ...vbSteps.filter((s) => s.biasV > 0)];
        const tip = [...cbSteps.filter((s) => s.biasV > 0), ...vbSteps.filter((s) => s.biasV < 0)].map((s) => Math.abs(s.heightA)).sort((a, b) => a - b);
        const typical = tip[tip.length >> 1];
        for (const v of truth.secondJunctionPeaksV) {
          const step = substrate.find((s) => Math.abs(s.biasV - v) < 1e-9);
          expect(step, `seed ${seed}: ${v} V is not a substrate-side step`).toBeDefined();
          // Closed form: CB at −E/(1 − η) with E one of the ladder's addition energies ε + Ec·(N + ½).
          const e = Math.abs(v) * (1 - truth.eta);
          const levels = v < 0 ? scenario.cb : scenario.vb;
          const ec = truth.chargingEnergyEV;
          expect(levels.some((l) => Array.from({ length: 8 }, (_, n) => Math.abs(l.energyEV) + ec * (n + 0.5)).some((x) => Math.abs(x - e) < 1e-9))).toBe(true);
        }
        // The noise-free simulated current rises across each listed resonance by at least a fifth
        // of a typical tip-side step (the listing asks for a quarter; neighbours may overlap).
        if (truth.secondJunctionPeaksV.length && seed <= 8) {
          const sim = simulateCurve({ ...scenario, noise: null }, { method: "fast", conductance: false });
          const n = sim.currentA.length;
          const at = (v: number) => sim.currentA[Math.min(n - 1, Math.max(0, Math.round((v - scenario.bias.fromV) / scenario.bias.stepV)))];
          const w = (truth.peakFwhmV * truth.eta) / (1 - truth.eta); // the FWHM on the substrate side
          for (const v of truth.secondJunctionPeaksV) {
            const jump = Math.abs(at(v + Math.sign(v) * w) - at(v - Math.sign(v) * w));
            expect(jump, `seed ${seed}: no step at ${v.toFixed(3)} V`).toBeGreaterThan(0.2 * typical);
          }
        }
        listed += truth.secondJunctionPeaksV.length;
      }
      expect(listed).toBeGreaterThan(10); // the mix does put resonances in the window
    });
  }

  it("keeps the default draws (redraw) unchanged and lists no resonance there", () => {
    const { truth } = syntheticSpectrum(1, "shell-filling");
    expect(truth.secondJunctionPeaksV).toEqual([]);
    // The doc comment's example (values of this generator; the s doublet at (ε_s + Ec(n + ½))/η).
    expectClose(truth.sPeaksV, [0.921, 0.994], { atol: 5e-4 });
  });

  it("lists the VB peaks at −(|ε_v| + Ec·(n + ½))/η in shell filling (closed form)", () => {
    const { scenario, truth } = syntheticSpectrum(3, "shell-filling");
    const [v1, v2] = scenario.vb.map((l) => Math.abs(l.energyEV));
    const ec = truth.chargingEnergyEV, eta = truth.eta;
    expectClose(truth.valencePeaksV, [v1 + ec / 2, v1 + 1.5 * ec, ...[2, 3, 4, 5].map((n) => v2 + ec * (n + 0.5))].map((e) => -e / eta), { rtol: 1e-12 });
  });
});
