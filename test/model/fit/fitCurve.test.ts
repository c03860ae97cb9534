// fitCurve round trips: curves simulated by the exact master equation (a closed-form-tested
// reference, test/model/ladder.test.ts) are fitted; the quality bar of the model issue is
// Ec within 3 % and Γtip/Γsub within a factor 1.5 at 0.3 % noise.
import { describe, it, expect } from "vitest";
import { crossoverDraw } from "../../helpers/crossoverDraw.ts";
import { expectClose } from "../../helpers/expectClose.ts";
import { fitCurve, FIT_DEFAULTS } from "../../../lib/model/fit/fitCurve.ts";
import { simulateCurve } from "../../../lib/model/simulate.ts";
import { analyzeCurve } from "../../../lib/pipeline/analyzeCurve.ts";
import { DotspecError } from "../../../lib/util/errors.ts";
import { eta, twoShellAnalysis } from "../../helpers/twoShellDot.ts";

const analysisOf = twoShellAnalysis;

describe("fitCurve(analysis)", () => {
  for (const [name, rate, ratio] of [
    ["shell filling", 1.2e9, 6],
    ["shell filling near the intermediate boundary", 6e8, 3],
    ["shell tunnelling", 4e6, 0.02],
  ] as const) {
    it(`recovers Ec within 3 % and Γtip/Γsub within × 1.5 in ${name} (r = ${ratio})`, () => {
      const fit = fitCurve(analysisOf(rate));
      expect(fit.converged).toBe(true);
      expectClose(fit.chargingEnergyEV.value, 0.12, { rtol: 0.03, what: "Ec" });
      expect(fit.rateRatio.value / ratio).toBeGreaterThan(1 / 1.5);
      expect(fit.rateRatio.value / ratio).toBeLessThan(1.5);
      expectClose(fit.chargingEnergyV.value, fit.chargingEnergyEV.value / eta, { rtol: 1e-12, what: "bias-referred = energy/η" });
      expect(fit.reducedChiSquare).toBeLessThan(10);
      const s = fit.levels.find((l) => l.label === "s")!;
      expectClose(s.energyEV.value, 0.45, { atol: 0.01, what: "ε_s" });
    });
  }

  it("names the regime implied by the fitted rate ratio (thresholds locked with the defaults)", () => {
    expect(fitCurve(analysisOf(1.2e9)).regime).toBe("shell-filling");
    expect(fitCurve(analysisOf(4e6)).regime).toBe("shell-tunneling");
  });

  it("stops at its time limit, says so, and still returns the best values found", () => {
    const fit = fitCurve(analysisOf(1.2e9), { timeLimitMs: 1 });
    expect(fit.converged).toBe(false);
    expect(fit.message).toMatch(/time limit/);
    expect(fit.warnings.join(" ")).toMatch(/did not converge/);
    expect(Number.isFinite(fit.chargingEnergyEV.value)).toBe(true);
  });

  it("when the assignment misses a multiplet (χ²_red > 10), compares the other groupings and says which one describes the curve", () => {
    // Drop the p multiplet: the model started from the assignment then misses six CB steps.
    const a = analysisOf(1.2e9);
    const partial = { ...a, assignment: { ...a.assignment, multiplets: a.assignment.multiplets.filter((m) => m.label !== "p") } };
    const fit = fitCurve(partial);
    const assigned = fit.alternatives.find((x) => x.hypothesis === "assigned")!;
    expect(assigned.reducedChiSquare).toBeGreaterThan(10);
    expect(fit.hypothesis).not.toBe("assigned");
    expect(fit.warnings.join(" ")).toMatch(/describes the curve better than the assignment/);
    expect(fit.reducedChiSquare).toBeLessThan(10);
    expectClose(fit.chargingEnergyEV.value, 0.12, { rtol: 0.03, what: "Ec (simulated 0.12 eV)" });
  });

  it("refuses an analysis without multiplets", () => {
    const a = analysisOf(1.2e9);
    const empty = { ...a, assignment: { ...a.assignment, multiplets: [] } };
    expect(() => fitCurve(empty)).toThrow(DotspecError);
  });

  it("refuses, with a DotspecError that names the count, a grouping whose master equation would exceed SCENARIO_DEFAULTS.maxStates", () => {
    // Eight VB levels of two states each and no CB level: 3⁸ = 6,561 charge states, above the
    // 1,200 the master equation solves (a RangeError from the rate matrix before this check).
    const a = analysisOf(1.2e9);
    const peaks = a.peaks.filter((p) => p.biasV < 0);
    const v1 = a.assignment.multiplets.find((m) => m.band === "VB")!;
    const many = Array.from({ length: 8 }, (_, k) => ({ ...v1, label: `v${k + 1}`, found: 1, degeneracy: null, subgroups: [1], peakIndices: [peaks.length - 1], peaksV: [peaks[peaks.length - 1].biasV] }));
    const vbOnly = { ...a, peaks, assignment: { ...a.assignment, regime: "undetermined" as const, multiplets: many } };
    let thrown: unknown = null;
    try {
      fitCurve(vbOnly);
    } catch (err) {
      thrown = err;
    }
    expect(thrown).toBeInstanceOf(DotspecError);
    expect((thrown as DotspecError).code).toBe("fit/too-many-states");
    expect((thrown as Error).message).toMatch(/6561 charge states in one band, more than the 1200/);
  });

  it("FIT_DEFAULTS are as documented (locked)", () => {
    expect(FIT_DEFAULTS).toEqual({
      temperatureK: 4.5,
      maxIterations: 60,
      maxEvaluations: 22_000,
      maxEliminationSteps: 3e9,
      maxPoints: 800,
      chargingEnergyGuessEV: 0.1,
      convergenceTolerance: 1e-5,
      chunkIterations: 4,
      fillingRatioMin: 1.5,
      tunnelingRatioMax: 3 / 7,
      poorFitChiSquare: 10,
      compareModels: false,
      rateRatioStartsLog10: [-2, -1, 0, 1, 2],
      exploreIterations: 8,
      exploreDropRatio: 4,
      extraStartsLog10: { "shell-filling": [], "shell-tunneling": [-1], "ladder-filling": [], "ladder-empty": [] },
      finishedHypotheses: 3,
      regimeSigmas: 2,
      rateRatioLimitChiSquare: 2.71,
      rateRatioLimitFromUpperLog10: [3, 2, 1.5, 1, 0.5, Math.log10(1.5)],
      rateRatioLimitFromLowerLog10: [-3, -2, -1.5, -1, Math.log10(3 / 7)],
      decisiveChiSquare: 2,
      bicTieMargin: 2,
      maxAssignedStates: 100,
      cbSideResonanceMarginFwhm: 2,
      cbSideHeldHole: true,
      shiftChiSquare: 2,
      wholeCurveChiSquare: 3,
      wholeCurveRatio: 2,
      wholeCurveEcSigmas: 1,
      wholeCurveCbChiSquare: 5.99,
      refinementRounds: 2,
      refinedGroupings: 2,
      refinementIterations: 4,
      blindSidePeaks: 2,
      blindSideGroupings: 5,
      blindSideAssigned: true,
    });
  });
});

