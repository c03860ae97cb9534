// etaForCurve: which η a curve is analysed with. Expected values follow from the inputs by
// construction (the documented precedence: given η, else the file's line, else none); there is no
// outside reference value for a rule of this project's own interface.
import { describe, expect, it } from "vitest";
import { etaForCurve } from "../../lib/io/etaForCurve.ts";
import { parseCurveText } from "../../lib/io/parse/index.ts";

const curveWith = (header: string) => parseCurveText(`${header}V,I\n-0.1,-1e-12\n0,0\n0.1,1e-12\n0.2,2e-12\n0.3,3e-12\n`, { source: "t.csv" }).curve;

describe("etaForCurve(given, curve)", () => {
  it("a given η wins over the file's line, with no note", () => {
    expect(etaForCurve(0.8, curveWith("# eta: 0.9\n"))).toEqual({ eta: 0.8, note: null });
  });

  it("else the file's η, with a note naming the key", () => {
    expect(etaForCurve(undefined, curveWith("# eta: 0.9\n"))).toEqual({ eta: 0.9, note: 'η = 0.9 taken from the file\'s metadata ("eta")' });
  });

  it("else none: undefined and no note (the analysis then takes 1 and warns)", () => {
    expect(etaForCurve(undefined, curveWith(""))).toEqual({ eta: undefined, note: null });
  });
});
