// Second-junction resonances. Closed form (orthodox theory of the double-barrier junction with a
// capacitive divider: D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena in Solids (Elsevier,
// 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)): a level seen through the tip junction
// at V₁ = (ε + Ec/2)/η lines up with the substrate's Fermi level at V₂ = −(ε + Ec/2)/(1 − η)
// = −η·V₁/(1 − η). The model check uses the project's master equation, whose closed-form plateaus
// are tested in test/model/ladder.test.ts.
import { describe, it, expect } from "vitest";
import { crowdedResonances, deeperChargingResonances, overlappedResonances, satelliteChargingEV, secondJunctionResonances, substrateChargingPeaks, SECOND_JUNCTION_DEFAULTS } from "../../lib/assign/secondJunction.ts";
import { substrateToTipStepRatio } from "../../lib/model/regimeLimits.ts";
import { analyzeCurve, assignSpectrum, analysisToJson, formatAnalysisText, loadCurveFigure, simulateCurve, SECOND_JUNCTION, type Peak } from "../../lib/index.ts";
import { expectClose } from "../helpers/expectClose.ts";

const peak = (biasV: number, sigma = 0.002): Peak => ({
  biasV, biasUncertaintyV: sigma, index: 0, heightS: 1e-9, prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30,
});

describe("secondJunctionResonances(peaks, eta)", () => {
  it("finds the resonance of a CB peak at −η·V/(1 − η) on the VB side (closed form)", () => {
    const eta = 0.62;
    const vs = 0.9;
    const v2 = (-eta * vs) / (1 - eta); // −1.4684 V
    const r = secondJunctionResonances([peak(v2 + 0.003), peak(-1.0), peak(vs)], eta);
    expect(r.map((x) => [x.index, x.sourceIndex])).toEqual([[0, 2]]);
    expectClose(r[0].predictedV, v2, { rtol: 1e-12 });
  });

  it("finds the resonance of a VB peak on the CB side, and none at η = 1 or without a match", () => {
    const eta = 0.6;
    const vv = -0.8;
    expect(secondJunctionResonances([peak(vv), peak(0.7), peak((-eta * vv) / (1 - eta))], eta).map((x) => x.index)).toEqual([2]);
    expect(secondJunctionResonances([peak(vv), peak(0.7), peak(1.2)], 1)).toEqual([]);
    expect(secondJunctionResonances([peak(vv), peak(0.7), peak(1.5)], eta)).toEqual([]); // predicted 1.2 V, 0.3 V away
  });

  it("a source located no better than its own width (σ far beyond FWHM/2) matches nothing across the window (closed form −η·V/(1 − η))", () => {
    // η = 0.916: the source at −1.182 V predicts +0.916·1.182/0.084 = 12.89 V, far outside a ±3 V window;
    // with its raw σ of 3.8 V (a weak step the local fit cannot place) 3σ·η/(1 − η) would reach every CB peak.
    const eta = 0.916;
    const weak = peak(-1.182, 3.8);
    const predictedV = (eta * 1.182) / (1 - eta);
    expectClose(predictedV, 12.889, { rtol: 1e-3, what: "closed form −η·V/(1 − η)" });
    expect(secondJunctionResonances([weak, peak(1.456), peak(1.844), peak(2.021)], eta)).toEqual([]);
    // At its own FWHM/2 (0.02 V) the window is 3·hypot(10.9·0.02, 0.002) ≈ 0.65 V around 12.89 V: still nothing.
    // A peak at the predicted position is still found.
    expect(secondJunctionResonances([weak, peak(predictedV - 0.3)], eta).map((x) => x.index)).toEqual([1]);
  });

  it("a resonance predicts nothing further (it is not a level)", () => {
    const eta = 0.6; // gain 1.5
    // 0.5 → −0.75 (resonance); −0.75 would predict +1.125, but that peak is a level here.
    const r = secondJunctionResonances([peak(-0.75), peak(0.5), peak(1.125)], eta);
    expect(r.map((x) => x.index)).toEqual([0]);
  });

  it("SECOND_JUNCTION_DEFAULTS are locked (common practice, no source: 3σ, or half the FWHM for an η known to a few %; Ec at most a quarter of the gap; closed form 13/17 for the step ratio)", () => {
    expect(SECOND_JUNCTION_DEFAULTS).toEqual({ toleranceSigma: 3, toleranceFwhmFraction: 0.5, companionChargingFractionMax: 0.25, companionSpacingFwhmMin: 1, companionSourceStepRatioMax: expect.any(Number), ownShareSourceStepRatioMin: expect.any(Number), overlapSourceStepRatioMin: expect.any(Number), deeperChargingMax: 2, companionChargingSpacingTolerance: 0.3, satelliteStepFractionRange: [0.1, 0.5] });
    expectClose(SECOND_JUNCTION_DEFAULTS.ownShareSourceStepRatioMin, 1 / 2, { rtol: 1e-12, what: "(g·r + 1)/(g + r) at g = 2, r → 0" });
    expectClose(SECOND_JUNCTION_DEFAULTS.companionSourceStepRatioMax, 13 / 17, { rtol: 1e-12, what: "(g·r + 1)/(g + r) at g = 2, r = 3/7" });
    expectClose(SECOND_JUNCTION_DEFAULTS.overlapSourceStepRatioMin, 1, { rtol: 1e-12, what: "closed form: (g·r + 1)/(g + r) at r = 1" });
  });
});

