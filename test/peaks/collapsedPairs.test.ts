// Collapsed pairs (lib/peaks/collapsedPairs.ts and findPeaks' note 11). Expected values come from
// closed forms: the current of Gaussian-broadened steps, I = a + b·x + Σ c_k·Φ((x − x_k)/s), with
// Φ from mathjs.erf, plus seeded white noise (the positions and heights put in are the check
// values); the sum of two Gaussians of a common σ at ±d/2 has one maximum when d ≤ 2σ (derived:
// its second derivative at the middle, ∝ (d/2)² − σ², is negative), so a level's peak found as two
// maxima closer than that is one step.
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { collapsedPairs, COLLAPSED_PAIRS_DEFAULTS } from "../../lib/peaks/collapsedPairs.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";
import { gapSideFwhm } from "../../lib/pipeline/bandAreas.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));
const axis = (from: number, to: number, step: number) => Float64Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);

/** A current of Gaussian-broadened steps (heights in A at positions in V, common σ) on a line, with seeded white noise. */
function stepsCurrent(x: Float64Array, steps: [number, number][], s: number, noiseA: number, rngStart: number): Float64Array {
  const rng = seededRandom(rngStart);
  return x.map((v) => 1e-12 + 2e-12 * v + steps.reduce((sum, [at, height]) => sum + height * phi((v - at) / s), 0) + noiseA * rng.normal());
}

/** A peak as findPeaks gives it, at a position with a step and a prominence (the rest plausible). */
function peakAt(x: Float64Array, biasV: number, stepA: number, prominenceS: number, fwhmV: number): Peak {
  const index = Math.round((biasV - x[0]) / (x[1] - x[0]));
  return { biasV, biasUncertaintyV: 0.002, index, heightS: prominenceS, prominenceS, fwhmV, stepA, snr: 50, stepSignificance: 20 };
}

describe("COLLAPSED_PAIRS_DEFAULTS", () => {
  it("is frozen with the documented value", () => {
    expect(Object.isFrozen(COLLAPSED_PAIRS_DEFAULTS)).toBe(true);
    expect(COLLAPSED_PAIRS_DEFAULTS).toEqual({ separationFraction: 1 });
  });
});

