import { describe, expect, it } from "vitest";
import { GRID_TABLE_DEFAULTS, parseGridTable } from "../../lib/io/parseGridTable.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

/** A 3 × 2 grid, 3 bias points; current (pA) = 100·iy + 10·ix + k; pixel (2, 1) left out. */
function table(opts: { skip?: [number, number]; delimiter?: string; header?: string; backward?: boolean } = {}): string {
  const d = opts.delimiter ?? ",";
  const rows = [opts.header ?? ["x (nm)", "y (nm)", "bias (mV)", "current (pA)"].join(d)];
  for (let iy = 0; iy < 2; iy++)
    for (let ix = 0; ix < 3; ix++) {
      if (opts.skip && opts.skip[0] === ix && opts.skip[1] === iy) continue;
      const ks = opts.backward ? [2, 1, 0, 0, 1, 2] : [0, 1, 2];
      for (const k of ks) rows.push([0.5 * ix, -1 + 0.5 * iy, -500 + 500 * k, 100 * iy + 10 * ix + k].join(d));
    }
  return "# invented test grid\n" + rows.join("\n") + "\n";
}

describe("parseGridTable(text)", () => {
  it("builds the regular grid and converts units (mV → V, pA → A: SI prefixes)", () => {
    const { cube, record } = parseGridTable(table());
    expect(cube.xNM).toEqual({ start: 0, step: 0.5, count: 3 });
    expect(cube.yNM).toEqual({ start: -1, step: 0.5, count: 2 });
    expectClose([cube.biasV.start, cube.biasV.step], [-0.5, 0.5], { rtol: 1e-15 });
    expect(cube.biasV.count).toBe(3);
    const want: number[] = [];
    for (let iy = 0; iy < 2; iy++) for (let ix = 0; ix < 3; ix++) for (let k = 0; k < 3; k++) want.push((100 * iy + 10 * ix + k) * 1e-12);
    expectClose(cube.currentA, want, { rtol: 1e-15, atol: 1e-27, what: "table formula" });
    expect(cube.missing).toBeNull();
    expect(record.units).toEqual({ bias: "mV", current: "pA" });
    expect(record.rows).toBe(18);
  });
  it("reports a missing pixel and leaves it out", () => {
    const { cube, record } = parseGridTable(table({ skip: [2, 1] }));
    expect(record.missingPixelsNM).toEqual([[1, -0.5]]);
    expect(Array.from(cube.missing!)).toEqual([0, 0, 0, 0, 0, 1]);
    expect(record.warnings.join(" ")).toContain("1 of 6 grid pixels have no data");
  });
  it("averages there-and-back sweeps and reads tab-separated tables", () => {
    const a = parseGridTable(table({ backward: true, delimiter: "\t" }));
    expect(a.record.delimiter).toBe("\t");
    expectClose(a.cube.currentA[5 * 3 + 2], (100 + 20 + 2) * 1e-12, { rtol: 1e-15, what: "table formula" });
  });
  it("reads a whitespace-separated table whose header names contain spaces (the curve importer's header rules)", () => {
    const text = table({ delimiter: " ", header: "x (nm)   y (nm)   bias (mV)   current (pA)" });
    const { cube, record } = parseGridTable(text);
    expect(record.delimiter).toBe("whitespace");
    expect(record.columns).toEqual({ x: "x (nm)", y: "y (nm)", bias: "bias (mV)", current: "current (pA)" });
    expect(cube.xNM.count).toBe(3);
  });
  it("names the missing column, a position unit other than nm and an off-grid value", () => {
    expectError(() => parseGridTable(table({ header: "x (nm),y (nm),bias (mV),z (nm)" })), "io/missing-column", "current", '"z (nm)"');
    expectError(() => parseGridTable(table({ header: "x (pm),y (nm),bias (mV),current (pA)" })), "io/position-unit", "x (nm)");
    expectError(() => parseGridTable(table({ header: "x (nm),y (nm),bias (kV),current (pA)" })), "io/unknown-unit", "kV");
    const off = table().replace("\n0.5,-1,-500,10\n", "\n0.7,-1,-500,10\n");
    expectError(() => parseGridTable(off), "io/not-grid", "not on a regular grid");
  });
  it("defaults are locked", () => {
    expect(Object.isFrozen(GRID_TABLE_DEFAULTS)).toBe(true);
    expect(GRID_TABLE_DEFAULTS).toEqual({ gridTolerance: 0.05, maxPointsPerRow: 16 }); // common practice (no source)
  });
});
