/**
 * Speed benchmarks (vitest bench): `npm run bench`. Targets from the issues: full analysis of one
 * 2,000-point curve ≤ 2 ms median; simulating one 2,000-point s + p curve ≤ 50 ms; fitting one
 * curve ≤ 2 s. Numbers measured on the project machine are in the README.
 */
import { bench, describe } from "vitest";
import { simulateCurve, analyzeCurve, parseCurveText, formatCurveCsv, type Curve } from "../lib/index.ts";
import { fitCurve } from "../lib/model/fit/fitCurve.ts";
import { BENCH_SCENARIO } from "../test/fixtures/exampleScenario.ts";

const scenario = BENCH_SCENARIO;
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