describe("collapsedPairs(biasV, current, peaks, expectedFwhmV, minStepSigma, minSeparationMV, floor)", () => {
  const x = axis(0, 1, 0.001);
  const s = 0.03; // FWHM 70.6 mV
  const fwhm = GAUSSIAN_FWHM_PER_SIGMA * s;
  const noiseA = 2e-14;

  it("is null where no two peaks are closer than minSeparationMV", () => {
    const currentA = stepsCurrent(x, [[0.3, 1e-11], [0.6, 1e-11]], s, noiseA, 1);
    const peaks = [peakAt(x, 0.3, 1e-11, 1e-10, fwhm), peakAt(x, 0.6, 1e-11, 1e-10, fwhm)];
    expect(collapsedPairs(x, { currentA, noiseA }, peaks, fwhm, 5, 40, 0.02)).toBeNull();
  });

  it("makes one peak of two maxima on one step's top, with the summed step (one level: closer than 2σ)", () => {
    const currentA = stepsCurrent(x, [[0.2, 1e-11], [0.5, 1e-11], [0.8, 1e-11]], s, noiseA, 2);
    // One level at 0.5 V found as two maxima 0.8σ apart, each with part of its step.
    const peaks = [peakAt(x, 0.2, 1e-11, 1e-10, fwhm), peakAt(x, 0.488, 4e-12, 0.9e-10, fwhm), peakAt(x, 0.512, 6e-12, 1e-10, fwhm), peakAt(x, 0.8, 1e-11, 1e-10, fwhm)];
    const out = collapsedPairs(x, { currentA, noiseA }, peaks, fwhm, 5, 40, 0.02)!;
    expect(out.peaks.map((p) => p.biasV)).toHaveLength(3);
    expect(out.merged).toEqual([1]);
    const one = out.peaks[1];
    // The step-weighted mean of the two positions (0.4·0.488 + 0.6·0.512), the summed step, the more prominent peak's prominence.
    expectClose(one.biasV, 0.5024, { atol: 1e-9 });
    expectClose(one.stepA, 1e-11, { rtol: 1e-12 });
    expect(one.prominenceS).toBe(1e-10);
    expect(out.peaks[0]).toBe(peaks[0]);
    expect(out.peaks[2]).toBe(peaks[3]);
  });

  it("keeps the maximum nearer 0 V, so the width read on the gap-side flank is the line's (a dip below half height between the maxima)", () => {
    // One level at 0.5 V whose conductance line (a Gaussian of σ = s, height 1e-10 S) has a noise
    // dip on its top reaching below half the height, leaving two maxima either side of 0.5 V.
    const currentA = stepsCurrent(x, [[0.2, 1e-11], [0.5, 1e-11], [0.8, 1e-11]], s, noiseA, 5);
    const didvS = x.map((v) => 1e-10 * Math.exp(-0.5 * ((v - 0.5) / s) ** 2) - 0.7e-10 * Math.exp(-0.5 * ((v - 0.5) / (0.25 * s)) ** 2));
    const maxima = [...didvS.keys()].filter((i) => i > 0 && i < x.length - 1 && didvS[i] > didvS[i - 1] && didvS[i] >= didvS[i + 1]);
    expect(maxima).toHaveLength(2);
    expect(didvS[500]).toBeLessThan(0.5 * didvS[maxima[0]]);
    // The two maxima as findPeaks has them after the refinement moved them together.
    const twin = (at: number, i: number, stepA: number): Peak => ({ ...peakAt(x, at, stepA, didvS[i], fwhm), index: i, heightS: didvS[i] });
    const peaks = [peakAt(x, 0.2, 1e-11, 1e-10, fwhm), twin(0.495, maxima[0], 5e-12), twin(0.505, maxima[1], 5e-12), peakAt(x, 0.8, 1e-11, 1e-10, fwhm)];
    const out = collapsedPairs(x, { currentA, noiseA }, peaks, fwhm, 5, 40, 0.02)!;
    expect(out.merged).toEqual([1]);
    const one = out.peaks[1];
    expect(one.index).toBe(maxima[0]);
    expect(one.heightS).toBe(didvS[maxima[0]]);
    // Walked from that maximum (height h) towards 0 V, half its height lies on the line's outer
    // flank (the dip's Gaussian is nil there), at 0.5 − s·√(2 ln(2·1e-10/h)) (closed form), and the
    // merged position is 0.5 (equal steps): the width read is 2s·√(2 ln(2·1e-10/h)), the line's
    // FWHM widened a little by h < 1e-10 S. From the maximum beyond the dip, the walk would end in
    // the dip (< 0.3 FWHM).
    expectClose(one.biasV, 0.5, { atol: 1e-12 });
    expectClose(gapSideFwhm(x, didvS, one)!, 2 * s * Math.sqrt(2 * Math.log((2 * 1e-10) / one.heightS)), { rtol: 2e-3 });
    expect(gapSideFwhm(x, didvS, { ...one, index: maxima[1], heightS: didvS[maxima[1]] })!).toBeLessThan(0.3 * fwhm);
  });

  it("keeps a pair whose maxima lie farther apart than 2σ as it is where the current shows no two steps", () => {
    // One step at 0.5 V; the two maxima the pair was found at lie 2.2σ apart, beyond what one
    // Gaussian line's top can show (a sum of two Gaussians of σ has two maxima only beyond 2σ):
    // not noise on one top, so no merge; and the two-step fit finds no second step.
    const currentA = stepsCurrent(x, [[0.2, 1e-11], [0.5, 1e-11], [0.8, 1e-11]], s, noiseA, 6);
    const at = (biasV: number, maxV: number, stepA: number): Peak => ({ ...peakAt(x, biasV, stepA, 1e-10, fwhm), index: Math.round(maxV / 0.001) });
    const peaks = [peakAt(x, 0.2, 1e-11, 1e-10, fwhm), at(0.49, 0.5 - 1.1 * s, 5e-12), at(0.51, 0.5 + 1.1 * s, 5e-12), peakAt(x, 0.8, 1e-11, 1e-10, fwhm)];
    const out = collapsedPairs(x, { currentA, noiseA }, peaks, fwhm, 5, 40, 0.02)!;
    expect(out.merged).toEqual([]);
    expect(out.peaks).toEqual(peaks);
  });

  it("gives back two levels 1.8 FWHM apart that the refinement had moved together, at their positions", () => {
    // Two levels at 0.44 and 0.567 V (1.8 FWHM apart), both peaks moved to the middle.
    const truth: [number, number][] = [[0.2, 1e-11], [0.44, 1e-11], [0.567, 1e-11], [0.85, 1e-11]];
    const currentA = stepsCurrent(x, truth, s, noiseA, 3);
    const peaks = [peakAt(x, 0.2, 1e-11, 1e-10, fwhm), peakAt(x, 0.502, 3e-12, 0.5e-10, fwhm), peakAt(x, 0.505, 9e-12, 0.6e-10, fwhm), peakAt(x, 0.85, 1e-11, 1e-10, fwhm)];
    const out = collapsedPairs(x, { currentA, noiseA }, peaks, fwhm, 5, 40, 0.02)!;
    expect(out.merged).toEqual([]);
    expect(out.peaks).toHaveLength(4);
    // Within 2 % of the FWHM of the positions put in, the steps within 5 % of theirs.
    expectClose(out.peaks[1].biasV, 0.44, { atol: 0.02 * fwhm });
    expectClose(out.peaks[2].biasV, 0.567, { atol: 0.02 * fwhm });
    expectClose(out.peaks[1].stepA, 1e-11, { rtol: 0.05 });
    expectClose(out.peaks[2].stepA, 1e-11, { rtol: 0.05 });
  });

  it("is null without an expected width (nothing to measure the pair's fits against)", () => {
    const currentA = stepsCurrent(x, [[0.5, 1e-11]], s, noiseA, 4);
    const peaks = [peakAt(x, 0.495, 5e-12, 1e-10, fwhm), peakAt(x, 0.505, 5e-12, 1e-10, fwhm)];
    expect(collapsedPairs(x, { currentA, noiseA }, peaks, undefined, 5, 40, 0.02)).toBeNull();
  });
});
