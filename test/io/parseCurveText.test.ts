// parseCurveText on every layout, every error, and random input.
//
// Sources of the expected values:
// - "by construction": the value written in the input text, converted to SI;
// - SI prefixes: BIPM, The International System of Units, 9th ed. (2019), Table 7
//   (m = 1e-3, µ = 1e-6, n = 1e-9, p = 1e-12, f = 1e-15);
// - number syntax: ECMA-262 StringToNumber, i.e. what Number("…") gives;
// - layouts (decimal comma with semicolons, `#` comments, fwd/bwd columns): common practice, no source.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { expectClose } from "../helpers/expectClose.ts";
import { isDotspecError } from "../../lib/util/errors.ts";
import { PARSE_DEFAULTS, parseCurveText, type ParseOptions, type ParsedCurve } from "../../lib/io/parse/index.ts";
import { ACCEPTED_UNITS, parseUnit, toSI } from "../../lib/io/units.ts";
import { errorOf } from "../helpers/errors.ts";

/** The DotspecError thrown by f (fails the test when f returns or throws something else). */

const parse = (text: string, options?: ParseOptions) => parseCurveText(text, options);
const arr = (a: ArrayLike<number>) => Array.from(a);

/** The invariants every parsed curve keeps. */
function checkCurve({ curve, record }: ParsedCurve): void {
  const n = curve.biasV.length;
  expect(n).toBeGreaterThanOrEqual(2);
  expect(curve.currentA.length).toBe(n);
  expect(curve.sweeps.length).toBeGreaterThanOrEqual(1);
  for (const s of curve.sweeps) expect(s.length).toBe(n);
  if (curve.didvS) expect(curve.didvS.length).toBe(n);
  const all = [curve.biasV, curve.currentA, ...curve.sweeps, ...(curve.didvS ? [curve.didvS] : [])];
  for (const a of all) for (let i = 0; i < n; i++) expect(Number.isFinite(a[i])).toBe(true);
  for (let i = 1; i < n; i++) expect(curve.biasV[i]).toBeGreaterThan(curve.biasV[i - 1]);
  expect(record.points).toBe(n);
  expect(record.sweeps).toBe(curve.sweeps.length);
  expect(record.biasRangeV).toEqual([curve.biasV[0], curve.biasV[n - 1]]);
}

describe("PARSE_DEFAULTS", () => {
  it("PARSE_DEFAULTS is locked (docs of ParseOptions name these defaults)", () => {
    // the documented defaults of ParseOptions (by construction of the contract)
    expect(PARSE_DEFAULTS).toEqual({
      source: "(text)",
      delimiter: "auto",
      biasUnit: null,
      currentUnit: null,
      conductanceUnit: null,
      biasColumn: null,
      currentColumns: null,
      minPoints: 5,
      biasPolarity: "sample",
    });
    expect(Object.isFrozen(PARSE_DEFAULTS)).toBe(true);
  });
});

