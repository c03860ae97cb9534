// Expected values: Φ table values (M. Abramowitz and I. A. Stegun, Handbook of Mathematical
// Functions (Dover, 1965), table 26.1); mathjs's erf (general-purpose reference library) for
// Φ(x) = (1 + erf(x/√2))/2; closed forms: Φ(−x) = 1 − Φ(x), Φ'(x) = exp(−x²/2)/√(2π); the
// interpolation error bound derived in the module's notes (h⁴·max|Φ''''|/384 ≈ 8e-13).
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { normalCdfHermite, NORMAL_CDF_HERMITE_DEFAULTS } from "../../lib/util/normalCdfHermite.ts";
import { normalCdf } from "../../lib/util/special.ts";

describe("normalCdfHermite", () => {
  it("locks its defaults", () => {
    expect(NORMAL_CDF_HERMITE_DEFAULTS).toEqual({ step: 1 / 256, reach: 9 });
    expect(Object.isFrozen(NORMAL_CDF_HERMITE_DEFAULTS)).toBe(true);
  });

  it("matches Φ table values (Abramowitz & Stegun 26.1)", () => {
    expectClose(normalCdfHermite(0), 0.5, { atol: 1e-12 });
    expectClose(normalCdfHermite(1), 0.8413447461, { atol: 1e-10 });
    expectClose(normalCdfHermite(-1.96), 0.0249978952, { atol: 1e-10 });
    expectClose(normalCdfHermite(3), 0.998650102, { atol: 1e-10 });
  });

  it("matches mathjs's erf to 1e-11 between and at the nodes over −8.99…8.99 (the error bound derived in the notes)", () => {
    let worst = 0;
    for (let x = -8.99; x < 9; x += 0.000731) worst = Math.max(worst, Math.abs(normalCdfHermite(x) - 0.5 * (1 + (erf(x / Math.SQRT2) as number))));
    expect(worst).toBeLessThan(1e-11);
  });

  it("differs from normalCdf by no more than that function's own error (its erfc approximation, 1.2e-7 relative)", () => {
    for (let x = -6; x <= 6; x += 0.0137) expectClose(normalCdfHermite(x), normalCdf(x), { atol: 1e-15, rtol: 1.3e-7, what: `Φ(${x})` });
  });

  it("is symmetric, Φ(−x) = 1 − Φ(x), to the accuracy of its table (closed form)", () => {
    for (const x of [0.1, 0.77, 1.5, 2.345, 4.2]) expectClose(normalCdfHermite(-x) + normalCdfHermite(x), 1, { atol: 1e-12, what: `x = ${x}` });
  });

  it("has a continuous derivative equal to φ(x): central differences across node boundaries (closed form)", () => {
    const h = NORMAL_CDF_HERMITE_DEFAULTS.step;
    for (const x of [-2 + 1e-9, 0, 0.5 * h, 1.3, 2 * h * 100]) {
      const slope = (normalCdfHermite(x + 1e-6) - normalCdfHermite(x - 1e-6)) / 2e-6;
      expectClose(slope, Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI), { rtol: 1e-5, what: `Φ'(${x})` });
    }
  });

  it("is exactly 0 and 1 beyond its reach and NaN for NaN", () => {
    expect(normalCdfHermite(-9)).toBe(0);
    expect(normalCdfHermite(12)).toBe(1);
    expect(normalCdfHermite(NaN)).toBeNaN();
  });
});
