// fitVerdict: the regime of a fitted rate ratio read through the closed-form step ratio
// r/(1 + r) of the second CB charging step over the first (E. Bonet, M. M. Deshmukh and
// D. C. Ralph, Phys. Rev. B 65, 045317 (2002); derivation in lib/model/regimeLimits.ts).
import { describe, it, expect } from "vitest";
import { fitVerdict } from "../../../lib/model/fit/fitVerdict.ts";
import { FIT_DEFAULTS } from "../../../lib/model/fit/fitCurve.ts";

describe("fitVerdict(rateRatio, reducedChiSquare, limits)", () => {
  it("reads the regime from a one-sided limit where the rate ratio ran onto a bound, when the limit lies inside one regime", () => {
    const lower = (rateRatio: number) => ({ kind: "lower" as const, rateRatio, chiSquareRise: 2.71 });
    const upper = (rateRatio: number) => ({ kind: "upper" as const, rateRatio, chiSquareRise: 2.71 });
    // r ≥ 917: every r allowed is ≥ 1.5, shell filling; r ≤ 1.6e-4: every r allowed is ≤ 3/7, shell tunnelling.
    expect(fitVerdict(1e4, 1, FIT_DEFAULTS, Infinity, lower(917))).toMatchObject({ regime: "shell-filling" });
    expect(fitVerdict(1e4, 1, FIT_DEFAULTS, Infinity, lower(917)).regimeReason).toContain("Γtip/Γsub ≥ 917");
    expect(fitVerdict(1e-4, 1, FIT_DEFAULTS, Infinity, upper(1.6e-4)).regime).toBe("shell-tunneling");
    // A limit that reaches past the boundary (r ≥ 1.2 allows intermediate) leaves the error to decide: none finite, undetermined.
    expect(fitVerdict(1e4, 1, FIT_DEFAULTS, Infinity, lower(1.2)).regime).toBe("undetermined");
  });
  it("calls shell filling where the second step is ≥ 60 % of the first (r ≥ 1.5, closed form 0.6/(1 − 0.6))", () => {
    // + 1e-12: 0.6/(1 − 0.6) rounds to 1.4999999999999998 in floating point.
    expect(fitVerdict(0.6 / (1 - 0.6) + 1e-12, 1, FIT_DEFAULTS).regime).toBe("shell-filling");
    expect(fitVerdict(20, 1, FIT_DEFAULTS).regime).toBe("shell-filling");
  });

  it("calls shell tunnelling where it is ≤ 30 % (r ≤ 3/7, closed form 0.3/(1 − 0.3)), intermediate in between", () => {
    expect(fitVerdict(0.3 / (1 - 0.3) - 1e-12, 1, FIT_DEFAULTS).regime).toBe("shell-tunneling");
    expect(fitVerdict(0.01, 1, FIT_DEFAULTS).regime).toBe("shell-tunneling");
    expect(fitVerdict(1, 1, FIT_DEFAULTS).regime).toBe("intermediate");
  });

  it("warns only when the reduced χ² exceeds poorFitChiSquare", () => {
    expect(fitVerdict(10, FIT_DEFAULTS.poorFitChiSquare, FIT_DEFAULTS).warning).toBeNull();
    expect(fitVerdict(10, 2 * FIT_DEFAULTS.poorFitChiSquare, FIT_DEFAULTS).warning).toMatch(/reduced χ² = 20\.0/);
  });

  it("says undetermined when the 2σ range of Γtip/Γsub reaches both regimes, or has no finite error (closed form: r·10^(±2·SE))", () => {
    // r = 0.8 with SE(log₁₀ r) = 0.2: 2σ range 0.8/10^0.4 = 0.318 … 0.8·10^0.4 = 2.01, across 3/7 and 1.5.
    const wide = fitVerdict(0.8, 1, FIT_DEFAULTS, 0.2);
    expect(wide.regime).toBe("undetermined");
    expect(wide.regimeReason).toMatch(/0\.32–2\.0/);
    // SE 0.05: range 0.635 … 1.01, inside the intermediate band.
    expect(fitVerdict(0.8, 1, FIT_DEFAULTS, 0.05).regime).toBe("intermediate");
    // r = 3 with SE 0.3: range 0.75 … 12 reaches only the filling side: the value decides.
    expect(fitVerdict(3, 1, FIT_DEFAULTS, 0.3).regime).toBe("shell-filling");
    expect(fitVerdict(3, 1, FIT_DEFAULTS, Number.NaN).regime).toBe("undetermined");
  });
});
