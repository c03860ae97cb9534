// compareGroupings on a CB side cut below the first VB crossing (low η): the charging ladders also
// started from the VB peaks' own spacing, the next groupings finished where no finalist is
// plausible, and the work budget a low-η comparison needs. Each case is a draw of the accuracy
// benchmark's low-η mix (syntheticSpectrum, simulated by the fast model): the truth is the
// simulation's own parameters, the bar the benchmark's for intermediate spectra (Ec within 3 %,
// Γtip/Γsub within × 1.5: the project's quality bar, common practice, no source).
import { describe, it, expect } from "vitest";
import { fitCurve, FIT_DEFAULTS } from "../../../lib/model/fit/fitCurve.ts";
import { cbSideEndV } from "../../../lib/model/fit/cbSideEnd.ts";
import { valenceSpacingEcEV } from "../../../lib/model/fit/wholeCurveRestarts.ts";
import { expectIntermediateTruth, lowEtaDraw } from "../../helpers/lowEtaDraw.ts";

/** Whether the draw's CB side ends below the curve's end (cbSideEndV with the held hole, as fitCurve cuts it). */
function cutSide(draw: ReturnType<typeof lowEtaDraw>): boolean {
  const endV = cbSideEndV(draw.analysis.peaks, draw.truth.eta, FIT_DEFAULTS.cbSideResonanceMarginFwhm, FIT_DEFAULTS.cbSideHeldHole);
  return endV < Math.max(...draw.sim.biasV);
}

describe("fitCurve(analysis, { compareModels: true }) on a cut CB side whose first two CB peaks misplace Ec", () => {
  // Intermediate draw 62: Ec 0.101 eV, Γtip/Γsub 0.64. Every ladder started from the CB peaks'
  // spacing settled at Ec 0.285 eV (× 2.8) with a good reduced χ²; the VB peaks' spacing lies
  // within 10 % of the simulated Ec.
  it("recovers the simulated Ec within 3 % and Γtip/Γsub within × 1.5, read intermediate (draw 62)", () => {
    const draw = lowEtaDraw(62, "intermediate");
    expect(cutSide(draw)).toBe(true);
    const vbPeaksV = draw.analysis.peaks.filter((x) => x.biasV < 0 && x.role !== "second-junction").map((x) => x.biasV);
    // The simulation's truth: the start the VB peaks give is within 10 % of the simulated Ec.
    expect(Math.abs(valenceSpacingEcEV(vbPeaksV, draw.truth.eta)! / draw.truth.chargingEnergyEV - 1)).toBeLessThan(0.1);
    expectIntermediateTruth(fitCurve(draw.analysis, { compareModels: true }), draw);
  }, 120_000);
});

describe("fitCurve(analysis, { compareModels: true }) where every CB-side finalist is degenerate", () => {
  // Intermediate draw 1056: Ec 0.188 eV, Γtip/Γsub 0.49. The ladders started from the VB peaks'
  // spacing fit the s doublet to the noise with Ec or Γtip/Γsub on a bound, and took every
  // finalist's place: the next groupings explored are finished until one is plausible.
  it("recovers the simulated Ec within 3 % and Γtip/Γsub within × 1.5, read intermediate (draw 1056)", () => {
    const draw = lowEtaDraw(1056, "intermediate");
    expect(cutSide(draw)).toBe(true);
    const fit = fitCurve(draw.analysis, { compareModels: true });
    expectIntermediateTruth(fit, draw);
    expect(fit.statusReasons.join(" ")).not.toMatch(/plausible/);
  }, 120_000);
});

describe("fitCurve(analysis, { compareModels: true }) within its work budget at low η", () => {
  // Intermediate draw 188: Ec 0.094 eV, Γtip/Γsub 0.49. The comparison asks for a little over
  // 10,000 model evaluations (the budget before): cut there, its right values were reported poor.
  it("is not cut short and recovers the simulated values (draw 188)", () => {
    const draw = lowEtaDraw(188, "intermediate");
    const fit = fitCurve(draw.analysis, { compareModels: true });
    expect(fit.work.stoppedBy).toBeNull();
    expect(fit.work.evaluations).toBeGreaterThan(10_000);
    expect(fit.work.evaluations).toBeLessThan(FIT_DEFAULTS.maxEvaluations);
    expect(fit.status).toBe("good");
    expectIntermediateTruth(fit, draw);
  }, 120_000);
});