describe("secondJunctionResonances: a peak without a current step predicts none", () => {
  it("leaves the peak at a step-less peak's −η·V/(1 − η) as a level, and takes it where the source steps", () => {
    // η = 0.62: 0.9 V predicts −0.62·0.9/0.38 = −1.468 V (closed form). The resonance steps in
    // proportion to its source's step ((g·r + 1)/(g + r) of it), so a source of step 0 gives none.
    const noStep = [{ ...peak(-1.47), stepA: 1e-12 }, { ...peak(0.9), stepA: 0 }];
    expect(secondJunctionResonances(noStep, 0.62)).toEqual([]);
    const stepping = [{ ...peak(-1.47), stepA: 1e-12 }, { ...peak(0.9), stepA: 2e-12 }];
    expect(secondJunctionResonances(stepping, 0.62).map((r) => r.index)).toEqual([0]);
  });
});

describe("substrateChargingPeaks(peaks, resonances, eta, stepRatio)", () => {
  // Shell tunnelling at η = 0.6 (gain η/(1 − η) = 1.5): v1 at −1.0 V through the tip; through the
  // substrate its charging doublet at 1.5 V and 1.5 + Ec/(1 − η) = 1.75 V for Ec = 0.1 eV (closed
  // form); each substrate step about half the tip step (substrateToTipStepRatio(2, r) → 1/2 for r → 0).
  const at = (biasV: number, stepA: number): Peak => ({ ...peak(biasV), stepA });
  it("finds the second charging peak of the resonance of the gap-edge level, past a level between them", () => {
    const peaks = [at(-1.0, 2e-12), at(0.9, 2e-12), at(1.5, 1e-12), at(1.6, 6e-12), at(1.75, 0.95e-12)];
    const res = secondJunctionResonances(peaks, 0.6);
    expect(res.map((r) => r.index)).toEqual([2]);
    expect(substrateChargingPeaks(peaks, res, 0.6, [0.6, 1.3]).map((r) => r.index)).toEqual([4]);
  });
  it("takes no peak within one FWHM of the resonance for its second charging peak (a part of the same peak)", () => {
    // Exact geometry: 1.53 V lies 0.03 V beyond the resonance, under its 0.04 V FWHM, and outside
    // its match tolerance (max(3σ, FWHM/2) = 0.02 V), so it is free; the doublet's spacing
    // Ec/(1 − η) = 0.25 V is far larger.
    const peaks = [at(-1.0, 2e-12), at(0.9, 2e-12), at(1.5, 1e-12), at(1.53, 0.9e-12), at(1.75, 0.95e-12)];
    const res = secondJunctionResonances(peaks, 0.6);
    expect(res.map((r) => r.index)).toEqual([2]);
    expect(Math.abs(peaks[3].biasV - peaks[2].biasV)).toBeLessThan(SECOND_JUNCTION_DEFAULTS.companionSpacingFwhmMin * peaks[2].fwhmV);
    expect(substrateChargingPeaks(peaks, res, 0.6, [0.6, 1.3]).map((r) => r.index)).not.toContain(3);
  });
  it("takes no peak much nearer than Ec/(1 − η) where a charging satellite measures Ec (note 5)", () => {
    // v1 at −1.0 V and its tip-side charging satellite at −1.2 V (a fifth of its step): Ec = η × 0.2 V
    // = 0.12 eV, so the companion lies Ec/(1 − η) = 0.3 V beyond the resonance at 1.5 V (closed
    // form); the peak at 1.6 V, 0.1 V beyond and stepping like the resonance, is a level.
    const withSatellite = [at(-1.0, 2e-12), at(-1.2, 4e-13), at(0.9, 2e-12), at(1.5, 1e-12), at(1.6, 0.95e-12)];
    const withoutSatellite = withSatellite.filter((_, k) => k !== 1);
    expect(satelliteChargingEV(withSatellite, 0.6, -1)).toBeCloseTo(0.12, 12);
    expect(satelliteChargingEV(withoutSatellite, 0.6, -1)).toBeNull();
    expect(substrateChargingPeaks(withoutSatellite, secondJunctionResonances(withoutSatellite, 0.6), 0.6, [0.6, 1.3]).map((r) => r.index)).toEqual([3]);
    const res = secondJunctionResonances(withSatellite, 0.6);
    expect(res.map((r) => r.index)).toEqual([3]);
    expect(substrateChargingPeaks(withSatellite, res, 0.6, [0.6, 1.3])).toEqual([]);
  });
  it("finds none where the resonance is higher than its source (the substrate side of shell filling shows a level, ratio → 2)", () => {
    const peaks = [at(-1.0, 1e-12), at(0.9, 1e-12), at(1.5, 1.9e-12), at(1.75, 1.8e-12)];
    expect(substrateChargingPeaks(peaks, secondJunctionResonances(peaks, 0.6), 0.6, [0.6, 1.3])).toEqual([]);
  });
});

