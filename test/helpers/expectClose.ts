import { expect } from "vitest";

export interface CloseOptions {
  /** Relative tolerance (fraction of |expected|). Default 1e-12. */
  rtol?: number;
  /** Absolute tolerance. Default 0. */
  atol?: number;
  /** Words printed with a failure, e.g. where the expected value came from. */
  what?: string;
}

/**
 * Asserts |actual − expected| ≤ atol + rtol·|expected|, element by element for arrays.
 * A failure prints both values, their difference and the tolerance.
 */
export function expectClose(
  actual: number | ArrayLike<number>,
  expected: number | ArrayLike<number>,
  { rtol = 1e-12, atol = 0, what = "" }: CloseOptions = {},
): void {
  const a = typeof actual === "number" ? [actual] : Array.from(actual);
  const e = typeof expected === "number" ? [expected] : Array.from(expected);
  if (a.length !== e.length) {
    expect.fail(`${what ? what + ": " : ""}length ${a.length} differs from expected length ${e.length}`);
  }
  for (let i = 0; i < a.length; i++) {
    const tol = atol + rtol * Math.abs(e[i]);
    const diff = Math.abs(a[i] - e[i]);
    if (!(diff <= tol)) {
      const at = a.length > 1 ? ` at index ${i}` : "";
      expect.fail(
        `${what ? what + ": " : ""}got ${a[i]}, expected ${e[i]}${at} (|diff| ${diff.toExponential(3)} > tolerance ${tol.toExponential(3)})`,
      );
    }
  }
}
