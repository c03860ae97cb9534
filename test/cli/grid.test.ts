// dotspec grid, run in-process: a long table of the particle-in-a-sphere dot (model spectra)
// through the whole command: the JSON summary, the files of --out, exit codes and errors.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { existsSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { formatGridText } from "../../lib/cli/commands/grid.ts";
import type { GridJson } from "../../lib/index.ts";
import { GRID_JOBS_DEFAULTS, runGridAnalysis, startGridPool } from "../../lib/cli/gridPool.ts";
import { readGridFile } from "../../lib/index.ts";
import { sphereDotCube } from "../fixtures/gridCubes.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { removeTempDirs, run, tempDir } from "./harness.ts";

let dir: string;
let table: string;
beforeAll(() => {
  dir = tempDir("dotspec-grid-");
  const c = sphereDotCube({ nx: 10, ny: 10, stepNM: 0.7 });
  const nb = c.biasV.count;
  const lines = ["# invented grid for the tests", "x (nm)\ty (nm)\tbias (mV)\tcurrent (pA)"];
  for (let iy = 0; iy < 10; iy++)
    for (let ix = 0; ix < 10; ix++) {
      if (ix === 0 && iy === 9) continue; // one missing pixel
      for (let k = 0; k < nb; k++) {
        lines.push(`${(c.xNM.start + ix * c.xNM.step).toFixed(3)}\t${(c.yNM.start + iy * c.yNM.step).toFixed(3)}\t${((c.biasV.start + k * c.biasV.step) * 1000).toFixed(4)}\t${(c.currentA[(iy * 10 + ix) * nb + k] * 1e12).toPrecision(7)}`);
      }
    }
  table = join(dir, "dot.tsv");
  writeFileSync(table, lines.join("\n") + "\n");
});
afterAll(removeTempDirs);