describe("substrateChargingPeaks(…, fromSource = true): the companion judged against the resonance's own share of its source", () => {
  // Shell tunnelling at η = 0.6 (gain 1.5): v1 at −1.0 V (2 pA), its resonance at 1.5 V with the
  // s level under it, and the resonance's second charging peak at 1.5 + Ec/(1 − η) = 1.75 V for
  // Ec = 0.1 eV (closed form). The resonance alone steps (g·r + 1)/(g + r) of its source, 1/2 to
  // 13/17 for g = 2 and r = Γtip/Γsub from 0 to 3/7 (closed form), and the companion about as much.
  const at = (biasV: number, stepA: number): Peak => ({ ...peak(biasV), stepA });
  const peaks = [at(-1.0, 2e-12), at(1.5, 3e-12), at(1.75, 1.1e-12), at(2.3, 4e-12)];
  const res = [{ index: 1, sourceIndex: 0, predictedV: 1.5 }];
  it("finds the companion past a merged level + resonance peak that the plain test skips (it steps more than its source)", () => {
    expect(substrateChargingPeaks(peaks, res, 0.6, [0.6, 1.3])).toEqual([]);
    expect(substrateChargingPeaks(peaks, res, 0.6, [0.6, 1.3], true).map((r) => r.index)).toEqual([2]);
  });
  it("takes no peak stepping like a level of its own (above 1.3 × 13/17 of the source) or far below the least share (0.6 × 1/2)", () => {
    const strong = [at(-1.0, 2e-12), at(1.5, 3e-12), at(1.75, 2.2e-12)];
    expect(substrateChargingPeaks(strong, res, 0.6, [0.6, 1.3], true)).toEqual([]);
    const weak = [at(-1.0, 2e-12), at(1.5, 3e-12), at(1.75, 0.5e-12)];
    expect(substrateChargingPeaks(weak, res, 0.6, [0.6, 1.3], true)).toEqual([]);
  });
});

