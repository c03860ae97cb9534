// wholeCurveEcStarts: the rule by its definition on hand-made peaks, and a low-η spectrum of the
// benchmark's simulator (syntheticSpectrum, the truth its own parameters) whose CB side alone
// read a wrong ladder. The quality bar is the accuracy benchmark's for intermediate spectra: Ec
// within 3 % and Γtip/Γsub within × 1.5 (common practice, no source).
import { describe, it, expect } from "vitest";
import { ecRestartedWhole, levelAtReachEdge, recentredSeeds, valenceSpacingEcEV, wholeCurveEcStarts, WHOLE_CURVE_RESTART_DEFAULTS } from "../../../lib/model/fit/wholeCurveRestarts.ts";
import { startingValues } from "../../../lib/model/fit/startingValues.ts";
import type { CurveAnalysis } from "../../../lib/pipeline/analyzeCurve.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";
import { fitCurve } from "../../../lib/model/fit/fitCurve.ts";
import { syntheticSpectrum } from "../../../lib/model/syntheticSpectrum.ts";
import { expectIntermediateTruth, lowEtaDraw } from "../../helpers/lowEtaDraw.ts";

describe("wholeCurveEcStarts", () => {
  it("gives the rules' Ec, the VB peaks' spacing times η, then the CB side's Ec times each factor", () => {
    // By the definition: VB peaks nearest the gap −2.0 and −2.4 V at η 0.5 give 0.2 eV; then 0.3 × [0.5, 1.5].
    const starts = wholeCurveEcStarts(0.3, 0.1, [-3.1, -2.0, -2.4, 1.5], 0.5);
    // 0.3 × 2/3 = 0.2 repeats the VB spacing and is left out.
    expect(WHOLE_CURVE_RESTART_DEFAULTS.ecFactors).toEqual([0.5, 2 / 3, 1.5]);
    expect(starts.map((v) => +v.toFixed(9))).toEqual([0.1, 0.2, 0.15, 0.45]);
  });
  it("leaves out starts within minRelativeGap of the CB side's Ec or of an earlier start, and missing ones", () => {
    // By the definition: no rules' Ec, one VB peak (no spacing); 0.3 × 2/3 = 0.2 repeats 0.2 given as the rules' Ec; 0.31 is within 10 % of 0.3.
    expect(wholeCurveEcStarts(0.3, null, [-2], 0.5).map((v) => +v.toFixed(6))).toEqual([0.15, 0.2, 0.45]);
    expect(wholeCurveEcStarts(0.3, 0.31, [], 0.5).map((v) => +v.toFixed(6))).toEqual([0.15, 0.2, 0.45]);
    expect(wholeCurveEcStarts(0.3, 0.2, [], 0.5).map((v) => +v.toFixed(6))).toEqual([0.2, 0.15, 0.45]);
  });
});

describe("ecRestartedWhole", () => {
  // The information criterion's rule (Schwarz 1978): among the fits the caller accepts, the lowest BIC is kept.
  const fitWith = (bic: number) => ({ bic }) as unknown as FitTrial;
  it("keeps the accepted fit of lowest BIC, fitting every start once", () => {
    const fitted: number[] = [];
    const best = ecRestartedWhole([0.1, 0.2, 0.3], (ec) => (fitted.push(ec), fitWith(ec * 1000)), (t) => t.bic !== 100);
    expect(fitted).toEqual([0.1, 0.2, 0.3]);
    expect(best?.bic).toBe(200); // 100 is lower but not accepted
  });
  it("gives null where no start is accepted or there is none", () => {
    expect(ecRestartedWhole([0.1, 0.2], (ec) => fitWith(ec), () => false)).toBeNull();
    expect(ecRestartedWhole([], (ec) => fitWith(ec), () => true)).toBeNull();
  });
});

