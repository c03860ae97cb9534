// splitGridStarts: the sub-level spacings are the bias distances of the peaks after the first p
// peak times η (closed form: a level entered from the empty dot steps at (ε + Ec/2)/η, so two
// such entries lie (ε₂ − ε₁)/η apart); the rate ratio of the starts is r = q/(1 − q) for the s
// doublet's step ratio q (closed form: orthodox theory gives (I₂ − I₁)/I₁ = r/(1 + r) for a
// spin-degenerate level, note 1 of regimeLimits' secondToFirstStepRatio); and a whole p level
// fitted to a fast-model curve of a split shell is recovered exactly from the start the grid
// gives (the simulated parameters are the check values: the model fits its own curve).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { splitGridStarts, SPLIT_GRID_DEFAULTS } from "../../../lib/model/fit/splitGridStarts.ts";
import { secondToFirstStepRatio } from "../../../lib/model/regimeLimits.ts";
import { simulateCurve } from "../../../lib/model/simulate.ts";
import { analyzeCurve } from "../../../lib/pipeline/analyzeCurve.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses, type FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import { parameterIndex } from "../../../lib/model/fit/parameterModel.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";

const eta = 0.85;
const seeds: LevelSeed[] = [
  { band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.765, before: 0 },
  { band: "CB", label: "p", degeneracy: 6, firstPeakV: 1.176, before: 2 },
];
// ε_s 0.6, ε_p 0.9 (eV), Ec 0.1 eV, log₁₀ r 0, log₁₀ σ −2. Entries from the empty dot: s at
// (0.6 + 0.05)/0.85 = 0.7647 V, p at (0.9 + 0.05)/0.85 = 1.1176 V.
const fitted = [0.6, 0.9, 0.1, 0, -2];

