// The first hole's entry held in the CB-side model at low η. Expected values: closed form (the
// substrate-junction crossing η·|V₁|/(1 − η) of a double-barrier junction, a CB level's own
// crossing −η·V/(1 − η), and the addition energy ε + Ec·(N + ½) = η·|V₁|: E. P. A. M. Bakkers
// et al., Nano Lett. 1, 551 (2001), from memory; C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991));
// and exact recovery of a fast-model simulation's own parameters from a start off by a known amount.
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { heldShellLevels, heldValenceLevels, withHeldLevels } from "../../../lib/model/fit/heldValenceLevels.ts";
import { shellValenceReading } from "../../../lib/model/fit/shellValenceReading.ts";
import { cbSideEndV, heldHoleEntry } from "../../../lib/model/fit/cbSideEnd.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses, type FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import { parameterIndex } from "../../../lib/model/fit/parameterModel.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";
import { simulateCurve } from "../../../lib/model/simulate.ts";
import { analyzeCurve } from "../../../lib/pipeline/analyzeCurve.ts";

const v1: LevelSeed = { band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.5, before: 0 };

describe("heldValenceLevels(seeds, holeEntryV, eta, topV)", () => {
  it("holds the first hole's entry where its crossing η·|V₁|/(1 − η) lies on the CB side (closed form: 0.6·1.5/0.4 = 2.25 V)", () => {
    expect(heldValenceLevels([v1], -1.5, 0.6, 2.25)).toEqual([{ band: "VB", label: "v1 (held)", degeneracy: 2, firstPeakV: -1.5, before: 0 }]);
    expect(heldValenceLevels([v1], -1.5, 0.6, 2.2499)).toEqual([]);
    expect(heldValenceLevels([{ ...v1, degeneracy: 4 }], -1.5, 0.6, 3)[0].degeneracy).toBe(4);
    expect(heldValenceLevels([], -1.5, 0.6, 3)[0].degeneracy).toBe(2);
    expect(heldValenceLevels([v1], null, 0.6, 3)).toEqual([]);
    expect(heldValenceLevels([v1], -1.5, 1, 3)).toEqual([]);
  });

  it("puts the held level at |ε| = η·|V₁| − Ec·(N_before + ½) after the fitted levels (closed form: 0.6·1.5 − 0.1/2 = 0.85 eV)", () => {
    const p = withHeldLevels([0.6, 0.9, 0.1, 0.5, -2], 2, [v1], 0.6);
    expect(p.length).toBe(6);
    expect(p.slice(0, 2)).toEqual([0.6, 0.9]);
    expectClose(p[2], 0.6 * 1.5 - 0.1 / 2, { rtol: 1e-15 });
    expect(p.slice(3)).toEqual([0.1, 0.5, -2]);
    // Its addition energy stays η·|V₁| as Ec moves (closed form).
    const q = withHeldLevels([0.6, 0.9, 0.13, 0.5, -2], 2, [v1], 0.6);
    expectClose(q[2] + 0.13 / 2, 0.9, { rtol: 1e-15 });
    expect(withHeldLevels([0.6, 0.1, 0, -2], 1, [], 0.6)).toEqual([0.6, 0.1, 0, -2]);
  });
});

describe("heldShellLevels(vbPeaksV, chargingEnergyV, eta, topV)", () => {
  // A doublet and a level of four at Ec/η = 0.1 V (closed form: the doublet's two charging peaks
  // at −1.0 and −1.1 V; the level of four's entry at −1.25 V and its charging peaks 0.1 V apart).
  const peaks = [-1.0, -1.1, -1.25, -1.35, -1.45, -1.55];
  it("holds the shell reading's levels whose crossing η·|V₁|/(1 − η) lies on the CB side (closed form: 0.6·1.0/0.4 = 1.5 V, 0.6·1.25/0.4 = 1.875 V)", () => {
    const both = heldShellLevels(peaks, 0.1, 0.6, 1.875);
    // The same levels as shellValenceReading (an exact equivalence with the general reading), labelled held.
    expect(both).toEqual(shellValenceReading(peaks, 0.1).map((s) => ({ ...s, label: `${s.label} (held)` })));
    expect(both.map((s) => [s.label, s.degeneracy, s.firstPeakV])).toEqual([["v1 (held)", 2, -1.0], ["v2 (held)", 4, -1.25]]);
    expect(heldShellLevels(peaks, 0.1, 0.6, 1.8749).map((s) => s.degeneracy)).toEqual([2]);
    expect(heldShellLevels(peaks, 0.1, 0.6, 1.4999)).toEqual([]);
    expect(heldShellLevels(peaks, 0.1, 1, 10)).toEqual([]);
    expect(heldShellLevels([], 0.1, 0.6, 10)).toEqual([]);
  });
});