describe("parseCurveText: layouts", () => {
  it("parseCurveText(text) reads a comma CSV with `bias (V),current (A)`", () => {
    const r = parse("bias (V),current (A)\n-1.0,-2e-10\n-0.5,-1e-10\n0.0,0\n0.5,1e-10\n1.0,2e-10\n");
    checkCurve(r);
    // by construction of the input
    expect(arr(r.curve.biasV)).toEqual([-1, -0.5, 0, 0.5, 1]);
    expect(arr(r.curve.currentA)).toEqual([-2e-10, -1e-10, 0, 1e-10, 2e-10]);
    expect(r.curve.didvS).toBeNull();
    // closed form: one unit in the last digit of "2e-10" and "1e-10" is 1e-10 A (the "0" cell is skipped)
    expect(r.curve.meta).toEqual({ source: "(text)", metadata: {}, currentResolutionA: 1e-10, conductanceResolutionS: null });
    expect(r.record).toMatchObject({
      delimiter: ",",
      decimalSeparator: ".",
      hasHeader: true,
      headerLine: 1,
      dataRows: 5,
      rowsDropped: 0,
      duplicatesMerged: 0,
      sweeps: 1,
      segments: 1,
      biasDirection: "ascending",
      points: 5,
      uniformStep: true,
      warnings: [],
    });
    expect(r.record.columns).toEqual([
      { index: 0, header: "bias (V)", name: "bias", role: "bias", unit: "V", scale: 1, unitFrom: "header", resolutionSI: null },
      // closed form: one unit in the last digit of "2e-10" and "1e-10" (the "0" cell is skipped)
      { index: 1, header: "current (A)", name: "current", role: "current", unit: "A", scale: 1, unitFrom: "header", resolutionSI: 1e-10 },
    ]);
    // by construction: the steps are 0.5 V
    expectClose(r.record.biasStepV, 0.5);
  });

  it("parseCurveText(text) reads `bias (mV)` as millivolts and `Current [pA]` as picoamperes", () => {
    const r = parse("bias (mV),Current [pA]\n-2,-5\n-1,-1\n0,0\n1,1\n2,5\n");
    checkCurve(r);
    // SI prefix definition (BIPM SI Brochure, 9th ed.): 1 mV = 1e-3 V, 1 pA = 1e-12 A
    expectClose(r.curve.biasV, [-2e-3, -1e-3, 0, 1e-3, 2e-3], { rtol: 1e-15 });
    expectClose(r.curve.currentA, [-5e-12, -1e-12, 0, 1e-12, 5e-12], { rtol: 1e-15 });
    expect(r.record.columns.map((c) => c.scale)).toEqual([1e-3, 1e-12]);
  });

  it("parseCurveText(text) reads semicolons with a decimal comma, CRLF line ends, a BOM and `#` metadata", () => {
    const text = "\ufeff# run: fixture B\r\n# T = 4.5 K\r\nBias (mV);Current (pA)\r\n-100,5;-201\r\n-50,25;-100,5\r\n0;0\r\n50,25;100,5\r\n100,5;201\r\n";
    const r = parse(text);
    checkCurve(r);
    // by construction (decimal comma: "100,5" is 100.5) and SI prefixes (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.biasV, [-0.1005, -0.05025, 0, 0.05025, 0.1005], { rtol: 1e-15 });
    expectClose(r.curve.currentA, [-201e-12, -100.5e-12, 0, 100.5e-12, 201e-12], { rtol: 1e-15 });
    expect(r.record.delimiter).toBe(";");
    expect(r.record.decimalSeparator).toBe(",");
    expect(r.record.headerLine).toBe(3);
    expect(r.curve.meta.metadata).toEqual({ run: "fixture B", T: "4.5 K" });
    expect(r.record.metadataKeys).toEqual(["run", "T"]);
  });

  it("parseCurveText(text) reads tab-separated `Bias [mV]\\tCurrent fwd [pA]\\tCurrent bwd [pA]` as two sweeps", () => {
    const r = parse("Bias [mV]\tCurrent fwd [pA]\tCurrent bwd [pA]\n-20\t-4\t-6\n-10\t-2\t-3\n0\t0\t0\n10\t2\t3\n20\t4\t6\n");
    checkCurve(r);
    expect(r.record.delimiter).toBe("\t");
    expect(r.curve.sweeps.length).toBe(2);
    // by construction of the input, SI prefixes (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.sweeps[0], [-4e-12, -2e-12, 0, 2e-12, 4e-12], { rtol: 1e-15 });
    expectClose(r.curve.sweeps[1], [-6e-12, -3e-12, 0, 3e-12, 6e-12], { rtol: 1e-15 });
    // the mean of the two sweeps: (fwd + bwd) / 2
    expectClose(r.curve.currentA, [-5e-12, -2.5e-12, 0, 2.5e-12, 5e-12], { rtol: 1e-15 });
    expect(r.record.columns.map((c) => c.name)).toEqual(["Bias", "Current fwd", "Current bwd"]);
  });

  it("parseCurveText(text) reads whitespace-separated `bias_V current_nA` with `#` metadata lines", () => {
    const text = "# setpoint: 100 pA\n# bias_start = -1.5 V\n# comment without a key\n\nbias_V current_nA\n  -1.5    -3.0\n  -0.75   -1.5\n   0.0     0.0\n   0.75    1.5\n   1.5     3.0\n";
    const r = parse(text);
    checkCurve(r);
    expect(r.record.delimiter).toBe("whitespace");
    expect(r.record.headerLine).toBe(5);
    // by construction of the input; 1 nA = 1e-9 A (BIPM SI Brochure, 9th ed.)
    expect(arr(r.curve.biasV)).toEqual([-1.5, -0.75, 0, 0.75, 1.5]);
    expectClose(r.curve.currentA, [-3e-9, -1.5e-9, 0, 1.5e-9, 3e-9], { rtol: 1e-15 });
    expect(r.curve.meta.metadata).toEqual({ setpoint: "100 pA", bias_start: "-1.5 V" });
  });

  it("parseCurveText(text) reads `Bias/V` and `I/nA` headers", () => {
    const r = parse("Bias/V,I/nA\n0,0\n1,1\n2,2\n3,3\n4,4\n");
    checkCurve(r);
    // by construction; 1 nA = 1e-9 A (BIPM SI Brochure, 9th ed.)
    expect(r.record.columns.map((c) => c.unit)).toEqual(["V", "nA"]);
    expectClose(r.curve.currentA[4], 4e-9, { rtol: 1e-15 });
  });

  it("parseCurveText(text, {biasUnit, currentUnit}) reads a headerless two-column file in those units", () => {
    const r = parse("-300 -60\n-150 -30\n0 0\n150 30\n300 60\n", { biasUnit: "mV", currentUnit: "pA" });
    checkCurve(r);
    // by construction; SI prefixes (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.biasV, [-0.3, -0.15, 0, 0.15, 0.3], { rtol: 1e-15 });
    expectClose(r.curve.currentA, [-60e-12, -30e-12, 0, 30e-12, 60e-12], { rtol: 1e-15 });
    expect(r.record.hasHeader).toBe(false);
    expect(r.record.columns.map((c) => c.unitFrom)).toEqual(["option", "option"]);
    expect(r.record.warnings.join(" ")).not.toContain("SI assumed");
  });

  it("parseCurveText(text) reads a headerless file in V and A and says so in the warnings", () => {
    const r = parse("-2 -4 -5\n-1 -1 -2\n0 0 0\n1 1 2\n2 4 5\n");
    checkCurve(r);
    // the brief's headerless convention: column 0 bias, the others currents (sweeps), SI assumed
    expect(r.curve.sweeps.length).toBe(2);
    expect(arr(r.curve.sweeps[1])).toEqual([-5, -2, 0, 2, 5]);
    expect(r.record.columns.map((c) => [c.role, c.unit, c.unitFrom])).toEqual([
      ["bias", "V", "default"],
      ["current", "A", "default"],
      ["current", "A", "default"],
    ]);
    const w = r.record.warnings.join("\n");
    expect(w).toContain("no header line");
    expect(w).toContain("as V");
    expect(w).toContain("as A");
  });

  it("parseCurveText(text) takes a `#` comment line just above headerless data as the header", () => {
    const r = parse("# dot 7\n# bias (mV)  current (pA)\n-2 -4\n-1 -2\n0 0\n1 2\n2 4\n");
    checkCurve(r);
    // by construction; SI prefixes (BIPM SI Brochure, 9th ed.)
    expect(r.record.hasHeader).toBe(true);
    expect(r.record.headerLine).toBe(2);
    expectClose(r.curve.biasV[4], 2e-3, { rtol: 1e-15 });
    expectClose(r.curve.currentA[4], 4e-12, { rtol: 1e-15 });
  });

  it("parseCurveText(text) joins a row of units to the row of names above it (`Bias,Current` / `V,pA`)", () => {
    const r = parse("Bias\tCurrent\n[mV]\t[nA]\n0\t0\n1\t1\n2\t2\n3\t3\n4\t4\n");
    checkCurve(r);
    // SI prefixes (BIPM SI Brochure, 9th ed.)
    expect(r.record.columns.map((c) => c.unit)).toEqual(["mV", "nA"]);
    expect(r.record.headerLine).toBe(1);
    expectClose(r.curve.currentA[4], 4e-9, { rtol: 1e-15 });
  });

  it("parseCurveText(text) reads quoted decimal commas in a comma CSV (`\"1,5\",\"2,5\"`)", () => {
    const r = parse('"V (V)","I (A)"\n"1,5","2,5"\n"2,5","3,5"\n"3,5","4,5"\n"4,5","5,5"\n"5,5","6,5"\n');
    checkCurve(r);
    // by construction: "1,5" is 1.5
    expect(r.record.delimiter).toBe(",");
    expect(r.record.decimalSeparator).toBe(",");
    expect(arr(r.curve.biasV)).toEqual([1.5, 2.5, 3.5, 4.5, 5.5]);
  });

  it("parseCurveText(text) reads a space-separated header with quoted names", () => {
    const r = parse('"bias (mV)" "current (pA)"\n0 0\n1 1\n2 2\n3 3\n4 4\n');
    checkCurve(r);
    expect(r.record.columns.map((c) => c.unit)).toEqual(["mV", "pA"]);
  });

  it("parseCurveText(text, {biasColumn, currentColumns}) picks the columns of a headerless file by index", () => {
    const r = parse("0 -1 -3\n1 -0.5 -2\n2 0 0\n3 0.5 2\n4 1 3\n", { biasColumn: 1, currentColumns: [2] });
    checkCurve(r);
    // by construction of the input
    expect(arr(r.curve.biasV)).toEqual([-1, -0.5, 0, 0.5, 1]);
    expect(arr(r.curve.currentA)).toEqual([-3, -2, 0, 2, 3]);
    expect(r.record.ignoredColumns).toEqual(["column 0"]);
    const b = parse("-1 -2\n-0.5 -1\n0 0\n0.5 1\n1 2\n", { biasColumn: 1 });
    expect(b.record.columns.map((c) => c.role)).toEqual(["current", "bias"]);
  });

  it("parseCurveText(text) warns when the first column of a headerless file looks like a row number", () => {
    // common practice (no source): scripts and spreadsheets often write a row number first
    const r = parse("0 -1 -1\n1 -0.5 -0.5\n2 0 0\n3 0.5 0.5\n4 1 1\n");
    expect(r.record.warnings.join(" ")).toContain("like a row number");
  });

  it("parseCurveText(text) turns a descending bias into an ascending one", () => {
    const r = parse("V (V),I (A)\n2,4\n1,1\n0,0\n-1,-1\n-2,-4\n");
    checkCurve(r);
    // by construction: the rows read backwards
    expect(arr(r.curve.biasV)).toEqual([-2, -1, 0, 1, 2]);
    expect(arr(r.curve.currentA)).toEqual([-4, -1, 0, 1, 4]);
    expect(r.record.biasDirection).toBe("descending");
    expect(r.record.sweeps).toBe(1);
  });

  it("parseCurveText(text) splits one there-and-back bias column into two sweeps", () => {
    const r = parse("V (V),I (A)\n-2,-4\n-1,-2\n0,0\n1,2\n2,4\n1,2.5\n0,0\n-1,-2.5\n-2,-5\n");
    checkCurve(r);
    // by construction: rows 1–5 go up, rows 5–9 come back (the turning point 2 V is in both)
    expect(r.record.segments).toBe(2);
    expect(r.record.sweeps).toBe(2);
    expect(r.record.biasDirection).toBe("both");
    expect(arr(r.curve.biasV)).toEqual([-2, -1, 0, 1, 2]);
    expect(arr(r.curve.sweeps[0])).toEqual([-4, -2, 0, 2, 4]);
    expect(arr(r.curve.sweeps[1])).toEqual([-5, -2.5, 0, 2.5, 4]);
    expect(arr(r.curve.currentA)).toEqual([-4.5, -2.25, 0, 2.25, 4]);
    expect(r.record.warnings.join(" ")).toMatch(/read as 2 sweeps \(up on lines 2–6, down on lines 6–10\)/);
  });

  it("parseCurveText(text) splits a there-and-back column whose turning point is repeated", () => {
    const r = parse("V (V),I (A)\n-2,-4\n-1,-2\n0,0\n1,2\n2,4\n2,6\n1,3\n0,0\n-1,-3\n-2,-6\n");
    checkCurve(r);
    // by construction: the second 2 V row starts the way back
    expect(arr(r.curve.sweeps[0])).toEqual([-4, -2, 0, 2, 4]);
    expect(arr(r.curve.sweeps[1])).toEqual([-6, -3, 0, 3, 6]);
    expect(r.record.duplicatesMerged).toBe(0);
  });

  it("parseCurveText(text) reads two full loops as four sweeps and drops a partial last sweep", () => {
    const up = "-2,-2\n-1,-1\n0,0\n1,1\n2,2\n";
    const down = "1,1\n0,0\n-1,-1\n-2,-2\n";
    const r = parse("V (V),I (A)\n" + up + down + "-1,-1\n0,0\n1,1\n2,2\n" + down + "-1,-1\n0,0\n");
    checkCurve(r);
    // by construction: up, down, up, down, then a partial up to 0 V
    expect(r.record.sweeps).toBe(4);
    expect(r.record.warnings.join(" ")).toContain("left out 1 partial sweep");
  });

  it("parseCurveText(text) reads a measured `dI/dV (nS)` column in siemens and ignores `z (nm)`", () => {
    const r = parse("bias (V)\tcurrent (nA)\tdI/dV (nS)\tz (nm)\n-1\t-3\t4\t0.52\n-0.5\t-1\t2\t0.52\n0\t0\t1\t0.52\n0.5\t1\t2\t0.52\n1\t3\t4\t0.52\n");
    checkCurve(r);
    // by construction; 1 nS = 1e-9 S (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.didvS!, [4e-9, 2e-9, 1e-9, 2e-9, 4e-9], { rtol: 1e-15 });
    expect(r.record.ignoredColumns).toEqual(["z (nm)"]);
    expect(r.record.columns[3]).toMatchObject({ role: "other", unit: null, scale: null });
  });

  it("parseCurveText(text) averages several conductance columns into didvS", () => {
    const r = parse("V (V),I (A),G1 (nS),G2 (nS)\n0,0,1,3\n1,1,2,4\n2,2,3,5\n3,3,4,6\n4,4,5,7\n");
    checkCurve(r);
    // the mean of the two columns, SI prefixes (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.didvS!, [2e-9, 3e-9, 4e-9, 5e-9, 6e-9], { rtol: 1e-15 });
  });

  it("parseCurveText(text) averages repeated bias points and counts them", () => {
    const r = parse("V (V),I (A)\n0,0\n1,1\n1,3\n2,2\n3,3\n4,4\n");
    checkCurve(r);
    // by construction: (1 + 3) / 2 = 2 at 1 V
    expect(arr(r.curve.currentA)).toEqual([0, 2, 2, 3, 4]);
    expect(r.record.duplicatesMerged).toBe(1);
    expect(r.record.warnings.join(" ")).toContain("1 repeated bias value");
  });

  it("parseCurveText(text) drops rows with NaN, inf, - or empty cells and counts them with the line", () => {
    const r = parse("V (V),I (A)\n0,0\n1,NaN\n2,2\ninf,3\n3,3\n4,-\n5,\n6,6\n7,7\n8,8\n9,9\n");
    checkCurve(r);
    // by construction: lines 3, 5, 7 and 8 hold no number in a used cell
    expect(r.record.rowsDropped).toBe(4);
    expect(arr(r.curve.biasV)).toEqual([0, 2, 3, 6, 7, 8, 9]);
    expect(r.record.warnings.join(" ")).toContain("4 data rows");
    expect(r.record.warnings.join(" ")).toContain("line 3");
  });

  it("parseCurveText(text) ignores bad cells in ignored columns", () => {
    const r = parse("V (V),I (A),note\n0,0,ok\n1,1,\n2,2,tip change\n3,3,?\n4,4,ok\n");
    checkCurve(r);
    // by construction: the note column is not used
    expect(r.record.rowsDropped).toBe(0);
    expect(r.record.ignoredColumns).toEqual(["note"]);
  });

  it("parseCurveText(text) ignores an unnamed index column and a trailing delimiter", () => {
    const r = parse(",bias (V),current (A),\n0,-1,-1,\n1,0,0,\n2,1,1,\n3,2,2,\n4,3,3,\n");
    checkCurve(r);
    // by construction of the input
    expect(arr(r.curve.biasV)).toEqual([-1, 0, 1, 2, 3]);
    expect(r.record.columns.length).toBe(3);
    expect(r.record.columns[0].role).toBe("other");
  });

  it("parseCurveText(text) uses the option unit, or V/A/S with a warning, for a header without unit", () => {
    const a = parse("V,I\n0,0\n1,1\n2,2\n3,3\n4,4\n", { currentUnit: "nA" });
    // SI prefix definition (BIPM SI Brochure, 9th ed.)
    expectClose(a.curve.currentA[4], 4e-9, { rtol: 1e-15 });
    expect(a.record.columns.map((c) => c.unitFrom)).toEqual(["default", "option"]);
    expect(a.record.warnings.join(" ")).toContain('"V" as V');
  });

  it("parseCurveText(text, {currentUnit}) lets a unit written in the header win, with a warning", () => {
    const r = parse("V (V),I (pA)\n0,0\n1,1\n2,2\n3,3\n4,4\n", { currentUnit: "nA" });
    // SI prefix definition (BIPM SI Brochure, 9th ed.): the header says pA
    expectClose(r.curve.currentA[4], 4e-12, { rtol: 1e-15 });
    expect(r.record.warnings.join(" ")).toContain("currentUnit = nA not used");
  });

  it("parseCurveText(text) reads a unit in another letter case (`mv`) with a warning", () => {
    const r = parse("bias (mv),current (PA)\n0,0\n1,1\n2,2\n3,3\n4,4\n");
    // SI prefix definition (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.biasV[4], 4e-3, { rtol: 1e-15 });
    expectClose(r.curve.currentA[4], 4e-12, { rtol: 1e-15 });
    expect(r.record.warnings.join(" ")).toContain('"mv" of column "bias (mv)" read as mV');
  });

  it("parseCurveText(text, {biasColumn, currentColumns}) picks columns by header and by index", () => {
    const text = "x,y1,y2,t\n0,5,50,9\n1,6,60,9\n2,7,70,9\n3,8,80,9\n4,9,90,9\n";
    const r = parse(text, { biasColumn: "x", currentColumns: [2] });
    checkCurve(r);
    // by construction of the input
    expect(arr(r.curve.biasV)).toEqual([0, 1, 2, 3, 4]);
    expect(arr(r.curve.currentA)).toEqual([50, 60, 70, 80, 90]);
    expect(r.record.ignoredColumns).toEqual(["y1", "t"]);
  });

  it("parseCurveText(text) pairs each current with the bias column to its left (side-by-side sweeps)", () => {
    const text = "Bias fwd (V),Current fwd (A),Bias bwd (V),Current bwd (A)\n-2,-4,2,5\n-1,-1,1,2\n0,0,0,0\n1,1,-1,-2\n2,4,-2,-5\n";
    const r = parse(text);
    checkCurve(r);
    // by construction: the backward sweep read against its own (descending) bias column
    expect(arr(r.curve.sweeps[0])).toEqual([-4, -1, 0, 1, 4]);
    expect(arr(r.curve.sweeps[1])).toEqual([-5, -2, 0, 2, 5]);
    expect(r.record.biasDirection).toBe("both");
  });

  it("parseCurveText(text) carries sweeps on different bias points onto the first one, linearly", () => {
    // closed form: I = 2·V is reproduced exactly by linear interpolation
    const text = "Bias fwd (V),Current fwd (A),Bias bwd (V),Current bwd (A)\n0,0,0.5,1\n1,2,1.5,3\n2,4,2.5,5\n3,6,3.5,7\n4,8,4.5,9\n5,10,5.5,11\n";
    const r = parse(text);
    checkCurve(r);
    expect(arr(r.curve.biasV)).toEqual([1, 2, 3, 4, 5]);
    expectClose(r.curve.sweeps[1], [2, 4, 6, 8, 10], { rtol: 1e-15 });
    expect(r.record.warnings.join(" ")).toContain("linear interpolation");
  });

  it("parseCurveText(text) sorts a bias column that jumps back and forth, and says so", () => {
    const r = parse("V (V),I (A)\n0,0\n2,2\n1,1\n4,4\n3,3\n6,6\n5,5\n");
    checkCurve(r);
    // by construction of the input
    expect(arr(r.curve.biasV)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(arr(r.curve.currentA)).toEqual([0, 1, 2, 3, 4, 5, 6]);
    expect(r.record.biasDirection).toBe("unordered");
  });

  it("parseCurveText(text) warns that a tip bias is read as sample bias", () => {
    // the project's convention (README, Conventions): bias is the sample bias unless a file says otherwise
    const r = parse("Tip bias (V),I (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n");
    expect(r.record.warnings.join(" ")).toContain("negate it if the bias was applied to the tip");
  });

  it("parseCurveText(text) ignores a lock-in signal in volts, with a warning", () => {
    // common practice (no source): raw lock-in outputs are recorded in volts
    const r = parse("V (V),I (A),Lock-in X (V)\n0,0,1\n1,1,1\n2,2,1\n3,3,1\n4,4,1\n");
    expect(r.curve.didvS).toBeNull();
    expect(r.record.ignoredColumns).toEqual(["Lock-in X (V)"]);
    expect(r.record.warnings.join(" ")).toContain("cannot be converted to siemens");
  });

  it("parseCurveText(text) reads key: value lines above the header as metadata, with a warning", () => {
    const r = parse("Instrument: demo\nSetpoint = 1 nA\nbias (V),current (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n");
    checkCurve(r);
    expect(r.curve.meta.metadata).toEqual({ Instrument: "demo", Setpoint: "1 nA" });
    expect(r.record.headerLine).toBe(3);
    expect(r.record.warnings.join(" ")).toContain("lines 1–2 above the header");
  });

  it("parseCurveText(text) keeps every value of a repeated metadata key", () => {
    const r = parse("# note: a\n# note: b\nV (V),I (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n");
    expect(r.curve.meta.metadata).toEqual({ note: "a; b" });
  });

  it("parseCurveText(text) reports the median step and whether it is uniform within 1 %", () => {
    // by construction: steps 0.1 V and 0.1005 V (0.5 % off) are uniform; a 0.5 V jump is not
    const a = parse("V (V),I (A)\n0,0\n0.1,1\n0.2,2\n0.3005,3\n0.4005,4\n");
    expectClose(a.record.biasStepV, 0.1, { rtol: 1e-12 });
    expect(a.record.uniformStep).toBe(true);
    const b = parse("V (V),I (A)\n0,0\n0.1,1\n0.2,2\n0.3,3\n0.8,4\n");
    expectClose(b.record.biasStepV, 0.1, { rtol: 1e-12 });
    expect(b.record.uniformStep).toBe(false);
  });

  it("parseCurveText(text, {source}) stores the source in meta and the record", () => {
    const r = parse("V (V),I (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n", { source: "dot-7.csv" });
    expect(r.curve.meta.source).toBe("dot-7.csv");
    expect(r.record.source).toBe("dot-7.csv");
  });

  it("parseCurveText(text) never shares arrays between currentA and a single sweep", () => {
    const r = parse("V (V),I (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n");
    expect(r.curve.currentA).not.toBe(r.curve.sweeps[0]);
  });
});

describe("parseCurveText: errors", () => {
  it("parseCurveText('') throws io/empty", () => {
    for (const t of ["", "  \n\n", "\ufeff", "\r\n"]) {
      const e = errorOf(() => parse(t, { source: "a.csv" }));
      expect(e.code).toBe("io/empty");
      expect(e.message).toContain("a.csv");
    }
  });

  it("parseCurveText(text) throws io/no-numeric-rows for comments only or words only", () => {
    expect(errorOf(() => parse("# just\n# comments\n")).code).toBe("io/no-numeric-rows");
    const e = errorOf(() => parse("bias,current\nabc,def\n"));
    expect(e.code).toBe("io/no-numeric-rows");
    expect(e.message).toContain("line 1");
  });

  it("parseCurveText(text) throws io/one-column for a single column of numbers", () => {
    const e = errorOf(() => parse("bias (V)\n1\n2\n3\n4\n5\n"));
    expect(e.code).toBe("io/one-column");
    expect(e.message).toContain("line 2");
  });

  it("parseCurveText(text) throws io/ragged-row naming the line of the file (comments and blanks counted)", () => {
    const e = errorOf(() => parse("# c\nV (V),I (A)\n\n0,0\n1,1\n2,2,7\n3,3\n"));
    expect(e.code).toBe("io/ragged-row");
    // by construction: the 6th line of the text has three cells
    expect(e.message).toContain("line 6");
    expect(e.message).toContain("3 cells");
    expect(e.message).toContain('"2,2,7"');
  });

  it("parseCurveText(text) throws io/ragged-row when the header has another number of cells", () => {
    const e = errorOf(() => parse("V (V),I (A),G (S)\n0,0\n1,1\n2,2\n"));
    expect(e.code).toBe("io/ragged-row");
    expect(e.message).toContain("line 1 (the header)");
  });

  it("parseCurveText(text) throws io/unknown-unit naming the header and listing the accepted units", () => {
    const e = errorOf(() => parse("Bias (kV),Current (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n"));
    expect(e.code).toBe("io/unknown-unit");
    expect(e.message).toContain('"Bias (kV)"');
    expect(e.message).toContain('"kV"');
    for (const u of ACCEPTED_UNITS.bias) expect(e.message).toContain(u);
    expect(e.message).toContain("biasUnit");
  });

  it("parseCurveText(text) throws io/unknown-unit for a current in volts (`Current (mV)`)", () => {
    const e = errorOf(() => parse("Bias (V),Current (mV)\n0,0\n1,1\n2,2\n3,3\n4,4\n"));
    expect(e.code).toBe("io/unknown-unit");
    expect(e.message).toContain("it is a bias unit");
  });

  it("parseCurveText(text) throws io/no-bias-column and io/no-current-column when the header lacks one", () => {
    const a = errorOf(() => parse("x (V),y (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n"));
    expect(a.code).toBe("io/no-bias-column");
    expect(a.message).toContain('"x (V)"');
    expect(a.message).toContain("biasColumn");
    const b = errorOf(() => parse("bias (V),z (nm)\n0,0\n1,1\n2,2\n3,3\n4,4\n"));
    expect(b.code).toBe("io/no-current-column");
    expect(b.message).toContain("currentColumns");
  });

  it("parseCurveText(text) throws io/too-few-points naming the minimum", () => {
    const e = errorOf(() => parse("V (V),I (A)\n0,0\n1,1\n1,2\n2,2\n"));
    expect(e.code).toBe("io/too-few-points");
    expect(e.message).toContain("only 3 distinct bias points");
    expect(e.message).toContain("at least 5");
    expect(errorOf(() => parse("V (V),I (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n", { minPoints: 6 })).message).toContain("at least 6");
  });

  it("parseCurveText(text) throws io/too-many-bad-rows when most rows are unreadable", () => {
    const e = errorOf(() => parse("V (V),I (A)\n0,0\n1,x\n2,x\n3,x\n4,4\n5,x\n"));
    expect(e.code).toBe("io/too-many-bad-rows");
    expect(e.message).toContain("4 of 6");
    expect(e.message).toContain("line 3");
  });

  it("parseCurveText(text) throws io/no-common-range for side-by-side sweeps over disjoint bias ranges", () => {
    const text = "Bias a (V),Current a (A),Bias b (V),Current b (A)\n0,0,10,0\n1,1,11,1\n2,2,12,2\n3,3,13,3\n4,4,14,4\n";
    const e = errorOf(() => parse(text));
    expect(e.code).toBe("io/no-common-range");
    expect(e.message).toContain("0 to 4 V");
    expect(e.message).toContain("10 to 14 V");
  });

  it("parseCurveText(text, {biasColumn}) throws io/no-such-column listing the columns", () => {
    const e = errorOf(() => parse("V (V),I (A)\n0,0\n1,1\n2,2\n3,3\n4,4\n", { biasColumn: "U" }));
    expect(e.code).toBe("io/no-such-column");
    expect(e.message).toContain('0 "V (V)"');
    expect(errorOf(() => parse("1 2\n3 4\n", { biasColumn: 5 })).code).toBe("io/no-such-column");
  });

  it("parseCurveText(text, options) rejects bad options with the option's name", () => {
    expect(errorOf(() => parse("V,I\n", { delimter: "," } as ParseOptions)).code).toBe("options/unknown-key");
    expect(errorOf(() => parse("V,I\n", { delimiter: "|" } as unknown as ParseOptions)).message).toContain("delimiter");
    const u = errorOf(() => parse("V,I\n", { biasUnit: "kV" }));
    expect(u.code).toBe("io/unknown-unit");
    expect(u.message).toContain("option biasUnit");
    expect(errorOf(() => parse("V,I\n", { minPoints: 1 })).message).toContain("minPoints");
    expect(errorOf(() => parse("V,I\n", { currentColumns: [] })).message).toContain("currentColumns");
  });

  it("parseCurveText(non-string) throws io/not-text", () => {
    expect(errorOf(() => parseCurveText(42 as unknown as string)).code).toBe("io/not-text");
  });
});

/* ------------------------------------------------------------------------------------------------
 * Property-based tests: any input either parses into a valid curve or throws a DotspecError.
 * ---------------------------------------------------------------------------------------------- */

/** Parse, then check the invariants; a DotspecError with a message is the only other outcome. */
function parsesOrExplains(text: string, options?: ParseOptions): boolean {
  let r: ParsedCurve;
  try {
    r = parseCurveText(text, options);
  } catch (e) {
    if (!isDotspecError(e)) throw e;
    expect(e.message.length).toBeGreaterThan(0);
    expect(e.code.length).toBeGreaterThan(0);
    return true;
  }
  checkCurve(r);
  return true;
}

const HEADERS = [
  "bias (V)", "bias (mV)", "V", "U [mV]", "bias_V", "Bias/V", "current (A)", "Current [pA]", "I", "current_nA",
  "It (fA)", "dI/dV (nS)", "G", "z (nm)", "time (s)", "Bias (kV)", "Current (arb.)", "", "Current fwd [pA]", "I/V",
];
const JUNK = ["NaN", "nan", "inf", "-inf", "", " ", "-", "--", "n/a", "abc", "1,5", "1.5.5", '"', '"2"', "1e999", "0x10", "\u22121", "#", "%", "µ", "\t", ";", ","];
const DELIMS = [",", ";", "\t", " ", "  "];

const GOOD_BIAS = ["bias (V)", "bias (mV)", "V", "U [mV]", "bias_V", "Bias/V"];
const GOOD_CURRENT = ["current (A)", "Current [pA]", "I", "current_nA", "It (fA)", "Current fwd [pA]"];
const OTHER = ["dI/dV (nS)", "G", "z (nm)", "time (s)", "Bias (kV)", "Current (arb.)", "", "I/V", "bias (V)", "I"];
const numberCell = fc.oneof(
  fc.double().map(String), // any double, NaN and ±Infinity included
  fc.integer({ min: -1000, max: 1000 }).map(String),
  fc.double({ min: -10, max: 10, noNaN: true }).map(String),
);

/**
 * A table that is nearly right: a header (plausible, random or none), a bias column going up,
 * down, up and down, or random, 2–4 columns of numbers, then junk put into cells and between lines.
 */
const junkTable = fc
  .record({
    extra: fc.integer({ min: 0, max: 2 }),
    rows: fc.integer({ min: 0, max: 40 }),
    delim: fc.constantFrom(...DELIMS),
    header: fc.oneof(
      fc.constant(null),
      fc.tuple(fc.constantFrom(...GOOD_BIAS), fc.constantFrom(...GOOD_CURRENT), fc.constantFrom(...OTHER), fc.constantFrom(...OTHER)),
      fc.array(fc.constantFrom(...HEADERS), { minLength: 4, maxLength: 4 }),
    ),
    biasKind: fc.constantFrom("up", "down", "upDown", "random"),
    cells: fc.array(numberCell, { minLength: 160, maxLength: 160 }),
    junkCells: fc.array(fc.tuple(fc.nat(159), fc.oneof(fc.constantFrom(...JUNK), fc.string({ maxLength: 5 }))), { maxLength: 6 }),
    junkLines: fc.array(
      fc.tuple(fc.nat(45), fc.oneof(fc.constantFrom(...JUNK), fc.string({ maxLength: 20 }), fc.constant("# key: value"))),
      { maxLength: 2 },
    ),
    eol: fc.constantFrom("\n", "\r\n"),
    bom: fc.boolean(),
  })
  .map(({ extra, rows, delim, header, biasKind, cells, junkCells, junkLines, eol, bom }) => {
    const cols = 2 + extra;
    const grid = cells.slice();
    for (const [at, junk] of junkCells) grid[at] = junk;
    const lines: string[] = [];
    if (header) lines.push(header.slice(0, cols).join(delim));
    const half = Math.ceil(rows / 2);
    for (let r = 0; r < rows; r++) {
      const b = biasKind === "up" ? r : biasKind === "down" ? rows - r : biasKind === "upDown" ? (r < half ? r : 2 * half - r) : null;
      const row: string[] = [];
      for (let c = 0; c < cols; c++) row.push(c === 0 && b !== null ? String(b * 0.01 - 0.1) : grid[(r * cols + c) % grid.length]);
      lines.push(row.join(delim));
    }
    for (const [at, junk] of junkLines) lines.splice(Math.min(at, lines.length), 0, junk);
    return (bom ? "\ufeff" : "") + lines.join(eol);
  });

describe("parseCurveText: random input (fast-check)", () => {
  it("parseCurveText(any string) parses into a valid curve or throws a DotspecError", () => {
    fc.assert(fc.property(fc.string({ unit: "binary", maxLength: 300 }), (s) => parsesOrExplains(s)), { numRuns: 400 });
  });

  it("parseCurveText(byte-like string) parses into a valid curve or throws a DotspecError", () => {
    const bytes = fc.uint8Array({ maxLength: 400 }).map((b) => String.fromCharCode(...b));
    fc.assert(fc.property(bytes, (s) => parsesOrExplains(s)), { numRuns: 400 });
  });

  it("parseCurveText(numeric table with junk injected) parses into a valid curve or throws a DotspecError", () => {
    fc.assert(fc.property(junkTable, (s) => parsesOrExplains(s)), { numRuns: 500 });
  });

  it("parseCurveText(string of table characters) parses into a valid curve or throws a DotspecError", () => {
    const chars = fc.constantFrom(..."0123456789.,;-+e \t\n\r#:=()[]_/VAIbiasµ".split(""));
    fc.assert(fc.property(fc.string({ unit: chars, maxLength: 200 }), (s) => parsesOrExplains(s)), { numRuns: 400 });
  });

  it("parseCurveText(table with random headers and options) parses into a valid curve or throws a DotspecError", () => {
    const arb = fc.record({
      header: fc.array(fc.oneof(fc.constantFrom(...HEADERS), fc.string({ maxLength: 12 })), { minLength: 2, maxLength: 3 }),
      delim: fc.constantFrom(",", ";", "\t"),
      n: fc.integer({ min: 3, max: 12 }),
      options: fc.record(
        {
          delimiter: fc.constantFrom("auto", ",", ";", "\t", "whitespace"),
          biasUnit: fc.constantFrom("V", "mV", "µV"),
          currentUnit: fc.constantFrom("A", "nA", "pA"),
          biasColumn: fc.oneof(fc.nat(3), fc.constantFrom(...HEADERS)),
        },
        { requiredKeys: [] },
      ),
    });
    fc.assert(
      fc.property(arb, ({ header, delim, n, options }) => {
        const lines = [header.join(delim)];
        for (let i = 0; i < n; i++) lines.push(header.map((_, c) => String((i - 2) * (c + 1) * 0.5)).join(delim));
        return parsesOrExplains(lines.join("\n"), options as ParseOptions);
      }),
      { numRuns: 300 },
    );
  });

  it("parseCurveText(well-formed table) returns exactly the numbers written, in SI (any delimiter, unit, direction)", () => {
    const arb = fc.record({
      ks: fc.uniqueArray(fc.integer({ min: -5000, max: 5000 }), { minLength: 5, maxLength: 60 }),
      currents: fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => x + 0), { minLength: 60, maxLength: 60 }),
      biasUnit: fc.constantFrom(...ACCEPTED_UNITS.bias),
      currentUnit: fc.constantFrom(...ACCEPTED_UNITS.current),
      layout: fc.constantFrom("comma", "semicolon-decimal-comma", "tab", "spaces"),
      descending: fc.boolean(),
    });
    fc.assert(
      fc.property(arb, ({ ks, currents, biasUnit, currentUnit, layout, descending }) => {
        const order = [...ks].sort((a, b) => (descending ? b - a : a - b));
        const bias = order.map((k) => k / 1000);
        const cur = bias.map((_, i) => currents[i]);
        const delim = layout === "comma" ? "," : layout === "tab" ? "\t" : layout === "spaces" ? "   " : ";";
        const num = (x: number) => (layout === "semicolon-decimal-comma" ? String(x).replace(".", ",") : String(x));
        const head = layout === "spaces" ? `bias_${biasUnit} current_${currentUnit}` : `bias (${biasUnit})${delim}current (${currentUnit})`;
        const text = [head, ...bias.map((b, i) => `${num(b)}${delim}${num(cur[i])}`)].join("\n");
        const r = parseCurveText(text);
        checkCurve(r);
        const bu = parseUnit(biasUnit);
        const cu = parseUnit(currentUnit);
        // by construction: the numbers written, converted with toSI (checked against mathjs in units.test.ts)
        const idx = bias.map((_, i) => i).sort((i, j) => bias[i] - bias[j]);
        expect(arr(r.curve.biasV)).toEqual(idx.map((i) => toSI(bias[i], bu)));
        expect(arr(r.curve.currentA)).toEqual(idx.map((i) => toSI(cur[i], cu)));
        expect(r.record.biasDirection).toBe(descending ? "descending" : "ascending");
        expect(r.record.warnings).toEqual([]);
        return true;
      }),
      { numRuns: 300 },
    );
  });
});

describe("parseCurveText(text, { biasPolarity: \"tip\" })", () => {
  it("turns a tip-bias file into sample bias: V → −V, I → −I, order ascending (closed form of the junction's electrostatics)", () => {
    const text = "bias (V),current (nA)\n-1,-3\n0,0\n1,1\n2,5\n3,6\n";
    const { curve, record } = parseCurveText(text, { biasPolarity: "tip" });
    expect(Array.from(curve.biasV)).toEqual([-3, -2, -1, 0, 1]);
    expectClose(curve.currentA, [-6e-9, -5e-9, -1e-9, 0, 3e-9], { rtol: 1e-12 });
    expect(record.biasPolarity).toBe("tip");
    expect(parseCurveText(text).record.biasPolarity).toBe("sample");
  });
});
