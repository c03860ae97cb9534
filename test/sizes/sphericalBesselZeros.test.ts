// Zeros of j_l against Abramowitz & Stegun, Handbook of Mathematical Functions (Dover, 1965),
// Table 10.6 (6 decimals), and the closed form x_n0 = nπ.
import { describe, expect, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { sphericalBesselZero } from "../../lib/sizes/sphericalBesselZeros.ts";
import { sphericalBesselJ } from "../../lib/sizes/sphericalBessel.ts";

describe("sphericalBesselZero(l, n)", () => {
  it("gives the A&S Table 10.6 zeros: x_10 = π, x_11 = 4.493409, x_12 = 5.763459, x_20 = 2π, x_21 = 7.725252", () => {
    expectClose(sphericalBesselZero(0, 1), Math.PI, { rtol: 1e-15, what: "x_10 (closed form π)" });
    expectClose(sphericalBesselZero(1, 1), 4.493409, { atol: 5e-7, what: "x_11 (A&S 10.6)" });
    expectClose(sphericalBesselZero(2, 1), 5.763459, { atol: 5e-7, what: "x_12 (A&S 10.6)" });
    expectClose(sphericalBesselZero(0, 2), 2 * Math.PI, { rtol: 1e-15, what: "x_20 (closed form 2π)" });
    expectClose(sphericalBesselZero(1, 2), 7.725252, { atol: 5e-7, what: "x_21 (A&S 10.6)" });
  });

  it("gives E1P/E1S = (x_11/π)² = 2.0457 (A&S 10.6 values)", () => {
    expectClose((sphericalBesselZero(1, 1) / Math.PI) ** 2, 2.0457, { atol: 5e-5 });
  });

  it("x_n0 = nπ for n = 1…3 (closed form: j_0 = sin x / x)", () => {
    for (const n of [1, 2, 3]) expectClose(sphericalBesselZero(0, n), n * Math.PI, { rtol: 1e-14 });
  });

  it("for l = 0…3, n = 1…3 the zeros are roots of j_l, increase with n and with l (interlacing, A&S 10.1)", () => {
    for (let l = 0; l <= 3; l++) {
      let previous = 0;
      for (let n = 1; n <= 3; n++) {
        const x = sphericalBesselZero(l, n);
        expect(Math.abs(sphericalBesselJ(l, x).value)).toBeLessThan(1e-14);
        expect(x).toBeGreaterThan(previous);
        if (l > 0) expect(x).toBeGreaterThan(sphericalBesselZero(l - 1, n));
        previous = x;
      }
    }
  });

  it("refuses l or n out of range", () => {
    expectError(() => sphericalBesselZero(0, 0), "options/not-integer", "n");
    expectError(() => sphericalBesselZero(-1, 1), "options/not-integer", "l");
  });
});
