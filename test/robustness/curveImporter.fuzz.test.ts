/**
 * The curve importer under hostile input (fast-check, fixed seeds so every run tries the same
 * cases): whatever the bytes, `parseCurveBytes` and `parseCurveText` return a curve whose numbers
 * are all finite, or throw a DotspecError whose message is one line naming the source — never
 * another exception, a hang or NaN.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analysisToJson, analyzeCurve, parseCurveBytes, parseCurveText, type ParsedCurve } from "../../lib/core.ts";
import { isDotspecError } from "../../lib/util/errors.ts";
import { expectFiniteNumbers, outcomeOf, utf16Bytes } from "../helpers/fuzz.ts";

const SOURCE = "fuzz.csv";

/** The outcome of one parse: "ok" after checking the result, or the DotspecError's code after checking its message (one line, naming the source, and the line for a ragged row). */
function outcome(parse: () => ParsedCurve): string {
  return outcomeOf(parse, { source: SOURCE, lineCodes: ["io/ragged-row"] }, checkResult);
}

/** Every number of a parsed curve and of its record is finite; the bias ascends strictly. */
function checkResult({ curve, record }: ParsedCurve): void {
  const n = curve.biasV.length;
  expect(n).toBeGreaterThanOrEqual(2);
  const series = [curve.biasV, curve.currentA, ...curve.sweeps, ...(curve.didvS ? [curve.didvS] : [])];
  for (const s of series) {
    expect(s.length).toBe(n);
    for (let i = 0; i < n; i++) if (!Number.isFinite(s[i])) expect.fail(`non-finite value ${s[i]} at index ${i}`);
  }
  for (let i = 1; i < n; i++) if (!(curve.biasV[i] > curve.biasV[i - 1])) expect.fail(`bias not ascending at index ${i}`);
  const numbers = [record.biasStepV, ...record.biasRangeV, record.points, record.dataRows, record.rowsDropped, record.duplicatesMerged];
  for (const x of numbers) expect(Number.isFinite(x)).toBe(true);
  for (const q of [record.currentResolutionA, record.conductanceResolutionS, curve.meta.currentResolutionA ?? null]) {
    if (q !== null) expect(Number.isFinite(q) && q >= 0).toBe(true);
  }
  expectFiniteNumbers(record, "record");
}

const bytesOf = (text: string) => new TextEncoder().encode(text);
const fromBytes = (bytes: Uint8Array) => () => parseCurveBytes(bytes, { source: SOURCE });
const fromText = (text: string) => () => parseCurveText(text, { source: SOURCE });

/** A well-formed curve file of `rows` rows, written with the given number formatter. */
function curveText(rows: number, format: (x: number) => string, delimiter = ",", eol = "\n"): string {
  const lines = [`bias (V)${delimiter}current (pA)`];
  for (let i = 0; i < rows; i++) {
    const v = -1 + (2 * i) / Math.max(1, rows - 1);
    lines.push(`${format(v)}${delimiter}${format(Math.sinh(3 * v))}`);
  }
  return lines.join(eol) + eol;
}

/** Numbers the way a file may hold them: ordinary, huge, tiny, with odd spellings. */
const numberCell = fc.oneof(
  fc.double({ noNaN: false }).map((x) => String(x)),
  fc.tuple(fc.double({ min: -1e308, max: 1e308, noNaN: true }), fc.integer({ min: 0, max: 20 })).map(([x, digits]) => x.toExponential(digits)),
  fc.constantFrom("1e309", "-1e309", "1e-320", "4.9e-324", "0x10", "1,5", "−2.5", "1.5D-03", "NaN", "inf", "", "-", "1e", "e5", ".", "+.", "1..2", "\"3\"", "1e400"),
  fc.integer().map(String),
);

/** Lines of a plausible but damaged table. */
const tableLine = fc.oneof(
  fc.array(numberCell, { minLength: 1, maxLength: 5 }).chain((cells) => fc.constantFrom(",", ";", "\t", " ").map((d) => cells.join(d))),
  fc.constantFrom("bias (V),current (A)", "Bias [mV];Current [µA]", "bias_V\tcurrent_nA\tdIdV_S", "# eta: 0.8", "% comment", "V,pA", "", "bias (V),current (\u00b5A)"),
  fc.string({ maxLength: 40 }),
);

