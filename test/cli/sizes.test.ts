// dotspec sizes, run in-process on a tiny series simulated with the project's model from the
// sphere model of InP (infinite wall, non-parabolic) and Ec = e²/(4πε₀·ε_eff·R), ε_eff = 7:
// dot ids and sizes from metadata or a size table, per-curve η, unassigned curves, the report
// folder, exit codes and refused options. Energies are compared with the model's own levels
// (closed form of the scenario: Ec and the single-particle gap) within 2 %, the project's
// accuracy bar for the gap (README, "Accuracy"; common practice (no source)).
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { listCurveFiles, readSizeMetaFile, simulateCurve, writeTextFile, resolveMaterial, type SizeSeriesJson } from "../../lib/index.ts";
import { seriesDotLevels, seriesDotScenario, type SeriesModel } from "../../scripts/make-size-series.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { removeTempDirs, run, tempDir } from "./harness.ts";
import { SIZES_CLI_DEFAULTS } from "../../lib/cli/commands/sizes.ts";

const MODEL: SeriesModel = {
  material: resolveMaterial("InP"),
  wall: "infinite",
  nonParabolic: true,
  chargingDielectricConstant: 7,
  chargingOffsetEV: 0,
  conductionEdgeEV: 0.62,
};
const DOTS = [
  { dot: "T1", radiusNM: 1.6, eta: 0.85 },
  { dot: "T2", radiusNM: 2.2, eta: 0.9 },
  { dot: "T3", radiusNM: 2.8, eta: 0.8 },
];

/** Writes one simulated curve with metadata lines; returns its file name. */
function writeDotCurve(dir: string, d: (typeof DOTS)[number], k: number, meta: Record<string, string | number>, eta = d.eta): string {
  const scenario = seriesDotScenario(
    { radiusNM: d.radiusNM, eta, regime: "filling", points: 700, noiseRelative: 0.002, seed: 10 * k + Math.round(d.radiusNM * 100), broadeningEV: 0.012 },
    MODEL,
    "test dot",
  );
  const sim = simulateCurve(scenario, { method: "fast", conductance: false });
  const lines = [...Object.entries(meta).map(([key, v]) => `# ${key}: ${v}`), "bias (V),current (A)"];
  for (let i = 0; i < sim.biasV.length; i++) lines.push(`${sim.biasV[i]},${sim.currentA[i]}`);
  const name = `${d.dot.toLowerCase()}-${k}.csv`;
  writeTextFile(join(dir, name), lines.join("\n") + "\n");
  return name;
}

let dir: string;
beforeAll(() => {
  dir = tempDir("dotspec-sizes-");
  for (const d of DOTS) for (const k of [1, 2]) writeDotCurve(dir, d, k, { dot: d.dot, radius_nm: d.radiusNM, eta: d.eta });
  // A curve of a dot whose size was not measured.
  writeDotCurve(dir, DOTS[1], 3, { dot: "T2b", eta: DOTS[1].eta });
}, 60_000);
afterAll(removeTempDirs);

describe("dotspec sizes DIR --material InP --json (sizes from the files' metadata)", () => {
  let out: SizeSeriesJson;
  beforeAll(async () => {
    const r = await run(["sizes", dir, "--material", "InP", "--json"]);
    // The closing count line only (by construction: lib/cli/batchCount.ts).
    expect(r.stderr).toMatch(/^dotspec: 7 done, 0 failed, \d+ warnings?( \(in \d+ files?\))?\n$/);
    expect(r.code).toBe(0);
    out = JSON.parse(r.stdout);
  }, 60_000);

  it("one row per dot, by radius, with the issue's fields; the curve without a size is unassigned", () => {
    expect(out.dots.map((d) => [d.dot, d.radiusNM, d.curves, d.regime])).toEqual([
      ["T1", 1.6, 2, "shell-filling"],
      ["T2", 2.2, 2, "shell-filling"],
      ["T3", 2.8, 2, "shell-filling"],
    ]);
    for (const key of ["gapV", "chargingEnergyV", "levelSpacingSPV", "energies", "uncertainties", "flags"]) expect(out.dots[0]).toHaveProperty(key);
    expect(out.unassigned.map((u) => [u.file.endsWith("t2-3.csv"), u.dot])).toEqual([[true, "T2b"]]);
    expect(out.bins.length).toBeGreaterThan(0);
  });

  it("energies after each file's η match the model's Ec and single-particle gap (closed form of the scenario) within 2 %", () => {
    for (const d of out.dots) {
      const truth = seriesDotLevels(d.radiusNM, MODEL);
      expectClose(d.energies.chargingEnergyEV!, truth.chargingEnergyEV, { rtol: 0.02, what: `${d.dot} Ec` });
      expectClose(d.energies.singleParticleGapEV!, truth.truth.singleParticleGapEV, { rtol: 0.02, what: `${d.dot} Eg,sp` });
      expect(d.energies.etas).toEqual([DOTS.find((x) => x.dot === d.dot)!.eta]);
    }
  });

  it("fits every quantity with the material's models", () => {
    const quantities = new Set(out.fits.map((f) => f.quantity));
    expect(quantities).toEqual(new Set(["gapEV", "singleParticleGapEV", "chargingEnergyEV", "levelSpacingSPEV", "valenceSpacing1EV"]));
    const ec = out.fits.find((f) => f.model === "charging-sphere")!;
    expect(ec.pointsUsed).toBe(3);
  });
});

