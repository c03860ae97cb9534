// Writing text files. Expected values are derived by construction (what was written is read
// back); the error code and message are the project's own contract.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { TEMP_FILE_PATTERN, writeTextFile } from "../../lib/io/writeTextFile.ts";
import { errorOf } from "../helpers/errors.ts";

let tmp = "";
beforeAll(() => {
  tmp = mkdtempSync(join(tmpdir(), "dotspec-write-"));
});
afterAll(() => {
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

describe("writeTextFile", () => {
  it("writeTextFile(path, text) creates the parent folders and writes UTF-8", () => {
    const path = join(tmp, "a", "b", "report.csv");
    writeTextFile(path, "µ,Ω\n");
    expect(readFileSync(path, "utf8")).toBe("µ,Ω\n");
    writeTextFile(path, "second\n");
    expect(readFileSync(path, "utf8")).toBe("second\n");
  });

  it("writeTextFile throws io/write-failed naming the path when a file stands where a folder should be", () => {
    const file = join(tmp, "plain-file");
    writeFileSync(file, "x");
    const path = join(file, "report.csv");
    const e = errorOf(() => writeTextFile(path, "y"));
    expect(e.code).toBe("io/write-failed");
    expect(e.message).toContain(path);
  });
});

describe("writeTextFile: a temporary name in the same folder, then rename (POSIX rename(2) is atomic)", () => {
  it("writeTextFile(path, text) leaves no temporary file beside the result, also when replacing a file", () => {
    const dir = join(tmp, "atomic");
    writeTextFile(join(dir, "x.json"), "first");
    writeTextFile(join(dir, "x.json"), "second");
    expect(readdirSync(dir)).toEqual(["x.json"]);
    expect(readFileSync(join(dir, "x.json"), "utf8")).toBe("second");
  });

  it("TEMP_FILE_PATTERN matches the temporary names and not ordinary ones", () => {
    expect(TEMP_FILE_PATTERN.test(".dot-01.json.1234-0.dotspec-tmp")).toBe(true);
    expect(TEMP_FILE_PATTERN.test("dot-01.json")).toBe(false);
    expect(TEMP_FILE_PATTERN.test(".hidden")).toBe(false);
  });
});
