// The public entry point of lib/io re-exports the pieces other modules and the CLI use
// (by construction of the module's contract).
// Expected values are derived from the inputs by construction: this is the project's own interface, with no outside reference value to name.
import { describe, expect, it } from "vitest";
import * as io from "../../lib/io/index.ts";

describe("lib/io/index", () => {
  it("re-exports the readers, writers, units and defaults", () => {
    for (const name of [
      "parseCurveText",
      "readCurveFile",
      "listCurveFiles",
      "formatCsv",
      "formatCurveCsv",
      "writeTextFile",
      "parseUnit",
      "findUnit",
      "toSI",
    ]) {
      expect(typeof (io as Record<string, unknown>)[name], name).toBe("function");
    }
    expect(io.PARSE_DEFAULTS.minPoints).toBe(5);
    expect(io.ACCEPTED_UNITS.current).toContain("pA");
    expect(io.CURVE_FILE_EXTENSIONS).toEqual([".csv", ".txt", ".dat", ".tsv"]);
  });
});