describe("parseCurveBytes(bytes) on random bytes", () => {
  it("returns a finite curve or throws a one-line DotspecError naming the source (2,000 byte strings)", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), (bytes) => {
        outcome(fromBytes(bytes));
      }),
      { seed: 12001, numRuns: 2000 },
    );
  });

  it("the same for random bytes after a plausible header and under each byte-order mark (600 cases)", () => {
    const prefix = fc.constantFrom(
      Uint8Array.of(),
      Uint8Array.of(0xef, 0xbb, 0xbf),
      Uint8Array.of(0xff, 0xfe),
      Uint8Array.of(0xfe, 0xff),
      bytesOf("bias (V),current (A)\n-1,-1e-9\n0,0\n"),
    );
    fc.assert(
      fc.property(prefix, fc.uint8Array({ maxLength: 300 }), (head, tail) => {
        const bytes = new Uint8Array(head.length + tail.length);
        bytes.set(head);
        bytes.set(tail, head.length);
        outcome(fromBytes(bytes));
      }),
      { seed: 12002, numRuns: 600 },
    );
  });
});

describe("parseCurveText(text) on damaged tables", () => {
  it("returns a finite curve or throws a one-line DotspecError naming the source (1,500 tables of random lines)", () => {
    fc.assert(
      fc.property(fc.array(tableLine, { maxLength: 30 }), fc.constantFrom("\n", "\r\n", "\r"), (lines, eol) => {
        outcome(fromText(lines.join(eol)));
      }),
      { seed: 12003, numRuns: 1500 },
    );
  });

  it("the same for a good file truncated at every length (a cut at any byte)", () => {
    const text = curveText(40, (x) => x.toPrecision(6));
    const codes = new Set<string>();
    for (let cut = 0; cut <= text.length; cut++) codes.add(outcome(fromText(text.slice(0, cut))));
    // the whole file reads; an empty one is io/empty (closed form: by construction of the input)
    expect(codes.has("ok")).toBe(true);
    expect(outcome(fromText(""))).toBe("io/empty");
  });

  it("the same for a good file with a random character replaced or inserted (1,000 cases)", () => {
    const text = curveText(30, (x) => x.toExponential(4));
    fc.assert(
      fc.property(fc.nat({ max: text.length - 1 }), fc.string({ minLength: 1, maxLength: 3, unit: "binary" }), fc.boolean(), (at, s, replace) => {
        outcome(fromText(text.slice(0, at) + s + text.slice(replace ? at + 1 : at)));
      }),
      { seed: 12004, numRuns: 1000 },
    );
  });

  it("reads huge and tiny magnitudes without overflow to Infinity or NaN (500 scales)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -320, max: 300 }), fc.integer({ min: 0, max: 17 }), (exp, digits) => {
        const scale = Number(`1e${exp}`);
        outcome(fromText(curveText(20, (x) => (x * scale).toExponential(digits))));
      }),
      { seed: 12005, numRuns: 500 },
    );
  });
});

describe("analyzeCurve(parseCurveText(text).curve) at any scale of bias and current", () => {
  it("gives a JSON record with finite numbers only, or a one-line DotspecError (80 scales, no hang)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -300, max: 8 }), fc.integer({ min: -320, max: 70 }), fc.integer({ min: 0, max: 2 ** 31 }), (biasExp, currentExp, seed) => {
        const b = Number(`1e${biasExp}`);
        const c = Number(`1e${currentExp}`);
        const lines = ["bias (V),current (A)"];
        for (let i = 0; i < 300; i++) {
          const v = -1 + (2 * i) / 299;
          const noise = 0.01 * Math.sin(i * 7 + seed); // a deterministic wiggle, not a check value
          lines.push(`${(v * b).toExponential(6)},${((Math.abs(v) > 0.3 ? Math.sinh(3 * v) : 0) * c + noise * c).toExponential(5)}`);
        }
        let record: ParsedCurve["record"];
        let analysed: ReturnType<typeof analysisToJson>;
        try {
          const parsed = parseCurveText(lines.join("\n"), { source: SOURCE });
          record = parsed.record;
          analysed = analysisToJson(analyzeCurve(parsed.curve, { eta: 0.8 }), record);
        } catch (e) {
          if (!isDotspecError(e)) throw e;
          expect(e.message).not.toMatch(/[\r\n]/);
          return;
        }
        expectFiniteNumbers(analysed, "analysis");
      }),
      { seed: 12006, numRuns: 80 },
    );
  });
});

