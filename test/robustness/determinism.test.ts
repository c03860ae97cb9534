// Determinism: the same input and options give byte-identical JSON whatever --jobs is, and the
// noise of `simulate` comes from its seed only. Expectations derived by construction.
import { describe, it, expect, afterAll } from "vitest";
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "../cli/harness.ts";

afterAll(removeTempDirs);

describe("byte-identical JSON with --jobs 1 and --jobs 2", () => {
  it("analyze --out writes the same bytes in every .json and summary.csv; --json prints the same bytes", async () => {
    const dir = tempDir("dotspec-det-");
    for (let k = 0; k < 5; k++) writeCurve(join(dir, `dot-${k}.csv`), { ...FILLING, noise: { relative: 0.003, seed: 40 + k } });
    writeFileSync(join(dir, "broken.csv"), "broken\n");
    const one = join(tempDir("dotspec-out-"), "one");
    const two = join(tempDir("dotspec-out-"), "two");
    const r1 = await run(["analyze", dir, "--out", one, "--jobs", "1", "--json"]);
    const r2 = await run(["analyze", dir, "--out", two, "--jobs", "2", "--json"]);
    expect(r2.stdout).toBe(r1.stdout);
    const files = readdirSync(one).filter((f) => f.endsWith(".json") || f.endsWith(".csv")).sort();
    expect(files).toHaveLength(7); // 5 records, summary.csv, the manifest
    expect(readdirSync(two).filter((f) => f.endsWith(".json") || f.endsWith(".csv")).sort()).toEqual(files);
    for (const f of files) expect(readFileSync(join(two, f), "utf8"), f).toBe(readFileSync(join(one, f), "utf8"));
  }, 60_000);
});

describe("noise in simulate only from the seed", () => {
  it("the same seed gives the same bytes, another seed other bytes", async () => {
    const dir = tempDir("dotspec-det-");
    const config = (seed: number) => {
      const p = join(dir, `s${seed}.json`);
      writeFileSync(p, JSON.stringify({ ...FILLING, noise: { relative: 0.003, seed } }));
      return p;
    };
    const sim = async (cfg: string, out: string) => {
      await run(["simulate", "--config", cfg, "--out", join(dir, out), "--method", "fast"]);
      // The lines after the metadata (which name the scenario file).
      return readFileSync(join(dir, out), "utf8").split("\n").filter((l) => !l.startsWith("# ")).join("\n");
    };
    const a = await sim(config(5), "a.csv");
    const b = await sim(config(5), "b.csv");
    const c = await sim(config(6), "c.csv");
    expect(b).toBe(a);
    expect(c).not.toBe(a);
  });

  it("no module of the library draws from Math.random (the only generator is seededRandom); the clock is read only where it cannot change a number", () => {
    const root = fileURLToPath(new URL("../../lib/", import.meta.url));
    const random: string[] = [];
    const clock: string[] = [];
    const walk = (d: string) => {
      for (const e of readdirSync(d, { withFileTypes: true })) {
        const p = join(d, e.name);
        if (e.isDirectory()) walk(p);
        else if (/\.(ts|mjs)$/.test(e.name)) {
          const text = readFileSync(p, "utf8");
          if (/Math\.random\(/.test(text)) random.push(p.slice(root.length));
          if (/Date\.now\(|new Date\(|performance\.now\(/.test(text)) clock.push(p.slice(root.length));
        }
      }
    };
    walk(root);
    expect(random).toEqual([]);
    // progress.ts: paces the progress bar on stderr. levenbergMarquardtLoop.ts and fitRunner.ts: the
    // fit's time limit, per run and over all its starts (a fit stopped by it could differ between
    // machines; analyze does not fit).
    expect(clock.sort()).toEqual(["cli/progress.ts", "model/fit/fitRunner.ts", "model/fit/levenbergMarquardtLoop.ts"]);
  });
});
