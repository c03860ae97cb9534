#!/usr/bin/env node
// `npm run build`: compiles lib/ into dist/ (ESM JavaScript, .d.ts declarations, source maps) with
// the project's TypeScript compiler, then points the relative imports of the declarations at the
// emitted .js files (the compiler rewrites them in the JavaScript only), so the declarations
// resolve for consumers under moduleResolution NodeNext and Bundler. Plain JavaScript, so it runs
// on a fresh `npm ci` (the `prepare` script) without any TypeScript loader.
//
//   node scripts/build.mjs            # dist/ next to this package's package.json
import { spawnSync } from "node:child_process";
import { readdirSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
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
console.log(`build: dist/ written (${declarations.length} declaration files)`);
