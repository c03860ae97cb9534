/**
 * Parsing the text of a small JSON file (a scenario, a grid sidecar), with the message a reader
 * of files and a page that opened the file both give.
 */
import { DotspecError } from "../util/errors.ts";

/**
 * Parses JSON text, dropping a UTF-8 byte-order mark first.
 *
 * Parameters
 * ----------
 * text : string
 *     The file's text.
 * source : string
 *     The file's name, put in front of the message.
 *
 * Returns
 * -------
 * unknown
 *     The parsed value (validate it before use).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/invalid-json` when the text is not valid JSON (the parser's message names the position).
 *
 * Example
 * -------
 * ```ts
 * parseJsonText('{"xNM": [0, 0.3, 24]}', "dot.json"); // => { xNM: [0, 0.3, 24] }
 * ```
 */
export function parseJsonText(text: string, source: string): unknown {
  try {
    return JSON.parse(text.replace(/^\uFEFF/, ""));
  } catch (err) {
    throw new DotspecError("io/invalid-json", `${source}: not valid JSON (${(err as Error).message})`);
  }
}
