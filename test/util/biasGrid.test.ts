// The median bias step and the 1 % uniformity rule shared by the import record and the signal stage.
// Expected values: closed form (the median of the written steps; the rule |Δ − median| ≤ 0.01·median).
import { describe, expect, it } from "vitest";
import { biasStep, UNIFORM_STEP_TOLERANCE } from "../../lib/util/biasGrid.ts";
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
