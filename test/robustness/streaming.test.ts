/**
 * Bounded memory on big inputs: the line reader that streams a file in chunks gives exactly the
 * lines of the whole text (closed form: `String.prototype.split(/\r\n|\r|\n/)` on the decoded text);
 * the streamed curve reader gives exactly what the whole-text importer gives (the importer itself is
 * the reference), in any chunk and batch size; and files of 40 MB are read by the Node readers in a
 * process whose JavaScript heap is capped at 96 MB, of which the loaded library takes about 45 MB
 * (derived: the whole text as one string, 40 MB, and a string per line would not fit in the rest). Expected values otherwise by construction of the generated files.
 */
import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, statSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parseCurveBytes, readCurveFile, readGridFile, STREAM_CURVE_FILE_BYTES } from "../../lib/index.ts";
import { FILE_LINES_DEFAULTS, forEachFileLine, withFileEncoding } from "../../lib/io/fileLines.ts";
import { CURVE_STREAM_DEFAULTS, readCurveStream } from "../../lib/io/readCurveStream.ts";
import { GRID_TABLE_ROWS_DEFAULTS } from "../../lib/io/gridTableRows.ts";
import { isDotspecError } from "../../lib/util/errors.ts";
import { joinBytes, utf16Bytes, utf8Bytes } from "../helpers/fuzz.ts";
import { removeTempDirs, run, tempDir } from "../cli/harness.ts";

afterAll(removeTempDirs);

const dir = tempDir("dotspec-stream-");
let k = 0;
const fileOf = (bytes: Uint8Array, ext = ".csv") => {
  const p = join(dir, `f-${k++}${ext}`);
  writeFileSync(p, bytes);
  return p;
};

describe("forEachFileLine(path): the lines of a file, read in chunks", () => {
  it("gives exactly text.split(/\\r\\n|\\r|\\n/) in UTF-8, UTF-16 LE/BE and Windows-1252, at any chunk size (400 files)", () => {
    const piece = fc.oneof(fc.constantFrom("\n", "\r", "\r\n", "\r\r\n", "a", "1,2", "µ", "é", "日本", "😀", " ", ""), fc.string({ maxLength: 6 }));
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 40 }), fc.constantFrom("utf-8", "utf-16le", "utf-16be", "bom8"), fc.integer({ min: 16, max: 70 }), (parts, enc, chunkBytes) => {
        const text = parts.join("").replace(/\0/g, "");
        const bytes = enc === "utf-16le" ? utf16Bytes(text, false) : enc === "utf-16be" ? utf16Bytes(text, true) : enc === "bom8" ? joinBytes(Uint8Array.of(0xef, 0xbb, 0xbf), utf8Bytes(text)) : utf8Bytes(text);
        const path = fileOf(bytes);
        const got: string[] = [];
        const { encoding } = withFileEncoding(path, (e) => {
          got.length = 0;
          forEachFileLine(path, e, (line, i) => {
            expect(i).toBe(got.length);
            got.push(line);
          }, { chunkBytes });
        });
        // closed form: the lines of the whole decoded text
        expect(got).toEqual(text.split(/\r\n|\r|\n/));
        expect(encoding).toBe(enc === "utf-16le" || enc === "utf-16be" ? enc : "utf-8");
      }),
      { seed: 12401, numRuns: 400 },
    );
  });

  it("reads invalid UTF-8 again as Windows-1252 (byte B5 is µ), and refuses a NUL byte with io/binary", () => {
    const latin1 = fileOf(joinBytes(utf8Bytes("a\n5 "), Uint8Array.of(0xb5), utf8Bytes("m\n")));
    const lines: string[] = [];
    const r = withFileEncoding(latin1, (e) => {
      lines.length = 0;
      forEachFileLine(latin1, e, (l) => void lines.push(l), { chunkBytes: 16 });
    });
    expect(r.encoding).toBe("windows-1252");
    expect(lines).toEqual(["a", "5 \u00b5m", ""]);
    const nul = fileOf(joinBytes(utf8Bytes("a,b\n"), Uint8Array.of(0), utf8Bytes("\n")));
    expect(() => forEachFileLine(nul, "utf-8", () => {})).toThrow(expect.objectContaining({ code: "io/binary" }));
  });

  it("FILE_LINES_DEFAULTS, CURVE_STREAM_DEFAULTS and GRID_TABLE_ROWS_DEFAULTS are as documented (locked)", () => {
    // common practice (no source): 1 MiB reads; batches of 2^12 rows (short-lived, so collected young); the importer's 50-line sample and 10-row look at a row-number column
    expect(FILE_LINES_DEFAULTS).toEqual({ chunkBytes: 1024 * 1024 });
    expect(CURVE_STREAM_DEFAULTS).toEqual({ batchRows: 4096, headDataRows: 10, maxHeadLines: 200_000, keptBadRows: 10_000 });
    expect(GRID_TABLE_ROWS_DEFAULTS).toEqual({ sampleLines: 50, headLines: 100_000, maxDistinct: 1_000_000 });
    for (const o of [FILE_LINES_DEFAULTS, CURVE_STREAM_DEFAULTS, GRID_TABLE_ROWS_DEFAULTS]) expect(Object.isFrozen(o)).toBe(true);
  });
});

