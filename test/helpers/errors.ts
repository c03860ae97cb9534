import { expect } from "vitest";
import { isDotspecError } from "../../lib/util/errors.ts";

/** The DotspecError `f` throws (any other exception propagates; returning fails the test). */
export function errorOf(f: () => unknown): { code: string; message: string } {
  try {
    f();
  } catch (e) {
    if (!isDotspecError(e)) throw e;
    return e;
  }
  throw new Error("expected a DotspecError, but the call returned");
}

/** Asserts that `f` throws a DotspecError with this code and a message containing every fragment. */
export function expectError(f: () => unknown, code: string, ...fragments: (string | RegExp)[]): void {
  const err = errorOf(f);
  expect(err.code).toBe(code);
  for (const fragment of fragments) {
    if (typeof fragment === "string") expect(err.message).toContain(fragment);
    else expect(err.message).toMatch(fragment);
  }
}
