// Brent's one-dimensional minimisation in a bracket. Expected values: closed forms (the vertex of
// a parabola, the minimum of cos at π, the kink of |x − c|) and the method's defining property
// (parabolic steps converge on a smooth minimum in far fewer evaluations than golden-section
// search, whose bracket shrinks by 0.618 per evaluation: R. P. Brent, Algorithms for
// Minimization without Derivatives, Prentice-Hall 1973, ch. 5).
import { describe, expect, it } from "vitest";
import { brentMinimize } from "../../lib/util/brentMinimize.ts";
import { expectClose } from "../helpers/expectClose.ts";

describe("brentMinimize", () => {
  it("finds the vertex of a parabola (closed form: x = 2, f = 1) in a few evaluations", () => {
    const m = brentMinimize((x) => (x - 2) ** 2 + 1, 0, 5, 1, 2, 1e-9, 100);
    // A smooth minimum is located to about √ε·|x| (closed form: f changes by (δx)², below one
    // unit in the last place of f when δx < 1e-8).
    expectClose(m.x, 2, { atol: 2e-8 });
    expectClose(m.fx, 1, { atol: 1e-15 });
    // At a tolerance above that floor, parabolic steps need a handful of evaluations where
    // golden-section search needs ln(1e-6/5)/ln(0.618) ≈ 32 for this bracket.
    const quick = brentMinimize((x) => (x - 2) ** 2 + 1, 0, 5, 1, 2, 1e-6, 100);
    expectClose(quick.x, 2, { atol: 2e-6 });
    expect(quick.evaluations).toBeLessThan(12);
  });

  it("finds cos's minimum at π in [3, 4] (closed form)", () => {
    const m = brentMinimize(Math.cos, 3, 4, 3.5, Math.cos(3.5), 1e-10, 100);
    expectClose(m.x, Math.PI, { atol: 3e-8 });
    expectClose(m.fx, -1, { atol: 1e-15 });
  });

  it("ends at a kink, where no parabola fits, by golden-section steps (closed form: |x − 0.3| is least at 0.3)", () => {
    const m = brentMinimize((x) => Math.abs(x - 0.3), -1, 2, 1, 0.7, 1e-7, 200);
    expectClose(m.x, 0.3, { atol: 3e-7 });
  });

  it("stays in the bracket when the minimum lies at its end (closed form: x on [1, 3] is least at 1)", () => {
    const m = brentMinimize((x) => x, 1, 3, 1.5, 1.5, 1e-8, 200);
    expect(m.x).toBeGreaterThanOrEqual(1);
    expectClose(m.x, 1, { atol: 1e-7 });
  });

  it("stops at its evaluation limit, and treats NaN as worse than any number", () => {
    const m = brentMinimize((x) => (x > 2.5 ? NaN : (x - 2) ** 2), 0, 5, 1, 1, 1e-12, 5);
    expect(m.evaluations).toBe(5);
    expect(Number.isNaN(m.fx)).toBe(false);
  });
});
