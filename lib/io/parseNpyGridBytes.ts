/**
 * A grid stored as an NPY array of current, shape [ny, nx, nbias], from the bytes of the file and
 * its parsed sidecar: no file system, so a page reads a file the user picked exactly as
 * `readNpyGrid` reads it from disk (both share the checks and the conversion below).
 */
import type { GridCube } from "../grid/gridCube.ts";
import { DotspecError } from "../util/errors.ts";
import { parseGridSidecar, type GridSidecar } from "./gridSidecar.ts";
import { parseNpyHeader, type NpyHeader } from "./npyHeader.ts";

/** What an NPY grid reader read. */
export interface NpyGridResult {
  cube: GridCube;
  header: NpyHeader;
  sidecar: GridSidecar;
}

/** Options of {@link parseNpyGridBytes}. */
export interface ParseNpyGridBytesOptions {
  /** The NPY file's name, put in front of messages and kept as the cube's source. Default: PARSE_NPY_GRID_BYTES_DEFAULTS.source ("grid.npy"). */
  source?: string;
  /** The sidecar's name, for messages. Default: PARSE_NPY_GRID_BYTES_DEFAULTS.sidecarSource ("sidecar"). */
  sidecarSource?: string;
}

/** Defaults of {@link parseNpyGridBytes} (locked by a test). */
export const PARSE_NPY_GRID_BYTES_DEFAULTS = Object.freeze({
  source: "grid.npy",
  sidecarSource: "sidecar",
});

/**
 * Checks a parsed NPY header against the sidecar and the file size.
 *
 * Parameters
 * ----------
 * header : NpyHeader
 *     From {@link parseNpyHeader}.
 * sidecar : GridSidecar
 *     From {@link parseGridSidecar}.
 * fileBytes : number
 *     Size of the whole file, bytes.
 * source : string
 *     The NPY file's name, for the messages.
 * sidecarSource : string
 *     The sidecar's name, for the messages.
 *
 * Returns
 * -------
 * number
 *     The number of data bytes (ny·nx·nbias·itemsize), which start at `header.dataOffset`.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/npy-order` (Fortran order); `io/npy-shape` (not [ny, nx, nbias] of the sidecar);
 *     `io/npy-size` (the file is shorter or longer than the shape says).
 *
 * Example
 * -------
 * ```ts
 * import { readFileSync } from "node:fs";
 * const bytes = readFileSync("sample-curves/grid/dot-grid.npy");
 * const header = parseNpyHeader(bytes.subarray(0, 256));
 * const sidecar = parseGridSidecar(JSON.parse(readFileSync("sample-curves/grid/dot-grid.json", "utf8")));
 * npyGridDataBytes(header, sidecar, bytes.length, "dot-grid.npy", "dot-grid.json"); // => 555264 (24·24·241 float32 values, 4 bytes each)
 * ```
 */
export function npyGridDataBytes(header: NpyHeader, sidecar: GridSidecar, fileBytes: number, source: string, sidecarSource: string): number {
  if (header.fortranOrder) {
    throw new DotspecError("io/npy-order", `${source}: the array is in Fortran order; save it in C order (numpy.save(path, numpy.ascontiguousarray(a)))`);
  }
  const want = [sidecar.yNM.count, sidecar.xNM.count, sidecar.biasV.count];
  if (header.shape.length !== 3 || header.shape.some((n, i) => n !== want[i])) {
    throw new DotspecError(
      "io/npy-shape",
      `${source}: shape (${header.shape.join(", ")}) is not [ny, nx, nbias] = [${want.join(", ")}] of ${sidecarSource}: store the current as a [ny, nx, nbias] array or fix the sidecar counts`,
    );
  }
  const dataBytes = want[0] * want[1] * want[2] * header.itemBytes;
  if (fileBytes !== header.dataOffset + dataBytes) {
    throw new DotspecError("io/npy-size", `${source}: ${fileBytes - header.dataOffset} data bytes, but shape (${want.join(", ")}) of ${header.dtype} needs ${dataBytes}: the file is truncated or not what its header says`);
  }
  return dataBytes;
}

/**
 * Turns the data bytes of an NPY grid into the cube: byte order of this machine, current in A.
 *
 * Parameters
 * ----------
 * buffer : ArrayBuffer | SharedArrayBuffer
 *     Exactly the data bytes, owned by the cube from now on (changed in place).
 * header : NpyHeader
 *     The file's header ({@link parseNpyHeader}), as checked by {@link npyGridDataBytes}.
 * sidecar : GridSidecar
 *     The axes and unit of the cube, as checked by {@link npyGridDataBytes}.
 * source : string
 *     The cube's source.
 *
 * Returns
 * -------
 * GridCube
 *     A Float32Array or Float64Array view of `buffer`, as stored.
 *
 * Notes
 * -----
 * 1. Big-endian data are byte-swapped in place.
 * 2. A current unit other than A is scaled in place (divided by 10^-exponent, so pA values are
 *    exact decimal shifts where the float allows).
 *
 * Example
 * -------
 * ```ts
 * import { readFileSync } from "node:fs";
 * const bytes = new Uint8Array(readFileSync("sample-curves/grid/dot-grid.npy"));
 * const header = parseNpyHeader(bytes.subarray(0, 256));
 * const sidecar = parseGridSidecar(JSON.parse(readFileSync("sample-curves/grid/dot-grid.json", "utf8")));
 * npyGridCube(bytes.slice(header.dataOffset).buffer, header, sidecar, "dot-grid.npy").currentA.length; // => 138816
 * ```
 */
