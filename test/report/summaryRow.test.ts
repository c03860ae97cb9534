// summaryRow: the columns of summary.csv and where each value comes from in the JSON record.
import { describe, it, expect } from "vitest";
import { analysisToJson, formatCsv, summaryRow, SUMMARY_COLUMNS } from "../../lib/index.ts";
import { simulatedAnalysis } from "./fixture.ts";
import { FILLING, chargingPeakV } from "../cli/harness.ts";
import { expectClose } from "../helpers/expectClose.ts";

describe("summaryRow(json)", () => {
  const { analysis } = simulatedAnalysis();
  const json = analysisToJson(analysis);
  const row = summaryRow(json);

  it("gives the fit's one-sided limit where Γtip/Γsub ran onto a bound: model_rate_ratio is the limit, no σ, model_rate_ratio_limit says which side", () => {
    const fitted = { status: "good", regime: "shell-filling", quantities: { gapEV: null, chargingEnergyEV: { value: 0.12, standardError: 0.001 }, levelSpacingSPEV: null }, decides: true };
    const bounded = summaryRow({ ...json, modelComparison: { ...fitted, rateRatio: { value: 1e4, standardError: Infinity }, rateRatioLimit: { kind: "lower", rateRatio: 917, chiSquareRise: 2.71 } } } as unknown as typeof json);
    expect(bounded).toMatchObject({ model_rate_ratio: 917, model_rate_ratio_sigma: null, model_rate_ratio_limit: "lower", model_regime: "shell-filling" });
    const measured = summaryRow({ ...json, modelComparison: { ...fitted, rateRatio: { value: 6.1, standardError: 0.3 }, rateRatioLimit: null } } as unknown as typeof json);
    expect(measured).toMatchObject({ model_rate_ratio: 6.1, model_rate_ratio_sigma: 0.3, model_rate_ratio_limit: null });
  });

  it("SUMMARY_COLUMNS are the columns of summary.csv, in order (the CLI specification of `analyze --out`)", () => {
    expect([...SUMMARY_COLUMNS]).toEqual([
      "source", "regime", "gap_V", "gap_sigma_V", "Ec_V", "Ec_sigma_V", "single_particle_gap_V", "dSP_V", "dSP_sigma_V",
      "eta", "gap_eV", "Ec_eV", "single_particle_gap_eV", "dSP_eV", "n_peaks", "n_warnings",
      "status", "reason", "n_notes", "tool_version", "input_bytes", "input_sha256", "options",
    ]);
    expect(Object.keys(row)).toEqual([...SUMMARY_COLUMNS]);
  });

  it("holds the dot's numbers: gap, Ec and Δsp of the simulated scenario, in V and in eV (closed forms of orthodox theory)", () => {
    // Closed form (C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)): the (n+1)-th carrier on a
    // level ε appears at ±(|ε| + Ec(n + ½))/η. So gap = s₁ − v₁ = (εs − εv + Ec)/η,
    // Ec in bias = Ec/η, Δsp = (p₁ − s₂) − Ec/η = (εp − εs)/η; energies are η × bias values.
    const { eta, chargingEnergyEV: ec } = FILLING;
    const [s, p] = FILLING.cb.map((l) => l.energyEV);
    const v = FILLING.vb[0].energyEV;
    const gapV = chargingPeakV(s, 0) - chargingPeakV(v, 0);
    expectClose(gapV, (s - v + ec) / eta, { rtol: 1e-12, what: "closed form of the gap" });
    const tol = { rtol: 0, atol: 0.01 }; // 10 mV: a few peak σ at 0.3 % noise (README, Accuracy)
    expect(row.source).toBe("dot-filling.csv");
    expect(row.regime).toBe("shell-filling");
    expectClose(row.gap_V as number, gapV, { ...tol, what: "gap_V" });
    expectClose(row.Ec_V as number, ec / eta, { ...tol, what: "Ec_V" });
    expectClose(row.dSP_V as number, (p - s) / eta, { ...tol, what: "dSP_V" });
    expectClose(row.single_particle_gap_V as number, gapV - ec / eta, { ...tol, what: "single_particle_gap_V" });
    expect(row.eta).toBe(eta);
    expectClose(row.gap_eV as number, eta * (row.gap_V as number), { rtol: 1e-12, what: "gap_eV = η·gap_V" });
    expectClose(row.Ec_eV as number, ec, { atol: eta * tol.atol, what: "Ec_eV" });
    expectClose(row.dSP_eV as number, p - s, { atol: eta * tol.atol, what: "dSP_eV" });
    for (const k of ["gap_sigma_V", "Ec_sigma_V", "dSP_sigma_V"] as const) {
      expect(row[k] as number, k).toBeGreaterThan(0);
      expect(row[k] as number, k).toBeLessThan(tol.atol);
    }
  });

  it("a null quantity becomes an empty CSV cell (formatCsv writes null as empty, lib/io/formatCsv.ts)", () => {
    const csv = formatCsv([{ ...row, Ec_V: null }], SUMMARY_COLUMNS);
    const [header, line] = csv.trimEnd().split("\n");
    expect(header).toBe(SUMMARY_COLUMNS.join(","));
    expect(line.split(",")[SUMMARY_COLUMNS.indexOf("Ec_V")]).toBe("");
  });
});
