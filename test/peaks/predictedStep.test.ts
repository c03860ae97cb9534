// A step looked for near a predicted position (lib/peaks/predictedStep.ts). Expected values:
// closed forms — currents built from Gaussian-broadened steps Φ((x − x_j)/s) with
// FWHM = 2√(2 ln 2)·s (Φ from mathjs.erf), where a noiseless least-squares fit at the drawn
// position gives the drawn step back; the exact equivalence of its t with the step test of findPeaks
// (stepSignificance) at the same sample and neighbours; the rules of its notes; a seeded Monte Carlo
// of white noise for the false-step rate (bound: the union bound of its note 3).
import { describe, it, expect } from "vitest";
import { erf } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { predictedStep } from "../../lib/peaks/predictedStep.ts";
import { stepSignificance, STEP_TEST_WINDOW } from "../../lib/peaks/localStepFit.ts";
import { FIND_PEAKS_DEFAULTS } from "../../lib/peaks/findPeaks.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";
import { seededRandom } from "../../lib/util/random.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));

// 2 mV samples from 1.5 to 3.5 V, FWHM 40 mV; a charging ladder 2.5 FWHM apart, its last step half
// the others' (the weak step to be found) at 2.5 V.
const h = 0.002;
const x = Float64Array.from({ length: 1001 }, (_, i) => 1.5 + i * h);
const fw = 0.04;
const s = fw / GAUSSIAN_FWHM_PER_SIGMA;
const ladder = [2.0, 2.1, 2.2, 2.3, 2.4];
const weakV = 2.5;
const stepA = 10e-12;
const curve = (withWeak: boolean, noiseA = 0, seed = 1) => {
  const rng = seededRandom(seed);
  return x.map((v) => 1e-12 + 2e-12 * v + ladder.reduce((sum, xj) => sum + stepA * phi((v - xj) / s), 0) + (withWeak ? 0.5 * stepA * phi((v - weakV) / s) : 0) + noiseA * rng.normal());
};
const index = (v: number) => Math.round((v - x[0]) / h);

describe("predictedStep(biasV, currentA, noiseA, predictedV, reachV, neighboursV, expectedFwhmV, minStepSigma)", () => {
  it("finds a noiseless step near its drawn position with its drawn height (closed form), the t the largest of the step test over the reach (exact equivalence)", () => {
    const current = curve(true);
    const noiseA = 0.05e-12;
    // Predicted 15 mV off, reach 30 mV.
    const got = predictedStep(x, current, noiseA, weakV + 0.015, 0.03, ladder, fw, 5);
    expect(got).not.toBeNull();
    // t peaks near the step, not at it (note 3): within a tenth of a FWHM here; the step fitted
    // there is the drawn one within 5 % (an exact model fitted slightly off its position).
    expect(Math.abs(got!.biasV - weakV)).toBeLessThanOrEqual(0.1 * fw + 1e-12);
    expectClose(got!.stepA, 0.5 * stepA, { rtol: 0.05, what: "the drawn step" });
    // The t reported is the step test's at the sample where it is largest.
    const best = [...Array(31).keys()].map((k) => index(weakV + 0.015 - 0.03) + k).filter((i) => !ladder.some((v) => Math.abs(v - x[i]) < fw));
    const tAt = (i: number) => stepSignificance(x, current, i, ladder, Math.round(fw / (2 * h)), noiseA, 5, FIND_PEAKS_DEFAULTS.preScreenSigma, { cols: new Float64Array(0) }, STEP_TEST_WINDOW.freeNeighbourFwhm * fw);
    expect(got!.significance).toBe(Math.max(...best.map(tAt)));
  });

  it("finds the weak step within a quarter FWHM in nearly every noisy draw where its t is about 8 (Monte Carlo, 50 seeded draws; common practice (no source): ≥ 48 of 50)", () => {
    // σ for t ≈ 8: SE of the step ≈ σ·√V with V from the noiseless fit (t = c/(σ√V)).
    const clean = curve(true);
    const probe = predictedStep(x, clean, 1, weakV, 0, ladder, fw, -Infinity)!;
    const sigmaA = (0.5 * stepA) / (8 * (0.5 * stepA) / probe.significance);
    let hits = 0;
    for (let seed = 1; seed <= 50; seed++) {
      const got = predictedStep(x, curve(true, sigmaA, seed), sigmaA, weakV + 0.01, 0.03, ladder, fw, 5);
      if (got && Math.abs(got.biasV - weakV) <= fw / 4) hits++;
    }
    expect(hits).toBeGreaterThanOrEqual(48);
  });

  it("finds no step where the current has none (Monte Carlo, 200 seeded draws at 4σ; union bound of note 3: expected ≤ 31 positions × 3.2e-5 × 200 = 0.2, so at most 1)", () => {
    const sigmaA = 1e-12;
    let found = 0;
    for (let seed = 1; seed <= 200; seed++) if (predictedStep(x, curve(false, sigmaA, seed), sigmaA, weakV, 0.03, ladder, fw, 4)) found++;
    expect(found).toBeLessThanOrEqual(1);
  });

  it("tests no position within one FWHM of a neighbour or of an end of the range (note 1)", () => {
    const current = curve(true);
    // The prediction on the neighbour at 2.4 V, reach below one FWHM: no position is allowed.
    expect(predictedStep(x, current, 0.05e-12, 2.4, 0.9 * fw, ladder, fw, 0)).toBeNull();
    // The weak step itself a neighbour: nothing left to find near it.
    expect(predictedStep(x, current, 0.05e-12, weakV, 0.9 * fw, [...ladder, weakV], fw, 0)).toBeNull();
    // Within one FWHM of the end of the range.
    expect(predictedStep(x, current, 0.05e-12, 3.49, 0.005, ladder, fw, 0)).toBeNull();
  });
});
