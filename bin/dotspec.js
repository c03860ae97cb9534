#!/usr/bin/env node
// The dotspec command: runs the compiled library in dist/ (`npm run build`, which `npm ci` runs
// through the `prepare` script). Nothing here compiles TypeScript.

// Node's built-in modules through `process.getBuiltinModule` where it exists (Node ≥ 20.16): an
// `import` of one builds an ES-module facade of it first, a few milliseconds of each start.
const builtin = (id) => process.getBuiltinModule?.(id) ?? import(id);
const { statSync } = await builtin("node:fs");

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
const codeCacheMode = process.env.DOTSPEC_CODE_CACHE; // "off", "check" or "write"; see commandFromCache
let codeCacheWrite = null;
const short = isShortRun(argv);
if (short && /^v20\./.test(process.version) && !process.execArgv.some((a) => a.startsWith("--interrupt-budget"))) {
  (await builtin("node:v8")).setFlagsFromString("--interrupt-budget=1081344");
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

const { main } = (short && (await commandFromCache())) || (await commandModule());
process.exitCode = await main(argv);
if (codeCacheMode === "write") await codeCacheWrite?.();

/** The command's ES-module entry (dist/cli/main.js and the chunks it imports). */
async function commandModule() {
  try {
    return await import("../dist/cli/main.js");
  } catch (err) {
    if (err?.code !== "ERR_MODULE_NOT_FOUND" || !String(err.message).includes("dist/cli/main.js")) throw err;
    console.error("dotspec: the compiled library (dist/) is missing; run `npm run build` in the dotspec folder");
    process.exit(1);
  }
}

/**
 * The command from its CommonJS bundle (dist/cli/command.cjs), compiled with the V8 code cache
 * the build saved beside it (scripts/commandBundle.mjs): a short run then starts without
 * compiling most of the command. V8 rejects a cache written by another V8 version or under
 * other flags and compiles afresh. Null where this Node cannot run the bundle (it loads every
 * package with `require`, ES modules included, which needs Node ≥ 20.19), where the bundle is
 * missing, or with DOTSPEC_CODE_CACHE=off; the caller then loads the ES modules.
 * DOTSPEC_CODE_CACHE=check prints whether the cache was used; =write (the build) saves a new one
 * after the run.
 */
async function commandFromCache() {
  if (codeCacheMode === "off" || process.features?.require_module !== true) return null;
  const vm = await builtin("node:vm");
  const { readFileSync, writeFileSync } = await builtin("node:fs");
  const { createRequire, wrap } = await builtin("node:module");
  const { dirname } = await builtin("node:path");
  const { fileURLToPath } = await builtin("node:url");
  const file = new URL("../dist/cli/command.cjs", import.meta.url);
  const cacheFile = new URL("../dist/cli/command.cjs.cache", import.meta.url);
  let source;
  try {
    source = readFileSync(file, "utf8");
  } catch {
    return null;
  }
  let cachedData;
  if (codeCacheMode !== "write") {
    try {
      cachedData = readFileSync(cacheFile);
    } catch {
      cachedData = undefined; // no cache: compile as usual
    }
  }
  const filename = fileURLToPath(file);
  const script = new vm.Script(wrap(source), { filename, cachedData });
  if (codeCacheMode === "check") {
    console.error(`dotspec: code cache ${cachedData === undefined ? "missing" : script.cachedDataRejected ? "rejected" : "used"}`);
  }
  const module = { exports: {} };
  script.runInThisContext().call(module.exports, module.exports, createRequire(file), module, filename, dirname(filename));
  if (codeCacheMode === "write") {
    codeCacheWrite = async () => {
      const data = script.createCachedData();
      writeFileSync(cacheFile, data);
      console.error(`dotspec: code cache written (${(data.length / 1024).toFixed(0)} KiB)`);
    };
  }
  return module.exports;
}