describe("dotspec sizes DIR --meta META.csv", () => {
  it("takes dots, sizes and η from the table; files it does not list are unassigned", async () => {
    const meta = join(tempDir(), "META.csv");
    // T3's curves listed with η 0.9 instead of their true 0.8: the energies must use 0.9.
    writeFileSync(meta, "file,dot,diameter_nm,eta\nt1-1.csv,T1,3.2,\nt1-2.csv,T1,3.2,\nt3-1.csv,T3,5.6,0.9\nt3-2.csv,T3,5.6,0.9\n");
    const r = await run(["sizes", dir, "--meta", meta, "--json"]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as SizeSeriesJson;
    expect(out.dots.map((d) => [d.dot, d.radiusNM])).toEqual([["T1", 1.6], ["T3", 2.8]]);
    expect(out.dots[0].energies.etas).toEqual([0.85]); // no η in the table: the file's metadata line
    expect(out.dots[1].energies.etas).toEqual([0.9]);
    // Energies = η × bias (the project's convention).
    expectClose(out.dots[1].energies.gapEV!, 0.9 * out.dots[1].gapV!, { rtol: 1e-12 });
    expect(out.unassigned.map((u) => u.reason)).toEqual(Array(3).fill(`not listed in ${meta}`));
    expect(out.fits).toEqual([]);
    expect(out.warnings.join(" ")).toContain("no material given");
  }, 60_000);

  it("says so when the size table was saved as Windows-1252 (a Latin-1 µ in a note), on stderr, in the record and in the count", async () => {
    const meta = join(tempDir(), "META.csv");
    // WHATWG Encoding Standard: byte 0xB5 is µ in windows-1252 and not valid UTF-8 on its own
    writeFileSync(meta, Buffer.concat([Buffer.from("file,dot,radius_nm,notes\nt1-1.csv,T1,1.6,tip 5 "), Buffer.from([0xb5]), Buffer.from("m\nt1-2.csv,T1,1.6,\n")]));
    const r = await run(["sizes", dir, "--meta", meta, "--json"]);
    expect(r.code).toBe(0);
    expect(r.stderr).toContain(`dotspec: warning: ${meta}: the file is not valid UTF-8`);
    const out = JSON.parse(r.stdout) as SizeSeriesJson;
    expect(out.warnings[0]).toMatch(/^.*META\.csv: the file is not valid UTF-8.*Windows-1252/);
    // the count line counts the table's warning with the curves' (by construction: lib/cli/batchCount.ts)
    expect(r.stderr).toMatch(/dotspec: 7 done, 0 failed, [1-9]\d* warnings? \(in [1-9]\d* files?\)\n$/);
  }, 60_000);

  it("a row naming a missing file is an error naming the row (exit 1)", async () => {
    const meta = join(tempDir(), "META.csv");
    writeFileSync(meta, "file,dot,radius_nm\nt1-1.csv,T1,1.6\nmissing.csv,T1,1.6\n");
    const r = await run(["sizes", dir, "--meta", meta]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("line 3 (missing.csv): no such file");
    expect(r.stdout).toBe("");
  });

  it("a row pointing outside DIR is an error naming the row (exit 1)", async () => {
    const meta = join(tempDir(), "META.csv");
    writeFileSync(meta, "file,dot,radius_nm\n../t1-1.csv,T1,1.6\n");
    const r = await run(["sizes", dir, "--meta", meta]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("line 2 (../t1-1.csv): the file points outside the series folder");
  });
});

describe("dotspec sizes --material-file M.json", () => {
  it("uses a built-in with fields changed; an unknown key is a usage error naming it", async () => {
    const m = join(tempDir(), "m.json");
    writeFileSync(m, JSON.stringify({ base: "InP", dielectricConstant: 10 }));
    const r = await run(["sizes", join(dir, "t1-1.csv"), join(dir, "t2-1.csv"), "--material-file", m, "--json"]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as SizeSeriesJson;
    expect(out.material).toMatchObject({ bandGapEV: 1.421, dielectricConstant: 10 });
    writeFileSync(m, JSON.stringify({ base: "InP", dielectric: 10 }));
    const bad = await run(["sizes", dir, "--material-file", m]);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain("dielectric");
  }, 60_000);
});

describe("dotspec sizes DIR --out REPORT", () => {
  it("writes sizes.json, the four tables, the figures and the per-curve records", async () => {
    const out = join(tempDir(), "report");
    const optical = join(tempDir(), "optical.csv");
    writeFileSync(optical, "radius_nm,peak_ev_1\n2.2,2.0\n");
    const r = await run(["sizes", dir, "--material", "InP", "--optical", optical, "--out", out]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("Per dot");
    for (const f of ["sizes.json", "sizes-curves.csv", "sizes-dots.csv", "sizes-bins.csv", "sizes-fits.csv", "sizes-gap.svg", "sizes-charging-energy.svg", "sizes-level-spacing.svg", "sizes-valence.svg", "sizes-optical.svg"]) {
      expect(existsSync(join(out, f)), f).toBe(true);
    }
    for (const f of ["t1-1.json", "t1-1.svg", "t2-3.json", "summary.csv"]) expect(existsSync(join(out, "curves", f)), f).toBe(true);
    const curves = readFileSync(join(out, "sizes-curves.csv"), "utf8").trim().split("\n");
    expect(curves).toHaveLength(1 + 7);
    expect(JSON.parse(readFileSync(join(out, "sizes.json"), "utf8")).optical).toHaveLength(1);
  }, 60_000);
});

describe("dotspec sizes: refused options (exit 2)", () => {
  it("an unknown material, both material options, --meta with two folders, a hostile or broken formula", async () => {
    const cases: [string[], RegExp][] = [
      [["sizes", dir, "--material", "Unobtainium"], /Unobtainium/],
      [["sizes", dir, "--material", "InP", "--material-file", "m.json"], /not both/],
      [["sizes", dir, dir, "--meta", "META.csv"], /one folder/],
      [["sizes", dir, "--material", "InP", "--formula", 'import({}, {})'], /formula/],
      [["sizes", dir, "--material", "InP", "--formula", "a + b / R^"], /formula/],
      [["sizes", dir, "--formula", "a + b / R"], /needs a material/],
      [["sizes", dir, "--bin-nm", "0"], /bin-nm/],
    ];
    for (const [argv, message] of cases) {
      const r = await run(argv);
      expect(r.code, argv.join(" ")).toBe(2);
      expect(r.stderr).toMatch(message);
    }
  });
});

describe("dotspec sizes with stderr a terminal", () => {
  it("draws a progress bar there and still prints the summary on stdout", async () => {
    const r = await run(["sizes", dir], { stderrTTY: true });
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("Per dot");
    expect(r.stderr).toContain("sizes [");
  }, 60_000);
});

describe("the bundled demo series", () => {
  it("lives in a sub-folder that `dotspec analyze sample-curves` does not read, so the six single-curve demos stay as they were", () => {
    expect(listCurveFiles(["sample-curves"]).map((f) => f.replace(/\\/g, "/"))).toEqual(
      ["dot-01.csv", "dot-02.tsv", "dot-03.txt", "dot-04.csv", "dot-05.dat", "dot-06.tsv"].map((f) => `sample-curves/${f}`),
    );
  });
  it("lists every curve file of its folder in META.csv except the one left unassigned on purpose", () => {
    const listed = readSizeMetaFile("sample-curves/series/META.csv", "sample-curves/series/curves").map((r) => r.file);
    const files = listCurveFiles(["sample-curves/series/curves"]).map((f) => f.split(/[\\/]/).pop()!);
    expect(files.filter((f) => !listed.includes(f))).toEqual(["qd-7-s07-3.csv"]);
  });
});

describe("SIZES_CLI_DEFAULTS", () => {
  it("is locked", () => {
    expect(SIZES_CLI_DEFAULTS).toEqual({ minCurvesPerPool: 40 });
  });
});

describe("dotspec sizes --help", () => {
  it("documents the options and says they are analysis settings, not instrument settings", async () => {
    const r = await run(["sizes", "--help"]);
    expect(r.code).toBe(0);
    for (const option of ["--meta", "--eta", "--material", "--material-file", "--optical", "--formula", "--bin-nm", "--window-mv", "--order", "--json", "--out", "--jobs"]) {
      expect(r.stdout).toContain(option);
    }
    expect(r.stdout.replace(/\s+/g, " ")).toContain("analysis settings, not instrument settings");
  });
});
