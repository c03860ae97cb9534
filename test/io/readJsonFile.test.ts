// readJsonFile: the scenario reader of dotspec simulate.
// Expected values are derived from the inputs by construction: this is the project's own interface, with no outside reference value to name.
import { describe, it, expect, afterAll } from "vitest";
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { readJsonFile } from "../../lib/io/readJsonFile.ts";
import { errorOf } from "../helpers/errors.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const codeOf = (f: () => unknown) => errorOf(f).code;

describe("readJsonFile(path)", () => {
  it("parses a JSON file (a UTF-8 byte-order mark is ignored)", () => {
    const path = join(tempDir(), "a.json");
    writeFileSync(path, '\uFEFF{"eta": 0.8, "cb": []}');
    expect(readJsonFile(path)).toEqual({ eta: 0.8, cb: [] });
  });
  it("throws io/invalid-json naming the file for bad JSON", () => {
    const path = join(tempDir(), "bad.json");
    writeFileSync(path, "{ eta: 0.8 }");
    expect(codeOf(() => readJsonFile(path))).toBe("io/invalid-json");
    expect(() => readJsonFile(path)).toThrow(/bad\.json: not valid JSON/);
  });
  it("throws io/unreadable-json for a missing file or a folder", () => {
    const dir = tempDir();
    expect(codeOf(() => readJsonFile(join(dir, "none.json")))).toBe("io/unreadable-json");
    expect(() => readJsonFile(dir)).toThrow(/is a folder/);
  });
});
