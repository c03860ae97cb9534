import { describe, expect, it } from "vitest";
import { mapCentre } from "../../lib/grid/mapCentre.ts";
import { rmsRadius } from "../../lib/grid/rmsRadius.ts";
import { mapRoundness } from "../../lib/grid/mapRoundness.ts";
import { radialProfile } from "../../lib/grid/radialProfile.ts";
import { dipDepth } from "../../lib/grid/dipDepth.ts";
import { thresholdMap } from "../../lib/grid/thresholdMap.ts";
import type { MapImage } from "../../lib/grid/mapImage.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

const axis = (start: number, step: number, count: number) => ({ start, step, count });
/** A map sampled from f(x, y) on an n × n grid of step h centred on 0. */
function sampled(n: number, h: number, f: (x: number, y: number) => number): MapImage {
  const values = new Float64Array(n * n);
  const s = -((n - 1) / 2) * h;
  for (let iy = 0; iy < n; iy++) for (let ix = 0; ix < n; ix++) values[iy * n + ix] = f(s + ix * h, s + iy * h);
  return { values, xNM: axis(s, h, n), yNM: axis(s, h, n) };
}

describe("mapCentre(map)", () => {
  it("is the weighted mean position (closed form: (0·1 + 2·3)/4 = 1.5)", () => {
    expect(mapCentre({ values: Float64Array.of(1, 3), xNM: axis(0, 2, 2), yNM: axis(5, 1, 1) })).toEqual([1.5, 5]);
  });
  it("ignores NaN and is null without a positive value", () => {
    expect(mapCentre({ values: Float64Array.of(NaN, 2), xNM: axis(0, 1, 2), yNM: axis(0, 1, 1) })).toEqual([1, 0]);
    expect(mapCentre({ values: Float64Array.of(0, 0), xNM: axis(0, 1, 2), yNM: axis(0, 1, 1) })).toBeNull();
  });
});

describe("rmsRadius(map, centre) and mapRoundness(map, centre)", () => {
  it("a sampled 2-D Gaussian of σ has RMS radius √2·σ and roundness 1 (closed form)", () => {
    const sigma = 1.3;
    const m = sampled(81, 0.2, (x, y) => Math.exp(-(x * x + y * y) / (2 * sigma * sigma))); // ±6σ: truncation below 1e-7
    expectClose(rmsRadius(m, [0, 0])!, Math.SQRT2 * sigma, { rtol: 1e-6, what: "√2·σ" });
    expectClose(mapRoundness(m, [0, 0])!, 1, { rtol: 1e-9, what: "isotropic" });
  });
  it("an elongated Gaussian (σx = 2σy) has roundness σy/σx = 0.5 (closed form)", () => {
    const m = sampled(121, 0.2, (x, y) => Math.exp(-(x * x) / (2 * 4) - (y * y) / (2 * 1))); // ±6σx
    expectClose(mapRoundness(m, [0, 0])!, 0.5, { rtol: 1e-4, what: "σy/σx" });
  });
});

describe("radialProfile(map, centre) and dipDepth(profile)", () => {
  it("averages rings: a ring map r² e^(−r²) peaks at r = 1 and has a full dip (closed form: max of r²e^(−r²) at r = 1)", () => {
    const m = sampled(41, 0.1, (x, y) => (x * x + y * y) * Math.exp(-(x * x + y * y)));
    const p = radialProfile(m, [0, 0]);
    let kMax = 0;
    for (let k = 0; k < p.mean.length; k++) if (p.mean[k] > p.mean[kMax]) kMax = k;
    expectClose(p.radiusNM[kMax], 1, { atol: 0.1, what: "argmax r²e^(−r²) = 1 (one ring width)" });
    expect(dipDepth(p)!).toBeGreaterThan(0.95);
  });
  it("gives depth 0 for a centred Gaussian and the documented example", () => {
    const m = sampled(21, 0.2, (x, y) => Math.exp(-(x * x + y * y)));
    expect(dipDepth(radialProfile(m, [0, 0]))).toBe(0);
    expect(dipDepth({ radiusNM: Float64Array.of(0.5, 1.5), mean: Float64Array.of(1, 4), pixels: Uint32Array.of(4, 12), binNM: 1 })).toBe(0.75);
  });
  it("counts pixels per ring (3 × 3 grid: the centre, then 8 within √2)", () => {
    const p = radialProfile({ values: Float64Array.of(2, 2, 2, 2, 1, 2, 2, 2, 2), xNM: axis(-1, 1, 3), yNM: axis(-1, 1, 3) }, [0, 0], { maxRadiusNM: 2 });
    expect(Array.from(p.pixels)).toEqual([1, 8]);
    expect(Array.from(p.mean)).toEqual([1, 2]);
  });
  it("rejects a ring width that is not positive", () => {
    expectError(() => radialProfile(sampled(3, 1, () => 1), [0, 0], { binNM: 0 }), "options/not-positive", "binNM");
  });
});

describe("thresholdMap(map, floor)", () => {
  it("zeroes values below the floor and negative values, keeps NaN", () => {
    const r = thresholdMap({ values: Float64Array.of(-1, 0.5, 3, NaN), xNM: axis(0, 1, 4), yNM: axis(0, 1, 1) }, 1);
    expect(Array.from(r.map.values)).toEqual([0, 0, 3, NaN]);
    expect(r.kept).toBe(1);
    expectError(() => thresholdMap(r.map, -1), "options/negative", "floor");
  });
});