describe("assignSpectrum: a p level under a VB level's resonance, the first level's substrate charging peak not counted in p", () => {
  // Shell tunnelling at η = 0.56 (gain η/(1 − η) = 14/11): v1 at −1.5 V and v2 at −2.0 V through
  // the tip; their resonances at 1.909 V and 2.545 V (−η·V/(1 − η), closed form); s at 2.06 V;
  // v1's resonance's second charging peak at 1.909 + Ec/(1 − η) = 2.273 V for Ec = 0.16 eV
  // (closed form); the p level lies under v2's resonance, so that peak steps p's share plus the
  // resonance's (more than its source). The companion steps 0.8 × v1 (within 13/17 × 1.3 of it)
  // but 1.33 × v1's resonance (above the doublet range 0.6–1.3 for measured steps).
  const at = (biasV: number, stepA: number): Peak => ({ ...peak(biasV), fwhmV: 0.05, stepA });
  const g = 0.56 / 0.44;
  const peaks = [at(-2.0, 1.3e-12), at(-1.5, 0.75e-12), at(1.5 * g, 0.45e-12), at(2.06, 0.9e-12), at(1.5 * g + 0.16 / 0.44, 0.6e-12), at(2.0 * g, 2.4e-12)];
  it("reads shell tunnelling with p at the peak under the resonance and the companion set aside", () => {
    const a = assignSpectrum(peaks, { eta: 0.56 });
    expect(a.regime).toBe("shell-tunneling");
    expect(a.multiplets.find((m) => m.label === "s")?.peakIndices).toEqual([3]);
    expect(a.multiplets.find((m) => m.label === "p")?.peakIndices).toEqual([5]);
    expect(a.evidence.secondJunction.map((r) => r.index).sort()).toEqual([2, 4]);
  });
});

describe("deeperChargingResonances(peaks, resonances, companions, levels, eta, stepRatio)", () => {
  // Shell tunnelling at η = 0.6 (gain 1.5): v1 at −1.0 V, its resonance at 1.5 V and its second
  // charging peak at 1.7 V (Ec/(1 − η) = 0.2 V); v2 at −1.3 V: plain 1.95 V, then 2.15 V (k = 1)
  // and 2.35 V (k = 2) (closed form, orthodox theory).
  const at = (biasV: number, stepA = 1e-12): Peak => ({ ...peak(biasV), stepA });
  const res = [{ index: 3, sourceIndex: 1, predictedV: 1.5 }];
  const comp = [{ index: 4, sourceIndex: 1, predictedV: 1.7 }];
  it("takes a peak at v2's plain prediction + 2·Ec/(1 − η), Ec/(1 − η) read from the companion's spacing", () => {
    const peaks = [at(-1.3, 2e-12), at(-1.0), at(0.9), at(1.5), at(1.7), at(2.352)];
    const found = deeperChargingResonances(peaks, res, comp, [0, 1, 2], 0.6, [0.6, 1.3]);
    expect(found.map((r) => [r.index, r.sourceIndex])).toEqual([[5, 0]]);
    expectClose(found[0].predictedV, 1.95 + 2 * 0.2, { rtol: 1e-12, what: "closed form 1.5·1.3 + 2·0.2" });
  });
  it("takes none at k = 3 (beyond the edge level's two carriers), none stepping like a level too, none from a source that is no level", () => {
    expect(deeperChargingResonances([at(-1.3, 2e-12), at(-1.0), at(0.9), at(1.5), at(1.7), at(2.55)], res, comp, [0, 1, 2], 0.6, [0.6, 1.3])).toEqual([]);
    // 2.15 V stepping twice the companion: a tip-side level lies under it.
    expect(deeperChargingResonances([at(-1.3, 2e-12), at(-1.0), at(0.9), at(1.5), at(1.7), at(2.15, 2e-12)], res, comp, [0, 1, 2], 0.6, [0.6, 1.3])).toEqual([]);
    // −1.3 V not among the levels (a satellite or noise peak of the reading).
    expect(deeperChargingResonances([at(-1.3, 2e-12), at(-1.0), at(0.9), at(1.5), at(1.7), at(2.15)], res, comp, [1, 2], 0.6, [0.6, 1.3])).toEqual([]);
  });
  it("finds nothing without companions (the substrate side not seen to fill)", () => {
    expect(deeperChargingResonances([at(-1.3, 2e-12), at(-1.0), at(0.9), at(1.5), at(2.15)], res, [], [0, 1, 2], 0.6, [0.6, 1.3])).toEqual([]);
  });
});

