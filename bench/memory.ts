/**
 * Memory benchmark: a 500 MB curve file and a 500 MB long-table grid, each read by a child
 * process, with its peak resident set size (getrusage maxRSS) and wall time (target: ≤ 1 GB peak).
 * The files are invented (a sinh-shaped current; a grid whose current is x·y·V) and written into a
 * temporary folder, then removed. Each child reads with the library's Node readers
 * (readCurveFile, readGridFile) and, unless --read-only, also runs the command itself
 * (`dotspec analyze FILE --json`, `dotspec grid FILE --json`) under /usr/bin/time. A row says
 * "failed" when the child exits with another status than 0.
 *
 *   npm run bench:memory                  # both files, about 500 MB each
 *   npm run bench:memory -- --mb 100      # smaller files
 *   npm run bench:memory -- --read-only   # the readers only
 *   npm run bench:memory -- --only curve  # one of the two files (curve or grid)
 */
import { closeSync, mkdtempSync, openSync, rmSync, statSync, writeSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";

const args = process.argv.slice(2);
const mbAt = args.indexOf("--mb");
const targetMB = mbAt >= 0 ? Number(args[mbAt + 1]) : 500;
const readOnly = args.includes("--read-only");
const onlyAt = args.indexOf("--only");
const only = onlyAt >= 0 ? args[onlyAt + 1] : null;
const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const dir = mkdtempSync(join(tmpdir(), "dotspec-memory-"));

/** Writes lines from a generator until the file reaches `bytes`, in 4 MB writes. */
function writeLines(path: string, header: string[], line: (i: number) => string, bytes: number): number {
  const fd = openSync(path, "w");
  let buf = header.join("\n") + "\n";
  let written = 0;
  let i = 0;
  while (written + buf.length < bytes) {
    buf += line(i++) + "\n";
    if (buf.length > 4e6) {
      writeSync(fd, buf);
      written += buf.length;
      buf = "";
    }
  }
  writeSync(fd, buf);
  closeSync(fd);
  return i;
}

/** Runs a child process and returns its wall time (s) and, from the child or /usr/bin/time, peak RSS (MB). */
function measure(argv: string[]): { seconds: number; maxRssMB: number; ok: boolean; tail: string } {
  const t0 = process.hrtime.bigint();
  const r = spawnSync("/usr/bin/time", ["-f", "MAXRSS_KB %M", ...argv], { encoding: "utf8", maxBuffer: 1 << 30 });
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  const m = /MAXRSS_KB (\d+)/.exec(r.stderr ?? "");
  return { seconds, maxRssMB: m ? Number(m[1]) / 1024 : NaN, ok: r.status === 0, tail: (r.stderr ?? "").slice(-400) };
}

const bytes = targetMB * 1e6;
const curveRows = only === "grid" ? 0 : writeLines(
  join(dir, "long.csv"),
  ["# invented benchmark curve (not a measurement)", "# eta: 0.8", "bias (V),current (A)"],
  (i) => `${(-2 + i * 1e-7).toFixed(7)},${(1e-9 * Math.sinh(-2 + i * 1e-7)).toExponential(6)}`,
  bytes,
);
// Biases −1 … 1 V in steps of 2 mV, written exactly (a regular grid, as the reader requires).
const nb = 1001;
const nx = 200;
const gridRows = only === "curve" ? 0 : writeLines(
  join(dir, "grid.csv"),
  ["# invented benchmark grid (not a measurement)", "x (nm),y (nm),bias (V),current (pA)"],
  (i) => {
    const b = i % nb, p = Math.floor(i / nb), x = p % nx, y = Math.floor(p / nx);
    return `${(0.1 * x).toFixed(1)},${(0.1 * y).toFixed(1)},${(-1 + 0.002 * b).toFixed(3)},${(x * y * (b - 500) * 1e-4).toExponential(4)}`;
  },
  bytes,
);
// The last pixel row may be incomplete: the grid reader flags its pixels as missing.
const reader = join(dir, "read.mts");
writeFileSync(
  reader,
  `import { readCurveFile, readGridFile } from ${JSON.stringify(join(root, "lib", "index.ts"))};
const [kind, file] = process.argv.slice(2);
const r = kind === "curve" ? readCurveFile(file).curve.biasV.length : readGridFile(file).cube.currentA.length;
console.log(r);
`,
);
const runTs = join(root, "bin", "run-ts.mjs");
const bin = join(root, "bin", "dotspec.js");
const rows: string[] = [];
for (const [kind, file, n] of [["curve", join(dir, "long.csv"), curveRows], ["grid", join(dir, "grid.csv"), gridRows]] as const) {
  if (only !== null && kind !== only) continue;
  const size = statSync(file).size / 1e6;
  const read = measure(["node", runTs, reader, kind, file]);
  rows.push(`| ${kind} | ${size.toFixed(0)} MB, ${n.toLocaleString("en")} rows | read (${kind === "curve" ? "readCurveFile" : "readGridFile"}) | ${read.seconds.toFixed(1)} s | ${read.maxRssMB.toFixed(0)} MB |${read.ok ? "" : " failed: " + read.tail.replace(/\n/g, " ")}`);
  if (!readOnly) {
    const cmd = measure(["node", bin, kind === "curve" ? "analyze" : "grid", file, "--eta", "0.8", "--json"]);
    rows.push(`| ${kind} | ${size.toFixed(0)} MB | \`dotspec ${kind === "curve" ? "analyze" : "grid"} --json\` | ${cmd.seconds.toFixed(1)} s | ${cmd.maxRssMB.toFixed(0)} MB |${cmd.ok ? "" : " failed: " + cmd.tail.replace(/\n/g, " ")}`);
  }
  console.log(rows.slice(-2).join("\n"));
}
console.log("\n| input | size | what | wall time | peak RSS |\n| --- | --- | --- | --- | --- |\n" + rows.join("\n"));
rmSync(dir, { recursive: true, force: true });
