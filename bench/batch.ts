/**
 * Batch benchmark: `dotspec analyze` over 1,000 files of 2,000 points (target ≤ 10 s wall on
 * 2 cores). Writes synthetic curves (the model, fast method, the accuracy benchmark's scenarios)
 * into a temporary folder, then times the real command as a child process.
 *
 *   npm run bench:batch                 # 1,000 files, --jobs 1 and 2, without and with --out
 *   npm run bench:batch -- --files 200
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, dirname } from "node:path";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { formatCurveCsv, inputDigest, simulateCurve, syntheticSpectrum, writeTextFile, type SyntheticRegime } from "../lib/index.ts";

const args = process.argv.slice(2);
const count = Number(args[args.indexOf("--files") + 1] || 1000) || 1000;
const bin = join(dirname(fileURLToPath(import.meta.url)), "..", "bin", "dotspec.js");
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
    ["--out (JSON + SVG + CSV), 2 threads", ["--out", join(dir, "report"), "--jobs", "2"]],
  ];
  // What provenance adds per file: a second read and its SHA-256 (inputDigest).
  const d0 = performance.now();
  for (let k = 0; k < count; k++) inputDigest(join(dir, "in", `curve-${String(k).padStart(4, "0")}.csv`));
  console.log(`inputDigest (read + SHA-256) of the ${count} files: ${((performance.now() - d0) / 1000).toFixed(2)} s`);
  for (const [name, extra] of runs) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [bin, "analyze", join(dir, "in"), "--eta", "0.8", ...extra], { encoding: "utf8", maxBuffer: 1 << 30 });
    const s = (performance.now() - t0) / 1000;
    // The closing count line: `dotspec: N done, M failed, K warnings …`.
    const failures = Number(/^dotspec: \d+ done, (\d+) failed/m.exec(r.stderr)?.[1] ?? NaN);
    console.log(`dotspec analyze ${count} files ${name}: ${s.toFixed(1)} s wall (exit ${r.status}, ${failures} file(s) reported failed)`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