// Across the crossover: curves simulated with the model's own parameters as truth (ε_s = 0.6 eV,
// ε_p = 0.9 eV, ε_v = −1.2 eV, Ec = 0.1 eV, η = 0.85, Γsub = 1e8/s), fitted with every hypothesis;
// the quality bar of the model issue is Ec within 3 % and Γtip/Γsub within × 1.5, the regime the
// one REGIME_LIMITS gives the true ratio (1.5 and 3/7, common practice, no source).
function crossover(rateRatio: number) {
  const sim = simulateCurve({
    cb: [{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }],
    vb: [{ energyEV: -1.2, degeneracy: 2 }],
    chargingEnergyEV: 0.1,
    eta,
    tipRatePerS: 1e8 * rateRatio,
    substrateRatePerS: 1e8,
    temperatureK: 4.5,
    broadeningEV: 0.01,
    bias: { fromV: -2, toV: 2.2, stepV: 0.002 },
    noise: { relative: 0.003, seed: 1 },
  }, { method: "fast" });
  return analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta });
}

describe("fitCurve(analysis, { compareModels: true }) across the filling–tunnelling crossover", () => {
  for (const [ratio, regime] of [[0.5, "intermediate"], [1, "intermediate"], [5, "shell-filling"]] as const) {
    it(`at Γtip/Γsub = ${ratio} picks a charging ladder with the true rate ratio and Ec, regime ${regime}`, () => {
      const fit = fitCurve(crossover(ratio), { compareModels: true });
      expect(fit.status).toBe("good");
      expectClose(fit.chargingEnergyEV.value, 0.1, { rtol: 0.03, what: "Ec (simulated 0.1 eV)" });
      expect(Math.abs(Math.log(fit.rateRatio.value / ratio))).toBeLessThan(Math.log(1.5));
      expect(fit.regime).toBe(regime);
      expect(fit.levels.filter((l) => l.band === "CB").map((l) => l.degeneracy)).toEqual([2, 6]);
      // The winner carries the largest weight, or one within the tie margin of it (ΔBIC < 2, so a
      // weight ratio above exp(−1), closed form); only plausible finalists carry any.
      const top = Math.max(...fit.alternatives.map((a) => a.weight));
      const own = Math.max(...fit.alternatives.filter((a) => a.hypothesis === fit.hypothesis).map((a) => a.weight));
      expect(own).toBeGreaterThan(top * Math.exp(-FIT_DEFAULTS.bicTieMargin / 2));
      expect(fit.alternatives.filter((a) => a.weight > 0).every((a) => Array.isArray(a.implausible) && a.implausible.length === 0)).toBe(true);
      expect(fit.evidence[0]).toMatch(/lowest BIC/);
    }, 60_000);
  }

  it("in clear shell filling, where several groupings tie, keeps the VB level and the gap of the whole-curve fit", () => {
    // analysisOf(1.2e9): Γtip/Γsub = 6, VB levels at −0.62 and −0.85 eV (the simulation's own parameters)
    const analysis = analysisOf(1.2e9);
    const compared = fitCurve(analysis, { compareModels: true });
    const plain = fitCurve(analysis);
    const vb = (f: typeof plain) => f.levels.filter((l) => l.band === "VB");
    expect(vb(compared).length).toBeGreaterThan(0);
    expect(vb(compared).length).toBe(vb(plain).length);
    expectClose(vb(compared)[0].energyEV.value, -0.62, { rtol: 0.03, what: "first VB level (simulated −0.62 eV)" });
    expect(compared.warnings.some((w) => /no VB level is reported/.test(w))).toBe(false);
  }, 60_000);

  it("at Γtip/Γsub = 0.5 never takes the single-level grouping whose free levels absorb p's charging peaks", () => {
    const fit = fitCurve(crossover(0.5), { compareModels: true });
    expect(fit.hypothesis).not.toBe("shell-tunneling");
    const single = fit.alternatives.filter((a) => a.hypothesis === "shell-tunneling");
    expect(single.every((a) => a.weight < 1e-6)).toBe(true);
  }, 60_000);
});

