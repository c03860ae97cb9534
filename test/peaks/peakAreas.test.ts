// peakAreas and edgeStepWidth checked against closed forms: sums of Gaussians and an erf step.
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { peakAreas, PEAK_AREAS_DEFAULTS } from "../../lib/peaks/peakAreas.ts";
import { edgeStepWidth, EDGE_STEP_WIDTH_DEFAULTS } from "../../lib/peaks/edgeStepWidth.ts";
import { normalCdf } from "../../lib/util/special.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const axis = (from: number, to: number, step: number) => Float64Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);

describe("peakAreas(biasV, didvS, positionsV, {fwhmV})", () => {
  it("recovers the areas A·σ·√(2π) of overlapping Gaussians on a sloped baseline exactly (closed form, noise-free)", () => {
    const x = axis(0, 2, 0.002);
    const s = 0.03;
    const amps = [2e-9, 1.2e-9, 2.5e-9];
    const pos = [0.8, 0.86, 0.95]; // 2σ apart: strongly overlapping
    const g = x.map((v) => 1e-10 + 5e-11 * (v - 0.8) + amps.reduce((acc, a, k) => acc + a * Math.exp(-0.5 * ((v - pos[k]) / s) ** 2), 0));
    const r = peakAreas(x, g, pos, { fwhmV: GAUSSIAN_FWHM_PER_SIGMA * s });
    // 1e-7: the basis Gaussians are cut at ±6σ (e^−18 ≈ 1.5e−8).
    expectClose(r.amplitudesS, amps, { rtol: 1e-7 });
    expectClose(r.areasA, amps.map((a) => a * s * Math.sqrt(2 * Math.PI)), { rtol: 1e-7 });
    expectClose(r.baseline, [1e-10, 5e-11], { rtol: 1e-6 });
  });
});

describe("edgeStepWidth(biasV, currentA, options)", () => {
  it("recovers the FWHM of a Gaussian-broadened step, 2√(2 ln 2)·σ, from its lower half (closed form)", () => {
    const x = axis(-1, 1, 0.002);
    for (const s of [0.01, 0.03, 0.06]) {
      const y = x.map((v) => 3e-11 + 7e-11 * normalCdf((v - 0.3) / s));
      const w = edgeStepWidth(x, y, { positionV: 0.3, rangeV: [-0.1, 0.3 + s] });
      expectClose(w!, GAUSSIAN_FWHM_PER_SIGMA * s, { rtol: 1e-4, what: `σ = ${s}` });
    }
  });
});

describe("PEAK_AREAS_DEFAULTS and EDGE_STEP_WIDTH_DEFAULTS", () => {
  it("are as documented (locked): change them on purpose, with the doc comments", () => {
    // Common practice (no source): a fit window of ±3σ beyond the outer peaks; basis Gaussians
    // cut at ±6σ, where e^−18 ≈ 1.5e−8 of the top (closed form).
    expect({ ...PEAK_AREAS_DEFAULTS }).toEqual({ marginSigma: 3, basisReachSigma: 6 });
    // Common practice (no source): FWHM bounds 5–400 mV cover dI/dV peaks of dots at 4.5 K;
    // 10 log-spaced trials, then Brent's method to 1e-4 in ln s (at most 40 evaluations).
    expect({ ...EDGE_STEP_WIDTH_DEFAULTS }).toEqual({ boundsV: [0.005, 0.4], sign: 1, minPoints: 5, trialCount: 10, logWidthTolerance: 1e-4, refineEvaluations: 40 });
  });
});
