// The VB ladder's second-junction resonances predicted as current and taken out of the CB side
// (lib/pipeline/valenceLadder.ts). The unit cases are exact equivalences with the project's fast
// model (lib/model/bandCurrent.ts): a VB ladder read from its own exact peaks gives back the
// model's resonance steps, and subtracting them from the current of a dot leaves the CB ladder's
// current to rounding. The draws are the accuracy benchmark's low-η mix (η 0.55–0.65, resonances
// kept), simulated by the same model: the expected values are the simulation's truth.
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { valenceLadderPrediction, valenceResonancePeaks, stepsCurrent, fullShell, subtractionWarning, VALENCE_LADDER_DEFAULTS } from "../../lib/pipeline/valenceLadder.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";
import { bandLadders, currentSteps, fastCurrent, type DotModel } from "../../lib/model/bandCurrent.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { erf } from "mathjs";
import { lowEtaDraw } from "../helpers/lowEtaDraw.ts";

describe("VALENCE_LADDER_DEFAULTS", () => {
  it("is frozen with the documented values", () => {
    expect(Object.isFrozen(VALENCE_LADDER_DEFAULTS)).toBe(true);
    expect(VALENCE_LADDER_DEFAULTS).toEqual({ minRateRatio: 1.5, maxRateRatio: 100, rateRatioGrid: 9, maxMisfitPerStep: 0.12, relaxationRateFactor: 1000, maxStates: 4096, temperatureK: 4.5 });
  });
});

describe("stepsCurrent", () => {
  it("is a Gaussian-broadened step of the given FWHM on a zero base (closed form, Φ from mathjs.erf)", () => {
    const fwhmV = 0.05, sigma = fwhmV / GAUSSIAN_FWHM_PER_SIGMA;
    const x = [0.9, 0.97, 1, 1.02, 1.2];
    const got = stepsCurrent([{ biasV: 1, heightA: 1e-11, thermalWidthV: 0 }], x, fwhmV);
    expectClose(got, x.map((v) => 1e-11 * 0.5 * (1 + (erf((v - 1) / (sigma * Math.SQRT2)) as number))), { rtol: 1e-6, atol: 1e-22, what: "h·Φ((V − V₀)/σ), closed form" });
  });
});

// A dot of the fast model at η = 0.65: VB levels of 2 and 4 holes (0.8 and 0.95 eV below the
// gap), CB s and p far enough that the CB ladder's resonances lie below the VB side's fitted stretch.
const eta = 0.65, ecEV = 0.1, r = 10;
const dot: DotModel = {
  cb: [{ energyEV: 1.2, degeneracy: 2 }, { energyEV: 1.5, degeneracy: 6 }],
  vb: [{ energyEV: -0.8, degeneracy: 2 }, { energyEV: -0.95, degeneracy: 4 }],
  chargingEnergyEV: ecEV, eta, tipRatePerS: r * 1e8, substrateRatePerS: 1e8, relaxationRatePerS: 1000 * r * 1e8, temperatureK: 4.5,
};
const fwhmV = 0.06;
const biasV = Float64Array.from({ length: 3001 }, (_, i) => -3 + i * 0.002);
const modelCurrent = (m: DotModel) => fastCurrent(currentSteps(m, bandLadders(m)), biasV, fwhmV / GAUSSIAN_FWHM_PER_SIGMA);
const vbOnly = { ...dot, cb: [] };
const vbSteps = currentSteps(vbOnly, bandLadders(vbOnly)).steps;
// The VB peaks where the model's charging steps lie (the tip junction, negative bias; the ladder's
// weak excited-state crossings, under a fifth of the largest step, make no peak), with its heights.
const largestA = Math.max(...vbSteps.filter((s) => s.biasV < 0).map((s) => s.heightA));
const tipSteps = vbSteps.filter((s) => s.biasV < 0 && s.heightA > 0.2 * largestA).sort((a, b) => b.biasV - a.biasV);
const asPeak = (v: number, stepA: number): Peak => ({ biasV: v, biasUncertaintyV: 0.002, index: 0, heightS: 1e-10, prominenceS: 1e-10, fwhmV, stepA, snr: 50, stepSignificance: 50 });
const peaks = [...tipSteps].reverse().map((s) => asPeak(s.biasV, s.heightA));
const idx = (v: number) => peaks.findIndex((p) => p.biasV === v);
const vbGroup = (label: string, members: number[]) => ({ band: "VB" as const, label, degeneracy: null, peakIndices: members, peaksV: members.map((i) => peaks[i].biasV), peakUncertaintiesV: [], found: members.length, expected: null, subgroups: [members.length] });
const assignment = {
  regime: "shell-filling" as const,
  multiplets: [vbGroup("v1", tipSteps.slice(0, 2).map((s) => idx(s.biasV))), vbGroup("v2", tipSteps.slice(2).map((s) => idx(s.biasV)))],
  quantities: { chargingEnergyV: ecEV / eta },
  evidence: { secondToFirstStepRatio: r / (1 + r) },
} as never;

