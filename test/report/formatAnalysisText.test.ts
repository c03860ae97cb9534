// formatAnalysisText: the readable report of `dotspec analyze`.
import { describe, it, expect } from "vitest";
import { analysisToJson, analyzeCurve, formatAnalysisText, FORMAT_TEXT_DEFAULTS, NO_MULTIPLET, type AnalysisJson } from "../../lib/index.ts";
import { simulatedAnalysis } from "./fixture.ts";

const { analysis } = simulatedAnalysis("dots/dot-07.csv");
const base = analysisToJson(analysis);

/** The record with Ec set to the example of the CLI specification: 142.3 ± 1.8 mV at η = 0.85. */
function withExampleEc(): AnalysisJson {
  const j = structuredClone(base);
  j.chargingEnergyV = 0.1423;
  j.uncertainties.chargingEnergyV = 0.0018;
  j.energies.eta = 0.85;
  j.energies.etaGiven = true;
  j.energies.chargingEnergyEV = 0.1423 * 0.85; // 120.955 meV: energy = η × bias (definition of η: energy = η × bias)
  j.energies.uncertainties.chargingEnergyEV = 0.0018 * 0.85; // 1.53 meV
  return j;
}

describe("formatAnalysisText(json)", () => {
  it("FORMAT_TEXT_DEFAULTS are locked", () => {
    expect(FORMAT_TEXT_DEFAULTS).toEqual({ color: false, indent: "  ", biasDecimals: 4, uncertaintyDigits: 2, maxDecimals: 3, missing: "—" });
  });

  it("prints Ec bias-referred and in meV after η as in the specification: `Ec = 142.3 ± 1.8 mV  →  121.0 ± 1.5 meV (η = 0.85)`", () => {
    // Two significant digits of σ, value rounded to the same place: common practice (no source).
    expect(formatAnalysisText(withExampleEc())).toMatch(/\n {4}Ec +=  *142\.3 ± 1\.8 mV  →  121\.0 ± 1\.5 meV \(η = 0\.85\)\n/);
  });

  it("starts with a header line naming the file, the regime and η", () => {
    const first = formatAnalysisText(base).split("\n")[0];
    expect(first).toBe("dots/dot-07.csv  ·  shell filling  ·  η = 0.8");
  });

  it("says when η was not given (energies then equal bias values, η = 1: lib/assign defaults)", () => {
    const j = structuredClone(base);
    j.energies.eta = 1;
    j.energies.etaGiven = false;
    expect(formatAnalysisText(j).split("\n")[0]).toContain("η = 1 (not given: energies equal bias values)");
  });

  it("has one peak row per peak with bias in V (4 decimals), and the multiplet label", () => {
    const text = formatAnalysisText(base);
    for (const p of base.peaks) {
      const row = text.split("\n").find((l) => l.includes(` ${p.biasV.toFixed(4)} `));
      expect(row, `row of the peak at ${p.biasV}`).toBeDefined();
      expect(row!.trimEnd().endsWith(p.multiplet ?? NO_MULTIPLET)).toBe(true);
    }
  });

  it("calls a peak in no multiplet by the figure legend's word, and lists the charging satellites set aside", () => {
    const j: AnalysisJson = structuredClone(base);
    j.peaks[0].multiplet = null;
    j.peaks[0].role = "satellite";
    j.evidence.satellitePeaksV = [j.peaks[0].biasV];
    const text = formatAnalysisText(j);
    const row = text.split("\n").find((l) => l.includes(` ${j.peaks[0].biasV.toFixed(4)} `))!;
    // The one word, shared with the figure's legend (project convention, by construction).
    expect(NO_MULTIPLET).toBe("no multiplet");
    expect(row.trimEnd().endsWith("no multiplet")).toBe(true);
    expect(text).not.toMatch(/\bsatellite\s*$/m);
    expect(text).toContain(`set aside as charging satellites (no multiplet): ${j.peaks[0].biasV.toFixed(4)} V`);
  });

  it("lists each multiplet with found/expected (s of shell filling: 2/2, spin degeneracy of the s level)", () => {
    expect(formatAnalysisText(base)).toMatch(/\n {4}CB +s +2\/2 /);
  });

  it("writes a quantity the regime does not define as — with the reason (Ec in shell tunnelling: one peak per level, so no charging ladder to read Ec from)", () => {
    const j = structuredClone(base);
    j.regime = "shell-tunneling";
    j.chargingEnergyV = null;
    j.energies.chargingEnergyEV = null;
    expect(formatAnalysisText(j)).toMatch(/\n {4}Ec += — \(not measurable in shell tunnelling\)\n/);
  });

  it("lists every warning", () => {
    const j = structuredClone(base);
    j.warnings = ["first warning", "second warning"];
    const text = formatAnalysisText(j);
    expect(text).toContain("Warnings (2)");
    expect(text).toContain("! first warning\n");
    expect(text).toContain("! second warning\n");
  });

  it("has no control codes unless color is asked for", () => {
    expect(formatAnalysisText(base)).not.toMatch(/\x1b/);
    expect(formatAnalysisText(base, { color: true })).toMatch(/\x1b\[1m/);
  });
});

describe("formatAnalysisText(json) for a curve without dot levels", () => {
  it("prints 'No levels found' with the reason, and no gap (closed form input: an ohmic curve I = V/R, R = 1 GΩ)", () => {
    const biasV = Float64Array.from({ length: 1001 }, (_, i) => -2 + 0.004 * i);
    const currentA = biasV.map((v, i) => v / 1e9 + 1e-12 * Math.sin(i * 2.3)); // a deterministic wiggle as noise
    const curve = { biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "ohmic.csv", metadata: {} } };
    const json = analysisToJson(analyzeCurve(curve, { eta: 0.8 }));
    expect(json.noLevels).not.toBeNull();
    const text = formatAnalysisText(json);
    expect(text).toContain(`No levels found: ${json.noLevels!.reason}`);
    expect(json.gapV).toBeNull();
  });
});