describe("crowdedResonances(peaks, resonances)", () => {
  // One prediction −η·V/(1 − η) matched by two peaks. Where the tip side does not fill the dot a
  // resonance steps less than its source ((g·r + 1)/(g + r) < 1 for r < 1, closed form).
  const at = (biasV: number, stepA: number) => ({ biasV, stepA });
  const two = [{ index: 1, sourceIndex: 0, predictedV: 2.841 }, { index: 2, sourceIndex: 0, predictedV: 2.841 }];
  it("releases the farther of two peaks whose summed step reaches the source's (a resonance and a level beside it)", () => {
    expect(crowdedResonances([at(-1.77, 0.4e-12), at(2.841, 0.16e-12), at(2.854, 0.39e-12)], two).map((r) => r.index)).toEqual([2]);
    // The nearer is kept whichever comes first in the list.
    expect(crowdedResonances([at(-1.77, 0.4e-12), at(2.83, 0.39e-12), at(2.842, 0.16e-12)], two).map((r) => r.index)).toEqual([1]);
  });
  it("keeps both where together they step less than the source (one resonance split by the peak search)", () => {
    expect(crowdedResonances([at(1.78, 0.46e-12), at(-2.437, 0.08e-12), at(-2.403, 0.06e-12)], [{ index: 1, sourceIndex: 0, predictedV: -2.425 }, { index: 2, sourceIndex: 0, predictedV: -2.425 }])).toEqual([]);
  });
  it("does not group a source's other predictions (a second charging peak through the substrate junction)", () => {
    const set = [{ index: 1, sourceIndex: 0, predictedV: 2.841 }, { index: 2, sourceIndex: 0, predictedV: 3.0 }];
    expect(crowdedResonances([at(-1.77, 0.4e-12), at(2.841, 0.3e-12), at(3.0, 0.3e-12)], set)).toEqual([]);
  });
});