// A dot with Ec equal to the s–p spacing (0.195 and 0.196 eV), Γtip/Γsub = 0.205, η = 0.933, p
// whole: its CB peaks are equally spaced, the rules read four of them as s, p, d and f single
// levels (3,465 charge states), and the charging ladders seeded from the peaks start one Ec off.
// Drawn by syntheticSpectrum (starts 35 and 1006 of the crossover range 0.2–5 that bench/fit.ts
// uses) and simulated by the fast model: the truth is the simulation's own parameters.
describe("fitCurve(analysis) on a ladder seeded one Ec off", () => {
  // Start 414 of the same draw (Γtip/Γsub 0.46, Ec 171 meV): the ladder read from the empty dot,
  // seeded from the peaks, settles at reduced χ² 3.7 with Ec 8 % low; started one Ec lower it
  // reaches the noise (1.02). (Start 35 served here until the peak finder's second step test
  // found its s charging step, after which the seeded fit needs no retry; 406 and 414 are the
  // first starts after 120 that take this route now.)
  it("takes the ladder started one Ec lower when it describes the curve far better, with Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(414);
    const fit = fitCurve(analysis);
    expect(fit.hypothesis).toMatch(/ −Ec$/);
    expect(fit.reducedChiSquare).toBeLessThan(2);
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);

  it("leaves the s, p, d, f reading unfitted, retries the ladders from ±Ec and recovers Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(1006);
    const fit = fitCurve(analysis);
    // The rules' grouping is too large to fit in time (above maxAssignedStates): never run.
    expect(fit.alternatives.some((a) => a.hypothesis === "assigned")).toBe(false);
    // Some grouping was retried one Ec lower or higher.
    expect(fit.alternatives.some((a) => / [−+]Ec$/.test(a.hypothesis))).toBe(true);
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);
});

