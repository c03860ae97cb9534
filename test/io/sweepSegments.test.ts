// Monotonic segments, duplicate merging and linear interpolation. Expected values are by
// construction of the input and, for interpolation, exact on straight lines (closed form).
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { expectClose } from "../helpers/expectClose.ts";
import { interpolateOnto, mergeDuplicates, splitMonotonic } from "../../lib/io/sweepSegments.ts";

describe("splitMonotonic", () => {
  it("splitMonotonic(bias) is one segment for a monotonic sequence", () => {
    // by construction of the input
    expect(splitMonotonic([0, 1, 2, 3])).toEqual([{ start: 0, end: 3, direction: 1 }]);
    expect(splitMonotonic([3, 2, 2, 1])).toEqual([{ start: 0, end: 3, direction: -1 }]);
    expect(splitMonotonic([5])).toEqual([{ start: 0, end: 0, direction: 0 }]);
    expect(splitMonotonic([])).toEqual([]);
  });

  it("splitMonotonic(bias) shares a turning point that occurs once", () => {
    // by construction of the input: 0 1 2 1 0 → rows 0–2 up, 2–4 down
    expect(splitMonotonic([0, 1, 2, 1, 0])).toEqual([
      { start: 0, end: 2, direction: 1 },
      { start: 2, end: 4, direction: -1 },
    ]);
  });

  it("splitMonotonic(bias) splits a repeated turning point between the sweeps", () => {
    // by construction of the input: 0 1 2 2 1 0 → rows 0–2 up, 3–5 down
    expect(splitMonotonic([0, 1, 2, 2, 1, 0])).toEqual([
      { start: 0, end: 2, direction: 1 },
      { start: 3, end: 5, direction: -1 },
    ]);
    // a dwell of three at the top: the first two end the up sweep
    expect(splitMonotonic([0, 1, 2, 2, 2, 1])).toEqual([
      { start: 0, end: 3, direction: 1 },
      { start: 4, end: 5, direction: -1 },
    ]);
  });

  it("splitMonotonic(bias) segments cover every row, each segment monotonic (property)", () => {
    // by construction: the definition of a monotonic segment
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -3, max: 3 }), { maxLength: 40 }), (xs) => {
        const segs = splitMonotonic(xs);
        if (xs.length === 0) return segs.length === 0;
        expect(segs[0].start).toBe(0);
        expect(segs[segs.length - 1].end).toBe(xs.length - 1);
        for (let k = 0; k < segs.length; k++) {
          const s = segs[k];
          if (k > 0) expect(s.start - segs[k - 1].end).toBeLessThanOrEqual(1);
          for (let i = s.start + 1; i <= s.end; i++) {
            const d = Math.sign(xs[i] - xs[i - 1]);
            expect(d === 0 || d === s.direction).toBe(true);
          }
        }
        return true;
      }),
      { numRuns: 300 },
    );
  });
});

describe("mergeDuplicates", () => {
  it("mergeDuplicates(bias, columns, order) averages rows of equal bias", () => {
    // by construction of the input: (10 + 20) / 2 = 15
    const m = mergeDuplicates([0, 1, 1, 2], [[0, 10, 20, 30]], [0, 1, 2, 3]);
    expect(Array.from(m.biasV)).toEqual([0, 1, 2]);
    expect(Array.from(m.values[0])).toEqual([0, 15, 30]);
    expect(m.merged).toBe(1);
  });

  it("mergeDuplicates follows the given order (descending input read backwards)", () => {
    // by construction of the input
    const m = mergeDuplicates([2, 1, 0], [[20, 10, 0]], [2, 1, 0]);
    expect(Array.from(m.biasV)).toEqual([0, 1, 2]);
    expect(Array.from(m.values[0])).toEqual([0, 10, 20]);
  });

  it("mergeDuplicates stays finite for values near the largest double", () => {
    // IEEE 754 double: Number.MAX_VALUE + Number.MAX_VALUE overflows, (a/2 + b/2) does not
    const m = mergeDuplicates([1, 1], [[Number.MAX_VALUE, Number.MAX_VALUE]], [0, 1]);
    expect(m.values[0][0]).toBe(Number.MAX_VALUE);
  });
});

describe("interpolateOnto", () => {
  it("interpolateOnto(from, values, to) is exact on a straight line", () => {
    // closed form: y = 2x + 1 is reproduced by linear interpolation
    const from = Float64Array.of(-1, 0, 0.5, 2);
    const y = from.map((x) => 2 * x + 1);
    const to = Float64Array.of(-1, -0.25, 0.5, 1.25, 2);
    expectClose(interpolateOnto(from, y, to), to.map((x) => 2 * x + 1), { rtol: 1e-15, atol: 1e-15 });
  });

  it("interpolateOnto returns the values at shared points unchanged", () => {
    // by construction of the input
    const from = Float64Array.of(0, 1, 2);
    const y = Float64Array.of(0.1, 0.7, 0.3);
    expect(Array.from(interpolateOnto(from, y, Float64Array.of(0, 1, 2)))).toEqual([0.1, 0.7, 0.3]);
  });
});
