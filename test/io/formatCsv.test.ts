// CSV text for tables and curves. References: d3-dsv's csvParse (RFC 4180 reader, reference library)
// for quoting; ECMA-262 Number::toString, whose shortest form reads back to the same double, for
// "full precision"; 10 significant digits bound the relative rounding error by 5e-10 (closed form:
// half a unit in the 10th digit).
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { csvParse, csvParseRows } from "d3-dsv";
import { expectClose } from "../helpers/expectClose.ts";
import { CURVE_CSV_DIGITS, escapeFormulaCell, formatCsv, formatCurveCsv } from "../../lib/io/formatCsv.ts";
import { parseCurveText } from "../../lib/io/parse/index.ts";
import { errorOf } from "../helpers/errors.ts";

describe("formatCsv", () => {
  it("formatCsv(rows) quotes cells so that d3-dsv's csvParse reads them back", () => {
    const rows = [{ file: 'a,b "c".csv', note: "two\nlines", gapV: 1.5 }];
    const text = formatCsv(rows);
    // d3-dsv csvParse (reference library)
    expect(csvParse(text)[0]).toMatchObject({ file: 'a,b "c".csv', note: "two\nlines", gapV: "1.5" });
    expect(text.endsWith("\n")).toBe(true);
  });

  it("formatCsv(rows) writes numbers in full precision, null as empty, booleans as words", () => {
    const text = formatCsv([{ x: 0.1 + 0.2, y: null, ok: true, n: -1e-300 }]);
    // ECMA-262 Number::toString: 0.1 + 0.2 is 0.30000000000000004
    expect(text).toBe("x,y,ok,n\n0.30000000000000004,,true,-1e-300\n");
  });

  it("formatCsv(rows) numbers read back to the same double (property)", () => {
    // ECMA-262 Number::toString round-trips every finite double
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 20 }), (xs) => {
        const rows = csvParseRows(formatCsv(xs.map((x) => ({ x }))).trimEnd());
        return rows.slice(1).every((r, i) => Object.is(Number(r[0]), xs[i]) || (xs[i] === 0 && Number(r[0]) === 0));
      }),
      { numRuns: 300 },
    );
  });

  it("formatCsv(rows, columns) follows the given column order and leaves out other keys", () => {
    // by construction of the input
    expect(formatCsv([{ a: 1, b: 2, c: 3 }], ["c", "a"])).toBe("c,a\n3,1\n");
  });

  it("formatCsv(rows) takes the columns from every row, in order of first appearance", () => {
    // d3-dsv csvFormat's documented column inference
    expect(formatCsv([{ a: 1 }, { b: 2 }])).toBe("a,b\n1,\n,2\n");
  });
});

