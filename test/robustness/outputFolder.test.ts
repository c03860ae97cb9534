// --out into a folder holding files dotspec did not write is refused unless --force; dotspec
// knows its own files by the folder's manifest (.dotspec-manifest.json). Expectations by
// construction (the rule in lib/cli/outputFolder.ts and README "Trust").
import { describe, it, expect, afterAll, beforeAll } from "vitest";
import { existsSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { OUTPUT_MANIFEST_NAME, readOutputManifest, sha256Hex, writeOutputManifest } from "../../lib/index.ts";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "../cli/harness.ts";

afterAll(removeTempDirs);

let curve: string;
beforeAll(() => {
  curve = writeCurve(join(tempDir("dotspec-in-"), "dot.csv"), FILLING);
});

describe("dotspec analyze --out DIR: whose files are in DIR", () => {
  it("a folder holding someone else's dot.json is refused (exit 2), and nothing in it changes", async () => {
    const out = tempDir("dotspec-out-");
    writeFileSync(join(out, "dot.json"), "someone else's\n");
    const r = await run(["analyze", curve, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--out .* holds files dotspec did not write \(dot\.json\).*--force/);
    expect(readdirSync(out)).toEqual(["dot.json"]);
    expect(readFileSync(join(out, "dot.json"), "utf8")).toBe("someone else's\n");
  });

  it("--force writes there anyway: the foreign file of the same name is replaced, others are kept", async () => {
    const out = tempDir("dotspec-out-");
    writeFileSync(join(out, "dot.json"), "someone else's\n");
    writeFileSync(join(out, "notes.txt"), "keep me\n");
    const r = await run(["analyze", curve, "--eta", "0.8", "--out", out, "--force"]);
    expect(r.code).toBe(0);
    expect(JSON.parse(readFileSync(join(out, "dot.json"), "utf8")).source).toBe(curve);
    expect(readFileSync(join(out, "notes.txt"), "utf8")).toBe("keep me\n");
    // notes.txt is still not dotspec's: the next run without --force is refused.
    expect(Object.keys(readOutputManifest(out)!.files)).not.toContain("notes.txt");
    expect((await run(["analyze", curve, "--eta", "0.8", "--out", out])).code).toBe(2);
  });

  it("a folder dotspec wrote is accepted again; the manifest holds the SHA-256 of each file it wrote", async () => {
    const out = join(tempDir("dotspec-out-"), "report");
    expect((await run(["analyze", curve, "--eta", "0.8", "--out", out])).code).toBe(0);
    expect((await run(["analyze", curve, "--eta", "0.8", "--out", out])).code).toBe(0);
    const m = readOutputManifest(out)!;
    expect(Object.keys(m.files)).toEqual(["dot.json", "dot.svg", "summary.csv"]);
    for (const [f, hash] of Object.entries(m.files)) expect(hash, f).toBe(sha256Hex(readFileSync(join(out, f))));
  });

  it("a file dotspec wrote and someone edited since is refused (its SHA-256 differs from the manifest's)", async () => {
    const out = join(tempDir("dotspec-out-"), "report");
    await run(["analyze", curve, "--eta", "0.8", "--out", out]);
    writeFileSync(join(out, "summary.csv"), readFileSync(join(out, "summary.csv"), "utf8") + "my own row\n");
    const r = await run(["analyze", curve, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/changed since dotspec wrote them \(summary\.csv\)/);
    expect(readFileSync(join(out, "summary.csv"), "utf8")).toMatch(/my own row\n$/);
  });

  it("a run interrupted after listing its files (null hashes, a temporary file left) leaves a folder the next run accepts", async () => {
    const out = tempDir("dotspec-out-");
    writeOutputManifest(out, ["dot.json", "dot.svg", "summary.csv"], false);
    writeFileSync(join(out, "dot.json"), "{ half");
    writeFileSync(join(out, ".dot.svg.12345-0.dotspec-tmp"), "<svg");
    expect(readOutputManifest(out)!.files["dot.json"]).toBeNull();
    const r = await run(["analyze", curve, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(0);
    expect(JSON.parse(readFileSync(join(out, "dot.json"), "utf8")).source).toBe(curve);
    expect(existsSync(join(out, OUTPUT_MANIFEST_NAME))).toBe(true);
  });

  it("--out naming a file is refused (exit 2)", async () => {
    const file = join(tempDir("dotspec-out-"), "report");
    writeFileSync(file, "x");
    const r = await run(["analyze", curve, "--out", file]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/is a file, not a folder/);
  });
});

describe("dotspec sizes --out DIR: the same rule", () => {
  it("refuses a folder with a foreign file (exit 2) and accepts it with --force", async () => {
    const dir = tempDir("dotspec-series-");
    writeCurve(join(dir, "a.csv"), FILLING);
    const out = tempDir("dotspec-out-");
    writeFileSync(join(out, "sizes.json"), "{}");
    const r = await run(["sizes", dir, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/holds files dotspec did not write \(sizes\.json\)/);
    const forced = await run(["sizes", dir, "--eta", "0.8", "--out", out, "--force"]);
    expect(forced.stderr).not.toMatch(/did not write/);
    expect(Object.keys(readOutputManifest(out)!.files)).toContain("curves/a.json");
  });
});

describe("dotspec fit --out DIR: the same rule", () => {
  it("refuses a folder with a foreign file (exit 2, nothing written) and writes there with --force", async () => {
    const out = tempDir("dotspec-out-");
    writeFileSync(join(out, "dot.fit.json"), "someone else's");
    const r = await run(["fit", curve, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/holds files dotspec did not write \(dot\.fit\.json\)/);
    expect(readdirSync(out)).toEqual(["dot.fit.json"]);
    await run(["fit", curve, "--eta", "0.8", "--out", out, "--force"]);
    expect(Object.keys(readOutputManifest(out)!.files)).toEqual(["dot.fit.json", "dot.fit.svg"]);
  }, 30_000);
});
