// summaryRow: the columns of summary.csv and where each value comes from in the JSON record.
import { describe, it, expect } from "vitest";
import { analysisToJson, formatCsv, summaryRow, SUMMARY_COLUMNS } from "../../lib/index.ts";
import { simulatedAnalysis } from "./fixture.ts";

describe("summaryRow(json)", () => {
  const { analysis } = simulatedAnalysis();
  const json = analysisToJson(analysis);
  const row = summaryRow(json);

  it("SUMMARY_COLUMNS are the columns of summary.csv, in order (the CLI specification of `analyze --out`)", () => {
    expect([...SUMMARY_COLUMNS]).toEqual([
      "source", "regime", "gap_V", "gap_sigma_V", "Ec_V", "Ec_sigma_V", "single_particle_gap_V", "dSP_V", "dSP_sigma_V",
      "eta", "gap_eV", "Ec_eV", "single_particle_gap_eV", "dSP_eV", "n_peaks", "n_warnings",
    ]);
    expect(Object.keys(row)).toEqual([...SUMMARY_COLUMNS]);
  });

  it("copies each value from its field of the record (bias-referred V, energies eV, counts)", () => {
    expect(row).toEqual({
      source: json.source,
      regime: json.regime,
      gap_V: json.gapV,
      gap_sigma_V: json.uncertainties.gapV,
      Ec_V: json.chargingEnergyV,
      Ec_sigma_V: json.uncertainties.chargingEnergyV,
      single_particle_gap_V: json.singleParticleGapV,
      dSP_V: json.levelSpacingSPV,
      dSP_sigma_V: json.uncertainties.levelSpacingSPV,
      eta: json.energies.eta,
      gap_eV: json.energies.gapEV,
      Ec_eV: json.energies.chargingEnergyEV,
      single_particle_gap_eV: json.energies.singleParticleGapEV,
      dSP_eV: json.energies.levelSpacingSPEV,
      n_peaks: json.peaks.length,
      n_warnings: json.warnings.length,
    });
  });

  it("a null quantity becomes an empty CSV cell (formatCsv writes null as empty, lib/io/formatCsv.ts)", () => {
    const csv = formatCsv([{ ...row, Ec_V: null }], SUMMARY_COLUMNS);
    const [header, line] = csv.trimEnd().split("\n");
    expect(header).toBe(SUMMARY_COLUMNS.join(","));
    expect(line.split(",")[SUMMARY_COLUMNS.indexOf("Ec_V")]).toBe("");
  });
});
