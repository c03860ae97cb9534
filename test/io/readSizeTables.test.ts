// readSizeMetaFile / readOpticalFile / readTextFile: the tables read from disk. Expected values
// are derived from the inputs by construction (the project's own format).
import { describe, it, expect, afterAll } from "vitest";
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { readOpticalFile, readSizeMetaFile, readTextFile } from "../../lib/io/readSizeTables.ts";
import { expectError } from "../helpers/errors.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

describe("readSizeMetaFile(path, dir)", () => {
  it("joins each row's file to the folder", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "sub"));
    writeFileSync(join(dir, "a.csv"), "x");
    writeFileSync(join(dir, "sub", "b.csv"), "x");
    const meta = join(dir, "META.csv");
    writeFileSync(meta, "file,dot,radius_nm\na.csv,D,2\nsub/b.csv,E,2.5\n");
    const rows = readSizeMetaFile(meta, dir);
    expect(rows.map((r) => r.path)).toEqual([join(dir, "a.csv"), join(dir, "sub", "b.csv")]);
  });
  it("names the line and the file of a row whose file is missing (or is a folder)", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "folder.csv"));
    const meta = join(dir, "META.csv");
    writeFileSync(meta, "file,dot,radius_nm\nnone.csv,D,2\n");
    expectError(() => readSizeMetaFile(meta, dir), "io/meta-missing-file", "line 2 (none.csv)", "no such file");
    writeFileSync(meta, "file,dot,radius_nm\nfolder.csv,D,2\n");
    expectError(() => readSizeMetaFile(meta, dir), "io/meta-missing-file", "line 2");
  });
  it("throws io/unreadable for a missing table", () => {
    expectError(() => readSizeMetaFile(join(tempDir(), "META.csv"), "."), "io/unreadable", "no such file");
    expectError(() => readOpticalFile(join(tempDir(), "o.csv")), "io/unreadable", "optical table");
    expectError(() => readTextFile(tempDir(), "material file"), "io/unreadable", "folder");
  });
  it("readOpticalFile parses the table", () => {
    const path = join(tempDir(), "o.csv");
    writeFileSync(path, "radius_nm,peak_ev_1\n2,1.9\n");
    expect(readOpticalFile(path)).toEqual([{ line: 2, radiusNM: 2, peaksEV: [1.9] }]);
  });
});
