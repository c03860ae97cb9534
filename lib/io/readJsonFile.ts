/**
 * Reading a small JSON file (a scenario, the package manifest) for the command line.
 */
import { readFileSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";
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
 *     `io/invalid-json` when it is not valid JSON ({@link parseJsonText}; the parser's message names
 *     the position).
 *
 * Example
 * -------
 * parseScenario(readJsonFile("scenario.json"));
 */
export function readJsonFile(path: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, "utf8");
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why =
      code === "ENOENT" ? "no such file" : code === "EISDIR" ? "is a folder, not a JSON file" : code === "EACCES" ? "permission denied" : (err as Error).message;
    throw new DotspecError("io/unreadable-json", `${path}: cannot be read (${why})`);
  }
  return parseJsonText(text, path);
}
