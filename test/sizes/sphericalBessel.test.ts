// Spherical Bessel functions against their closed forms (Abramowitz & Stegun, Handbook of
// Mathematical Functions, Dover 1965, 10.1.11 for j_0…j_2 and 10.2.15 for k_0…k_2 (the latter
// up to the constant factor π/2, which the scaled function leaves out).
import { describe, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { sphericalBesselJ, scaledModifiedSphericalBesselK } from "../../lib/sizes/sphericalBessel.ts";

const j0 = (x: number) => Math.sin(x) / x;
const j1 = (x: number) => Math.sin(x) / x ** 2 - Math.cos(x) / x;
const j2 = (x: number) => (3 / x ** 3 - 1 / x) * Math.sin(x) - (3 / x ** 2) * Math.cos(x);
const j3 = (x: number) => (15 / x ** 4 - 6 / x ** 2) * Math.sin(x) - (15 / x ** 3 - 1 / x) * Math.cos(x);
// closed form: j_0' = (x cos x − sin x)/x²; j_1' = j_0 − 2 j_1/x
const j0p = (x: number) => (x * Math.cos(x) - Math.sin(x)) / x ** 2;
const j1p = (x: number) => j0(x) - (2 / x) * j1(x);

describe("sphericalBesselJ(l, x)", () => {
  it("matches the closed forms of j_0…j_3 for x from 1.5 to 20 (A&S 10.1.11)", () => {
    for (const x of [1.5, 2.7, 4.493409457909064, 7.1, 12.3, 20]) {
      expectClose(sphericalBesselJ(0, x).value, j0(x), { rtol: 1e-13, atol: 1e-15, what: `j0(${x})` });
      expectClose(sphericalBesselJ(1, x).value, j1(x), { rtol: 1e-12, atol: 1e-15, what: `j1(${x})` });
      expectClose(sphericalBesselJ(2, x).value, j2(x), { rtol: 1e-11, atol: 1e-14, what: `j2(${x})` });
    }
    for (const x of [3.5, 6, 9.9]) expectClose(sphericalBesselJ(3, x).value, j3(x), { rtol: 1e-10, atol: 1e-14, what: `j3(${x})` });
  });

  it("uses the small-x limit x^l/(2l+1)!! (closed form) where the recurrence would cancel", () => {
    expectClose(sphericalBesselJ(3, 1e-3).value, 1e-9 / 105, { rtol: 1e-6 });
    expectClose(sphericalBesselJ(0, 0).value, 1, { rtol: 0 });
    expectClose(sphericalBesselJ(2, 0).value, 0, { atol: 0 });
  });

  it("is continuous where it switches from series to recurrence (x = l, closed form on both sides)", () => {
    for (const l of [2, 3]) {
      const f = [j0, j1, j2, j3][l];
      expectClose(sphericalBesselJ(l, l - 1e-9).value, f(l - 1e-9), { rtol: 1e-8 });
      expectClose(sphericalBesselJ(l, l + 1e-9).value, f(l + 1e-9), { rtol: 1e-8 });
    }
  });

  it("derivatives match the closed forms of j_0' and j_1'", () => {
    for (const x of [0.3, 1.2, 3.3, 8.8]) {
      expectClose(sphericalBesselJ(0, x).slope, j0p(x), { rtol: 1e-9, atol: 1e-14, what: `j0'(${x})` });
      expectClose(sphericalBesselJ(1, x).slope, j1p(x), { rtol: 1e-9, atol: 1e-14, what: `j1'(${x})` });
    }
    expectClose(sphericalBesselJ(1, 0).slope, 1 / 3, { rtol: 1e-15, what: "j1'(0) = 1/3 (series)" });
  });

  it("refuses a non-integer order", () => {
    expectError(() => sphericalBesselJ(1.5, 1), "options/not-integer", "l");
  });
});

describe("scaledModifiedSphericalBesselK(l, x)", () => {
  // closed forms (A&S 10.2.15 × 2/π × eˣ): K_0 = 1/x, K_1 = 1/x + 1/x², K_2 = 1/x + 3/x² + 3/x³
  const K = [(x: number) => 1 / x, (x: number) => 1 / x + 1 / x ** 2, (x: number) => 1 / x + 3 / x ** 2 + 3 / x ** 3];
  // derivative of eˣ·k_l: K_l + eˣ·k_l'; closed form for l = 0: 1/x − 1/x − 1/x² = −1/x²
  it("matches the closed forms of K_0…K_2", () => {
    for (const x of [0.01, 0.5, 2, 30]) {
      for (let l = 0; l < 3; l++) expectClose(scaledModifiedSphericalBesselK(l, x).value, K[l](x), { rtol: 1e-13, what: `K${l}(${x})` });
      expectClose(scaledModifiedSphericalBesselK(0, x).slope, -1 / x ** 2, { rtol: 1e-13, what: `K0'(${x})` });
      // K_1' = −1/x² − 2/x³ (closed form, derivative of 1/x + 1/x²)
      expectClose(scaledModifiedSphericalBesselK(1, x).slope, -1 / x ** 2 - 2 / x ** 3, { rtol: 1e-12, what: `K1'(${x})` });
    }
  });

  it("refuses x ≤ 0", () => {
    expectError(() => scaledModifiedSphericalBesselK(0, 0), "options/not-positive", "x");
  });
});
