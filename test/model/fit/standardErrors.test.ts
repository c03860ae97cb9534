// standardErrors checked against the closed form of ordinary least squares for a straight line
// y = a + b·x at unit noise: SE(b) = 1/√Sxx, SE(a) = √(Σx²/(n·Sxx)), Sxx = Σ(x − x̄)² (W. H. Press,
// S. A. Teukolsky, W. T. Vetterling and B. P. Flannery, Numerical Recipes, 3rd ed., Cambridge
// University Press, 2007, §15.2).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { standardErrors } from "../../../lib/model/fit/standardErrors.ts";

const x = [0, 1, 2, 3, 4, 5, 6];
const n = x.length;
const mean = x.reduce((s, v) => s + v, 0) / n;
const sxx = x.reduce((s, v) => s + (v - mean) ** 2, 0);
const sx2 = x.reduce((s, v) => s + v * v, 0);
const line = (q: number[]) => Float64Array.from(x, (v) => q[0] + q[1] * v);

describe("standardErrors(model, q, steps, reducedChiSquare, warnings)", () => {
  it("gives the closed-form standard errors of a straight-line fit (Numerical Recipes §15.2)", () => {
    const se = standardErrors(line, [1, 2], [1e-3, 1e-3], 1, []);
    expectClose(se, [Math.sqrt(sx2 / (n * sxx)), 1 / Math.sqrt(sxx)], { rtol: 1e-9 });
  });

  it("scales them by √χ²_red when χ²_red > 1 and not below 1 (closed form: √4 = 2)", () => {
    const base = standardErrors(line, [1, 2], [1e-3, 1e-3], 1, []);
    expectClose(standardErrors(line, [1, 2], [1e-3, 1e-3], 4, []), base.map((s) => 2 * s), { rtol: 1e-12 });
    expectClose(standardErrors(line, [1, 2], [1e-3, 1e-3], 0.25, []), base, { rtol: 1e-12 });
  });

  it("gives NaN to a parameter that does not change the model (a zero column of J) and the closed form to the others, with a warning", () => {
    // Closed form: a zero column decouples from the rest of JᵀJ, so the line's errors are those
    // of the line alone (Numerical Recipes §15.2).
    const warnings: string[] = [];
    const se = standardErrors((q) => line(q).map((v) => v + 0 * q[2]), [1, 2, 3], [1e-3, 1e-3, 1e-3], 1, warnings);
    expect(Number.isNaN(se[2])).toBe(true);
    expectClose(se.slice(0, 2), [Math.sqrt(sx2 / (n * sxx)), 1 / Math.sqrt(sxx)], { rtol: 1e-9 });
    expect(warnings.join(" ")).toMatch(/not determined.*1 of them/);
  });

  it("returns NaN for every parameter when two columns are the same (singular JᵀJ with no zero column)", () => {
    // Closed form: a + b·x + c·x has JᵀJ of rank 2; b and c are not separately determined.
    const warnings: string[] = [];
    const se = standardErrors((q) => Float64Array.from(x, (v) => q[0] + (q[1] + q[2]) * v), [1, 2, 3], [1e-3, 1e-3, 1e-3], 1, warnings);
    expect(se.every((s) => Number.isNaN(s))).toBe(true);
    expect(warnings.join(" ")).toMatch(/singular/);
  });
});
