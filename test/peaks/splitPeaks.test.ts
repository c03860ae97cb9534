// Two steps under one peak (lib/peaks/splitPeaks.ts and findPeaks' note 7). Expected values come
// from closed forms: the slope of a Gaussian at its half-height point, s·√(2 ln 2) from the
// centre (FWHM = 2√(2 ln 2)·s); the current of Gaussian-broadened steps, I = a + b·x + Σ c_k·Φ((x −
// x_k)/s), with Φ from mathjs.erf (noiseless data drawn from the fitted model give back its
// coefficients); the sum of two Gaussians of a common σ at ±d/2 has one maximum when d ≤ 2σ
// (derived: its second derivative at the middle, ∝ (d/2)² − σ², is negative); and constructed
// currents with known steps plus seeded white noise (the positions put in are the check values).
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { fitSteps, halfProminenceSides, halfWidthSE, isWide, splitPeak, stepSearch, SPLIT_PEAKS_DEFAULTS } from "../../lib/peaks/splitPeaks.ts";
import { findPeaks } from "../../lib/peaks/findPeaks.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));
const axis = (from: number, to: number, step: number) => Float64Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);
const gauss = (x: number, x0: number, s: number) => Math.exp(-0.5 * ((x - x0) / s) ** 2) / (s * Math.sqrt(2 * Math.PI));

/** A current of Gaussian-broadened steps (heights in A at positions in V, common σ) on a line, with seeded white noise. */
function stepsCurrent(x: Float64Array, steps: [number, number][], s: number, noiseA: number, rngStart: number): Float64Array {
  const rng = seededRandom(rngStart);
  return x.map((v) => 1e-12 + 2e-12 * v + steps.reduce((sum, [at, height]) => sum + height * phi((v - at) / s), 0) + noiseA * rng.normal());
}

/** Its conductance without noise: the sum of the steps' Gaussians (the derivative of the current, closed form). */
function stepsConductance(x: Float64Array, steps: [number, number][], s: number): Float64Array {
  return x.map((v) => 2e-12 + steps.reduce((sum, [at, height]) => sum + height * gauss(v, at, s), 0));
}

describe("SPLIT_PEAKS_DEFAULTS", () => {
  it("is frozen with the documented values", () => {
    expect(Object.isFrozen(SPLIT_PEAKS_DEFAULTS)).toBe(true);
    expect(SPLIT_PEAKS_DEFAULTS).toEqual({ gateSigma: 2, minSeparationFwhm: 0.5, windowFwhm: 3, searchTolFwhm: 1 / 64, widthBounds: [0.8, 2.5] });
  });
});

describe("halfWidthSE(fwhmV, snr)", () => {
  it("is the noise over the slope at the half-height point, 0.7213·FWHM/SNR (closed form)", () => {
    const s = 0.03, height = 2, noise = 0.05;
    const at = s * Math.sqrt(2 * Math.LN2);
    const slope = height * (at / s ** 2) * Math.exp(-(at ** 2) / (2 * s ** 2)); // |G'| at the half-height point
    expectClose(halfWidthSE(GAUSSIAN_FWHM_PER_SIGMA * s, height / noise), noise / slope, { rtol: 1e-12 });
    expectClose(halfWidthSE(1, 1), 1 / (2 * Math.LN2), { rtol: 1e-15, what: "1/(2 ln 2) = 0.7213" });
  });
});

describe("halfProminenceSides(biasV, g, peak)", () => {
  it("gives s·√(2 ln 2) on both sides of a Gaussian (closed form), null where the base comes first", () => {
    const x = axis(-0.5, 0.5, 0.001);
    const s = 0.04;
    const g = x.map((v) => Math.exp(-0.5 * (v / s) ** 2));
    const peak = { biasV: 0, index: 500, heightS: 1, prominenceS: 1, snr: 100, leftBase: 0, rightBase: 1000 };
    const [left, right] = halfProminenceSides(x, g, peak);
    // Linear interpolation between samples 1 mV apart: error below h²·|G''|/(8·|G'|) ≈ 5e-6 V here.
    expectClose(left!, s * Math.sqrt(2 * Math.LN2), { atol: 1e-5 });
    expectClose(right!, s * Math.sqrt(2 * Math.LN2), { atol: 1e-5 });
    expect(halfProminenceSides(x, g, { ...peak, rightBase: 520 })[1]).toBeNull();
    // Walked no further than asked: a side longer than maxV is Infinity, a shorter one as before.
    expect(halfProminenceSides(x, g, peak, 0.01)).toEqual([Infinity, Infinity]);
    expect(halfProminenceSides(x, g, peak, 0.05)).toEqual([left, right]);
  });
});

describe("isWide(peak, expectedFwhmV)", () => {
  it("flags a side longer than half the FWHM by more than gateSigma of its error, and only then (the rule of SPLIT_PEAKS_DEFAULTS.gateSigma)", () => {
    const fw = 0.05, snr = 20;
    const limit = fw / 2 + SPLIT_PEAKS_DEFAULTS.gateSigma * halfWidthSE(fw, snr);
    expect(isWide({ biasV: 0, sidesV: [fw / 2, fw / 2], snr }, fw)).toBe(false);
    expect(isWide({ biasV: 0, sidesV: [fw / 2, limit * 0.99], snr }, fw)).toBe(false);
    expect(isWide({ biasV: 0, sidesV: [limit * 1.01, null], snr }, fw)).toBe(true);
  });
});

