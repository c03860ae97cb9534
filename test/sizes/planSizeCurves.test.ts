// planSizeCurves: the plan of a series from a size table or from the files' metadata. Expected
// values follow from the inputs by construction (the documented rules: table order, then the
// unlisted files; η = the row's, else the caller's); no outside reference value exists for this
// project's own bookkeeping. The "not listed in" and metadata reasons are the ones `dotspec sizes`
// printed before the plan moved into the library (test/cli/sizes.test.ts checks the command).
import { describe, expect, it } from "vitest";
import { planSizeCurves, PLAN_SIZE_CURVES_DEFAULTS } from "../../lib/sizes/planSizeCurves.ts";
import { expectError } from "../helpers/errors.ts";

const row = (line: number, file: string, dot: string, radiusNM: number, eta: number | null = null) => ({ line, file, dot, radiusNM, eta });

describe("planSizeCurves(files, options)", () => {
  it("PLAN_SIZE_CURVES_DEFAULTS: locked (common practice, no source)", () => {
    expect(Object.isFrozen(PLAN_SIZE_CURVES_DEFAULTS)).toBe(true);
    const { fileKey, ...rest } = PLAN_SIZE_CURVES_DEFAULTS;
    expect(rest).toEqual({ meta: null, metaSource: "the size table", eta: undefined });
    expect(fileKey("dir/a.csv")).toBe("dir/a.csv");
  });

  it("with a size table: its rows in order (row η, else the given η), then the unlisted files as unassigned", () => {
    const plan = planSizeCurves([{ file: "c.csv" }, { file: "b.csv" }, { file: "a.csv" }], {
      meta: [row(3, "a.csv", "D1", 1.5, 0.86), row(4, "b.csv", "D1", 1.5)],
      metaSource: "META.csv",
      eta: 0.9,
    });
    expect(plan.curves).toEqual([
      { file: "a.csv", dot: "D1", radiusNM: 1.5, eta: 0.86 },
      { file: "b.csv", dot: "D1", radiusNM: 1.5, eta: 0.9 },
      { file: "c.csv", dot: null, radiusNM: null, eta: 0.9, unassignedReason: "not listed in META.csv" },
    ]);
    expect(plan.problems).toEqual([]);
  });

  it("matches table rows and files through fileKey", () => {
    const plan = planSizeCurves([{ file: "./dir/a.csv" }], { meta: [row(2, "dir/a.csv", "D1", 2)], fileKey: (f) => f.replace(/^\.\//, "") });
    expect(plan.curves).toEqual([{ file: "dir/a.csv", dot: "D1", radiusNM: 2, eta: undefined }]);
  });

  it("a row naming a file that was not given is an error naming the table, the line and the file", () => {
    expectError(() => planSizeCurves([{ file: "a.csv" }], { meta: [row(7, "gone.csv", "D1", 2)], metaSource: "META.csv" }), "io/meta-missing-file", "META.csv", "line 7", "gone.csv");
  });

  it("without a table: each file's metadata lines; no size or a bad size line leaves the curve unassigned", () => {
    const plan = planSizeCurves([
      { file: "a.csv", metadata: { dot: "D1", diameter_nm: "3" } },
      { file: "b.csv", metadata: {} },
      { file: "c.csv", metadata: { radius_nm: "-1" } },
      { file: "d.csv", metadata: null },
    ]);
    expect(plan.curves[0]).toEqual({ file: "a.csv", dot: "D1", radiusNM: 1.5, eta: undefined }); // diameter 3 nm → radius 1.5 nm
    expect(plan.curves[1]).toEqual({ file: "b.csv", dot: null, radiusNM: null, eta: undefined, unassignedReason: "no radius_nm or diameter_nm metadata line" });
    expect(plan.curves[2].radiusNM).toBeNull();
    expect(plan.curves[2].unassignedReason).toMatch(/radius_nm/);
    expect(plan.curves[3]).toEqual({ file: "d.csv", dot: null, radiusNM: null, eta: undefined, unassignedReason: "no radius_nm or diameter_nm metadata line" });
    expect(plan.problems).toHaveLength(1);
    expect(plan.problems[0]).toMatch(/^c\.csv: .*; fix the line, or remove it to list the curve as unassigned$/);
  });

  it("refuses an η outside (0, 1] and unknown options", () => {
    expectError(() => planSizeCurves([], { eta: 1.2 }), "options/out-of-range", "eta", "1.2");
    expectError(() => planSizeCurves([], { etaV: 1 } as never), "options/unknown-key", "etaV");
  });
});
