import { erf } from "mathjs";
import { describe, expect, it } from "vitest";
import {
  MAD_TO_SIGMA,
  WHITE_NOISE_DEFAULTS,
  median,
  medianAbsoluteDeviation,
  whiteNoiseSigma,
} from "../../lib/signal/noise.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { steppedCurrent } from "./fixtures/noiseEstimators.ts";
import { mulberry32, whiteNoise } from "./fixtures/random.ts";
import { expectError } from "../helpers/errors.ts";


describe("median(values)", () => {
  it("of small arrays (hand-computed)", () => {
    expect(median([3, 1, 4, 1, 5])).toBe(3); // sorted 1 1 3 4 5
    expect(median([1, 2, 3, 10])).toBe(2.5); // (2 + 3)/2
    expect(median([7])).toBe(7);
    expect(median([-1, -1, -1, 2])).toBe(-1); // (−1 + −1)/2
  });

  it("equals the middle of a full sort on seeded random data, odd and even lengths", () => {
    // Reference: Array.prototype.sort (numeric comparator).
    const rand = mulberry32(3);
    for (const n of [1, 2, 3, 10, 101, 1000, 1001]) {
      const values = Array.from({ length: n }, () => Math.floor(rand() * 50) - 25); // many ties
      const sorted = [...values].sort((a, b) => a - b);
      const expected = n % 2 ? sorted[(n - 1) / 2] : (sorted[n / 2 - 1] + sorted[n / 2]) / 2;
      expect(median(values), `n = ${n}`).toBe(expected);
    }
  });

  it("does not modify its input", () => {
    const values = new Float64Array([5, 3, 1, 4]);
    median(values);
    expect(Array.from(values)).toEqual([5, 3, 1, 4]);
  });
});

describe("medianAbsoluteDeviation(values)", () => {
  it("of a known small array (hand-computed)", () => {
    // median 2; |x − 2| = 1 1 0 0 2 4 7 → sorted 0 0 1 1 2 4 7 → 1.
    expect(medianAbsoluteDeviation([1, 1, 2, 2, 4, 6, 9])).toBe(1);
    // median 2.5; |x − 2.5| = 1.5 0.5 0.5 7.5 → sorted 0.5 0.5 1.5 7.5 → 1.
    expect(medianAbsoluteDeviation([1, 2, 3, 10])).toBe(1);
    expect(medianAbsoluteDeviation([4, 4, 4])).toBe(0);
  });

  it("rejects empty and non-finite input", () => {
    expectError(() => medianAbsoluteDeviation([]), "signal/too-few-points", "at least 1");
    expectError(() => medianAbsoluteDeviation([1, Number.NaN]), "signal/not-finite", "index 1");
  });
});

describe("MAD_TO_SIGMA", () => {
  it("is 1/Φ⁻¹(3/4): Φ(1/MAD_TO_SIGMA) = 3/4 with Φ from mathjs's erf", () => {
    // Φ(x) = (1 + erf(x/√2))/2 (closed form); erf from mathjs (reference library).
    expectClose((1 + erf(1 / MAD_TO_SIGMA / Math.SQRT2)) / 2, 0.75, { rtol: 1e-14 });
    expectClose(MAD_TO_SIGMA, 1.482602218505602, { rtol: 1e-12, what: "1.4826… (from memory)" });
  });
});

