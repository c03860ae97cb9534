/**
 * Reading a grid stored as an NPY array of current, shape [ny, nx, nbias], with its JSON sidecar.
 */
import { closeSync, fstatSync, openSync, readSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";
import { parseGridSidecar } from "./gridSidecar.ts";
import { parseNpyHeader, type NpyHeader } from "./npyHeader.ts";
import { npyGridCube, npyGridDataBytes, type NpyGridResult } from "./parseNpyGridBytes.ts";

export type { NpyGridResult } from "./parseNpyGridBytes.ts";

/** Options of {@link readNpyGrid}. */
export interface ReadNpyGridOptions {
  /** Put the cube on a SharedArrayBuffer, so worker threads can read it without a copy. Default false. */
  shared?: boolean;
  /** Bytes read per call. Default 8388608 (8 MiB, READ_NPY_DEFAULTS.chunkBytes). */
  chunkBytes?: number;
}

/** Defaults of {@link readNpyGrid} (locked by a test). */
export const READ_NPY_DEFAULTS = Object.freeze({
  shared: false,
  chunkBytes: 8 * 1024 * 1024,
  /** Bytes read first for the header (a longer header is read in full after its length is known). */
  headBytes: 4096,
});

/**
 * Reads an NPY current cube with its sidecar axes.
 *
 * Parameters
 * ----------
 * path : string
 *     The `.npy` file: float32 or float64, either byte order, C order, shape [ny, nx, nbias].
 * sidecar : unknown
 *     The parsed sidecar JSON ({@link parseGridSidecar}): `{ xNM: [x0, dx, nx], yNM: [y0, dy, ny],
 *     biasV: [v0, dv, nbias], currentUnit }`.
 * options : ReadNpyGridOptions, optional
 *     shared (default false), chunkBytes (default 8 MiB).
 * sidecarSource : string, optional
 *     The sidecar's name for messages. Default "sidecar".
 *
 * Returns
 * -------
 * NpyGridResult
 *     The cube (current in A, in one Float32Array or Float64Array as stored), the header and the sidecar.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found`, `io/read-failed`; every error of {@link parseNpyHeader} and
 *     {@link parseGridSidecar}; `io/npy-order` (Fortran order); `io/npy-shape` (not 3-D, or not
 *     [ny, nx, nbias] of the sidecar); `io/npy-size` (the file is shorter or longer than the shape
 *     says): the checks of {@link npyGridDataBytes}.
 *
 * Notes
 * -----
 * 1. Read the first 4 KiB, parse the header; check order and shape against the sidecar and the
 *    file size against offset + ny·nx·nbias·itemsize.
 * 2. Allocate one buffer (shared if asked) and read the data into it in chunks of chunkBytes,
 *    straight into its bytes: no intermediate copy and never an array of JS numbers.
 * 3. Big-endian data are byte-swapped in place; a current unit other than A is scaled in place
 *    ({@link npyGridCube}, shared with {@link parseNpyGridBytes}, the reader of bytes in memory).
 *
 * References
 * ----------
 * NumPy Enhancement Proposal 1, "A simple file format for NumPy arrays"; `numpy.lib.format`
 * documentation (NumPy Developers).
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readNpyGrid("sample-curves/grid/dot-grid.npy", readJsonFile("sample-curves/grid/dot-grid.json"));
 * cube.currentA.length; // => 138816 (24 × 24 pixels × 241 biases)
 * ```
 */
export function readNpyGrid(path: string, sidecar: unknown, options: ReadNpyGridOptions = {}, sidecarSource = "sidecar"): NpyGridResult {
  const side = parseGridSidecar(sidecar, sidecarSource);
  const chunkBytes = options.chunkBytes ?? READ_NPY_DEFAULTS.chunkBytes;
  if (!(Number.isInteger(chunkBytes) && chunkBytes >= 8)) throw new DotspecError("options/not-integer", `chunkBytes must be an integer of at least 8; got ${chunkBytes}`);
  let fd: number;
  try {
    fd = openSync(path, "r");
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new DotspecError(code === "ENOENT" ? "io/not-found" : "io/read-failed", `${path}: cannot be read (${code === "ENOENT" ? "no such file" : (err as Error).message})`);
  }
  try {
    const size = fstatSync(fd).size;
    let head = new Uint8Array(Math.min(size, READ_NPY_DEFAULTS.headBytes));
    readSync(fd, head, 0, head.length, 0);
    let header: NpyHeader;
    try {
      header = parseNpyHeader(head, path);
    } catch (err) {
      if (!(err instanceof DotspecError && err.code === "io/npy-truncated" && size > head.length && head.length >= 12)) throw err;
      // A header longer than the first read: read exactly as much as its length field says.
      const view = new DataView(head.buffer);
      const need = head[6] === 1 ? 10 + view.getUint16(8, true) : 12 + view.getUint32(8, true);
      head = new Uint8Array(Math.min(size, need));
      readSync(fd, head, 0, head.length, 0);
      header = parseNpyHeader(head, path);
    }
    const dataBytes = npyGridDataBytes(header, side, size, path, sidecarSource);
    const buffer = options.shared ? new SharedArrayBuffer(dataBytes) : new ArrayBuffer(dataBytes);
    const bytes = new Uint8Array(buffer);
    for (let done = 0; done < dataBytes; ) {
      const len = Math.min(chunkBytes - (chunkBytes % header.itemBytes), dataBytes - done);
      const got = readSync(fd, bytes, done, len, header.dataOffset + done);
      if (got <= 0) throw new DotspecError("io/npy-size", `${path}: the file ended after ${done} of ${dataBytes} data bytes`);
      done += got;
    }
    const cube = npyGridCube(buffer, header, side, path);
    return { cube, header, sidecar: side };
  } finally {
    closeSync(fd);
  }
}
