/**
 * CPU time of a whole child process (all its threads: worker threads and V8's compiler threads
 * included), for benchmarks that run the built command: a preload prints `process.cpuUsage()` on
 * stderr when the process exits. On this shared 2-core machine the wall time moves with the other
 * jobs; the CPU time much less.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

let probe: string | null = null;

/** Node arguments that make the child print its CPU time at exit (put them before the script). */
export function cpuProbeArgs(): string[] {
  if (probe === null) {
    probe = join(mkdtempSync(join(tmpdir(), "dotspec-cpu-")), "cpu.mjs");
    writeFileSync(probe, 'process.on("exit", () => { const u = process.cpuUsage(); process.stderr.write(`\\ncpu-us ${u.user + u.system}\\n`); });\n');
  }
  return ["--import", probe];
}

/** The CPU time (ms) the probe printed on `stderr`; NaN when it is missing (the child did not exit normally). */
export function cpuMsFrom(stderr: string): number {
  const m = /cpu-us (\d+)/.exec(stderr);
  return m ? Number(m[1]) / 1000 : NaN;
}
