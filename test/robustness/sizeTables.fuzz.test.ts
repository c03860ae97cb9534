/**
 * The size-table and optical-table readers under hostile input (fast-check, fixed seeds so every
 * run tries the same cases): whatever the bytes, `parseSizeMeta` and `parseOpticalTable` (and the
 * file readers around them) return rows whose numbers are all finite, or throw a DotspecError whose
 * message is one line naming the table and, for a row, the line — never another exception, a hang
 * or NaN. Expected values are by construction of the inputs (closed form: the numbers written in
 * the generated tables), with no outside reference.
 */
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseMaterialJson, parseOpticalTable, parseSizeMeta, readOpticalFile, readSizeMetaFile } from "../../lib/index.ts";
import { decodeTextBytes } from "../../lib/io/decodeTextBytes.ts";
import { joinBytes, outcomeOf, utf16Bytes, utf8Bytes } from "../helpers/fuzz.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const META = "META.csv";
const OPTICAL = "optical.csv";
/** Row errors: each names its line. */
const ROW_CODES = ["io/ragged-row", "io/meta-file", "io/meta-duplicate", "io/meta-dot", "io/meta-size", "io/meta-eta", "io/not-a-number", "io/optical-size", "io/optical-peak", "io/duplicate-column"];
const meta = (text: string) => () => parseSizeMeta(text, META);
const optical = (text: string) => () => parseOpticalTable(text, OPTICAL);
const metaRules = { source: META, lineCodes: ROW_CODES };
const opticalRules = { source: OPTICAL, lineCodes: ROW_CODES };

/** A good size table of `rows` rows (two curves per dot), with the given number formatter. */
function metaText(rows: number, format: (x: number) => string = String, delimiter = ",", eol = "\n"): string {
  const lines = ["# size table", ["file", "dot", "radius_nm", "eta", "notes"].join(delimiter)];
  for (let i = 0; i < rows; i++) lines.push([`c-${i}.csv`, `D-${i >> 1}`, format(1 + 0.25 * (i >> 1)), format(0.8), i % 3 ? "" : "ok"].join(delimiter));
  return lines.join(eol) + eol;
}

/** A good optical table of `rows` rows. */
function opticalText(rows: number, format: (x: number) => string = String, delimiter = ",", eol = "\n"): string {
  const lines = [["radius_nm", "peak_ev_1", "peak_ev_2"].join(delimiter)];
  for (let i = 0; i < rows; i++) lines.push([format(1 + 0.25 * i), format(2.5 - 0.05 * i), format(3.2 - 0.05 * i)].join(delimiter));
  return lines.join(eol) + eol;
}

const numberCell = fc.oneof(
  fc.double().map(String),
  fc.tuple(fc.double({ min: -1e308, max: 1e308, noNaN: true }), fc.integer({ min: 0, max: 20 })).map(([x, d]) => x.toExponential(d)),
  fc.constantFrom("1e309", "-1e309", "1e-320", "0x10", "0b11", "1,5", "−2.5", "NaN", "Infinity", "", "-", ".", "1e", "\"2\"", "\"1,5\""),
  fc.integer().map(String),
);
const textCell = fc.oneof(
  fc.constantFrom("a.csv", "../up.csv", "/abs.csv", "C:\\x.csv", "sub\\b.csv", "./c.csv", "a/../../d.csv", "QD-1", "", "\"q,uoted\"", "\"\"\"\"", "__proto__", "constructor"),
  fc.string({ maxLength: 12 }),
);
const headerWords = fc.constantFrom("file", "dot", "radius_nm", "diameter_nm", "eta", "notes", "peak_ev_1", "peak_ev_2", "peak", "FILE", "Radius_NM", "x", "", "__proto__");
const tableLine = fc.oneof(
  fc.array(fc.oneof(numberCell, textCell), { minLength: 1, maxLength: 6 }).chain((cells) => fc.constantFrom(",", ";", "\t").map((d) => cells.join(d))),
  fc.array(headerWords, { minLength: 1, maxLength: 6 }).map((w) => w.join(",")),
  fc.constantFrom("# comment", "", "file,dot,radius_nm", "radius_nm,peak_ev_1", "a.csv,QD-1,2", "2,2.1,3.0"),
  fc.string({ maxLength: 40 }),
);