describe("splitGridStarts(seeds, parameters, eta, peaks)", () => {
  it("SPLIT_GRID_DEFAULTS are locked", () => {
    expect(SPLIT_GRID_DEFAULTS).toEqual({ spacingEcRange: [0.25, 1.4], maxSpacings: 3, sameSpacingEc: 0.1, entrySnapEc: 0.4, doubletSpacingTolerance: 0.3, doubletEntryEc: 0.3, minStepOfMedian: 0.15, maxStepRatio: 0.9 });
    expect(Object.isFrozen(SPLIT_GRID_DEFAULTS)).toBe(true);
  });

  it("splits p at each peak spacing from the first p peak, 2+4, 2+2+2 and 2+2+2 with the peak the third sub-level, with Γtip/Γsub from the s step ratio", () => {
    const r = 0.6;
    const q = secondToFirstStepRatio(r); // r/(1 + r) = 0.375
    expectClose(q, 0.6 / 1.6, { rtol: 1e-12, what: "closed form r/(1 + r)" });
    // s entry, its second charging peak one Ec/η later, the p entry, a sub-level 0.085 eV above it, and p's own charging peak.
    const pV = (0.9 + 0.05) / eta;
    const peaks = [
      { biasV: 0.65 / eta, stepA: 1 },
      { biasV: 0.65 / eta + 0.1 / eta, stepA: q },
      { biasV: pV, stepA: 0.5 },
      { biasV: pV + 0.085 / eta, stepA: 0.5 },
      { biasV: pV + 0.09 / eta, stepA: 0.5 }, // 0.09 eV: within sameSpacingEc·Ec (0.01 eV) of 0.085 eV, the same spacing
      { biasV: pV + 0.13 / eta, stepA: 0.5 },
      { biasV: pV + 0.2 / eta, stepA: 0.5 }, // 0.2 eV: beyond spacingEcRange[1]·Ec (0.14 eV)
    ];
    const starts = splitGridStarts(seeds, fitted, eta, peaks);
    expect(starts.map((s) => s.layout)).toEqual(["2+2+4", "2+2+2+2", "2+2+2+2", "2+2+4", "2+2+2+2", "2+2+2+2"]);
    const logR = Math.log10(r);
    expectClose(starts[0].parameters, [0.6, 0.9, 0.985, 0.1, logR, -2], { rtol: 1e-9, what: "2+4 at 85 meV, r from q" });
    expectClose(starts[1].parameters, [0.6, 0.9, 0.985, 1.07, 0.1, logR, -2], { rtol: 1e-9, what: "2+2+2 at 85 meV" });
    expectClose(starts[2].parameters.slice(0, 4), [0.6, 0.9, 0.9425, 0.985], { rtol: 1e-9, what: "2+2+2 with the 85 meV peak the third sub-level" });
    expectClose(starts[4].parameters.slice(0, 4), [0.6, 0.9, 1.03, 1.16], { rtol: 1e-9, what: "2+2+2 at 130 meV" });
    expect(starts[0].change).toMatch(/85 meV apart, Γtip\/Γsub 0.60 \(s step ratio\)/);
    // Each seed's first peak inverts startingValues' ε = η·V − Ec·(before + ½).
    for (const s of starts) s.seeds.forEach((x, j) => expectClose(eta * x.firstPeakV - 0.1 * (x.before + 0.5), s.parameters[j], { rtol: 1e-12 }));
  });

  it("keeps the fitted rate ratio where the first two peaks are not an s doublet one Ec apart", () => {
    const peaks = [{ biasV: 0.765, stepA: 1 }, { biasV: 0.95, stepA: 0.3 }, { biasV: 1.1176, stepA: 1 }, { biasV: 1.2176, stepA: 1 }];
    const starts = splitGridStarts(seeds, fitted, eta, peaks);
    expect(starts.map((s) => s.layout)).toEqual(["2+2+4", "2+2+2+2", "2+2+2+2"]);
    expect(starts[0].parameters[4]).toBe(0);
    expect(starts[0].change).toMatch(/as fitted/);
  });

  it("with firstPeakAfterS takes the first p peak from the first CB peak after the s doublet, wherever the fitted p level settled", () => {
    // Closed-form positions: s entries at (0.6 + 0.05)/η and one Ec/η later; the p sub-levels
    // 0.9, 0.96, 1.02 eV entered from the empty dot at (ε + Ec/2)/η. A fitted p level 0.1 eV low
    // (0.8) puts its entry (0.85/η) nearest no peak within entrySnapEc·Ec/η.
    const r = 0.8;
    const q = secondToFirstStepRatio(r);
    const peaks = [{ biasV: 0.65 / eta, stepA: 1 }, { biasV: 0.75 / eta, stepA: q }, ...[0.9, 0.96, 1.02].map((e) => ({ biasV: (e + 0.05) / eta, stepA: 0.5 }))];
    const low = [0.6, 0.8, 0.1, 0, -2];
    const plain = splitGridStarts(seeds, low, eta, peaks);
    expect(plain[0].parameters[1]).toBeCloseTo(0.8, 12);
    const after = splitGridStarts(seeds, low, eta, peaks, { firstPeakAfterS: true });
    // Two spacings (60 and 120 meV), each 2+4, 2+2+2 and 2+2+2 with the peak the third; then the
    // same with V₁ p's entry with one electron on the dot, ε₁ = η·V₁ − 3Ec/2 (closed form).
    const layouts = ["2+2+4", "2+2+2+2", "2+2+2+2", "2+2+4", "2+2+2+2", "2+2+2+2"];
    expect(after.map((s) => s.layout)).toEqual([...layouts, ...layouts]);
    expectClose(after[1].parameters, [0.6, 0.9, 0.96, 1.02, 0.1, Math.log10(r), -2], { rtol: 1e-9, what: "2+2+2 at 60 meV from the first peak after the doublet, r = q/(1 − q)" });
    expectClose(after[7].parameters, [0.6, 0.8, 0.86, 0.92, 0.1, Math.log10(r), -2], { rtol: 1e-9, what: "the same, V₁ the entry with one electron" });
    expect(after[7].change).toMatch(/V₁ its entry with one electron$/);
    // No peak after the doublet: no start.
    expect(splitGridStarts(seeds, low, eta, peaks.slice(0, 2), { firstPeakAfterS: true })).toEqual([]);
  });

  it("gives nothing without an s and a p level", () => {
    expect(splitGridStarts([seeds[0]], [0.6, 0.1, 0, -2], eta, [{ biasV: 1, stepA: 1 }])).toEqual([]);
  });

  it("recovers a 2+4 p shell of a fast-model curve from a whole p level 20 meV above its lower sub-level, with Γtip/Γsub twice the truth", () => {
    // Truth: s 0.6, p 2@0.9 + 4@0.98 eV, Ec 0.1 eV, Γtip/Γsub 0.5, σ 0.008 eV, η 0.85.
    const sim = simulateCurve({
      cb: [{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 2 }, { energyEV: 0.98, degeneracy: 4 }],
      vb: [{ energyEV: -1.2, degeneracy: 2 }],
      chargingEnergyEV: 0.1, eta, tipRatePerS: 1e8, substrateRatePerS: 2e8, temperatureK: 4.5, broadeningEV: 0.008,
      bias: { fromV: -2, toV: 2.2, stepV: 0.002 }, noise: { relative: 0.003, seed: 5 },
    }, { method: "fast" });
    const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta });
    const wholeP = [0.6, 0.92, 0.1, Math.log10(1), Math.log10(0.008)];
    const starts = splitGridStarts(seeds, wholeP, eta, analysis.peaks);
    const runner = fitRunner(analysis, { eta, temperatureK: 4.5, maxPoints: 800, maxEvaluations: 100_000, timeLimitMs: null, maxIterations: 60, chargingEnergyGuessEV: 0.1, chunkIterations: 4, convergenceTolerance: 1e-5, cbSideMarginFwhm: 2 });
    const h0 = fitHypotheses(analysis, eta, false)[0];
    const fits = starts.map((s) => {
      const h: FitHypothesis = { ...h0, seeds: s.seeds, vbReadings: [[]], cbDegeneracies: s.seeds.map((x) => x.degeneracy) };
      return { s, t: runner.run(h, null, 60, s.parameters, runner.cbSide) };
    });
    const best = fits.reduce((a, b) => (b.t.bic < a.t.bic ? b : a));
    expect(best.s.layout).toBe("2+2+4");
    const at = parameterIndex(3);
    const p = best.t.loop.parameters;
    expectClose(p.slice(0, 3), [0.6, 0.9, 0.98], { atol: 0.002, what: "levels (simulated)" });
    expectClose(p[at.chargingEnergy], 0.1, { rtol: 0.01, what: "Ec (simulated)" });
    expectClose(10 ** p[at.logRateRatio], 0.5, { rtol: 0.05, what: "Γtip/Γsub (simulated)" });
    expect(runner.reduced(best.t)).toBeLessThan(1.3);
  }, 60_000);
});
