/**
 * Start-up benchmark of the built command (hyperfine-style): each command runs as a whole
 * process N times after warm-up runs, and min / median / max wall times are printed. Targets:
 * `dotspec --help` ≤ 120 ms median, `dotspec analyze --json` on one curve ≤ 200 ms median.
 * Also prints what bounds them: a bare `node` start, and the import time of each entry and of
 * the heavy dependencies in a fresh process.
 *
 *   npm run bench:startup                      # 20 runs each, 3 warm-up
 *   npm run bench:startup -- --runs 50 --curve sample-curves/dot-04.csv,sample-curves/dot-02.tsv
 *
 * Builds dist/ first (scripts/build.mjs): the command runs the compiled library.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { cpus, loadavg } from "node:os";
import { medianInPlace } from "../lib/util/medianInPlace.ts";
import { cpuMsFrom, cpuProbeArgs } from "./processCpu.ts";

const ROOT = join(dirname(fileURLToPath(import.meta.url)), "..");
const BIN = join(ROOT, "bin", "dotspec.js");
const args = process.argv.slice(2);
const option = (name: string, fallback: string) => (args.includes(name) ? args[args.indexOf(name) + 1] : fallback);
const runs = Math.max(1, Number(option("--runs", "20")) || 20);
const warmup = Math.max(0, Number(option("--warmup", "3")) || 0);
// Three sweeps of 2,000 points, and one sweep of 2,000 points (like the batch benchmark's files).
const curves = option("--curve", [join("sample-curves", "dot-01.csv"), join("sample-curves", "dot-05.dat")].join(",")).split(",");

/**
 * Wall time of one whole process, ms, and with `cpu` also its CPU time (all threads, through the
 * preloaded probe of bench/processCpu.ts; NaN without it); throws when it fails.
 */
function once(argv: string[], cpu = false, env: Record<string, string> = {}): [number, number] {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, [...(cpu ? cpuProbeArgs() : []), ...argv], { cwd: ROOT, encoding: "utf8", maxBuffer: 1 << 26, env: { ...process.env, ...env } });
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const cpuMs = cpu ? cpuMsFrom(r.stderr) : NaN;
  if (r.status !== 0 || (cpu && !Number.isFinite(cpuMs))) throw new Error(`node ${argv.join(" ")} exited with ${r.status}: ${r.stderr}`);
  return [ms, cpuMs];
}

/** The median (the mean of the middle two for an even count). */
const median = (xs: number[]) => medianInPlace(Float64Array.from(xs));

let baseline: number | null = null;

/** Runs one command `runs` times and prints min / median / max (and the median over a bare Node start). */
function measure(name: string, argv: string[], target: number | null): number {
  for (let k = 0; k < warmup; k++) once(argv);
  const times = Array.from({ length: runs }, () => once(argv)[0]).sort((a, b) => a - b);
  const mid = median(times);
  const verdict = target === null ? "" : mid <= target ? `  (target ≤ ${target} ms: met)` : `  (target ≤ ${target} ms: NOT met)`;
  const over = baseline === null ? "" : `  (${(mid - baseline).toFixed(0)} ms over Node's start)`;
  console.log(`${name.padEnd(48)} min ${times[0].toFixed(0).padStart(4)} ms  median ${mid.toFixed(0).padStart(4)} ms  max ${times[runs - 1].toFixed(0).padStart(4)} ms${over}${verdict}`);
  return mid;
}

/** Import time of a module in a fresh process, ms (median of 5). */
function importMs(specifier: string): number {
  const code = `const t = performance.now(); await import(${JSON.stringify(specifier)}); console.log(performance.now() - t);`;
  const times = Array.from({ length: 5 }, () => Number(execFileSync(process.execPath, ["--input-type=module", "-e", code], { cwd: ROOT, encoding: "utf8" }))).sort((a, b) => a - b);
  return times[2];
}

execFileSync(process.execPath, [join(ROOT, "scripts", "build.mjs")], { stdio: ["ignore", "ignore", "inherit"] });
console.log(`Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? "CPU"}, load average ${loadavg()[0].toFixed(1)}; ${runs} runs each after ${warmup} warm-up`);
baseline = measure("node -e 0 (Node's own start)", ["-e", "0"], null);
measure("dotspec --version", [BIN, "--version"], null);
measure("dotspec --help", [BIN, "--help"], 120);
for (const curve of curves) measure(`dotspec analyze --json ${curve}`, [BIN, "analyze", curve, "--json"], 200);

