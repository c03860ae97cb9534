// p read again as three spin pairs (each orbital's two electrons charge one Ec apart, so p's six
// charging peaks are three pairs Ec/η wide: constant-interaction model, closed form), on draws of
// the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept), simulated by
// the project's model: every expected value is the simulation's truth, the tolerance the project's
// quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";
import { simulateCurve } from "../../lib/model/simulate.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS } from "../../lib/model/syntheticSpectrum.ts";

const lowEta = { ...SYNTHETIC_DEFAULTS, eta: [0.55, 0.65] as [number, number], secondJunction: "keep" as const };

describe("analyzeCurve(curve, { eta }): p read as three spin pairs past the resonances in it (low-η draws)", () => {
  // Draw 1131: p 2.732, 2.896 | 3.233, 3.397, 3.561, 3.724 V; a VB level's resonance at 3.067 V
  // between the pairs was read in p, and the shell's last peak left out.
  // Draw 115: p 2.779 … 4.109 V (whole, Ec/η = 0.266 V); resonances at 2.740, 3.231 and 3.667 V
  // crowd p's peaks, and p was read with four.
  for (const start of [1131, 115]) {
    it(`reads p's six charging peaks and leaves the resonances out (draw ${start})`, () => {
      const { scenario, truth } = syntheticSpectrum(start, "shell-filling", lowEta);
      const sim = simulateCurve(scenario, { method: "fast", conductance: false });
      const a = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "simulated", metadata: {} } }, { eta: truth.eta });
      const tolV = (0.25 * truth.chargingEnergyEV) / truth.eta;
      // The draw is the case: a resonance of the truth lies inside p's span, clear of p's peaks.
      const inside = truth.secondJunctionPeaksV.filter((v) => v > truth.pPeaksV[0] && v < truth.pPeaksV[5] && truth.pPeaksV.every((q) => Math.abs(q - v) > tolV));
      expect(inside.length).toBeGreaterThan(0);
      expect(a.assignment.regime).toBe("shell-filling");
      const p = a.assignment.multiplets.find((m) => m.band === "CB" && m.label === "p")!;
      expect(p.peaksV.length).toBe(6);
      expectClose(p.peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
      for (const v of inside) expect(p.peaksV.some((q) => Math.abs(q - v) < tolV / 2), `p holds the resonance at ${v} V`).toBe(false);
      expect(a.assignment.evidence.reasons.some((r) => r.startsWith("p read again as three spin pairs"))).toBe(true);
      // Ec against the truth, within the accuracy benchmark's 10 % for shell filling.
      expect(Math.abs(a.assignment.energies.chargingEnergyEV! / truth.chargingEnergyEV - 1)).toBeLessThan(0.1);
    }, 30_000);
  }
});
