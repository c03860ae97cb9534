// numberOption: the parser behind --eta, --order, --window-mv, --min-step-sigma, --jobs.
// Expected values are derived from the inputs by construction: this is the project's own interface, with no outside reference value to name.
import { describe, it, expect } from "vitest";
import { InvalidArgumentError } from "commander";
import { numberOption } from "../../lib/cli/optionValue.ts";

describe("numberOption(rule)(raw)", () => {
  const eta = numberOption({ min: 0, minExclusive: true, max: 1, accepted: "a number in (0, 1]" });
  it("returns the number inside the range, ends included where the rule says", () => {
    expect(eta("0.85")).toBe(0.85);
    expect(eta("1")).toBe(1);
    expect(eta("1e-3")).toBe(0.001);
  });
  it.each(["0", "-0.1", "1.0001", "abc", "", " ", "NaN", "Infinity"])("rejects %j with the accepted range", (raw) => {
    expect(() => eta(raw)).toThrow(InvalidArgumentError);
    expect(() => eta(raw)).toThrow("expected a number in (0, 1].");
  });
  it("integer rules reject fractions; a word is passed through", () => {
    const order = numberOption({ min: 2, max: 4, integer: true, accepted: "2 to 4" });
    expect(order("3")).toBe(3);
    expect(() => order("3.5")).toThrow(InvalidArgumentError);
    const windowMV = numberOption({ min: 0, minExclusive: true, word: "auto", accepted: "mV or auto" });
    expect(windowMV("auto")).toBe("auto");
    expect(windowMV("30")).toBe(30);
  });
});
