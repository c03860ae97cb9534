// `dotspec fit`: curves simulated by the model in closed-form-known regimes (harness FILLING and
// TUNNELING; Ec = 0.1 eV, η = 0.8, Γtip/Γsub = 10 and 0.01) are fitted; the model issue's bar is
// Ec within 3 % and the rate ratio within a factor 1.5.
import { afterAll, describe, expect, it } from "vitest";
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { expectClose } from "../helpers/expectClose.ts";
import { FILLING, TUNNELING, removeTempDirs, run, tempDir, writeCurve } from "./harness.ts";

afterAll(removeTempDirs);

describe("dotspec fit FILE... --eta η", () => {
  const dir = tempDir();
  const filling = writeCurve(join(dir, "filling.csv"), FILLING, "exact");
  const tunneling = writeCurve(join(dir, "tunneling.csv"), TUNNELING, "exact");

  it("--json prints one record per file with Ec, the rate ratio, the levels and χ² (keys of the model issue)", async () => {
    const r = await run(["fit", filling, tunneling, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(0);
    const records = JSON.parse(r.stdout);
    expect(records).toHaveLength(2);
    const [f, t] = records;
    for (const rec of records) for (const key of ["source", "chargingEnergyV", "rateRatio", "levelsV", "reducedChiSquare", "peakBased"]) expect(rec).toHaveProperty(key);
    expectClose(f.energies.chargingEnergyEV.value, 0.1, { rtol: 0.03, what: "Ec, filling" });
    expectClose(f.chargingEnergyV, 0.1 / 0.8, { rtol: 0.03, what: "Ec/η in bias" });
    expect(f.rateRatio).toBeGreaterThan(10 / 1.5);
    expect(f.rateRatio).toBeLessThan(10 * 1.5);
    expect(f.regime).toBe("shell-filling");
    expect(t.rateRatio).toBeGreaterThan(0.01 / 1.5);
    expect(t.rateRatio).toBeLessThan(0.01 * 1.5);
    expect(t.regime).toBe("shell-tunneling");
    // Levels referred to bias: ε/η (closed form from the scenario).
    expectClose(f.levelsV.CB, [0.5 / 0.8, 0.8 / 0.8], { atol: 0.01 });
    expectClose(f.levelsV.VB, [-0.6 / 0.8], { atol: 0.01 });
    expect(f.residuals.biasV.length).toBe(f.residuals.residualA.length);
    // A good fit's residuals are the noise: no window sums to a run far beyond a normal tail
    // (the fit's 5 σ rule, closed form of the normal distribution); the window lies in the data.
    expect(f.residualStructure.largestZ).toBeLessThan(5);
    expect(f.residualStructure.windowPoints).toBeGreaterThan(1);
    expect(f.residualStructure.atBiasV).toBeGreaterThanOrEqual(Math.min(...f.residuals.biasV));
    expect(f.residualStructure.atBiasV).toBeLessThanOrEqual(Math.max(...f.residuals.biasV));
  });

  it("prints a readable report and writes DIR/<name>.fit.json and the figure DIR/<name>.fit.svg with --out", async () => {
    const out = join(dir, "fits");
    const r = await run(["fit", filling, "--eta", "0.8", "--out", out]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Γtip\/Γsub/);
    expect(r.stdout).toMatch(/model fit: good/);
    expect(r.stdout).toMatch(/Quantities \(eV\) +fit +peaks/);
    expect(existsSync(join(out, "filling.fit.json"))).toBe(true);
    expect(JSON.parse(readFileSync(join(out, "filling.fit.json"), "utf8")).source).toBe(filling);
    const svg = readFileSync(join(out, "filling.fit.svg"), "utf8");
    expect(svg.startsWith("<svg")).toBe(true);
    expect(svg).toContain("filling.csv  —  measured curve and model");
    expect(svg).toContain("residual, data − fitted model");
  });

  it("a fit cut short by its time limit says so and keeps the peak-based result; its status, not convergence, sets the exit code", async () => {
    const r = await run(["fit", filling, "--eta", "0.8", "--json", "--time-limit-ms", "1"]);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.converged).toBe(false);
    expect(rec.message).toMatch(/time limit/);
    expect(rec.peakBased.regime).toBe("shell-filling");
    expect(["good", "poor", "failed"]).toContain(rec.status);
    expect(r.code).toBe(rec.status === "failed" ? 1 : 0);
  });

  it("an intermediate dot (Γtip/Γsub = 1) that the peak rules leave undetermined gets a status with reasons, never a silent collapse", async () => {
    // The crossover case: the assignment gives no CB ladder, so the single-level model cannot
    // describe the curve; the fit must say so (status failed: "NO FIT", exit 1) or, if a start
    // does describe it, give a determined Ec (closed form: 0.1 eV in the scenario).
    const mid = writeCurve(join(dir, "mid.csv"), { ...FILLING, tipRatePerS: 1e8, substrateRatePerS: 1e8 }, "fast");
    const r = await run(["fit", mid, "--eta", "0.8", "--json"]);
    const [rec] = JSON.parse(r.stdout);
    expect(rec.statusReasons.length).toBeGreaterThan(0);
    if (rec.status === "failed") {
      expect(r.code).toBe(1);
      expect(r.stderr).toMatch(/mid\.csv: no fit \(/);
    } else {
      expectClose(rec.energies.chargingEnergyEV.value, 0.1, { rtol: 0.1, what: "Ec of a fit that claims success" });
    }
    expect(rec.alternatives.length).toBeGreaterThan(1); // the rate-ratio grid was tried
    const text = await run(["fit", mid, "--eta", "0.8"]);
    if (rec.status === "failed") expect(text.stdout).toMatch(/NO FIT/);
  });

  it("a missing file fails alone (exit 1); a bad option is a usage error (exit 2)", async () => {
    const r = await run(["fit", join(dir, "missing.csv"), filling, "--eta", "0.8", "--json"]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/missing\.csv/);
    expect(JSON.parse(r.stdout)).toHaveLength(1);
    expect((await run(["fit", filling, "--eta", "2"])).code).toBe(2);
  });
});
