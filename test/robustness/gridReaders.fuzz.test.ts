/**
 * The grid readers under hostile input (fast-check, fixed seeds): the NPY header parser, the
 * sidecar validator, the NPY reader on damaged files and the long-table reader return a cube whose
 * numbers are all finite, or throw a DotspecError whose message is one line naming the file (and,
 * for a row, its line) — never another exception, a hang, an allocation the machine cannot make,
 * or NaN. Expected values are by construction of the inputs (closed form: the numbers written into
 * the generated files); the NPY layout follows NumPy Enhancement Proposal 1 ("A simple file format
 * for NumPy arrays").
 */
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseGridSidecar, parseGridTable, parseNpyHeader, readGridFile } from "../../lib/index.ts";
import { readNpyGrid } from "../../lib/io/readNpyGrid.ts";
import type { GridCube } from "../../lib/grid/gridCube.ts";
import { expectFiniteNumbers, joinBytes, outcomeOf, utf16Bytes, utf8Bytes } from "../helpers/fuzz.ts";
import { removeTempDirs, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const NPY = "grid.npy";
const TABLE = "grid.csv";
const FIXTURES = new URL("../fixtures/io/grid/", import.meta.url).pathname;
const tableRules = { source: TABLE, lineCodes: ["io/ragged-row"] };

/** The cube's numbers are finite and its shape matches its axes. */
function checkCube(cube: GridCube): void {
  expect(cube.currentA.length).toBe(cube.xNM.count * cube.yNM.count * cube.biasV.count);
  expectFiniteNumbers({ currentA: cube.currentA, x: cube.xNM, y: cube.yNM, b: cube.biasV }, "cube");
}

/** A long table over nx × ny pixels and nb biases, current I = x·y·V (pA), with the given formatter. */
function tableText(nx: number, ny: number, nb: number, format: (x: number) => string = String, delimiter = ",", eol = "\n"): string {
  const lines = [["x (nm)", "y (nm)", "bias (V)", "current (pA)"].join(delimiter)];
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) for (let k = 0; k < nb; k++) {
    const x = 0.5 * i, y = 0.5 * j, v = -1 + (2 * k) / Math.max(1, nb - 1);
    lines.push([x, y, v, x * y * v].map(format).join(delimiter));
  }
  return lines.join(eol) + eol;
}

describe("parseNpyHeader(bytes) and parseGridSidecar(value)", () => {
  it("random bytes, and random bytes after the magic string: a header or a one-line error naming the file (3,000 cases)", () => {
    const magic = fc.constantFrom(Uint8Array.of(), Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59), Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0), Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 3, 0, 40, 0, 0, 0));
    fc.assert(
      fc.property(magic, fc.uint8Array({ maxLength: 200 }), (head, tail) => {
        outcomeOf(() => parseNpyHeader(joinBytes(head, tail), NPY), { source: NPY });
      }),
      { seed: 12301, numRuns: 3000 },
    );
  });

  it("random header dictionaries: a header with whole, non-negative shape entries or a one-line error (1,500 cases)", () => {
    const entry = fc.oneof(fc.nat().map(String), fc.constantFrom("1e3", "-1", "2L", "1.5", "", " ", "1e400", "0x10", "9007199254740993"));
    const dict = fc.record({
      descr: fc.constantFrom("<f4", ">f8", "|u1", "<i4", "=f8", "<f2", "", "'"),
      order: fc.constantFrom("True", "False", "true", "0"),
      shape: fc.array(entry, { maxLength: 5 }),
    }).map(({ descr, order, shape }) => `{'descr': '${descr}', 'fortran_order': ${order}, 'shape': (${shape.join(", ")}), }`);
    fc.assert(
      fc.property(dict, fc.constantFrom(1, 2, 3), (text, major) => {
        const body = utf8Bytes(text.padEnd(((text.length + 20) >> 4) << 4) + "\n");
        const len = major === 1 ? Uint8Array.of(body.length & 255, body.length >> 8) : Uint8Array.of(body.length & 255, body.length >> 8, 0, 0);
        const bytes = joinBytes(Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, major, 0), len, body);
        outcomeOf(() => parseNpyHeader(bytes, NPY), { source: NPY }, (h) => {
          for (const n of h.shape) expect(Number.isSafeInteger(n) && n >= 0).toBe(true);
        });
      }),
      { seed: 12302, numRuns: 1500 },
    );
  });

  it("random sidecars: axes of finite numbers and whole counts, or a one-line error naming the sidecar (2,000 values)", () => {
    const num = fc.oneof(fc.double(), fc.constantFrom(0, 1, 16, 0.5, -1, 1e308, 1e-320, 2 ** 53, 1.5), fc.integer());
    const axis = fc.oneof(fc.tuple(num, num, num), fc.array(num, { maxLength: 4 }), fc.constantFrom(null, "0,1,2", {}));
    const value = fc.oneof(
      fc.record({ xNM: axis, yNM: axis, biasV: axis, currentUnit: fc.constantFrom("A", "pA", "µA", "uA", "nA", "mV", "", "kA", 1) }, { requiredKeys: [] }),
      fc.jsonValue(),
    );
    fc.assert(
      fc.property(value, (v) => {
        outcomeOf(() => parseGridSidecar(v, "grid.json"), { source: "grid.json" });
      }),
      { seed: 12303, numRuns: 2000 },
    );
  });
});