describe("fitSteps(x, current, lo, hi, neighboursV, neighbourSigmaV, freeV, sigmaV, withShift)", () => {
  it("gives back the heights of noiseless Gaussian-broadened steps and a zero residual (closed form: the data are the model)", () => {
    const x = axis(0, 1, 0.002);
    const s = 0.02;
    const current = x.map((v) => 3e-12 + 1e-12 * (v - x[250]) + 4e-11 * phi((v - 0.45) / 0.015) + 2e-11 * phi((v - 0.5) / s) + 1e-11 * phi((v - 0.56) / s));
    const fit = fitSteps(x, current, 150, 350, [0.45], 0.015, [0.5, 0.56], s, true)!;
    expectClose(fit.steps, [2e-11, 1e-11], { rtol: 1e-6 });
    expect(fit.ss).toBeLessThan(1e-30);
    // The shift columns see no shift at the true positions (δ = −e·s/d with e = 0).
    expectClose(fit.shifts, [0, 0], { atol: 1e-8 });
  });
});

describe("fitSteps with widthWeights (the Gauss–Newton step of stepSearch)", () => {
  it("gives the first-order change of the width: a width 2 % off is moved to within (2 %)² of the truth (closed form: Φ((x − x_k)/s) linear in s to first order)", () => {
    const x = axis(0, 1, 0.002);
    const s = 0.02;
    const current = x.map((v) => 3e-12 + 2e-11 * phi((v - 0.5) / s) + 1e-11 * phi((v - 0.56) / s));
    const at = fitSteps(x, current, 150, 350, [], 0.015, [0.5, 0.56], 1.02 * s, false)!;
    const lin = fitSteps(x, current, 150, 350, [], 0.015, [0.5, 0.56], 1.02 * s, true, { cols: [] }, at.steps)!;
    expectClose(1.02 * s + lin.widthShift, s, { atol: 2 * 0.02 ** 2 * s });
    expectClose(lin.shifts, [0, 0], { atol: 0.02 ** 2 * s });
    // Without the weights the width column is left out.
    expect(fitSteps(x, current, 150, 350, [], 0.015, [0.5, 0.56], 1.02 * s, true)!.widthShift).toBe(0);
  });
});

describe("stepSearch(problem, start, lower, upper, maxMove, minGapV, tolV)", () => {
  const x = axis(0, 1, 0.002);
  const s = 0.02;
  const clean = x.map((v) => 3e-12 + 1e-12 * v + 4e-11 * phi((v - 0.4) / 0.015) + 2e-11 * phi((v - 0.5) / s) + 1e-11 * phi((v - 0.56) / s));
  const problem = { x, current: clean, lo: 150, hi: 350, neighboursV: [0.4], neighbourSigmaV: 0.015, scratch: { cols: [] } };

  it("finds noiseless steps' positions and common width from a start a FWHM off (closed form: the data are the model, zero residual at the truth)", () => {
    const { p, value } = stepSearch(problem, [0.47, 0.6, 0.026], [0.42, 0.42, 0.016], [0.7, 0.7, 0.05], [0.024, 0.024, 0.01], 0.01, 1e-6);
    expectClose(p, [0.5, 0.56, s], { atol: 1e-6 });
    expect(value).toBeLessThan(1e-28);
  });

  it("reaches the least-squares point of a noisy current as a fine compass search does (same residual within 1e-6), and keeps to its bounds", () => {
    const noisy = stepsCurrent(x, [[0.4, 4e-11], [0.5, 2e-11], [0.56, 1e-11]], s, 2e-13, 7);
    const prob = { ...problem, current: noisy, scratch: { cols: [] } };
    const ss = (q: number[]) => fitSteps(x, noisy, 150, 350, [0.4], 0.015, [q[0], q[1]], q[2], false)!.ss;
    const gn = stepSearch(prob, [0.47, 0.6, 0.026], [0.42, 0.42, 0.016], [0.7, 0.7, 0.05], [0.024, 0.024, 0.01], 0.01, 1e-7);
    // A compass search (each parameter ± its step while that helps, steps halved) to 1e-7 V.
    const p = [0.47, 0.6, 0.026], step = [0.006, 0.006, 0.0025];
    let best = ss(p);
    while (step[0] > 1e-7) {
      let moved = false;
      for (let k = 0; k < 3; k++) for (const dir of [1, -1]) {
        const q = p.slice();
        q[k] += dir * step[k];
        const v = ss(q);
        if (v < best) { best = v; p[k] = q[k]; moved = true; }
      }
      if (!moved) for (let k = 0; k < 3; k++) step[k] /= 2;
    }
    expectClose(gn.value, best, { rtol: 1e-6 });
    expectClose(gn.p, p, { atol: 1e-5 });
    // Bounds: the width held below its least-squares value stays at the bound.
    const held = stepSearch(prob, [0.47, 0.6, 0.018], [0.42, 0.42, 0.016], [0.7, 0.7, 0.019], [0.024, 0.024, 0.01], 0.01, 1e-6);
    expect(held.p[2]).toBe(0.019);
    // The positions never come closer than minGapV.
    const apart = stepSearch(prob, [0.47, 0.6, 0.026], [0.42, 0.42, 0.016], [0.7, 0.7, 0.05], [0.024, 0.024, 0.01], 0.1, 1e-6);
    expect(apart.p[1] - apart.p[0]).toBeGreaterThanOrEqual(0.1);
  });
});

