// dotspec simulate, run in-process: the CSV it writes, its round trip through analyze, and its
// errors (unreadable or invalid JSON, invalid scenario naming the key).
import { describe, it, expect, afterAll } from "vitest";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { expectClose } from "../helpers/expectClose.ts";
import type { AnalysisJson } from "../../lib/index.ts";
import { chargingPeakV, FILLING, removeTempDirs, run, tempDir } from "./harness.ts";

afterAll(removeTempDirs);

function scenarioFile(scenario: unknown, name = "scenario.json"): string {
  const path = join(tempDir(), name);
  writeFileSync(path, JSON.stringify(scenario, null, 2));
  return path;
}

describe("dotspec simulate --config SCENARIO.json --out CURVE.csv", () => {
  it("writes bias and current with the header `bias (V),current (A)` after the `# key: value` metadata lines, one row per bias point; stdout stays empty", async () => {
    const config = scenarioFile(FILLING);
    const out = join(tempDir(), "curve.csv");
    const r = await run(["simulate", "--config", config, "--out", out, "--method", "fast"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toBe("");
    const lines = readFileSync(out, "utf8").trimEnd().split("\n").filter((l) => !l.startsWith("# "));
    expect(lines[0]).toBe("bias (V),current (A)");
    // Points of the sweep: (toV − fromV)/stepV + 1 = 2.8/0.002 + 1 = 1401 (closed form).
    expect(lines).toHaveLength(1 + 1401);
    expect(Number(lines[1].split(",")[0])).toBe(-1.2);
    expect(Number(lines.at(-1)!.split(",")[0])).toBe(1.6);
  });

  it("prints one summary line on stderr: points and noise", async () => {
    const out = join(tempDir(), "curve.csv");
    const r = await run(["simulate", "--config", scenarioFile(FILLING), "--out", out, "--method", "fast"]);
    const lines = r.stderr.trimEnd().split("\n");
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^dotspec: wrote .*curve\.csv: 1401 points .* noise σ = .* A \(0\.3 % of full scale, seed 7\)$/);
  });

  it("--dIdV adds the column `dI/dV (S)`", async () => {
    const out = join(tempDir(), "curve.csv");
    expect((await run(["simulate", "--config", scenarioFile(FILLING), "--out", out, "--dIdV", "--method", "fast"])).code).toBe(0);
    const lines = readFileSync(out, "utf8").split("\n").filter((l) => !l.startsWith("# "));
    expect(lines[0]).toBe("bias (V),current (A),dI/dV (S)");
    expect(lines[1].split(",")).toHaveLength(3);
  });

  it("the same seed gives the same file", async () => {
    const config = scenarioFile(FILLING);
    const a = join(tempDir(), "a.csv");
    const b = join(tempDir(), "b.csv");
    await run(["simulate", "--config", config, "--out", a, "--method", "fast"]);
    await run(["simulate", "--config", config, "--out", b, "--method", "fast"]);
    expect(readFileSync(a, "utf8")).toBe(readFileSync(b, "utf8"));
  });

  it("writes a curve that analyze reads back, with the peaks at (ε + Ec(n + ½))/η (closed form of orthodox theory: Beenakker, Phys. Rev. B 44, 1646 (1991))", async () => {
    const out = join(tempDir(), "dot.csv");
    expect((await run(["simulate", "--config", scenarioFile(FILLING), "--out", out])).code).toBe(0);
    const r = await run(["analyze", out, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(0);
    const [j] = JSON.parse(r.stdout) as AnalysisJson[];
    const s = j.multiplets.find((m) => m.label === "s")!;
    expectClose(s.peaksV, [chargingPeakV(0.5, 0), chargingPeakV(0.5, 1)], { atol: 0.003, what: "s peaks" });
  });
});

describe("dotspec simulate: errors", () => {
  it("an unknown scenario key → exit 2, the message names the key", async () => {
    const out = join(tempDir(), "x.csv");
    const r = await run(["simulate", "--config", scenarioFile({ ...FILLING, chargingEnergyMeV: 100 }), "--out", out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^dotspec: .*scenario\.json: invalid scenario: .*"chargingEnergyMeV"/);
    expect(existsSync(out)).toBe(false);
  });

  it("a missing or out-of-range key → exit 2 naming it", async () => {
    const { eta: _eta, ...noEta } = FILLING;
    expect((await run(["simulate", "--config", scenarioFile(noEta), "--out", join(tempDir(), "x.csv")])).stderr).toMatch(/scenario\.eta is missing/);
    const r = await run(["simulate", "--config", scenarioFile({ ...FILLING, eta: 1.5 }), "--out", join(tempDir(), "x.csv")]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/scenario\.eta must be in \(0, 1\]/);
  });

  it("invalid JSON → exit 2 with the parser's reason; a missing file → exit 1", async () => {
    const bad = join(tempDir(), "bad.json");
    writeFileSync(bad, "{ cb: [ }");
    const r = await run(["simulate", "--config", bad, "--out", join(tempDir(), "x.csv")]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/bad\.json: not valid JSON/);
    const missing = await run(["simulate", "--config", join(tempDir(), "none.json"), "--out", join(tempDir(), "x.csv")]);
    expect(missing.code).toBe(1);
    expect(missing.stderr).toMatch(/none\.json: cannot be read \(no such file\)/);
  });

  it.each([
    [["simulate", "--out", "x.csv"], /required option '--config/],
    [["simulate", "--config", "s.json"], /required option '--out/],
    [["simulate", "--config", "s.json", "--out", "x.csv", "--method", "slow"], /--method.*'slow'.*exact, fast/],
    [["simulate", "--config", "s.json", "--out", "s.json"], /--out s\.json is the scenario file/],
  ])("usage error %j → exit 2", async (argv, message) => {
    const r = await run(argv as string[]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });
});
