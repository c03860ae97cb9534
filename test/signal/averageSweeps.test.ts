import { mean as mathMean, std as mathStd } from "mathjs";
import { describe, expect, it } from "vitest";
import { averageSweeps } from "../../lib/signal/averageSweeps.ts";
import { isDotspecError } from "../../lib/util/errors.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { whiteNoise } from "./fixtures/random.ts";

describe("averageSweeps(sweeps)", () => {
  it("of two small sweeps (hand-computed)", () => {
    const r = averageSweeps([new Float64Array([1, 2]), new Float64Array([3, 2])]);
    expect(Array.from(r.mean)).toEqual([2, 2]);
    expectClose(r.std, [Math.SQRT2, 0], { rtol: 1e-15 }); // √(((1−2)² + (3−2)²)/1)
    expectClose(r.rmsStd, 1, { rtol: 1e-15 }); // √((2 + 0)/2)
    expect(r.sweepCount).toBe(2);
  });

  it("agrees with mathjs mean and std (unbiased, n − 1) point by point", () => {
    // Reference library: mathjs mean/std (std normalisation "unbiased" by default).
    const sweeps = [1, 2, 3, 4, 5].map((seed) => whiteNoise(50, 1e-12, seed).map((x, i) => x + 1e-10 * i));
    const r = averageSweeps(sweeps);
    let sumVar = 0;
    for (let i = 0; i < 50; i++) {
      const column = sweeps.map((s) => s[i]);
      expectClose(r.mean[i], mathMean(column) as number, { rtol: 1e-14, atol: 1e-25, what: `mean at ${i}` });
      const sd = mathStd(column) as unknown as number;
      expectClose(r.std[i], sd, { rtol: 1e-12, what: `std at ${i}` });
      sumVar += sd * sd;
    }
    expectClose(r.rmsStd, Math.sqrt(sumVar / 50), { rtol: 1e-12 });
  });

  it("returns zeros for one sweep", () => {
    const r = averageSweeps([new Float64Array([1, 5, 3])]);
    expect(Array.from(r.mean)).toEqual([1, 5, 3]);
    expect(Array.from(r.std)).toEqual([0, 0, 0]);
    expect(r.rmsStd).toBe(0);
  });

  it("rejects an empty list and sweeps of different lengths", () => {
    for (const [f, code] of [
      [() => averageSweeps([]), "signal/no-sweeps"],
      [() => averageSweeps([new Float64Array(3), new Float64Array(2)]), "signal/length-mismatch"],
      [() => averageSweeps([new Float64Array(0)]), "signal/too-few-points"],
    ] as const) {
      let caught: unknown;
      try {
        f();
      } catch (err) {
        caught = err;
      }
      expect(isDotspecError(caught)).toBe(true);
      expect((caught as { code: string }).code).toBe(code);
    }
  });
});
