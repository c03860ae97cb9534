/**
 * analyzeCurve of this checkout against another checkout of dotspec, in one run, interleaved so
 * that both see the same machine load: the before/after figure for a change to the pipeline.
 *
 *   git worktree add --detach .tmp/base <commit> && ln -s "$PWD/node_modules" .tmp/base/node_modules
 *   node bin/run-ts.js bench/compareRevisions.ts --before .tmp/base
 *
 * Curves: the benchmark scenario (one sweep) and the same with three noisy sweeps, 2,001 points.
 */
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { simulateCurve, seededRandom, type Curve, type CurveAnalysis } from "../lib/index.ts";
import { analyzeCurve as analyzeAfter } from "../lib/pipeline/analyzeCurve.ts";
import { BENCH_SCENARIO } from "../test/fixtures/exampleScenario.ts";

const args = process.argv.slice(2);
const at = args.indexOf("--before");
if (at < 0 || !args[at + 1]) {
  console.error("usage: node bin/run-ts.js bench/compareRevisions.ts --before PATH_TO_OTHER_CHECKOUT [--runs N]");
  process.exit(2);
}
const runsAt = args.indexOf("--runs");
const runs = runsAt >= 0 ? Number(args[runsAt + 1]) : 2000;
if (!(Number.isInteger(runs) && runs >= 1)) {
  console.error(`--runs must be a whole number of at least 1; got ${args[runsAt + 1]}`);
  process.exit(2);
}
const other = (await import(pathToFileURL(resolve(args[at + 1], "lib/pipeline/analyzeCurve.ts")).href)) as {
  analyzeCurve: (c: Curve, o: { eta: number }) => CurveAnalysis;
};

const sim = simulateCurve(BENCH_SCENARIO);
const one: Curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "bench", metadata: {} } };
const rng = seededRandom(7);
const noise = 0.002 * Math.max(...sim.currentA.map(Math.abs));
const sweeps = [0, 1, 2].map(() => sim.currentA.map((v) => v + noise * rng.normal()));
const mean = sweeps[0].map((_, i) => (sweeps[0][i] + sweeps[1][i] + sweeps[2][i]) / 3);
const three: Curve = { ...one, currentA: mean, sweeps };

for (const [name, curve] of [["one sweep", one], ["three sweeps", three]] as const) {
  const t = { before: [] as number[], after: [] as number[] };
  const time = (f: () => unknown) => {
    const t0 = performance.now();
    f();
    return performance.now() - t0;
  };
  for (let i = 0; i < 200; i++) (other.analyzeCurve(curve, { eta: 0.8 }), analyzeAfter(curve, { eta: 0.8 }));
  for (let i = 0; i < runs; i++) {
    t.before.push(time(() => other.analyzeCurve(curve, { eta: 0.8 })));
    t.after.push(time(() => analyzeAfter(curve, { eta: 0.8 })));
  }
  const med = (a: number[]) => a.sort((x, y) => x - y)[a.length >> 1];
  const b = med(t.before), a = med(t.after);
  console.log(`analyzeCurve, 2,001 points, ${name.padEnd(13)} before ${b.toFixed(3)} ms  after ${a.toFixed(3)} ms  speed-up × ${(b / a).toFixed(2)}  (medians of ${runs} interleaved runs)`);
}
