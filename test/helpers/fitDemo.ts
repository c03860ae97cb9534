// The example dot of fitCurve's doc comment, simulated by the fast model (its truth is the
// simulation's own parameters: ε_s = 0.6, ε_p = 0.9, ε_v = −1.2 eV, Ec = 0.1 eV, Γtip/Γsub = 10,
// η = 0.85), analysed, and the settings of one fit of it.
import { simulateCurve } from "../../lib/model/simulate.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";

export const eta = 0.85;
const sim = simulateCurve(
  {
    cb: [{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }],
    vb: [{ energyEV: -1.2, degeneracy: 2 }],
    chargingEnergyEV: 0.1,
    eta,
    tipRatePerS: 1e9,
    substrateRatePerS: 1e8,
    temperatureK: 4.5,
    broadeningEV: 0.01,
    bias: { fromV: -2, toV: 2.2, stepV: 0.002 },
    noise: { relative: 0.003, seed: 1 },
  },
  { method: "fast" },
);
export const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "demo", metadata: {} } }, { eta });
export const settings = { eta, temperatureK: 4.5, maxPoints: 800, maxEvaluations: 1_000_000_000, timeLimitMs: null, maxIterations: 60, chargingEnergyGuessEV: 0.1, chunkIterations: 4, convergenceTolerance: 1e-5, cbSideMarginFwhm: 2 };

