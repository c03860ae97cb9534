/**
 * Median timings after warm-up, for the targets stated as medians (one 2,000-point curve analysed
 * in ≤ 2 ms). Runs under plain Node with tsx, as the command does. Part of `npm run bench`.
 */
import { simulateCurve, analyzeCurve, fitCurve, type Curve } from "../lib/index.ts";
import { BENCH_SCENARIO } from "../test/fixtures/exampleScenario.ts";
import { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRegime } from "../lib/model/syntheticSpectrum.ts";

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

// The accuracy benchmark's spectra (its default mix: shell filling, shell tunnelling and
// intermediate dots, plus the crossover's Γtip/Γsub 0.2–5 and η down to 0.55), 60 of each, fast
// model: the median of analyzeCurve over all of them after one warm-up pass.
const mixCurves: { curve: Curve; eta: number }[] = [];
const regimes: SyntheticRegime[] = ["shell-filling", "shell-tunneling", "intermediate"];
const mixes = [SYNTHETIC_DEFAULTS, { ...SYNTHETIC_DEFAULTS, rateRatio: { ...SYNTHETIC_DEFAULTS.rateRatio, intermediate: [0.2, 5] as [number, number] } }, { ...SYNTHETIC_DEFAULTS, eta: [0.55, 0.65] as [number, number] }];
for (const ranges of mixes) {
  for (const regime of regimes) {
    for (let k = 1; k <= 20; k++) {
      const { scenario, truth } = syntheticSpectrum(k, regime, ranges);
      const s = simulateCurve(scenario, { method: "fast", conductance: false });
      mixCurves.push({ curve: { biasV: s.biasV, currentA: s.currentA, sweeps: [s.currentA], didvS: null, meta: { source: `${regime}-${k}`, metadata: {} } }, eta: truth.eta });
    }
  }
}
for (const { curve: c, eta } of mixCurves) analyzeCurve(c, { eta });
const perCurve: number[] = [];
for (let pass = 0; pass < 5; pass++) {
  for (const { curve: c, eta } of mixCurves) {
    const t0 = performance.now();
    analyzeCurve(c, { eta });
    perCurve.push(performance.now() - t0);
  }
}
perCurve.sort((a, b) => a - b);
const q = (f: number) => perCurve[Math.floor(f * (perCurve.length - 1))].toFixed(2);
console.log(`${`analyzeCurve over the benchmark mix (${mixCurves.length} spectra)`.padEnd(52)} median ${q(0.5)} ms  (p10 ${q(0.1)}, p90 ${q(0.9)}; ${perCurve.length} runs)`);
