/**
 * Speed benchmarks (vitest bench): `npm run bench`. Targets from the issues: full analysis of one
 * 2,000-point curve ≤ 2 ms median; simulating one 2,000-point s + p curve ≤ 50 ms; fitting one
 * curve ≤ 2 s. Numbers measured on the project machine are in the README.
 */
import { bench, describe } from "vitest";
import { simulateCurve, analyzeCurve, parseCurveText, formatCurveCsv, type Curve } from "../lib/index.ts";
import { fitCurve } from "../lib/model/fitCurve.ts";

const scenario = {
  cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }],
  vb: [{ energyEV: -0.6, degeneracy: 2 }, { energyEV: -0.8, degeneracy: 4 }],
  chargingEnergyEV: 0.1,
  eta: 0.8,
  tipRatePerS: 1e9,
  substrateRatePerS: 1e8,
  temperatureK: 4.5,
  broadeningEV: 0.01,
  bias: { fromV: -2.0, toV: 2.2, stepV: 0.0021 }, // 2,001 points
  noise: { relative: 0.003, seed: 7 },
};
const spOnly = { ...scenario, vb: [] };
const sim = simulateCurve(scenario);
const curve: Curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "bench", metadata: {} } };
const analysis = analyzeCurve(curve, { eta: 0.8 });
const csv = formatCurveCsv({ biasV: sim.biasV, currentA: sim.currentA });

describe("one 2,000-point curve", () => {
  bench(
    "analyzeCurve (conductance, peaks, assignment)",
    () => {
      analyzeCurve(curve, { eta: 0.8 });
    },
    { warmupIterations: 100, time: 3000 },
  );
  bench("parseCurveText (2,000 rows)", () => {
    parseCurveText(csv);
  });
});

describe("model", () => {
  bench("simulateCurve exact, s + p levels, 2,000 points", () => {
    simulateCurve(spOnly);
  });
  bench("simulateCurve exact, s + p + two VB levels, 2,000 points", () => {
    simulateCurve(scenario);
  });
  bench("simulateCurve fast, s + p + two VB levels", () => {
    simulateCurve(scenario, { method: "fast" });
  });
  bench(
    "fitCurve (from the peak-based assignment)",
    () => {
      fitCurve(analysis);
    },
    { iterations: 5, time: 0 },
  );
});
