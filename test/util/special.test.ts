// erfc and Φ checked against mathjs's erf (general-purpose reference library) and against
// table values of Φ (Abramowitz & Stegun, Handbook of Mathematical Functions, table 26.1).
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { erfc, normalCdf, normalCdfFast, gaussianFast, fermi } from "../../lib/util/special.ts";

describe("special functions", () => {
  it("erfc(x) matches 1 − erf(x) from mathjs to 1.2e-7 (relative) over −5…5", () => {
    for (let x = -5; x <= 5; x += 0.0625) {
      const ref = 1 - (erf(x) as number);
      // atol 1e-15: 1 − erf(x) from the reference itself loses digits to cancellation at large x.
      expectClose(erfc(x), ref, { rtol: 1.3e-7, atol: 1e-15, what: `erfc(${x})` });
    }
  });

  it("normalCdf(x) matches Φ table values (Abramowitz & Stegun 26.1)", () => {
    expectClose(normalCdf(0), 0.5, { atol: 1e-7 });
    expectClose(normalCdf(1), 0.8413447461, { atol: 2e-7 });
    expectClose(normalCdf(-1.96), 0.0249978952, { atol: 2e-7 });
    expectClose(normalCdf(3), 0.9986501020, { atol: 2e-7 });
  });

  it("fermi(x) is 1/(1+e^x), symmetric f(x) + f(−x) = 1, and does not overflow (closed form)", () => {
    expectClose(fermi(0), 0.5);
    expectClose(fermi(2) + fermi(-2), 1, { rtol: 1e-15 });
    expectClose(fermi(1), 1 / (1 + Math.E), { rtol: 1e-15 });
    expect(fermi(1000)).toBe(0);
    expect(fermi(-1000)).toBe(1);
  });
});

describe("normalCdfFast", () => {
  it("agrees with normalCdf within 2e-7 absolute over −10…10 (linear interpolation error bound h²/8·max|Φ''| with h = 1/512)", () => {
    for (let x = -10; x <= 10; x += 0.00377) expectClose(normalCdfFast(x), normalCdf(x), { atol: 2e-7, what: `Φ(${x})` });
  });

  it("equals normalCdf to the bit at every node of its table inside its reach, −9 < x < 9 in steps of 1/512 (the upper half is filled by Φ(x) = 1 − Φ(−x), closed form; halving is exact in binary floating point)", () => {
    let differing = 0;
    for (let i = 1; i < 9216; i++) {
      const x = -9 + i / 512;
      if (normalCdfFast(x) !== normalCdf(x)) differing++;
    }
    expect(differing).toBe(0);
  });
});

describe("gaussianFast", () => {
  it("agrees with exp(−z²/2) within 1.2e-7 absolute over −12…12 (closed form; linear interpolation error bound h²/8·max|g''| with h = 1/1024)", () => {
    for (let z = -12; z <= 12; z += 0.000731) expectClose(gaussianFast(z), Math.exp(-0.5 * z * z), { atol: 1.2e-7, what: `exp(−z²/2) at z = ${z}` });
  });

  it("is exact at the table's nodes and at 0, 0 far out and NaN for NaN (closed form)", () => {
    expect(gaussianFast(0)).toBe(1);
    expectClose(gaussianFast(1), Math.exp(-0.5), { rtol: 1e-15 });
    expectClose(gaussianFast(-2), Math.exp(-2), { rtol: 1e-15 });
    expect(gaussianFast(9)).toBe(0);
    expect(gaussianFast(-Infinity)).toBe(0);
    expect(gaussianFast(Number.NaN)).toBeNaN();
  });
});