describe("parseSizeMeta(text) and parseOpticalTable(text) on random text", () => {
  it("return finite rows or throw a one-line DotspecError naming the table (and the line of a row) (1,500 tables of random lines each)", () => {
    fc.assert(
      fc.property(fc.array(tableLine, { maxLength: 25 }), fc.constantFrom("\n", "\r\n", "\r"), (lines, eol) => {
        const text = lines.join(eol);
        outcomeOf(meta(text), metaRules);
        outcomeOf(optical(text), opticalRules);
      }),
      { seed: 12101, numRuns: 1500 },
    );
  });

  it("the same after a good header (1,000 cases each): most rows then reach the row checks", () => {
    const codes = new Set<string>();
    fc.assert(
      fc.property(fc.array(tableLine, { maxLength: 10 }), (lines) => {
        codes.add(outcomeOf(meta("file,dot,radius_nm,eta,notes\n" + lines.join("\n")), metaRules));
        codes.add(outcomeOf(optical("radius_nm,peak_ev_1,peak_ev_2,notes\n" + lines.join("\n")), opticalRules));
      }),
      { seed: 12102, numRuns: 1000 },
    );
    // the row checks were reached (by construction: random rows under a good header)
    expect(codes.has("io/meta-size") || codes.has("io/not-a-number")).toBe(true);
  });

  it("the same on random bytes, decoded as the file readers decode them (2,000 byte strings, with and without a byte-order mark)", () => {
    const prefix = fc.constantFrom(Uint8Array.of(), Uint8Array.of(0xef, 0xbb, 0xbf), Uint8Array.of(0xff, 0xfe), Uint8Array.of(0xfe, 0xff), utf8Bytes("file,dot,radius_nm\n"));
    fc.assert(
      fc.property(prefix, fc.uint8Array({ maxLength: 300 }), (head, tail) => {
        const bytes = joinBytes(head, tail);
        outcomeOf(() => parseSizeMeta(decodeTextBytes(bytes, META).text, META), metaRules);
        outcomeOf(() => parseOpticalTable(decodeTextBytes(bytes, OPTICAL).text, OPTICAL), opticalRules);
      }),
      { seed: 12103, numRuns: 2000 },
    );
  });
});

describe("good tables damaged", () => {
  it("a good size table cut at every length reads or fails in one line (the whole table reads)", () => {
    const text = metaText(12);
    const codes = new Set<string>();
    for (let cut = 0; cut <= text.length; cut++) codes.add(outcomeOf(meta(text.slice(0, cut)), metaRules));
    // by construction: the whole table is good, the empty prefix has no header
    expect(outcomeOf(meta(text), metaRules)).toBe("ok");
    expect(codes.has("io/empty")).toBe(true);
  });

  it("a good optical table cut at every length reads or fails in one line", () => {
    const text = opticalText(10);
    for (let cut = 0; cut <= text.length; cut++) outcomeOf(optical(text.slice(0, cut)), opticalRules);
    expect(outcomeOf(optical(text), opticalRules)).toBe("ok");
  });

  it("a character replaced or inserted anywhere (800 cases each)", () => {
    const m = metaText(10);
    const o = opticalText(10);
    fc.assert(
      fc.property(fc.nat({ max: 10_000 }), fc.string({ minLength: 1, maxLength: 3, unit: "binary" }), fc.boolean(), (at, s, replace) => {
        const edit = (t: string) => t.slice(0, at % t.length) + s + t.slice((at % t.length) + (replace ? 1 : 0));
        outcomeOf(meta(edit(m)), metaRules);
        outcomeOf(optical(edit(o)), opticalRules);
      }),
      { seed: 12104, numRuns: 800 },
    );
  });

  it("huge and tiny numbers (10⁻³²⁰ … 10³⁰⁰) in every number cell give finite rows or a one-line refusal (400 scales)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -320, max: 300 }), fc.integer({ min: 0, max: 17 }), (exp, digits) => {
        const scale = Number(`1e${exp}`);
        outcomeOf(meta(metaText(6, (x) => (x * scale).toExponential(digits))), metaRules);
        outcomeOf(optical(opticalText(6, (x) => (x * scale).toExponential(digits))), opticalRules);
      }),
      { seed: 12105, numRuns: 400 },
    );
  });
});