/** The outcome of a read: the parsed curve, or the error's code and message. */
function outcome(read: () => unknown): unknown {
  try {
    return read();
  } catch (e) {
    if (!isDotspecError(e)) throw e;
    return { code: e.code, message: e.message };
  }
}

describe("readCurveStream(path) against the whole-text importer", () => {
  const cell = (x: number, digits: number, comma: boolean) => (comma ? x.toFixed(digits).replace(".", ",") : x.toPrecision(digits + 1));
  const file = fc.record({
    rows: fc.integer({ min: 40, max: 160 }),
    header: fc.constantFrom("bias (mV),current (pA)", "V,I", "", "bias (V),current (A),dI/dV (S)", "index,bias (V),current (nA)"),
    preamble: fc.constantFrom([], ["Instrument export", "date = 2026-01-01"], ["# eta: 0.8", "% T: 4.5 K"]),
    comments: fc.array(fc.tuple(fc.nat(), fc.constantFrom("# note: mid", "# eta: 0.7", "% setpoint = 1 nA", "#", "% plain words")), { maxLength: 4 }),
    trailing: fc.boolean(),
    comma: fc.boolean(),
    bad: fc.array(fc.tuple(fc.nat(), fc.constantFrom("NaN", "", "x", "1,2,3,4,5", "inf")), { maxLength: 3 }),
    blank: fc.array(fc.nat(), { maxLength: 3 }),
    back: fc.boolean(),
    eol: fc.constantFrom("\n", "\r\n"),
    digits: fc.integer({ min: 2, max: 8 }),
  });

  it("gives the same curve and record, or the same error, at small chunk and batch sizes (150 files)", () => {
    fc.assert(
      fc.property(file, fc.integer({ min: 16, max: 300 }), fc.integer({ min: 1, max: 40 }), (f, chunkBytes, batchRows) => {
        const delim = f.comma ? ";" : ",";
        const cols = f.header === "" ? 2 : f.header.split(",").length;
        const lines: string[] = [...f.preamble];
        if (f.header) lines.push(f.header.replace(/,/g, delim));
        const n = f.rows;
        for (let i = 0; i < n; i++) {
          const t = f.back && i >= n / 2 ? n - 1 - i : i;
          const v = -1 + (2 * t) / (n - 1);
          const vals = cols === 3 && f.header.startsWith("index") ? [i, v, Math.sinh(3 * v)] : [v, Math.sinh(3 * v), Math.cosh(3 * v)].slice(0, cols);
          lines.push(vals.map((x) => cell(x, f.digits, f.comma)).join(delim) + (f.trailing ? delim : ""));
        }
        const at = (p: number) => 1 + (p % (lines.length - 1));
        for (const [p, text] of f.bad) lines[at(p)] = text;
        for (const [p, c] of f.comments) lines.splice(at(p), 0, c);
        for (const p of f.blank) lines.splice(at(p), 0, "");
        const text = lines.join(f.eol) + f.eol;
        const path = fileOf(utf8Bytes(text));
        const whole = outcome(() => parseCurveBytes(utf8Bytes(text), { source: path }));
        const streamed = outcome(() => readCurveStream(path, {}, { chunkBytes, batchRows }));
        // reference: the whole-text importer on the same bytes
        expect(streamed).toEqual(whole);
      }),
      { seed: 12402, numRuns: 150 },
    );
  });

  it("reads a Latin-1 µ in a unit of a long file as the importer does (with its warning)", () => {
    const rows = Array.from({ length: 120 }, (_, i) => `${(-1 + i / 60).toFixed(4)},${(i * 0.01).toFixed(3)}`).join("\n");
    const bytes = joinBytes(utf8Bytes("bias (V),current ("), Uint8Array.of(0xb5), utf8Bytes("A)\n" + rows + "\n"));
    const path = fileOf(bytes);
    expect(outcome(() => readCurveStream(path, {}, { chunkBytes: 64, batchRows: 16 }))).toEqual(outcome(() => parseCurveBytes(bytes, { source: path })));
  });
});

