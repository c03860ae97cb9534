// ecProfile: the χ² profile over Ec of a shell-tunnelling fit. profileReading is checked on a
// model linear in its parameter, whose χ² profile is exactly a parabola (hand calculation); the
// stage itself through fitCurve on master-equation curves of a two-shell dot, where each level's
// satellite (charging) step is r/(1 + r) of its first (orthodox theory: E. Bonet, M. M. Deshmukh
// and D. C. Ralph, Phys. Rev. B 65, 045317 (2002); secondToFirstStepRatio).
import { describe, it, expect } from "vitest";
import { EC_PROFILE_DEFAULTS, profileReading } from "../../../lib/model/fit/ecProfile.ts";
import { fitCurve } from "../../../lib/model/fit/fitCurve.ts";
import { secondToFirstStepRatio } from "../../../lib/model/regimeLimits.ts";
import { twoShellAnalysis, substrateRatePerS } from "../../helpers/twoShellDot.ts";

// y = a·x at x = 1, 2, 3 with σ = 0.1: â = Σxy/Σx² and SE(â) = σ/√Σx² (least squares, closed form);
// χ²(a) = χ²(â) + (a − â)²·Σx²/σ² exactly.
const x = [1, 2, 3];
const y = [2.1, 3.9, 6.2];
const sigma = 0.1;
const chi2 = (a: number) => x.reduce((s, xi, i) => s + ((y[i] - a * xi) / sigma) ** 2, 0);
const sxx = 14;
const aHat = 28.5 / sxx; // Σxy = 2.1 + 7.8 + 18.6
const seHat = sigma / Math.sqrt(sxx);

describe("EC_PROFILE_DEFAULTS", () => {
  it("are locked", () => {
    expect(EC_PROFILE_DEFAULTS).toEqual({
      maxSatelliteFraction: 0.05,
      gapFraction: 0.5,
      gridSteps: 10,
      bestFactors: [0.5, 2 / 3, 1.5, 2],
      profileIterations: 6,
      oneSigmaChiSquare: 1,
      undeterminedChiSquare: 3.84,
      farFraction: 0.25,
      moveChiSquare: 1,
      maxBudgetSpent: 0.75,
    });
    expect(Object.isFrozen(EC_PROFILE_DEFAULTS)).toBe(true);
  });
  it("the Δχ² levels are the normal distribution's 1σ (1) and two-sided 95 % (1.96² = 3.84) points (closed form)", () => {
    expect(EC_PROFILE_DEFAULTS.oneSigmaChiSquare).toBe(1 ** 2);
    expect(EC_PROFILE_DEFAULTS.undeterminedChiSquare).toBeCloseTo(1.96 ** 2, 2);
  });
});

describe("profileReading(ecEV, chiSquare, bestEcEV, bestChiSquare, scale)", () => {
  it("on an exact parabola gives the least-squares standard error as its half-width, from points at any distance (hand calculation)", () => {
    expect(aHat).toBeCloseTo(2.0357142857, 9);
    for (const d of [0.01, 0.05, 0.3]) {
      const r = profileReading([aHat - d, aHat + 2 * d], [chi2(aHat - d), chi2(aHat + 2 * d)], aHat, chi2(aHat), 1);
      expect(r.halfWidth).toBeCloseTo(seHat, 12); // 0.1/√14 = 0.026726
    }
  });
  it("scales the Δχ² level by max(1, reduced χ²): the half-width grows by its square root (as the standard errors do)", () => {
    const r = profileReading([aHat - 0.05, aHat + 0.05], [chi2(aHat - 0.05), chi2(aHat + 0.05)], aHat, chi2(aHat), 4);
    expect(r.halfWidth).toBeCloseTo(2 * seHat, 12);
  });
  it("calls a value determined where every point more than 25 % away rises above 3.84, and undetermined where one does not", () => {
    // Parabola of σ 5 meV about 100 meV, and a second minimum at 200 meV whose rise is set by hand.
    const ec = [0.09, 0.11, 0.2];
    const para = (e: number) => ((e - 0.1) / 0.005) ** 2;
    const determined = profileReading(ec, [para(0.09), para(0.11), 3.9], 0.1, 0, 1);
    expect(determined.determined).toBe(true);
    expect(determined.halfWidth).toBeCloseTo(0.005, 12);
    expect([determined.withinLowEV, determined.withinHighEV]).toEqual([0.1, 0.1]);
    const flat = profileReading(ec, [para(0.09), para(0.11), 3.8], 0.1, 0, 1);
    expect(flat.determined).toBe(false);
    expect(flat.withinHighEV).toBe(0.2);
    // … and the same rise scaled by a reduced χ² of 2 is within 2 × 3.84.
    expect(profileReading(ec, [para(0.09), para(0.11), 3.9], 0.1, 0, 2).determined).toBe(false);
  });
  it("a near point within the level does not make the value undetermined; a point that does not rise gives its distance as the half-width", () => {
    const r = profileReading([0.095, 0.2], [0, 100], 0.1, 0, 1);
    expect(r.determined).toBe(true);
    expect(r.halfWidth).toBeCloseTo(0.1 * Math.sqrt(1 / 100), 12); // the far side's parabola: 0.1·√(1/100) = 0.01 > 0.005
    expect(profileReading([0.095], [0], 0.1, 0, 1).halfWidth).toBeCloseTo(0.005, 12);
  });
  it("without points gives a zero half-width and a determined value", () => {
    expect(profileReading([], [], 0.1, 5, 1)).toEqual({ determined: true, halfWidth: 0, withinLowEV: 0.1, withinHighEV: 0.1 });
  });
});

