// Roots with known closed forms.
import { describe, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { bracketRoot } from "../../lib/sizes/bracketRoot.ts";

describe("bracketRoot(f, a, b)", () => {
  it("finds √2 of x² − 2 on [0, 2] (closed form)", () => {
    expectClose(bracketRoot((x) => x * x - 2, 0, 2), Math.SQRT2, { rtol: 1e-15 });
  });
  it("finds π of sin on [3, 4] with the bracket given backwards (closed form)", () => {
    expectClose(bracketRoot(Math.sin, 4, 3), Math.PI, { rtol: 1e-15 });
  });
  it("finds the root of a steep function, x¹⁵ − 1 on [0, 3] (closed form: 1), where plain regula falsi stalls", () => {
    expectClose(bracketRoot((x) => x ** 15 - 1, 0, 3), 1, { rtol: 1e-14 });
  });
  it("honours an absolute tolerance", () => {
    expectClose(bracketRoot((x) => x - 1 / 3, 0, 1, { absoluteTolerance: 1e-6 }), 1 / 3, { atol: 1e-6 });
  });
  it("refuses a bracket without a sign change", () => {
    expectError(() => bracketRoot((x) => x * x + 1, -1, 1), "sizes/no-bracket", "change sign");
  });
});
