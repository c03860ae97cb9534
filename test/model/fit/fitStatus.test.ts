// fitStatus: the status rules on constructed inputs (by construction of the documented limits:
// the reduced-χ² limit of poor (3) derived from the fit benchmark's simulated curves, where right
// fits end below 2 and fits one Ec off at 3–9; the rest common practice (no source) for χ²-based
// acceptance of an approximate model; the residual limit 5 from the normal tail, closed form
// 2·(1 − Φ(5)) = 5.7e-7 per window; the Ec limit of 5 combined σ derived from the benchmark).
import { describe, it, expect } from "vitest";
import { fitStatus, FIT_STATUS_DEFAULTS } from "../../../lib/model/fit/fitStatus.ts";

const ok = { reducedChiSquare: 1.2, regime: "shell-filling" as const, chargingEnergyEV: 0.1, chargingEnergySE: 0.001, logRateRatioSE: 0.05, atBound: [] };

describe("fitStatus(input)", () => {
  it("FIT_STATUS_DEFAULTS are locked", () => {
    expect(FIT_STATUS_DEFAULTS).toEqual({ poorChiSquare: 3, failedChiSquare: 100, poorRelativeError: 0.25, failedRelativeError: 1, poorLogRatioError: 0.3, deepRatioSigmas: 2, poorResidualZ: 5, poorChargingSigmas: 5 });
    expect(Object.isFrozen(FIT_STATUS_DEFAULTS)).toBe(true);
  });
  it("good when χ² is small and Ec and the rate ratio are determined", () => {
    expect(fitStatus(ok).status).toBe("good");
  });
  it("poor for a ladder one Ec off at χ²_red 4.5 (above 3, where right fits do not reach)", () => {
    expect(fitStatus({ ...ok, reducedChiSquare: 2.9 }).status).toBe("good");
    expect(fitStatus({ ...ok, reducedChiSquare: 4.5 }).status).toBe("poor");
  });
  it("poor for χ²_red in (3, 100], Ec known to worse than 25 %, or a rate ratio uncertain by more than a factor 2", () => {
    expect(fitStatus({ ...ok, reducedChiSquare: 47 }).status).toBe("poor");
    expect(fitStatus({ ...ok, chargingEnergySE: 0.03 }).status).toBe("poor");
    expect(fitStatus({ ...ok, logRateRatioSE: 0.5 }).status).toBe("poor");
  });
  it("lets a rate ratio uncertain by more than a factor 2 pass where its 2σ range lies inside shell filling or shell tunnelling", () => {
    // Closed form of the range: r ÷ 10^(2σ) … r × 10^(2σ). Regime limits 1.5 and 3/7 (REGIME_LIMITS,
    // read from the step ratio r/(1 + r)).
    // r = 36, σ(log₁₀ r) = 0.61 (×4.1): 36 / 10^1.22 = 2.17 ≥ 1.5, deep in shell filling.
    const deep = fitStatus({ ...ok, rateRatio: 36, logRateRatioSE: 0.61 });
    expect(deep.status).toBe("good");
    expect(deep.reasons.join(" ")).toMatch(/factor 4\.1 but its 2σ range 2\.2–6\.0e\+2 lies inside shell filling/);
    // r = 10 with the same error: 10 / 16.6 = 0.60 < 1.5, the range reaches intermediate: poor.
    expect(fitStatus({ ...ok, rateRatio: 10, logRateRatioSE: 0.61 }).status).toBe("poor");
    // r = 0.01, σ 0.5 (×3.2): 0.01 × 10 = 0.1 ≤ 3/7, deep in shell tunnelling.
    expect(fitStatus({ ...ok, regime: "shell-tunneling", rateRatio: 0.01, logRateRatioSE: 0.5 }).status).toBe("good");
    // Intermediate needs the ratio itself: its error always counts.
    expect(fitStatus({ ...ok, regime: "intermediate", rateRatio: 1, logRateRatioSE: 0.5 }).status).toBe("poor");
  });
  it("failed for the collapse seen in the crossover: χ²_red 1326 and Ec 115 ± 134 meV", () => {
    const r = fitStatus({ ...ok, reducedChiSquare: 1326, chargingEnergyEV: 0.115, chargingEnergySE: 0.134 });
    expect(r.status).toBe("failed");
    expect(r.reasons.join(" ")).toMatch(/1326.*Ec is not determined/);
  });
  it("failed when Ec or the rate ratio ends on a bound, or an error is not finite", () => {
    expect(fitStatus({ ...ok, atBound: ["Ec"] }).status).toBe("failed");
    expect(fitStatus({ ...ok, logRateRatioSE: Infinity }).status).toBe("failed");
    expect(fitStatus({ ...ok, chargingEnergySE: NaN }).status).toBe("failed");
  });
  it("lets the rate ratio on a bound pass where the curve sets a one-sided limit on it inside one regime, and says the limit", () => {
    // Deep in shell filling the step ratio r/(1 + r) is within the noise of 1 (closed form), so the
    // curve bounds r from below only: the limit is the measurement, not a degenerate solution.
    const deep = { ...ok, logRateRatioSE: Infinity, atBound: ["Γtip/Γsub"], rateRatioLimit: { kind: "lower" as const, rateRatio: 917, chiSquareRise: 2.71 } };
    const r = fitStatus(deep);
    expect(r.status).toBe("good");
    expect(r.reasons.join(" ")).toContain("Γtip/Γsub ≥ 917");
    // Without the limit the same fit fails; Ec on a bound still fails with it (a collapse).
    expect(fitStatus({ ...deep, rateRatioLimit: null }).status).toBe("failed");
    expect(fitStatus({ ...deep, atBound: ["Ec", "Γtip/Γsub"] }).status).toBe("failed");
  });
  it("does not judge Ec in shell tunnelling, where the ladder does not show it", () => {
    expect(fitStatus({ ...ok, regime: "shell-tunneling", chargingEnergySE: 0.5 }).status).toBe("good");
  });
  it("says so where a shell-tunnelling Ec is undetermined (error NaN, note 5) and keeps the fit good; in shell filling the same Ec fails it", () => {
    const tunnelling = fitStatus({ ...ok, regime: "shell-tunneling", chargingEnergySE: NaN });
    expect(tunnelling.status).toBe("good");
    expect(tunnelling.reasons[0]).toMatch(/Ec not determined \(shell tunnelling: the regime and the levels stand without it\), Γtip\/Γsub determined/);
    expect(fitStatus({ ...ok, regime: "shell-tunneling" }).reasons[0]).toMatch(/Ec and Γtip\/Γsub determined/);
    expect(fitStatus({ ...ok, chargingEnergySE: NaN }).status).toBe("failed");
  });
  it("poor, with where, when the residuals hold a run of one sign above 5 σ over a peak's width", () => {
    const structured = fitStatus({ ...ok, residualStructure: { largestZ: 6.2, atBiasV: 1.542, windowPoints: 4 } });
    expect(structured.status).toBe("poor");
    expect(structured.reasons.join(" ")).toMatch(/structure .* near 1\.542 V .*6\.2 σ over 4 points/);
    const clean = fitStatus({ ...ok, residualStructure: { largestZ: 4.9, atBiasV: 1.5, windowPoints: 4 } });
    expect(clean.status).toBe("good");
    expect(clean.reasons[0]).toMatch(/no structure in the residuals \(largest run 4\.9 σ ≤ 5\)/);
  });
  it("poor when Ec is more than 5 combined σ from the peak-based Ec, both reading a charging ladder", () => {
    // Combined σ = √(1² + 3²) meV = 3.162 meV (closed form); 0.1 vs 0.117 eV is 5.4 σ, vs 0.115 eV 4.7 σ.
    const far = fitStatus({ ...ok, peakChargingEnergy: { valueEV: 0.117, standardErrorEV: 0.003 } });
    expect(far.status).toBe("poor");
    expect(far.reasons.join(" ")).toMatch(/differs from the peak-based 117\.0 ± 3\.0 meV by 5\.4 combined σ/);
    expect(fitStatus({ ...ok, peakChargingEnergy: { valueEV: 0.115, standardErrorEV: 0.003 } }).status).toBe("good");
    // The fit reads shell tunnelling: the peak-based Ec assumes filling and is not compared.
    expect(fitStatus({ ...ok, regime: "shell-tunneling", peakChargingEnergy: { valueEV: 0.2, standardErrorEV: 0.003 } }).status).toBe("good");
  });
});
