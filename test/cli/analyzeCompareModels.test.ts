// dotspec analyze --compare-models: the orthodox model fitted with every grouping of the peaks on
// the curves the rules leave undetermined (or on all). Curves simulated with the project's model
// at known parameters; the expected Ec and Γtip/Γsub are the scenario's own (closed form of the
// simulation), within the bar (Ec within 3 %, Γtip/Γsub within × 1.5; common practice
// (no source) for what "recovered" means).
import { csvParse } from "d3-dsv";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { formatCurveCsv, MODEL_SUMMARY_COLUMNS, simulateCurve, type AnalysisJson } from "../../lib/index.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";
import { FILLING, removeTempDirs, run, tempDir, writeCurve } from "./harness.ts";

// The example dot at Γtip/Γsub = 1: charging and level steps both show, the rules say undetermined.
const CROSSOVER = Object.freeze({ ...EXAMPLE_SCENARIO, tipRatePerS: 1e9, substrateRatePerS: 1e9 });
// At Γtip/Γsub = 1.8 the rules name shell filling, but the s doublet's second step is
// r/(1 + r) = 0.64 of the first (closed form, orthodox theory: C. W. J. Beenakker, Phys. Rev. B 44,
// 1646 (1991)), inside the crossover band 0.2–0.7, and p's last charging step is too weak to be
// found: the rules are not decisive.
const NEAR_FILLING = Object.freeze({ ...EXAMPLE_SCENARIO, tipRatePerS: 1.8e9, substrateRatePerS: 1e9 });

let dir: string;
let crossover: string;
let filling: string;
let nearFilling: string;
beforeAll(() => {
  dir = tempDir();
  nearFilling = join(dir, "near-filling.csv");
  writeFileSync(nearFilling, `# eta: ${NEAR_FILLING.eta}\n` + formatCurveCsv(simulateCurve(NEAR_FILLING, { method: "fast", conductance: false })));
  crossover = join(dir, "crossover.csv");
  writeFileSync(crossover, `# eta: ${CROSSOVER.eta}\n` + formatCurveCsv(simulateCurve(CROSSOVER, { method: "fast", conductance: false })));
  filling = writeCurve(join(dir, "filling.csv"), FILLING);
});
afterAll(removeTempDirs);

