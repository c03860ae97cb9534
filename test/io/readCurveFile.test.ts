// Reading curve files and listing folders. Expected values: by construction of the fixture files
// (test/fixtures/io, see its README) and of the temporary files written here; SI prefixes from the
// BIPM SI Brochure, 9th ed. (2019), Table 7; text encodings as defined by the WHATWG Encoding
// Standard (what TextDecoder implements).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { chmodSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync, copyFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, relative } from "node:path";
import { fileURLToPath } from "node:url";
import { expectClose } from "../helpers/expectClose.ts";
import { parseCurveText } from "../../lib/io/parse/index.ts";
import { listCurveFiles, readCurveFile, readCurveFileWithDigest } from "../../lib/io/readCurveFile.ts";
import { createHash } from "node:crypto";
import { errorOf } from "../helpers/errors.ts";

const FIXTURES = fileURLToPath(new URL("../fixtures/io/", import.meta.url));
const fixture = (name: string) => join(FIXTURES, name);
let tmp = "";

beforeAll(() => {
  tmp = mkdtempSync(join(tmpdir(), "dotspec-io-"));
});
afterAll(() => {
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});


describe("readCurveFile", () => {
  it("readCurveFile(path) gives the same result as parseCurveText on the file's text, with source = path", () => {
    for (const name of ["comma-si.csv", "semicolon-decimal-comma.csv", "tab-fwd-bwd.txt", "whitespace-metadata.dat", "there-and-back.csv", "didv.tsv"]) {
      const path = fixture(name);
      const got = readCurveFile(path);
      // reference: the pure parser on the same text
      expect(got).toEqual(parseCurveText(readFileSync(path, "utf8"), { source: path }));
      expect(got.curve.meta.source).toBe(path);
      expect(got.record.source).toBe(path);
    }
  });

  it("readCurveFile(relative path) keeps the path exactly as given", () => {
    const rel = relative(process.cwd(), fixture("comma-si.csv"));
    expect(readCurveFile(rel).curve.meta.source).toBe(rel);
  });

  it("readCurveFile reads each fixture layout to the values written in it", () => {
    // by construction of the fixtures; SI prefixes (BIPM SI Brochure, 9th ed.)
    const a = readCurveFile(fixture("comma-si.csv"));
    expect(Array.from(a.curve.biasV)).toEqual([-1, -0.5, 0, 0.5, 1]);
    expect(a.curve.meta.metadata).toEqual({ sample: "fixture A", temperature: "4.5 K" });
    const b = readCurveFile(fixture("semicolon-decimal-comma.csv"));
    expectClose(b.curve.biasV, [-0.1005, -0.05025, 0, 0.05025, 0.1005], { rtol: 1e-15 });
    expectClose(b.curve.currentA, [-201e-12, -100.5e-12, 0, 100.5e-12, 201e-12], { rtol: 1e-15 });
    const c = readCurveFile(fixture("tab-fwd-bwd.txt"));
    expect(c.record.sweeps).toBe(2);
    expectClose(c.curve.currentA, [-5e-12, -2.5e-12, 0, 2.5e-12, 5e-12], { rtol: 1e-15 });
    const d = readCurveFile(fixture("whitespace-metadata.dat"));
    expectClose(d.curve.currentA, [-3e-9, -1.5e-9, 0, 1.5e-9, 3e-9], { rtol: 1e-15 });
    const e = readCurveFile(fixture("headerless.dat"), { biasUnit: "mV", currentUnit: "pA" });
    expectClose(e.curve.biasV, [-0.3, -0.15, 0, 0.15, 0.3], { rtol: 1e-15 });
    expectClose(e.curve.currentA, [-60e-12, -30e-12, 0, 30e-12, 60e-12], { rtol: 1e-15 });
    const f = readCurveFile(fixture("there-and-back.csv"));
    expect(f.record.sweeps).toBe(2);
    const g = readCurveFile(fixture("didv.tsv"));
    expectClose(g.curve.didvS!, [4e-9, 2e-9, 1e-9, 2e-9, 4e-9], { rtol: 1e-15 });
  });

  it("readCurveFile(path) leaves the file's bytes and modification time unchanged, even read-only", () => {
    const path = join(tmp, "untouched.csv");
    copyFileSync(fixture("comma-si.csv"), path);
    chmodSync(path, 0o444);
    const before = statSync(path);
    const bytes = readFileSync(path);
    readCurveFile(path);
    readCurveFile(path, { delimiter: "," });
    const after = statSync(path);
    expect(readFileSync(path).equals(bytes)).toBe(true);
    expect(after.mtimeMs).toBe(before.mtimeMs);
    expect(after.size).toBe(before.size);
    expect(after.mode).toBe(before.mode);
  });

  it("readCurveFile reads a UTF-8 file with BOM and CRLF line ends", () => {
    const path = join(tmp, "bom-crlf.csv");
    writeFileSync(path, "\ufeffbias (mV),current (\u00b5A)\r\n0,0\r\n1,1\r\n2,2\r\n3,3\r\n4,4\r\n", "utf8");
    const r = readCurveFile(path);
    // SI prefixes (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.currentA[4], 4e-6, { rtol: 1e-15 });
    expect(r.record.columns[1].unit).toBe("\u00b5A");
  });

  it("readCurveFile reads UTF-16LE text with a byte-order mark", () => {
    const path = join(tmp, "utf16.txt");
    writeFileSync(path, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from("V (V)\tI (nA)\n0\t0\n1\t1\n2\t2\n3\t3\n4\t4\n", "utf16le")]));
    const r = readCurveFile(path);
    // SI prefixes (BIPM SI Brochure, 9th ed.)
    expectClose(r.curve.currentA[4], 4e-9, { rtol: 1e-15 });
  });

  it("readCurveFile reads a Latin-1 file (µ as byte 0xB5) with a warning", () => {
    const path = join(tmp, "latin1.csv");
    writeFileSync(path, Buffer.from("V (V),I (\xb5A)\n0,0\n1,1\n2,2\n3,3\n4,4\n", "latin1"));
    const r = readCurveFile(path);
    // WHATWG Encoding Standard: byte 0xB5 is U+00B5 in windows-1252
    expect(r.record.columns[1].unit).toBe("\u00b5A");
    expect(r.record.warnings[0]).toContain("not valid UTF-8");
  });

  it("readCurveFile throws io/binary for a file with NUL bytes", () => {
    const path = join(tmp, "binary.dat");
    writeFileSync(path, Buffer.from([0x00, 0x01, 0x02, 0x41, 0x00]));
    expect(errorOf(() => readCurveFile(path)).code).toBe("io/binary");
  });

  it("readCurveFile throws io/not-found naming the missing path", () => {
    const path = join(tmp, "no-such-file.csv");
    const e = errorOf(() => readCurveFile(path));
    expect(e.code).toBe("io/not-found");
    expect(e.message).toContain(path);
  });

  it("readCurveFile throws io/is-directory for a folder", () => {
    const e = errorOf(() => readCurveFile(FIXTURES));
    expect(e.code).toBe("io/is-directory");
    expect(e.message).toContain("listCurveFiles");
  });

  it.skipIf(process.getuid?.() === 0)("readCurveFile throws io/unreadable for a file without read permission", () => {
    const path = join(tmp, "locked.csv");
    writeFileSync(path, "V,I\n0,0\n");
    chmodSync(path, 0o000);
    expect(errorOf(() => readCurveFile(path)).code).toBe("io/unreadable");
  });

  it("readCurveFile passes parse errors through with the path in the message", () => {
    const path = join(tmp, "ragged.csv");
    writeFileSync(path, "V (V),I (A)\n0,0\n1,1,1\n");
    const e = errorOf(() => readCurveFile(path));
    expect(e.code).toBe("io/ragged-row");
    expect(e.message.startsWith(`${path}: line 3`)).toBe(true);
  });

  it("readCurveFile(path, {source}) is refused: the source is the path", () => {
    expect(errorOf(() => readCurveFile(fixture("comma-si.csv"), { source: "x" } as never)).code).toBe("options/unknown-key");
  });
});

