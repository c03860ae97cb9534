// Batches survive faults: each bad input is reported and skipped, every input gets a row in
// summary.csv, and the run ends with one count line and exit 1. Expectations by construction
// (the exit codes and outputs documented in `dotspec analyze --help` and README "Trust").
import { describe, it, expect, afterAll, beforeAll } from "vitest";
import { csvParse } from "d3-dsv";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { FILLING, removeTempDirs, run, tempDir, TUNNELING, writeCurve } from "../cli/harness.ts";

afterAll(removeTempDirs);

/** Bad inputs a lab's folder may hold, with a fragment of the reason each gets. */
function badInputs(dir: string): [string, RegExp][] {
  const path = (name: string) => join(dir, name);
  writeFileSync(path("empty.csv"), "");
  writeFileSync(path("text.csv"), "hello\nworld\n");
  writeFileSync(path("binary.dat"), Buffer.from([0x00, 0x01, 0xff, 0x00, 0x42, 0x13, 0x00]));
  writeFileSync(path("short.csv"), "bias (V),current (A)\n0.1,1e-12\n0.2,2e-12\n");
  writeFileSync(path("ragged.csv"), "bias (V),current (A)\n" + Array.from({ length: 50 }, (_, i) => (i === 20 ? `${i / 100},1e-12,5` : `${i / 100},${i}e-12`)).join("\n") + "\n");
  mkdirSync(path("empty-folder"));
  return [
    [path("empty.csv"), /\S/],
    [path("text.csv"), /\S/],
    [path("binary.dat"), /\S/],
    [path("short.csv"), /\S/],
    [path("ragged.csv"), /\S/],
    [path("empty-folder"), /no curve files/],
    [path("missing.csv"), /no such file/],
  ];
}

describe("dotspec analyze: a batch with bad inputs", () => {
  let dir: string;
  let out: string;
  let bad: [string, RegExp][];
  let good: string[];
  let r: { code: number; stdout: string; stderr: string };
  beforeAll(async () => {
    dir = tempDir("dotspec-batch-");
    bad = badInputs(dir);
    good = [writeCurve(join(dir, "filling.csv"), FILLING), writeCurve(join(dir, "tunneling.csv"), TUNNELING)];
    out = join(tempDir("dotspec-out-"), "report");
    r = await run(["analyze", good[0], ...bad.map(([f]) => f), good[1], "--eta", "0.8", "--out", out]);
  });

  it("exits 1 (partial failure), still analyses the good files", () => {
    expect(r.code).toBe(1);
    expect(JSON.parse(readFileSync(join(out, "filling.json"), "utf8")).source).toBe(good[0]);
    expect(JSON.parse(readFileSync(join(out, "tunneling.json"), "utf8")).source).toBe(good[1]);
  });

  it("prints one `dotspec: FILE: reason` line per bad input, no stack trace", () => {
    for (const [file, reason] of bad) {
      const line = r.stderr.split("\n").find((l) => l.startsWith(`dotspec: ${file}: `));
      expect(line, file).toBeDefined();
      expect(line!.slice(`dotspec: ${file}: `.length), file).toMatch(reason);
    }
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(r.stderr).not.toMatch(/internal error/);
  });

  it("summary.csv has one row per input: status ok or failed, the reason of each failure", () => {
    const rows = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    const bySource = new Map(rows.map((row) => [row.source, row]));
    expect(rows).toHaveLength(bad.length + good.length);
    for (const f of good) expect(bySource.get(f)?.status, f).toBe("ok");
    for (const [f] of bad) {
      expect(bySource.get(f)?.status, f).toBe("failed");
      expect(bySource.get(f)?.reason, f).not.toBe("");
      expect(r.stderr, f).toContain(`dotspec: ${f}: ${bySource.get(f)!.reason}`);
    }
  });

  it("ends with one count line on stderr: done, failed, warnings", () => {
    const last = r.stderr.trimEnd().split("\n").at(-1);
    expect(last).toMatch(new RegExp(`^dotspec: 2 done, ${bad.length} failed, \\d+ warnings?`));
  });

  it("a failed file that can be read still has its size and SHA-256 in its row", () => {
    const rows = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    const text = rows.find((row) => row.source === join(dir, "text.csv"))!;
    expect(Number(text.input_bytes)).toBe(12); // "hello\nworld\n": 12 bytes (by construction)
    expect(text.input_sha256).toMatch(/^[0-9a-f]{64}$/);
  });
});

describe("dotspec analyze: exit codes of whole batches", () => {
  it("exit 0 when every file is analysed; exit 1 when every file fails", async () => {
    const dir = tempDir("dotspec-batch-");
    const good = writeCurve(join(dir, "ok.csv"), FILLING);
    expect((await run(["analyze", good, "--eta", "0.8", "--json"])).code).toBe(0);
    writeFileSync(join(dir, "bad.csv"), "nothing\n");
    const r = await run(["analyze", join(dir, "bad.csv"), "--json"]);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe("[]\n");
    expect(r.stderr.trimEnd().split("\n").at(-1)).toBe("dotspec: 0 done, 1 failed, 0 warnings");
  });
});
