// dotspec fit and dotspec grid under the rules analyze follows: fit records and figures carry the
// provenance (version, options as given, the input's name, size and SHA-256) and the run ends with
// the count line; grid --out claims its folder with the manifest and refuses others' files unless
// --force; a streamed grid table shows a reading bar on a terminal. Expectations: SHA-256 of the input by node:crypto (inputDigest, checked against the
// FIPS 180-2 vector in provenance.test.ts), package.json for the version, by construction otherwise.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { JSDOM } from "jsdom";
import { DOTSPEC_VERSION, OUTPUT_MANIFEST_NAME, inputDigest, readOutputManifest, sha256Hex } from "../../lib/index.ts";
import { TIME_LIMIT_WARNING } from "../../lib/cli/commands/fit.ts";
import { sphereDotCube } from "../fixtures/gridCubes.ts";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "../cli/harness.ts";

afterAll(removeTempDirs);

let curve: string;
let table: string;
beforeAll(() => {
  curve = writeCurve(join(tempDir("dotspec-fitin-"), "dot.csv"), FILLING);
  const c = sphereDotCube({ nx: 6, ny: 6, stepNM: 0.9 });
  const nb = c.biasV.count;
  const lines = ["# invented grid for the tests", "x (nm),y (nm),bias (V),current (A)"];
  for (let iy = 0; iy < 6; iy++) for (let ix = 0; ix < 6; ix++) for (let k = 0; k < nb; k++) {
    lines.push(`${c.xNM.start + ix * c.xNM.step},${c.yNM.start + iy * c.yNM.step},${c.biasV.start + k * c.biasV.step},${c.currentA[(iy * 6 + ix) * nb + k]}`);
  }
  table = join(tempDir("dotspec-gridin-"), "dot.csv");
  writeFileSync(table, lines.join("\n") + "\n");
});

