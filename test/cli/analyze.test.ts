// dotspec analyze, run in-process: closed-form peak positions through the whole command, the
// three output modes, exit codes, per-file failures, and the input files left untouched.
import { csvParse } from "d3-dsv";
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { JSDOM } from "jsdom";
import { expectClose } from "../helpers/expectClose.ts";
import { SUMMARY_COLUMNS, type AnalysisJson } from "../../lib/index.ts";
import { chargingPeakV, FILLING, removeTempDirs, run, tempDir, TUNNELING, writeCurve } from "./harness.ts";

/** Peak positions are compared within 3 mV: "a few mV" (common practice (no source)) at 2 mV steps. */
const PEAK_ATOL_V = 0.003;

let dir: string;
let filling: string;
let tunneling: string;

beforeAll(() => {
  dir = tempDir();
  filling = writeCurve(join(dir, "filling.csv"), FILLING, "exact");
  tunneling = writeCurve(join(dir, "tunneling.csv"), TUNNELING, "exact");
});
afterAll(removeTempDirs);

function parseRecords(stdout: string): AnalysisJson[] {
  const value = JSON.parse(stdout);
  expect(Array.isArray(value)).toBe(true);
  return value as AnalysisJson[];
}

const multiplet = (j: AnalysisJson, label: string) => j.multiplets.find((m) => m.label === label)!;

