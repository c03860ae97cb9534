// peakEcRefuted: the peak-based Ec is set aside only where the rules' own grouping, fitted to the
// whole curve, fails to describe it (reduced χ² above the status's limit of poor, 3) by a clear
// factor (× 3) against the fit checked; a fit that is the assignment itself, an assignment not
// fitted, or two readings that describe the curve alike leave the Ec check standing (by
// construction of the reduced χ²: a model that reaches the noise has reduced χ² near 1, one that
// misses a charging step stays far above it; common practice (no source)).
import { describe, it, expect } from "vitest";
import { peakEcRefuted, PEAK_EC_REFUTED_DEFAULTS } from "../../../lib/model/fit/peakEcRefuted.ts";
import { fitStatus } from "../../../lib/model/fit/fitStatus.ts";

describe("peakEcRefuted(input, limits)", () => {
  it("PEAK_EC_REFUTED_DEFAULTS are locked", () => {
    expect(PEAK_EC_REFUTED_DEFAULTS).toEqual({ assignedChiSquare: 3, assignedRatio: 3 });
    expect(Object.isFrozen(PEAK_EC_REFUTED_DEFAULTS)).toBe(true);
  });

  it("refutes the rules' reading where their grouping misses the curve and another reaches the noise", () => {
    expect(peakEcRefuted({ assignedReducedChiSquare: 32, fitReducedChiSquare: 0.99, fitIsAssigned: false })).toBe(true);
    expect(peakEcRefuted({ assignedReducedChiSquare: Infinity, fitReducedChiSquare: 1.2, fitIsAssigned: false })).toBe(true);
  });

  it("leaves the Ec check standing otherwise", () => {
    // Both readings describe the curve: the data do not say which is wrong.
    expect(peakEcRefuted({ assignedReducedChiSquare: 1.4, fitReducedChiSquare: 0.99, fitIsAssigned: false })).toBe(false);
    // The assignment misses the curve, but the fit checked does hardly better: no clear margin.
    expect(peakEcRefuted({ assignedReducedChiSquare: 6, fitReducedChiSquare: 2.5, fitIsAssigned: false })).toBe(false);
    // The fit is the assignment's own grouping, or the assignment was not fitted.
    expect(peakEcRefuted({ assignedReducedChiSquare: 32, fitReducedChiSquare: 32, fitIsAssigned: true })).toBe(false);
    expect(peakEcRefuted({ assignedReducedChiSquare: null, fitReducedChiSquare: 0.99, fitIsAssigned: false })).toBe(false);
    expect(peakEcRefuted({ assignedReducedChiSquare: NaN, fitReducedChiSquare: 0.99, fitIsAssigned: false })).toBe(false);
  });

  it("with the check set aside, a fit that reaches the noise is good despite the peak-based Ec", () => {
    // A ladder Ec of 106 meV ± 0.5 against a peak-based 156 ± 3.4 meV: 14.6 combined σ apart.
    const base = { reducedChiSquare: 0.99, regime: "intermediate" as const, chargingEnergyEV: 0.106, chargingEnergySE: 0.0005, logRateRatioSE: 0.02, atBound: [] };
    const peak = { valueEV: 0.156, standardErrorEV: 0.0034 };
    expect(fitStatus({ ...base, peakChargingEnergy: peak }).status).toBe("poor");
    const refuted = peakEcRefuted({ assignedReducedChiSquare: 32, fitReducedChiSquare: base.reducedChiSquare, fitIsAssigned: false });
    expect(fitStatus({ ...base, peakChargingEnergy: refuted ? null : peak }).status).toBe("good");
  });
});
