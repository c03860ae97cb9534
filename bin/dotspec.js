#!/usr/bin/env node
// The dotspec command: runs the compiled library in dist/ (`npm run build`, which `npm ci` runs
// through the `prepare` script). Nothing here compiles TypeScript.
let main;
try {
  ({ main } = await import("../dist/cli/main.js"));
} catch (err) {
  if (err?.code !== "ERR_MODULE_NOT_FOUND" || !String(err.message).includes("dist/cli/main.js")) throw err;
  console.error("dotspec: the compiled library (dist/) is missing; run `npm run build` in the dotspec folder");
  process.exit(1);
}
process.exitCode = await main(process.argv.slice(2));
