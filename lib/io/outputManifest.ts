/**
 * The manifest of an output folder: how dotspec knows which files in a `--out` folder it wrote
 * itself, so that it never replaces someone else's file without `--force`. Node only.
 */
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative, sep } from "node:path";
import { DotspecError } from "../util/errors.ts";
import { DOTSPEC_VERSION } from "../util/version.ts";
import { sha256Hex } from "./inputDigest.ts";
import { TEMP_FILE_PATTERN, writeTextFile } from "./writeTextFile.ts";

/** The manifest's file name inside an output folder. */
export const OUTPUT_MANIFEST_NAME = ".dotspec-manifest.json";

/** The manifest: every file dotspec wrote in the folder (paths relative to it, `/`-separated). */
export interface OutputManifest {
  tool: "dotspec";
  version: string;
  /** Path → SHA-256 of the content written, or null while a run is writing it. */
  files: Record<string, string | null>;
}

/** What {@link checkOutputFolder} found. */
export interface OutputFolderCheck {
  /** Files the manifest does not list (not written by dotspec), relative paths, sorted. */
  foreign: string[];
  /** Files dotspec wrote whose content has changed since, relative paths, sorted. */
  changed: string[];
}

/** Every file under `dir`, relative, `/`-separated. */
function filesUnder(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const entry of readdirSync(d, { withFileTypes: true })) {
      const p = join(d, entry.name);
      if (entry.isDirectory()) walk(p);
      else out.push(relative(dir, p).split(sep).join("/"));
    }
  };
  walk(dir);
  return out.sort();
}

/**
 * The manifest of a folder, or null when it has none (or an unreadable one).
 *
 * Parameters
 * ----------
 * dir : string
 *     The output folder.
 *
 * Returns
 * -------
 * OutputManifest | null
 *     Its manifest, or null when it has none or an unreadable one.
 *
 * Example
 * -------
 * ```ts
 * import { mkdtempSync, writeFileSync } from "node:fs";
 * import { tmpdir } from "node:os";
 * import { join } from "node:path";
 * const dir = mkdtempSync(join(tmpdir(), "dotspec-example-"));
 * writeFileSync(join(dir, "dot-01.json"), "{}");
 * writeOutputManifest(dir, ["dot-01.json"], true);
 * readOutputManifest(dir);
 * // => { tool: "dotspec", version: "0.1.0", files: { "dot-01.json": "44136fa355b3678a1146ad16f7e8649e94fb4fc21fe77e8310c060f61caaff8a" } }
 * ```
 */
export function readOutputManifest(dir: string): OutputManifest | null {
  const path = join(dir, OUTPUT_MANIFEST_NAME);
  if (!existsSync(path)) return null;
  try {
    const m = JSON.parse(readFileSync(path, "utf8")) as Partial<OutputManifest>;
    if (m && m.tool === "dotspec" && m.files && typeof m.files === "object") return { tool: "dotspec", version: String(m.version), files: m.files };
  } catch {
    // An unreadable manifest vouches for nothing.
  }
  return null;
}

/**
 * Checks that an output folder holds only files dotspec wrote there, unchanged.
 *
 * Parameters
 * ----------
 * dir : string
 *     The output folder (need not exist: a missing folder is clean).
 *
 * Returns
 * -------
 * OutputFolderCheck
 *     Empty lists when the folder may be written to.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-a-folder` when `dir` is a file.
 *
 * Notes
 * -----
 * 1. The folder's own manifest ({@link OUTPUT_MANIFEST_NAME}) lists every file dotspec wrote,
 *    with the SHA-256 of what it wrote (null: listed before the write, by a run that may have been
 *    interrupted).
 * 2. A file not listed is foreign, except a temporary file of an interrupted write
 *    ({@link TEMP_FILE_PATTERN}); a listed file whose SHA-256 differs was changed by someone.
 *
 * Example
 * -------
 * ```ts
 * import { mkdtempSync, writeFileSync } from "node:fs";
 * import { tmpdir } from "node:os";
 * import { join } from "node:path";
 * const dir = mkdtempSync(join(tmpdir(), "dotspec-example-"));
 * writeFileSync(join(dir, "dot-01.json"), "{}");
 * writeOutputManifest(dir, ["dot-01.json"], true);
 * writeFileSync(join(dir, "notes.txt"), "mine");
 * checkOutputFolder(dir); // => { foreign: ["notes.txt"], changed: [] }
 * ```
 */
