import { describe, expect, it } from "vitest";
import { parseNpyHeader } from "../../lib/io/npyHeader.ts";
import { expectError } from "../helpers/errors.ts";

/**
 * An NPY header built by hand from the format description (NumPy Enhancement Proposal 1, "A
 * simple file format for NumPy arrays"; numpy.lib.format documentation): magic \x93NUMPY, major
 * and minor version bytes, header length (little-endian uint16 for 1.0, uint32 for 2.0), the
 * dictionary padded with spaces to a multiple of 64 bytes in all and ended by a newline.
 */
function header(dict: string, major: 1 | 2 = 1): Uint8Array {
  const pre = major === 1 ? 10 : 12;
  let body = dict;
  while ((pre + body.length + 1) % 64 !== 0) body += " ";
  body += "\n";
  const out = new Uint8Array(pre + body.length);
  out.set([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, major, 0]);
  const view = new DataView(out.buffer);
  if (major === 1) view.setUint16(8, body.length, true);
  else view.setUint32(8, body.length, true);
  for (let i = 0; i < body.length; i++) out[pre + i] = body.charCodeAt(i);
  return out;
}

describe("parseNpyHeader(bytes)", () => {
  it("reads a version 1.0 header: descr, order, shape, data offset (NEP 1: 10 + header length)", () => {
    const h = parseNpyHeader(header("{'descr': '<f4', 'fortran_order': False, 'shape': (16, 16, 400), }"));
    expect(h).toEqual({ version: [1, 0], descr: "<f4", dtype: "float32", itemBytes: 4, littleEndian: true, fortranOrder: false, shape: [16, 16, 400], dataOffset: 128 });
    // closed form: 10 + 67-character dictionary + newline, padded to the next multiple of 64 (NEP 1)
  });
  it("reads a version 2.0 header (uint32 length) with big-endian float64", () => {
    const h = parseNpyHeader(header("{'descr': '>f8', 'fortran_order': False, 'shape': (2, 3, 5), }", 2));
    expect(h.version).toEqual([2, 0]);
    expect(h.dtype).toBe("float64");
    expect(h.littleEndian).toBe(false);
    expect(h.dataOffset).toBe(128); // closed form: 12 + 69-character dictionary + newline, padded to the next multiple of 64 (NEP 1)
  });
  it("reads fortran_order True and a one-element shape tuple", () => {
    const h = parseNpyHeader(header("{'descr': '<f8', 'fortran_order': True, 'shape': (7,), }"));
    expect(h.fortranOrder).toBe(true);
    expect(h.shape).toEqual([7]);
  });
  it("rejects other dtypes with the fix, a bad magic string and an unknown version", () => {
    expectError(() => parseNpyHeader(header("{'descr': '<i4', 'fortran_order': False, 'shape': (2, 3, 5), }")), "io/npy-dtype", "<i4", "float32 or float64");
    expectError(() => parseNpyHeader(header("{'descr': '|u1', 'fortran_order': False, 'shape': (2,), }")), "io/npy-dtype");
    // '=' (native order) is not written by NumPy's writer and would make the file's meaning depend on the machine
    expectError(() => parseNpyHeader(header("{'descr': '=f4', 'fortran_order': False, 'shape': (2,), }")), "io/npy-dtype", "explicit byte order");
    expectError(() => parseNpyHeader(new TextEncoder().encode("x,y,bias,current\n0,0,0,0\n")), "io/npy-magic");
    const v9 = header("{'descr': '<f4', 'fortran_order': False, 'shape': (2,), }");
    v9[6] = 9;
    expectError(() => parseNpyHeader(v9), "io/npy-version", "9.0");
  });
  it("rejects a header cut short and a header without shape", () => {
    expectError(() => parseNpyHeader(header("{'descr': '<f4', 'fortran_order': False, 'shape': (2,), }").subarray(0, 30)), "io/npy-truncated");
    expectError(() => parseNpyHeader(header("{'descr': '<f4', 'fortran_order': False, }")), "io/npy-header", "shape");
  });
});
