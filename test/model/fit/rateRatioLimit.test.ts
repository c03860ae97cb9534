// The one-sided limit on Γtip/Γsub where the fit runs onto a bound of it. Curves simulated by the
// master equation far beyond the bounds (r = 10⁵ and 10⁻⁶) must be fitted onto the bound with a
// limit the truth satisfies: a one-sided 95 % limit from Δχ² = 1.645² = 2.71 (closed form: 1.645
// is the one-sided 95 % point of the normal distribution), which must lie inside the regime the
// truth is in; a ratio the curve does determine (r = 6) gets no limit.
import { describe, it, expect } from "vitest";
import { fitCurve, FIT_DEFAULTS } from "../../../lib/model/fit/fitCurve.ts";
import { twoShellAnalysis, substrateRatePerS } from "../../helpers/twoShellDot.ts";
import { REGIME_LIMITS } from "../../../lib/model/regimeLimits.ts";

const fitAt = (rateRatio: number) => fitCurve(twoShellAnalysis(rateRatio * substrateRatePerS));

describe("rateRatioLimit (through fitCurve)", () => {
  it("deep shell filling (r = 10⁵): Γtip/Γsub on the upper bound, a lower limit between 1.5 and the truth, shell filling, good", () => {
    const fit = fitAt(1e5);
    expect(fit.rateRatio.value).toBeCloseTo(1e4, -2);
    expect(fit.rateRatioLimit?.kind).toBe("lower");
    expect(fit.rateRatioLimit!.rateRatio).toBeGreaterThan(REGIME_LIMITS.fillingRateRatioMin);
    expect(fit.rateRatioLimit!.rateRatio).toBeLessThan(1e5);
    expect(fit.rateRatioLimit!.chiSquareRise).toBe(FIT_DEFAULTS.rateRatioLimitChiSquare);
    expect(fit).toMatchObject({ regime: "shell-filling", status: "good" });
    expect(fit.chargingEnergyEV.value).toBeCloseTo(0.12, 2);
  });
  it("deep shell tunnelling (r = 10⁻⁶): on the lower bound, an upper limit between the truth and 3/7, shell tunnelling, good", () => {
    const fit = fitAt(1e-6);
    expect(fit.rateRatioLimit?.kind).toBe("upper");
    expect(fit.rateRatioLimit!.rateRatio).toBeLessThan(REGIME_LIMITS.tunnelingRateRatioMax);
    expect(fit.rateRatioLimit!.rateRatio).toBeGreaterThan(1e-6);
    expect(fit).toMatchObject({ regime: "shell-tunneling", status: "good" });
  });
  it("no limit where the curve determines the ratio (r = 6)", () => {
    const fit = fitAt(6);
    expect(fit.rateRatioLimit).toBeNull();
    expect(fit.rateRatio.value / 6).toBeGreaterThan(1 / 1.5);
    expect(fit.rateRatio.value / 6).toBeLessThan(1.5);
  });
});
