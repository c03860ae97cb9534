// parseNpyGridBytes / parseGridBytes / parseJsonText: the readers of a grid held in memory (what a
// page gets from a file input). Expected values come from NumPy-written fixtures (numpy.lib.format,
// the general-purpose reference writer; test/fixtures/io/grid/make-npy-fixtures.py): value at
// [iy, ix, k] = 100·iy + 10·ix + k + 0.25 pA. The Node readers are the reference for the messages
// (by construction: both must give the same reason for the same file, as the CLI prints it).
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { parseNpyGridBytes, PARSE_NPY_GRID_BYTES_DEFAULTS } from "../../lib/io/parseNpyGridBytes.ts";
import { gridSidecarName, isNpyGridName, parseGridBytes, PARSE_GRID_BYTES_DEFAULTS } from "../../lib/io/parseGridBytes.ts";
import { parseJsonText } from "../../lib/io/parseJsonText.ts";
import { readNpyGrid } from "../../lib/io/readNpyGrid.ts";
import { parseGridTable } from "../../lib/io/parseGridTable.ts";
import { failureReason } from "../../lib/util/errors.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { errorOf, expectError } from "../helpers/errors.ts";

const DIR = new URL("../fixtures/io/grid/", import.meta.url).pathname;
const SIDECAR_TEXT = readFileSync(join(DIR, "sidecar.json"), "utf8");
const SIDECAR = JSON.parse(SIDECAR_TEXT);
const bytesOf = (name: string) => new Uint8Array(readFileSync(join(DIR, name)));
const expected = (() => {
  const out: number[] = [];
  for (let iy = 0; iy < 2; iy++) for (let ix = 0; ix < 3; ix++) for (let k = 0; k < 5; k++) out.push((100 * iy + 10 * ix + k + 0.25) * 1e-12);
  return out;
})();

describe("parseNpyGridBytes(bytes, sidecar)", () => {
  for (const [file, dtype] of [["le-f4-v1.npy", Float32Array], ["be-f4-v2.npy", Float32Array], ["be-f8-v1.npy", Float64Array], ["le-f8-v2.npy", Float64Array]] as const) {
    it(`reads ${file} (NumPy's writer) into one ${dtype.name} in A, as readNpyGrid reads the file`, () => {
      const bytes = bytesOf(file);
      const before = bytes.slice();
      const { cube, header } = parseNpyGridBytes(bytes, SIDECAR, { source: file });
      expect(cube.currentA).toBeInstanceOf(dtype);
      expect(header.shape).toEqual([2, 3, 5]);
      // float32 keeps 24 bits: relative rounding ≤ 2^-24 (closed form), twice for the unit scaling
      expectClose(cube.currentA, expected, { rtol: dtype === Float32Array ? 2e-7 : 1e-15, what: "generator formula" });
      expect(Array.from(cube.currentA)).toEqual(Array.from(readNpyGrid(join(DIR, file), SIDECAR).cube.currentA));
      expect(cube.source).toBe(file);
      expect(cube.yNM).toEqual({ start: -1, step: 0.5, count: 2 });
      // The caller's bytes are not swapped or scaled in place.
      expect(bytes).toEqual(before);
    });
  }

  it("gives readNpyGrid's reason for Fortran order, an integer dtype, a wrong shape and a truncated file", () => {
    for (const [file, code] of [["fortran-f4.npy", "io/npy-order"], ["int32.npy", "io/npy-dtype"], ["wrong-shape.npy", "io/npy-shape"]] as const) {
      const path = join(DIR, file);
      const fromFile = errorOf(() => readNpyGrid(path, SIDECAR, {}, "sidecar.json"));
      const fromBytes = errorOf(() => parseNpyGridBytes(bytesOf(file), SIDECAR, { source: path, sidecarSource: "sidecar.json" }));
      expect(fromBytes.code).toBe(code);
      expect(fromBytes.message).toBe(fromFile.message);
    }
    const cut = bytesOf("le-f4-v1.npy").subarray(0, 200);
    expectError(() => parseNpyGridBytes(cut, SIDECAR, { source: "cut.npy" }), "io/npy-size", "cut.npy: ", "truncated");
    expectError(() => parseNpyGridBytes(new Uint8Array(5), SIDECAR), "io/npy-magic", "grid.npy: ");
    expectError(() => parseNpyGridBytes("not bytes" as unknown as Uint8Array, SIDECAR), "io/not-bytes", "Uint8Array");
    expectError(() => parseNpyGridBytes(bytesOf("le-f4-v1.npy"), { ...SIDECAR, currentUnit: 3 }, { sidecarSource: "s.json" }), "io/bad-sidecar", "s.json: currentUnit");
  });

  it("defaults are locked", () => {
    expect(Object.isFrozen(PARSE_NPY_GRID_BYTES_DEFAULTS)).toBe(true);
    expect(PARSE_NPY_GRID_BYTES_DEFAULTS).toEqual({ source: "grid.npy", sidecarSource: "sidecar" }); // common practice (no source): names for messages
  });
});

