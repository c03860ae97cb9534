// An esbuild plugin for the command's bundle (scripts/build.mjs, step 4): each named import from
// the library's entry modules (dist/index.js, dist/core.js) is rewritten to import the same name
// from the module that defines it.
//
// Why: the command imports the library only through its public entry (lib/index.ts), and that
// entry re-exports every module. esbuild assigns each module to a chunk by the set of entry
// points (including every `import()`) that can reach it, and through the entry every entry point
// reaches every module: the model fit, the size series and the grid maps all landed in the one
// shared chunk that `dotspec analyze --json` loads first (462 kB, ~30 ms to load on the 2-core
// machine of the README). With the imports pointed at the defining modules, a module is reached
// only by the code that uses it, and `import()` keeps the fit, the sizes and the grids out of an
// analysis that does not need them. The names, the values and the order of evaluation are the
// same: only which file a binding is read from changes. Plain JavaScript, like build.mjs.
import { readFileSync } from "node:fs";
import { dirname, relative, resolve, sep } from "node:path";

const REEXPORT = /export\s*\{([^}]*)\}\s*from\s*"([^"]+)";/g;
const REEXPORT_ALL = /export\s*\*\s*from\s*"([^"]+)";/g;
const IMPORT = /import\s*\{([^}]*)\}\s*from\s*"((?:\.\.?\/)+)(index|core)\.js";/g;

/** `a`, `a as b` → [exported name, local name]. */
function specifiers(list) {
  return list
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean)
    .map((s) => {
      const [name, alias] = s.split(/\s+as\s+/);
      return [name.trim(), (alias ?? name).trim()];
    });
}

/** Re-exports of one module: name → [source file, name there], and the targets of `export *`. */
function reexportsOf(file, cache) {
  if (cache.has(file)) return cache.get(file);
  const text = readFileSync(file, "utf8");
  const named = new Map();
  const all = [];
  for (const [, list, from] of text.matchAll(REEXPORT)) {
    for (const [theirs, ours] of specifiers(list)) named.set(ours, [resolve(dirname(file), from), theirs]);
  }
  for (const [, from] of text.matchAll(REEXPORT_ALL)) all.push(resolve(dirname(file), from));
  const entry = { named, all };
  cache.set(file, entry);
  return entry;
}

/**
 * The module that defines `name` as exported from `file`, and its name there, following
 * re-exports; null when it cannot be told from the re-export lines alone (the import then stays).
 */
function definingModule(file, name, cache, depth = 0) {
  if (depth > 20) return null;
  const { named, all } = reexportsOf(file, cache);
  const hit = named.get(name);
  if (hit) return definingModule(hit[0], hit[1], cache, depth + 1) ?? { file: hit[0], name: hit[1] };
  for (const target of all) {
    const found = definingModule(target, name, cache, depth + 1);
    if (found) return found;
  }
  // Not re-exported here: defined here if the module declares it.
  const text = readFileSync(file, "utf8");
  const declared = new RegExp(`export\\s+(?:async\\s+)?(?:function\\*?|const|let|var|class)\\s+${name.replace(/\$/g, "\\$")}\\b`);
  return declared.test(text) ? { file, name } : null;
}

/** The plugin: rewrites imports from the entry modules in the files under `cliDir`. */
export function flattenBarrels(cliDir) {
  const cache = new Map();
  return {
    name: "flatten-library-entry",
    setup(build) {
      build.onLoad({ filter: /\.js$/ }, (args) => {
        if (!args.path.startsWith(cliDir + sep)) return undefined;
        const text = readFileSync(args.path, "utf8");
        const here = dirname(args.path);
        const contents = text.replace(IMPORT, (whole, list, up, entry) => {
          const barrel = resolve(here, `${up}${entry}.js`);
          const byFile = new Map();
          for (const [theirs, local] of specifiers(list)) {
            const found = definingModule(barrel, theirs, cache);
            if (!found) return whole;
            const key = found.file;
            if (!byFile.has(key)) byFile.set(key, []);
            byFile.get(key).push(found.name === local ? local : `${found.name} as ${local}`);
          }
          // One line, as the statement was: the source map's lines stay where they were.
          return [...byFile]
            .map(([file, names]) => {
              const path = relative(here, file).split(sep).join("/");
              return `import { ${names.join(", ")} } from "${path.startsWith(".") ? path : `./${path}`}";`;
            })
            .join(" ");
        });
        return { contents, loader: "js", resolveDir: here };
      });
    },
  };
}