describe("encodings and layouts a table may come in (through the file readers)", () => {
  const dir = tempDir("dotspec-tables-");
  for (let i = 0; i < 8; i++) writeFileSync(join(dir, `c-${i}.csv`), "");
  const plainMeta = metaText(8);
  const plainOptical = opticalText(6);
  const expectedMeta = parseSizeMeta(plainMeta, META).map(({ file, dot, radiusNM, eta, notes }) => ({ file, dot, radiusNM, eta, notes }));
  const expectedOptical = parseOpticalTable(plainOptical, OPTICAL).map(({ radiusNM, peaksEV }) => ({ radiusNM, peaksEV }));
  const decimalComma = (x: number) => String(x).replace(".", ",");
  const cases: [string, string, string, (t: string) => Uint8Array][] = [
    ["UTF-8 with a byte-order mark", plainMeta, plainOptical, (t) => joinBytes(Uint8Array.of(0xef, 0xbb, 0xbf), utf8Bytes(t))],
    ["UTF-16 LE with a byte-order mark", plainMeta, plainOptical, (t) => utf16Bytes(t, false)],
    ["UTF-16 BE with a byte-order mark", plainMeta, plainOptical, (t) => utf16Bytes(t, true)],
    ["CRLF line ends", plainMeta, plainOptical, (t) => utf8Bytes(t.replace(/\n/g, "\r\n"))],
    ["decimal commas with semicolons", metaText(8, decimalComma, ";"), opticalText(6, decimalComma, ";"), utf8Bytes],
    ["decimal commas with tabs", metaText(8, decimalComma, "\t"), opticalText(6, decimalComma, "\t"), utf8Bytes],
  ];
  it.each(cases)("reads %s as the plain table", (name, metaBody, opticalBody, encode) => {
    const m = join(dir, `meta-${name.replace(/\W+/g, "-")}.csv`);
    const o = join(dir, `optical-${name.replace(/\W+/g, "-")}.csv`);
    writeFileSync(m, encode(metaBody));
    writeFileSync(o, encode(opticalBody));
    // by construction: the same rows as the plain UTF-8 table
    expect(readSizeMetaFile(m, dir).map(({ file, dot, radiusNM, eta, notes }) => ({ file, dot, radiusNM, eta, notes }))).toEqual(expectedMeta);
    expect(readOpticalFile(o).map(({ radiusNM, peaksEV }) => ({ radiusNM, peaksEV }))).toEqual(expectedOptical);
  });

  it("reads a Latin-1 µ (byte B5) in a note as µ", () => {
    const m = join(dir, "meta-latin1.csv");
    writeFileSync(m, joinBytes(utf8Bytes("file,dot,radius_nm,notes\nc-0.csv,D-0,2,tip 5 "), Uint8Array.of(0xb5), utf8Bytes("m\n")));
    // closed form: Windows-1252 byte B5 is U+00B5
    const warnings: string[] = [];
    expect(readSizeMetaFile(m, dir, { onWarning: (w) => warnings.push(w) })[0].notes).toBe("tip 5 \u00b5m");
    // and the reader says how it read the table, naming it (the same table in UTF-8 says nothing)
    expect(warnings).toEqual([`${m}: ${decodeTextBytes(Uint8Array.of(0xb5), m).warning}`]);
    const o = join(dir, "optical-latin1.csv");
    writeFileSync(o, joinBytes(utf8Bytes("radius_nm,peak_ev_1,notes\n2,2.5,"), Uint8Array.of(0xb5), utf8Bytes("\n")));
    const opticalWarnings: string[] = [];
    readOpticalFile(o, { onWarning: (w) => opticalWarnings.push(w) });
    expect(opticalWarnings.length).toBe(1);
    const quiet: string[] = [];
    const utf8 = join(dir, "meta-utf8.csv");
    writeFileSync(utf8, utf8Bytes("file,dot,radius_nm,notes\nc-0.csv,D-0,2,tip 5 \u00b5m\n"));
    readSizeMetaFile(utf8, dir, { onWarning: (w) => quiet.push(w) });
    expect(quiet).toEqual([]);
  });

  it("refuses NUL bytes outside UTF-16 with io/binary naming the file", () => {
    const m = join(dir, "meta-nul.csv");
    writeFileSync(m, joinBytes(utf8Bytes("file,dot,radius_nm\nc-0.csv,D-0,2"), Uint8Array.of(0), utf8Bytes("\n")));
    expect(outcomeOf(() => readSizeMetaFile(m, dir), { source: m })).toBe("io/binary");
    expect(outcomeOf(() => readOpticalFile(m), { source: m })).toBe("io/binary");
  });

  it("reads lines of 100,000 characters (a long note) and refuses a long bad cell in one short line", () => {
    const long = "n".repeat(100_000);
    expect(parseSizeMeta(`file,dot,radius_nm,notes\na.csv,D,2,${long}\n`, META)[0].notes!.length).toBe(100_000);
    const err = outcomeOf(meta(`file,dot,radius_nm\na.csv,D,${"9".repeat(100_000)}x\n`), metaRules);
    expect(err).toBe("io/not-a-number");
  });

  it("reads a 1,000,000-row size table and a 1,000,000-row optical table (one test each; not timed)", () => {
    const rows = 1_000_000;
    const m: string[] = ["file,dot,diameter_nm"];
    for (let i = 0; i < rows; i++) m.push(`c-${i}.csv,D-${i},${(2 + (i % 1000) / 100).toFixed(2)}`);
    const got = parseSizeMeta(m.join("\n"), META);
    // by construction: one row per line; the last radius is half its diameter 2 + 999/100
    expect(got.length).toBe(rows);
    expect(got[rows - 1].radiusNM).toBeCloseTo((2 + 999 / 100) / 2, 12);
    const o: string[] = ["radius_nm,peak_ev_1"];
    for (let i = 0; i < rows; i++) o.push(`${(1 + i / rows).toFixed(7)},${(2 + (i % 100) / 100).toFixed(2)}`);
    expect(parseOpticalTable(o.join("\n"), OPTICAL).length).toBe(rows);
  }, 60_000);
});

describe("parseMaterialJson(text): the material file of a size series", () => {
  const MATERIAL = "material.json";
  const value = fc.oneof(fc.double(), fc.constantFrom(0, -1, 1e-320, 1e308, 0.1, 1, 10), fc.string({ maxLength: 6 }), fc.constantFrom(null, true, [], {}));
  const keys = fc.constantFrom("base", "electronMassE", "holeMassE", "epsilonR", "bulkGapEV", "name", "x", "__proto__");
  it("random JSON text, and objects of random material fields: a material with finite numbers or a one-line error naming the file (1,500 cases)", () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string({ maxLength: 40 }),
          fc.json(),
          fc.dictionary(keys, value, { maxKeys: 5 }).map((o) => JSON.stringify({ base: "InP", ...o })),
          fc.dictionary(keys, value, { maxKeys: 5 }).map((o) => JSON.stringify(o, null, 2).slice(0, 30)),
        ),
        (text) => {
          outcomeOf(() => parseMaterialJson(text, MATERIAL), { source: MATERIAL, lineCodes: ["io/invalid-json"] });
        },
      ),
      { seed: 12106, numRuns: 1500 },
    );
  });
});
