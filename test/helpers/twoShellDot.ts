// A dot with an s doublet and a p sextet (ε_s = 0.45, ε_p = 0.78 eV) and a VB doublet and four
// (−0.62, −0.85 eV), Ec = 0.12 eV, η = 0.85, Γsub = 2e8/s, simulated by the master equation at
// 0.3 % noise and analysed: the truth is the simulation's own parameters, Γtip/Γsub = tipRatePerS / 2e8.
import { simulateCurve } from "../../lib/model/simulate.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";

export const eta = 0.85;
export const substrateRatePerS = 2e8;

/** The analysis of the dot's curve at this tip rate (1/s); `extra` overrides the scenario's fields. */
export function twoShellAnalysis(tipRatePerS: number, extra: Record<string, unknown> = {}) {
  const sim = simulateCurve({
    cb: [{ energyEV: 0.45, degeneracy: 2 }, { energyEV: 0.78, degeneracy: 6 }],
    vb: [{ energyEV: -0.62, degeneracy: 2 }, { energyEV: -0.85, degeneracy: 4 }],
    chargingEnergyEV: 0.12,
    eta,
    tipRatePerS,
    substrateRatePerS,
    temperatureK: 4.5,
    broadeningEV: 0.012,
    bias: { fromV: -2.2, toV: 2.3, stepV: 0.0025 },
    noise: { relative: 0.003, seed: 3 },
    ...extra,
  });
  return analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta });
}