export function checkOutputFolder(dir: string): OutputFolderCheck {
  if (!existsSync(dir)) return { foreign: [], changed: [] };
  if (!statSync(dir).isDirectory()) {
    throw new DotspecError("io/not-a-folder", `${dir}: is a file, not a folder; give a folder for the report`);
  }
  // A subfolder with a manifest of its own (a report another dotspec command wrote there, e.g.
  // report/sizes) is judged by that manifest: each file by the nearest manifest above it.
  const manifests = new Map<string, Record<string, string | null> | null>();
  const manifestOf = (sub: string) => {
    if (!manifests.has(sub)) manifests.set(sub, readOutputManifest(sub === "" ? dir : join(dir, sub))?.files ?? null);
    return manifests.get(sub)!;
  };
  const foreign: string[] = [];
  const changed: string[] = [];
  for (const file of filesUnder(dir)) {
    const parts = file.split("/");
    const name = parts[parts.length - 1];
    if (name === OUTPUT_MANIFEST_NAME) continue;
    let owner = "";
    let listed: Record<string, string | null> = {};
    for (let k = parts.length - 1; k >= 0; k--) {
      const sub = parts.slice(0, k).join("/");
      const m = manifestOf(sub);
      if (m) {
        owner = sub;
        listed = m;
        break;
      }
    }
    const key = owner === "" ? file : file.slice(owner.length + 1);
    if (!(key in listed)) {
      if (!TEMP_FILE_PATTERN.test(name)) foreign.push(file);
      continue;
    }
    const hash = listed[key];
    if (hash !== null && sha256Hex(readFileSync(join(dir, file))) !== hash) changed.push(file);
  }
  return { foreign, changed };
}

/**
 * Writes (or updates) the manifest of an output folder.
 *
 * Parameters
 * ----------
 * dir : string
 *     The output folder.
 * files : string[]
 *     Paths relative to `dir` (`/`-separated) that this run writes or has written.
 * written : boolean
 *     false before the run's writes (the files are listed with a null hash, so an interrupted run
 *     leaves a folder the next run accepts); true after them (the SHA-256 of each existing file is
 *     recorded, and a listed file that is missing is dropped).
 *
 * Notes
 * -----
 * Entries of earlier runs are kept (files of earlier runs stay dotspec's own); the manifest
 * itself is written atomically ({@link writeTextFile}).
 *
 * Example
 * -------
 * ```ts
 * import { mkdtempSync, writeFileSync } from "node:fs";
 * import { tmpdir } from "node:os";
 * import { join } from "node:path";
 * const dir = mkdtempSync(join(tmpdir(), "dotspec-example-"));
 * writeOutputManifest(dir, ["dot-01.json", "summary.csv"], false); // before the run's writes
 * writeFileSync(join(dir, "dot-01.json"), "{}");
 * writeOutputManifest(dir, ["dot-01.json", "summary.csv"], true); // after them
 * Object.keys(readOutputManifest(dir)!.files); // => ["dot-01.json"] (summary.csv was not written)
 * ```
 */
export function writeOutputManifest(dir: string, files: readonly string[], written: boolean): void {
  const entries: Record<string, string | null> = { ...(readOutputManifest(dir)?.files ?? {}) };
  for (const f of files) entries[f] = null;
  if (written) {
    for (const f of Object.keys(entries)) {
      const p = join(dir, f);
      if (!existsSync(p)) delete entries[f];
      else entries[f] = sha256Hex(readFileSync(p));
    }
  }
  const sorted = Object.fromEntries(Object.keys(entries).sort().map((k) => [k, entries[k]]));
  const manifest: OutputManifest = { tool: "dotspec", version: DOTSPEC_VERSION, files: sorted };
  writeTextFile(join(dir, OUTPUT_MANIFEST_NAME), JSON.stringify(manifest, null, 2) + "\n");
}
