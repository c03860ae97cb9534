// Splitting lines and reading numbers. Expected values are by construction of the input, with the
// number syntax of ECMAScript's Number() (ECMA-262, StringToNumber) as the reference.
import { describe, expect, it } from "vitest";
import { csvParseRows } from "d3-dsv";
import { detectDelimiter, isMissingCell, parseNumberCell, splitLine } from "../../lib/io/cells.ts";

describe("splitLine", () => {
  it("splitLine(line, ',') splits like d3-dsv's csvParseRows, quotes included", () => {
    // d3-dsv csvParseRows (reference implementation of RFC 4180 parsing)
    for (const line of ["1,2,3", '"a,b",2', 'x,"say ""hi""",', ",,"]) {
      expect(splitLine(line, ",")).toEqual(csvParseRows(line)[0]);
    }
  });

  it("splitLine(line, '\\t') leaves a quoted comma line without tabs in one cell", () => {
    // by construction: the line holds no tab
    expect(splitLine('"1,5","2,5"', "\t")).toEqual(['"1,5","2,5"']);
  });

  it("splitLine(line, 'whitespace') splits on runs of spaces and tabs and ignores the ends", () => {
    // by construction of the input
    expect(splitLine("  -1.0 \t  2e-12   ", "whitespace")).toEqual(["-1.0", "2e-12"]);
    expect(splitLine("   ", "whitespace")).toEqual([""]);
  });

  it("splitLine(line, d) for a quote-free line gives String.prototype.split(d)'s cells, empty ones included", () => {
    // Reference: ECMA-262 String.prototype.split with a one-character separator.
    for (const d of [",", ";", "\t"] as const) {
      for (const line of ["", "1", `1${d}2`, `${d}`, `${d}${d}`, `-1.5${d}${d}2e-12${d}`, `${d}a${d}b`, `x ${d} y`]) {
        expect(splitLine(line, d)).toEqual(line.split(d));
      }
    }
  });

  it("splitLine(line, 'whitespace') splits where /\s+/ does, for every UTF-16 code unit as the separator", () => {
    // Reference: ECMAScript's \s (WhiteSpace and LineTerminator) as the engine's own RegExp reads it.
    for (let c = 0; c < 0x10000; c++) {
      const ch = String.fromCharCode(c);
      const line = `1${ch}2${ch}${ch}3`;
      const t = line.trim();
      expect(splitLine(line, "whitespace"), `U+${c.toString(16)}`).toEqual(t === "" ? [""] : t.split(/\s+/));
    }
  });

  it("splitLine(line, ';') keeps decimal commas inside cells", () => {
    // by construction of the input
    expect(splitLine("-0,25;1,5e-3", ";")).toEqual(["-0,25", "1,5e-3"]);
  });
});

describe("parseNumberCell", () => {
  it("parseNumberCell(cell, false) reads decimal and exponent forms as Number() does", () => {
    // ECMA-262 StringToNumber (the reference for what Number() accepts)
    for (const s of ["0", "-1.5", "+.5", "1e-12", "-2.5E+3", " 7 ", "1."]) expect(parseNumberCell(s, false)).toBe(Number(s));
  });

  it("parseNumberCell(cell, true) reads a decimal comma: '1,25' → 1.25", () => {
    // by construction of the input
    expect(parseNumberCell("1,25", true)).toBe(1.25);
    expect(parseNumberCell("-0,5e-3", true)).toBe(-0.0005);
    expect(parseNumberCell("1,25", false)).toBeNaN();
  });

  it("parseNumberCell returns NaN for empty, missing, non-finite and non-decimal cells", () => {
    // common practice (no source): these markers mean "no value" in instrument exports;
    // Number("") is 0 in ECMA-262, which must not be taken as a value
    for (const s of ["", "  ", "NaN", "nan", "inf", "-inf", "Infinity", "1e999", "-", "abc", "0x1F", "0b11", "0o7", "1.2.3"]) {
      expect(parseNumberCell(s, false), JSON.stringify(s)).toBeNaN();
    }
  });

  it("parseNumberCell accepts a Unicode minus, a Fortran D exponent and quotes", () => {
    // common practice (no source): typeset minus U+2212 and Fortran-formatted output
    expect(parseNumberCell("\u22121.5", false)).toBe(-1.5);
    expect(parseNumberCell("1.5D-03", false)).toBe(0.0015);
    expect(parseNumberCell('"2.5"', false)).toBe(2.5);
  });
});

describe("isMissingCell", () => {
  it("isMissingCell(cell) is true for NaN, NA, n/a, -, --, null, empty; false for numbers and words", () => {
    // common practice (no source)
    for (const s of ["", " ", "NaN", "NA", "n/a", "-", "--", "null", "None", "inf"]) expect(isMissingCell(s)).toBe(true);
    for (const s of ["0", "bias", "V"]) expect(isMissingCell(s)).toBe(false);
  });
});

describe("detectDelimiter", () => {
  it("detectDelimiter(lines) finds comma, semicolon, tab and whitespace", () => {
    // by construction of the input
    expect(detectDelimiter(["-1.0,2e-12", "0,0", "1.0,2e-12"])).toEqual({ delimiter: ",", decimalComma: false });
    expect(detectDelimiter(["-1.0;2e-12", "0;0"])).toEqual({ delimiter: ";", decimalComma: false });
    expect(detectDelimiter(["-1.0\t2e-12\t3", "0\t0\t0"])).toEqual({ delimiter: "\t", decimalComma: false });
    expect(detectDelimiter(["  -1.0   2e-12", "0 0", " 1.0  2e-12"])).toEqual({ delimiter: "whitespace", decimalComma: false });
  });

  it("detectDelimiter(lines) reads '1,25;3,5' as semicolon with decimal comma", () => {
    // by construction of the input
    expect(detectDelimiter(["-1,25;-3,5", "0;0", "1,25;3,5"])).toEqual({ delimiter: ";", decimalComma: true });
  });

  it("detectDelimiter(lines) tells '1,5 2,3' (spaces, decimal comma) from '1.5, 2.3' (comma)", () => {
    // by construction of the input
    expect(detectDelimiter(["1,5 2,3", "-1,5 -2,3"])).toEqual({ delimiter: "whitespace", decimalComma: true });
    expect(detectDelimiter(["1.5, 2.3", "-1.5, -2.3"])).toEqual({ delimiter: ",", decimalComma: false });
    expect(detectDelimiter(['"1,5","2,3"', '"-1,5","-2,3"'])).toEqual({ delimiter: ",", decimalComma: true });
  });

  it("detectDelimiter(lines, [d]) keeps the forced delimiter", () => {
    // by construction of the input
    expect(detectDelimiter(["1,5\t2,5"], ["\t"])).toEqual({ delimiter: "\t", decimalComma: true });
    expect(detectDelimiter(["1"], [","]).delimiter).toBe(",");
  });
});