export function npyGridCube(buffer: ArrayBuffer | SharedArrayBuffer, header: NpyHeader, sidecar: GridSidecar, source: string): GridCube {
  if (header.littleEndian !== isLittleEndianHost()) swapBytes(new Uint8Array(buffer), header.itemBytes);
  const currentA = header.dtype === "float32" ? new Float32Array(buffer) : new Float64Array(buffer);
  if (sidecar.currentUnit.exponent !== 0) {
    const div = 10 ** -sidecar.currentUnit.exponent;
    for (let i = 0; i < currentA.length; i++) currentA[i] /= div;
  }
  return { currentA, xNM: sidecar.xNM, yNM: sidecar.yNM, biasV: sidecar.biasV, missing: null, source };
}

/**
 * Reads an NPY current cube from the bytes of the file and its sidecar.
 *
 * Parameters
 * ----------
 * bytes : Uint8Array
 *     The whole `.npy` file (in a browser, `new Uint8Array(await file.arrayBuffer())`): float32 or
 *     float64, either byte order, C order, shape [ny, nx, nbias]. Not changed.
 * sidecar : unknown
 *     The parsed sidecar JSON: `{ xNM: [x0, dx, nx], yNM: [y0, dy, ny], biasV: [v0, dv, nbias],
 *     currentUnit }` ({@link parseGridSidecar}).
 * options : ParseNpyGridBytesOptions, optional
 *     source (default "grid.npy"), sidecarSource (default "sidecar").
 *
 * Returns
 * -------
 * NpyGridResult
 *     The cube (current in A, on a new buffer of the stored type), the header and the sidecar.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-bytes`; every error of {@link parseGridSidecar}, {@link parseNpyHeader} and
 *     {@link npyGridDataBytes}: the same messages as `readNpyGrid` for the same file.
 *
 * Notes
 * -----
 * 1. Validate the sidecar, parse the header, check order, shape and size ({@link npyGridDataBytes}).
 * 2. Copy the data bytes onto a new buffer (aligned for the typed array) and convert them
 *    ({@link npyGridCube}).
 *
 * References
 * ----------
 * NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays"; `numpy.lib.format`
 * documentation (NumPy Developers).
 *
 * Example
 * -------
 * ```ts
 * import { readFileSync } from "node:fs";
 * const bytes = new Uint8Array(readFileSync("sample-curves/grid/dot-grid.npy"));
 * const sidecar = JSON.parse(readFileSync("sample-curves/grid/dot-grid.json", "utf8"));
 * const { cube } = parseNpyGridBytes(bytes, sidecar, { source: "dot-grid.npy" });
 * cube.xNM.count; // => 24
 * ```
 */
export function parseNpyGridBytes(bytes: Uint8Array, sidecar: unknown, options: ParseNpyGridBytesOptions = {}): NpyGridResult {
  const source = options.source ?? PARSE_NPY_GRID_BYTES_DEFAULTS.source;
  const sidecarSource = options.sidecarSource ?? PARSE_NPY_GRID_BYTES_DEFAULTS.sidecarSource;
  if (!(bytes instanceof Uint8Array)) {
    throw new DotspecError("io/not-bytes", `parseNpyGridBytes: bytes must be a Uint8Array (the file's content); got ${bytes === null ? "null" : typeof bytes}`);
  }
  const side = parseGridSidecar(sidecar, sidecarSource);
  const header = parseNpyHeader(bytes, source);
  const dataBytes = npyGridDataBytes(header, side, bytes.length, source, sidecarSource);
  const buffer = bytes.slice(header.dataOffset, header.dataOffset + dataBytes).buffer;
  return { cube: npyGridCube(buffer, header, side, source), header, sidecar: side };
}

function isLittleEndianHost(): boolean {
  return new Uint8Array(Uint16Array.of(1).buffer)[0] === 1;
}

/** Reverses the bytes of every item of `size` bytes, in place. */
function swapBytes(bytes: Uint8Array, size: number): void {
  for (let i = 0; i + size <= bytes.length; i += size) {
    for (let a = i, b = i + size - 1; a < b; a++, b--) {
      const t = bytes[a];
      bytes[a] = bytes[b];
      bytes[b] = t;
    }
  }
}
