// The command as one CommonJS file with a V8 code cache beside it, for short runs (scripts/build.mjs
// step 5; bin/dotspec.js loads it).
//
// Why: a short `dotspec analyze --json` spends about a tenth of its wall time compiling the
// command's JavaScript. Node 20 keeps no compiled code between processes, and V8's code cache
// (`vm.Script` `cachedData`) only serves classic scripts, not ES modules. So the build also writes
// the command as a single CommonJS file, runs it once on a sample curve and saves the bytecode V8
// compiled for it; bin/dotspec.js hands that cache to `vm.Script` on the next start. V8 checks the
// cache against its own version, its flags and the source, and compiles afresh when any differs:
// a stale cache costs speed, never a result.
import { readFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { join, relative, dirname, sep } from "node:path";

/**
 * Packages the command's bundles carry inside them rather than load from node_modules: small,
 * needed at every start (commander for the options, d3-dsv for the reader), and each a module
 * resolution, a read and a compile less (d3-dsv, an ES module, took 6–19 ms through `require`).
 */
export const INLINE_PACKAGES = ["commander", "d3-dsv"];

/** The bundle's file name in dist/cli; bin/dotspec.js reads it and `${COMMAND_CJS}.cache` (the package test checks both ship). */
export const COMMAND_CJS = "command.cjs";

// `const x = await lazyModule(…)` at a module's top level, as tsc emits it (types gone).
const AWAIT_LAZY = /\bawait\s+lazyModule\(/g;
const LAZY_IMPORT = /import\s*\{\s*lazyModule\s*\}\s*from\s*(["'][^"']*lazyModule\.js["'])/;

/**
 * esbuild plugin: in tsc's output under `distDir`, `await lazyModule(…)` → `lazyModuleNow(…)`
 * (the same getter, made without waiting: a CommonJS file cannot wait at its top level). Fails the
 * build where a module awaits `lazyModule` but its import of it does not have the expected form.
 */
function lazyModulesNow(distDir) {
  return {
    name: "lazy-modules-now",
    setup(build) {
      build.onLoad({ filter: /\.js$/ }, (args) => {
        if (!args.path.startsWith(distDir + sep) || args.path.endsWith(`${sep}lazyModule.js`)) return undefined;
        const text = readFileSync(args.path, "utf8");
        if (!AWAIT_LAZY.test(text)) return undefined;
        AWAIT_LAZY.lastIndex = 0;
        if (!LAZY_IMPORT.test(text)) {
          return { errors: [{ text: `${relative(distDir, args.path)} awaits lazyModule without importing it as { lazyModule } from …/lazyModule.js` }] };
        }
        const contents = text.replace(AWAIT_LAZY, "lazyModuleNow(").replace(LAZY_IMPORT, "import { lazyModuleNow } from $1");
        return { contents, loader: "js", resolveDir: dirname(args.path) };
      });
    },
  };
}

/**
 * esbuild plugin: packages stay external (resolved from node_modules at run time, as by the
 * ES-module build) except those in `inline`, which join the bundle and so its code cache; their
 * own `require` of `node:child_process` is deferred to first use (commander loads it at start-up
 * for subcommands run as separate programs, which dotspec has none of; about 4 ms a start).
 */
export function packagesExcept(inline) {
  const packageName = (specifier) => specifier.split("/").slice(0, specifier.startsWith("@") ? 2 : 1).join("/");
  return {
    name: "packages-except",
    setup(build) {
      build.onResolve({ filter: /^(node:)?child_process$/ }, (args) =>
        inline.some((name) => args.importer.includes(`${sep}node_modules${sep}${name}${sep}`)) ? { path: "child_process", namespace: "deferred-builtin" } : undefined,
      );
      build.onLoad({ filter: /.*/, namespace: "deferred-builtin" }, (args) => ({
        contents: `let loaded;\nmodule.exports = new Proxy({}, { get: (_, key) => (loaded ??= require("node:${args.path}"))[key] });\n`,
        loader: "js",
      }));
      build.onResolve({ filter: /^[^./]/ }, (args) => {
        if (args.path.startsWith("node:") || inline.includes(packageName(args.path))) return undefined;
        return { path: args.path, external: true };
      });
    },
  };
}

/** File in dist/cli with the licence texts of INLINE_PACKAGES (the bundles' closing comment points to it). */
export const LICENCES_FILE = "bundled-licences.txt";

/** The licence texts of the inlined packages, for LICENCES_FILE. */
export function licences(root, inline) {
  const texts = inline.map((name) => `${name} (${JSON.parse(readFileSync(join(root, "node_modules", name, "package.json"), "utf8")).version}):\n\n${readFileSync(join(root, "node_modules", name, "LICENSE"), "utf8").trim()}`);
  return `Packages bundled into the command's files in this folder, with their licences.\n\n${texts.join("\n\n---\n\n")}\n`;
}

/** The closing comment of each bundled file. */
export const LICENCES_FOOTER = `/*! Bundles ${INLINE_PACKAGES.join(", ")}: licences in ${LICENCES_FILE} beside this file. */`;

/**
 * Bundles tsc's `dist/cli/main.js` (and everything it imports, dynamic imports included) into one
 * CommonJS file `outFile`; packages stay external but commander (see `packagesExcept`). `import.meta.url` becomes the bundle's own file
 * URL, which lies in dist/cli like the ES-module entry's, so `workerEntry` and the package.json
 * lookup resolve as before.
 */
export async function bundleCommandCjs(esbuild, root, distDir, entry, outFile) {
  await esbuild.build({ ...cjsOptions(entry, outFile), plugins: [lazyModulesNow(distDir), packagesExcept(INLINE_PACKAGES)] });
}

/** The bundle for runs that name no command; bin/dotspec.js reads it and `${HELP_CJS}.cache` (the package test checks both ship). */
export const HELP_CJS = "help.cjs";

/**
 * Bundles tsc's `dist/cli/main.js` with its static imports only into the CommonJS file `outFile`:
 * the command's entry, its option parser (commander, inlined) and the list of commands, each
 * command's own module left out. Its every dynamic import (a command, or the library for an error
 * report) becomes a module that fails when loaded: a run that names no command (`--help`,
 * `--version`, an unknown option) reaches none of them. Fails the build where the bundle would take
 * in any of the library (a module of dist/ outside dist/cli), which such a run must never load.
 */
export async function bundleHelpCjs(esbuild, root, distDir, entry, outFile) {
  const result = await esbuild.build({
    ...cjsOptions(entry, outFile),
    absWorkingDir: root,
    metafile: true,
    plugins: [
      {
        name: "commands-left-out",
        setup(build) {
          build.onResolve({ filter: /.*/ }, (args) => (args.kind === "dynamic-import" ? { path: args.path, namespace: "left-out" } : undefined));
          build.onLoad({ filter: /.*/, namespace: "left-out" }, (args) => ({
            contents: `throw new Error(${JSON.stringify(`${args.path} is not in ${HELP_CJS}: bin/dotspec.js runs it only where no command is named`)});\n`,
            loader: "js",
          }));
        },
      },
      packagesExcept(INLINE_PACKAGES),
    ],
  });
  const library = Object.keys(result.metafile.inputs).filter((input) => {
    const path = join(root, input);
    return path.startsWith(distDir + sep) && !path.startsWith(join(distDir, "cli") + sep);
  });
  if (library.length) throw new Error(`${HELP_CJS} would load the library (${library.join(", ")}); the command's entry must import it only dynamically`);
}

/** esbuild options shared by the CommonJS bundles: `entry` → `outFile`, minified ASCII. */
function cjsOptions(entry, outFile) {
  return {
    entryPoints: [entry],
    outfile: outFile,
    bundle: true,
    format: "cjs",
    platform: "node",
    target: "node20",
    sourcemap: "linked",
    sourcesContent: false,
    // Minified: the source is read and turned into a string at every start (629 → 442 kB, about
    // 10 ms of CPU time less a start than with whitespace alone, load average ~4.5), and ASCII, which V8
    // keeps in one byte a character. The errors the command prints name no function (DotspecError
    // and UsageError set their names); the source map points into the TypeScript sources.
    minify: true,
    charset: "ascii",
    logLevel: "warning",
    footer: { js: LICENCES_FOOTER },
    // `import()` of a package → `require` (Node ≥ 20.19 requires ES modules too): a script run by
    // `vm.Script` has no module loader for `import()` of its own in Node 20.
    supported: { "dynamic-import": false },
    define: { "import.meta.url": "__dotspecFileUrl" },
    banner: { js: 'var __dotspecFileUrl = require("node:url").pathToFileURL(__filename).href;' },
  };
}

/**
 * Writes the code cache of the command's bundle: runs `bin/dotspec.js analyze --json` on
 * `sampleCurve` in a child process with DOTSPEC_CODE_CACHE=write, so the cache holds what a short
 * run compiles, under the V8 flags a short run sets. Returns the child's status line (or why there
 * is no cache), or throws with the child's error output.
 */
export function writeCommandCache(root, sampleCurve) {
  // bin/dotspec.js runs the bundle only where `require` loads ES modules (Node ≥ 20.19).
  if (process.features?.require_module !== true) return "dotspec: no code cache (this Node cannot run the single-file bundle; the command runs its ES modules)";
  return cachingRun(root, ["analyze", "--json", sampleCurve]);
}

/** Writes the code cache of {@link HELP_CJS} from a run of `bin/dotspec.js --help`, as {@link writeCommandCache}. */
export function writeHelpCache(root) {
  return cachingRun(root, ["--help"]);
}

/** Runs the command with `args` and DOTSPEC_CODE_CACHE=write; its status line about the cache. */
function cachingRun(root, args) {
  const run = spawnSync(process.execPath, [join(root, "bin", "dotspec.js"), ...args], {
    cwd: root,
    encoding: "utf8",
    env: { ...process.env, DOTSPEC_CODE_CACHE: "write" },
    maxBuffer: 1 << 26,
  });
  const line = run.stderr.split("\n").find((l) => l.startsWith("dotspec: code cache"));
  if (run.status !== 0 || !line) throw new Error(`writing the code cache (dotspec ${args[0]}) failed (exit ${run.status}): ${run.stderr.slice(-2000)}`);
  return line;
}
