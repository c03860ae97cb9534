// parseSizeMeta: the size table of a series (META.csv). Expected values are derived from the
// inputs by construction (the project's own file format; no outside reference value exists),
// and radius = diameter / 2 is the closed form of a sphere.
import { describe, it, expect } from "vitest";
import { parseSizeMeta, SIZE_META_COLUMNS } from "../../lib/io/parseSizeMeta.ts";
import { expectError } from "../helpers/errors.ts";

describe("parseSizeMeta(text, source)", () => {
  it("SIZE_META_COLUMNS is locked", () => {
    expect(SIZE_META_COLUMNS).toEqual({ required: ["file", "dot"], size: ["radius_nm", "diameter_nm"], optional: ["eta", "notes"] });
  });

  it("reads rows with their line numbers; diameter_nm is halved (closed form: R = D/2)", () => {
    const text = "# invented\nfile,dot,diameter_nm,eta,notes\na.csv,QD-1,3.2,0.85,first\nsub/b.csv,QD-1,3.2,,\n";
    expect(parseSizeMeta(text, "META.csv")).toEqual([
      { line: 3, file: "a.csv", dot: "QD-1", radiusNM: 1.6, eta: 0.85, notes: "first" },
      { line: 4, file: "sub/b.csv", dot: "QD-1", radiusNM: 1.6, eta: null, notes: null },
    ]);
  });

  it("accepts semicolons, tabs, quoted cells and any case of the header", () => {
    expect(parseSizeMeta('File;Dot;Radius_nm\n"x;1.csv";D;2\n', "m.csv")[0]).toMatchObject({ file: "x;1.csv", dot: "D", radiusNM: 2 });
    expect(parseSizeMeta("file\tdot\tradius_nm\ny.dat\tE\t2.5\n", "m.tsv")[0]).toMatchObject({ file: "y.dat", radiusNM: 2.5 });
  });

  it("names the line and the file of a missing, zero or negative size", () => {
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,D,\n", "META.csv"), "io/meta-size", "META.csv: line 2 (a.csv)", "size is missing");
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,D,0\n", "META.csv"), "io/meta-size", "line 2 (a.csv)", "greater than 0");
    expectError(() => parseSizeMeta("file,dot,diameter_nm\na.csv,D,-3\n", "META.csv"), "io/meta-size", "diameter_nm -3");
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,D,big\n", "META.csv"), "io/not-a-number", "line 2", "radius_nm");
  });

  it("refuses a duplicated file, naming both lines", () => {
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,D,2\n./a.csv,E,2\n", "META.csv"), "io/meta-duplicate", "line 3", "line 2");
  });

  it("refuses a file pointing outside the folder", () => {
    for (const bad of ["../x.csv", "sub/../../x.csv", "/etc/x.csv", "C:\\data\\x.csv", "..\\x.csv"]) {
      expectError(() => parseSizeMeta(`file,dot,radius_nm\n${bad},D,2\n`, "META.csv"), "io/meta-file", "line 2", "outside the series folder");
    }
  });

  it("refuses one dot with two sizes, and radius and diameter that disagree", () => {
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,D,2\nb.csv,D,2.5\n", "M"), "io/meta-size", "line 3", "line 2", 'dot "D"');
    expectError(() => parseSizeMeta("file,dot,radius_nm,diameter_nm\na.csv,D,2,5\n", "M"), "io/meta-size", "disagree");
  });

  it("refuses unknown and missing columns, an empty dot and η outside (0, 1]", () => {
    expectError(() => parseSizeMeta("file,dot,radius_mm\na.csv,D,2\n", "M"), "io/meta-column", '"radius_mm"');
    expectError(() => parseSizeMeta("file,radius_nm\na.csv,2\n", "M"), "io/meta-column", '"dot"');
    expectError(() => parseSizeMeta("file,dot\na.csv,D\n", "M"), "io/meta-column", "radius_nm");
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,,2\n", "M"), "io/meta-dot", "line 2");
    expectError(() => parseSizeMeta("file,dot,radius_nm,eta\na.csv,D,2,1.2\n", "M"), "io/meta-eta", "line 2", "1.2");
    expectError(() => parseSizeMeta("# only a comment\n", "M"), "io/empty");
    expectError(() => parseSizeMeta("file,dot,radius_nm\na.csv,D,2,x\n", "M"), "io/ragged-row", "line 2");
  });
});