describe("parseGridBytes(bytes, options)", () => {
  it("reads an .npy (any case) with its sidecar text, and says so when the sidecar is missing or not JSON", () => {
    const r = parseGridBytes(bytesOf("le-f8-v2.npy"), { source: "dot.NPY", sidecarText: SIDECAR_TEXT });
    expect(r.layout).toBe("npy");
    expect(r.table).toBeNull();
    expectClose(r.cube.currentA, expected, { rtol: 1e-15, what: "generator formula" });
    expectError(() => parseGridBytes(bytesOf("le-f8-v2.npy"), { source: "dot.npy" }), "io/no-sidecar", "dot.npy: ", "dot.json", "open both files together");
    const bad = errorOf(() => parseGridBytes(bytesOf("le-f8-v2.npy"), { source: "dot.npy", sidecarText: "{xNM: 1}" }));
    expect(bad.code).toBe("io/invalid-json");
    expect(failureReason("dot.json", bad)).toMatch(/^not valid JSON: line 1, column \d+: /);
  });

  it("reads any other name as a long table, exactly as parseGridTable reads its text (a byte-order mark kept)", () => {
    const text = "\uFEFFx (nm),y (nm),bias (V),current (pA)\n0,0,-0.5,1\n0,0,0,2\n0,0,0.5,3\n0.5,0,-0.5,4\n0.5,0,0,5\n0.5,0,0.5,6\n";
    const r = parseGridBytes(new TextEncoder().encode(text), { source: "scan.csv" });
    const ref = parseGridTable(text, { source: "scan.csv" });
    expect(r.layout).toBe("table");
    expect(Array.from(r.cube.currentA)).toEqual(Array.from(ref.cube.currentA));
    expect(r.table).toEqual(ref.record);
    expect(r.warnings).toEqual(ref.record.warnings);
    // The same reason for a table that is not a grid.
    const notes = "# a lab note\nnothing here\n";
    expect(errorOf(() => parseGridBytes(new TextEncoder().encode(notes), { source: "notes.csv" })).message).toBe(errorOf(() => parseGridTable(notes, { source: "notes.csv" })).message);
  });

  it("names: .npy in any case is NPY; the sidecar is the same name with .json", () => {
    expect([isNpyGridName("a.npy"), isNpyGridName("a.NPY"), isNpyGridName("a.npy.csv"), isNpyGridName("npy")]).toEqual([true, true, false, false]);
    expect(gridSidecarName("scans/dot-03.NPY")).toBe("scans/dot-03.json");
  });

  it("defaults are locked", () => {
    expect(Object.isFrozen(PARSE_GRID_BYTES_DEFAULTS)).toBe(true);
    expect(PARSE_GRID_BYTES_DEFAULTS).toEqual({ source: "grid table" }); // common practice (no source): the name parseGridTable uses
  });
});

describe("parseJsonText(text, source)", () => {
  it("parses JSON after a byte-order mark; names the file and the position when it is not JSON", () => {
    expect(parseJsonText('\uFEFF{"a": [1, 2]}', "x.json")).toEqual({ a: [1, 2] }); // JSON, ECMA-404
    expectError(() => parseJsonText("{a: 1}", "x.json"), "io/invalid-json", "x.json: not valid JSON: line 1, column 2: ");
  });
});
