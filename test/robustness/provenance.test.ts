// Provenance and replay: every JSON record, CSV row and SVG figure carries the tool's version, the
// options, the input's name, size and SHA-256; `analyze --replay` re-runs a record and says
// whether the numbers match. Expectations: the SHA-256 test vector of FIPS 180-2 (Appendix B.1,
// "abc"), package.json for the version, and by construction otherwise.
import { describe, it, expect, afterAll, beforeAll } from "vitest";
import { csvParse } from "d3-dsv";
import { readFileSync, statSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { JSDOM } from "jsdom";
import { DOTSPEC_VERSION, inputDigest, sha256Hex, type AnalysisJson } from "../../lib/index.ts";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "../cli/harness.ts";

afterAll(removeTempDirs);

const PACKAGE = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { version: string };

describe("inputDigest(path) and DOTSPEC_VERSION", () => {
  it('sha256Hex("abc") is the FIPS 180-2 test vector; inputDigest gives name, size and that hash', () => {
    const abc = "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"; // FIPS 180-2, Appendix B.1
    expect(sha256Hex("abc")).toBe(abc);
    const file = join(tempDir("dotspec-prov-"), "abc.txt");
    writeFileSync(file, "abc");
    expect(inputDigest(file)).toEqual({ name: file, bytes: 3, sha256: abc });
  });

  it("DOTSPEC_VERSION is package.json's version, and `dotspec --version` prints it", async () => {
    expect(DOTSPEC_VERSION).toBe(PACKAGE.version);
    expect((await run(["--version"])).stdout.trim()).toBe(PACKAGE.version);
  });
});

describe("dotspec analyze --out: provenance in the record, the summary row and the figure", () => {
  let file: string;
  let out: string;
  let rec: AnalysisJson;
  beforeAll(async () => {
    file = writeCurve(join(tempDir("dotspec-prov-"), "dot.csv"), FILLING);
    out = join(tempDir("dotspec-out-"), "r");
    expect((await run(["analyze", file, "--eta", "0.8", "--order", "4", "--out", out])).code).toBe(0);
    rec = JSON.parse(readFileSync(join(out, "dot.json"), "utf8")) as AnalysisJson;
  });

  it("the JSON record: tool, version, command, input (name, bytes, SHA-256) and the options as given", () => {
    expect(rec.provenance).toEqual({
      tool: "dotspec",
      version: PACKAGE.version,
      command: "analyze",
      input: { name: file, bytes: statSync(file).size, sha256: sha256Hex(readFileSync(file)) },
      options: { analyze: { eta: 0.8, order: 4 }, read: {} },
    });
  });

  it("the summary row: tool_version, input_bytes, input_sha256 and the options as JSON", () => {
    const [row] = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    expect(row.tool_version).toBe(PACKAGE.version);
    expect(Number(row.input_bytes)).toBe(statSync(file).size);
    expect(row.input_sha256).toBe(rec.provenance!.input!.sha256);
    expect(JSON.parse(row.options)).toEqual(rec.provenance!.options);
  });

  it("the SVG figure: a <metadata> element holding the same provenance (SVG 1.1 §21.2: not drawn)", () => {
    const doc = new JSDOM(readFileSync(join(out, "dot.svg"), "utf8"), { contentType: "image/svg+xml" }).window.document;
    const meta = doc.getElementById("dotspec-provenance");
    expect(meta?.localName).toBe("metadata");
    expect(JSON.parse(meta!.textContent!)).toEqual(rec.provenance);
  });
});

describe("dotspec analyze --replay RECORD.json", () => {
  it("re-runs with the recorded options on the recorded file: the numbers match (exit 0)", async () => {
    const file = writeCurve(join(tempDir("dotspec-replay-"), "dot.csv"), { ...FILLING, noise: { relative: 0.003, seed: 3 } });
    const out = join(tempDir("dotspec-out-"), "r");
    await run(["analyze", file, "--eta", "0.8", "--window-mv", "30", "--out", out]);
    const r = await run(["analyze", "--replay", join(out, "dot.json")]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/: the numbers match \(\d+ values compared\)\n$/);
  });

  it("says which numbers differ when the record does not match (exit 1)", async () => {
    const file = writeCurve(join(tempDir("dotspec-replay-"), "dot.csv"), FILLING);
    const out = join(tempDir("dotspec-out-"), "r");
    await run(["analyze", file, "--eta", "0.8", "--out", out]);
    const path = join(out, "dot.json");
    const rec = JSON.parse(readFileSync(path, "utf8")) as AnalysisJson;
    const gap = rec.gapV;
    rec.gapV = gap! + 0.001;
    writeFileSync(path, JSON.stringify(rec));
    const r = await run(["analyze", "--replay", path]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/1 of \d+ values differ: gapV: [\d.]+ recorded, [\d.]+ now/);
    expect(r.stdout).toContain(`${JSON.stringify(gap)} now`);
  });

  it("says the input has changed since (SHA-256), exit 1", async () => {
    const file = writeCurve(join(tempDir("dotspec-replay-"), "dot.csv"), FILLING);
    const out = join(tempDir("dotspec-out-"), "r");
    await run(["analyze", file, "--eta", "0.8", "--out", out]);
    writeFileSync(file, readFileSync(file, "utf8") + "\n");
    const r = await run(["analyze", "--replay", join(out, "dot.json")]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/has changed since the record was made \(SHA-256/);
  });

  it("replays each record of an `analyze --json` array; a record without provenance is refused", async () => {
    const dir = tempDir("dotspec-replay-");
    writeCurve(join(dir, "a.csv"), FILLING);
    writeCurve(join(dir, "b.csv"), { ...FILLING, noise: { relative: 0.003, seed: 9 } });
    const records = join(tempDir("dotspec-out-"), "all.json");
    writeFileSync(records, (await run(["analyze", dir, "--eta", "0.8", "--json"])).stdout);
    const r = await run(["analyze", "--replay", records]);
    expect(r.code).toBe(0);
    expect(r.stdout.trimEnd().split("\n")).toHaveLength(2);
    const old = JSON.parse(readFileSync(records, "utf8"))[0];
    delete old.provenance;
    writeFileSync(records, JSON.stringify(old));
    const bare = await run(["analyze", "--replay", records]);
    expect(bare.code).toBe(1);
    expect(bare.stderr).toMatch(/no provenance/);
  });

  it("takes no FILE (usage error, exit 2)", async () => {
    expect((await run(["analyze", "x.csv", "--replay", "r.json"])).code).toBe(2);
  });
});

describe("dotspec sizes --out: provenance in sizes.json, every table row and every figure", () => {
  it("sizes.json has the options and the tables' SHA-256; sizes-curves.csv rows each file's SHA-256; figures a <metadata> element", async () => {
    const dir = tempDir("dotspec-prov-");
    const file = writeCurve(join(dir, "a.csv"), FILLING);
    const meta = join(tempDir("dotspec-prov-"), "META.csv");
    writeFileSync(meta, "file,dot,radius_nm\na.csv,A,2\n");
    const out = join(tempDir("dotspec-out-"), "s");
    const r = await run(["sizes", dir, "--meta", meta, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(0);
    const json = JSON.parse(readFileSync(join(out, "sizes.json"), "utf8"));
    expect(json.provenance.version).toBe(PACKAGE.version);
    expect(json.provenance.options.tables.meta).toEqual({ name: meta, bytes: statSync(meta).size, sha256: sha256Hex(readFileSync(meta)) });
    const [row] = csvParse(readFileSync(join(out, "sizes-curves.csv"), "utf8"));
    expect(row.input_sha256).toBe(sha256Hex(readFileSync(file)));
    expect(row.tool_version).toBe(PACKAGE.version);
    for (const f of ["sizes-dots.csv", "sizes-bins.csv", "sizes-fits.csv"]) {
      expect(readFileSync(join(out, f), "utf8").split("\n")[0], f).toMatch(/,tool_version,options$/);
    }
    expect(readFileSync(join(out, "sizes-gap.svg"), "utf8")).toMatch(/<metadata id="dotspec-provenance">/);
  });
});
