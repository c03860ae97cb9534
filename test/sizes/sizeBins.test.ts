// sizeBins: dots grouped by radius. Expected values by hand from the inputs (mean and sample SD:
// closed forms; bin k = floor(R / w)).
import { describe, it, expect } from "vitest";
import { sizeBins, SIZE_BINS_DEFAULTS } from "../../lib/sizes/sizeBins.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

describe("sizeBins(dots, options)", () => {
  it("SIZE_BINS_DEFAULTS is locked", () => {
    expect(SIZE_BINS_DEFAULTS).toEqual({ binNM: 0.25 });
  });
  it("groups by [k·w, (k+1)·w) with a radius on an edge in the bin above; mean, SD and count by hand", () => {
    const bins = sizeBins([
      { dot: "a", radiusNM: 1.6, values: { gapEV: 2.9, ecEV: 0.1 } },
      { dot: "b", radiusNM: 1.7, values: { gapEV: 2.8, ecEV: null } },
      { dot: "c", radiusNM: 0.75, values: { gapEV: 3.5, ecEV: 0.2 } },
      { dot: "d", radiusNM: 1.74, values: { gapEV: 2.7, ecEV: 0.12 } },
    ]);
    expect(bins.map((b) => [b.fromNM, b.toNM, b.dots])).toEqual([
      [0.75, 1, ["c"]],
      [1.5, 1.75, ["a", "b", "d"]],
    ]);
    const b = bins[1];
    expectClose(b.radiusNM, (1.6 + 1.7 + 1.74) / 3, { rtol: 1e-12 });
    expectClose(b.values.gapEV!.mean, 2.8, { rtol: 1e-12 });
    expectClose(b.values.gapEV!.sd!, 0.1, { rtol: 1e-9 });
    expect(b.values.gapEV!.count).toBe(3);
    expectClose(b.values.ecEV!.mean, 0.11, { rtol: 1e-12 });
    expect(b.values.ecEV!.count).toBe(2);
    expect(bins[0].values.gapEV).toEqual({ mean: 3.5, sd: null, count: 1 });
  });
  it("takes the width from binNM", () => {
    const bins = sizeBins([{ dot: "a", radiusNM: 1.6, values: {} }, { dot: "b", radiusNM: 1.9, values: {} }], { binNM: 0.5 });
    expect(bins.map((b) => b.dots)).toEqual([["a", "b"]]);
  });
  it("refuses a width ≤ 0 and a radius ≤ 0", () => {
    expectError(() => sizeBins([], { binNM: 0 }), "options/not-positive", "binNM");
    expectError(() => sizeBins([{ dot: "x", radiusNM: -1, values: {} }]), "sizes/bad-radius", '"x"');
  });
});