describe("heldHoleEntry(peaks, eta) and cbSideEndV(…, holdHole)", () => {
  it("reads the peak nearest 0 V as the first hole's entry, whatever its role, unless a CB peak's own crossing lies there (closed form −η·V/(1 − η))", () => {
    const entry = heldHoleEntry([{ biasV: -1.5, fwhmV: 0.05, role: "satellite" }, { biasV: -1.8, fwhmV: 0.05, role: "level" }, { biasV: 1.2, fwhmV: 0.05, role: "level" }], 0.6);
    expect(entry?.entry.biasV).toBe(-1.5);
    expect(entry?.next?.biasV).toBe(-1.8);
    // 0.56·1.30/0.44 = 1.6545: the peak at −1.66 V is the CB peak's crossing.
    expect(heldHoleEntry([{ biasV: -1.66, fwhmV: 0.07, role: "level" }, { biasV: 1.3, fwhmV: 0.07, role: "unassigned" }], 0.56)).toBeNull();
    expect(heldHoleEntry([{ biasV: 1.3, fwhmV: 0.07, role: "level" }], 0.6)).toBeNull();
    expect(heldHoleEntry([{ biasV: -1.5, fwhmV: 0.05, role: "level" }], 1)).toBeNull();
  });

  it("with the hole held, ends the CB side below the next entry's crossing, its margin widened by η/(1 − η) (closed form: 0.6·1.7/0.4 − 2·0.05·1.5 = 2.4 V)", () => {
    const peaks = [
      { biasV: -1.5, fwhmV: 0.05, role: "level" },
      { biasV: -1.7, fwhmV: 0.05, role: "satellite" },
      { biasV: 1.2, fwhmV: 0.05, role: "level" },
      { biasV: 1.4, fwhmV: 0.05, role: "level" },
      { biasV: 2.3, fwhmV: 0.05, role: "level" },
    ];
    expectClose(cbSideEndV(peaks, 0.6, 2, true), 0.6 * 1.7 / 0.4 - 2 * 0.05 * 1.5, { rtol: 1e-12 });
    // Without holding: below the first VB level peak's crossing, 0.6·1.5/0.4 − 2·0.05 = 2.15 V (the rule before).
    expectClose(cbSideEndV(peaks, 0.6, 2, false), 2.15, { rtol: 1e-12 });
    // Where the first VB level peak's end keeps p's first step (the third CB peak), nothing is held.
    const pInside = peaks.map((p) => (p.biasV === 2.3 ? { ...p, biasV: 2.0 } : p));
    expectClose(cbSideEndV(pInside, 0.6, 2, true), 2.15, { rtol: 1e-12 });
    // No next entry: the whole positive side.
    expect(cbSideEndV(peaks.filter((p) => p.biasV !== -1.7), 0.6, 2, true)).toBe(Infinity);
  });
});

