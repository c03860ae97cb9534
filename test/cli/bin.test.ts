// The real binary under plain Node (not vitest's module loader): bin/dotspec.js runs the compiled
// main (dist/, built by the test run's global setup). This catches module-format traps that in-process tests cannot see (for example the
// CommonJS default export of ml-savitzky-golay, toolchain notes).
import { describe, it, expect, afterAll } from "vitest";
import { execFile, spawn } from "node:child_process";
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { promisify } from "node:util";
import { expectClose } from "../helpers/expectClose.ts";
import { runNode } from "../helpers/runProcess.ts";
import type { AnalysisJson } from "../../lib/index.ts";
import { chargingPeakV, FILLING, removeTempDirs, tempDir, writeCurve } from "./harness.ts";

const BIN = fileURLToPath(new URL("../../bin/dotspec.js", import.meta.url));
const exec = promisify(execFile);

afterAll(removeTempDirs);

const dotspec = (args: string[], cwd: string) => runNode([BIN, ...args], cwd);

describe("node bin/dotspec.js", () => {
  it("simulate writes a CSV and analyze --json reads it back, peaks at (ε + Ec(n + ½))/η (closed form of orthodox theory: Beenakker, Phys. Rev. B 44, 1646 (1991))", async () => {
    const dir = tempDir();
    writeFileSync(join(dir, "dot.json"), JSON.stringify(FILLING));
    const sim = await dotspec(["simulate", "--config", "dot.json", "--out", "curves/dot.csv", "--method", "fast"], dir);
    expect(sim.code).toBe(0);
    expect(sim.stdout).toBe("");
    expect(readFileSync(join(dir, "curves/dot.csv"), "utf8").split("\n").find((l) => !l.startsWith("# "))).toBe("bias (V),current (A)");

    const r = await dotspec(["analyze", "curves", "--eta", "0.8", "--json"], dir);
    expect(r.stderr).toBe("dotspec: 1 done, 0 failed, 0 warnings\n");
    expect(r.code).toBe(0);
    const [j] = JSON.parse(r.stdout) as AnalysisJson[];
    expect(j.source).toBe(join("curves", "dot.csv"));
    const p = j.multiplets.find((m) => m.label === "p")!;
    expectClose(p.peaksV, [2, 3, 4].map((n) => chargingPeakV(0.8, n)), { atol: 0.003, what: "p peaks" });
  });

  it("analyze --out loads Observable Plot and jsdom under plain Node and writes the figure", async () => {
    const dir = tempDir();
    writeFileSync(join(dir, "dot.json"), JSON.stringify(FILLING));
    await dotspec(["simulate", "--config", "dot.json", "--out", "in/dot.csv", "--method", "fast"], dir);
    const r = await dotspec(["analyze", "in/dot.csv", "--out", "report"], dir);
    expect(r.code).toBe(0);
    expect(readFileSync(join(dir, "report/dot.svg"), "utf8")).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
  });

  it("passes the exit code to the process: 2 for a usage error, 1 for a failed file", async () => {
    const dir = tempDir();
    const usage = await dotspec(["analyze", "x.csv", "--eta", "1.5"], dir);
    expect(usage.code).toBe(2);
    expect(usage.stderr).toMatch(/--eta/);
    const failed = await dotspec(["analyze", "missing.csv"], dir);
    expect(failed.code).toBe(1);
    expect(failed.stderr).toBe("dotspec: missing.csv: no such file or folder (from " + dir + "); check the path\ndotspec: 0 done, 1 failed, 0 warnings\n");
  });

  it("stops quietly when the reader of stdout goes away (`dotspec analyze … | head`)", async () => {
    const dir = tempDir();
    for (let k = 0; k < 8; k++) writeCurve(join(dir, `dot-${k}.csv`), { ...FILLING, noise: { relative: 0.003, seed: 30 + k } });
    const child = spawn(process.execPath, [BIN, "analyze", dir, "--jobs", "1"], { stdio: ["ignore", "pipe", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (d) => (stderr += d));
    child.stdout.once("data", () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on("close", resolve));
    expect(stderr).toBe("");
    expect(code).toBe(0);
  });

  it("--help and --version stop quietly when stdout's reader is already gone (`dotspec --help | true`), from the help bundle and from the ES modules", async () => {
    for (const [args, mode] of [[["--help"], "check"], [["--version"], "check"], [["--help"], "off"]] as const) {
      const child = spawn(process.execPath, [BIN, ...args], { stdio: ["ignore", "pipe", "pipe"], env: { ...process.env, DOTSPEC_CODE_CACHE: mode } });
      // The read end closes before the child has started: its first write meets a closed pipe (EPIPE).
      child.stdout.destroy();
      let stderr = "";
      child.stderr.on("data", (d) => (stderr += d));
      const code = await new Promise<number | null>((resolve) => child.on("close", resolve));
      expect(stderr, `${args.join(" ")} ${mode}`).toBe(mode === "check" ? "dotspec: code cache used\n" : "");
      expect(code, `${args.join(" ")} ${mode}`).toBe(0);
    }
  });

  it("loads neither Observable Plot nor jsdom without --out (they take most of a second to import)", async () => {
    const dir = tempDir();
    writeCurve(join(dir, "dot.csv"), FILLING);
    // A module-resolution hook that refuses the two packages: analyze must not need them…
    writeFileSync(
      join(dir, "hooks.mjs"),
      'export async function resolve(s, c, next) { if (/^(jsdom|@observablehq\\/plot)(\\/|$)/.test(s)) throw new Error("blocked " + s); return next(s, c); }\n',
    );
    // …and a `require` hook as well: a short run loads packages from the single-file bundle with `require`.
    writeFileSync(
      join(dir, "block.mjs"),
      [
        'import Module, { register } from "node:module";',
        'register("./hooks.mjs", import.meta.url);',
        "const load = Module._load;",
        'Module._load = function (request, ...rest) { if (/^(jsdom|@observablehq\\/plot)(\\/|$)/.test(request)) throw new Error("blocked " + request); return load.call(this, request, ...rest); };',
        "",
      ].join("\n"),
    );
    const withHook = (args: string[]) =>
      exec(process.execPath, ["--import", join(dir, "block.mjs"), BIN, ...args], { cwd: dir }).then(
        () => 0,
        (e: { code: number; stderr: string }) => ({ code: e.code, stderr: e.stderr }),
      );
    expect(await withHook(["analyze", "dot.csv", "--json"])).toBe(0);
    // …and the hook does bite when they are needed.
    const out = await withHook(["analyze", "dot.csv", "--out", "report"]);
    expect(out).toMatchObject({ code: 1 });
    expect((out as { stderr: string }).stderr).toMatch(/blocked (jsdom|@observablehq\/plot)/);
  });
});

describe("node bin/dotspec.js: a short run from the single-file bundle and its code cache", () => {
  // Expected values by construction: the bundle and the ES modules are two builds of the same
  // sources (scripts/build.mjs), so every output must agree to the byte; the cache is V8's own.
  const SAMPLE = fileURLToPath(new URL("../../sample-curves/dot-01.csv", import.meta.url));
  const OTHER = fileURLToPath(new URL("../../sample-curves/dot-04.csv", import.meta.url));
  const requiresEsm = (process as { features: { require_module?: boolean } }).features.require_module === true;
  const run = (args: string[], mode: "check" | "off") => runNode([BIN, ...args], process.cwd(), { NO_COLOR: "1", DOTSPEC_CODE_CACHE: mode });

  it("analyze --json and fit --json use the cache the build wrote and print what the ES modules print", async () => {
    for (const args of [["analyze", SAMPLE, "--json"], ["fit", SAMPLE, "--json"], ["analyze", SAMPLE, OTHER, "--json", "--jobs", "2"]]) {
      const [cached, modules] = await Promise.all([run(args, "check"), run(args, "off")]);
      expect(cached.code, args.join(" ")).toBe(0);
      expect(cached.stdout, args.join(" ")).toBe(modules.stdout);
      expect(cached.stderr, args.join(" ")).toBe((requiresEsm ? "dotspec: code cache used\n" : "") + modules.stderr);
    }
  });

  it("analyze --out and analyze --compare-models all write the same files from the bundle as from the ES modules (figures and fits included)", async () => {
    const outputs: Record<string, string>[] = [];
    for (const mode of ["check", "off"] as const) {
      const dir = tempDir();
      const r = await run(["analyze", SAMPLE, "--out", join(dir, "report"), "--compare-models", "all"], mode);
      expect(r.code, mode).toBe(0);
      const files = readdirSync(join(dir, "report")).filter((f) => !f.startsWith("."));
      outputs.push(Object.fromEntries(files.map((f) => [f, readFileSync(join(dir, "report", f), "utf8")])));
    }
    expect(Object.keys(outputs[0])).toContain("dot-01.svg");
    expect(outputs[0]).toEqual(outputs[1]);
  });

  it("a run that names no command (--help, --version, none, an unknown option) uses the help bundle's cache and prints what the ES modules print", async () => {
    for (const args of [["--help"], ["-h"], ["--version"], [], ["--no-such-option"]]) {
      const [cached, modules] = await Promise.all([run(args, "check"), run(args, "off")]);
      expect(cached.code, args.join(" ")).toBe(modules.code);
      expect(cached.stdout, args.join(" ")).toBe(modules.stdout);
      expect(cached.stderr, args.join(" ")).toBe("dotspec: code cache used\n" + modules.stderr);
    }
    expect((await run(["--help"], "off")).stdout).toMatch(/^Usage: dotspec /);
  });

  it("a command's --help and a folder (a batch) run the ES modules: no bundle, no cache", async () => {
    const help = await run(["analyze", "--help"], "check");
    expect(help.code).toBe(0);
    expect(help.stderr).toBe("");
    expect(help.stdout).toMatch(/^Usage: dotspec analyze /);
    const folder = await run(["analyze", tempDirWith(SAMPLE), "--json"], "check");
    expect(folder.code).toBe(0);
    expect(folder.stderr).not.toMatch(/code cache/);
  });
});

/** A temporary folder holding a copy of `file`. */
function tempDirWith(file: string): string {
  const dir = tempDir();
  writeFileSync(join(dir, "dot.csv"), readFileSync(file));
  return dir;
}
