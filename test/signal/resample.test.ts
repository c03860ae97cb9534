import { describe, expect, it } from "vitest";
import { RESAMPLE_DEFAULTS, isUniformStep, resampleUniform } from "../../lib/signal/resample.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { mulberry32 } from "./fixtures/random.ts";
import { expectError } from "../helpers/errors.ts";


/** A strictly ascending, irregular bias axis from −1.5 V to 2 V (seeded). */
function irregularBias(n: number, seed: number): Float64Array {
  const rand = mulberry32(seed);
  const steps = Array.from({ length: n - 1 }, () => 0.5 + rand());
  const total = steps.reduce((a, b) => a + b, 0);
  const out = new Float64Array(n);
  out[0] = -1.5;
  for (let i = 1; i < n; i++) out[i] = out[i - 1] + (3.5 * steps[i - 1]) / total;
  out[n - 1] = 2;
  return out;
}

describe("isUniformStep(biasV, tolerance)", () => {
  it("accepts uniform axes and rejects a missing point", () => {
    expect(isUniformStep([0, 0.1, 0.2, 0.3])).toBe(true);
    expect(isUniformStep(Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002))).toBe(true);
    expect(isUniformStep([0, 0.1, 0.2, 0.4, 0.5])).toBe(false);
    expect(isUniformStep([1])).toBe(true);
    expect(isUniformStep([1, 3])).toBe(true);
  });

  it("compares every step with the median step, within the tolerance", () => {
    // Steps 1, 1, 1.005, 1 (0.5 % off) and 1, 1, 1.02, 1 (2 % off); median step 1.
    expect(isUniformStep([0, 1, 2, 3.005, 4.005])).toBe(true);
    expect(isUniformStep([0, 1, 2, 3.02, 4.02])).toBe(false);
    expect(isUniformStep([0, 1, 2, 3.02, 4.02], 0.03)).toBe(true);
  });

  it("rejects axes that are not strictly ascending, and bad tolerances", () => {
    expectError(() => isUniformStep([0, 0.2, 0.1]), "signal/not-ascending", "index 2");
    expectError(() => isUniformStep([0, 0.1, 0.1]), "signal/not-ascending");
    expectError(() => isUniformStep([0, Number.NaN]), "signal/not-finite");
    expectError(() => isUniformStep([0, 1], -1), "signal/invalid-tolerance", "got -1");
  });
});

describe("resampleUniform(biasV, series, stepV)", () => {
  it("reproduces linear functions exactly on a uniform grid from min to max", () => {
    // Closed form: linear interpolation of a linear function is the function itself.
    const biasV = irregularBias(700, 4);
    const a = Float64Array.from(biasV, (v) => 3 - 2 * v);
    const b = Float64Array.from(biasV, (v) => 1e-9 * v + 2e-12);
    const r = resampleUniform(biasV, [a, b]);
    expect(r.biasV[0]).toBe(-1.5);
    expect(r.biasV[r.biasV.length - 1]).toBe(2);
    expectClose(r.stepV, 3.5 / (r.biasV.length - 1), { rtol: 1e-15 });
    for (let i = 1; i < r.biasV.length; i++) expectClose(r.biasV[i] - r.biasV[i - 1], r.stepV, { rtol: 1e-9, what: `step ${i}` });
    expectClose(r.series[0], Array.from(r.biasV, (v) => 3 - 2 * v), { rtol: 1e-13, atol: 1e-14 });
    expectClose(r.series[1], Array.from(r.biasV, (v) => 1e-9 * v + 2e-12), { rtol: 1e-13, atol: 1e-24 });
  });

  it("uses the median step by default and the requested step (adjusted to end at max) otherwise", () => {
    const biasV = [0, 0.1, 0.2, 0.4, 0.5, 0.6];
    const y = biasV.map((v) => 10 * v);
    const r = resampleUniform(biasV, [y]);
    expectClose(r.stepV, 0.1, { rtol: 1e-14, what: "median step of 0.1 0.1 0.2 0.1 0.1" });
    expectClose(r.series[0], [0, 1, 2, 3, 4, 5, 6], { rtol: 1e-13, atol: 1e-14 });
    // 0.6 V / 0.13 V = 4.6 → 5 intervals of 0.12 V.
    const s = resampleUniform(biasV, [y], 0.13);
    expect(s.biasV.length).toBe(6);
    expectClose(s.stepV, 0.12, { rtol: 1e-14 });
    expectClose(s.series[0], [0, 1.2, 2.4, 3.6, 4.8, 6], { rtol: 1e-13, atol: 1e-14 });
  });

  it("interpolates a piecewise-linear series between its points (hand-computed)", () => {
    const r = resampleUniform([0, 1, 3], [[0, 2, 0]], 0.5);
    expectClose(r.series[0], [0, 1, 2, 1.5, 1, 0.5, 0], { rtol: 1e-15, atol: 1e-15 });
  });

  it("leaves its inputs unchanged", () => {
    const biasV = new Float64Array([0, 0.1, 0.3]);
    const y = new Float64Array([1, 2, 3]);
    resampleUniform(biasV, [y]);
    expect(Array.from(biasV)).toEqual([0, 0.1, 0.3]);
    expect(Array.from(y)).toEqual([1, 2, 3]);
  });

  it("rejects short, unsorted or mismatched input and bad steps", () => {
    expectError(() => resampleUniform([1], [[1]]), "signal/too-few-points", "at least 2");
    expectError(() => resampleUniform([0, 2, 1], [[1, 2, 3]]), "signal/not-ascending");
    expectError(() => resampleUniform([0, 1, 2], [[1, 2]]), "signal/length-mismatch", "series[0]", "(3)", "got 2");
    expectError(() => resampleUniform([0, 1, 2], [[1, 2, 3]], 0), "signal/invalid-step", "got 0");
  });

  it("RESAMPLE_DEFAULTS are locked", () => {
    expect({ ...RESAMPLE_DEFAULTS }).toEqual({ tolerance: 0.01 });
  });
});
