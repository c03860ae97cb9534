// parseOpticalTable: the optical table of a series. Expected values are derived from the inputs
// by construction (the project's own format); radius = diameter / 2 (closed form).
import { describe, it, expect } from "vitest";
import { parseOpticalTable, OPTICAL_PEAK_RANGE_EV } from "../../lib/io/parseOpticalTable.ts";
import { expectError } from "../helpers/errors.ts";

describe("parseOpticalTable(text, source)", () => {
  it("OPTICAL_PEAK_RANGE_EV is locked", () => {
    expect(OPTICAL_PEAK_RANGE_EV).toEqual([0.1, 10]);
  });
  it("reads rows of peaks; empty cells are left out; diameter_nm is halved", () => {
    const text = "# invented\nradius_nm,peak_ev_1,peak_ev_2\n1.5,2.0,2.6\n2.0,1.8,\n";
    expect(parseOpticalTable(text, "o.csv")).toEqual([
      { line: 3, radiusNM: 1.5, peaksEV: [2.0, 2.6] },
      { line: 4, radiusNM: 2.0, peaksEV: [1.8] },
    ]);
    expect(parseOpticalTable("diameter_nm;peak_ev_1\n4;1,9\n", "o.csv")).toEqual([{ line: 2, radiusNM: 2, peaksEV: [1.9] }]);
  });
  it("names the line of a bad row", () => {
    expectError(() => parseOpticalTable("radius_nm,peak_ev_1\n0,2\n", "o.csv"), "io/optical-size", "o.csv: line 2");
    expectError(() => parseOpticalTable("radius_nm,peak_ev_1\n2,550\n", "o.csv"), "io/optical-peak", "line 2", "wavelength");
    expectError(() => parseOpticalTable("radius_nm,peak_ev_1\n2,\n", "o.csv"), "io/optical-peak", "no peak");
  });
  it("refuses tables without a size or a peak column, or with an unknown column", () => {
    expectError(() => parseOpticalTable("size,peak_ev_1\n2,2\n", "o.csv"), "io/optical-column", "radius_nm");
    expectError(() => parseOpticalTable("radius_nm,energy\n2,2\n", "o.csv"), "io/optical-column");
    expectError(() => parseOpticalTable("radius_nm,peak_ev_1,width\n2,2,0.1\n", "o.csv"), "io/optical-column", '"width"');
  });
});
