// failureReason: the one-line reason the CLI prints and the notebooks show. Expected values are
// the project's own message contract (by construction).
import { describe, expect, it } from "vitest";
import { DotspecError, failureReason } from "../../lib/util/errors.ts";

describe("failureReason(source, err)", () => {
  it("drops the source prefix the library already put in front of a DotspecError message", () => {
    expect(failureReason("a.csv", new DotspecError("io/binary", "a.csv: the file holds NUL bytes"))).toBe("the file holds NUL bytes");
  });

  it("keeps a DotspecError message that does not start with the source", () => {
    expect(failureReason("a.csv", new DotspecError("signal/too-few-points", "need at least 5 points; got 3"))).toBe("need at least 5 points; got 3");
  });

  it("calls anything else an internal error to report", () => {
    expect(failureReason("a.csv", new TypeError("x is undefined"))).toBe("internal error (TypeError: x is undefined); please report it with the file");
  });
});