describe("dotspec analyze --compare-models", () => {
  let records: AnalysisJson[];
  beforeAll(async () => {
    const r = await run(["analyze", crossover, filling, "--compare-models", "--json"]);
    expect(r.code).toBe(0);
    records = JSON.parse(r.stdout);
  }, 120_000);

  it("fits the curve the rules leave undetermined: intermediate, Ec within 3 % and Γtip/Γsub within × 1.5 of the simulated dot", () => {
    const [rec] = records;
    expect(rec.regime).toBe("undetermined");
    const m = rec.modelComparison!;
    expect(m.scope).toBe("undecided");
    expect(m.ranBecause).toEqual(["the rules left the regime undetermined"]);
    expect(m.status).toBe("good");
    expect(m.regime).toBe("intermediate");
    // A good fit where the rules have no answer gives the record's answer.
    expect(m.decides).toBe(true);
    expect(m.agreesWithRules).toBe(false);
    expect(m.decision).toMatch(/stands by the fit \(intermediate\)/);
    expect(Math.abs(m.quantities.chargingEnergyEV!.value - CROSSOVER.chargingEnergyEV)).toBeLessThan(0.03 * CROSSOVER.chargingEnergyEV);
    expect(Math.abs(Math.log(m.rateRatio!.value / (CROSSOVER.tipRatePerS / CROSSOVER.substrateRatePerS)))).toBeLessThan(Math.log(1.5));
    expect(m.rateRatio!.standardError).toBeGreaterThan(0);
    // The comparison is recorded: every grouping with its weight, the winner's weight the largest.
    expect(m.alternatives.length).toBeGreaterThan(1);
    const best = Math.max(...m.alternatives.map((a) => a.weight));
    expect(m.alternatives.some((a) => a.hypothesis === m.hypothesis && a.weight === best)).toBe(true);
    expect(rec.provenance!.options).toMatchObject({ compareModels: "undecided" });
  });

  it("fits a curve the rules name but do not decide (Γtip/Γsub = 1.8), says why, and stands by the good fit: Ec within 3 % and Γtip/Γsub within × 1.5 of the simulated dot", async () => {
    const r = await run(["analyze", nearFilling, "--compare-models", "--json"]);
    expect(r.code).toBe(0);
    const rec = (JSON.parse(r.stdout) as AnalysisJson[])[0];
    // The record only gains fields: the top level stays the rules' reading.
    expect(rec.regime).toBe("shell-filling");
    const m = rec.modelComparison!;
    expect(m.ranBecause!.some((x) => /within the crossover band/.test(x))).toBe(true);
    expect(m.status).toBe("good");
    expect(m.regime).toBe("shell-filling");
    expect(Math.abs(m.quantities.chargingEnergyEV!.value - NEAR_FILLING.chargingEnergyEV)).toBeLessThan(0.03 * NEAR_FILLING.chargingEnergyEV);
    expect(Math.abs(Math.log(m.rateRatio!.value / 1.8))).toBeLessThan(Math.log(1.5));
    expect(m.agreesWithRules).toBe(true);
    expect(m.decides).toBe(true);
    const text = await run(["analyze", nearFilling, "--compare-models"]);
    expect(text.stdout).toContain("the rules are not decisive");
    expect(text.stdout).toMatch(/why: the second CB step is 0\.\d\d × the first/);
    expect(text.stdout).toContain("the fit decides: the record stands by the fit");
  }, 120_000);

  it("--max-evaluations bounds the comparison's fits exactly (the same stop on every machine) and is refused without --compare-models", async () => {
    const r = await run(["analyze", crossover, "--compare-models", "--max-evaluations", "40", "--json"]);
    expect(r.code).toBe(0);
    const m = (JSON.parse(r.stdout) as AnalysisJson[])[0].modelComparison!;
    // exact: the budget is a count, and a fit cut short by it is never `good`
    expect(m.work).toMatchObject({ maxEvaluations: 40, stoppedBy: "budget" });
    expect(m.work!.evaluations).toBeLessThanOrEqual(40);
    expect(m.status).not.toBe("good");
    expect(m.decides).toBe(false);
    const usage = await run(["analyze", crossover, "--max-evaluations", "40"]);
    expect(usage.code).toBe(2);
    expect(usage.stderr).toContain("add --compare-models");
  }, 120_000);

  it("leaves a curve the rules decide alone, and fits it too with --compare-models all", async () => {
    expect(records[1].regime).toBe("shell-filling");
    expect(records[1].modelComparison).toBeUndefined();
    const r = await run(["analyze", filling, "--compare-models", "all", "--json", "--eta", String(FILLING.eta)]);
    expect(r.code).toBe(0);
    const m = (JSON.parse(r.stdout) as AnalysisJson[])[0].modelComparison!;
    expect(m.scope).toBe("all");
    expect(m.ranBecause![0]).toMatch(/every curve is fitted/);
    expect(m.regime).toBe("shell-filling");
    expect(Math.abs(m.quantities.chargingEnergyEV!.value - FILLING.chargingEnergyEV)).toBeLessThan(0.03 * FILLING.chargingEnergyEV);
  }, 120_000);

  it("adds nothing without the option: no modelComparison, no model columns", async () => {
    const out = join(tempDir(), "plain");
    const r = await run(["analyze", crossover, "--json", "--out", out]);
    expect(r.code).toBe(0);
    expect("modelComparison" in (JSON.parse(r.stdout) as AnalysisJson[])[0]).toBe(false);
    const header = readFileSync(join(out, "summary.csv"), "utf8").split("\n")[0].split(",");
    for (const c of MODEL_SUMMARY_COLUMNS) expect(header).not.toContain(c);
  }, 60_000);

  it("puts the fit's regime, status, Ec and Γtip/Γsub in summary.csv, shows the block in the report, and replays to the same numbers", async () => {
    const out = join(tempDir(), "report");
    const r = await run(["analyze", crossover, filling, "--compare-models", "--out", out, "--json"]);
    expect(r.code).toBe(0);
    const rows = csvParse(readFileSync(join(out, "summary.csv"), "utf8"));
    expect(rows[0].model_regime).toBe("intermediate");
    expect(rows[0].model_status).toBe("good");
    expect(Number(rows[0].model_Ec_eV)).toBeCloseTo(CROSSOVER.chargingEnergyEV, 2);
    expect(rows[0].model_decides).toBe("yes"); // the rules left it undetermined; a good fit decides
    expect(rows[1].model_regime).toBe(""); // the filling curve was not fitted
    const text = await run(["analyze", crossover, "--compare-models"]);
    expect(text.stdout).toContain("Model comparison");
    expect(text.stdout).toMatch(/intermediate, fit good/);
    const replay = await run(["analyze", "--replay", join(out, "crossover.json")]);
    expect(replay.stdout).toContain("the numbers match");
    expect(replay.code).toBe(0);
  }, 180_000);

  it("keeps the analysis of a curve the fit cannot start on, with a comparison that says why (status failed)", async () => {
    // One CB level and no VB in the window (shell tunnelling): the rules form no multiplet, so the
    // fit has nothing to start from (by construction of the scenario).
    const lone = join(dir, "one-level.csv");
    const scenario = { ...EXAMPLE_SCENARIO, cb: [{ energyEV: 0.6, degeneracy: 2 }], vb: [], tipRatePerS: 1e7, bias: { fromV: -0.5, toV: 1.4, stepV: 0.002 } };
    writeFileSync(lone, `# eta: ${scenario.eta}\n` + formatCurveCsv(simulateCurve(scenario, { method: "fast", conductance: false })));
    const r = await run(["analyze", lone, "--compare-models", "--json"]);
    expect(r.code).toBe(0);
    const rec = (JSON.parse(r.stdout) as AnalysisJson[])[0];
    expect(rec.regime).toBe("undetermined");
    expect(rec.modelComparison!.status).toBe("failed");
    expect(rec.modelComparison!.statusReasons[0]).toMatch(/no multiplets to start the fit from/);
    expect(rec.modelComparison!.rateRatio).toBeNull();
    expect(rec.modelComparison!.decides).toBe(false);
    const text = await run(["analyze", lone, "--compare-models"]);
    expect(text.stdout).toContain("NO FIT");
  }, 60_000);

  it("reads a file right after the option as a FILE, not as its scope (the default scope then applies)", async () => {
    // by construction: the same curve and option, the file before and after --compare-models
    const after = await run(["analyze", "--compare-models", crossover, "--json"]);
    expect(after.code).toBe(0);
    const before = await run(["analyze", crossover, "--compare-models", "--json"]);
    const [a, b] = [after, before].map((r) => (JSON.parse(r.stdout) as AnalysisJson[])[0].modelComparison!);
    expect(a.scope).toBe("undecided");
    expect(a.regime).toBe(b.regime);
    expect(a.quantities.chargingEnergyEV).toEqual(b.quantities.chargingEnergyEV);
  }, 120_000);

  it("refuses a scope it does not know (usage error, exit 2)", async () => {
    const r = await run(["analyze", crossover, "--compare-models", "some"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('expected "undecided"');
  });
});
