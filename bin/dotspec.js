#!/usr/bin/env node
// The dotspec command: runs the compiled library in dist/ (`npm run build`, which `npm ci` runs
// through the `prepare` script). Nothing here compiles TypeScript.

import { statSync } from "node:fs";

// A short run is over before V8's optimising compiler pays back its cost: at its default
// threshold it spent about a third of the CPU time of `analyze --json` on one curve and of `fit`
// compiling code the process then barely used. A higher threshold (the interrupt budget, × 16)
// leaves only the code that stays hot to it. A batch is the opposite case: there the later
// compilation made 1,000 files 10–20 % slower. So the threshold is raised only for `analyze` and
// `fit` on a few files and no folder (measured with `npm run bench:startup` and the batch
// benchmark; README, "Start-up and the package"); the choice changes speed only, never a result.
// Set before the library loads, for this process and its worker threads; not where the person
// running Node set it, and only on the Node versions it was measured on (V8 prints an error for
// a flag it does not know).
const SHORT_RUN_MAX_FILES = 8;
const argv = process.argv.slice(2);
if (isShortRun(argv) && /^v20\./.test(process.version) && !process.execArgv.some((a) => a.startsWith("--interrupt-budget"))) {
  (await import("node:v8")).setFlagsFromString("--interrupt-budget=1081344");
}

/** `analyze` or `fit` on at most SHORT_RUN_MAX_FILES existing files and no folder (help and version run no library code). */
function isShortRun(args) {
  const [command, ...rest] = args;
  if ((command !== "analyze" && command !== "fit") || rest.some((a) => ["-h", "--help"].includes(a))) return false;
  let files = 0;
  for (const arg of rest) {
    if (arg.startsWith("-")) continue;
    let stat;
    try {
      stat = statSync(arg);
    } catch {
      continue; // an option's value, or a path the command will report
    }
    if (stat.isDirectory() || (stat.isFile() && ++files > SHORT_RUN_MAX_FILES)) return false;
  }
  return true;
}

let main;
try {
  ({ main } = await import("../dist/cli/main.js"));
} catch (err) {
  if (err?.code !== "ERR_MODULE_NOT_FOUND" || !String(err.message).includes("dist/cli/main.js")) throw err;
  console.error("dotspec: the compiled library (dist/) is missing; run `npm run build` in the dotspec folder");
  process.exit(1);
}
process.exitCode = await main(argv);
