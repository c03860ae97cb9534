// orderLevels: the sub-levels of a split p shell in order of energy (common practice (no source):
// sub-levels are numbered from the gap outward), each keeping its degeneracy and errors; the
// check values are the inputs reordered by hand.
import { describe, it, expect } from "vitest";
import { orderLevels } from "../../../lib/model/fit/orderLevels.ts";
import type { FittedLevel } from "../../../lib/model/fit/curveFit.ts";

const level = (band: "CB" | "VB", label: string, degeneracy: number, energyEV: number, se = 0.001): FittedLevel => ({
  band, label, degeneracy, energyEV: { value: energyEV, standardError: se }, energyV: { value: energyEV / 0.8, standardError: se / 0.8 },
});

describe("orderLevels(levels)", () => {
  it("sorts crossed p sub-levels upward and relabels them p1, p2, …", () => {
    const got = orderLevels([level("CB", "s", 2, 1.117), level("CB", "p1", 2, 1.554, 0.002), level("CB", "p2", 4, 1.503, 0.003), level("CB", "p3", 2, 1.61), level("VB", "v1", 2, -1.15)]);
    expect(got.map((l) => [l.label, l.degeneracy, l.energyEV.value, l.energyEV.standardError])).toEqual([
      ["s", 2, 1.117, 0.001], ["p1", 4, 1.503, 0.003], ["p2", 2, 1.554, 0.002], ["p3", 2, 1.61, 0.001], ["v1", 2, -1.15, 0.001],
    ]);
  });

  it("leaves a whole p level and VB levels in energy order as they are", () => {
    const levels = [level("CB", "s", 2, 0.6), level("CB", "p", 6, 0.9), level("VB", "v1", 4, -1.1), level("VB", "v2", 2, -1.2)];
    expect(orderLevels(levels)).toEqual(levels);
  });

  it("puts crossed VB levels downward from the gap, the labels v1, v2 keeping their places", () => {
    const got = orderLevels([level("CB", "s", 2, 0.6), level("VB", "v1", 2, -1.2, 0.002), level("VB", "v2", 4, -1.1, 0.003)]);
    expect(got.map((l) => [l.label, l.degeneracy, l.energyEV.value, l.energyEV.standardError])).toEqual([
      ["s", 2, 0.6, 0.001], ["v1", 4, -1.1, 0.003], ["v2", 2, -1.2, 0.002],
    ]);
  });
});
