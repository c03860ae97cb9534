/**
 * The identity of an input file for provenance: its name, size and SHA-256. Node only.
 */
import { createHash } from "node:crypto";
import { closeSync, openSync, readSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";

/** Name, size and content hash of an input file. */
export interface InputDigest {
  /** The path as given. */
  name: string;
  /** Size, bytes. */
  bytes: number;
  /** SHA-256 of the content, 64 lowercase hex digits. */
  sha256: string;
}

/**
 * SHA-256 of a text or bytes, as 64 lowercase hex digits (FIPS 180-4, through node:crypto).
 *
 * Parameters
 * ----------
 * data : string | Uint8Array
 *     The text (hashed as UTF-8) or the bytes.
 *
 * Returns
 * -------
 * string
 *     The digest, 64 lowercase hex digits.
 *
 * Example
 * -------
 * ```ts
 * sha256Hex("abc"); // => "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
 * ```
 */
export function sha256Hex(data: string | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}

/**
 * Name, size and SHA-256 of a file (read only).
 *
 * Parameters
 * ----------
 * path : string
 *     The file, as the user gave it (kept as `name`).
 *
 * Returns
 * -------
 * InputDigest
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unreadable` when the file cannot be read.
 *
 * Example
 * -------
 * ```ts
 * const { name, bytes, sha256 } = inputDigest("sample-curves/dot-01.csv");
 * bytes; // => 97996
 * sha256.length; // => 64 (hex digits)
 * ```
 */
export function inputDigest(path: string): InputDigest {
  // Read in chunks: a large input is hashed without being held in memory.
  const hash = createHash("sha256");
  const chunk = Buffer.allocUnsafe(INPUT_DIGEST_CHUNK_BYTES);
  let total = 0;
  let fd: number | null = null;
  try {
    fd = openSync(path, "r");
    for (;;) {
      const got = readSync(fd, chunk, 0, chunk.length, null);
      if (got === 0) break;
      hash.update(chunk.subarray(0, got));
      total += got;
    }
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    throw new DotspecError("io/unreadable", `${path}: cannot be read (${reason})`);
  } finally {
    if (fd !== null) closeSync(fd);
  }
  return { name: path, bytes: total, sha256: hash.digest("hex") };
}

/** Bytes read at a time by {@link inputDigest}. */
const INPUT_DIGEST_CHUNK_BYTES = 1 << 20;
