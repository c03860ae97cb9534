/**
 * Reading a curve from the raw bytes of a file: the text decoding a file reader needs, then
 * {@link parseCurveText}. Pure (no file system), so a browser page that opens a file the user picked
 * reads it exactly as `readCurveFile` reads it from disk.
 */
import { DotspecError } from "../util/errors.ts";
import { decodeTextBytes } from "./decodeTextBytes.ts";
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
 * ```ts
 * const text = "bias (V),current (pA)\n" + Array.from({ length: 101 }, (_, i) => `${-1 + i * 0.02},${(-1 + i * 0.02) ** 3}`).join("\n");
 * const { curve } = parseCurveBytes(new TextEncoder().encode(text), { source: "dot.csv" });
 * curve.meta.source; // => "dot.csv"
 * ```
 */
export function parseCurveBytes(bytes: Uint8Array, options: ParseOptions = {}): ParsedCurve {
  if (!(bytes instanceof Uint8Array)) {
    throw new DotspecError("io/not-bytes", `parseCurveBytes: bytes must be a Uint8Array (the file's content); got ${bytes === null ? "null" : typeof bytes}`);
  }
  const source = typeof options.source === "string" ? options.source : "(text)";
  const { text, warning } = decodeTextBytes(bytes, source, "a text table", "export the sweep as CSV or plain text");
  const result = parseCurveText(text, options);
  if (warning) result.record.warnings.unshift(warning);
  return result;
}
