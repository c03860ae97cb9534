/**
 * Median timings after warm-up, for the targets stated as medians (one 2,000-point curve analysed
 * in ≤ 2 ms). Runs under plain Node with tsx, as the command does. Part of `npm run bench`.
 */
import { simulateCurve, analyzeCurve, fitCurve, type Curve } from "../lib/index.ts";

const scenario = {
  cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }],
  vb: [{ energyEV: -0.6, degeneracy: 2 }, { energyEV: -0.8, degeneracy: 4 }],
  chargingEnergyEV: 0.1,
  eta: 0.8,
  tipRatePerS: 1e9,
  substrateRatePerS: 1e8,
  temperatureK: 4.5,
  broadeningEV: 0.01,
  bias: { fromV: -2.0, toV: 2.2, stepV: 0.0021 },
  noise: { relative: 0.003, seed: 7 },
};
const sim = simulateCurve(scenario);
const curve: Curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "bench", metadata: {} } };
const analysis = analyzeCurve(curve, { eta: 0.8 });

function median(name: string, f: () => unknown, warmup: number, runs: number): void {
  for (let i = 0; i < warmup; i++) f();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  t.sort((a, b) => a - b);
  console.log(`${name.padEnd(52)} median ${t[runs >> 1].toFixed(2)} ms  (p10 ${t[Math.floor(runs * 0.1)].toFixed(2)}, p90 ${t[Math.floor(runs * 0.9)].toFixed(2)}; ${runs} runs)`);
}

median("analyzeCurve, 2,001 points", () => analyzeCurve(curve, { eta: 0.8 }), 200, 1000);
median("simulateCurve exact, s + p, 2,001 points", () => simulateCurve({ ...scenario, vb: [] }), 10, 60);
median("fitCurve", () => fitCurve(analysis), 3, 20);