describe("valenceLadderPrediction", () => {
  it("gives back the model's resonance steps from the model's own VB peaks (exact equivalence with currentSteps)", () => {
    // Tip steps of the two levels: 2 + 4 holes, Ec/η apart inside a level (closed form of the ladder).
    expect(tipSteps.length).toBe(6);
    const pred = valenceLadderPrediction(peaks, assignment, eta, [-3, 3], { biasV, currentA: modelCurrent(vbOnly), fwhmV })!;
    expect(pred).not.toBeNull();
    expectClose(pred.chargingEnergyEV, ecEV, { rtol: 1e-9, what: "Ec, the model's" });
    expectClose(pred.levels.map((l) => l.energyEV), [-0.8, -0.95], { rtol: 1e-9, what: "VB levels, the model's" });
    expect(pred.levels.map((l) => l.degeneracy)).toEqual([2, 4]);
    expectClose(pred.rateRatio, r, { rtol: 1e-9, what: "Γtip/Γsub, the model's (the s doublet's reading fits exactly)" });
    expectClose(pred.scale, 1e8, { rtol: 1e-9, what: "Γsub, the model's" });
    const want = vbSteps.filter((s) => s.biasV > 0 && s.biasV <= 3);
    // Every step the model has in the window, the zero-height crossings among them.
    expect(pred.steps.length).toBe(want.length);
    expectClose(pred.steps.map((s) => s.biasV), want.map((s) => s.biasV), { rtol: 1e-9, what: "resonance positions, currentSteps of the model" });
    expectClose(pred.steps.map((s) => s.heightA), want.map((s) => s.heightA), { rtol: 1e-9, what: "resonance heights, currentSteps of the model" });
    expect(pred.misfitPerStep).toBeLessThan(1e-6);
  });

  it("models the s level's resonances on the VB side with the same rates (note 3; exact equivalence with currentSteps)", () => {
    // s at 0.6 eV: its resonances −(ε + Ec·(N + ½))/(1 − η) ≈ −1.86 and −2.14 V fall among the VB peaks.
    const withS: DotModel = { ...vbOnly, cb: [{ energyEV: 0.6, degeneracy: 2 }] };
    const sOnly = { ...withS, vb: [] };
    const sTip = currentSteps(sOnly, bandLadders(sOnly)).steps.filter((st) => st.biasV > 0);
    expect(currentSteps(sOnly, bandLadders(sOnly)).steps.filter((st) => st.biasV < 0 && st.biasV > tipSteps[tipSteps.length - 1].biasV).length).toBeGreaterThan(0);
    const all = [...peaks, ...sTip.map((st) => asPeak(st.biasV, st.heightA))];
    const a = assignment as unknown as { multiplets: object[] };
    const withSAssignment = { ...a, multiplets: [...a.multiplets, { band: "CB", label: "s", degeneracy: 2, peakIndices: [peaks.length, peaks.length + 1], subgroups: [2] }] };
    const pred = valenceLadderPrediction(all, withSAssignment as never, eta, [-3, 3], { biasV, currentA: modelCurrent(withS), fwhmV })!;
    expectClose(pred.scale, 1e8, { rtol: 1e-9, what: "Γsub, the model's" });
    const want = vbSteps.filter((st) => st.biasV > 0 && st.biasV <= 3);
    expectClose(pred.steps.map((st) => st.heightA), want.map((st) => st.heightA), { rtol: 1e-9, what: "resonance heights, currentSteps of the VB ladder" });
    // Without the s level in the assignment, its resonances' current is read as the VB's: the scale is off.
    const without = valenceLadderPrediction(all, assignment, eta, [-3, 3], { biasV, currentA: modelCurrent(withS), fwhmV });
    expect(without === null || Math.abs(without.scale / 1e8 - 1) > 0.01).toBe(true);
  });

  it("gives nothing for an odd VB sub-group, outside shell filling, or where the model misfits the VB side (notes 1, 4)", () => {
    const a = assignment as unknown as { multiplets: ReturnType<typeof vbGroup>[] };
    const odd = { ...a, multiplets: [a.multiplets[0], { ...a.multiplets[1], peakIndices: a.multiplets[1].peakIndices.slice(0, 3), subgroups: [3] }] };
    const current = { biasV, currentA: modelCurrent(vbOnly), fwhmV };
    expect(valenceLadderPrediction(peaks, odd as never, eta, [-3, 3], current)).toBeNull();
    expect(valenceLadderPrediction(peaks, { ...a, regime: "shell-tunneling" } as never, eta, [-3, 3], current)).toBeNull();
    // v2 read as a doublet of its first and last peaks (the two between missed): the model lacks
    // two steps inside the fitted stretch and misfits the VB current by about a step.
    const v2 = a.multiplets[1].peakIndices;
    const short = { ...a, multiplets: [a.multiplets[0], { ...a.multiplets[1], peakIndices: [v2[0], v2[3]], subgroups: [2] }] };
    expect(valenceLadderPrediction(peaks, short as never, eta, [-3, 3], current)).toBeNull();
  });
});

