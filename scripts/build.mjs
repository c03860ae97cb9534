#!/usr/bin/env node
// `npm run build`: compiles lib/ into dist/ (ESM JavaScript, .d.ts declarations, source maps) with
// the project's TypeScript compiler, then points the relative imports of the declarations at the
// emitted .js files (the compiler rewrites them in the JavaScript only), so the declarations
// resolve for consumers under moduleResolution NodeNext and Bundler. Last, the command's compiled
// modules (dist/cli) are bundled into a few files, so that a `dotspec` process loads a handful
// of modules instead of about two hundred (see step 4), and once more into one CommonJS file with
// a V8 code cache for short runs (steps 5 and 6). Plain JavaScript, so it runs on a fresh
// `npm ci` (the `prepare` script) without any TypeScript loader.
//
//   node scripts/build.mjs            # dist/ next to this package's package.json
import { spawnSync } from "node:child_process";
import { readdirSync, readFileSync, renameSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const dist = join(root, "dist");

// 1. Remove what an earlier build emitted (a deleted module must not linger), keeping the
//    notebook build that `npm run notebooks:build` writes to dist/notebooks.
if (existsSync(dist)) {
  for (const entry of readdirSync(dist)) if (entry !== "notebooks") rmSync(join(dist, entry), { recursive: true, force: true });
}

// 2. Compile with the project's own tsc.
const require = createRequire(import.meta.url);
const tscPackage = require.resolve("typescript/package.json");
const tsc = join(dirname(tscPackage), JSON.parse(readFileSync(tscPackage, "utf8")).bin.tsc);
const compiled = spawnSync(process.execPath, [tsc, "-p", join(root, "tsconfig.build.json")], { stdio: "inherit", cwd: root });
if (compiled.status !== 0) {
  console.error(`build: tsc failed (exit ${compiled.status ?? compiled.signal})`);
  process.exit(1);
}

// 3. Relative `.ts` specifiers in the declarations → `.js` (import, export, import("…") types).
const specifier = /((?:\bfrom\s*|\bimport\s*\(\s*|\bimport\s+)["'])(\.{1,2}\/[^"']*?)\.ts(["'])/g;
const declarations = [];
const walk = (dir) => {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory() && path !== join(dist, "notebooks")) walk(path);
    else if (entry.name.endsWith(".d.ts")) declarations.push(path);
  }
};
walk(dist);
const left = [];
for (const path of declarations) {
  const text = readFileSync(path, "utf8");
  const fixed = text.replace(specifier, "$1$2.js$3");
  if (fixed !== text) writeFileSync(path, fixed);
  // A leftover relative `.ts` specifier would make the declarations unusable: fail on it.
  if (/["']\.{1,2}\/[^"']*\.ts["']/.test(fixed)) left.push(path);
}
if (left.length) {
  console.error(`build: relative .ts imports left in ${left.join(", ")}`);
  process.exit(1);
}
// 4. The command, bundled. Node's module loader pays for every file it resolves, reads and
//    compiles: the library is about 200 modules, and loading them took ~100 ms of each
//    `dotspec analyze` process (measured with `npm run bench:startup`, README "Start-up and the
//    package"). esbuild joins the command's compiled modules (dist/cli/main.js and the two worker
//    entries) into entry files and shared chunks that replace dist/cli, so bin/dotspec.js and
//    the workers keep their paths. Dynamic imports stay separate chunks, so a command still
//    loads only what it needs; packages stay external (the lazy `require` of mathjs, ml-matrix
//    and cli-progress resolves them from node_modules as before). The source maps chain to the
//    TypeScript sources through the compiler's maps. The library entries (dist/index.js,
//    dist/core.js) stay one module per source file, as a consumer's bundler expects.
const cli = join(dist, "cli");
const bundled = join(dist, ".cli-bundle");
rmSync(bundled, { recursive: true, force: true });
const esbuild = await import("esbuild");
const { flattenBarrels } = await import("./flattenBarrels.mjs");
const { bundleCommandCjs, bundleHelpCjs, writeCommandCache, writeHelpCache, packagesExcept, licences, INLINE_PACKAGES, LICENCES_FILE, LICENCES_FOOTER, COMMAND_CJS, HELP_CJS } = await import("./commandBundle.mjs");
try {
  await esbuild.build({
    entryPoints: Object.fromEntries(["main", "analyzeWorker", "gridWorker"].map((name) => [name, join(cli, `${name}.js`)])),
    outdir: bundled,
    bundle: true,
    splitting: true,
    format: "esm",
    platform: "node",
    target: "node20",
    sourcemap: "linked",
    // Positions only: the sources themselves ship once, inside the library's own maps.
    sourcesContent: false,
    chunkNames: "chunk-[hash]",
    logLevel: "warning",
    // Packages stay external but the small ones every start needs (INLINE_PACKAGES, their
    // licences in dist/cli/bundled-licences.txt); commander is CommonJS, so its `require`s of Node's
    // built-in modules need a `require` in the ES chunks.
    banner: { js: 'import { createRequire as __dotspecCreateRequire } from "node:module"; const require = __dotspecCreateRequire(import.meta.url);' },
    footer: { js: LICENCES_FOOTER },
    // Imports of the library's entry pointed at the defining modules, so that the chunks follow
    // what each command uses (scripts/flattenBarrels.mjs).
    plugins: [flattenBarrels(cli), packagesExcept(INLINE_PACKAGES)],
  });
  // 5. The command once more as one CommonJS file, for short runs with a code cache
  //    (scripts/commandBundle.mjs says why; bin/dotspec.js chooses).
  await bundleCommandCjs(esbuild, root, dist, join(cli, "main.js"), join(bundled, COMMAND_CJS));
  // 5b. Its entry and option parser alone, for runs that name no command (--help, --version).
  await bundleHelpCjs(esbuild, root, dist, join(cli, "main.js"), join(bundled, HELP_CJS));
} catch (err) {
  console.error(`build: bundling the command failed: ${err instanceof Error ? err.message : err}`);
  process.exit(1);
}
writeFileSync(join(bundled, LICENCES_FILE), licences(root, INLINE_PACKAGES));
rmSync(cli, { recursive: true, force: true });
renameSync(bundled, cli);
const chunks = readdirSync(cli).filter((f) => f.endsWith(".js")).length;
console.log(`build: dist/ written (${declarations.filter((p) => !p.startsWith(cli)).length} declaration files; the command in ${chunks} files, ${COMMAND_CJS} and ${HELP_CJS})`);

// 6. The code caches: the command's from one short run on a bundled sample curve (absent from a
//    source tree without sample-curves/: the command then compiles at each start, as it would
//    anyway), and that of the help bundle from one `--help`.
const sample = join(root, "sample-curves", "dot-05.dat");
try {
  console.log(`build: help: ${writeHelpCache(root).replace(/^dotspec: /, "")}`);
  if (existsSync(sample)) console.log(`build: ${writeCommandCache(root, sample).replace(/^dotspec: /, "")}`);
  else console.log(`build: no code cache (sample-curves/dot-05.dat not here)`);
} catch (err) {
  console.error(`build: ${err instanceof Error ? err.message : err}`);
  process.exit(1);
}