describe("parseCurveBytes(bytes): encodings and layouts a file may come in", () => {
  const good = curveText(50, (x) => x.toFixed(5));
  const expected = parseCurveText(good, { source: SOURCE }).curve;

  it.each([
    ["UTF-8 with a byte-order mark", Uint8Array.from([0xef, 0xbb, 0xbf, ...bytesOf(good)])],
    ["UTF-16 LE with a byte-order mark", utf16Bytes(good, false)],
    ["UTF-16 BE with a byte-order mark", utf16Bytes(good, true)],
    ["CRLF line ends", bytesOf(good.replace(/\n/g, "\r\n"))],
    ["decimal commas with semicolons", bytesOf(good.replace(/,/g, ";").replace(/\./g, ","))],
  ])("reads %s as the plain file", (_, bytes) => {
    const { curve } = parseCurveBytes(bytes, { source: SOURCE });
    // by construction: the same numbers as the plain UTF-8 file
    expect(Array.from(curve.biasV)).toEqual(Array.from(expected.biasV));
    expect(Array.from(curve.currentA)).toEqual(Array.from(expected.currentA));
  });

  it("reads a Latin-1 µ in a unit (byte B5) as microamperes, with a warning", () => {
    const latin1 = Uint8Array.from([...bytesOf("bias (V),current ("), 0xb5, ...bytesOf("A)\n-1,-2\n0,0\n1,2\n2,4\n3,6\n")]);
    const { curve, record } = parseCurveBytes(latin1, { source: SOURCE });
    // closed form: 2 µA = 2e-6 A
    expect(curve.currentA[2]).toBeCloseTo(2e-6, 18);
    expect(record.warnings.some((w) => w.includes("Windows-1252"))).toBe(true);
  });

  it("refuses NUL bytes outside UTF-16 with io/binary naming the source", () => {
    const bytes = Uint8Array.from([...bytesOf("bias (V),current (A)\n-1,-1\n"), 0, ...bytesOf("0,0\n1,1\n")]);
    expect(outcome(fromBytes(bytes))).toBe("io/binary");
  });

  it("reads a file whose lines are 100,000 characters long (an ignored column of digits) or refuses it in one line", () => {
    const pad = "7".repeat(100_000);
    const text = `bias (V),current (A),note\n` + Array.from({ length: 20 }, (_, i) => `${i * 0.1},${i * 1e-10},${pad}`).join("\n");
    expect(outcome(fromText(text))).toBe("ok");
  });

  it("reads a 1,000,000-row file (one test; its time is not measured)", () => {
    const rows = 1_000_000;
    const parts: string[] = ["bias (V),current (A)"];
    for (let i = 0; i < rows; i++) parts.push(`${(-2 + (4 * i) / (rows - 1)).toFixed(7)},${(1e-9 * Math.sin(i)).toExponential(5)}`);
    const { curve, record } = parseCurveText(parts.join("\n"), { source: SOURCE });
    // by construction of the input
    expect(curve.biasV.length).toBe(rows);
    expect(record.dataRows).toBe(rows);
    // closed form: 5 decimals of the mantissa at exponents −10 and −9 (RMS over the cells, within those two)
    expect(record.currentResolutionA! >= 1e-15 && record.currentResolutionA! <= 1e-14).toBe(true);
  }, 60_000);
});
