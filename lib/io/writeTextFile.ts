/**
 * Writing text files (reports, tables, figures) to disk: Node only.
 */
import { mkdirSync, writeFileSync } from "node:fs";
import { dirname } from "node:path";
import { DotspecError } from "../util/errors.ts";

/**
 * Write a text file, creating its folder if needed.
 *
 * Parameters
 * ----------
 * path : string
 *     Where to write; parent folders are created.
 * text : string
 *     The content, written as UTF-8. An existing file is replaced.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/write-failed` naming the path and the reason (permission, a file where a folder should be…).
 *
 * Example
 * -------
 * writeTextFile("report/summary.csv", formatCsv(rows));
 */
export function writeTextFile(path: string, text: string): void {
  if (typeof path !== "string" || path === "") {
    throw new DotspecError("io/write-failed", `writeTextFile: path must be a non-empty string; got ${JSON.stringify(path)}`);
  }
  if (typeof text !== "string") {
    throw new DotspecError("io/write-failed", `writeTextFile: text must be a string; got ${typeof text}`);
  }
  try {
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(path, text, "utf8");
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    throw new DotspecError("io/write-failed", `${path}: could not be written (${reason}); check the folder exists and is writable`);
  }
}
