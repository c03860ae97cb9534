/**
 * The `--out` folder of a command: refused when it holds files dotspec did not write (unless
 * `--force`), and listed in its manifest before and after the run's writes.
 */
import { checkOutputFolder, OUTPUT_MANIFEST_NAME, writeOutputManifest } from "../index.ts";
import { UsageError } from "./context.ts";
import { basename, extname } from "node:path";

/** How many file names a refusal lists before "…". */
const LISTED = 5;

/** Names for a message: the first few, then how many in all. */
function some(names: readonly string[]): string {
  return names.length <= LISTED ? names.join(", ") : `${names.slice(0, LISTED).join(", ")}, … (${names.length} in all)`;
}

/**
 * Checks an output folder and lists the files this run will write in its manifest.
 *
 * Parameters
 * ----------
 * dir : string
 *     The `--out` folder (created if missing).
 * planned : string[]
 *     Paths relative to `dir` that the run writes.
 * force : boolean
 *     `--force`: write even when the folder holds foreign or changed files.
 *
 * Throws
 * ------
 * UsageError
 *     When the folder holds files dotspec did not write, or files it wrote that have changed
 *     since, and `force` is false. Nothing is written then.
 *
 * Notes
 * -----
 * 1. What dotspec wrote is what the folder's manifest (`.dotspec-manifest.json`) lists, with the
 *    SHA-256 of each file as written; a file not listed is foreign, a listed file whose SHA-256
 *    differs was changed by someone (`checkOutputFolder`).
 * 2. The planned files are listed before any is written, so a run interrupted half-way leaves a
 *    folder that the next run accepts.
 */
export function claimOutputFolder(dir: string, planned: readonly string[], force: boolean): void {
  let check;
  try {
    check = checkOutputFolder(dir);
  } catch (err) {
    throw new UsageError(`--out ${dir}: ${err instanceof Error ? err.message.replace(`${dir}: `, "") : String(err)}`);
  }
  if (!force && (check.foreign.length || check.changed.length)) {
    const what = [
      check.foreign.length ? `files dotspec did not write (${some(check.foreign)})` : "",
      check.changed.length ? `files changed since dotspec wrote them (${some(check.changed)})` : "",
    ].filter(Boolean).join(" and ");
    throw new UsageError(
      `--out ${dir} holds ${what}; give a new or empty folder, or add --force to write there anyway (files of the same name are replaced; dotspec's own are listed in ${OUTPUT_MANIFEST_NAME})`,
    );
  }
  writeOutputManifest(dir, planned, false);
}

/** Records the SHA-256 of the files the run wrote in the folder's manifest. */
export function sealOutputFolder(dir: string, written: readonly string[]): void {
  writeOutputManifest(dir, written, true);
}

/**
 * Output base names inside an output folder: each file's name without extension, made unique
 * without regard to letter case (`dot`, `dot-2`, …), never one of `reserved` (names the command
 * writes itself, e.g. "summary").
 *
 * Example
 * -------
 * ```ts
 * outputNames(["a/dot.csv", "b/dot.csv", "summary.csv"], ["summary"]);  // => ["dot", "dot-2", "summary-2"]
 * ```
 */
export function outputNames(files: readonly string[], reserved: readonly string[] = []): string[] {
  const used = new Set<string>(reserved.map((r) => r.toLowerCase()));
  return files.map((file) => {
    const stem = basename(file, extname(file)) || "curve";
    let name = stem;
    for (let k = 2; used.has(name.toLowerCase()); k++) name = `${stem}-${k}`;
    used.add(name.toLowerCase());
    return name;
  });
}