describe("analyzeCurve at η = 0.62: the substrate-junction resonance of s is set aside, not read as a valence group", () => {
  // A dot with CB s at 0.5 eV and VB levels at −0.55 and −0.75 eV, Ec = 0.05 eV, shell tunnelling.
  // Closed form: s at (0.5 + 0.025)/0.62 = 0.847 V through the tip junction, and at
  // −0.525/0.38 = −1.382 V through the substrate junction; VB levels at −(0.55 + 0.025)/0.62 =
  // −0.927 V and −(0.75 + 0.025)/0.62 = −1.25 V. (The window stops at −1.45 V, before the second
  // electron enters s from the substrate at −(0.5 + 0.075)/0.38 = −1.513 V: charging peaks that
  // only the substrate junction shows are not predicted.)
  const scenario = {
    cb: [{ energyEV: 0.5, degeneracy: 2 }],
    vb: [{ energyEV: -0.55, degeneracy: 2 }, { energyEV: -0.75, degeneracy: 2 }],
    chargingEnergyEV: 0.05,
    eta: 0.62,
    tipRatePerS: 1e7,
    substrateRatePerS: 1e9,
    temperatureK: 4.5,
    broadeningEV: 0.008,
    bias: { fromV: -1.45, toV: 1.2, stepV: 0.002 },
    noise: { relative: 0.002, seed: 3 },
  };
  const sim = simulateCurve(scenario, { method: "exact", conductance: false });
  const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "low-eta", metadata: {} } };
  const a = analyzeCurve(curve, { eta: 0.62 });

  it("labels the peak near −0.525/(1 − 0.62) V a second-junction resonance of s", () => {
    const res = a.peaks.filter((p) => p.role === "second-junction");
    expect(res.length).toBe(1);
    expectClose(res[0].biasV, -0.525 / 0.38, { atol: 0.02, what: "resonance position" });
    expect(res[0].multiplet).toBeNull();
  });

  it("keeps two valence groups at the tip-junction positions, spacing (0.75 − 0.55)/0.62 V", () => {
    const vb = a.assignment.multiplets.filter((m) => m.band === "VB");
    expect(vb.map((m) => m.label)).toEqual(["v1", "v2"]);
    expectClose(vb[0].peaksV[0], -0.575 / 0.62, { atol: 0.01, what: "v1" });
    expectClose(vb[1].peaksV[0], -0.775 / 0.62, { atol: 0.01, what: "v2" });
  });

  it("without the stage the resonance is read as a third valence group", () => {
    expect(a.assignment.evidence.secondJunction.map((r) => r.index)).toEqual(a.peaks.flatMap((p, k) => (p.role === "second-junction" ? [k] : [])));
    const plain = assignSpectrum(a.peaks, { eta: 0.62, secondJunction: false });
    expect(plain.multiplets.filter((m) => m.band === "VB").map((m) => m.label)).toEqual(["v1", "v2", "v3"]);
  });

  it("names the resonance in the text report and the figure (the same word in both)", async () => {
    expect(formatAnalysisText(analysisToJson(a))).toContain(`set aside as ${SECOND_JUNCTION} resonances`);
    const svg = (await loadCurveFigure())(a, { curve });
    expect(svg).toContain(SECOND_JUNCTION);
  });
});

describe("overlappedResonances(peaks, resonances)", () => {
  // Closed form (master equation with one extra carrier, substrateToTipStepRatio): a resonance of a
  // level of g states steps (g·r + 1)/(g + r) × its source; below 1 for every g ≥ 2 when r < 1.
  const at = { index: 1, sourceIndex: 0, predictedV: 2.0 };
  const steps = (source: number, peak: number) => [{ stepA: source }, { stepA: peak }];
  it("keeps as a resonance a peak stepping as a resonance alone on the tunnelling side (r = 0.1, 3/7; g = 2, 4, 6)", () => {
    for (const g of [2, 4, 6]) for (const r of [0.1, 3 / 7]) expect(overlappedResonances(steps(1e-12, substrateToTipStepRatio(g, r) * 1e-12), [at])).toEqual([]);
  });
  it("finds a level under a peak stepping the resonance's share plus a level's step (r = 0.1, g = 2: 0.524 + 1 of the source)", () => {
    expect(overlappedResonances(steps(1e-12, (substrateToTipStepRatio(2, 0.1) + 1) * 1e-12), [at])).toEqual([at]);
  });
  it("the boundary is the step ratio at r = 1, the same for every g (closed form)", () => {
    for (const g of [2, 4, 6]) expectClose(substrateToTipStepRatio(g, 1), 1, { rtol: 1e-12, what: "(g + 1)/(g + 1)" });
    expect(overlappedResonances(steps(1e-12, 1e-12), [at])).toEqual([at]);
  });
  it("a source without a positive step releases nothing (no ratio to compare)", () => {
    expect(overlappedResonances(steps(0, 1e-12), [at])).toEqual([]);
  });
});
