// tunnelingEcStarts on a low-η shell-tunnelling spectrum of the accuracy benchmark (seed 1001 draw
// 1147: Ec 170.4 meV, Γtip/Γsub 0.0038, η 0.572), simulated by the fast model: the truth is the
// simulation's own parameters. In shell tunnelling each level's first entry lies at ε + Ec/2 and
// its satellite steps r/(1 + r) of it (orthodox theory: E. Bonet, M. M. Deshmukh and D. C. Ralph,
// Phys. Rev. B 65, 045317 (2002); secondToFirstStepRatio), here 0.4 %, at the noise.
// Where the check values come from: Ec and Γtip/Γsub are the simulation's own parameters (derived:
// the draw's truth); Ec within 3 % is issue 9's bar for a fitted Ec (common practice (no source));
// a reduced χ² below 1.2 is a fit to the noise for the ~800 points fitted (χ²/ν has standard
// deviation √(2/ν) ≈ 0.05, closed form of the χ² distribution); the peak positions are the ones the
// analysis reports for this draw (derived: measured on the spectrum).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { lowEtaDraw } from "../../helpers/lowEtaDraw.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses } from "../../../lib/model/fit/fitHypotheses.ts";
import { parameterIndex } from "../../../lib/model/fit/parameterModel.ts";
import { tunnelingEcStarts, TUNNELING_EC_STARTS_DEFAULTS } from "../../../lib/model/fit/tunnelingEcStarts.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";

describe("TUNNELING_EC_STARTS_DEFAULTS", () => {
  it("are locked and frozen", () => {
    expect(TUNNELING_EC_STARTS_DEFAULTS).toEqual({ maxSatelliteFraction: 0.05, gapFraction: 0.25, gridSteps: 8, sameEcFraction: 0.1, maxBudgetSpent: 0.75 });
    expect(Object.isFrozen(TUNNELING_EC_STARTS_DEFAULTS)).toBe(true);
  });
});

describe("tunnelingEcStarts(input)", () => {
  const draw = lowEtaDraw(1147, "shell-tunneling");
  const { analysis, truth, scenario } = draw;
  const eta = truth.eta;
  const setup = () => {
    const runner = fitRunner(analysis, { eta, temperatureK: scenario.temperatureK, maxPoints: 800, maxEvaluations: 1_000_000_000, timeLimitMs: null, maxIterations: 60, chargingEnergyGuessEV: 0.1, chunkIterations: 4, convergenceTolerance: 1e-5, cbSideMarginFwhm: 2 });
    const h = fitHypotheses(analysis, eta, true).find((x) => x.kind === "assigned")!;
    const at = parameterIndex(h.seeds.length);
    const trials: FitTrial[] = [];
    const input = (whole: FitTrial) => ({
      trials, run: runner.run, cbSide: runner.cbSide, eta, exploreIterations: 20, maxIterations: 60, reduced: runner.reduced,
      // A stand-in for fitCurve's test (reduced χ² ≤ 3 and no residual structure above 5 σ, which the stuck fit shows at 24 σ): reduced χ² ≤ 2.
      describes: (t: FitTrial) => runner.reduced(t) <= 2, acceptable: () => true, whole,
      peaksV: analysis.peaks.filter((x) => x.role !== "second-junction").map((x) => x.biasV),
    });
    return { runner, h, at, trials, input };
  };

  it("reaches the simulated Ec from a whole-curve fit stuck near half of it", () => {
    const { runner, h, at, trials, input } = setup();
    // The whole curve started as the fit's CB side left it: Ec 90 meV, each level's first entry at its peak (ε = η·V − Ec/2;
    // closed form of the tip-junction resonance). The peak positions (V) are the analysis's for draw 1147 (derived).
    const levelsPeaksV = [1.876, 2.534, 1.72, 1.944];
    expect(h.seeds.length).toBe(levelsPeaksV.length);
    const from = [...levelsPeaksV.map((v) => v * eta - 0.045), 0.09, Math.log10(0.02), Math.log10(scenario.broadeningEV)];
    const stuck = runner.run(h, null, 60, from);
    expect(runner.reduced(stuck)).toBeGreaterThan(2);
    const found = tunnelingEcStarts(input(stuck));
    expect(found).not.toBeNull();
    expect(runner.reduced(found!.whole)).toBeLessThan(1.2);
    expectClose(found!.whole.loop.parameters[at.chargingEnergy], truth.chargingEnergyEV, { rtol: 0.03, what: "Ec (simulated)" });
    expect(trials).toContain(found!.whole);
    expect(trials).toContain(found!.cb);
  }, 120_000);

  // Γtip/Γsub = 10 gives a satellite step r/(1 + r) = 10/11 = 0.91 of its level (closed form, orthodox theory), far above 5 %.
  it("leaves a fit alone whose satellites step more than 5 % (Γtip/Γsub 10: r/(1 + r) = 0.91)", () => {
    const { runner, h, at, trials, input } = setup();
    const t = runner.run(h, null, 2);
    const filling = { ...t, loop: { ...t.loop, parameters: t.loop.parameters.map((v, k) => (k === at.logRateRatio ? 1 : v)) } };
    expect(tunnelingEcStarts(input(filling))).toBeNull();
    expect(trials).toHaveLength(0);
  }, 60_000);
});
