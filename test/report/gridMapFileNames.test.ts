// gridMapFileNames: file names of the map figures. Expected values derived by hand from the rule
// in its doc comment (letters, digits, ".", "+", "-" kept; other runs → "_"; repeats get "_").
import { describe, expect, it } from "vitest";
import { gridMapFileNames } from "../../lib/report/gridMapFileNames.ts";

describe("gridMapFileNames(labels)", () => {
  it("keeps plain labels and turns spaces and brackets into one _", () => {
    expect(gridMapFileNames(["s", "p1", "p (multiplet)", "at 0.700 V", "at -0.350 V"])).toEqual(["s", "p1", "p_multiplet", "at_0.700_V", "at_-0.350_V"]);
  });
  it("makes repeated names distinct and never returns an empty name", () => {
    expect(gridMapFileNames(["s", "s", "s", "()", "/"])).toEqual(["s", "s_", "s__", "map", "map_"]);
  });
});