// Curves of the two-shell dot (Ec 0.12 eV, 0.3 % noise) simulated by the master equation.
describe("ecProfile (through fitCurve)", () => {
  it("deep shell tunnelling (r = 10⁻⁶: satellites 10⁻⁴ % of their levels' steps, far below the noise): Ec not determined, said in words, the fit still good", () => {
    expect(secondToFirstStepRatio(1e-6)).toBeLessThan(EC_PROFILE_DEFAULTS.maxSatelliteFraction);
    const fit = fitCurve(twoShellAnalysis(1e-6 * substrateRatePerS));
    expect(fit).toMatchObject({ regime: "shell-tunneling", status: "good" });
    expect(Number.isNaN(fit.chargingEnergyEV.standardError)).toBe(true);
    expect(Number.isNaN(fit.chargingEnergyV.standardError)).toBe(true);
    expect(Number.isFinite(fit.chargingEnergyEV.value)).toBe(true);
    expect(fit.warnings.some((w) => /^Ec not determined: the satellite steps r\/\(1 \+ r\)/.test(w))).toBe(true);
    expect(fit.statusReasons[0]).toMatch(/Ec not determined \(shell tunnelling/);
  });
  it("shell tunnelling with satellites of 1 % (r = 0.01, above the 0.3 % noise): profiled, Ec determined and within its error of the truth", () => {
    expect(secondToFirstStepRatio(0.01)).toBeLessThan(EC_PROFILE_DEFAULTS.maxSatelliteFraction);
    const fit = fitCurve(twoShellAnalysis(0.01 * substrateRatePerS));
    expect(fit).toMatchObject({ regime: "shell-tunneling", status: "good" });
    const ec = fit.chargingEnergyEV;
    expect(Number.isFinite(ec.standardError)).toBe(true);
    expect(Math.abs(ec.value - 0.12)).toBeLessThan(2 * ec.standardError);
    expect(fit.warnings.some((w) => /Ec not determined/.test(w))).toBe(false);
  });
  it("satellites of 17 % (r = 0.2) place Ec: the profile is not run and Ec keeps its curvature error", () => {
    expect(secondToFirstStepRatio(0.2)).toBeGreaterThan(EC_PROFILE_DEFAULTS.maxSatelliteFraction);
    const fit = fitCurve(twoShellAnalysis(0.2 * substrateRatePerS));
    expect(fit.regime).toBe("shell-tunneling");
    expect(fit.chargingEnergyEV.value).toBeCloseTo(0.12, 2);
    expect(fit.chargingEnergyEV.standardError).toBeLessThan(0.001);
    expect(fit.warnings.some((w) => /Ec not determined|χ² profile over Ec/.test(w))).toBe(false);
  });
});
