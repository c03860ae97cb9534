// withMultiplets: each peak's multiplet read from the multiplets' peak indices.
import { describe, it, expect } from "vitest";
import { withMultiplets } from "../../lib/assign/peakMultiplets.ts";
import type { Multiplet } from "../../lib/assign/assignSpectrum.ts";
import { expectError } from "../helpers/errors.ts";

const multiplet = (label: string, peakIndices: number[]): Multiplet => ({
  band: label.startsWith("v") ? "VB" : "CB",
  label,
  degeneracy: null,
  peakIndices,
  peaksV: [],
  peakUncertaintiesV: [],
  found: peakIndices.length,
  expected: null,
  subgroups: [peakIndices.length],
});

describe("withMultiplets(peaks, multiplets)", () => {
  // Expected links written out by hand from the indices given (common practice (no source)).
  const peaks = [{ biasV: -0.9 }, { biasV: -0.8 }, { biasV: 0.69 }, { biasV: 0.7 }, { biasV: 0.81 }];
  const multiplets = [multiplet("s", [2, 4]), multiplet("v1", [1, 0])];

  it("gives each peak the index of the multiplet naming it, null to the others", () => {
    expect(withMultiplets(peaks, multiplets).map((p) => p.multiplet)).toEqual([1, 1, 0, null, 0]);
  });

  it("links peaks of equal bias by index, not by position", () => {
    const twins = [{ biasV: 0.5 }, { biasV: 0.5 }];
    expect(withMultiplets(twins, [multiplet("s", [1])]).map((p) => p.multiplet)).toEqual([null, 0]);
  });

  it("returns copies and leaves the peaks as they were", () => {
    const out = withMultiplets(peaks, multiplets);
    expect(out[0]).not.toBe(peaks[0]);
    expect(peaks[0]).toEqual({ biasV: -0.9 });
    expect(out[0]).toEqual({ biasV: -0.9, multiplet: 1 });
  });

  it("throws assign/foreign-multiplets for an index outside the list or a peak claimed twice", () => {
    expectError(() => withMultiplets(peaks, [multiplet("s", [5])]), "assign/foreign-multiplets", /peak 5, outside the 5 peaks/);
    expectError(() => withMultiplets(peaks, [multiplet("s", [2]), multiplet("p", [2])]), "assign/foreign-multiplets", /peak 2 is claimed/);
  });
});