// Split p shells (draws of the same crossover range, the truth the simulation's own parameters).
describe("fitCurve(analysis) on split p shells", () => {
  // Start 14: Γtip/Γsub 1.07, Ec 195 meV, p split 2+2+2; every grouping seeded from the peaks
  // reads p whole and reaches reduced χ² 1.16 with Ec 15 % high; split about the fitted p level
  // it reaches the noise with the simulated Ec.
  it("splits a p level fitted whole and recovers Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(14);
    expect(truth.pSubgroups).toEqual([2, 2, 2]);
    const fit = fitCurve(analysis);
    expect(fit.hypothesis).toMatch(/refined to 2\+2\+2\+2/);
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);

  // Start 46: Γtip/Γsub 0.59, Ec 150 meV, p split 2+4 with sub-levels 97 meV apart. Every start
  // about the fitted values settled at Ec 11 % low (Γtip/Γsub 0.99) or at Γtip/Γsub 0.30; the split
  // at the spacing the peaks show (the second sub-level's entry 0.108 V after the first's), with
  // Γtip/Γsub 0.62 from the s doublet's step ratio, reaches the simulated values.
  it("splits p at the spacing the peaks show, with Γtip/Γsub from the s step ratio, and recovers Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(46);
    const fit = fitCurve(analysis);
    expect(fit.hypothesis).toMatch(/refined to 2\+2\+4 \(p split 2\+4 at the peaks/);
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);

  // Start 122: Γtip/Γsub 0.815, Ec 66 meV, η 0.67, p split 2+2+2 with sub-levels 76 meV apart,
  // entered from the empty dot before s is full. Every grouping settled with p one entry low, three
  // sub-levels within 13 meV at Γtip/Γsub 6.7 (reduced χ² 4.7, `poor`); the rescue's split from the
  // first peak after the s doublet reaches the simulated values.
  it("rescues a poor comparison by splitting p from the first peak after the s doublet, and recovers Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(122);
    expect(truth.pSubgroups).toEqual([2, 2, 2]);
    const fit = fitCurve(analysis);
    expect(fit.hypothesis).toMatch(/p from the first peak after s\)$/);
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);

  // Start 149: Γtip/Γsub 1.15, Ec 152 meV, p split 2+2+2 (sub-levels 96–97 meV apart, spanning
  // more than the s–p distance). With split shells held to a span below their distance from s the
  // fit read p as 2+4 (reduced χ² below 3 but a run of one sign above 5 σ inside p: poor); with the
  // bound at 1.5 × the distance (harmonic confinement up to 2.5 : 1, hypothesisPlausibility) the
  // 2+2+2 reading is admitted and describes the curve. (The status's structure check itself is
  // tested on fitStatus.)
  it("reads a 2+2+2 p shell that spans more than its distance from s, and recovers Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(149);
    expect(truth.pSubgroups).toEqual([2, 2, 2]);
    const fit = fitCurve(analysis);
    expect(fit.levels.filter((l) => l.band === "CB" && /^p/.test(l.label)).map((l) => l.degeneracy)).toEqual([2, 2, 2]);
    expect(fit.residualStructure.largestZ).toBeLessThan(5);
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);

  // Start 1204: Γtip/Γsub 0.538, Ec 177.3 meV, p split 2+2+2. The CB side's values are off (Ec 171.6
  // meV, Γtip/Γsub 0.591); the free whole-curve fit moves them to 176.1 meV and 0.535 and describes
  // the curve (reduced χ² 1.07, largest residual run 3.5 σ), while held at the CB side's values it
  // leaves a run of one sign of 5.9 σ (> 5).
  it("keeps the free whole-curve fit where holding the CB side's values leaves residual structure it has not", () => {
    const { analysis, truth } = crossoverDraw(1204);
    const fit = fitCurve(analysis);
    expect(fit.warnings.some((w) => /the whole curve's values stand/.test(w))).toBe(true);
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);
});

// A VB reading that does not fit with the CB values (draws of the same crossover range, the truth
// the simulation's own parameters).
describe("fitCurve(analysis) when the VB reading pulls Ec", () => {
  // Start 1014: Γtip/Γsub 1.71, Ec 124.2 meV, p split 2+2+2; VB levels 2 at −0.918 and 4 at
  // −1.199 eV. The VB readings from the peaks start the second VB level an Ec away (its first peak is
  // its entry with one hole in the first, (ε + 1.5·Ec)/η), and the whole-curve fit pulled Ec to
  // 131 meV and Γtip/Γsub to 2.5 (held at the CB side's values until this round); the reading with
  // that level entered one hole earlier fits with the CB values, and nothing needs holding.
  it("enters the second VB level one hole earlier when no reading fits with the CB values, and keeps Ec, Γtip/Γsub and the VB levels", () => {
    const { analysis, truth } = crossoverDraw(1014);
    const fit = fitCurve(analysis);
    expect(fit.warnings.some((w) => /Ec and Γtip\/Γsub are the CB side's/.test(w))).toBe(false);
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
    const vb = fit.levels.filter((l) => l.band === "VB").map((l) => [l.degeneracy, l.energyEV.value]);
    expect(vb.map((v) => v[0])).toEqual([2, 4]);
    expectClose(vb.map((v) => v[1]), [-0.918, -1.199], { atol: 0.01, what: "VB levels (simulated, eV)" });
    expect(fit.status).toBe("good");
  }, 60_000);

  // Start 3085: Γtip/Γsub 0.565, Ec 77.6 meV, p split 2+2+2; VB levels 2 at −0.760 and 4 at
  // −0.975 eV, six VB peaks (the window cuts the second level's ladder). The groupings' own VB
  // readings (filling groups; runs of peaks one Ec/η apart, one level each) read neither level
  // whole and leave the whole curve at reduced χ² 19.5, so the CB side alone gave Ec 75.0 meV
  // (3.4 % low); the VB read as a doublet and a level of four entered from the empty dot fits with
  // the CB values and brings Ec within 3 %.
  it("reads the VB as a doublet and a level of four from the empty dot where no reading of the grouping fits with the CB values", () => {
    const { analysis, truth } = crossoverDraw(3085);
    const fit = fitCurve(analysis, { compareModels: true });
    expect(fit.warnings.some((w) => /no reading of the VB peaks fits together/.test(w))).toBe(false);
    const vb = fit.levels.filter((l) => l.band === "VB").map((l) => [l.degeneracy, l.energyEV.value]);
    expect(vb.map((v) => v[0])).toEqual([2, 4]);
    expectClose(vb.map((v) => v[1]), [-0.76, -0.975], { atol: 0.01, what: "VB levels (simulated, eV)" });
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
    expect(fit.status).toBe("good");
  }, 60_000);

  // Start 3111: Γtip/Γsub 1.33, Ec 78.0 meV, p split 2+2+2. The CB side alone gives Ec 74.4 ±
  // 1.5 meV; the whole curve, its VB read as a doublet and a level of four, 77.2 meV (1.7 combined
  // standard errors away). Refitted with the whole curve's Ec and Γtip/Γsub held, the CB side's χ²
  // rises by 3.3 (below 5.99, the 95 % point for two parameters): the two agree, and the whole
  // curve's values stand instead of being held at the CB side's.
  it("keeps the whole curve's Ec where the CB side refitted at it rises by less than the 95 % point of χ² for two parameters", () => {
    const { analysis, truth } = crossoverDraw(3111);
    const fit = fitCurve(analysis);
    expect(fit.warnings.some((w) => /the CB side refitted at them rises by χ² [\d.]+ only/.test(w))).toBe(true);
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
    expect(fit.status).toBe("good");
  }, 60_000);

  // Start 1861: Γtip/Γsub 3.73, p split 2+2+2 (sub-levels 64 meV apart). p fitted whole stretches
  // Ec; the rules' Ec from the peak spacings (80 meV) starts a 2+2+2 split that reaches the
  // simulated values.
  it("splits p at the peak-based Ec and recovers Ec within 3 % and Γtip/Γsub within × 1.5", () => {
    const { analysis, truth } = crossoverDraw(1861);
    expect(truth.pSubgroups).toEqual([2, 2, 2]);
    const fit = fitCurve(analysis);
    expect(fit.hypothesis).toMatch(/p split 2\+2\+2 at the peak-based Ec/);
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
    expect(fit.regime).toBe("shell-filling");
    expect(fit.status).toBe("good");
  }, 60_000);

  // Start 127: Γtip/Γsub 3.02, Ec 157.0 meV, p whole. Every CB-side grouping fits (reduced χ² 0.94,
  // Γtip/Γsub 2.99 inside its bounds); the whole curve's VB reading runs Γtip/Γsub onto its bound
  // (10⁴). That bound is the VB reading's, not the grouping's: until this round it made every
  // grouping implausible and the comparison said "no fit".
  it("does not count a whole-curve fit's bound against a CB grouping that stayed inside its bounds", () => {
    const { analysis, truth } = crossoverDraw(127);
    const fit = fitCurve(analysis, { compareModels: true });
    expect(fit.status).toBe("good");
    expect(fit.regime).toBe("shell-filling");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
  }, 60_000);

  // Start 70: Γtip/Γsub 2.27, Ec 144.5 meV, p split 2+2+2. The whole curve keeps Ec but moves
  // Γtip/Γsub by 1.1 combined standard errors (2.33 on the CB side, 2.28 on the whole curve); it was
  // held at the CB side's value until the CB side's own test: refitted with the whole curve's
  // values held, its χ² rises by 2.6 (below 5.99), so the whole curve's values stand.
  it("keeps the whole curve's Γtip/Γsub where it moves alone and the CB side agrees with it", () => {
    const { analysis, truth } = crossoverDraw(70);
    expect(truth.pSubgroups).toEqual([2, 2, 2]);
    const fit = fitCurve(analysis);
    expect(fit.evidence.some((e) => /the whole-curve fit moved Γtip\/Γsub from/.test(e))).toBe(false);
    expect(fit.warnings.some((w) => /the CB side refitted at them rises by χ² [\d.]+ only/.test(w))).toBe(true);
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
    expect(fit.regime).toBe("shell-filling");
  }, 60_000);

  // Start 1030: Γtip/Γsub 3.29, Ec 83.4 meV, p split 2+2+2 (sub-levels 75 meV apart), a window
  // that shows only part of the p ladder (the rules find five of its six peaks); VB levels 2 at
  // −0.836 and 4 at −0.959 eV. Every VB reading of the groupings left structure in the whole
  // curve's residuals on the VB side (near −1.41 V, 11 σ), none on the CB side, and the CB side's
  // values stood alone; the VB read as a doublet and a level of four (shellValenceReading) fits
  // with the CB values, and the whole curve gives Ec, Γtip/Γsub and both VB levels.
  it("reads the VB as a doublet and a level of four where the groupings' readings leave structure on the VB side", () => {
    const { analysis, truth } = crossoverDraw(1030);
    expect(truth.pSubgroups).toEqual([2, 2, 2]);
    const fit = fitCurve(analysis);
    expect(fit.warnings.some((w) => /no reading of the VB peaks fits together/.test(w))).toBe(false);
    const vb = fit.levels.filter((l) => l.band === "VB").map((l) => [l.degeneracy, l.energyEV.value]);
    expect(vb.map((v) => v[0])).toEqual([2, 4]);
    expectClose(vb.map((v) => v[1]), [-0.836, -0.959], { atol: 0.01, what: "VB levels (simulated, eV)" });
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(Math.abs(Math.log(fit.rateRatio.value / truth.rateRatio))).toBeLessThan(Math.log(1.5));
    expect(fit.regime).toBe("shell-filling");
  }, 60_000);
});
