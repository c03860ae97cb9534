/**
 * The text of a file from its bytes, decoded the way every dotspec reader decodes text: UTF-16
 * by its byte-order mark, otherwise UTF-8, with Windows-1252 as the fallback of older exports.
 * Pure (no file system), so the notebooks decode exactly as the command line does.
 */
import { DotspecError } from "../util/errors.ts";

/** A decoded text and, when it was not UTF-8, the warning that says how it was read. */
export interface DecodedText {
  /** The text, without a byte-order mark. */
  text: string;
  /** "the file is not valid UTF-8; read as Windows-1252 (Latin-1) text", or null. */
  warning: string | null;
}

/**
 * Decodes the bytes of a text file.
 *
 * Parameters
 * ----------
 * bytes : Uint8Array
 *     The whole file (a Node `Buffer` is a `Uint8Array`).
 * source : string
 *     The file's name, put in front of the error message.
 * what : string, optional
 *     What the file should be, for the message ("a text table", "JSON"). Default "a text table".
 * fix : string, optional
 *     What to do about a binary file, for the message. Default "save it as UTF-8 text".
 *
 * Returns
 * -------
 * DecodedText
 *     The text (byte-order mark dropped) and a warning when it was read as Windows-1252.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/binary` when the bytes hold a NUL byte outside UTF-16 (a binary file, or UTF-16
 *     without a byte-order mark).
 *
 * Notes
 * -----
 * 1. A UTF-16 byte-order mark (FF FE little-endian, FE FF big-endian) selects UTF-16.
 * 2. Otherwise a NUL byte anywhere means the file is not text: refused.
 * 3. Otherwise UTF-8 (a UTF-8 byte-order mark is dropped); bytes that are not valid UTF-8 are read
 *    as Windows-1252, the usual encoding of older instrument exports (a Latin-1 `µ` is byte B5),
 *    with a warning.
 *
 * References
 * ----------
 * The Unicode Standard, Version 15.0, §3.10 and §23.8 (byte-order mark); WHATWG Encoding Standard
 * (windows-1252 decoder).
 *
 * Example
 * -------
 * ```ts
 * decodeTextBytes(Uint8Array.of(0xef, 0xbb, 0xbf, 0x61), "a.csv"); // => { text: "a", warning: null }
 * ```
 */
export function decodeTextBytes(bytes: Uint8Array, source: string, what = "a text table", fix = "save it as UTF-8 text"): DecodedText {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return { text: new TextDecoder("utf-16le").decode(bytes), warning: null };
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return { text: new TextDecoder("utf-16be").decode(bytes), warning: null };
  if (bytes.indexOf(0) >= 0) throw binaryFileError(source, what, fix);
  try {
    return { text: new TextDecoder("utf-8", { fatal: true }).decode(bytes), warning: null };
  } catch {
    return { text: new TextDecoder("windows-1252").decode(bytes), warning: "the file is not valid UTF-8; read as Windows-1252 (Latin-1) text" };
  }
}

/**
 * The error for a file that holds NUL bytes outside UTF-16 (`io/binary`), shared by the readers
 * that decode a whole file and those that stream it.
 *
 * Example
 * -------
 * ```ts
 * binaryFileError("a.csv", "a text table", "save it as UTF-8 text").code; // => "io/binary"
 * ```
 */
export function binaryFileError(source: string, what: string, fix: string): DotspecError {
  return new DotspecError(
    "io/binary",
    `${source}: the file holds NUL bytes, so it is not ${what} (a binary file, or UTF-16 text without a byte-order mark); ${fix}`,
  );
}
