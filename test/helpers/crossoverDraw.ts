// A spectrum of the accuracy benchmark's crossover mix (Γtip/Γsub 0.2–5, the range bench/fit.ts
// uses), drawn by syntheticSpectrum, simulated by the fast model and analysed with its η: the truth
// is the simulation's own parameters.
import { simulateCurve } from "../../lib/model/simulate.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS } from "../../lib/model/syntheticSpectrum.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";

/** Start `start` of the crossover mix: its analysis, truth and scenario. */
export function crossoverDraw(start: number) {
  const ranges = { ...SYNTHETIC_DEFAULTS, rateRatio: { ...SYNTHETIC_DEFAULTS.rateRatio, intermediate: [0.2, 5] as [number, number] } };
  const { scenario, truth } = syntheticSpectrum(start, "intermediate", ranges);
  const sim = simulateCurve(scenario, { method: "fast", conductance: false });
  const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta: truth.eta });
  return { analysis, truth, scenario };
}