describe("dotspec fit: provenance and the count line", () => {
  it("the JSON record carries the provenance: version, command, options as given, the input's name, size and SHA-256", async () => {
    const r = await run(["fit", curve, "--eta", "0.8", "--max-iterations", "40", "--json"]);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.provenance).toEqual({
      tool: "dotspec",
      version: DOTSPEC_VERSION,
      command: "fit",
      input: inputDigest(curve),
      options: { analyze: { eta: 0.8 }, read: {}, fit: { maxIterations: 40 } },
    });
    // the peak-based record inside is the one analyze makes, with its own provenance and metadata
    expect(rec.peakBased.provenance.input).toEqual(inputDigest(curve));
    expect(rec.peakBased.metadata).toBeDefined();
  }, 60_000);

  it("ends with the one-line count on stderr, like analyze", async () => {
    const missing = join(tempDir("dotspec-fitin-"), "missing.csv");
    const r = await run(["fit", curve, missing, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(1);
    expect(r.stderr.trimEnd().split("\n").pop()).toMatch(/^dotspec: 1 done, 1 failed, \d+ warnings?/);
  }, 60_000);

  it("--out: the record and the figure carry the same provenance; the manifest lists both", async () => {
    const out = join(tempDir("dotspec-fitout-"), "fits");
    const r = await run(["fit", curve, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(0);
    const rec = JSON.parse(readFileSync(join(out, "dot.fit.json"), "utf8"));
    const svg = readFileSync(join(out, "dot.fit.svg"), "utf8");
    const meta = new JSDOM(svg, { contentType: "image/svg+xml" }).window.document.getElementById("dotspec-provenance");
    expect(JSON.parse(meta!.textContent!)).toEqual(rec.provenance);
    const m = readOutputManifest(out)!;
    for (const f of ["dot.fit.json", "dot.fit.svg"]) expect(m.files[f]).toBe(sha256Hex(readFileSync(join(out, f))));
  }, 60_000);

  it("a fit stopped by its time limit warns that its numbers depend on the machine", async () => {
    const r = await run(["fit", curve, "--eta", "0.8", "--json", "--time-limit-ms", "1"]);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.message).toMatch(/time limit/);
    expect(rec.warnings).toContain(TIME_LIMIT_WARNING);
    expect(r.stderr).toContain("--time-limit-ms");
  }, 60_000);
});

describe("dotspec grid --out DIR: whose files are in DIR", () => {
  it("a folder holding someone else's summary.json is refused (exit 2) and nothing in it changes; --force writes", async () => {
    const out = tempDir("dotspec-gridout-");
    writeFileSync(join(out, "summary.json"), "someone else's\n");
    const r = await run(["grid", table, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--out .* holds files dotspec did not write \(summary\.json\).*--force/);
    expect(readdirSync(out)).toEqual(["summary.json"]);
    const forced = await run(["grid", table, "--eta", "0.8", "--out", out, "--force"]);
    expect(forced.code).toBe(0);
    expect(JSON.parse(readFileSync(join(out, "summary.json"), "utf8")).source).toBe(table);
  }, 60_000);

  it("a folder dotspec wrote is accepted again; the manifest lists every file with its SHA-256, maps included", async () => {
    const out = join(tempDir("dotspec-gridout-"), "g");
    expect((await run(["grid", table, "--eta", "0.8", "--out", out])).code).toBe(0);
    expect((await run(["grid", table, "--eta", "0.8", "--out", out])).code).toBe(0);
    const m = readOutputManifest(out)!;
    const listed = Object.keys(m.files);
    expect(listed).toEqual(expect.arrayContaining(["summary.json", "profiles.csv", "reference.svg"]));
    expect(listed.some((f) => f.startsWith("maps/"))).toBe(true);
    for (const [f, hash] of Object.entries(m.files)) expect(hash, f).toBe(sha256Hex(readFileSync(join(out, f))));
    expect(readdirSync(out)).toContain(OUTPUT_MANIFEST_NAME);
  }, 60_000);

  it("a map figure edited since dotspec wrote it is refused; --out that is the input's folder is refused", async () => {
    const out = join(tempDir("dotspec-gridout-"), "g");
    await run(["grid", table, "--eta", "0.8", "--out", out]);
    const map = Object.keys(readOutputManifest(out)!.files).find((f) => f.startsWith("maps/"))!;
    writeFileSync(join(out, map), "edited\n");
    const r = await run(["grid", table, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/changed since dotspec wrote them/);
    const here = await run(["grid", table, "--eta", "0.8", "--out", join(table, "..")]);
    expect(here.code).toBe(2);
  }, 60_000);
});

describe("progress bars while a big input is streamed (on a terminal)", () => {
  it("dotspec grid shows a reading bar in MB for a long table of 8 MB on a terminal, and none when stderr is not a terminal", async () => {
    const c = sphereDotCube({ nx: 16, ny: 16, stepNM: 0.5 });
    const nb = c.biasV.count;
    const lines = ["x (nm),y (nm),bias (V),current (A)"];
    for (let rep = 0; rep < 4; rep++) for (let iy = 0; iy < 16; iy++) for (let ix = 0; ix < 16; ix++) for (let k = 0; k < nb; k++) {
      lines.push(`${(c.xNM.start + ix * c.xNM.step).toFixed(4)},${(c.yNM.start + iy * c.yNM.step).toFixed(4)},${(c.biasV.start + k * c.biasV.step).toFixed(6)},${c.currentA[(iy * 16 + ix) * nb + k].toExponential(8)}`);
    }
    const big = join(tempDir("dotspec-gridin-"), "big.csv");
    writeFileSync(big, lines.join("\n") + "\n");
    // by construction: more than 5 MB, so the bar (shown for more than 5 units) appears
    expect(readFileSync(big).length).toBeGreaterThan(5e6);
    const tty = await run(["grid", big, "--eta", "0.8", "--json"], { stderrTTY: true });
    expect(tty.code).toBe(0);
    expect(tty.stderr).toMatch(/read \[[#-]+\] \d+\/\d+ MB/);
    const plain = await run(["grid", big, "--eta", "0.8", "--json"]);
    expect(plain.stderr).not.toMatch(/read \[/);
  }, 120_000);
});
