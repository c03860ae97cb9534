// cbSideEcLadderWholeFits on a low-η shell-filling spectrum of the accuracy benchmark (seed 5001
// draw 5085: Ec 196.4 meV, Γtip/Γsub 30.9, η 0.575, p split 2+4, VB a doublet and a level of
// four), simulated by the fast model: the truth is the simulation's own parameters. In shell
// filling each level's charging peaks lie Ec/η apart (the closed form of the orthodox ladder, as
// in the matched readings' own notes), so the s doublet on the CB side fixes Ec.
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { lowEtaDraw } from "../../helpers/lowEtaDraw.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses } from "../../../lib/model/fit/fitHypotheses.ts";
import { parameterIndex } from "../../../lib/model/fit/parameterModel.ts";
import { mergedPeakEcEV, mergedPeakWholeFits } from "../../../lib/model/fit/mergedPeakWholeFits.ts";
import { cbSideEcLadderWholeFits, matchedValenceReadings, CB_SIDE_EC_LADDER_DEFAULTS } from "../../../lib/model/fit/cbSideEcLadderWholeFits.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";

describe("CB_SIDE_EC_LADDER_DEFAULTS", () => {
  it("are locked and frozen", () => {
    expect(CB_SIDE_EC_LADDER_DEFAULTS).toEqual({ sameEcFraction: 0.1, vbLayout: [2, 4], vbReadings: 2, maxBudgetSpent: 0.8 });
    expect(Object.isFrozen(CB_SIDE_EC_LADDER_DEFAULTS)).toBe(true);
    expect(Object.isFrozen(CB_SIDE_EC_LADDER_DEFAULTS.vbLayout)).toBe(true);
  });
});

describe("matchedValenceReadings(peaks, chargingEnergyV, bottomV)", () => {
  // Closed-form ladder, by hand: a doublet entered at −1.0 V and a level of four at −1.9 V, Ec/η 0.3 V; resonances at −1.45 and −1.65 V.
  // Entered at −1.65 V the level of four passes over one peak fewer, its charging peaks 0.05 V off
  // −1.9, −2.2 and −2.5 V (within 0.3·Ec/η): matched too, but not as close as the true one's.
  const ecV = 0.3;
  const levelsV = [-1.0, -1.3, -1.9, -2.2, -2.5, -2.8];
  const peaks = [...levelsV, -1.65, -1.45].map((biasV) => ({ biasV, stepA: 1e-11 }));

  it("reads the doublet and the level of four whose charging peaks lie on peaks, the closest first", () => {
    const readings = matchedValenceReadings(peaks, ecV, -3.2);
    expect(readings[0].map((x) => [x.band, x.degeneracy, x.firstPeakV, x.before])).toEqual([
      ["VB", 2, -1.0, 0],
      ["VB", 4, -1.9, 2],
    ]);
    expect(readings.length).toBeLessThanOrEqual(CB_SIDE_EC_LADDER_DEFAULTS.vbReadings);
  });

  it("leaves out peaks that carry almost no step, and reads nothing without VB peaks", () => {
    expect(matchedValenceReadings(peaks.map((x) => ({ ...x, stepA: x.biasV === -1.9 ? 1e-14 : x.stepA })), ecV, -3.2).some((r) => r.some((x) => x.firstPeakV === -1.9))).toBe(false);
    expect(matchedValenceReadings([{ biasV: 1.2, stepA: 1e-11 }], ecV, -3.2)).toEqual([]);
  });
});

describe("cbSideEcLadderWholeFits(context) on low-η draw 5085", () => {
  const { analysis, truth, scenario } = lowEtaDraw(5085);
  const eta = truth.eta;
  const setup = () => {
    const runner = fitRunner(analysis, { eta, temperatureK: scenario.temperatureK, maxPoints: 800, maxEvaluations: 1_000_000_000, timeLimitMs: null, maxIterations: 60, chargingEnergyGuessEV: 0.1, chunkIterations: 4, convergenceTolerance: 1e-5, cbSideMarginFwhm: 2 });
    const trials: FitTrial[] = [];
    const context = (cbSideEcEV: number) => ({
      trials, run: runner.run, cbSide: runner.cbSide, eta, exploreIterations: 8, maxIterations: 60, reduced: runner.reduced,
      // A stand-in for fitCurve's test (reduced χ² ≤ 3 and no residual structure above 5 σ): reduced χ² ≤ 2.
      describes: (t: FitTrial) => runner.reduced(t) <= 2, acceptable: () => true,
      hypotheses: fitHypotheses(analysis, eta, true),
      vbPeaksV: analysis.peaks.filter((x) => x.biasV < 0).map((x) => x.biasV),
      cbSideEcEV,
    });
    return { runner, trials, context };
  };

  it("reaches the simulated values at the CB side's Ec where the VB spacing's Ec misses them", () => {
    const { runner, trials, context } = setup();
    // The fit's CB side (s doublet, p beyond it) gives Ec 196.5 meV; a resonance between the VB doublet's peaks makes their first spacing give about 111 meV.
    const c = context(0.1965);
    expect(mergedPeakEcEV(c)!).toBeLessThan(0.8 * truth.chargingEnergyEV);
    expect(mergedPeakWholeFits(c)).toBeNull();
    const found = cbSideEcLadderWholeFits(c);
    expect(found).not.toBeNull();
    const { whole } = found!;
    expect(runner.reduced(whole)).toBeLessThan(1.2);
    const at = parameterIndex(whole.hypothesis.seeds.length);
    expectClose(whole.loop.parameters[at.chargingEnergy], truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expectClose(whole.loop.parameters[at.logRateRatio], Math.log10(truth.rateRatio), { atol: Math.log10(1.5), what: "log₁₀ Γtip/Γsub (simulated)" });
    expect(whole.hypothesis.cbDegeneracies).toEqual([2, ...truth.pSubgroups]);
    expect(trials).toContain(found!.whole);
    expect(trials).toContain(found!.cb);
  }, 180_000);

  // Note 4: another CB layout than the CB-side winner's replaces it only at a lower CB-side BIC
  // (BIC = χ² + k·ln n, Schwarz 1978, Annals of Statistics 6, 461; the lower the better).
  it("keeps a reading with another CB layout than the CB-side winner's only at a lower CB-side BIC", () => {
    const { context } = setup();
    const c = context(0.1965);
    const found = cbSideEcLadderWholeFits(c)!;
    const layout = (degeneracies: number[]) => ({ seeds: degeneracies.map((degeneracy) => ({ band: "CB", degeneracy })) }) as unknown as FitTrial["hypothesis"];
    expect(found.cb.hypothesis.cbDegeneracies).toEqual([2, 2, 4]);
    const withWinner = (degeneracies: number[], bic: number) => cbSideEcLadderWholeFits({ ...context(0.1965), cbSideWinner: { hypothesis: layout(degeneracies), bic } });
    expect(withWinner([2, 6], found.cb.bic + 10)).not.toBeNull();
    expect(withWinner([2, 6], found.cb.bic - 10)).toBeNull();
    expect(withWinner([2, 2, 4], found.cb.bic - 10)).not.toBeNull();
  }, 180_000);

  it("leaves the ladders alone where the CB side's Ec is the one already matched", () => {
    const { trials, context } = setup();
    const used = mergedPeakEcEV(context(1))!;
    expect(cbSideEcLadderWholeFits(context(used * 1.05))).toBeNull();
    expect(cbSideEcLadderWholeFits(context(0))).toBeNull();
    expect(trials).toHaveLength(0);
  }, 60_000);
});
