// The manifest of an output folder. Expectations by construction (the rule documented in
// lib/io/outputManifest.ts): listed and unchanged files are dotspec's, others foreign or changed.
import { afterAll, describe, expect, it } from "vitest";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { checkOutputFolder, OUTPUT_MANIFEST_NAME, readOutputManifest, sha256Hex, writeOutputManifest } from "../../lib/index.ts";
import { errorOf } from "../helpers/errors.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

describe("checkOutputFolder(dir) / writeOutputManifest(dir, files, written)", () => {
  it("a missing folder and an empty one are clean", () => {
    const dir = tempDir("dotspec-manifest-");
    expect(checkOutputFolder(join(dir, "none"))).toEqual({ foreign: [], changed: [] });
    expect(checkOutputFolder(dir)).toEqual({ foreign: [], changed: [] });
  });

  it("files before the run are listed with null, after it with their SHA-256; earlier entries are kept", () => {
    const dir = tempDir("dotspec-manifest-");
    writeOutputManifest(dir, ["a.json", "sub/b.svg"], false);
    expect(readOutputManifest(dir)!.files).toEqual({ "a.json": null, "sub/b.svg": null });
    writeFileSync(join(dir, "a.json"), "{}");
    mkdirSync(join(dir, "sub"));
    writeFileSync(join(dir, "sub", "b.svg"), "<svg/>");
    writeOutputManifest(dir, ["a.json", "sub/b.svg"], true);
    expect(readOutputManifest(dir)!.files).toEqual({ "a.json": sha256Hex("{}"), "sub/b.svg": sha256Hex("<svg/>") });
    writeFileSync(join(dir, "c.csv"), "x");
    writeOutputManifest(dir, ["c.csv"], true);
    expect(Object.keys(readOutputManifest(dir)!.files)).toEqual(["a.json", "c.csv", "sub/b.svg"]);
    expect(checkOutputFolder(dir)).toEqual({ foreign: [], changed: [] });
  });

  it("an unlisted file is foreign (also in a sub-folder); a listed file whose content changed is changed", () => {
    const dir = tempDir("dotspec-manifest-");
    writeFileSync(join(dir, "a.json"), "{}");
    writeOutputManifest(dir, ["a.json"], true);
    writeFileSync(join(dir, "a.json"), "{ edited }");
    mkdirSync(join(dir, "curves"));
    writeFileSync(join(dir, "curves", "x.json"), "{}");
    writeFileSync(join(dir, "notes.txt"), "mine");
    expect(checkOutputFolder(dir)).toEqual({ foreign: ["curves/x.json", "notes.txt"], changed: ["a.json"] });
  });

  it("a manifest that is not dotspec's vouches for nothing", () => {
    const dir = tempDir("dotspec-manifest-");
    writeFileSync(join(dir, "a.json"), "{}");
    writeFileSync(join(dir, OUTPUT_MANIFEST_NAME), JSON.stringify({ files: { "a.json": null } }));
    expect(readOutputManifest(dir)).toBeNull();
    expect(checkOutputFolder(dir).foreign).toEqual(["a.json"]);
    writeFileSync(join(dir, OUTPUT_MANIFEST_NAME), "not json");
    expect(checkOutputFolder(dir).foreign).toEqual(["a.json"]);
  });

  it("a file given as the folder is refused (io/not-a-folder)", () => {
    const file = join(tempDir("dotspec-manifest-"), "f");
    writeFileSync(file, "x");
    expect(errorOf(() => checkOutputFolder(file)).code).toBe("io/not-a-folder");
    expect(readFileSync(file, "utf8")).toBe("x");
  });

  it("judges a subfolder with a manifest of its own by that manifest (a report of another command inside, as npm start writes report/sizes) — by construction", () => {
    const dir = tempDir("dotspec-nested-");
    mkdirSync(join(dir, "sizes"));
    writeFileSync(join(dir, "dot-01.json"), "{}\n");
    writeFileSync(join(dir, "sizes", "sizes.json"), "{}\n");
    writeOutputManifest(dir, ["dot-01.json"], true);
    writeOutputManifest(join(dir, "sizes"), ["sizes.json"], true);
    expect(checkOutputFolder(dir)).toEqual({ foreign: [], changed: [] });
    writeFileSync(join(dir, "sizes", "notes.txt"), "someone else's\n");
    expect(checkOutputFolder(dir).foreign).toEqual(["sizes/notes.txt"]);
  });
});