describe("formatCurveCsv", () => {
  it("formatCurveCsv(curve) writes the header `bias (V),current (A)` and compact numbers", () => {
    const text = formatCurveCsv({ biasV: [-0.1, 0, 0.1], currentA: [-2e-12, 0, 2.0000000001234e-12] });
    // 10 significant digits: 2.0000000001234e-12 → 2.000000000e-12 → "2e-12"
    expect(text).toBe("bias (V),current (A)\n-0.1,-2e-12\n0,0\n0.1,2e-12\n");
  });

  it("formatCurveCsv(curve with didvS) adds the column `dI/dV (S)`", () => {
    const text = formatCurveCsv({ biasV: [0, 1], currentA: [0, 1e-9], didvS: [1e-9, 2e-9] });
    expect(text.split("\n")[0]).toBe("bias (V),current (A),dI/dV (S)");
    expect(text.split("\n")[2]).toBe("1,1e-9,2e-9");
  });

  it("parseCurveText(formatCurveCsv(curve)) gives the curve back to 10 significant digits (property)", () => {
    const arb = fc.record({
      ks: fc.uniqueArray(fc.integer({ min: -3000, max: 3000 }), { minLength: 5, maxLength: 80 }),
      currents: fc.array(fc.double({ min: -1e-6, max: 1e-6, noNaN: true }), { minLength: 80, maxLength: 80 }),
      withDidv: fc.boolean(),
    });
    fc.assert(
      fc.property(arb, ({ ks, currents, withDidv }) => {
        const biasV = Float64Array.from([...ks].sort((a, b) => a - b).map((k) => k * 1e-3));
        const currentA = Float64Array.from(biasV, (_, i) => currents[i]);
        const didvS = withDidv ? Float64Array.from(biasV, (_, i) => Math.abs(currents[i]) * 1e3) : null;
        const { curve, record } = parseCurveText(formatCurveCsv({ biasV, currentA, didvS }));
        // half a unit in the 10th significant digit: relative error ≤ 5e-10
        expectClose(curve.biasV, biasV, { rtol: 5e-10 });
        expectClose(curve.currentA, currentA, { rtol: 5e-10 });
        if (didvS) expectClose(curve.didvS!, didvS, { rtol: 5e-10 });
        else expect(curve.didvS).toBeNull();
        expect(record.warnings).toEqual([]);
        expect(record.columns.map((c) => c.unitFrom)).toEqual(withDidv ? ["header", "header", "header"] : ["header", "header"]);
        return true;
      }),
      { numRuns: 300 },
    );
    expect(CURVE_CSV_DIGITS).toBe(10);
  });

  it("formatCurveCsv throws io/length-mismatch and io/not-finite naming the array", () => {
    const a = errorOf(() => formatCurveCsv({ biasV: [0, 1], currentA: [0] }));
    expect(a.code).toBe("io/length-mismatch");
    expect(a.message).toContain("currentA has 1 values but biasV has 2");
    const b = errorOf(() => formatCurveCsv({ biasV: [0, 1], currentA: [0, NaN] }));
    expect(b.code).toBe("io/not-finite");
    expect(b.message).toContain("currentA[1]");
  });
});

describe("formatCsv: formula escaping (OWASP Foundation, \"CSV Injection\", https://owasp.org/www-community/attacks/CSV_Injection)", () => {
  it("formatCsv(rows) puts a single quote before text starting with = + - @ tab or CR, which csvParse reads back with the quote", () => {
    const text = formatCsv([{ a: "=1+1", b: "+x", c: "-x", d: "@x", e: "\tx", f: "\rx", g: "ok" }]);
    expect(csvParse(text)[0]).toEqual({ a: "'=1+1", b: "'+x", c: "'-x", d: "'@x", e: "'\tx", f: "'\rx", g: "ok" });
  });

  it("escapeFormulaCell(text) of any text never starts with a formula character (property)", () => {
    fc.assert(
      fc.property(fc.string(), (t) => {
        const out = escapeFormulaCell(t) as string;
        return !/^[=+\-@\t\r]/.test(out) || /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(out);
      }),
      { numRuns: 500 },
    );
  });
});

describe("formatCurveCsv(curve, { metadata })", () => {
  it("writes `# key: value` lines first, which parseCurveText reads back into the curve's metadata", () => {
    const text = formatCurveCsv({ biasV: [-0.2, -0.1, 0, 0.1, 0.2, 0.3], currentA: [-2e-12, -1e-12, 0, 1e-12, 2e-12, 3e-12] }, { metadata: { eta: 0.8, description: "two\nlines" } });
    expect(text.split("\n").slice(0, 3)).toEqual(["# eta: 0.8", "# description: two lines", "bias (V),current (A)"]);
    expect(parseCurveText(text).curve.meta.metadata).toEqual({ eta: "0.8", description: "two lines" });
  });

  it("refuses a key that would not read back as one (io/bad-metadata-key)", () => {
    expect(errorOf(() => formatCurveCsv({ biasV: [0], currentA: [0] }, { metadata: { "a: b": 1 } })).code).toBe("io/bad-metadata-key");
  });
});
