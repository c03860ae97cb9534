// formatUncertain: value ± σ with σ to two significant digits and the value rounded to the same
// place (common practice, no source); the examples are worked by hand from that rule.
import { describe, expect, it } from "vitest";
import { formatEta, formatUncertain, FORMAT_UNCERTAIN_DEFAULTS } from "../../lib/report/formatUncertain.ts";

describe("formatUncertain(value, sigma)", () => {
  it("FORMAT_UNCERTAIN_DEFAULTS is locked", () => {
    expect(FORMAT_UNCERTAIN_DEFAULTS).toEqual({ digits: 2, maxDecimals: 3 });
  });
  it("rounds σ to two significant digits and the value to the same decimal place", () => {
    expect(formatUncertain(142.31, 1.84)).toBe("142.3 ± 1.8");
    expect(formatUncertain(3055.42, 13)).toBe("3055 ± 13");
    expect(formatUncertain(216.2437, 0.27)).toBe("216.24 ± 0.27");
  });
  it("keeps at most maxDecimals decimals", () => {
    expect(formatUncertain(1.23456, 0.00001)).toBe("1.235 ± 0.000");
  });
  it("writes the value alone (one decimal) without a usable σ", () => {
    expect(formatUncertain(12.34, null)).toBe("12.3");
    expect(formatUncertain(12.34, NaN)).toBe("12.3");
  });
});

describe("formatEta", () => {
  it("shows η to four significant digits, a hand-typed value as typed (common practice, no source)", () => {
    expect(formatEta(0.8)).toBe("0.8");
    expect(formatEta(0.62)).toBe("0.62");
    expect(formatEta(0.640419766586274)).toBe("0.6404");
    expect(formatEta(0.99995)).toBe("1");
  });
});
