/**
 * Median timings after warm-up, for the targets stated as medians (one 2,000-point curve analysed
 * in ≤ 2 ms). Runs under plain Node with tsx, as the command does. Part of `npm run bench`.
 */
import { simulateCurve, analyzeCurve, fitCurve, type Curve } from "../lib/index.ts";
import { BENCH_SCENARIO } from "../test/fixtures/exampleScenario.ts";

const scenario = BENCH_SCENARIO;
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
