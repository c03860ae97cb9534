// The demo grid generator (scripts/make-sample-grid.ts). Check values: the NPY layout from its
// specification (NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays": magic
// \x93NUMPY, version 1.0, a little-endian uint16 header length, the header padded with spaces and
// ended by "\n" so that magic + version + length + header is a multiple of 64 bytes); the
// committed demo files are what the generator makes (by construction: same code, same start of the
// random numbers), and the parser reads the shape the sidecar states.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { float32Npy, SAMPLE_GRID, sampleGridFiles } from "../../scripts/make-sample-grid.ts";
import { parseNpyHeader } from "../../lib/io/npyHeader.ts";
import { parseGridBytes } from "../../lib/io/parseGridBytes.ts";

const DEMO = new URL("../../sample-curves/grid/", import.meta.url);

describe("float32Npy(values, shape)", () => {
  it("writes an NPY 1.0 header aligned to 64 bytes, then the values little-endian", () => {
    const values = Float32Array.of(1.5, -2, 0.25, 3, 4, 5);
    const bytes = float32Npy(values, [1, 2, 3]);
    expect(Array.from(bytes.subarray(0, 8))).toEqual([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0]); // NEP 1 magic and version
    const headerLength = bytes[8] + 256 * bytes[9];
    expect((10 + headerLength) % 64).toBe(0); // NEP 1 alignment
    expect(bytes[10 + headerLength - 1]).toBe(0x0a); // the header ends in "\n"
    const header = parseNpyHeader(bytes);
    expect(header).toMatchObject({ descr: "<f4", fortranOrder: false, shape: [1, 2, 3], dataOffset: 10 + headerLength });
    expect(Array.from(new Float32Array(bytes.slice(header.dataOffset).buffer))).toEqual([1.5, -2, 0.25, 3, 4, 5]); // exact in float32
  });
});

describe("the demo grid (sample-curves/grid/)", () => {
  it("is what npm run samples:grid makes, says it is invented, and reads as the sidecar says", () => {
    const made = sampleGridFiles();
    const npy = new Uint8Array(readFileSync(new URL(`${SAMPLE_GRID.name}.npy`, DEMO)));
    const sidecarText = readFileSync(new URL(`${SAMPLE_GRID.name}.json`, DEMO), "utf8");
    expect(sidecarText).toBe(made.sidecarText);
    expect(Buffer.compare(Buffer.from(npy), Buffer.from(made.npy))).toBe(0);
    expect(JSON.parse(sidecarText).description).toMatch(/^Invented demo grid, not a measurement/);
    const { cube } = parseGridBytes(npy, { source: "dot-grid.npy", sidecarText });
    expect([cube.yNM.count, cube.xNM.count, cube.biasV.count]).toEqual([SAMPLE_GRID.ny, SAMPLE_GRID.nx, 241]); // (1.32 − (−0.9))/0.00925 + 1 = 241 biases (closed form)
  });
});
