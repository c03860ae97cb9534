// Traceable batches: the file's own metadata lines in its record and summary row, notes apart
// from warnings, the CLI's option names in printed messages, and simulate's metadata read back by
// analyze. Expectations derived by construction (the record layout in lib/report/analysisJson.ts) unless
// stated.
import { describe, it, expect, afterAll } from "vitest";
import { csvParse } from "d3-dsv";
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { formatCurveCsv, parseCurveText, simulateCurve, type AnalysisJson } from "../../lib/index.ts";
import { errorOf } from "../helpers/errors.ts";
import { cliOptionNames, CLI_OPTION_NAMES } from "../../lib/cli/cliOptionNames.ts";
import { FILLING, removeTempDirs, run, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const META = { dot: "D-17", radius_nm: "2.1", setpoint: "1 nA at 2.5 V", date: "2026-11-30", eta: "0.8" };

function curveWithMetadata(dir: string): string {
  const path = join(dir, "d17.csv");
  writeFileSync(path, formatCurveCsv(simulateCurve(FILLING, { method: "fast", conductance: false }), { metadata: META }));
  return path;
}

describe("the file's metadata lines travel with its results", () => {
  it("into the JSON record (`metadata`, keys and values as written) and the summary row (`meta_<key>` columns)", async () => {
    const dir = tempDir("dotspec-trace-");
    const file = curveWithMetadata(dir);
    const out = join(tempDir("dotspec-out-"), "r");
    expect((await run(["analyze", file, "--out", out])).code).toBe(0);
    const json = JSON.parse(readFileSync(join(out, "d17.json"), "utf8")) as AnalysisJson;
    expect(json.metadata).toEqual(META);
    const [row] = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    expect(row.meta_dot).toBe("D-17");
    expect(row.meta_radius_nm).toBe("2.1");
    expect(row.meta_setpoint).toBe("1 nA at 2.5 V");
    expect(row.meta_date).toBe("2026-11-30");
  });
});

describe("notes and warnings are separate lists", () => {
  it("η taken from the file's metadata is a note, not a warning; the readable report prints it as `note:` after the warnings", async () => {
    const file = curveWithMetadata(tempDir("dotspec-trace-"));
    const j = await run(["analyze", file, "--json"]);
    const [rec] = JSON.parse(j.stdout) as AnalysisJson[];
    expect(rec.energies.eta).toBe(0.8);
    expect(rec.notes).toEqual([`η = 0.8 taken from the file's metadata ("eta")`]);
    expect(rec.warnings.join("\n")).not.toMatch(/taken from the file's metadata/);
    expect(j.stderr).not.toMatch(/taken from the file's metadata/); // notes are not printed with the warnings
    const text = await run(["analyze", file]);
    expect(text.stdout).toMatch(/\n {2}note: η = 0\.8 taken from the file's metadata/);
  });

  it("with --eta there is no such note", async () => {
    const file = curveWithMetadata(tempDir("dotspec-trace-"));
    const [rec] = JSON.parse((await run(["analyze", file, "--eta", "0.8", "--json"])).stdout) as AnalysisJson[];
    expect(rec.notes).toEqual([]);
  });
});

describe("messages printed by the CLI name the CLI's options", () => {
  it("cliOptionNames maps each library option name to its flag (the flags `dotspec analyze --help` lists)", async () => {
    const help = (await run(["analyze", "--help"])).stdout;
    for (const [name, flag] of Object.entries(CLI_OPTION_NAMES)) {
      if (name !== "binNM") expect(help, flag).toContain(flag);
      expect(cliOptionNames(`option ${name} is wrong`)).toBe(`option ${flag} is wrong`);
    }
    expect(cliOptionNames("scenario.eta must be in (0, 1]")).toBe("scenario.eta must be in (0, 1]"); // a scenario key, not an option
    expect(cliOptionNames("eta must be in (0, 1]")).toBe("--eta must be in (0, 1]");
  });

  it("a headerless file's warning says --bias-unit / --current-unit, not biasUnit / currentUnit, in the report and on stderr", async () => {
    const dir = tempDir("dotspec-trace-");
    const lines = formatCurveCsv(simulateCurve(FILLING, { method: "fast", conductance: false })).split("\n").slice(1).join("\n");
    writeFileSync(join(dir, "plain.dat"), lines);
    const text = await run(["analyze", join(dir, "plain.dat"), "--eta", "0.8"]);
    expect(text.stdout).toMatch(/--bias-unit \/ --current-unit/);
    expect(text.stdout).not.toMatch(/currentUnit/);
    const json = await run(["analyze", join(dir, "plain.dat"), "--eta", "0.8", "--json"]);
    expect(json.stderr).toMatch(/: warning: .*--bias-unit \/ --current-unit/);
    expect(json.stderr).not.toMatch(/currentUnit/);
  });

  it("no failure reason suggests an option the CLI does not have (biasColumn)", async () => {
    const dir = tempDir("dotspec-trace-");
    const text = "0.1,abc\n0.2,1e-12\n";
    writeFileSync(join(dir, "nan.csv"), text);
    expect(errorOf(() => parseCurveText(text)).message).toMatch(/biasColumn/); // the library's wording
    const r = await run(["analyze", join(dir, "nan.csv")]);
    expect(r.code).toBe(1);
    expect(r.stderr).not.toMatch(/biasColumn/);
  });
});

describe("simulate writes the scenario's η and description as metadata lines that analyze reads back", () => {
  it("analysing simulate's own output uses the scenario's η (a note says so), and the description is in the record", async () => {
    const dir = tempDir("dotspec-trace-");
    const config = join(dir, "s.json");
    writeFileSync(config, JSON.stringify({ ...FILLING, eta: 0.73, description: "invented dot, for a test" }));
    expect((await run(["simulate", "--config", config, "--out", join(dir, "c.csv"), "--method", "fast"])).code).toBe(0);
    const head = readFileSync(join(dir, "c.csv"), "utf8").split("\n");
    expect(head[0]).toBe("# eta: 0.73");
    expect(head[1]).toBe("# description: invented dot, for a test");
    const [rec] = JSON.parse((await run(["analyze", join(dir, "c.csv"), "--json"])).stdout) as AnalysisJson[];
    expect(rec.energies.eta).toBe(0.73);
    expect(rec.notes[0]).toMatch(/η = 0\.73 taken from the file's metadata/);
    expect(rec.metadata.description).toBe("invented dot, for a test");
    expect(rec.metadata.scenario).toBe(config);
  });
});
