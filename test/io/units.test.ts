// Scale factors checked against mathjs unit conversions (general-purpose reference library, pinned
// at mathjs 15.2.0) and the SI prefixes (BIPM, The International System of Units, 9th ed. 2019,
// Table 7: m = 1e-3, µ = 1e-6, n = 1e-9, p = 1e-12, f = 1e-15).
import { describe, expect, it } from "vitest";
import { create, all } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { isDotspecError } from "../../lib/util/errors.ts";
import {
  ACCEPTED_UNITS,
  BIAS_UNITS,
  CONDUCTANCE_UNITS,
  CURRENT_UNITS,
  findUnit,
  parseUnit,
  toSI,
  type Quantity,
} from "../../lib/io/units.ts";

const math = create(all);
const SI: Record<Quantity, string> = { bias: "V", current: "A", conductance: "S" };
/** mathjs writes micro as "u" only. */
const forMathjs = (u: string) => u.replace(/^[µμ]/, "u");

function thrown(f: () => unknown): unknown {
  try {
    f();
  } catch (e) {
    return e;
  }
  throw new Error("expected an error");
}

describe("units", () => {
  it("BIAS_UNITS, CURRENT_UNITS, CONDUCTANCE_UNITS list the units of the brief", () => {
    // the project's accepted list (by construction of the module's contract)
    expect([...BIAS_UNITS].sort()).toEqual(["V", "mV", "uV", "µV", "μV"].sort());
    expect([...CURRENT_UNITS].sort()).toEqual(["A", "fA", "mA", "nA", "pA", "uA", "µA", "μA"].sort());
    for (const u of ["S", "mS", "µS", "μS", "uS", "nS", "pS", "A/V", "mA/V", "µA/V", "uA/V", "nA/V", "pA/V"]) {
      expect(CONDUCTANCE_UNITS).toContain(u);
    }
    expect(ACCEPTED_UNITS.bias).toBe(BIAS_UNITS);
  });

  it("parseUnit(u).scale equals mathjs's unit(1, u).toNumber(SI) for every accepted unit", () => {
    for (const q of ["bias", "current", "conductance"] as const) {
      for (const u of ACCEPTED_UNITS[q]) {
        const info = parseUnit(u, q);
        expect(info.quantity).toBe(q);
        expect(info.caseFolded).toBe(false);
        // mathjs unit conversion (reference library)
        const ref = math.unit(1, forMathjs(u)).toNumber(SI[q]);
        expectClose(info.scale, ref, { rtol: 1e-15, what: `${u} in ${SI[q]}` });
        expectClose(info.scale, 10 ** info.exponent, { rtol: 1e-15, what: `${u} exponent` });
      }
    }
  });

  it("parseUnit accepts both micro signs U+00B5 and U+03BC and the letter u", () => {
    // SI prefix definition: micro = 1e-6 (BIPM SI Brochure, 9th ed., Table 7)
    for (const u of ["\u00b5A", "\u03bcA", "uA"]) expectClose(parseUnit(u).scale, 1e-6);
    expect(parseUnit("\u00b5A").unit).toBe("\u00b5A");
    expect(parseUnit("\u03bcA").unit).toBe("\u03bcA");
  });

  it("parseUnit('pA') is 1e-12 A and parseUnit('nA/V') is 1e-9 S", () => {
    // mathjs unit conversion (reference library)
    expectClose(parseUnit("pA").scale, math.unit(1, "pA").toNumber("A"));
    expectClose(parseUnit("nA/V").scale, math.unit(1, "nA/V").toNumber("S"));
    expect(parseUnit("nA/V").quantity).toBe("conductance");
  });

  it("findUnit(text, quantity) reads a case-only variant (mv, PA) when unambiguous, and flags it", () => {
    // common practice (no source): instrument headers often write units in one letter case
    const mv = findUnit("mv", "bias");
    expect(mv?.unit).toBe("mV");
    expect(mv?.caseFolded).toBe(true);
    expect(findUnit("PA", "current")?.unit).toBe("pA");
    expect(findUnit(" nA ")?.unit).toBe("nA");
  });

  it("findUnit returns null for units that are not accepted (kV, nm, s, arb.)", () => {
    // by construction of the accepted list
    for (const u of ["kV", "nm", "arb.", "", "V/A", "Hz"]) expect(findUnit(u)).toBeNull();
    expect(findUnit("s", "current")).toBeNull();
    expect(findUnit("mV", "current")).toBeNull();
  });

  it("parseUnit(text, quantity) throws io/unknown-unit naming the text and listing the accepted units", () => {
    const e = thrown(() => parseUnit("kV", "bias", "option biasUnit"));
    expect(isDotspecError(e)).toBe(true);
    const err = e as { code: string; message: string };
    expect(err.code).toBe("io/unknown-unit");
    expect(err.message).toContain('"kV"');
    expect(err.message).toContain("option biasUnit");
    for (const u of BIAS_UNITS) expect(err.message).toContain(u);
  });

  it("parseUnit('mV', 'current') says that mV is a bias unit", () => {
    const e = thrown(() => parseUnit("mV", "current")) as { code: string; message: string };
    expect(e.code).toBe("io/unknown-unit");
    expect(e.message).toContain("it is a bias unit");
  });

  it("toSI(value, unit) divides by the exact power of ten (1.25 mV → 0.00125 V)", () => {
    // SI prefix definition (BIPM SI Brochure, 9th ed.); the double nearest to 0.00125 is Number("0.00125")
    expect(toSI(1.25, parseUnit("mV"))).toBe(Number("0.00125"));
    expect(toSI(-3.5, parseUnit("pA"))).toBe(Number("-3.5e-12"));
    expectClose(toSI(-3.3, parseUnit("pA")), -3.3e-12, { rtol: 2 ** -52 });
    expect(toSI(7, parseUnit("A"))).toBe(7);
  });
});