describe("readNpyGrid(path) on damaged files", () => {
  const dir = tempDir("dotspec-npy-");
  const good = readFileSync(join(FIXTURES, "le-f4-v1.npy"));
  const sidecar = JSON.parse(readFileSync(join(FIXTURES, "sidecar.json"), "utf8"));

  it("a good file cut at every length, or with a byte replaced anywhere (300 cases): a cube of finite numbers or a one-line error", () => {
    const path = join(dir, "cut.npy");
    for (let cut = 0; cut < good.length; cut += 3) {
      writeFileSync(path, good.subarray(0, cut));
      expect(outcomeOf(() => readNpyGrid(path, sidecar), { source: path })).not.toBe("ok");
    }
    fc.assert(
      fc.property(fc.nat({ max: good.length - 1 }), fc.integer({ min: 0, max: 255 }), (at, byte) => {
        const bytes = Uint8Array.from(good);
        bytes[at] = byte;
        writeFileSync(path, bytes);
        // A changed data byte may make a NaN or an infinity: those are data, the reader must not crash.
        outcomeOf(() => readNpyGrid(path, sidecar), { source: path }, (r) => expect(r.cube.currentA.length).toBe(30));
      }),
      { seed: 12304, numRuns: 300 },
    );
  });

  it("a header announcing a huge shape is refused before anything is allocated (closed form: 10¹² samples ≠ the file's size)", () => {
    const header = "{'descr': '<f8', 'fortran_order': False, 'shape': (1000000, 1000000, 1), }".padEnd(111) + "\n";
    const path = join(dir, "huge.npy");
    writeFileSync(path, joinBytes(Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0, header.length, 0), utf8Bytes(header), new Uint8Array(64)));
    const side = { xNM: [0, 1, 1_000_000], yNM: [0, 1, 1_000_000], biasV: [0, 1, 1], currentUnit: "A" };
    expect(outcomeOf(() => readNpyGrid(path, side), { source: path })).toBe("io/npy-size");
  });
});

describe("parseGridTable(text): the long table", () => {
  const cell = fc.oneof(
    fc.double().map(String),
    fc.constantFrom("0", "0.5", "1", "-1", "1e308", "-1e308", "1e-320", "1,5", "NaN", "inf", "", "x", "1e400"),
    fc.integer({ min: -5, max: 5 }).map(String),
  );
  const line = fc.oneof(
    fc.array(cell, { minLength: 1, maxLength: 5 }).chain((c) => fc.constantFrom(",", ";", "\t", " ").map((d) => c.join(d))),
    fc.constantFrom("x (nm),y (nm),bias (V),current (pA)", "x (nm);y (nm);bias (mV);current (nA)", "x,y,bias,current", "# comment", "% c", "", "x (pm),y (nm),bias (V),current (A)"),
    fc.string({ maxLength: 30 }),
  );

  it("random tables: a cube of finite numbers or a one-line error naming the table (and the line of a row) (1,500 tables)", () => {
    fc.assert(
      fc.property(fc.array(line, { maxLength: 25 }), fc.constantFrom("\n", "\r\n", "\r"), (lines, eol) => {
        outcomeOf(() => parseGridTable(lines.join(eol), { source: TABLE }), tableRules, (r) => checkCube(r.cube));
      }),
      { seed: 12305, numRuns: 1500 },
    );
  });

  it("random rows under a good header (1,500 tables): the same", () => {
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 4, maxLength: 4 }).map((c) => c.join(",")), { maxLength: 30 }), (rows) => {
        outcomeOf(() => parseGridTable("x (nm),y (nm),bias (V),current (pA)\n" + rows.join("\n"), { source: TABLE }), tableRules, (r) => checkCube(r.cube));
      }),
      { seed: 12306, numRuns: 1500 },
    );
  });

  it("positions spread so far that the regular grid would have 10¹² points are refused, not allocated", () => {
    const text = "x (nm),y (nm),bias (V),current (A)\n0,0,0,1\n1e-6,0,0,1\n1,0,0,1\n0,1e-6,0,1\n0,1,0,1\n0,0,1,1\n";
    expect(outcomeOf(() => parseGridTable(text, { source: TABLE }), tableRules)).toBe("io/not-grid");
    const wide = "x (nm),y (nm),bias (V),current (A)\n-1e308,0,0,1\n1e308,0,0,1\n0,0,0,1\n";
    expect(outcomeOf(() => parseGridTable(wide, { source: TABLE }), tableRules)).toBe("io/not-grid");
  });

  it("a good table cut at every length, or with a character replaced or inserted (600 cases)", () => {
    const text = tableText(3, 2, 5);
    for (let cut = 0; cut <= text.length; cut += 2) outcomeOf(() => parseGridTable(text.slice(0, cut), { source: TABLE }), tableRules, (r) => checkCube(r.cube));
    fc.assert(
      fc.property(fc.nat({ max: text.length - 1 }), fc.string({ minLength: 1, maxLength: 3, unit: "binary" }), fc.boolean(), (at, s, replace) => {
        const t = text.slice(0, at) + s + text.slice(replace ? at + 1 : at);
        outcomeOf(() => parseGridTable(t, { source: TABLE }), tableRules, (r) => checkCube(r.cube));
      }),
      { seed: 12307, numRuns: 600 },
    );
  });

  it("huge and tiny magnitudes (10⁻³⁰⁰ … 10³⁰⁰) of positions, bias and current (300 scales)", () => {
    fc.assert(
      fc.property(fc.integer({ min: -300, max: 300 }), fc.integer({ min: 1, max: 17 }), (exp, digits) => {
        const scale = Number(`1e${exp}`);
        outcomeOf(() => parseGridTable(tableText(3, 2, 5, (x) => (x * scale).toExponential(digits)), { source: TABLE }), tableRules, (r) => checkCube(r.cube));
      }),
      { seed: 12308, numRuns: 300 },
    );
  });
});

