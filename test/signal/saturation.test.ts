import { describe, expect, it } from "vitest";
import { findSaturation, SATURATION_DEFAULTS } from "../../lib/signal/saturation.ts";
import { seededRandom } from "../../lib/util/random.ts";

const biasV = Float64Array.from({ length: 201 }, (_, i) => -1 + 0.01 * i);

describe("findSaturation(biasV, currentA, options)", () => {
  it("SATURATION_DEFAULTS are locked", () => {
    expect(SATURATION_DEFAULTS).toEqual({ minRunSamples: 5, toleranceFraction: 1e-9, noiseDominanceRatio: 2, kneeSlopeFraction: 1e-3 });
    expect(Object.isFrozen(SATURATION_DEFAULTS)).toBe(true);
  });

  it("finds a line clipped at both ends, noise-free (closed form: I = V·1 nA/V clipped at ±0.8 nA flattens |V| ≥ 0.8 V)", () => {
    const currentA = biasV.map((v) => Math.max(-0.8e-9, Math.min(0.8e-9, 1e-9 * v)));
    const found = findSaturation(biasV, currentA, { noiseA: 0 });
    expect(found.map((s) => s.end)).toEqual(["negative", "positive"]);
    // by construction: samples −1.00 … −0.80 V and 0.80 … 1.00 V (21 each)
    expect(found[0].indices).toEqual([0, 20]);
    expect(found[1].indices).toEqual([180, 200]);
    expect(found[1].levelA).toBe(0.8e-9);
  });

  it("finds a clipped noisy curve from the run alone (equal samples amid noise 100× the resolution)", () => {
    const rng = seededRandom(5);
    const currentA = biasV.map((v) => Math.min(0.5e-9, 1e-9 * v * v * v + 1e-12 * rng.normal()));
    const found = findSaturation(biasV, currentA, { noiseA: 1e-12, resolutionA: 1e-14 });
    expect(found.length).toBe(1);
    expect(found[0].end).toBe("positive");
    // closed form: V³ = 0.5 at V = 0.794 V; the run starts at the first sample above it (noise may move it by one)
    expect(Math.abs(found[0].biasV[0] - 0.8)).toBeLessThanOrEqual(0.02);
  });

  it("leaves a noise-free curve that approaches its own plateau smoothly alone (closed form: a Gaussian-broadened step, erf)", () => {
    const erf = (x: number) => {
      // Abramowitz & Stegun 7.1.26 (|error| < 1.5e-7), enough for the shape
      const t = 1 / (1 + 0.3275911 * Math.abs(x));
      const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
      return x >= 0 ? y : -y;
    };
    const currentA = biasV.map((v) => 1e-9 * (1 + erf((v - 0.3) / 0.05)));
    expect(findSaturation(biasV, currentA, { noiseA: 0, resolutionA: 1e-15 })).toEqual([]);
  });

  it("ignores runs shorter than 5 samples and extremes at the ends that are not flat", () => {
    const short = biasV.map((v) => Math.min(0.97e-9, 1e-9 * v)); // flat over the last 4 samples
    expect(findSaturation(biasV, short, { noiseA: 0 })).toEqual([]);
    const curved = biasV.map((v) => 1e-9 * Math.cos(2 * v)); // its minimum at both ends, but no run
    expect(findSaturation(biasV, curved, { noiseA: 0 })).toEqual([]);
  });
});