describe("whiteNoiseSigma(y, {differenceOrder})", () => {
  it("of an alternating sequence (hand-computed)", () => {
    // Lengths chosen so that each set of differences has an even count (median 0).
    const odd = [0, 1, 0, 1, 0, 1, 0, 1, 0];
    const even = [0, 1, 0, 1, 0, 1, 0, 1];
    // Δ³y = +4, −4, … (six values), median 0 → MAD 4 → σ = 1.4826·4/√20.
    expectClose(whiteNoiseSigma(odd), (MAD_TO_SIGMA * 4) / Math.sqrt(20), { rtol: 1e-14 });
    // Δ²y = −2, +2, … (six values) → MAD 2 → σ = 1.4826·2/√6.
    expectClose(whiteNoiseSigma(even, { differenceOrder: 2 }), (MAD_TO_SIGMA * 2) / Math.sqrt(6), { rtol: 1e-14 });
    // Δy = +1, −1, … (eight values) → MAD 1 → σ = 1.4826/√2.
    expectClose(whiteNoiseSigma(odd, { differenceOrder: 1 }), MAD_TO_SIGMA / Math.SQRT2, { rtol: 1e-14 });
    // An odd count of alternating differences has median ±4 and MAD 0: the estimate needs
    // differences that scatter around a common centre, as noise does.
    expect(whiteNoiseSigma(even)).toBe(0);
  });

  it("recovers σ of seeded Gaussian noise on 10⁴ samples within 4 %", () => {
    // Seeded white noise (mulberry32 + Box–Muller), σ = 2.5e-12; the estimator is consistent by
    // construction (closed form: Var Δᵏε = C(2k, k)σ²). Scatter on 10⁴ samples ≈ 1.5 % (Monte Carlo).
    for (const seed of [1, 2, 3]) {
      const y = whiteNoise(10000, 2.5e-12, seed);
      for (const k of [1, 2, 3] as const) {
        expectClose(whiteNoiseSigma(y, { differenceOrder: k }), 2.5e-12, { rtol: 0.04, what: `seed ${seed}, k = ${k}` });
      }
    }
  });

  it("recovers σ with a step-like I(V) curve underneath (signal/σ = 10³, 10⁴)", () => {
    // Ten erf current steps of 20 mV FWHM on a sinh background, 2 mV step (test/signal/fixtures/noiseEstimators.ts).
    const clean = steppedCurrent(20);
    let peak = 0;
    for (const x of clean) peak = Math.max(peak, Math.abs(x));
    for (const snr of [1e3, 1e4]) {
      const sigma = peak / snr;
      const noise = whiteNoise(clean.length, sigma, 17);
      const y = clean.map((x, i) => x + noise[i]);
      expectClose(whiteNoiseSigma(y), sigma, { rtol: 0.06, what: `k = 3 (default), snr ${snr}` });
    }
    // The first difference is biased by the slope of the steps: this is why it is not the default.
    const sigma = peak / 1e4;
    const noise = whiteNoise(clean.length, sigma, 17);
    const y = clean.map((x, i) => x + noise[i]);
    expect(whiteNoiseSigma(y, { differenceOrder: 1 }) / sigma).toBeGreaterThan(2);
  });

  it("is zero for a noise-free polynomial of degree below the difference order (closed form)", () => {
    const quadratic = Float64Array.from({ length: 200 }, (_, i) => 3 + 0.5 * i - 0.01 * i * i);
    expect(whiteNoiseSigma(quadratic)).toBeLessThan(1e-12);
    const line = Float64Array.from({ length: 200 }, (_, i) => 2 * i);
    expect(whiteNoiseSigma(line, { differenceOrder: 2 })).toBe(0);
  });

  it("rejects a bad difference order, too few points and non-finite values", () => {
    expectError(() => whiteNoiseSigma([1, 2, 3, 4, 5, 6], { differenceOrder: 4 as 3 }), "signal/invalid-difference-order", "got 4");
    expectError(() => whiteNoiseSigma([1, 2, 3, 4]), "signal/too-few-points", "at least 5", "got 4");
    expectError(() => whiteNoiseSigma([1, 2, Number.POSITIVE_INFINITY, 4, 5, 6]), "signal/not-finite", "index 2");
  });

  it("WHITE_NOISE_DEFAULTS are locked", () => {
    expect({ ...WHITE_NOISE_DEFAULTS }).toEqual({ differenceOrder: 3 });
  });
});