describe("readCurveFileWithDigest", () => {
  it("gives readCurveFile's curve and record and the file's size and SHA-256 (reference: node:crypto over the file's bytes)", () => {
    for (const name of ["comma-si.csv", "whitespace-metadata.dat", "tab-fwd-bwd.txt"]) {
      const path = fixture(name);
      const bytes = readFileSync(path);
      const { parsed, input } = readCurveFileWithDigest(path);
      expect(parsed).toEqual(readCurveFile(path));
      expect(input).toEqual({ name: path, bytes: bytes.length, sha256: createHash("sha256").update(bytes).digest("hex") });
    }
  });

  it("throws what readCurveFile throws (io/not-found)", () => {
    expect(errorOf(() => readCurveFileWithDigest(join(tmp, "missing.csv"))).code).toBe("io/not-found");
  });
});

describe("listCurveFiles", () => {
  it("listCurveFiles([folder]) lists .csv .txt .dat .tsv files, sorted, skipping other files", () => {
    // by construction of test/fixtures/io (README.md and notes.md.bak are not curve files)
    expect(listCurveFiles([FIXTURES]).map((p) => relative(FIXTURES, p))).toEqual([
      "comma-si.csv",
      "didv.tsv",
      "headerless.dat",
      "semicolon-decimal-comma.csv",
      "tab-fwd-bwd.txt",
      "there-and-back.csv",
      "whitespace-metadata.dat",
    ]);
  });

  it("listCurveFiles matches extensions in any letter case, skips hidden files and sub-folders", () => {
    const dir = join(tmp, "folder");
    mkdirSync(join(dir, "sub.csv"), { recursive: true });
    for (const name of ["B.CSV", "a.txt", "c.Dat", "d.tsv", "e.json", ".hidden.csv", "._b.csv"]) writeFileSync(join(dir, name), "");
    // sorted by UTF-16 code units (uppercase before lowercase), by construction
    expect(listCurveFiles([dir])).toEqual(["B.CSV", "a.txt", "c.Dat", "d.tsv"].map((n) => join(dir, n)));
  });

  it("listCurveFiles keeps explicit files as given (any extension), in order, once each", () => {
    const readme = fixture("README.md");
    const csv = fixture("comma-si.csv");
    const got = listCurveFiles([readme, csv, FIXTURES]);
    expect(got.slice(0, 2)).toEqual([readme, csv]);
    expect(got.filter((p) => p.endsWith("comma-si.csv")).length).toBe(1);
  });

  it("listCurveFiles([empty folder]) is empty", () => {
    const dir = join(tmp, "empty");
    mkdirSync(dir);
    expect(listCurveFiles([dir])).toEqual([]);
  });

  it("listCurveFiles throws io/not-found for a missing path", () => {
    const path = join(tmp, "missing-folder");
    const e = errorOf(() => listCurveFiles([FIXTURES, path]));
    expect(e.code).toBe("io/not-found");
    expect(e.message).toContain(path);
  });
});
