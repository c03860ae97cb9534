/**
 * Reading a curve from the raw bytes of a file: the text decoding a file reader needs, then
 * {@link parseCurveText}. Pure (no file system), so a browser page that opens a file the user picked
 * reads it exactly as `readCurveFile` reads it from disk.
 */
import { DotspecError } from "../util/errors.ts";
import { parseCurveText, type ParseOptions, type ParsedCurve } from "./parse/index.ts";

/**
 * Decode the bytes of a curve file and parse them.
 *
 * Parameters
 * ----------
 * bytes : Uint8Array
 *     The whole file (a Node `Buffer` is a `Uint8Array`; in a browser, `new Uint8Array(await
 *     file.arrayBuffer())`).
 * options : ParseOptions, optional
 *     As for {@link parseCurveText}; `source` (the file's name or path) is put in front of every
 *     error message and stored in the record. Default source `"(text)"`.
 *
 * Returns
 * -------
 * ParsedCurve
 *     The same as {@link parseCurveText} on the decoded text, with a warning in the record when the
 *     text was not UTF-8.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/binary` when the bytes hold a NUL byte (not a text table: a binary file, or UTF-16
 *     without a byte-order mark), and every error of {@link parseCurveText}.
 *
 * Notes
 * -----
 * 1. A UTF-16 byte-order mark (FF FE little-endian, FE FF big-endian) selects UTF-16.
 * 2. Otherwise a NUL byte anywhere means the file is not text: rejected.
 * 3. Otherwise UTF-8 (a UTF-8 byte-order mark is dropped); bytes that are not valid UTF-8 are read
 *    as Windows-1252 (Latin-1), the usual encoding of older instrument exports, with a warning.
 *
 * Example
 * -------
 * const { curve } = parseCurveBytes(new TextEncoder().encode("bias (V),current (pA)\n…"), { source: "dot.csv" });
 * curve.meta.source; // => "dot.csv"
 */
export function parseCurveBytes(bytes: Uint8Array, options: ParseOptions = {}): ParsedCurve {
  if (!(bytes instanceof Uint8Array)) {
    throw new DotspecError("io/not-bytes", `parseCurveBytes: bytes must be a Uint8Array (the file's content); got ${bytes === null ? "null" : typeof bytes}`);
  }
  const source = typeof options.source === "string" ? options.source : "(text)";
  const { text, warning } = decodeCurveBytes(source, bytes);
  const result = parseCurveText(text, options);
  if (warning) result.record.warnings.unshift(warning);
  return result;
}

function decodeCurveBytes(source: string, bytes: Uint8Array): { text: string; warning: string | null } {
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return { text: new TextDecoder("utf-16le").decode(bytes), warning: null };
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return { text: new TextDecoder("utf-16be").decode(bytes), warning: null };
  if (bytes.indexOf(0) >= 0) {
    throw new DotspecError(
      "io/binary",
      `${source}: the file holds NUL bytes, so it is not a text table (a binary file, or UTF-16 text without a byte-order mark); ` +
        `export the sweep as CSV or plain text`,
    );
  }
  try {
    return { text: new TextDecoder("utf-8", { fatal: true }).decode(bytes), warning: null };
  } catch {
    return {
      text: new TextDecoder("windows-1252").decode(bytes),
      warning: "the file is not valid UTF-8; read as Windows-1252 (Latin-1) text",
    };
  }
}