describe("valenceResonancePeaks", () => {
  it("leaves the CB ladder's current to rounding where the VB ladder is predicted exactly (exact equivalence: the model's bands add)", () => {
    const whole = modelCurrent(dot), cb = modelCurrent({ ...dot, vb: [] });
    const didv = new Float64Array(biasV.length);
    const got = valenceResonancePeaks(whole, didv, biasV, peaks, peaks.map((p) => p.stepA), assignment, eta, fwhmV, { differentiate: (y) => y.slice(), findPeaks: () => [asPeak(2.0, 1e-11)] })!;
    expect(got).not.toBeNull();
    const scaleA = Math.max(...cb.map(Math.abs));
    let worst = 0;
    for (let i = 0; i < biasV.length; i++) if (biasV[i] > 0) worst = Math.max(worst, Math.abs(got.currentA[i] - cb[i]));
    // The scale is a least-squares estimate (exact here to about 1e-9 of itself): "rounding" is 1e-7 of the current.
    expect(worst).toBeLessThan(1e-7 * scaleA);
    // The remainder's conductance is the conductance less the filtered prediction (here the identity filter).
    for (let i = 0; i < biasV.length; i += 250) expectClose(got.didvS[i], -(whole[i] - got.currentA[i]), { rtol: 1e-12, atol: 1e-30, what: "didv − filter(prediction)" });
    // The VB side's peaks are kept, the CB side's are those found on the remainder.
    expect(got.peaks.map((p) => p.biasV)).toEqual([...peaks.map((p) => p.biasV), 2.0]);
  });
});

describe("fullShell", () => {
  it("reads p full where it holds its expected count", () => {
    const m = (found: number) => ({ multiplets: [{ band: "CB", label: "p", found, expected: 6 }] }) as never;
    expect(fullShell(m(6), "p")).toBe(true);
    expect(fullShell(m(5), "p")).toBe(false);
    expect(fullShell(m(6), "d")).toBe(false);
  });
});

// Draws of the low-η mix where p's first charging peak lies on the VB band-edge level's resonance
// through the substrate junction: the ladder read from the VB side predicts it, and the CB side
// found again on the remainder reads p with its six peaks.
describe("analyzeCurve(curve, { eta }): p read on the current less the VB ladder's resonances (low-η draws)", () => {
  // Draw 123: p1 2.350 V, the resonance 2.323 V; draw 92: p1 2.916 V, the resonance 2.919 V.
  for (const start of [123, 92]) {
    it(`predicts the resonances of the truth and reads p with its six peaks (draw ${start})`, () => {
      const { scenario, truth, sim, analysis: a, tolV } = lowEtaDraw(start);
      // The draw is the case: p's first peak lies at a resonance of the truth.
      expect(truth.secondJunctionPeaksV.some((v) => Math.abs(v - truth.pPeaksV[0]) < tolV)).toBe(true);
      // The prediction from the analysis' VB side against the simulation's own VB resonance steps.
      const top = sim.biasV[sim.biasV.length - 1];
      const pred = valenceLadderPrediction(a.peaks, a.assignment, truth.eta, [0, top], { biasV: a.conductance.biasV, currentA: a.conductance.currentA, fwhmV: a.settings.peakWidthMV / 1000 })!;
      expect(pred).not.toBeNull();
      const m = scenario as unknown as DotModel;
      const own = currentSteps({ ...m, cb: [] }).steps.filter((s) => s.biasV > 0 && s.biasV <= top && s.heightA > 0.2 * pred.steps[0].heightA);
      for (const s of own) {
        const near = pred.steps.reduce((b, q) => (Math.abs(q.biasV - s.biasV) < Math.abs(b.biasV - s.biasV) ? q : b));
        expectClose(near.biasV, s.biasV, { atol: 0.015, what: "resonance position, the simulation's model" });
        expectClose(near.heightA, s.heightA, { rtol: 0.15, what: "resonance height, the simulation's model" });
      }
      const p = a.assignment.multiplets.find((x) => x.band === "CB" && x.label === "p");
      expect(a.assignment.regime).toBe("shell-filling");
      expect(p?.peaksV.length).toBe(6);
      expectClose(p!.peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
      // The record says the resonances were taken out, and where: each step of the truth's model named.
      const note = a.warnings.find((w) => w.startsWith("CB peaks found on the current less the VB ladder's predicted"));
      expect(note).toBeDefined();
      expect(own.length).toBeGreaterThan(0);
      const named = [...note!.matchAll(/\d+\.\d{3}(?=[,;] | V;)/g)].map((x) => Number(x[0]));
      for (const s of own) expect(named.some((v) => Math.abs(v - s.biasV) < 0.015), `step at ${s.biasV} V named`).toBe(true);
      // The same steps in the record's own field, heights too; the warning is made from it.
      const taken = a.subtractedResonances!;
      for (const s of own) {
        const near = taken.steps.reduce((b, q) => (Math.abs(q.biasV - s.biasV) < Math.abs(b.biasV - s.biasV) ? q : b));
        expectClose(near.biasV, s.biasV, { atol: 0.015, what: "subtracted step, the simulation's model" });
        expectClose(near.heightA, s.heightA, { rtol: 0.15, what: "subtracted height, the simulation's model" });
      }
      expect(note).toBe(subtractionWarning(taken));
    }, 30_000);
  }
});
