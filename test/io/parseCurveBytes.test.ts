// Decoding curve files from bytes. Expected values: the encodings' definitions (WHATWG Encoding
// Standard: UTF-8, UTF-16LE/BE with byte-order marks, windows-1252, where byte 0xB5 is "µ"),
// and parseCurveText on the same text (the function is decode-then-parse by its contract).
import { describe, expect, it } from "vitest";
import { parseCurveBytes } from "../../lib/io/parseCurveBytes.ts";
import { parseCurveText } from "../../lib/io/parse/index.ts";
import { errorOf } from "../helpers/errors.ts";

const TEXT = "bias (V),current (µA)\n-0.2,-2\n-0.1,-1\n0,0\n0.1,1\n0.2,2\n";

function utf16(text: string, bigEndian: boolean): Uint8Array {
  const out = new Uint8Array(2 + 2 * text.length);
  out.set(bigEndian ? [0xfe, 0xff] : [0xff, 0xfe]);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[2 + 2 * i + (bigEndian ? 1 : 0)] = c & 0xff;
    out[2 + 2 * i + (bigEndian ? 0 : 1)] = c >> 8;
  }
  return out;
}

describe("parseCurveBytes", () => {
  it("parseCurveBytes(UTF-8 bytes) equals parseCurveText on the text", () => {
    const got = parseCurveBytes(new TextEncoder().encode(TEXT), { source: "a.csv" });
    expect(got).toEqual(parseCurveText(TEXT, { source: "a.csv" }));
    // µA = 1e-6 A (SI prefix micro)
    expect(got.curve.currentA[4]).toBeCloseTo(2e-6, 18);
  });

  it("parseCurveBytes(UTF-16 with a byte-order mark, either order) reads the same curve", () => {
    const want = parseCurveText(TEXT, { source: "u.csv" });
    expect(parseCurveBytes(utf16(TEXT, false), { source: "u.csv" })).toEqual(want);
    expect(parseCurveBytes(utf16(TEXT, true), { source: "u.csv" })).toEqual(want);
  });

  it("parseCurveBytes(windows-1252 bytes) reads 0xB5 as µ and warns", () => {
    const bytes = Uint8Array.from(TEXT.replace("µ", "\u00b5"), (c) => c.charCodeAt(0)); // one byte per character
    const got = parseCurveBytes(bytes, { source: "latin.csv" });
    expect(got.curve.currentA[4]).toBeCloseTo(2e-6, 18);
    expect(got.record.warnings[0]).toMatch(/not valid UTF-8.*Windows-1252/);
  });

  it("parseCurveBytes throws io/binary naming the source for a NUL byte, and io/not-bytes for a string", () => {
    const e = errorOf(() => parseCurveBytes(Uint8Array.from([0x31, 0, 0x32]), { source: "scan.sxm" }));
    expect(e.code).toBe("io/binary");
    expect(e.message.startsWith("scan.sxm: ")).toBe(true);
    expect(errorOf(() => parseCurveBytes("0,1" as unknown as Uint8Array)).code).toBe("io/not-bytes");
  });
});