describe("dotspec grid", () => {
  it("--json prints the summary with the maps' label, bias, RMS radius, centre and dip depth", async () => {
    const r = await run(["grid", table, "--eta", "0.8", "--json", "--jobs", "1"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout) as GridJson;
    expect(j.grid.missingPixels).toBe(1);
    expect(j.reference.analysis.regime).toBe("shell-tunneling");
    const s = j.maps.find((m) => m.label === "s")!;
    // closed form: the s step at (ε + Ec/2)/η = 0.625 V (the fixture's scenario), ± one bias step
    expectClose(s.biasV, 0.625, { atol: 0.007, what: "(ε + Ec/2)/η" });
    for (const m of j.maps) for (const key of ["label", "biasV", "rmsRadiusNM", "centreNM", "dipDepth"]) expect(m).toHaveProperty(key);
    expect(j.warnings.join(" ")).toContain("1 of 100 grid pixels have no data");
  });
  it("--out writes summary.json, profiles.csv, reference.svg and one SVG per map; --at sets the map biases", async () => {
    const out = join(dir, "out");
    const r = await run(["grid", table, "--eta", "0.8", "--out", out, "--at", "0.625,1.1875", "--jobs", "1"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("at 0.625 V");
    for (const f of ["summary.json", "profiles.csv", "reference.svg"]) expect(existsSync(join(out, f)), f).toBe(true);
    expect(readdirSync(join(out, "maps")).sort()).toEqual(["at_0.625_V.svg", "at_1.188_V.svg", "current.svg", "p_multiplet.svg", "s_multiplet.svg", "v1_multiplet.svg"]);
    expect(readFileSync(join(out, "profiles.csv"), "utf8").split("\n")[0]).toBe("map,unit,radius_nm,mean,pixels");
  });
  it("reports an unreadable input with exit 1 and a bad --at with exit 2", async () => {
    const bad = await run(["grid", join(dir, "none.npy"), "--json"]);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toContain("none.npy");
    // A folder is a user's slip (the grid's folder instead of its .npy file), not an internal error.
    const folder = await run(["grid", dir, "--json"]);
    expect(folder.code).toBe(1);
    expect(folder.stderr).toContain("is a folder, not a grid file");
    expect(folder.stderr).not.toContain("internal error");
    const usage = await run(["grid", table, "--at", "0.7,x"]);
    expect(usage.code).toBe(2);
    expect(usage.stderr).toContain("--at");
  });
  it("--reference-circle and --reference-pixel choose the reference spectrum", async () => {
    const c = await run(["grid", table, "--eta", "0.8", "--json", "--jobs", "1", "--reference-circle", "0,0,1.45"]);
    expect(c.code, c.stderr).toBe(0);
    const j = JSON.parse(c.stdout) as GridJson;
    // closed form: pixels at |x|, |y| ∈ {0.35, 1.05} nm with x² + y² ≤ 1.45² = 2.1025: (0.35, 0.35) 0.245 and (0.35, 1.05) 1.225 in, (1.05, 1.05) 2.205 out: 4 + 8 = 12
    expect(j.reference.pixels).toBe(12);
    const p = await run(["grid", table, "--eta", "0.8", "--json", "--jobs", "1", "--reference-pixel", "5,5"]);
    expect(JSON.parse(p.stdout).reference.pixels).toBe(1);
    const both = await run(["grid", table, "--reference-pixel", "5,5", "--reference-circle", "0,0,1"]);
    expect(both.code).toBe(2);
  });
  it("formatGridText prints one line per map", async () => {
    const r = await run(["grid", table, "--eta", "0.8", "--json", "--jobs", "1"]);
    const j = JSON.parse(r.stdout) as GridJson;
    const lines = formatGridText(j).split("\n");
    for (const m of j.maps) expect(lines.filter((l) => l.startsWith(m.label.padEnd(16))), m.label).toHaveLength(1);
  });
  it("--jobs 2 runs the pixel passes on worker threads over a shared NPY cube and gives the same maps as one thread", async () => {
    // 64 × 64 pixels × 512 bias points = 2.1 M samples, above GRID_JOBS_DEFAULTS.minSamplesForWorkers
    const c = sphereDotCube({ nx: 4, ny: 4, stepNM: 1.8 });
    const nb = 512, nx = 64, ny = 64;
    const data = new Float32Array(nx * ny * nb);
    // each pixel: the fixture's pixel (ix mod 4, iy mod 4), first 401 points, then the last value repeated
    for (let iy = 0; iy < ny; iy++)
      for (let ix = 0; ix < nx; ix++)
        for (let k = 0; k < nb; k++) data[(iy * nx + ix) * nb + k] = c.currentA[((iy % 4) * 4 + (ix % 4)) * c.biasV.count + Math.min(k, c.biasV.count - 1)];
    const dict = `{'descr': '<f4', 'fortran_order': False, 'shape': (${ny}, ${nx}, ${nb}), }`.padEnd(117, " ") + "\n";
    const head = Buffer.alloc(10);
    Buffer.from([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0]).copy(head);
    head.writeUInt16LE(dict.length, 8);
    const npy = join(dir, "tiled.npy");
    writeFileSync(npy, Buffer.concat([head, Buffer.from(dict, "latin1"), Buffer.from(data.buffer)]));
    writeFileSync(join(dir, "tiled.json"), JSON.stringify({ xNM: [0, 0.45, nx], yNM: [0, 0.45, ny], biasV: [c.biasV.start, c.biasV.step, nb], currentUnit: "A" }));
    const one = await run(["grid", npy, "--eta", "0.8", "--json", "--jobs", "1"]);
    const two = await run(["grid", npy, "--eta", "0.8", "--json", "--jobs", "2"]);
    expect(one.code, one.stderr).toBe(0);
    expect(two.code, two.stderr).toBe(0);
    const a = JSON.parse(one.stdout) as GridJson, b = JSON.parse(two.stdout) as GridJson;
    expect(b.maps.map((m) => m.label)).toEqual(a.maps.map((m) => m.label));
    // the same arithmetic, only the spectrum sum is added in parts: equal to rounding
    expectClose(b.maps.map((m) => m.rmsRadiusNM!), a.maps.map((m) => m.rmsRadiusNM!), { rtol: 1e-9, what: "one thread" });
  }, 60_000);
  it("runGridAnalysis spreads both passes over the pool in parts (2 workers × 4 parts each)", async () => {
    const { cube } = readGridFile(join(dir, "tiled.npy"), { shared: true });
    const pool = startGridPool(2);
    const totals = new Set<number>();
    let calls = 0;
    try {
      const g = await runGridAnalysis(cube, { eta: 0.8 }, pool, (_done, total) => {
        totals.add(total);
        calls++;
      });
      expect(g.maps.length).toBeGreaterThan(3);
    } finally {
      await pool.close();
    }
    expect([...totals]).toEqual([16]); // closed form: 2 passes × 2 workers × partsPerWorker (4)
    expect(calls).toBe(16);
  }, 60_000);
  it("GRID_JOBS_DEFAULTS are locked", () => {
    expect(Object.isFrozen(GRID_JOBS_DEFAULTS)).toBe(true);
    // measured on this machine (npm run bench:grid), see the README
    expect(GRID_JOBS_DEFAULTS).toEqual({ minSamplesForWorkers: 2_000_000, autoWorkersMinBytes: 1024 * 1024 * 1024, partsPerWorker: 4 });
  });
});