describe("splitPeak and findPeaks' note 7 (constructed currents with known steps)", () => {
  const h = 0.002;
  const x = axis(0, 1.2, h);
  const s = 0.025; // FWHM 58.9 mV
  const fw = GAUSSIAN_FWHM_PER_SIGMA * s;
  const noiseA = 2e-13;

  it("two equal steps 0.8 FWHM apart show one maximum (derived: d ≤ 2σ) and findPeaks returns both", () => {
    const steps: [number, number][] = [[0.5, 2e-11], [0.5 + 0.8 * fw, 2e-11]];
    expect(0.8 * fw).toBeLessThan(2 * s);
    const clean = stepsConductance(x, steps, s);
    let maxima = 0;
    for (let i = 1; i < x.length - 1; i++) if (clean[i] > clean[i - 1] && clean[i] > clean[i + 1]) maxima++;
    expect(maxima).toBe(1);
    const current = stepsCurrent(x, steps, s, noiseA, 11);
    const noiseS = 1e-12;
    const { peaks } = findPeaks(x, clean, { noiseS, current: { currentA: current, noiseA }, expectedFwhmV: fw });
    expect(peaks.length).toBe(2);
    peaks.forEach((p, k) => {
      expectClose(p.biasV, steps[k][0], { atol: 3 * p.biasUncertaintyV, what: `step ${k + 1} within 3σ` });
      expect(p.stepSignificance!).toBeGreaterThan(5);
    });
    // Without the current there is nothing to split, nor where positions are not refined on it (a measured conductance): one peak.
    expect(findPeaks(x, clean, { noiseS }).peaks.length).toBe(1);
    expect(findPeaks(x, clean, { noiseS, current: { currentA: current, noiseA }, expectedFwhmV: fw, refineOnCurrent: false }).peaks.length).toBe(1);
  });

  it("a shoulder (a step 1 FWHM beyond one 2.5 times larger) is found as its own peak", () => {
    const steps: [number, number][] = [[0.5, 2.5e-11], [0.5 + fw, 1e-11]];
    const clean = stepsConductance(x, steps, s);
    let maxima = 0;
    for (let i = 1; i < x.length - 1; i++) if (clean[i] > clean[i - 1] && clean[i] > clean[i + 1]) maxima++;
    expect(maxima).toBe(1);
    const current = stepsCurrent(x, steps, s, noiseA, 12);
    const { peaks } = findPeaks(x, clean, { noiseS: 1e-12, current: { currentA: current, noiseA }, expectedFwhmV: fw });
    expect(peaks.length).toBe(2);
    expectClose(peaks[1].biasV, steps[1][0], { atol: 3 * peaks[1].biasUncertaintyV });
  });

  it("keeps one peak for one step, also one 1.5 times wider than expected (a resonance's width at η = 0.6), over 20 seeded draws", () => {
    for (const widthFactor of [1, 1.5]) {
      for (let draw = 0; draw < 10; draw++) {
        const steps: [number, number][] = [[0.6, 3e-11]];
        const current = stepsCurrent(x, steps, widthFactor * s, noiseA, 100 + draw);
        const g = stepsConductance(x, steps, widthFactor * s);
        const { peaks } = findPeaks(x, g, { noiseS: 1e-12, current: { currentA: current, noiseA }, expectedFwhmV: fw });
        expect(peaks.length).toBe(1);
        // The wide one passes the gate (sides 1.5 × FWHM/2, closed form) and is kept whole by the split's tests.
        const side = (widthFactor * fw) / 2;
        if (widthFactor > 1) {
          expect(isWide({ biasV: peaks[0].biasV, sidesV: [side, side], snr: 200 }, fw)).toBe(true);
          expect(splitPeak(x, current, noiseA, { biasV: peaks[0].biasV, sidesV: [side, side], snr: 200 }, [], fw, 5)).toBeNull();
        }
      }
    }
  });

  it("keeps one peak for two equal steps 0.3 FWHM apart (derived: their sum differs from one wider step by its fourth moment alone)", () => {
    const steps: [number, number][] = [[0.5, 2e-11], [0.5 + 0.3 * fw, 2e-11]];
    const current = stepsCurrent(x, steps, s, noiseA, 13);
    const r = splitPeak(x, current, noiseA, { biasV: 0.5 + 0.15 * fw, sidesV: [0.6 * fw, 0.6 * fw], snr: 200 }, [], fw, 5);
    expect(r).toBeNull();
  });
});
