/**
 * analyzeCurve of this checkout against another checkout of dotspec, in one run, interleaved so
 * that both see the same machine load: the before/after figure for a change to the pipeline.
 *
 *   git worktree add --detach .tmp/base <commit> && ln -s "$PWD/node_modules" .tmp/base/node_modules
 *   node bin/run-ts.mjs bench/compareRevisions.ts --before .tmp/base
 *
 *   node bin/run-ts.mjs bench/compareRevisions.ts --before .tmp/base --runs 3000 --compiled --block 100
 *
 * Curves: the benchmark scenario (one sweep) and the same with three noisy sweeps, 2,001 points.
 *
 * By default both versions run through the TypeScript loader of bin/run-ts.mjs. With --compiled,
 * each checkout's lib/pipeline/analyzeCurve.ts is first bundled by esbuild (ESM, packages left
 * external, written under this checkout's node_modules/.cache so that they resolve), and the two
 * bundles are compared: the code the way the package runs it, with no loader in between (the
 * loader wraps each function it creates, which weighs on code that creates closures in hot paths).
 * With --block N the two alternate in blocks of N calls instead of call by call: each version
 * then runs in its own steady state (its tables and arrays in the caches, as in a batch), while
 * both still see the same machine load; call by call, each call starts with the caches the other
 * version left.
 */
import { dirname, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { simulateCurve, seededRandom, type Curve, type CurveAnalysis } from "../lib/index.ts";
import { analyzeCurve as analyzeAfterSource } from "../lib/pipeline/analyzeCurve.ts";
import { BENCH_SCENARIO } from "../test/fixtures/exampleScenario.ts";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..");
const args = process.argv.slice(2);
const at = args.indexOf("--before");
if (at < 0 || !args[at + 1]) {
  console.error("usage: node bin/run-ts.mjs bench/compareRevisions.ts --before PATH_TO_OTHER_CHECKOUT [--runs N] [--block N] [--compiled]");
  process.exit(2);
}
const runsAt = args.indexOf("--runs");
const runs = runsAt >= 0 ? Number(args[runsAt + 1]) : 2000;
if (!(Number.isInteger(runs) && runs >= 1)) {
  console.error(`--runs must be a whole number of at least 1; got ${args[runsAt + 1]}`);
  process.exit(2);
}
const blockAt = args.indexOf("--block");
const block = blockAt >= 0 ? Number(args[blockAt + 1]) : 1;
if (!(Number.isInteger(block) && block >= 1)) {
  console.error(`--block must be a whole number of at least 1; got ${args[blockAt + 1]}`);
  process.exit(2);
}
type Analyze = { analyzeCurve: (c: Curve, o: { eta: number }) => CurveAnalysis };
const compiled = args.includes("--compiled");
/** The module of a checkout's analyzeCurve: its source through the loader, or an esbuild bundle of it. */
async function analyzeModule(checkout: string, name: string): Promise<Analyze> {
  const entry = resolve(checkout, "lib/pipeline/analyzeCurve.ts");
  if (!compiled) return (await import(pathToFileURL(entry).href)) as Analyze;
  const { build } = await import("esbuild");
  const outfile = resolve(ROOT, "node_modules", ".cache", "dotspec-compare", `${name}.mjs`);
  await build({ entryPoints: [entry], bundle: true, platform: "node", format: "esm", packages: "external", outfile, logLevel: "error" });
  return (await import(`${pathToFileURL(outfile).href}?t=${Date.now()}`)) as Analyze;
}
const other = await analyzeModule(args[at + 1], "before");
const { analyzeCurve: analyzeAfter } = compiled ? await analyzeModule(ROOT, "after") : { analyzeCurve: analyzeAfterSource };

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
  for (let i = 0; i < runs; i += block) {
    for (let k = i; k < Math.min(runs, i + block); k++) t.before.push(time(() => other.analyzeCurve(curve, { eta: 0.8 })));
    for (let k = i; k < Math.min(runs, i + block); k++) t.after.push(time(() => analyzeAfter(curve, { eta: 0.8 })));
  }
  const med = (a: number[]) => a.sort((x, y) => x - y)[a.length >> 1];
  const b = med(t.before), a = med(t.after);
  console.log(`analyzeCurve, 2,001 points, ${name.padEnd(13)} before ${b.toFixed(3)} ms  after ${a.toFixed(3)} ms  speed-up × ${(b / a).toFixed(2)}  (medians of ${runs} runs interleaved ${block === 1 ? "call by call" : `in blocks of ${block}`}${compiled ? ", esbuild bundles" : ", through the TypeScript loader"})`);
}