describe("dotspec analyze --json", () => {
  let records: AnalysisJson[];
  beforeAll(async () => {
    const r = await run(["analyze", filling, tunneling, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(0);
    // With --json the warnings are also on stderr (by construction: lib/cli/commands/analyze.ts), then the count.
    expect(r.stderr).toMatch(/^(dotspec: \S+: warning: .*\n)*dotspec: 2 done, 0 failed, \d+ warnings?( \(in \d files?\))?\n$/);
    records = parseRecords(r.stdout);
  });

  it("prints exactly one JSON array with one record per file, in the order given", () => {
    expect(records.map((j) => j.source)).toEqual([filling, tunneling]);
  });

  it("shell filling: charging peaks at (ε + Ec(n + ½))/η (closed form of orthodox theory: Beenakker, Phys. Rev. B 44, 1646 (1991))", () => {
    const [j] = records;
    expect(j.regime).toBe("shell-filling");
    // s (g = 2): n = 0, 1; p (g = 6): n = 2, 3, 4 inside the 1.6 V sweep; VB level: n = 0, 1.
    expectClose(multiplet(j, "s").peaksV, [0, 1].map((n) => chargingPeakV(0.5, n)), { atol: PEAK_ATOL_V, what: "s peaks" });
    expectClose(multiplet(j, "p").peaksV, [2, 3, 4].map((n) => chargingPeakV(0.8, n)), { atol: PEAK_ATOL_V, what: "p peaks" });
    expectClose(multiplet(j, "v1").peaksV, [0, 1].map((n) => chargingPeakV(-0.6, n)), { atol: PEAK_ATOL_V, what: "v1 peaks" });
  });

  it("shell filling: Ec = 0.1 eV (0.125 V in bias), gap = first CB − first VB peak, Δsp = εp − εs (closed forms; Banin et al., Nature 400, 542 (1999), from memory)", () => {
    const [j] = records;
    expectClose(j.chargingEnergyV!, 0.1 / 0.8, { atol: 0.002, what: "Ec in bias" });
    expectClose(j.energies.chargingEnergyEV!, 0.1, { atol: 0.002, what: "Ec in eV" });
    expectClose(j.gapV!, chargingPeakV(0.5, 0) - chargingPeakV(-0.6, 0), { atol: 2 * PEAK_ATOL_V, what: "gap" });
    expectClose(j.energies.levelSpacingSPEV!, 0.8 - 0.5, { atol: 0.003, what: "Δsp in eV" });
    expect(j.energies.eta).toBe(0.8);
    expect(j.energies.etaGiven).toBe(true);
  });

  it("shell tunnelling: one peak per level at (ε + Ec/2)/η and no Ec (closed form; Banin et al., Nature 400, 542 (1999), from memory)", () => {
    const [, j] = records;
    expect(j.regime).toBe("shell-tunneling");
    expectClose(multiplet(j, "s").peaksV, [chargingPeakV(0.5, 0)], { atol: PEAK_ATOL_V, what: "s" });
    expectClose(multiplet(j, "p").peaksV, [chargingPeakV(0.8, 0)], { atol: PEAK_ATOL_V, what: "p" });
    expect(j.chargingEnergyV).toBeNull();
  });

  it("numbers are JSON numbers", () => {
    expect(typeof records[0].gapV).toBe("number");
    expect(typeof records[0].peaks[0].biasV).toBe("number");
  });
});

describe("dotspec analyze (readable report)", () => {
  it("prints per file a header (file, regime, η), peaks, multiplets and Ec in mV and meV, without control codes", async () => {
    const r = await run(["analyze", filling, "--eta", "0.8"]);
    expect(r.code).toBe(0);
    expect(r.stdout.split("\n")[0]).toBe(`${filling}  ·  shell filling  ·  η = 0.8`);
    expect(r.stdout).toContain("Peaks (");
    expect(r.stdout).toContain("Multiplets");
    // Ec = 0.1 eV: 125 mV in bias and 100 meV after η (closed form); printed to the σ's precision.
    const ec = /\n {4}Ec += +(\d+\.\d+) ± [\d.]+ mV  →  (\d+\.\d+) ± [\d.]+ meV \(η = 0\.8\)\n/.exec(r.stdout);
    expect(ec).not.toBeNull();
    expectClose(Number(ec![1]), 125, { atol: 2, what: "Ec mV" });
    expectClose(Number(ec![2]), 100, { atol: 2, what: "Ec meV" });
    expect(r.stdout).not.toMatch(/\x1b/);
  });

  it("adds emphasis on a terminal, and none with NO_COLOR (no-color.org convention)", async () => {
    expect((await run(["analyze", filling], { stdoutTTY: true })).stdout).toMatch(/\x1b\[1m/);
    expect((await run(["analyze", filling], { stdoutTTY: true, env: { NO_COLOR: "1" } })).stdout).not.toMatch(/\x1b/);
  });

  it("reads a folder's curve files (listCurveFiles), skipping other files", async () => {
    const folder = tempDir();
    writeCurve(join(folder, "a.csv"), FILLING);
    writeCurve(join(folder, "b.txt"), TUNNELING);
    writeFileSync(join(folder, "notes.md"), "not a curve\n");
    const r = await run(["analyze", folder, "--json"]);
    expect(r.code).toBe(0);
    expect(parseRecords(r.stdout).map((j) => j.source)).toEqual([join(folder, "a.csv"), join(folder, "b.txt")]);
  });
});

describe("dotspec analyze: failures and exit codes", () => {
  it("exit 1 with one stderr line per failed file; the other files are still analysed", async () => {
    const folder = tempDir();
    const bad = join(folder, "bad.csv");
    const short = join(folder, "short.csv");
    const missing = join(folder, "missing.csv");
    writeFileSync(bad, "hello\nworld\n");
    writeFileSync(short, "bias (V),current (A)\n0.1,1e-12\n0.2,2e-12\n");
    const r = await run(["analyze", bad, filling, short, missing, tunneling, "--json"]);
    expect(r.code).toBe(1);
    // Warnings (`dotspec: FILE: warning: …`) and the closing count line aside.
    const all = r.stderr.trimEnd().split("\n");
    expect(all.at(-1)).toMatch(new RegExp(`^dotspec: 2 done, 3 failed, ${all.filter((l) => /: warning: /.test(l)).length} warnings`));
    const lines = all.slice(0, -1).filter((l) => !/: warning: /.test(l));
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^dotspec: .*missing\.csv: no such file/);
    expect(lines[1]).toMatch(new RegExp(`^dotspec: ${bad.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}: \\S`));
    expect(lines[2]).toMatch(/^dotspec: .*short\.csv: /);
    expect(parseRecords(r.stdout).map((j) => j.source)).toEqual([filling, tunneling]);
  });

  it("exit 1 for a folder without curve files", async () => {
    const r = await run(["analyze", tempDir(), filling, "--json"]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^dotspec: .*: no curve files/);
    expect(parseRecords(r.stdout)).toHaveLength(1);
  });

  it("--json with every file failing prints an empty array", async () => {
    const r = await run(["analyze", join(tempDir(), "none.csv"), "--json"]);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.stdout)).toEqual([]);
  });

  it.each([
    [["analyze"], /missing FILE/],
    [["analyze", "x.csv", "--bogus"], /unknown option '--bogus'/],
    [["analyze", "x.csv", "--eta", "abc"], /--eta.*'abc'.*greater than 0 and at most 1/],
    [["analyze", "x.csv", "--eta", "1.5"], /--eta.*'1\.5'.*greater than 0 and at most 1/],
    [["analyze", "x.csv", "--eta", "0"], /--eta.*greater than 0/],
    [["analyze", "x.csv", "--order", "5"], /--order.*from 2 to 4/],
    [["analyze", "x.csv", "--order", "2.5"], /--order.*whole number/],
    [["analyze", "x.csv", "--window-mv", "-3"], /--window-mv.*greater than 0/],
    [["analyze", "x.csv", "--min-step-sigma", "x"], /--min-step-sigma.*0 or more/],
    [["analyze", "x.csv", "--jobs", "0"], /--jobs.*from 1 to 64/],
    [["frobnicate"], /unknown command 'frobnicate'/],
    [[], /Usage: dotspec/],
  ])("usage error %j → exit 2 with the option and the accepted range on stderr", async (argv, message) => {
    const r = await run(argv as string[]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(r.stdout).toBe("");
  });

  it('--window-mv accepts "auto" and a number in mV', async () => {
    expect((await run(["analyze", filling, "--window-mv", "auto", "--json"])).code).toBe(0);
    const r = await run(["analyze", filling, "--window-mv", "30", "--order", "2", "--min-step-sigma", "4", "--json"]);
    expect(r.code).toBe(0);
    const [j] = parseRecords(r.stdout);
    expect(j.settings.automaticWindow).toBe(false);
    expect(j.settings.order).toBe(2);
    expect(j.settings.minStepSigma).toBe(4);
    // The window is rounded to an odd number of 2 mV steps (lib/signal/conductance.ts): 15 steps, 30 mV.
    expect(j.settings.windowMV).toBeCloseTo(30, 9);
  });
});

describe("dotspec analyze --out DIR", () => {
  it("writes DIR/<name>.json, DIR/<name>.svg per file and DIR/summary.csv, creating DIR; inputs unchanged", async () => {
    const before = [filling, tunneling].map((f) => ({ bytes: readFileSync(f), mtimeMs: statSync(f).mtimeMs }));
    const out = join(tempDir(), "nested", "report");
    const r = await run(["analyze", filling, tunneling, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual([".dotspec-manifest.json", "filling.json", "filling.svg", "summary.csv", "tunneling.json", "tunneling.svg"]);

    const j = JSON.parse(readFileSync(join(out, "filling.json"), "utf8")) as AnalysisJson;
    expect(j.source).toBe(filling);
    expectClose(multiplet(j, "s").peaksV, [0, 1].map((n) => chargingPeakV(0.5, n)), { atol: PEAK_ATOL_V, what: "s peaks from the written JSON" });

    const csv = readFileSync(join(out, "summary.csv"), "utf8").trimEnd().split("\n");
    expect(csv[0]).toBe(SUMMARY_COLUMNS.join(","));
    expect(csv).toHaveLength(3);
    const row = Object.fromEntries(csv[0].split(",").map((k, i) => [k, csv[1].split(",")[i]]));
    expect(row.source).toBe(filling);
    expect(row.regime).toBe("shell-filling");
    expectClose(Number(row.Ec_eV), 0.1, { atol: 0.002, what: "Ec_eV (closed form 0.1 eV)" });
    expect(Number(row.eta)).toBe(0.8);

    const svg = readFileSync(join(out, "filling.svg"), "utf8");
    const doc = new JSDOM(svg, { contentType: "image/svg+xml" }).window.document;
    expect(doc.documentElement.localName).toBe("svg");
    expect(doc.getElementsByTagName("circle")).toHaveLength(j.peaks.length);

    [filling, tunneling].forEach((f, i) => {
      expect(readFileSync(f).equals(before[i].bytes)).toBe(true);
      expect(statSync(f).mtimeMs).toBe(before[i].mtimeMs);
    });
  });

  it("refuses (exit 2) to write into the folder of an input file, and writes nothing", async () => {
    const folder = tempDir();
    const f = writeCurve(join(folder, "dot.csv"), FILLING);
    const r = await run(["analyze", f, "--out", folder]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--out .* is the folder of the input file/);
    expect(readdirSync(folder)).toEqual(["dot.csv"]);
    const over = await run(["analyze", f, "--out", f]);
    expect(over.code).toBe(2);
    expect(over.stderr).toMatch(/--out .* is an input file/);
    expect(readdirSync(folder)).toEqual(["dot.csv"]);
  });

  it("gives files with the same name distinct outputs", async () => {
    const a = tempDir();
    const b = tempDir();
    writeCurve(join(a, "dot.csv"), FILLING);
    writeCurve(join(b, "dot.csv"), TUNNELING);
    const out = join(tempDir(), "out");
    expect((await run(["analyze", join(a, "dot.csv"), join(b, "dot.csv"), "--out", out, "--json"])).code).toBe(0);
    expect(readdirSync(out).sort()).toEqual([".dotspec-manifest.json", "dot-2.json", "dot-2.svg", "dot.json", "dot.svg", "summary.csv"]);
  });

  it("a file that fails gets no outputs, and a row in summary.csv with status failed and the reason", async () => {
    const folder = tempDir();
    writeFileSync(join(folder, "bad.csv"), "no numbers\n");
    const out = join(tempDir(), "out");
    const r = await run(["analyze", join(folder, "bad.csv"), filling, "--out", out]);
    expect(r.code).toBe(1);
    expect(readdirSync(out).sort()).toEqual([".dotspec-manifest.json", "filling.json", "filling.svg", "summary.csv"]);
    const rows = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    expect(rows.map((row) => [row.source, row.status])).toEqual([[join(folder, "bad.csv"), "failed"], [filling, "ok"]]);
    expect(r.stderr).toContain(`dotspec: ${join(folder, "bad.csv")}: ${rows[0].reason}`);
  });

  it("exit 1 when DIR cannot be created (a file is in the way)", async () => {
    const blocker = join(tempDir(), "file");
    writeFileSync(blocker, "x");
    const r = await run(["analyze", filling, "--out", join(blocker, "report")]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/could not be written/);
  });
});

describe("dotspec analyze --jobs", () => {
  it("worker threads give the same output, in the order given, as one thread", async () => {
    const folder = tempDir();
    for (let k = 0; k < 4; k++) writeCurve(join(folder, `dot-${k}.csv`), { ...FILLING, noise: { relative: 0.003, seed: 10 + k } });
    writeFileSync(join(folder, "dot-2b.csv"), "broken\n");
    const one = await run(["analyze", folder, "--json", "--jobs", "1"]);
    const two = await run(["analyze", folder, "--json", "--jobs", "2"]);
    expect(two.code).toBe(1);
    expect(two.stdout).toBe(one.stdout);
    expect(two.stderr).toBe(one.stderr);
    expect(parseRecords(two.stdout).map((j) => j.source)).toEqual([0, 1, 2, 3].map((k) => join(folder, `dot-${k}.csv`)));
  });
});

describe("dotspec analyze: progress bar", () => {
  let folder: string;
  beforeAll(() => {
    folder = tempDir();
    for (let k = 0; k < 6; k++) writeCurve(join(folder, `dot-${k}.csv`), { ...FILLING, noise: { relative: 0.003, seed: 20 + k } });
  });

  it("is drawn on stderr, not stdout, for more than 5 files when stderr is a terminal", async () => {
    const r = await run(["analyze", folder, "--json"], { stderrTTY: true });
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/analyze \[/);
    expect(parseRecords(r.stdout)).toHaveLength(6);
  });

  it("is not drawn over the readable report on a terminal (the report shows the progress)", async () => {
    const r = await run(["analyze", folder], { stderrTTY: true, stdoutTTY: true });
    expect(r.stderr).toMatch(/^dotspec: 6 done, 0 failed, 6 warnings \(in 6 files\)\n$/);
  });

  it("is not drawn when stderr is not a terminal, or for 5 files or fewer", async () => {
    // Only the warnings (η not given) and the count line: no bar.
    const noBar = /^(dotspec: \S+: warning: .*\n)*dotspec: \d done, 0 failed, .*\n$/;
    expect((await run(["analyze", folder, "--json"])).stderr).toMatch(noBar);
    const five = [0, 1, 2, 3, 4].map((k) => join(folder, `dot-${k}.csv`));
    expect((await run(["analyze", ...five, "--json"], { stderrTTY: true })).stderr).toMatch(noBar);
  });
});

it("never writes beside its inputs: a run without --out leaves the input folder as it was", async () => {
  const folder = tempDir();
  writeCurve(join(folder, "dot.csv"), FILLING);
  await run(["analyze", folder, "--json"]);
  await run(["analyze", folder]);
  expect(readdirSync(folder)).toEqual(["dot.csv"]);
  expect(existsSync(join(folder, "summary.csv"))).toBe(false);
});

describe("dotspec analyze --bias-unit U --current-unit U (headerless files)", () => {
  it("reads a headerless two-column file in mV and pA with the units given, and finds the same peaks (SI prefixes: 1 mV = 1e-3 V, 1 pA = 1e-12 A)", async () => {
    const csv = readFileSync(filling, "utf8").trimEnd().split("\n").slice(1);
    const headerless = join(dir, "headerless.dat");
    writeFileSync(headerless, csv.map((line) => { const [v, i] = line.split(",").map(Number); return `${v * 1e3} ${i * 1e12}`; }).join("\n") + "\n");
    const r = await run(["analyze", headerless, "--eta", "0.8", "--json", "--bias-unit", "mV", "--current-unit", "pA"]);
    expect(r.code).toBe(0);
    const [rec] = parseRecords(r.stdout);
    const s = rec.multiplets.find((m) => m.label === "s")!;
    expectClose(s.peaksV, [chargingPeakV(0.5, 0), chargingPeakV(0.5, 1)], { atol: PEAK_ATOL_V });
    expect(rec.warnings.join(" ")).not.toMatch(/assumed/);
  });

  it("rejects an unknown unit as a usage error naming the accepted ones (exit 2)", async () => {
    const r = await run(["analyze", filling, "--bias-unit", "furlong"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/mV/);
  });
});

describe("dotspec analyze: sign conventions", () => {
  // A file written with the bias applied to the tip (V_tip = −V_sample, current with it) and one
  // whose current has the sign opposite to the bias: both give the peaks of the sample-bias file,
  // s at +(|ε| + Ec/2)/η (closed form of orthodox theory: Beenakker, Phys. Rev. B 44, 1646 (1991)).
  let tipFile: string;
  let invertedFile: string;
  beforeAll(() => {
    const lines = readFileSync(filling, "utf8").split("\n");
    const header = lines.findIndex((l) => /^bias/i.test(l));
    const rows = lines.slice(header + 1).filter((l) => l.trim() !== "").map((l) => l.split(",").map(Number));
    const neg = (x: number) => (x === 0 ? 0 : -x);
    tipFile = join(dir, "tip.csv");
    writeFileSync(tipFile, [lines[header], ...rows.map((r) => r.map(neg).join(","))].join("\n") + "\n");
    invertedFile = join(dir, "inverted.csv");
    writeFileSync(invertedFile, [lines[header], ...rows.map(([v, ...i]) => [v, ...i.map(neg)].join(","))].join("\n") + "\n");
  });

  it("--bias-polarity tip reads a tip-bias file as sample bias", async () => {
    const r = await run(["analyze", tipFile, "--eta", "0.8", "--bias-polarity", "tip", "--json"]);
    expect(r.code).toBe(0);
    const [j] = parseRecords(r.stdout);
    expectClose(multiplet(j, "s").peaksV[0], chargingPeakV(FILLING.cb[0].energyEV, 0), { atol: PEAK_ATOL_V, what: "s1" });
    expect(j.regime).toBe("shell-filling");
  });

  it("a current with the sign opposite to the bias is flipped, with a warning that names the tip option", async () => {
    const r = await run(["analyze", invertedFile, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(0);
    const [j] = parseRecords(r.stdout);
    expect(j.warnings.join(" ")).toMatch(/opposite to the bias.*tip/);
    expectClose(multiplet(j, "s").peaksV[0], chargingPeakV(FILLING.cb[0].energyEV, 0), { atol: PEAK_ATOL_V, what: "s1" });
    expect(j.regime).toBe("shell-filling");
  });

  it("--bias-polarity takes only sample or tip", async () => {
    const r = await run(["analyze", filling, "--bias-polarity", "anode"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/sample, tip/);
  });
});
