#!/usr/bin/env node
// The dotspec command: runs the compiled library in dist/ (`npm run build`, which `npm ci` runs
// through the `prepare` script). Nothing here compiles TypeScript.
//
// A CommonJS file (bin/package.json says so): Node starts a CommonJS entry without its ES-module
// loader, about 10 ms of every start, and `--help` and `--version` never need that loader (below).
"use strict";

const { fstatSync, readFileSync, statSync, writeFileSync, writeSync } = require("node:fs");
const { dirname, join } = require("node:path");

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
const codeCacheMode = process.env.DOTSPEC_CODE_CACHE; // "off", "check" or "write"; see fromBundle
const short = isShortRun(argv);
if (short && /^v20\./.test(process.version) && !process.execArgv.some((a) => a.startsWith("--interrupt-budget"))) {
  require("node:v8").setFlagsFromString("--interrupt-budget=1081344");
}

/**
 * The single-file bundles of the command in dist/cli, each with the V8 code cache the build saved
 * beside it (scripts/commandBundle.mjs):
 * - `help.cjs`: the command's entry and option parser alone, every command left out. It serves a
 *   run that names no command (`--help`, `--version`, no argument, or an unknown option), which
 *   never loads one.
 * - `command.cjs`: the whole command, for short runs. It loads every package with `require`, ES
 *   modules included, which needs Node ≥ 20.19.
 */
const BUNDLES = {
  help: { file: "help.cjs", usable: () => true },
  command: { file: "command.cjs", usable: () => process.features?.require_module === true },
};

run().then((code) => {
  process.exitCode = code;
});

async function run() {
  const which = codeCacheMode === "off" ? null : !argv.some((a) => !a.startsWith("-")) ? BUNDLES.help : short ? BUNDLES.command : null;
  const bundle = which && fromBundle(which);
  const { main } = bundle?.exports ?? (await commandModule());
  const code = await main(argv, which === BUNDLES.help ? { stdout: directStream(1), stderr: directStream(2) } : {});
  if (codeCacheMode === "write") bundle?.writeCache();
  return code;
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
 * A bundle of {@link BUNDLES}, compiled with its code cache: the run then starts without compiling
 * most of what it runs. V8 rejects a cache written by another V8 version or under other flags and
 * compiles afresh. Null where this Node cannot run the bundle or the bundle is missing; the caller
 * then loads the ES modules, as it does with DOTSPEC_CODE_CACHE=off. DOTSPEC_CODE_CACHE=check
 * prints whether the cache was used; =write (the build) saves a new one after the run
 * (`writeCache`).
 */
function fromBundle({ file, usable }) {
  if (!usable()) return null;
  const vm = require("node:vm");
  const { createRequire, wrap } = require("node:module");
  const filename = join(__dirname, "..", "dist", "cli", file);
  const cacheFile = `${filename}.cache`;
  let source;
  try {
    source = readFileSync(filename, "utf8");
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
  const script = new vm.Script(wrap(source), { filename, cachedData });
  if (codeCacheMode === "check") {
    console.error(`dotspec: code cache ${cachedData === undefined ? "missing" : script.cachedDataRejected ? "rejected" : "used"}`);
  }
  const module = { exports: {} };
  script.runInThisContext().call(module.exports, module.exports, createRequire(filename), module, filename, dirname(filename));
  return {
    exports: module.exports,
    writeCache() {
      const data = script.createCachedData();
      writeFileSync(cacheFile, data);
      console.error(`dotspec: code cache written (${(data.length / 1024).toFixed(0)} KiB)`);
    },
  };
}

/**
 * A run that names no command writes a few lines: straight to the file descriptor where it is a
 * pipe, a file or a socket (never a terminal), without the stream Node would build for
 * process.stdout on first use (its stream and terminal modules, about 5 ms). Undefined for a
 * character device (a terminal, whose width the help needs, or /dev/null) or where the
 * descriptor cannot be examined: the command then uses Node's own stream.
 */
function directStream(fd) {
  let stat;
  try {
    stat = fstatSync(fd);
  } catch {
    return undefined;
  }
  if (stat.isCharacterDevice()) return undefined;
  let gone = false;
  return {
    isTTY: false,
    write(text) {
      if (gone) return true;
      const bytes = Buffer.from(text);
      let done = 0;
      try {
        while (done < bytes.length) done += writeSync(fd, bytes, done);
      } catch (err) {
        if (err?.code === "EAGAIN") {
          // A non-blocking descriptor that is full: the rest through Node's stream, which waits.
          const stream = fd === 1 ? process.stdout : process.stderr;
          stream.once("error", (e) => cannotWrite(e));
          stream.write(bytes.subarray(done));
        } else {
          // The reader has gone (EPIPE, `dotspec --help | head -0`): nothing more to write, as
          // with Node's stream. Any other failure (a full disk) is said once, as the command says it.
          gone = true;
          if (err?.code !== "EPIPE") cannotWrite(err);
        }
      }
      return true;
    },
  };
}

/** Says on stderr, as the command does, that the output could not be written. */
function cannotWrite(err) {
  try {
    writeSync(2, `dotspec: cannot write the output (${err instanceof Error ? err.message : String(err)})\n`);
  } catch {
    // stderr is gone too: nothing left to tell.
  }
}
