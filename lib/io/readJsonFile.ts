/**
 * Reading a small JSON file (a scenario, a grid sidecar, the package manifest) for the command line.
 */
import { readFileSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";
import { decodeTextBytes } from "./decodeTextBytes.ts";
import { parseJsonText } from "./parseJsonText.ts";

/**
 * Reads and parses a JSON file.
 *
 * Parameters
 * ----------
 * path : string
 *     The file, as the user gave it.
 *
 * Returns
 * -------
 * unknown
 *     The parsed value (validate it before use).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unreadable-json` when the file cannot be read (missing, a folder, no permission);
 *     `io/binary` when it holds NUL bytes outside UTF-16; `io/invalid-json` when it is not valid
 *     JSON (one line naming the line and column, see {@link parseJsonText}).
 *
 * Notes
 * -----
 * 1. The bytes are decoded as every reader decodes text ({@link decodeTextBytes}: UTF-16 by its
 *    byte-order mark, UTF-8, else Windows-1252).
 * 2. {@link parseJsonText} parses the text.
 *
 * Example
 * -------
 * ```ts
 * (readJsonFile("sample-curves/grid/dot-grid.json") as { biasV: number[] }).biasV; // => [-0.9, 0.00925, 241]
 * ```
 */
export function readJsonFile(path: string): unknown {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why =
      code === "ENOENT" ? "no such file" : code === "EISDIR" ? "is a folder, not a JSON file" : code === "EACCES" ? "permission denied" : (err as Error).message;
    throw new DotspecError("io/unreadable-json", `${path}: cannot be read (${why})`);
  }
  return parseJsonText(decodeTextBytes(bytes, path, "a JSON file", "save it as UTF-8 text").text, path);
}
