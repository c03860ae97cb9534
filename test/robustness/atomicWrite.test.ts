// Ctrl-C leaves no half-written file: writeTextFile writes a temporary file in the same folder and
// renames it into place. Expectations by construction (POSIX rename(2) replaces the target in one
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

const RUN_TS = fileURLToPath(new URL("../../bin/run-ts.js", import.meta.url));
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
