#!/usr/bin/env node
// The dotspec command: runs the compiled library in dist/ (`npm run build`, which `npm ci` runs
// through the `prepare` script). Nothing here compiles TypeScript.

// A command is a short-lived process: V8's optimising compiler, at its default threshold, spends
// more CPU compiling the analysis of one curve or one fit than the compiled code then saves
// (measured with `npm run bench:startup`: about a third of the CPU time of `analyze --json` on
// one curve, with no loss on a batch of 1,000 files; README, "Start-up and the package"). A
// higher threshold (the interrupt budget, × 16) leaves only the code that stays hot to it. Set
// before the library loads, for this process and its worker threads; not where the person
// running Node set it, and only on the Node versions it was measured on (V8 prints an error for
// a flag it does not know). Not for help or the version, which run no library code.
const argv = process.argv.slice(2);
const runsLibrary = argv.length > 0 && !argv.some((a) => ["-h", "--help", "-V", "--version"].includes(a));
if (runsLibrary && /^v20\./.test(process.version) && !process.execArgv.some((a) => a.startsWith("--interrupt-budget"))) {
  (await import("node:v8")).setFlagsFromString("--interrupt-budget=1081344");
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
