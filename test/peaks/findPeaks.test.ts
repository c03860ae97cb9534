// findPeaks checked against closed forms (Gaussian peaks and Gaussian-broadened current steps),
// the definition of topographic prominence, and Monte-Carlo noise statistics.
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { findPeaks, FIND_PEAKS_DEFAULTS } from "../../lib/peaks/findPeaks.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { normalCdf } from "../../lib/util/special.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";
import { DotspecError } from "../../lib/util/errors.ts";

const axis = (from: number, to: number, step: number) => Float64Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);
const gauss = (x: number, x0: number, s: number) => Math.exp(-0.5 * ((x - x0) / s) ** 2);

describe("findPeaks(biasV, didvS, options)", () => {
  it("finds Gaussian peaks at their centres with their heights and FWHM 2√(2 ln 2)·σ (closed form)", () => {
    const x = axis(-1, 1, 0.001);
    const s = 0.02;
    const g = x.map((v) => 3e-9 * gauss(v, -0.3037, s) + 1e-9 * gauss(v, 0.4512, s));
    const { peaks } = findPeaks(x, g, { noiseS: 1e-12 });
    expect(peaks.map((p) => p.index)).toEqual([696, 1451]);
    expectClose(peaks[0].biasV, -0.3037, { atol: 2e-5, what: "position 1" });
    expectClose(peaks[1].biasV, 0.4512, { atol: 2e-5, what: "position 2" });
    // A parabola through the top 30 % of a Gaussian sits ≈ 0.5 % below its apex (derived: least squares of e^(−u²/2) over |u| ≤ 0.845).
    expectClose(peaks[0].heightS, 3e-9, { rtol: 1e-2 });
    expectClose(peaks[1].fwhmV, GAUSSIAN_FWHM_PER_SIGMA * s, { rtol: 2e-3 });
    // Area of a Gaussian = A·σ·√(2π) (closed form): the current step it carries.
    expectClose(peaks[0].stepA, 3e-9 * s * Math.sqrt(2 * Math.PI), { rtol: 5e-3 });
  });

  it("measures prominence as the height above the higher of the two surrounding minima (definition, as in scipy.signal.peak_prominences)", () => {
    // Hand-worked: the peak of 3 at index 3 has minima 0 (left, to the edge) and 1 (right, before the 4); prominence 3 − 1 = 2.
    const g = Float64Array.from([0, 1, 0, 3, 1, 4, 0]);
    const x = axis(0, 6, 1);
    const { peaks } = findPeaks(x, g, { noiseS: 0.1, minProminenceSigma: 0, minSeparationMV: 0 });
    expect(peaks.map((p) => [p.index, p.prominenceS])).toEqual([[1, 1], [3, 2], [5, 4]]);
  });

  it("drops the less prominent of two peaks closer than minSeparationMV", () => {
    const x = axis(0, 1, 0.001);
    const g = x.map((v) => gauss(v, 0.5, 0.005) + 0.6 * gauss(v, 0.515, 0.005));
    const close = findPeaks(x, g, { noiseS: 1e-4, minSeparationMV: 20 });
    const apart = findPeaks(x, g, { noiseS: 1e-4, minSeparationMV: 10 });
    expect(close.peaks.length).toBe(1);
    expect(close.record.tooClose).toBe(1);
    expect(apart.peaks.length).toBe(2);
  });

  it("with the current's step test, white noise gives no peak and a step of 15σ is found (Monte Carlo, seeded)", () => {
    const rng = seededRandom(5);
    const x = axis(-1, 1, 0.002);
    const sigmaA = 1e-12;
    const s = 0.02;
    const clean = x.map((v) => 15 * sigmaA * normalCdf((v - 0.2) / s));
    for (const withStep of [false, true]) {
      const current = (withStep ? clean : x.map(() => 0)).map((v) => v + sigmaA * rng.normal());
      // A plain central difference stands in for the smoothed dI/dV here.
      const g = current.map((_, i) => (current[Math.min(i + 5, x.length - 1)] - current[Math.max(i - 5, 0)]) / (0.02));
      const noiseS = (sigmaA * Math.SQRT2) / 0.02;
      const { peaks } = findPeaks(x, g, { noiseS, current: { currentA: current, noiseA: sigmaA }, expectedFwhmV: GAUSSIAN_FWHM_PER_SIGMA * s });
      if (withStep) {
        expect(peaks.length).toBe(1);
        expectClose(peaks[0].biasV, 0.2, { atol: 0.003 });
        expect(peaks[0].stepSignificance!).toBeGreaterThan(FIND_PEAKS_DEFAULTS.minStepSigma);
      } else expect(peaks).toEqual([]);
    }
  });

  it("finds the middle steps of a charging ladder that the ±3 FWHM test misses (Monte Carlo, 60 seeded draws; closed form Φ(z − 5) with z from the fit's exact variances)", () => {
    // Nine equal Gaussian-broadened steps 1.4 FWHM apart. The middle step's standard error over
    // ±3 FWHM is 1.63 × that over the moved window (test/peaks/localStepFit.test.ts computes both
    // with mathjs): with the noise set so that its expected t is 4.5 over ±3 FWHM, a test over
    // ±3 FWHM alone would pass it with probability at most Φ(4.5 − 5) = 0.31 (4 of these 60 draws:
    // its estimate is also pulled by the unfitted steps at ±4.2 FWHM), the moved window with
    // Φ(4.5·1.414 − 5) = 0.92.
    const x = axis(-1, 1, 0.001);
    const fw = 0.05, s = fw / GAUSSIAN_FWHM_PER_SIGMA;
    const positions = [-4, -3, -2, -1, 0, 1, 2, 3, 4].map((k) => 1.4 * fw * k);
    const step = 1e-11;
    const sePlainPerSigma = 1.6315; // √Var(step)/σ over ±3 FWHM (the fit's exact variance, checked against mathjs in localStepFit.test.ts)
    const sigmaA = step / (4.5 * sePlainPerSigma);
    const g = x.map((v) => positions.reduce((sum, xj) => sum + (step / (s * Math.sqrt(2 * Math.PI))) * gauss(v, xj, s), 0));
    let found = 0;
    const draws = 60;
    for (let k = 0; k < draws; k++) {
      const rng = seededRandom(700 + k);
      const current = x.map((v) => positions.reduce((sum, xj) => sum + step * normalCdf((v - xj) / s), 0) + sigmaA * rng.normal());
      const { peaks } = findPeaks(x, g, { noiseS: 1e-3 * Math.max(...g), current: { currentA: current, noiseA: sigmaA }, expectedFwhmV: fw, minSeparationMV: 0 });
      if (peaks.some((p) => Math.abs(p.biasV) < 0.25 * fw)) found++;
    }
    // 0.92 expected; 0.8 is 3.4 binomial standard errors below it and far above 0.31.
    expect(found / draws).toBeGreaterThan(0.8);
  });

  it("reports position uncertainties that match the scatter of repeated noisy measurements within 25 % (least-squares theory; Monte Carlo, 300 seeded draws)", () => {
    const x = axis(-0.5, 0.5, 0.002);
    const s = 0.015, sigmaA = 2e-12, step = 40e-12;
    const positions: number[] = [];
    const reported: number[] = [];
    for (let k = 0; k < 300; k++) {
      const rng = seededRandom(100 + k);
      const current = x.map((v) => step * normalCdf((v - 0.0123) / s) + sigmaA * rng.normal());
      const g = x.map((v) => ((step / (s * Math.sqrt(2 * Math.PI))) * gauss(v, 0.0123, s)));
      const { peaks } = findPeaks(x, g, { noiseS: 1e-12, current: { currentA: current, noiseA: sigmaA }, expectedFwhmV: GAUSSIAN_FWHM_PER_SIGMA * s });
      positions.push(peaks[0].biasV);
      reported.push(peaks[0].biasUncertaintyV);
    }
    const mean = positions.reduce((a, b) => a + b, 0) / positions.length;
    const sd = Math.sqrt(positions.reduce((a, b) => a + (b - mean) ** 2, 0) / (positions.length - 1));
    const typical = reported.reduce((a, b) => a + b, 0) / reported.length;
    expectClose(mean, 0.0123, { atol: 3 * (sd / Math.sqrt(300)), what: "unbiased" });
    // The reported σ adds a floor of 2 % of the FWHM in quadrature (FIND_PEAKS_DEFAULTS).
    const floor = FIND_PEAKS_DEFAULTS.positionFloorPerFwhm * GAUSSIAN_FWHM_PER_SIGMA * s;
    expectClose(typical, Math.hypot(sd, floor), { rtol: 0.25, what: "reported σ vs scatter (with the floor)" });
  });

  it("rejects arrays of different lengths and curves under 3 points", () => {
    const err = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return e as DotspecError;
      }
      throw new Error("no error");
    };
    expect(err(() => findPeaks(axis(0, 1, 0.1), new Float64Array(3), { noiseS: 1 })).code).toBe("peaks/length-mismatch");
    expect(err(() => findPeaks(axis(0, 1, 1), new Float64Array(2), { noiseS: 1 })).code).toBe("peaks/too-few-points");
    expect(err(() => findPeaks(axis(0, 1, 0.1), new Float64Array(11), { noiseS: -1 })).message).toMatch(/noiseS/);
  });

  it("FIND_PEAKS_DEFAULTS are as documented (locked)", () => {
    expect(FIND_PEAKS_DEFAULTS).toEqual({
      minProminenceSigma: 3,
      minProminenceSigmaAlone: 8,
      minStepSigma: 5,
      refineOnCurrent: true,
      preScreenSigma: 2,
      refineIterations: 1,
      positionFloorPerFwhm: 0.02,
      positionFloorPerFwhmParabola: 0.008,
      minSeparationMV: 20,
      fitLevel: 0.7,
    });
  });
});
