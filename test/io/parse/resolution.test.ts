import { describe, expect, it } from "vitest";
import { cellQuantum } from "../../../lib/io/parse/resolution.ts";
import { parseCurveText } from "../../../lib/io/parse/index.ts";
import { expectClose } from "../../helpers/expectClose.ts";

describe("cellQuantum(cell, decimalComma)", () => {
  // closed form for every row: 10^(exponent − digits after the decimal separator)
  it.each([
    ["-1.52849e-11", false, 1e-16],
    ["0.0150", false, 1e-4],
    ["42", false, 1],
    ["12,50", true, 1e-2],
    ["1.5D-03", false, 1e-4],
    ["+7.E2", false, 100],
    ["\u22123.25", false, 1e-2],
    [" 2.5e+3 ", false, 100],
  ])("cellQuantum(%j) = %s", (cell, comma, q) => {
    expectClose(cellQuantum(cell as string, comma as boolean), q as number, { rtol: 1e-12 });
  });

  it.each([
    ["1e+0005", 1e5],
    ["1e-0", 1],
    ["1e1234567", NaN], // exponent read by Number(): 1234567 is an integer, but 10^1234567 is out of range
    ["1e0x10", 1e16], // Number("0x10") = 16, an integer: taken as written
    ["1e+-3", NaN],
    ["1e3.5", NaN],
  ])("cellQuantum(%j): the exponent is read as Number() reads it (reference: ECMA-262 StringToNumber)", (cell, q) => {
    if (Number.isNaN(q)) expect(cellQuantum(cell as string, false)).toBeNaN();
    else expectClose(cellQuantum(cell as string, false), q as number, { rtol: 1e-12 });
  });

  it.each(["", "abc", "NaN", "1e", "e5", ".", "\"3\"", "0x10", "1.2.3"])("cellQuantum(%j) is NaN (not a plain decimal number)", (cell) => {
    expect(cellQuantum(cell, false)).toBeNaN();
  });
});

describe("parseCurveText(text): the resolution of the written numbers", () => {
  it("records the RMS quantum per current column and on the curve, in A (closed form: √((1² + 10²)/2) pA for 3 and 2 decimals, ×1e-3)", () => {
    const text = "bias (V),current (nA),current (nA)\n0,1.125,1.13\n1,2.250,2.25\n2,3.375,3.38\n";
    const { curve, record } = parseCurveText(text, { minPoints: 3 });
    expectClose(record.columns[1].resolutionSI!, 1e-12, { rtol: 1e-12 });
    expectClose(record.columns[2].resolutionSI!, 1e-11, { rtol: 1e-12 });
    const rms = Math.sqrt((1e-24 + 1e-22) / 2);
    expectClose(record.currentResolutionA!, rms, { rtol: 1e-12 });
    expectClose(curve.meta.currentResolutionA!, rms, { rtol: 1e-12 });
    expect(record.columns[0].resolutionSI).toBeNull();
  });

  it("skips zero cells, whose digits say nothing of a magnitude's (closed form: 6 significant digits at 1e-11 give 1e-16)", () => {
    const text = "bias (V),current (A)\n-1,-1.23456e-11\n0,0\n1,1.23456e-11\n";
    expectClose(parseCurveText(text, { minPoints: 3 }).record.currentResolutionA!, 1e-16, { rtol: 1e-12 });
  });

  it("records the conductance column's resolution in S (closed form: 0.01 nS)", () => {
    const text = "bias (V),current (nA),dI/dV (nS)\n0,1,0.25\n1,2,0.50\n2,3,0.75\n";
    const { curve, record } = parseCurveText(text, { minPoints: 3 });
    expectClose(record.conductanceResolutionS!, 1e-11, { rtol: 1e-12 });
    expectClose(curve.meta.conductanceResolutionS!, 1e-11, { rtol: 1e-12 });
  });
});