/** Runs a script in a child Node process whose JavaScript heap is capped; returns its exit status and output. */
function capped(heapMB: number, script: string): { status: number | null; stdout: string; stderr: string } {
  const path = join(dir, `run-${k++}.mts`);
  writeFileSync(path, script);
  const r = spawnSync(process.execPath, [`--max-old-space-size=${heapMB}`, new URL("../../bin/run-ts.mjs", import.meta.url).pathname, path], { encoding: "utf8", timeout: 120_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("the Node readers on files of 40 MB, with the JavaScript heap capped at 96 MB (about 50 MB free after loading)", () => {
  const lib = new URL("../../lib/index.ts", import.meta.url).pathname;
  const HEAP_MB = 96;

  it("readCurveFile streams a 40 MB curve (1.6 million rows) with a 96 MB heap", () => {
    const path = join(dir, "long.csv");
    const rows = 1_600_000;
    const parts: string[] = ["# eta: 0.8", "bias (V),current (A)"];
    for (let i = 0; i < rows; i++) parts.push(`${(-2 + (4 * i) / (rows - 1)).toFixed(8)},${(1e-9 * Math.sinh((4 * i) / (rows - 1) - 2)).toExponential(6)}`);
    writeFileSync(path, parts.join("\n") + "\n");
    const r = capped(HEAP_MB, `import { readCurveFile } from ${JSON.stringify(lib)};
const { curve, record } = readCurveFile(${JSON.stringify(path)});
console.log(JSON.stringify({ n: curve.biasV.length, rows: record.dataRows, eta: curve.meta.metadata.eta, last: curve.biasV[curve.biasV.length - 1] }));`);
    expect(r.status, r.stderr.slice(-2000)).toBe(0);
    // by construction: one point per row, the last bias 2 V, the metadata line kept
    expect(JSON.parse(r.stdout)).toEqual({ n: rows, rows, eta: "0.8", last: 2 });
  }, 180_000);

  it("readGridFile streams a 40 MB long table (1.5 million rows) with a 96 MB heap", () => {
    const path = join(dir, "grid.csv");
    const parts: string[] = ["x (nm),y (nm),bias (V),current (pA)"];
    for (let j = 0; j < 30; j++) for (let i = 0; i < 50; i++) for (let b = 0; b < 1000; b++) parts.push(`${0.25 * i},${0.25 * j},${(-1 + b / 500).toFixed(3)},${(i * j * (b - 500) * 1e-3).toFixed(4)}`);
    writeFileSync(path, parts.join("\n") + "\n");
    const r = capped(HEAP_MB, `import { readGridFile } from ${JSON.stringify(lib)};
const { cube } = readGridFile(${JSON.stringify(path)});
console.log(JSON.stringify({ nx: cube.xNM.count, ny: cube.yNM.count, nb: cube.biasV.count, last: cube.currentA[cube.currentA.length - 1] }));`);
    expect(r.status, r.stderr.slice(-2000)).toBe(0);
    // by construction: 50 × 30 pixels × 1000 biases; the last current 49·29·499·10⁻³ pA
    const got = JSON.parse(r.stdout);
    expect([got.nx, got.ny, got.nb]).toEqual([50, 30, 1000]);
    expect(got.last).toBeCloseTo(49 * 29 * 499e-3 * 1e-12, 20);
  }, 180_000);
});

describe("progress while a big file is streamed", () => {
  const BIG_ROWS = 700_000;
  /** A sinh curve of BIG_ROWS rows, above the streaming threshold (written once). */
  const bigCurve = (): string => {
    const path = join(dir, "progress.csv");
    if (existsSync(path)) return path;
    const parts: string[] = ["bias (V),current (A)"];
    for (let i = 0; i < BIG_ROWS; i++) parts.push(`${(-2 + (4 * i) / (BIG_ROWS - 1)).toFixed(8)},${(1e-9 * Math.sinh((4 * i) / (BIG_ROWS - 1) - 2)).toExponential(6)}`);
    writeFileSync(path, parts.join("\n") + "\n");
    return path;
  };

  it("readCurveFile(path, options, onProgress) on a file over STREAM_CURVE_FILE_BYTES reports a rising fraction that ends at 1", () => {
    const path = bigCurve();
    const rows = BIG_ROWS;
    // by construction: the file is above the streaming threshold
    expect(statSync(path).size).toBeGreaterThan(STREAM_CURVE_FILE_BYTES);
    const seen: number[] = [];
    const { curve } = readCurveFile(path, {}, (f) => seen.push(f));
    expect(curve.biasV.length).toBe(rows);
    expect(seen.length).toBeGreaterThan(5);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
    expect(seen[seen.length - 1]).toBe(1);
  }, 120_000);

  it("dotspec analyze on a terminal draws the reading bar of a big file also when worker threads read it (--jobs 2)", async () => {
    const big = bigCurve();
    const small = join(dir, "small-one.csv");
    const rows = 2001;
    const parts: string[] = ["bias (V),current (A)"];
    for (let i = 0; i < rows; i++) parts.push(`${(-2 + (4 * i) / (rows - 1)).toFixed(6)},${(1e-9 * Math.sinh((4 * i) / (rows - 1) - 2)).toExponential(6)}`);
    writeFileSync(small, parts.join("\n") + "\n");
    for (const jobs of ["1", "2"]) {
      const r = await run(["analyze", big, small, "--json", "--jobs", jobs], { stderrTTY: true });
      // by construction (lib/cli/commands/analyze.ts): the bar is labelled "read FILE" and counts in %
      expect(r.stderr, `--jobs ${jobs}`).toContain("read progress.csv [");
      expect(r.stderr).toContain("%");
      expect(r.stderr).not.toContain("read small-one.csv");
      expect(r.stderr).toMatch(/2 done, 0 failed/);
    }
  }, 180_000);

  it("readGridFile(path, { onProgress }) on a long table reports a rising fraction over its two passes, ending at 1", () => {
    const path = join(dir, "progress-grid.csv");
    const parts: string[] = ["x (nm),y (nm),bias (V),current (A)"];
    for (let j = 0; j < 10; j++) for (let i = 0; i < 10; i++) for (let b = 0; b < 2001; b++) parts.push(`${i},${j},${(-1 + b * 0.001).toFixed(3)},${i * j * b * 1e-15}`);
    writeFileSync(path, parts.join("\n") + "\n");
    const seen: number[] = [];
    readGridFile(path, { onProgress: (f) => seen.push(f) });
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
    // closed form: the second pass starts at one half (the file is read twice)
    expect(seen.some((f) => f > 0.5)).toBe(true);
    expect(seen[seen.length - 1]).toBe(1);
  }, 120_000);
});
