import { describe, expect, it } from "vitest";
import { mapFunctional, indexRange } from "../../lib/grid/mapFunctional.ts";
import { gridConductance } from "../../lib/grid/gridConductance.ts";
import { runPixelPass, combinePixelPass } from "../../lib/grid/pixelPass.ts";
import { functionalNoise } from "../../lib/grid/gridNoise.ts";
import { planGridMaps, GRID_MAP_DEFAULTS } from "../../lib/grid/planGridMaps.ts";
import { GRID_NOISE_DEFAULTS } from "../../lib/grid/gridNoise.ts";
import type { GridCube } from "../../lib/grid/gridCube.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

const bias = { start: -1, step: 0.01, count: 201 };
const V = (k: number) => bias.start + k * bias.step;
const filter = { windowSamples: 9, order: 3 };
/** A cubic I(V) = a + bV + cV² + dV³: Savitzky–Golay of order 3 differentiates it exactly (Savitzky & Golay 1964). */
const cubic = (v: number) => 1 + 2 * v - 0.5 * v * v + 0.8 * v * v * v;
const dCubic = (v: number) => 2 - v + 2.4 * v * v;
const apply = (f: { firstIndex: number; weights: Float64Array }, y: (k: number) => number) => f.weights.reduce((s, w, j) => s + w * y(f.firstIndex + j), 0);

describe("mapFunctional(bias, measure, filter)", () => {
  it("didvMean of a cubic is the mean of its exact derivative over the window (closed form)", () => {
    const f = mapFunctional(bias, { kind: "didvMean", fromV: 0.3, toV: 0.35 }, filter);
    const [a, b] = indexRange(bias, 0.3, 0.35);
    let want = 0;
    for (let k = a; k <= b; k++) want += dCubic(V(k)) / (b - a + 1);
    expectClose(apply(f, (k) => cubic(V(k))), want, { rtol: 1e-9, what: "mean of dI/dV of the cubic" });
  });
  it("didvIntegral of a cubic is the trapezoid integral of its exact derivative, also at the ends (asymmetric fits)", () => {
    const f = mapFunctional(bias, { kind: "didvIntegral", fromV: -1, toV: -0.5 }, filter);
    const [a, b] = indexRange(bias, -1, -0.5);
    let want = 0;
    for (let k = a; k <= b; k++) want += (k === a || k === b ? 0.5 : 1) * dCubic(V(k)) * bias.step;
    expectClose(apply(f, (k) => cubic(V(k))), want, { rtol: 1e-9, what: "trapezoid of the exact derivative" });
  });
  it("currentMean of a cubic less its offset region is the mean difference (smoothing is exact for a cubic)", () => {
    const f = mapFunctional(bias, { kind: "currentMean", fromV: -0.8, toV: -0.8, offsetV: [-0.1, 0.1], sign: -1 }, filter);
    const [oa, ob] = indexRange(bias, -0.1, 0.1);
    let off = 0;
    for (let k = oa; k <= ob; k++) off += cubic(V(k)) / (ob - oa + 1);
    expectClose(apply(f, (k) => cubic(V(k))), -(cubic(-0.8) - off), { rtol: 1e-9, what: "closed form" });
  });
  it("equals the same average of the per-pixel dI/dV cube (the filter is linear)", () => {
    const nb = bias.count;
    const data = new Float64Array(2 * nb);
    for (let k = 0; k < nb; k++) {
      data[k] = Math.tanh(5 * V(k)) + 0.01 * Math.sin(37 * k);
      data[nb + k] = Math.exp(V(k));
    }
    const cube: GridCube = { currentA: data, xNM: { start: 0, step: 1, count: 2 }, yNM: { start: 0, step: 1, count: 1 }, biasV: bias, missing: null, source: "test" };
    const didv = gridConductance(cube, filter);
    const f = mapFunctional(bias, { kind: "didvMean", fromV: -1, toV: -0.95 }, filter);
    const maps = runPixelPass(cube, { kind: "maps", functionals: [f] }, 0, 2);
    const [a, b] = indexRange(bias, -1, -0.95);
    for (let p = 0; p < 2; p++) {
      let want = 0;
      for (let k = a; k <= b; k++) want += didv[p * nb + k] / (b - a + 1);
      expectClose(maps[p], want, { rtol: 1e-10, what: "mean of gridConductance" });
    }
  });
  it("rejects a range outside the axis", () => {
    expectError(() => mapFunctional(bias, { kind: "didvMean", fromV: 2, toV: 2.1 }, filter), "grid/empty-range", "outside");
  });
});

describe("functionalNoise(functional, σ)", () => {
  it("is σ·√Σw² (variance of a sum of independent samples)", () => {
    expect(functionalNoise({ firstIndex: 0, weights: Float64Array.of(0.5, 0.5) }, 2)).toBeCloseTo(Math.SQRT2, 15);
  });
});

describe("runPixelPass / combinePixelPass", () => {
  it("the spectrum sum over parts equals the sum over all pixels, skipping missing pixels", () => {
    const nb = 5;
    const data = Float64Array.from({ length: 4 * nb }, (_, i) => i);
    const cube: GridCube = { currentA: data, xNM: { start: 0, step: 1, count: 2 }, yNM: { start: 0, step: 1, count: 2 }, biasV: { start: 0, step: 1, count: nb }, missing: Uint8Array.of(0, 1, 0, 0), source: "t" };
    const pass = { kind: "spectrumSum" as const, mask: null };
    const whole = runPixelPass(cube, pass, 0, 4);
    const split = combinePixelPass(pass, [{ fromPixel: 0, toPixel: 1, values: runPixelPass(cube, pass, 0, 1) }, { fromPixel: 1, toPixel: 4, values: runPixelPass(cube, pass, 1, 4) }], 4, nb);
    expect(Array.from(split)).toEqual(Array.from(whole));
    // closed form: pixels 0, 2, 3 at bias 0 hold 0, 10, 15
    expect(whole[0]).toBe(25);
    expect(whole[nb]).toBe(3);
  });
});

describe("defaults", () => {
  it("are frozen and locked", () => {
    expect(Object.isFrozen(GRID_MAP_DEFAULTS)).toBe(true);
    expect(GRID_MAP_DEFAULTS).toEqual({ peakWindowFraction: 0.25, multipletReachFWHM: 1, neighbourStopFraction: 0.5 }); // common practice (no source)
    expect(Object.isFrozen(GRID_NOISE_DEFAULTS)).toBe(true);
    expect(GRID_NOISE_DEFAULTS).toEqual({ samplePixels: 256 }); // common practice (no source)
    expect(typeof planGridMaps).toBe("function");
  });
});
