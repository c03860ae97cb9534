// `dotspec fit --max-evaluations` and `--replay` of fit records: checks exact by construction
// (the fit is deterministic, so a replay must give the recorded numbers bit for bit, and the
// evaluations counted at a stop by the budget equal the budget). The curve is the harness's
// FILLING scenario (Ec = 0.1 eV, η = 0.8, Γtip/Γsub = 10: the simulation's own parameters).
import { afterAll, describe, expect, it } from "vitest";
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { FIT_DEFAULTS } from "../../lib/index.ts";
import { TIME_LIMIT_WARNING } from "../../lib/cli/commands/fit.ts";
import { analyzeCurveFile } from "../../lib/cli/analyzeCurveFile.ts";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "./harness.ts";

afterAll(removeTempDirs);

describe("dotspec fit --max-evaluations N, and analyze --replay of its record", () => {
  const dir = tempDir();
  const filling = writeCurve(join(dir, "filling.csv"), FILLING, "fast");

  it("a fit within its default budget records the budget, no stop and no time-limit warning, and replays to the same numbers", async () => {
    const r = await run(["fit", filling, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(0);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.work.maxEvaluations).toBe(FIT_DEFAULTS.maxEvaluations);
    expect(rec.work.stoppedBy).toBeNull();
    expect(rec.work.timeLimitMs).toBeNull();
    expect(rec.work.evaluations).toBeGreaterThan(0);
    expect(rec.warnings).not.toContain(TIME_LIMIT_WARNING);
    const saved = join(dir, "fit-default.json");
    writeFileSync(saved, r.stdout);
    const replay = await run(["analyze", "--replay", saved]);
    expect(replay.stdout).toContain("the numbers match");
    expect(replay.code).toBe(0);
  }, 120_000);

  it("a fit cut short by its budget stops at exactly N evaluations, says so, is not good, and replays to the same numbers", async () => {
    const out = join(dir, "fits");
    const r = await run(["fit", filling, "--eta", "0.8", "--json", "--out", out, "--max-evaluations", "30"]);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.work).toEqual({ evaluations: 30, maxEvaluations: 30, timeLimitMs: null, stoppedBy: "budget" });
    expect(rec.warnings.join(" ")).toMatch(/work budget of 30 model evaluations \(the same on every machine\)/);
    expect(rec.warnings).not.toContain(TIME_LIMIT_WARNING);
    expect(rec.status).not.toBe("good");
    expect(rec.provenance.options.fit).toEqual({ maxEvaluations: 30 });
    const replay = await run(["analyze", "--replay", join(out, "filling.fit.json")]);
    expect(replay.stdout).toContain("the numbers match");
    expect(replay.code).toBe(0);
    // The replay runs with the budget the record names (work.maxEvaluations), not today's default:
    // the same record without the option as given still replays to the same numbers.
    const edited = { ...rec, provenance: { ...rec.provenance, options: { ...rec.provenance.options, fit: {} } } };
    const path = join(dir, "fit-budget-no-option.json");
    writeFileSync(path, JSON.stringify(edited));
    const again = await run(["analyze", "--replay", path]);
    expect(again.stdout).toContain("the numbers match");
    // … and a record whose numbers were changed does not match (the replay can fail).
    const tampered = join(dir, "fit-tampered.json");
    writeFileSync(tampered, JSON.stringify({ ...rec, rateRatio: rec.rateRatio * 2 }));
    const bad = await run(["analyze", "--replay", tampered]);
    expect(bad.stdout).toMatch(/1 of \d+ values differ.*rateRatio/);
    expect(bad.code).toBe(1);
    expect(JSON.parse(readFileSync(join(out, "filling.fit.json"), "utf8")).work.stoppedBy).toBe("budget");
  }, 120_000);

  it("only a time limit asked for gives the machine-dependence warning", async () => {
    const r = await run(["fit", filling, "--eta", "0.8", "--json", "--time-limit-ms", "1"]);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.work.timeLimitMs).toBe(1);
    expect(rec.work.stoppedBy).toBe("time");
    expect(rec.warnings).toContain(TIME_LIMIT_WARNING);
    expect(rec.status).not.toBe("good");
  }, 60_000);

  it("refuses a budget that is not a whole number of at least 1", async () => {
    for (const bad of ["0", "2.5", "-3", "many"]) {
      const r = await run(["fit", filling, "--eta", "0.8", "--max-evaluations", bad]);
      expect(r.code).not.toBe(0);
      expect(r.stderr).toContain("--max-evaluations");
    }
  }, 60_000);

  it("an analysis' model comparison records its budget, and --replay re-runs it with that budget to the same numbers", async () => {
    const { json } = analyzeCurveFile(filling, { analyze: { eta: 0.8 }, read: {}, compareModels: "all", maxEvaluations: 200 });
    expect(json.modelComparison?.work).toEqual({ evaluations: 200, maxEvaluations: 200, timeLimitMs: null, stoppedBy: "budget" });
    expect(json.modelComparison?.status).not.toBe("good");
    // The record without the option as given: the replay still takes the budget from the record's work.
    const path = join(dir, "comparison-budget.json");
    writeFileSync(path, JSON.stringify({ ...json, provenance: { ...json.provenance, options: { ...json.provenance!.options, maxEvaluations: undefined } } }));
    const replay = await run(["analyze", "--replay", path]);
    expect(replay.stdout).toContain("the numbers match");
    expect(replay.code).toBe(0);
  }, 120_000);
});
