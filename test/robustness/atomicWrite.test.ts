// Ctrl-C leaves no half-written file: writeTextFile writes a temporary file in the same folder and
// renames it into place. Expectations derived by construction (POSIX rename(2) replaces the target in one
// step within a file system) and checked against a process killed in the middle of its writes.
import { describe, it, expect, afterAll } from "vitest";
import { spawn } from "node:child_process";
import { existsSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { checkOutputFolder, TEMP_FILE_PATTERN, writeTextFile } from "../../lib/index.ts";
import { errorOf } from "../helpers/errors.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const RUN_TS = fileURLToPath(new URL("../../bin/run-ts.mjs", import.meta.url));
const CHILD = fileURLToPath(new URL("./fixtures/writeForever.ts", import.meta.url));

describe("writeTextFile(path, text): temporary name, then rename", () => {
  it("leaves only the final file in the folder (no temporary file) and replaces an existing one whole", () => {
    const dir = tempDir("dotspec-atomic-");
    const path = join(dir, "a.json");
    writeFileSync(path, "old content that is longer than the new one\n");
    writeTextFile(path, "new\n");
    expect(readFileSync(path, "utf8")).toBe("new\n");
    expect(readdirSync(dir)).toEqual(["a.json"]);
  });

  it("a failed write leaves neither the file nor a temporary file, and says why", () => {
    const dir = tempDir("dotspec-atomic-");
    writeFileSync(join(dir, "blocker"), "x");
    const err = errorOf(() => writeTextFile(join(dir, "blocker", "a.json"), "text"));
    expect(err.code).toBe("io/write-failed");
    expect(readdirSync(dir)).toEqual(["blocker"]);
  });

  it("a process killed (SIGKILL) in the middle of its writes leaves the old file or a whole new one, never part of one", async () => {
    const dir = tempDir("dotspec-atomic-");
    const path = join(dir, "big.txt");
    const bytes = 8_000_000;
    writeFileSync(path, "z".repeat(bytes));
    const child = spawn(process.execPath, [RUN_TS, CHILD, path, String(bytes)], { stdio: ["ignore", "pipe", "inherit"] });
    await new Promise<void>((resolve) => child.stdout.once("data", () => resolve()));
    // Let it write several versions, then kill it without warning (worse than Ctrl-C).
    await new Promise((resolve) => setTimeout(resolve, 400));
    child.kill("SIGKILL");
    await new Promise((resolve) => child.once("exit", resolve));
    const text = readFileSync(path, "utf8");
    expect(text.length).toBe(bytes);
    expect(new Set(text).size).toBe(1); // one version, whole
    // A temporary file may remain; it has the temporary pattern, and the output-folder check accepts it.
    const others = readdirSync(dir).filter((f) => f !== "big.txt");
    for (const f of others) expect(f).toMatch(TEMP_FILE_PATTERN);
    expect(checkOutputFolder(dir).foreign).toEqual(["big.txt"]); // big.txt is not listed in a manifest
    expect(existsSync(path)).toBe(true);
  }, 30_000);
});

describe("dotspec analyze --out interrupted by Ctrl-C (SIGINT)", () => {
  it("leaves only whole files, and the next run into the same folder is accepted without --force", async () => {
    const { writeCurve, FILLING, run } = await import("../cli/harness.ts");
    const dir = tempDir("dotspec-sigint-");
    for (let k = 0; k < 40; k++) writeCurve(join(dir, `dot-${String(k).padStart(2, "0")}.csv`), { ...FILLING, noise: { relative: 0.003, seed: 100 + k } });
    const out = join(tempDir("dotspec-sigint-"), "report");
    const bin = fileURLToPath(new URL("../../bin/dotspec.js", import.meta.url));
    const child = spawn(process.execPath, [bin, "analyze", dir, "--eta", "0.8", "--out", out, "--json"], { stdio: "ignore" });
    const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
    // Wait until some reports are written, then press Ctrl-C.
    for (let t = 0; t < 600; t++) {
      if (existsSync(out) && readdirSync(out).filter((f) => f.endsWith(".svg")).length >= 3) break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    child.kill("SIGINT");
    await exited;
    const files = readdirSync(out);
    expect(files).not.toContain("summary.csv"); // the run was stopped before its end
    expect(files.filter((f) => f.endsWith(".json") && !f.startsWith(".")).length).toBeGreaterThan(0);
    for (const f of files) {
      if (TEMP_FILE_PATTERN.test(f)) continue;
      const text = readFileSync(join(out, f), "utf8");
      if (f.endsWith(".json")) expect(() => JSON.parse(text), f).not.toThrow();
      if (f.endsWith(".svg")) expect(text.trimEnd().endsWith("</svg>"), f).toBe(true);
    }
    const again = await run(["analyze", dir, "--eta", "0.8", "--out", out, "--json"]);
    expect(again.code).toBe(0);
    expect(readdirSync(out).filter((f) => f.endsWith(".json") && !f.startsWith("."))).toHaveLength(40);
  }, 120_000);
});
