// The median bias step and the 1 % uniformity rule shared by the import record and the signal stage.
// Expected values: closed form (the median of the written steps; the rule |Δ − median| ≤ 0.01·median).
import { describe, expect, it } from "vitest";
import { biasStep, isUniformAxis, uniformByStepRange, UNIFORM_STEP_TOLERANCE } from "../../lib/util/biasGrid.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { expectClose } from "../helpers/expectClose.ts";

describe("biasStep(biasV)", () => {
  it("UNIFORM_STEP_TOLERANCE is 1 % (locked; ImportRecord.uniformStep documents it)", () => {
    expect(UNIFORM_STEP_TOLERANCE).toBe(0.01);
  });

  it("takes the middle step for an odd count and the mean of the middle two for an even count", () => {
    // Steps 1, 1, 2 mV → median 1 mV; steps 1, 2, 3, 4 mV → (2 + 3)/2 = 2.5 mV.
    expectClose(biasStep(Float64Array.of(0, 0.001, 0.002, 0.004)).medianV, 0.001, { rtol: 1e-12 });
    expectClose(biasStep(Float64Array.of(0, 0.001, 0.003, 0.006, 0.01)).medianV, 0.0025, { rtol: 1e-12 });
  });

  it("calls steps uniform within 1 % of the median and not beyond", () => {
    // Steps 1, 1, 1.009 (0.9 % off) and 1, 1, 1.011 (1.1 % off), in units of 1 V.
    expect(biasStep(Float64Array.of(0, 1, 2, 3.009)).uniform).toBe(true);
    expect(biasStep(Float64Array.of(0, 1, 2, 3.011)).uniform).toBe(false);
    expect(biasStep(Float64Array.of(-1, 1)).uniform).toBe(true);
  });
});

describe("isUniformAxis(biasV) (the rule without the median when the steps' range decides)", () => {
  it("answers as the 1 % rule on hand-made axes, including those the range alone cannot decide", () => {
    // Closed form: steps 1, 1, 1.009 → within 1 % of the median 1; 1, 1, 1.011 → not.
    expect(isUniformAxis(Float64Array.of(0, 1, 2, 3.009))).toBe(true);
    expect(isUniformAxis(Float64Array.of(0, 1, 2, 3.011))).toBe(false);
    // Steps 0.995, 1, 1, 1, 1.008: range 0.013 > 1 % of the smallest, yet every step is within
    // 0.008 of the median 1, so uniform; steps 0.98, 1, 1, 1 → 2 % below the median, not uniform.
    expect(isUniformAxis(Float64Array.of(0, 0.995, 1.995, 2.995, 3.995, 5.003))).toBe(true);
    expect(uniformByStepRange(Float64Array.of(0, 0.995, 1.995, 2.995, 3.995, 5.003))).toBe(false); // undecided by the range alone
    expect(isUniformAxis(Float64Array.of(0, 0.98, 1.98, 2.98, 3.98))).toBe(false);
    // Descending axes, a repeated point (a zero step) and too few points.
    expect(isUniformAxis(Float64Array.of(3, 2, 1, 0))).toBe(true);
    expect(isUniformAxis(Float64Array.of(0, 1, 1, 2))).toBe(false);
    expect(isUniformAxis(Float64Array.of(0))).toBe(true);
  });

  it("agrees with biasStep's rule on 2,000 jittered axes around the 1 % limit", () => {
    // Reference: the rule as biasStep states it (|Δᵢ − median| ≤ tolerance·|median|), closed form.
    const rng = seededRandom(11);
    for (let k = 0; k < 2000; k++) {
      const n = 3 + Math.floor(rng.uniform() * 40);
      const jitter = 0.02 * rng.uniform();
      const sign = k % 2 ? 1 : -1;
      const axis = new Float64Array(n);
      for (let i = 1; i < n; i++) axis[i] = axis[i - 1] + sign * 0.002 * (1 + jitter * (rng.uniform() - 0.5));
      expect(isUniformAxis(axis)).toBe(biasStep(axis).uniform);
      // The range test is sufficient, never wrong when it says uniform.
      if (uniformByStepRange(axis)) expect(biasStep(axis).uniform).toBe(true);
    }
  });
});
