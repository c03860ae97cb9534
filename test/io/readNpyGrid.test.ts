import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { READ_NPY_DEFAULTS, readNpyGrid } from "../../lib/io/readNpyGrid.ts";
import { parseGridSidecar } from "../../lib/io/gridSidecar.ts";
import { readGridFile } from "../../lib/io/readGridFile.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

// Fixtures written by NumPy's numpy.lib.format.write_array (the general-purpose reference writer):
// test/fixtures/io/grid/make-npy-fixtures.py. Value at [iy, ix, k] = 100·iy + 10·ix + k + 0.25 (pA).
const DIR = new URL("../fixtures/io/grid/", import.meta.url).pathname;
const SIDECAR = JSON.parse(readFileSync(join(DIR, "sidecar.json"), "utf8"));
const expected = (() => {
  const out: number[] = [];
  for (let iy = 0; iy < 2; iy++) for (let ix = 0; ix < 3; ix++) for (let k = 0; k < 5; k++) out.push((100 * iy + 10 * ix + k + 0.25) * 1e-12);
  return out;
})();
const scratch = mkdtempSync(join(tmpdir(), "dotspec-npy-"));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe("readNpyGrid(path, sidecar)", () => {
  for (const [file, dtype] of [["le-f4-v1.npy", Float32Array], ["be-f4-v2.npy", Float32Array], ["be-f8-v1.npy", Float64Array], ["le-f8-v2.npy", Float64Array]] as const) {
    it(`reads ${file} (NumPy's writer) into one ${dtype.name}, values in A`, () => {
      const { cube, header } = readNpyGrid(join(DIR, file), SIDECAR);
      expect(cube.currentA).toBeInstanceOf(dtype);
      expect(header.shape).toEqual([2, 3, 5]);
      // float32 keeps 24 bits: relative rounding ≤ 2^-24 (closed form), twice for the unit scaling
      expectClose(cube.currentA, expected, { rtol: dtype === Float32Array ? 2e-7 : 1e-15, what: "generator formula" });
      expect(cube.xNM).toEqual({ start: 0, step: 0.5, count: 3 });
      expect(cube.yNM).toEqual({ start: -1, step: 0.5, count: 2 });
      expect(cube.biasV).toEqual({ start: -1, step: 0.5, count: 5 });
    });
  }
  it("reads the same values in chunks of 8 bytes and onto a SharedArrayBuffer", () => {
    const a = readNpyGrid(join(DIR, "be-f8-v1.npy"), SIDECAR).cube.currentA;
    const b = readNpyGrid(join(DIR, "be-f8-v1.npy"), SIDECAR, { chunkBytes: 8, shared: true }).cube.currentA;
    expect(b.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(Array.from(b)).toEqual(Array.from(a));
  });
  it("rejects Fortran order, an integer dtype and a shape that is not [ny, nx, nbias] of the sidecar", () => {
    expectError(() => readNpyGrid(join(DIR, "fortran-f4.npy"), SIDECAR), "io/npy-order", "C order");
    expectError(() => readNpyGrid(join(DIR, "int32.npy"), SIDECAR), "io/npy-dtype", "<i4");
    expectError(() => readNpyGrid(join(DIR, "wrong-shape.npy"), SIDECAR), "io/npy-shape", "(6, 5)", "[2, 3, 5]");
    expectError(() => readNpyGrid(join(DIR, "le-f4-v1.npy"), { ...SIDECAR, xNM: [0, 0.5, 4] }), "io/npy-shape");
  });
  it("reads a header longer than the first read (4 KiB) in a second read", () => {
    // NEP 1 allows any header length; pad the dictionary of le-f4-v1.npy to 8,192 bytes (version 2.0 length field)
    const src = readFileSync(join(DIR, "le-f4-v1.npy"));
    const len = src.readUInt16LE(8);
    const dict = src.subarray(10, 10 + len).toString("latin1").trimEnd();
    const body = dict.padEnd(8192 - 12 - 1, " ") + "\n";
    const head = Buffer.alloc(12);
    Buffer.from([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 2, 0]).copy(head);
    head.writeUInt32LE(body.length, 8);
    const p = join(scratch, "long-header.npy");
    writeFileSync(p, Buffer.concat([head, Buffer.from(body, "latin1"), src.subarray(10 + len)]));
    const { cube, header } = readNpyGrid(p, SIDECAR);
    expect(header.dataOffset).toBe(8192);
    expectClose(cube.currentA, expected, { rtol: 2e-7, what: "generator formula" });
  });
  it("rejects a truncated file and a missing file", () => {
    const cut = join(scratch, "cut.npy");
    writeFileSync(cut, readFileSync(join(DIR, "le-f4-v1.npy")).subarray(0, 200));
    expectError(() => readNpyGrid(cut, SIDECAR), "io/npy-size", "truncated");
    expectError(() => readNpyGrid(join(scratch, "none.npy"), SIDECAR), "io/not-found");
  });
  it("readGridFile finds the sidecar next to the file", () => {
    const p = join(scratch, "dot.npy");
    copyFileSync(join(DIR, "le-f8-v2.npy"), p);
    writeFileSync(join(scratch, "dot.json"), JSON.stringify(SIDECAR));
    const r = readGridFile(p);
    expect(r.layout).toBe("npy");
    expectClose(r.cube.currentA, expected, { rtol: 1e-15, what: "generator formula" });
  });
  it("defaults are locked", () => {
    expect(Object.isFrozen(READ_NPY_DEFAULTS)).toBe(true);
    expect(READ_NPY_DEFAULTS).toEqual({ shared: false, chunkBytes: 8 * 1024 * 1024, headBytes: 4096 }); // common practice (no source)
  });
});

describe("parseGridSidecar(value)", () => {
  it("reads the axes and the current unit (pA = 1e-12 A, SI prefix)", () => {
    const s = parseGridSidecar(SIDECAR);
    expect(s.currentUnit.scale).toBe(1e-12);
    expect(s.biasV).toEqual({ start: -1, step: 0.5, count: 5 });
  });
  it("names the key and the rule when it is wrong", () => {
    expectError(() => parseGridSidecar({ ...SIDECAR, biasV: [1, -0.5, 5] }), "io/bad-sidecar", "biasV step", "ascending");
    expectError(() => parseGridSidecar({ ...SIDECAR, xNM: [0, 0.5] }), "io/bad-sidecar", "xNM", "three numbers");
    expectError(() => parseGridSidecar({ ...SIDECAR, yNM: [0, 0.5, 2.5] }), "io/bad-sidecar", "count");
    expectError(() => parseGridSidecar({ ...SIDECAR, zNM: [0, 1, 1] }), "io/bad-sidecar", "zNM");
    expectError(() => parseGridSidecar({ ...SIDECAR, currentUnit: "mV" }), "io/unknown-unit");
    const { yNM: _y, ...noY } = SIDECAR;
    expectError(() => parseGridSidecar(noY), "io/bad-sidecar", "yNM is missing");
  });
});
