/**
 * Batch benchmark: `dotspec analyze` over 1,000 files of 2,000 points (target ≤ 4 s wall on
 * 2 cores with --json). Writes synthetic curves (the model, fast method, the accuracy
 * benchmark's scenarios) into a temporary folder, then times the built command (bin/dotspec.js
 * running dist/) as a child process, and splits the per-file work the command does into its
 * stages, timed in this process on the same files: the provenance digest (read + SHA-256), the
 * parse (readCurveFile), the analysis (analyzeCurve) and the JSON record (analysisToJson +
 * JSON.stringify).
 *
 *   npm run bench:batch                      # 1,000 files, --jobs 1 and 2, without and with --out
 *   npm run bench:batch -- --files 200
 *   npm run bench:batch -- --json-only       # skip the --out run (figures dominate it)
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, dirname } from "node:path";
import { fileURLToPath } from "node:url";
import { cpus, loadavg } from "node:os";
import { cpuMsFrom, cpuProbeArgs } from "./processCpu.ts";
import {
  analysisToJson,
  analyzeCurve,
  etaForCurve,
  formatCurveCsv,
  inputDigest,
  makeProvenance,
  readCurveFile,
  simulateCurve,
  syntheticSpectrum,
  writeTextFile,
  type SyntheticRegime,
} from "../lib/index.ts";

const args = process.argv.slice(2);
const count = Number(args[args.indexOf("--files") + 1] || 1000) || 1000;
const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const bin = join(root, "bin", "dotspec.js");
const jsonOnly = args.includes("--json-only");
const dir = mkdtempSync(join(tmpdir(), "dotspec-batch-"));
const regimes: SyntheticRegime[] = ["shell-filling", "shell-tunneling", "intermediate"];
try {
  const made = performance.now();
  for (let k = 0; k < count; k++) {
    const { scenario } = syntheticSpectrum(10_000 + k, regimes[k % 3]);
    const sim = simulateCurve(scenario, { method: "fast", conductance: false });
    writeTextFile(join(dir, "in", `curve-${String(k).padStart(4, "0")}.csv`), formatCurveCsv({ biasV: sim.biasV, currentA: sim.currentA }));
  }
  console.log(`${count} files of 2,000 points written in ${((performance.now() - made) / 1000).toFixed(1)} s`);
  const runs: [string, string[]][] = [
    ["--json, 1 thread", ["--json", "--jobs", "1"]],
    ["--json, 2 threads", ["--json", "--jobs", "2"]],
  ];
  if (!jsonOnly) runs.push(["--out (JSON + SVG + CSV), 2 threads", ["--out", join(dir, "report"), "--jobs", "2"]]);
  // The command runs the compiled library: build it as it is now.
  execFileSync(process.execPath, [join(root, "scripts", "build.mjs")], { stdio: ["ignore", "ignore", "inherit"] });
  console.log(`Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? "CPU"}, load average ${loadavg()[0].toFixed(1)} at the start`);

  // Where the time of one file goes: the stages of readAndAnalyze (lib/cli/analyzeFile.ts), in
  // this process, after one warm-up pass over 50 files.
  const files = Array.from({ length: count }, (_, k) => join(dir, "in", `curve-${String(k).padStart(4, "0")}.csv`));
  const split = { digest: 0, parse: 0, analysis: 0, json: 0 };
  for (const [pass, list] of [["warm-up", files.slice(0, 50)], ["timed", files]] as const) {
    for (const file of list) {
      const t0 = performance.now();
      const digest = inputDigest(file);
      const t1 = performance.now();
      const { curve, record } = readCurveFile(file);
      const t2 = performance.now();
      const { eta } = etaForCurve(0.8, curve);
      const analysis = analyzeCurve(curve, { eta });
      const t3 = performance.now();
      const text = JSON.stringify(analysisToJson(analysis, record, { metadata: curve.meta.metadata, provenance: makeProvenance("analyze", digest, { analyze: { eta: 0.8 }, read: {} }) }));
      const t4 = performance.now();
      if (pass === "timed" && text.length > 0) {
        split.digest += t1 - t0;
        split.parse += t2 - t1;
        split.analysis += t3 - t2;
        split.json += t4 - t3;
      }
    }
  }
  const total = split.digest + split.parse + split.analysis + split.json;
  const share = (ms: number) => `${(ms / 1000).toFixed(2)} s (${((100 * ms) / total).toFixed(0)} %)`;
  console.log(
    `per-file work of ${count} files in one thread: ${(total / 1000).toFixed(2)} s = parse ${share(split.parse)} + analysis ${share(split.analysis)} + JSON ${share(split.json)} + provenance digest ${share(split.digest)}`,
  );
  for (const [name, extra] of runs) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [...cpuProbeArgs(), bin, "analyze", join(dir, "in"), "--eta", "0.8", ...extra], { encoding: "utf8", maxBuffer: 1 << 30 });
    const s = (performance.now() - t0) / 1000;
    // The closing count line: `dotspec: N done, M failed, K warnings …`.
    const failures = Number(/^dotspec: \d+ done, (\d+) failed/m.exec(r.stderr)?.[1] ?? NaN);
    const cpu = cpuMsFrom(r.stderr) / 1000;
    console.log(`dotspec analyze ${count} files ${name}: ${s.toFixed(1)} s wall, ${cpu.toFixed(1)} s CPU (all threads; exit ${r.status}, ${failures} file(s) reported failed; load average ${loadavg()[0].toFixed(1)})`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