describe("a CB-side fit with the first hole's entry held, at η = 0.6", () => {
  // s (g 2) at 0.6 eV, p (g 6) at 0.8 eV, Ec 0.1 eV; a VB level of one hole at −0.75 eV (entry
  // E = 0.8 eV: tip side −0.8/0.6 = −1.333 V, substrate side 0.8/0.4 = 2.0 V, between p's second
  // and third steps at 1.917 and 2.083 V) and a doublet at −1.2 eV (second entry 1.35 eV: tip side
  // −2.25 V, substrate side 3.375 V, both outside the window).
  const eta = 0.6;
  const truth = { s: 0.6, p: 0.8, ec: 0.1, logR: Math.log10(2), logSigma: Math.log10(0.008) };
  const sim = simulateCurve(
    {
      cb: [{ energyEV: truth.s, degeneracy: 2 }, { energyEV: truth.p, degeneracy: 6 }],
      vb: [{ energyEV: -0.75, degeneracy: 1 }, { energyEV: -1.2, degeneracy: 2 }],
      chargingEnergyEV: truth.ec, eta, tipRatePerS: 2e8, substrateRatePerS: 1e8, temperatureK: 4.5, broadeningEV: 0.008,
      bias: { fromV: -2.2, toV: 2.8, stepV: 0.002 }, noise: { relative: 0.0005, seed: 7 },
    },
    { method: "fast" },
  );
  const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta });
  const settings = { eta, temperatureK: 4.5, maxPoints: 2500, maxEvaluations: 1e9, timeLimitMs: null, maxIterations: 60, chargingEnergyGuessEV: 0.1, chunkIterations: 4, convergenceTolerance: 1e-10 };
  const runner = fitRunner(analysis, { ...settings, cbSideMarginFwhm: 2, cbSideHeldHole: false });
  const [h0] = fitHypotheses(analysis, eta, false);
  const seeds: LevelSeed[] = [
    { band: "CB", label: "s", degeneracy: 2, firstPeakV: (truth.s + truth.ec / 2) / eta, before: 0 },
    { band: "CB", label: "p", degeneracy: 6, firstPeakV: (truth.p + 2.5 * truth.ec) / eta, before: 2 },
  ];
  const hc: FitHypothesis = { ...h0, seeds, vbReadings: [[]], cbDegeneracies: [2, 6], chargingEnergyStartEV: truth.ec, rateRatioStartLog10: truth.logR };
  // The hypothesis' first VB level gives the held level's degeneracy (one hole, as simulated).
  const held: FitHypothesis = { ...hc, heldVb: heldValenceLevels([{ band: "VB", label: "v1", degeneracy: 1, firstPeakV: -0.8 / eta, before: 0 }], -0.8 / eta, eta, 2.8) };
  // The whole positive side (the hole's crossing at 2.0 V inside it).
  const all = runner.all;
  const idx = Array.from(all.biasV.keys()).filter((i) => all.biasV[i] > 0);
  const positive = { biasV: Float64Array.from(idx, (i) => all.biasV[i]), dataA: Float64Array.from(idx, (i) => all.dataA[i]), v3: Float64Array.from(idx, (i) => all.v3[i]), n: idx.length, data: { x: idx.map((_, i) => i), y: idx.map((i) => all.data.y[i]) } };
  const at = parameterIndex(2);
  const start = [truth.s + 0.015, truth.p - 0.015, truth.ec + 0.005, truth.logR + Math.log10(2), truth.logSigma + 0.1];

  it("recovers the levels, Ec and Γtip/Γsub over the whole positive side (exact to the noise)", () => {
    expect(held.heldVb?.length).toBe(1);
    const t = runner.run(held, null, 60, start, positive);
    const p = t.loop.parameters;
    expectClose(p[0], truth.s, { atol: 2e-4, what: "ε_s" });
    expectClose(p[1], truth.p, { atol: 2e-4, what: "ε_p" });
    expectClose(p[at.chargingEnergy], truth.ec, { rtol: 1e-3, what: "Ec" });
    expectClose(p[at.logRateRatio], truth.logR, { atol: 0.005, what: "log₁₀ Γtip/Γsub" });
    expectClose(p[at.logBroadening], truth.logSigma, { atol: 0.01, what: "log₁₀ σ" });
    expect(runner.reduced(t)).toBeLessThan(1.5);
    // k counts the fitted parameters and the four linear ones only: the held level is not fitted.
    expect(t.k).toBe(start.length + 4);
    // The same start without the held level cannot describe the hole's step at 2.0 V.
    const bare = runner.run(hc, null, 60, start, positive);
    expect(runner.reduced(bare)).toBeGreaterThan(10 * runner.reduced(t));
  }, 60_000);
});
