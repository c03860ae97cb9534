// The package as a user gets it: `npm pack`, installed from the tarball into a fresh project
// that has no TypeScript, then used from plain Node, type-checked against the shipped
// declarations, and run as the installed `dotspec` command.
// Expected values: the gap is derived from the in-repo library on the same file (the package
// must give the same number to the last digit); the tarball's file list is the project's own
// packaging rule (by construction: what a user needs, nothing of the repository's workshop).
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { execFile } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { promisify } from "node:util";
import { analysisToJson, analyzeCurve, readCurveFile } from "../../lib/index.ts";

const exec = promisify(execFile);
const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const SAMPLE = join(ROOT, "sample-curves", "dot-01.csv");
const TSC = join(ROOT, "node_modules", "typescript", "bin", "tsc");
/** Installing the tarball's dependencies from npm's cache (or the registry on a cold machine) can take a while. */
const SLOW_MS = 240_000;

/** npm as the surrounding `npm test` runs it (its CLI script), else the `npm` on the PATH. */
function npm(args: string[], cwd: string) {
  const script = process.env.npm_execpath;
  const [file, argv] = script && /\.[cm]?js$/.test(script) ? [process.execPath, [script, ...args]] : ["npm", args];
  return exec(file, argv, { cwd, maxBuffer: 1 << 26, env: { ...process.env, npm_config_audit: "false", npm_config_fund: "false", npm_config_update_notifier: "false" } });
}

interface PackedFile {
  path: string;
}

let work = "";
let consumer = "";
let tarball = "";
let packed: PackedFile[] = [];
let packedSize = 0;

beforeAll(async () => {
  work = mkdtempSync(join(tmpdir(), "dotspec-package-"));
  // dist/ is fresh (the test run's global setup builds it); --ignore-scripts: no second build.
  // A notebook build (dist/notebooks) must stay out of the package: put a page there if none is.
  const notebooks = join(ROOT, "dist", "notebooks");
  const probe = existsSync(notebooks) ? null : join(notebooks, "probe.html");
  if (probe) {
    mkdirSync(notebooks, { recursive: true });
    writeFileSync(probe, "<!doctype html>\n");
  }
  const { stdout } = await npm(["pack", "--ignore-scripts", "--json", "--pack-destination", work], ROOT).finally(() => {
    if (probe) rmSync(notebooks, { recursive: true, force: true });
  });
  const [info] = JSON.parse(stdout) as { filename: string; size: number; files: PackedFile[] }[];
  tarball = join(work, info.filename);
  packed = info.files;
  packedSize = info.size;

  // A fresh project. Its lock file pins dotspec to the tarball and every run-time dependency to
  // the version, address and checksum of this repository's lock file, so `npm ci` installs exactly
  // what CI tested, from npm's cache when it holds them (it does after the repository's `npm ci`).
  consumer = join(work, "consumer");
  mkdirSync(consumer);
  const manifest = JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")) as { version: string; license: string; dependencies: Record<string, string>; bin: Record<string, string>; engines: Record<string, string> };
  const lock = JSON.parse(readFileSync(join(ROOT, "package-lock.json"), "utf8")) as { packages: Record<string, { dev?: boolean }> };
  const spec = `file:${tarball}`;
  const packages: Record<string, unknown> = {
    "": { name: "consumer", version: "1.0.0", dependencies: { dotspec: spec } },
    "node_modules/dotspec": {
      version: manifest.version,
      resolved: spec,
      integrity: "sha512-" + createHash("sha512").update(readFileSync(tarball)).digest("base64"),
      license: manifest.license,
      dependencies: manifest.dependencies,
      bin: manifest.bin,
      engines: manifest.engines,
    },
  };
  for (const [path, entry] of Object.entries(lock.packages)) if (path.startsWith("node_modules/") && entry.dev !== true) packages[path] = entry;
  writeFileSync(join(consumer, "package.json"), JSON.stringify({ name: "consumer", version: "1.0.0", private: true, type: "module", dependencies: { dotspec: spec } }, null, 2));
  writeFileSync(join(consumer, "package-lock.json"), JSON.stringify({ name: "consumer", version: "1.0.0", lockfileVersion: 3, requires: true, packages }, null, 2));
  await npm(["ci", "--prefer-offline", "--ignore-scripts", "--no-audit", "--no-fund"], consumer);
}, SLOW_MS);

afterAll(() => {
  if (work) rmSync(work, { recursive: true, force: true });
});

