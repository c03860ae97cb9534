// Header cells taken apart. Expected names, units and roles are by construction of the input,
// following the header conventions of the brief (common practice, no source).
import { describe, expect, it } from "vitest";
import { readColumnHeader } from "../../lib/io/readColumnHeader.ts";

const cases: [string, string, string | null, string][] = [
  // header, name, unit text, role
  ["bias (mV)", "bias", "mV", "bias"],
  ["Current [pA]", "Current", "pA", "current"],
  ["bias_V", "bias", "V", "bias"],
  ["current_nA", "current", "nA", "current"],
  ["Bias/V", "Bias", "V", "bias"],
  ["I/nA", "I", "nA", "current"],
  ["U [mV]", "U", "mV", "bias"],
  ["sample bias (V)", "sample bias", "V", "bias"],
  ["Voltage", "Voltage", null, "bias"],
  ["V", "V", null, "bias"],
  ["Vbias", "Vbias", null, "bias"],
  ["I", "I", null, "current"],
  ["It (A)", "It", "A", "current"],
  ["I_t", "I_t", null, "current"],
  ["I2 (nA)", "I2", "nA", "current"],
  ["Current fwd [pA]", "Current fwd", "pA", "current"],
  ["Current [bwd] (pA)", "Current [bwd]", "pA", "current"],
  ["dI/dV (nS)", "dI/dV", "nS", "conductance"],
  ["didv_S", "didv", "S", "conductance"],
  ["G (uS)", "G", "uS", "conductance"],
  ["G/nA/V", "G", "nA/V", "conductance"],
  ["conductance (pS)", "conductance", "pS", "conductance"],
  ["Lock-in X (V)", "Lock-in X", "V", "conductance"],
  ["z (nm)", "z", "nm", "other"],
  ["time (s)", "time", "s", "other"],
  ["time_s", "time_s", null, "other"],
  ["Index", "Index", null, "other"],
  ["(dI/dV)/(I/V)", "(dI/dV)/(I/V)", null, "other"],
  ["I/V", "I/V", null, "other"],
  ["", "", null, "other"],
];

describe("readColumnHeader", () => {
  for (const [header, name, unitText, role] of cases) {
    it(`readColumnHeader(${JSON.stringify(header)}) → name ${JSON.stringify(name)}, unit ${unitText}, role ${role}`, () => {
      const h = readColumnHeader(header);
      expect(h.name).toBe(name);
      expect(h.unitText).toBe(unitText);
      expect(h.role).toBe(role);
    });
  }

  it("readColumnHeader(text) keeps an unknown bracketed unit for the caller to report (Bias (kV))", () => {
    // by construction of the input
    expect(readColumnHeader("Bias (kV)")).toMatchObject({ name: "Bias", unitText: "kV", role: "bias" });
  });

  it("readColumnHeader(text) unquotes and trims", () => {
    // by construction of the input
    expect(readColumnHeader('  "Bias (V)" ')).toMatchObject({ header: "Bias (V)", unitText: "V", role: "bias" });
  });

  it("readColumnHeader('Tip bias (V)') flags a tip bias", () => {
    // the project's convention (README, Conventions): dotspec reads bias as sample bias
    expect(readColumnHeader("Tip bias (V)").tipBias).toBe(true);
    expect(readColumnHeader("sample bias (V)").tipBias).toBe(false);
  });
});
