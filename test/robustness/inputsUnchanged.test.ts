// Inputs are never modified, and paths from metadata stay inside the data folder. Expectations by
// construction: every byte, the size and the modification time of each input are the same after
// a run; the size table's file names are confined to the series folder (lib/io/parseSizeMeta.ts).
import { describe, it, expect, afterAll } from "vitest";
import { readdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { formatCurveCsv, readSizeMetaFile, sha256Hex, simulateCurve } from "../../lib/index.ts";
import { errorOf } from "../helpers/errors.ts";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "../cli/harness.ts";

afterAll(removeTempDirs);

/** SHA-256, size and mtime of every file in a folder. */
function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const f of readdirSync(dir).sort()) {
    const p = join(dir, f);
    const s = statSync(p);
    out[f] = `${sha256Hex(readFileSync(p))} ${s.size} ${s.mtimeMs}`;
  }
  return out;
}

describe("inputs are never modified", () => {
  it("by analyze (text, --json, --out, --replay), sizes --out and fit --out: same bytes, size and mtime; no file added beside them", async () => {
    const dir = tempDir("dotspec-inputs-");
    writeCurve(join(dir, "a.csv"), FILLING);
    writeFileSync(join(dir, "b.csv"), formatCurveCsv(simulateCurve(FILLING, { method: "fast", conductance: false }), { metadata: { dot: "B", radius_nm: 2, eta: 0.8 } }));
    writeFileSync(join(dir, "bad.csv"), "not a curve\n");
    const before = snapshot(dir);
    const out = tempDir("dotspec-out-");
    await run(["analyze", dir]);
    await run(["analyze", dir, "--json", "--jobs", "2"]);
    await run(["analyze", dir, "--out", join(out, "a")]);
    await run(["analyze", "--replay", join(out, "a", "b.json")]);
    await run(["sizes", dir, "--out", join(out, "s")]);
    await run(["fit", join(dir, "b.csv"), "--out", join(out, "f")]);
    expect(snapshot(dir)).toEqual(before);
  }, 60_000);
});

describe("paths from metadata stay inside the data folder", () => {
  it("a size table naming ../x.csv or an absolute path is refused, naming the table's line", () => {
    const root = tempDir("dotspec-meta-");
    const series = join(root, "series");
    writeCurve(join(series, "in.csv"), FILLING);
    writeCurve(join(root, "outside.csv"), FILLING);
    const table = join(root, "META.csv");
    writeFileSync(table, "file,dot,radius_nm\n../outside.csv,D1,2\n");
    expect(errorOf(() => readSizeMetaFile(table, series)).message).toMatch(/line 2 .*outside the series folder/);
    writeFileSync(table, `file,dot,radius_nm\n${resolve(root, "outside.csv")},D1,2\n`);
    expect(errorOf(() => readSizeMetaFile(table, series)).message).toMatch(/line 2 /);
    writeFileSync(table, "file,dot,radius_nm\nin.csv,D1,2\n");
    expect(readSizeMetaFile(table, series).map((r) => r.file)).toEqual(["in.csv"]);
  });

  it("a metadata line naming a path (scenario: ../../etc/passwd) is carried as text and never opened", async () => {
    const dir = tempDir("dotspec-meta-");
    const file = join(dir, "c.csv");
    writeFileSync(file, formatCurveCsv(simulateCurve(FILLING, { method: "fast", conductance: false }), { metadata: { scenario: "../../etc/passwd", eta: 0.8 } }));
    const r = await run(["analyze", file, "--json"]);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)[0].metadata.scenario).toBe("../../etc/passwd");
  });
});