describe("valenceSpacingEcEV", () => {
  it("is η times the spacing of the two negative peaks nearest 0 V", () => {
    // By the definition: −2.0 and −2.4 V nearest the gap (the positive peak and −3.1 V do not count), η 0.5: 0.2 eV.
    expect(valenceSpacingEcEV([-3.1, 1.5, -2.4, -2.0], 0.5)).toBeCloseTo(0.2, 12);
    // By the definition: fewer than two negative peaks give none.
    expect(valenceSpacingEcEV([-2.0, 1.5, 2.2], 0.5)).toBeNull();
    expect(valenceSpacingEcEV([], 0.5)).toBeNull();
  });
});

describe("fitCurve(analysis, { compareModels: true }) on a CB side crossed by the VB, the s doublet's second peak taken for a resonance", () => {
  // The accuracy benchmark's low-η mix, its intermediate draw 26: Ec 0.0862 eV, Γtip/Γsub 0.61,
  // η 0.575. The CB side runs to the curve's end across the VB crossings; the first two CB
  // peaks left after the resonances are 0.76 V apart, a ladder start at Ec 0.438 eV (× 5.1), and
  // every grouping from it settled far off (shell tunnelling at Ec 0.116 eV). The VB peaks'
  // own spacing, 0.078 eV, starts the ladders near the simulated Ec.
  it("recovers the simulated Ec within 3 % and Γtip/Γsub within × 1.5, read intermediate", () => {
    const { scenario, truth, analysis } = lowEtaDraw(26, "intermediate");
    const vbPeaksV = analysis.peaks.filter((x) => x.biasV < 0 && x.role !== "second-junction").map((x) => x.biasV);
    // The simulation's truth: the VB spacing is within 10 % of the simulated Ec (the start the fix adds).
    expect(Math.abs(valenceSpacingEcEV(vbPeaksV, truth.eta)! / truth.chargingEnergyEV - 1)).toBeLessThan(0.1);
    const fit = fitCurve(analysis, { compareModels: true });
    expectIntermediateTruth(fit, { scenario, truth });
  }, 60_000);
});

describe("fitCurve(analysis, { compareModels: true }) where the CB side's Ec gives no whole-curve fit", () => {
  // The accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept), its
  // intermediate draw 117: Ec 0.120 eV, Γtip/Γsub 0.92. The CB side ends near the s doublet and
  // fits 2+6 in filling order to the noise at Ec 0.195 eV, Γtip/Γsub 6.8; every whole-curve
  // reading started from that Ec stayed at reduced χ² above 20, and the whole curve was fitted
  // again from other Ec starts. Its CB side is cut below the first VB crossing: the ladders are now
  // also started there from the VB peaks' spacing (compareGroupings, notes 1), and the CB side
  // itself reaches the simulated Ec.
  it("recovers the simulated Ec within 3 % and Γtip/Γsub within × 1.5 with the VB levels", () => {
    const { scenario, truth, analysis } = lowEtaDraw(117, "intermediate");
    const fit = fitCurve(analysis, { compareModels: true });
    expectIntermediateTruth(fit, { scenario, truth });
    expect(fit.levels.some((l) => l.band === "VB")).toBe(true);
  }, 60_000);
});

describe("fitCurve(analysis, { compareModels: true }) where the whole curve is fitted again from another Ec", () => {
  // The accuracy benchmark's low-η mix, its intermediate draw 164: Ec 0.172 eV, Γtip/Γsub 0.71,
  // the rules undetermined. The CB side alone reaches Ec 0.170 eV, but the whole curve (with the
  // VB levels) started from it stays at reduced χ² near 10; started again from the other Ec starts
  // of `wholeCurveEcStarts` it reaches the noise. This draw keeps the restart path under an
  // end-to-end test: the warning says the path was taken, the simulation's truth says it helped.
  it("takes the restart path and recovers the simulated Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { scenario, truth, analysis } = lowEtaDraw(164, "intermediate");
    const fit = fitCurve(analysis, { compareModels: true });
    expect(fit.warnings.some((w) => w.includes("started from another Ec it reaches"))).toBe(true);
    expectIntermediateTruth(fit, { scenario, truth });
    expect(fit.levels.some((l) => l.band === "VB")).toBe(true);
  }, 60_000);
});

