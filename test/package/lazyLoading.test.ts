// The start-up path of the built command loads only what the command needs (DEVELOPERS.md, "Lazy
// loading"): `--help` loads no library, `analyze --json` none of the heavy dependencies. Run
// under plain Node with a preload that refuses them, for ES modules (a resolve hook) and for
// `require` (what lazyModule uses in Node) alike. Expected values are derived from the project's
// own loading rule (by construction); each block is shown to bite where the dependency is needed.
import { describe, it, expect, afterAll } from "vitest";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { runNode } from "../helpers/runProcess.ts";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const BIN = join(ROOT, "bin", "dotspec.js");
const SAMPLE = join(ROOT, "sample-curves", "dot-01.csv");
const HEAVY = "jsdom|@observablehq/plot|mathjs|ml-matrix|ml-levenberg-marquardt|cli-progress";

const dir = mkdtempSync(join(tmpdir(), "dotspec-lazy-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/**
 * A preload that refuses the packages matching `pattern` and, optionally, the parts of the library
 * that define the functions named in `definitions` ("analyzeCurve": the library itself, i.e.
 * dist/pipeline/analyzeCurve.js in the compiled library or the chunk that holds it in the
 * command's bundle; "fitCurve": the model fit; …).
 */
function blocker(name: string, pattern: string, definitions: string | null): string {
  const hooks = join(dir, `${name}-hooks.mjs`);
  writeFileSync(
    hooks,
    [
      'import { readFileSync } from "node:fs";',
      'import { fileURLToPath } from "node:url";',
      `const blocked = new RegExp(${JSON.stringify(`^(${pattern})(/|$)`)});`,
      `const defines = ${definitions ? `new RegExp(${JSON.stringify(`function (${definitions})\\(`)})` : "null"};`,
      "export async function resolve(specifier, context, next) {",
      '  if (blocked.test(specifier)) throw new Error("blocked " + specifier);',
      "  const result = await next(specifier, context);",
      "  if (defines && /\\/dist\\/.*\\.js$/.test(result.url) && defines.test(readFileSync(fileURLToPath(result.url), \"utf8\"))) throw new Error(\"blocked the library \" + result.url);",
      "  return result;",
      "}",
    ].join("\n"),
  );
  const preload = join(dir, `${name}.mjs`);
  writeFileSync(
    preload,
    [
      'import { register } from "node:module";',
      'import Module from "node:module";',
      `register(${JSON.stringify(`./${name}-hooks.mjs`)}, import.meta.url);`,
      `const blocked = new RegExp(${JSON.stringify(`^(${pattern})(/|$)`)});`,
      "const load = Module._load;",
      'Module._load = function (request, ...rest) { if (blocked.test(request)) throw new Error("blocked require " + request); return load.call(this, request, ...rest); };',
    ].join("\n"),
  );
  return preload;
}

const node = (args: string[]) => runNode(args, dir);
/**
 * The same through the command's ES modules (dist/cli/main.js and its chunks): a short `analyze`
 * or `fit` otherwise runs the single-file bundle with its code cache (bin/dotspec.js), where the
 * library is one file and "which modules loaded" has no meaning; --help, --version and batches
 * always take this path.
 */
const nodeModules = (args: string[]) => runNode(args, dir, { NO_COLOR: "1", DOTSPEC_CODE_CACHE: "off" });

describe("the built command's start-up", () => {
  it("--help and --version load neither the library nor any heavy dependency", async () => {
    const preload = blocker("nolib", HEAVY, "analyzeCurve");
    // From the help bundle (dist/cli/help.cjs) and from the ES modules alike.
    for (const run of [node, nodeModules]) {
      const help = await run(["--import", preload, BIN, "--help"]);
      expect(help.stderr).toBe("");
      expect(help.code).toBe(0);
      expect(help.stdout).toMatch(/^Usage: dotspec /);
      expect((await run(["--import", preload, BIN, "--version"])).code).toBe(0);
    }
    // …and the block bites as soon as a command needs the library.
    const analyze = await nodeModules(["--import", preload, BIN, "analyze", SAMPLE, "--json"]);
    expect(analyze.code).not.toBe(0);
    expect(analyze.stderr).toMatch(/blocked the library/);
  });

  it("the help bundle cannot take in the library: its build fails where the entry imports any of it statically", async () => {
    const esbuild = await import("esbuild");
    const { bundleHelpCjs } = (await import(new URL("../../scripts/commandBundle.mjs", import.meta.url).href)) as {
      bundleHelpCjs: (esbuild: unknown, root: string, distDir: string, entry: string, outFile: string) => Promise<void>;
    };
    const dist = join(ROOT, "dist");
    // A module of the library (dist/util/errors.js) as the entry: refused, naming it.
    await expect(bundleHelpCjs(esbuild, ROOT, dist, join(dist, "util", "errors.js"), join(dir, "refused.cjs"))).rejects.toThrow(/would load the library \(dist\/util\/errors\.js\)/);
    // The same library imported dynamically: left out of the bundle, which then fails only if that import runs.
    const entry = join(dir, "entry.mjs");
    writeFileSync(entry, `export const load = async () => (await import(${JSON.stringify(join(dist, "util", "errors.js"))})).DotspecError;\n`);
    await bundleHelpCjs(esbuild, ROOT, dist, entry, join(dir, "help.cjs"));
    const bundled = { exports: {} as { load: () => Promise<unknown> } };
    new Function("module", "exports", "require", "__filename", readFileSync(join(dir, "help.cjs"), "utf8"))(bundled, bundled.exports, createRequire(entry), join(dir, "help.cjs"));
    await expect(bundled.exports.load()).rejects.toThrow(/is not in help\.cjs/);
  });

  it("analyze --json loads none of jsdom, Observable Plot, mathjs, ml-matrix, the Levenberg–Marquardt solver, cli-progress, from the single-file bundle and from the ES modules alike", async () => {
    const preload = blocker("heavy", HEAVY, null);
    for (const run of [node, nodeModules]) {
      const r = await run(["--import", preload, BIN, "analyze", SAMPLE, "--json"]);
      expect(r.stderr).toBe("dotspec: 1 done, 0 failed, 0 warnings\n");
      expect(r.code).toBe(0);
      expect(JSON.parse(r.stdout)).toHaveLength(1);
    }
  });

  it("analyze --json loads no code of the model fit, the size series or the grid maps; --compare-models loads the fit", async () => {
    const preload = blocker("parts", HEAVY, "fitCurve|sizeSeries|analyzeGrid");
    const r = await nodeModules(["--import", preload, BIN, "analyze", SAMPLE, "--json"]);
    expect(r.stderr).toBe("dotspec: 1 done, 0 failed, 0 warnings\n");
    expect(r.code).toBe(0);
    // …and the block bites where the fit is needed.
    const compared = await nodeModules(["--import", preload, BIN, "analyze", SAMPLE, "--json", "--compare-models", "all"]);
    expect(compared.code).not.toBe(0);
    expect(compared.stderr).toMatch(/blocked the library/);
  });

  it("the blocks bite where the dependency is needed: a size formula needs mathjs, a fit ml-matrix", async () => {
    const mathjs = blocker("mathjs", "mathjs", null);
    const formula = await node(["--import", mathjs, "--input-type=module", "-e", `const m = await import(${JSON.stringify(join(ROOT, "dist", "index.js"))}); m.parseSizeFormula("a / R");`]);
    expect(formula.code).not.toBe(0);
    expect(formula.stderr).toMatch(/blocked require mathjs/);
    const matrix = blocker("matrix", "ml-matrix|ml-levenberg-marquardt", null);
    const fit = await node(["--import", matrix, BIN, "fit", SAMPLE, "--json"]);
    expect(fit.code).not.toBe(0);
    expect(fit.stderr).toMatch(/blocked require ml-/);
  });
});