describe("npm pack", () => {
  it("ships dist/, bin/dotspec.js (with bin/package.json), README.md, LICENSE and package.json, and nothing else", () => {
    const paths = packed.map((f) => f.path).sort();
    const allowed = (p: string) => p.startsWith("dist/") || ["bin/dotspec.js", "bin/package.json", "README.md", "LICENSE", "package.json"].includes(p);
    expect(paths.filter((p) => !allowed(p))).toEqual([]);
    for (const needed of ["dist/index.js", "dist/index.d.ts", "dist/core.js", "dist/core.d.ts", "dist/cli/main.js", "dist/cli/analyzeWorker.js", "dist/cli/gridWorker.js", "dist/cli/command.cjs", "dist/cli/command.cjs.cache", "dist/cli/help.cjs", "dist/cli/help.cjs.cache", "dist/cli/bundled-licences.txt", "bin/dotspec.js", "bin/package.json", "README.md", "LICENSE", "package.json"]) {
      expect(paths, needed).toContain(needed);
    }
    // No tests, benchmarks, scripts, demo data or reports, notebook build, scratch or TypeScript sources.
    const workshop = paths.filter((p) => /^(test|bench|scripts|sample-curves|report|notebooks|artifacts|\.tmp|node_modules|dist\/notebooks)\//.test(p) || (/\.ts$/.test(p) && !p.endsWith(".d.ts")) || p.endsWith(".mjs"));
    expect(workshop).toEqual([]);
    expect(packedSize).toBeGreaterThan(0);
  });

  it("ships the command bundled: dist/cli holds its three entries and shared chunks, not one module per source file", () => {
    const cli = packed.map((f) => f.path).filter((p) => p.startsWith("dist/cli/") && p.endsWith(".js"));
    const entries = cli.filter((p) => !/^dist\/cli\/chunk-[A-Z0-9]+\.js$/.test(p)).sort();
    expect(entries).toEqual(["dist/cli/analyzeWorker.js", "dist/cli/gridWorker.js", "dist/cli/main.js"]);
    // The library compiles to about two hundred modules; the command's bundle must stay a few dozen files (its chunks follow what each command uses).
    expect(packed.filter((f) => f.path.startsWith("dist/") && f.path.endsWith(".js")).length).toBeGreaterThan(100);
    expect(cli.length).toBeLessThan(80);
  });

  it("installs into a project without TypeScript or a TypeScript loader", () => {
    expect(existsSync(join(consumer, "node_modules", "dotspec", "dist", "index.js"))).toBe(true);
    expect(existsSync(join(consumer, "node_modules", "typescript"))).toBe(false);
    expect(existsSync(join(consumer, "node_modules", "tsx"))).toBe(false);
  });
});

describe("the installed package", () => {
  it("plain Node imports the public API and analyses a sample curve to the same gap as the in-repo library (derived: in-repo analyzeCurve on the same file)", async () => {
    writeFileSync(
      join(consumer, "use.mjs"),
      [
        'import { readCurveFile, analyzeCurve, analysisToJson } from "dotspec";',
        'import * as core from "dotspec/core";',
        "const json = analysisToJson(analyzeCurve(readCurveFile(process.argv[2]).curve));",
        'console.log(JSON.stringify({ gapV: json.gapV, chargingEnergyV: json.chargingEnergyV, coreAnalyze: typeof core.analyzeCurve, coreReads: "readCurveFile" in core }));',
      ].join("\n"),
    );
    const { stdout } = await exec(process.execPath, ["use.mjs", SAMPLE], { cwd: consumer });
    const got = JSON.parse(stdout) as { gapV: number; chargingEnergyV: number; coreAnalyze: string; coreReads: boolean };
    const here = analysisToJson(analyzeCurve(readCurveFile(SAMPLE).curve));
    expect(typeof here.gapV).toBe("number");
    expect(got.gapV).toBe(here.gapV);
    expect(got.chargingEnergyV).toBe(here.chargingEnergyV);
    expect(got.coreAnalyze).toBe("function");
    expect(got.coreReads).toBe(false); // the browser-safe entry has no file I/O
  });

  it("type-checks a consumer against the shipped declarations under moduleResolution NodeNext and Bundler", async () => {
    mkdirSync(join(consumer, "src"), { recursive: true });
    writeFileSync(
      join(consumer, "src", "use.ts"),
      [
        'import { analyzeCurve, analysisToJson, readCurveFile, type AnalysisJson, type AnalyzeOptions, type CurveAnalysis } from "dotspec";',
        'import { parseCurveText, type ParsedCurve } from "dotspec/core";',
        "const options: AnalyzeOptions = { eta: 0.8 };",
        'const parsed: ParsedCurve = readCurveFile("dot.csv");',
        "const analysis: CurveAnalysis = analyzeCurve(parsed.curve, options);",
        "const json: AnalysisJson = analysisToJson(analysis);",
        "export const gapV: number | null = json.gapV;",
        'const fromText: ParsedCurve = parseCurveText("bias (V),current (A)\\n0,0\\n", { source: "inline" });',
        "// @ts-expect-error an option that does not exist is refused by the declarations",
        "analyzeCurve(fromText.curve, { etaa: 0.8 });",
        "",
      ].join("\n"),
    );
    const common = { target: "ES2022", lib: ["ES2022"], strict: true, noEmit: true, skipLibCheck: false, types: [] };
    const configs = {
      "tsconfig.nodenext.json": { ...common, module: "NodeNext", moduleResolution: "NodeNext" },
      "tsconfig.bundler.json": { ...common, module: "ESNext", moduleResolution: "Bundler" },
    };
    for (const [name, compilerOptions] of Object.entries(configs)) {
      writeFileSync(join(consumer, name), JSON.stringify({ compilerOptions, files: ["src/use.ts"] }, null, 2));
      const result = await exec(process.execPath, [TSC, "-p", name], { cwd: consumer }).then(
        () => "",
        (e: { stdout: string; stderr: string }) => e.stdout + e.stderr,
      );
      expect(result, name).toBe("");
    }
    // …and the check does bite: a wrong type is reported against the declarations.
    writeFileSync(join(consumer, "src", "use.ts"), 'import { analyzeCurve } from "dotspec";\nexport const n: number = analyzeCurve;\n');
    const wrong = await exec(process.execPath, [TSC, "-p", "tsconfig.nodenext.json"], { cwd: consumer }).then(
      () => "",
      (e: { stdout: string }) => e.stdout,
    );
    expect(wrong).toMatch(/error TS2322/);
  });

  it("runs the installed dotspec command: --help, and analyze --json on a sample curve", async () => {
    const bin = join(consumer, "node_modules", ".bin", "dotspec");
    const version = await exec(bin, ["--version"], { cwd: consumer });
    expect(version.stdout.trim()).toBe((JSON.parse(readFileSync(join(ROOT, "package.json"), "utf8")) as { version: string }).version);
    const help = await exec(bin, ["--help"], { cwd: consumer });
    expect(help.stdout).toMatch(/^Usage: dotspec /);
    for (const command of ["analyze", "sizes", "fit", "grid", "simulate"]) expect(help.stdout).toMatch(new RegExp(`\\n  ${command} `));
    const analyzed = await exec(bin, ["analyze", SAMPLE, "--json"], { cwd: consumer });
    expect(analyzed.stderr).toBe("dotspec: 1 done, 0 failed, 0 warnings\n");
    const [record] = JSON.parse(analyzed.stdout) as { gapV: number }[];
    expect(record.gapV).toBe(analysisToJson(analyzeCurve(readCurveFile(SAMPLE).curve)).gapV);
    // The short run above came from the single-file bundle with the code cache packed beside it
    // (bin/dotspec.js; Node ≥ 20.19), and V8 accepted that cache here.
    if ((process as { features: { require_module?: boolean } }).features.require_module === true) {
      const checked = await exec(bin, ["analyze", SAMPLE, "--json"], { cwd: consumer, env: { ...process.env, DOTSPEC_CODE_CACHE: "check" } });
      expect(checked.stderr).toBe("dotspec: code cache used\ndotspec: 1 done, 0 failed, 0 warnings\n");
      expect(checked.stdout).toBe(analyzed.stdout);
    }
  });

  it("runs analyze on two worker threads from the compiled worker file", async () => {
    const bin = join(consumer, "node_modules", ".bin", "dotspec");
    const r = await exec(bin, ["analyze", SAMPLE, join(ROOT, "sample-curves", "dot-04.csv"), "--json", "--jobs", "2"], { cwd: consumer });
    expect(r.stderr).toMatch(/^dotspec: 2 done, 0 failed/);
    expect(JSON.parse(r.stdout)).toHaveLength(2);
  });
});
