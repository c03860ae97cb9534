/**
 * The header of an NPY file (the open array format of NumPy): version, dtype, order and shape.
 */
import { DotspecError } from "../util/errors.ts";

/** What an NPY header says. */
export interface NpyHeader {
  /** Format version [major, minor]: [1, 0], [2, 0] or [3, 0]. */
  version: [number, number];
  /** The `descr` string as written, e.g. `"<f4"`. */
  descr: string;
  /** Element type: "float32" or "float64" (the only ones dotspec reads). */
  dtype: "float32" | "float64";
  /** Bytes per element (4 or 8). */
  itemBytes: number;
  /** True for little-endian data (`<`), false for big-endian (`>`). */
  littleEndian: boolean;
  /** `fortran_order` as written. */
  fortranOrder: boolean;
  /** The shape, outermost first. */
  shape: number[];
  /** Byte offset of the data: magic (6) + version (2) + length field (2 or 4) + header. */
  dataOffset: number;
}

const MAGIC = [0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59]; // \x93NUMPY

/**
 * Reads an NPY header from the first bytes of a file.
 *
 * Parameters
 * ----------
 * bytes : Uint8Array
 *     The start of the file: at least the whole header (10 bytes plus the header length for
 *     version 1.0, 12 plus it for 2.0 and 3.0).
 * source : string, optional
 *     The file name, for error messages. Default "NPY file".
 *
 * Returns
 * -------
 * NpyHeader
 *
 * Throws
 * ------
 * DotspecError
 *     `io/npy-magic` (not an NPY file), `io/npy-version` (unknown version), `io/npy-truncated`
 *     (fewer bytes than the header needs), `io/npy-header` (the header dictionary cannot be read),
 *     `io/npy-dtype` (not float32/float64: the message names the descr and the fix).
 *
 * Notes
 * -----
 * 1. Magic string `\x93NUMPY`, then the major and minor version bytes.
 * 2. Header length: little-endian uint16 for version 1.0, uint32 for 2.0 and 3.0.
 * 3. The header is a Python dictionary literal (ASCII; UTF-8 in 3.0) with the keys `descr`,
 *    `fortran_order` and `shape`, padded with spaces and ended by a newline; the data follow.
 * 4. `descr` `<f4`, `>f4`, `<f8`, `>f8` are accepted (`<` little-, `>` big-endian).
 *
 * References
 * ----------
 * NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays" (R. Kern, 2007), and the
 * `numpy.lib.format` documentation (NumPy Developers, https://numpy.org/doc/stable/reference/generated/numpy.lib.format.html).
 *
 * Example
 * -------
 * ```ts
 * import { readFileSync } from "node:fs";
 * parseNpyHeader(readFileSync("sample-curves/grid/dot-grid.npy").subarray(0, 256)).shape; // => [24, 24, 241]
 * ```
 */
export function parseNpyHeader(bytes: Uint8Array, source = "NPY file"): NpyHeader {
  if (bytes.length < 10 || MAGIC.some((b, i) => bytes[i] !== b)) {
    throw new DotspecError("io/npy-magic", `${source}: not an NPY file (it does not start with the magic string \\x93NUMPY)`);
  }
  const major = bytes[6], minor = bytes[7];
  if (!((major === 1 || major === 2 || major === 3) && minor === 0)) {
    throw new DotspecError("io/npy-version", `${source}: NPY format version ${major}.${minor} is not known; versions 1.0, 2.0 and 3.0 are read`);
  }
  const lengthBytes = major === 1 ? 2 : 4;
  if (bytes.length < 8 + lengthBytes) throw new DotspecError("io/npy-truncated", `${source}: the file ends inside the NPY header`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const headerLength = major === 1 ? view.getUint16(8, true) : view.getUint32(8, true);
  const start = 8 + lengthBytes;
  const dataOffset = start + headerLength;
  if (bytes.length < dataOffset) throw new DotspecError("io/npy-truncated", `${source}: the file ends inside the NPY header (${headerLength} bytes announced)`);
  const text = new TextDecoder(major === 3 ? "utf-8" : "latin1").decode(bytes.subarray(start, dataOffset));

  const bad = (what: string) => new DotspecError("io/npy-header", `${source}: the NPY header ${what}: ${JSON.stringify(text.trim().slice(0, 120))}`);
  const descrMatch = /['"]descr['"]\s*:\s*['"]([^'"]*)['"]/.exec(text);
  const orderMatch = /['"]fortran_order['"]\s*:\s*(True|False)/.exec(text);
  const shapeMatch = /['"]shape['"]\s*:\s*\(([^)]*)\)/.exec(text);
  if (!descrMatch) throw bad("has no 'descr' string");
  if (!orderMatch) throw bad("has no 'fortran_order' True/False");
  if (!shapeMatch) throw bad("has no 'shape' tuple");
  const shape = shapeMatch[1]
    .split(",")
    .map((s) => s.trim())
    .filter((s) => s !== "")
    .map((s) => {
      const n = Number(s.replace(/L$/, ""));
      if (!Number.isSafeInteger(n) || n < 0) throw bad(`has a shape entry that is not a non-negative integer below 2^53 (${s.slice(0, 40)})`);
      return n;
    });
  const descr = descrMatch[1];
  const m = /^([<>|=])f([48])$/.exec(descr);
  if (!m || m[1] === "|" || m[1] === "=") {
    throw new DotspecError(
      "io/npy-dtype",
      `${source}: dtype ${JSON.stringify(descr)} is not read; store the current as float32 or float64 with an explicit byte order ('<f4', '>f4', '<f8', '>f8'), e.g. numpy.save(path, a.astype('<f4'))`,
    );
  }
  return {
    version: [major, minor],
    descr,
    dtype: m[2] === "4" ? "float32" : "float64",
    itemBytes: Number(m[2]),
    littleEndian: m[1] === "<",
    fortranOrder: orderMatch[1] === "True",
    shape,
    dataOffset,
  };
}