describe("readGridFile(path): encodings and sizes of a long table", () => {
  const dir = tempDir("dotspec-gridtable-");
  const plain = tableText(3, 2, 5);
  const expected = parseGridTable(plain, { source: TABLE }).cube;
  const decimalComma = (x: number) => String(x).replace(".", ",");
  it.each([
    ["UTF-8 with a byte-order mark", joinBytes(Uint8Array.of(0xef, 0xbb, 0xbf), utf8Bytes(plain))],
    ["UTF-16 LE with a byte-order mark", utf16Bytes(plain, false)],
    ["UTF-16 BE with a byte-order mark", utf16Bytes(plain, true)],
    ["CRLF line ends", utf8Bytes(plain.replace(/\n/g, "\r\n"))],
    ["decimal commas with semicolons", utf8Bytes(tableText(3, 2, 5, decimalComma, ";"))],
    ["a Latin-1 µ in the current unit", joinBytes(utf8Bytes("x (nm),y (nm),bias (V),current ("), Uint8Array.of(0xb5), utf8Bytes("A)\n" + plain.split("\n").slice(1).map((l) => l.replace(/[^,]*$/, (c) => (c === "" ? "" : String(Number(c) * 1e-6)))).join("\n")))],
  ])("reads %s as the plain table", (name, bytes) => {
    const path = join(dir, `${name.replace(/\W+/g, "-")}.csv`);
    writeFileSync(path, bytes);
    const { cube } = readGridFile(path);
    // by construction: the same axes and currents as the plain UTF-8 table (1 pA = 10⁻⁶ µA)
    expect([cube.xNM, cube.yNM, cube.biasV]).toEqual([expected.xNM, expected.yNM, expected.biasV]);
    for (let i = 0; i < expected.currentA.length; i++) expect(Math.abs(cube.currentA[i] - expected.currentA[i])).toBeLessThanOrEqual(1e-15 * Math.abs(expected.currentA[i]) + 1e-30);
  });

  it("refuses NUL bytes outside UTF-16 with io/binary naming the file", () => {
    const path = join(dir, "nul.csv");
    writeFileSync(path, joinBytes(utf8Bytes(plain.slice(0, 50)), Uint8Array.of(0), utf8Bytes(plain.slice(50))));
    expect(outcomeOf(() => readGridFile(path), { source: path })).toBe("io/binary");
  });

  it("reads lines of 100,000 characters (an ignored column) and a 1,000,000-row table (not timed)", () => {
    const pad = "7".repeat(100_000);
    const long = join(dir, "long.csv");
    writeFileSync(long, plain.split("\n").map((l, i) => (l === "" ? l : `${l},${i === 0 ? "note" : pad}`)).join("\n"));
    expect(readGridFile(long).cube.currentA.length).toBe(30);
    const big = join(dir, "big.csv");
    writeFileSync(big, tableText(50, 50, 400));
    const { cube } = readGridFile(big);
    // by construction: 50 × 50 pixels × 400 biases = 1,000,000 rows, I = x·y·V in pA at the last sample
    expect(cube.currentA.length).toBe(1_000_000);
    expect(cube.currentA[999_999]).toBeCloseTo(24.5 * 24.5 * 1 * 1e-12, 20);
  }, 60_000);
});