describe("recentredSeeds", () => {
  // The starting rule (startingValues note 2): |ε| = η·|V_first| − Ec₀·(N_before + ½); a level's
  // reach lies symmetric about its start (note 5). A minimal analysis: regime undetermined, 30 mV peaks.
  const analysis = { assignment: { regime: "undetermined", energies: { chargingEnergyEV: null } }, settings: { peakWidthMV: 30 } } as unknown as CurveAnalysis;
  const seeds: LevelSeed[] = [
    { band: "CB", label: "s", degeneracy: 2, firstPeakV: 2.287, before: 0 },
    { band: "CB", label: "p", degeneracy: 6, firstPeakV: 2.535, before: 0 },
    { band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.686, before: 0 },
    { band: "VB", label: "v2", degeneracy: 4, firstPeakV: -1.936, before: 2 },
  ];
  it("starts every level at the given energy, its reach centred there (closed form of the starting rule)", () => {
    const eta = 0.555;
    const ec0 = 0.0694;
    const levelsEV = [1.2, 1.45, 0.867, 1.086];
    const moved = recentredSeeds(seeds, levelsEV, eta, ec0);
    // By the starting rule inverted: V = ±(|ε| + Ec₀·(N_before + ½))/η.
    expect(moved[1].firstPeakV).toBeCloseTo((1.45 + ec0 * 0.5) / eta, 12);
    expect(moved[3].firstPeakV).toBeCloseTo(-(1.086 + ec0 * 2.5) / eta, 12);
    expect(moved.map((x) => [x.band, x.label, x.degeneracy, x.before])).toEqual(seeds.map((x) => [x.band, x.label, x.degeneracy, x.before]));
    const sv = startingValues(analysis, moved, eta, 0.1, { chargingEnergyEV: ec0 });
    levelsEV.forEach((e, j) => {
      expect(sv.initialValues[j]).toBeCloseTo(e, 12);
      expect(sv.maxValues[j] - e).toBeCloseTo(e - sv.minValues[j], 12);
    });
  });
});

describe("levelAtReachEdge", () => {
  it("is true where a level lies on a bound within boundFraction of its span, false inside (by the definition)", () => {
    const start = { minValues: [1.1, 1.27, 1e-4, -4, -4], maxValues: [1.3, 1.3983, 2, 4, -0.3] };
    expect(WHOLE_CURVE_RESTART_DEFAULTS.boundFraction).toBe(1e-3);
    expect(levelAtReachEdge([1.2, 1.3983, 0.14, 0, -2], start, 2)).toBe(true);
    expect(levelAtReachEdge([1.1, 1.33, 0.14, 0, -2], start, 2)).toBe(true);
    expect(levelAtReachEdge([1.2, 1.33, 0.14, 0, -2], start, 2)).toBe(false);
    // Ec and the logarithms on their bounds do not count: only the levels (the first levelCount).
    expect(levelAtReachEdge([1.2, 1.33, 2, 4, -0.3], start, 2)).toBe(false);
  });
});

describe("fitCurve(analysis, { compareModels: true }) where a whole-curve restart leaves a level on the edge of its reach", () => {
  // The accuracy benchmark's low-η mix, its intermediate draw 93: Ec 0.1368 eV, Γtip/Γsub 0.757,
  // p whole at 1.4515 eV, the rules undetermined. The CB side ends before p and fits 2+6 with p's
  // entry on s's second charging peak (Ec undetermined); the whole curve from other Ec starts
  // moved Ec to 0.137 eV, but p, placed from that peak at Ec 0.069 eV, ended on the edge of its
  // reach (1.433 eV) at reduced χ² 1.97 with residual structure near p's second peak, and the
  // result came from the CB side alone (status failed). Run on with the reach centred on the
  // fitted levels, the whole curve reaches the noise.
  it("recovers the simulated Ec within 3 % and Γtip/Γsub within × 1.5 with the VB levels", () => {
    const { scenario, truth, analysis } = lowEtaDraw(93, "intermediate");
    const fit = fitCurve(analysis, { compareModels: true });
    expectIntermediateTruth(fit, { scenario, truth });
    expect(fit.status).toBe("good");
    expect(fit.levels.some((l) => l.band === "VB")).toBe(true);
  }, 60_000);
});
