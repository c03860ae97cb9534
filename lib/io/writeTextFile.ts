/**
 * Writing text files (reports, tables, figures) to disk: Node only.
 */
import { mkdirSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { DotspecError } from "../util/errors.ts";

/**
 * How a temporary file of {@link writeTextFile} is named: `.<name>.<pid>-<n>.dotspec-tmp` beside
 * the final file. The output-folder check knows the pattern (an interrupted run may leave one).
 */
export const TEMP_FILE_PATTERN = /^\..+\.\d+-\d+\.dotspec-tmp$/;

let tempCounter = 0;

/**
 * Write a text file atomically, creating its folder if needed.
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
 * Notes
 * -----
 * 1. The text goes to a temporary name in the same folder (`.<name>.<pid>-<n>.dotspec-tmp`),
 *    which is then renamed onto `path`. A rename within one file system is atomic (POSIX
 *    rename(2)), so a reader, or a run interrupted by Ctrl-C, sees the old file or the new one,
 *    never half of one.
 * 2. When the write or the rename fails, the temporary file is removed.
 *
 * Example
 * -------
 * ```ts
 * import { readFileSync } from "node:fs";
 * import { tmpdir } from "node:os";
 * import { join } from "node:path";
 * const path = join(tmpdir(), "dotspec-example", "summary.csv");
 * writeTextFile(path, formatCsv([{ dot: "dot-01", gap_eV: 1.92 }]));
 * readFileSync(path, "utf8"); // => "dot,gap_eV\ndot-01,1.92\n"
 * ```
 */
export function writeTextFile(path: string, text: string): void {
  if (typeof path !== "string" || path === "") {
    throw new DotspecError("io/write-failed", `writeTextFile: path must be a non-empty string; got ${JSON.stringify(path)}`);
  }
  if (typeof text !== "string") {
    throw new DotspecError("io/write-failed", `writeTextFile: text must be a string; got ${typeof text}`);
  }
  const temp = join(dirname(path), `.${basename(path)}.${process.pid}-${tempCounter++}.dotspec-tmp`);
  try {
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(temp, text, "utf8");
    renameSync(temp, path);
  } catch (err) {
    try {
      rmSync(temp, { force: true });
    } catch {
      // The folder itself is missing or unusable: no temporary file was made.
    }
    const reason = err instanceof Error ? err.message : String(err);
    throw new DotspecError("io/write-failed", `${path}: could not be written (${reason}); check the folder exists and is writable`);
  }
}
