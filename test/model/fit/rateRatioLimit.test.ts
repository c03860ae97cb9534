// The one-sided limit on Γtip/Γsub where the fit runs onto a bound of it. Curves simulated by the
// master equation far beyond the bounds (r = 10⁵ and 10⁻⁶) must be fitted onto the bound with a
// limit the truth satisfies: a one-sided 95 % limit from Δχ² = 1.645² = 2.71 (closed form: 1.645
// is the one-sided 95 % point of the normal distribution), which must lie inside the regime the
// truth is in; a ratio the curve does determine (r = 6) gets no limit.
import { describe, it, expect } from "vitest";
import { fitCurve, FIT_DEFAULTS } from "../../../lib/model/fit/fitCurve.ts";
import { simulateCurve } from "../../../lib/model/simulate.ts";
import { analyzeCurve } from "../../../lib/pipeline/analyzeCurve.ts";
import { REGIME_LIMITS } from "../../../lib/model/regimeLimits.ts";

const eta = 0.85;
function fitAt(rateRatio: number) {
  const substrateRatePerS = 2e8;
  const sim = simulateCurve({
    cb: [{ energyEV: 0.45, degeneracy: 2 }, { energyEV: 0.78, degeneracy: 6 }],
    vb: [{ energyEV: -0.62, degeneracy: 2 }, { energyEV: -0.85, degeneracy: 4 }],
    chargingEnergyEV: 0.12,
    eta,
    tipRatePerS: rateRatio * substrateRatePerS,
    substrateRatePerS,
    temperatureK: 4.5,
    broadeningEV: 0.012,
    bias: { fromV: -2.2, toV: 2.3, stepV: 0.0025 },
    noise: { relative: 0.003, seed: 3 },
  });
  return fitCurve(analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta }));
}

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