/** Runs two variants of each command alternately (so that both see the same load) and prints median wall / CPU time of the whole process (all threads). */
function alternate(title: string, names: [string, string], variants: [(argv: string[]) => [number, number], (argv: string[]) => [number, number]]) {
  console.log(`\n${title}; median wall / CPU time:`);
  for (const argv of [...curves.map((c) => ["analyze", c, "--json"]), ["fit", curves[0], "--json"]]) {
    const a: [number, number][] = [], b: [number, number][] = [];
    for (let k = 0; k < warmup + runs; k++) {
      const x = variants[0](argv), y = variants[1](argv);
      if (k >= warmup) a.push(x), b.push(y);
    }
    const show = (xs: [number, number][]) => `${median(xs.map((x) => x[0])).toFixed(0).padStart(4)} / ${median(xs.map((x) => x[1])).toFixed(0).padStart(4)} ms`;
    console.log(`  dotspec ${argv.join(" ").padEnd(44)} ${names[0]}: ${show(a)}   ${names[1]}: ${show(b)}`);
  }
}

// A short run (such as these) runs the command's single-file bundle with the V8 code cache the
// build wrote (bin/dotspec.js, scripts/commandBundle.mjs); against the ES modules compiled at
// each start (DOTSPEC_CODE_CACHE=off).
alternate("The code cache: the single-file bundle with it against the ES modules", ["cache", "modules"], [
  (argv) => once([BIN, ...argv], true),
  (argv) => once([BIN, ...argv], true, { DOTSPEC_CODE_CACHE: "off" }),
]);

// bin/dotspec.js raises V8's interrupt budget (the threshold of the optimising compiler) × 16 for
// short runs; the same commands at V8's default (bin/dotspec.js leaves a budget given on the
// command line). Both from the ES modules: the code cache holds only under the flags it was
// written with.
const DEFAULT_BUDGET = "--interrupt-budget=67584";
const modules = { DOTSPEC_CODE_CACHE: "off" };
alternate("The optimising compiler's threshold: bin/dotspec.js's (× 16) against V8's default, ES modules", ["× 16", "default"], [
  (argv) => once([BIN, ...argv], true, modules),
  (argv) => once([DEFAULT_BUDGET, BIN, ...argv], true, modules),
]);

console.log("\nImport time in a fresh process (median of 5), what a command pays before its work:");
for (const [name, spec] of [
  ["dist/cli/main.js (the command, no library)", "./dist/cli/main.js"],
  ["dist/core.js (browser-safe entry)", "./dist/core.js"],
  ["dist/index.js (Node entry)", "./dist/index.js"],
  ["commander (the package; the command's bundles carry their own copy)", "commander"],
  ["mathjs (size formulas only, loaded on use)", "mathjs"],
  ["ml-matrix (fits only, loaded on use)", "ml-matrix"],
  ["@observablehq/plot (figures only, loaded on use)", "@observablehq/plot"],
  ["jsdom (figures in Node only, loaded on use)", "jsdom"],
] as const) {
  console.log(`  ${name.padEnd(52)} ${importMs(spec).toFixed(0).padStart(4)} ms`);
}

console.log("");
// The first curve runs in cold code (not yet optimised); the same work warm, for comparison.
for (const curve of curves) {
  const firstCurve = `
    const lib = await import(${JSON.stringify("./dist/index.js")});
    const times = [];
    for (let k = 0; k < 20; k++) {
      const t0 = performance.now();
      const { curve, record } = lib.readCurveFile(${JSON.stringify(curve)});
      const t1 = performance.now();
      const json = JSON.stringify(lib.analysisToJson(lib.analyzeCurve(curve), record));
      const t2 = performance.now();
      if (json.length) times.push([t1 - t0, t2 - t1]);
    }
    console.log(JSON.stringify([times[0], times[times.length - 1]]));`;
  const [[coldRead, coldAnalysis], [warmRead, warmAnalysis]] = JSON.parse(execFileSync(process.execPath, ["--input-type=module", "-e", firstCurve], { cwd: ROOT, encoding: "utf8" })) as number[][];
  console.log(`${curve} in a fresh process: read ${coldRead.toFixed(0)} ms, analyse + JSON ${coldAnalysis.toFixed(0)} ms the first time; the 20th time ${warmRead.toFixed(1)} ms and ${warmAnalysis.toFixed(1)} ms`);
}
console.log(`load average ${loadavg()[0].toFixed(1)} at the end`);
