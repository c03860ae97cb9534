/**
 * Reading curve files from disk, and finding them in folders. The only reads of the file system
 * in dotspec; input files are opened read-only and never modified.
 */
import { readdirSync, readFileSync, statSync, type Stats } from "node:fs";
import { extname, join, resolve } from "node:path";
import { DotspecError } from "../util/errors.ts";
import { parseCurveBytes } from "./parseCurveBytes.ts";
import { readCurveStream } from "./readCurveStream.ts";
import { inputDigest, sha256Hex, type InputDigest } from "./inputDigest.ts";
import type { ParseOptions, ParsedCurve } from "./parse/index.ts";

/** Options of {@link readCurveFile}: those of {@link parseCurveText} except `source`, which is the path. */
export type ReadCurveOptions = Omit<ParseOptions, "source">;

/** File name extensions {@link listCurveFiles} picks up in a folder (compared in lower case). */
export const CURVE_FILE_EXTENSIONS: readonly string[] = Object.freeze([".csv", ".txt", ".dat", ".tsv"]);

/** Largest file {@link readCurveFile} reads, in bytes (4 GiB): a guard against pointing at the wrong file. */
export const MAX_CURVE_FILE_BYTES = 4 * 1024 * 1024 * 1024;

/**
 * Files larger than this (16 MiB) are streamed ({@link readCurveStream}): the same result, with
 * memory for the columns of numbers but not for the text.
 */
export const STREAM_CURVE_FILE_BYTES = 16 * 1024 * 1024;

/**
 * Read one curve file.
 *
 * Parameters
 * ----------
 * path : string
 *     The file, as the user gave it; stored unchanged as `curve.meta.source` and `record.source`.
 * options : ReadCurveOptions, optional
 *     Parsing options, see {@link ParseOptions}.
 * onProgress : (fraction: number) => void, optional
 *     Called while a streamed file is read, with the fraction done (0 … 1). Default: none.
 *
 * Returns
 * -------
 * ParsedCurve
 *     The same as {@link parseCurveBytes} on the file's bytes (decoded, then {@link parseCurveText}).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found` (no such file), `io/bad-path` (not a non-empty string), `io/is-directory`,
 *     `io/unreadable` (no permission),
 *     `io/too-large` (over {@link MAX_CURVE_FILE_BYTES}, 4 GiB), `io/binary` (the file holds NUL bytes:
 *     not text, or UTF-16 without a byte-order mark), `io/read-failed` (any other read error), and
 *     every error of {@link parseCurveText}.
 *
 * Notes
 * -----
 * 1. The file is read once, synchronously, with the read-only flag; it is never written. A file
 *    over {@link STREAM_CURVE_FILE_BYTES} is streamed in chunks ({@link readCurveStream}: the same
 *    curve and record, without holding the text).
 * 2. Text encoding: UTF-8 (a BOM is ignored); UTF-16 with a byte-order mark; otherwise, when the
 *    bytes are not valid UTF-8, Windows-1252 (Latin-1) with a warning in the record.
 *
 * Example
 * -------
 * ```ts
 * const { curve, record } = readCurveFile("sample-curves/dot-01.csv");
 * curve.biasV.length; // => 2000
 * record.source; // => "sample-curves/dot-01.csv"
 * ```
 */
export function readCurveFile(path: string, options: ReadCurveOptions = {}, onProgress?: (fraction: number) => void): ParsedCurve {
  return readCurve(path, options, onProgress, false).parsed;
}

/**
 * Read one curve file and the digest of what was read: {@link readCurveFile} plus the file's
 * name, size and SHA-256 ({@link inputDigest}) for a record's provenance.
 *
 * Parameters
 * ----------
 * path : string
 *     The file, as the user gave it.
 * options : ReadCurveOptions, optional
 *     Parsing options, see {@link ParseOptions}.
 * onProgress : (fraction: number) => void, optional
 *     As for {@link readCurveFile}.
 *
 * Returns
 * -------
 * { parsed: ParsedCurve; input: InputDigest }
 *     The curve and record of {@link readCurveFile}, and the digest.
 *
 * Throws
 * ------
 * DotspecError
 *     Those of {@link readCurveFile}.
 *
 * Notes
 * -----
 * 1. A file read whole is hashed from the very bytes that were parsed (one read, and the digest
 *    cannot describe another version of the file than the one analysed).
 * 2. A streamed file (over {@link STREAM_CURVE_FILE_BYTES}) is hashed in a read of its own, before
 *    it is streamed.
 *
 * Example
 * -------
 * ```ts
 * const { parsed, input } = readCurveFileWithDigest("sample-curves/dot-01.csv");
 * input.sha256.length; // => 64
 * ```
 */
export function readCurveFileWithDigest(path: string, options: ReadCurveOptions = {}, onProgress?: (fraction: number) => void): { parsed: ParsedCurve; input: InputDigest } {
  const { parsed, input } = readCurve(path, options, onProgress, true);
  return { parsed, input: input! };
}

/** {@link readCurveFile}, with the digest of what was read when `digest` is set. */
function readCurve(path: string, options: ReadCurveOptions, onProgress: ((fraction: number) => void) | undefined, digest: boolean): { parsed: ParsedCurve; input: InputDigest | null } {
  if (typeof path !== "string" || path === "") {
    throw new DotspecError("io/bad-path", `readCurveFile: path must be a non-empty string; got ${JSON.stringify(path)}`);
  }
  if (options !== null && typeof options === "object" && "source" in options) {
    throw new DotspecError("options/unknown-key", `readCurveFile options: "source" is always the path (${JSON.stringify(path)}); leave it out`);
  }
  const stats = statOrThrow(path);
  if (stats.isDirectory()) {
    throw new DotspecError("io/is-directory", `${path}: is a folder, not a curve file; give a file, or use listCurveFiles to read the folder's .csv/.txt/.dat/.tsv files`);
  }
  if (stats.size > MAX_CURVE_FILE_BYTES) {
    throw new DotspecError(
      "io/too-large",
      `${path}: ${stats.size} bytes is more than the ${MAX_CURVE_FILE_BYTES} bytes a single curve file may have; is this the right file?`,
    );
  }
  if (stats.size > STREAM_CURVE_FILE_BYTES) {
    const input = digest ? inputDigest(path) : null;
    return { parsed: readCurveStream(path, { ...options, source: path }, onProgress ? { onProgress } : {}), input };
  }
  let bytes: Buffer;
  try {
    bytes = readFileSync(path, { flag: "r" });
  } catch (err) {
    throw fsError(path, err);
  }
  const input = digest ? { name: path, bytes: bytes.length, sha256: sha256Hex(bytes) } : null;
  return { parsed: parseCurveBytes(bytes, { ...options, source: path }), input };
}

function statOrThrow(path: string): Stats {
  try {
    return statSync(path);
  } catch (err) {
    throw fsError(path, err);
  }
}

function fsError(path: string, err: unknown): DotspecError {
  const code = (err as NodeJS.ErrnoException)?.code;
  const reason = err instanceof Error ? err.message : String(err);
  if (code === "ENOENT" || code === "ENOTDIR") {
    return new DotspecError("io/not-found", `${path}: no such file or folder (from ${resolve(".")}); check the path`);
  }
  if (code === "EISDIR") return new DotspecError("io/is-directory", `${path}: is a folder, not a curve file; give a file`);
  if (code === "EACCES" || code === "EPERM") {
    return new DotspecError("io/unreadable", `${path}: permission denied; make the file readable (for example chmod +r) or copy it`);
  }
  return new DotspecError("io/read-failed", `${path}: could not be read (${reason})`);
}

/**
 * Expand a list of files and folders into the curve files to read.
 *
 * Parameters
 * ----------
 * paths : string[]
 *     Files and folders, as the user gave them.
 *
 * Returns
 * -------
 * string[]
 *     Files in the order given; a folder is replaced by its files whose extension is one of
 *     {@link CURVE_FILE_EXTENSIONS} (any letter case), sorted by name (code-unit order), not
 *     descending into sub-folders and skipping hidden files (names starting with `.`). An explicit
 *     file is kept whatever its extension. A file reached twice is listed once (first place).
 *     May be empty (an empty folder).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found` for a path that does not exist, `io/bad-path` for a path that is not a
 *     non-empty string, `io/unreadable` for a folder that cannot be listed, `io/read-failed` otherwise.
 *
 * Example
 * -------
 * ```ts
 * listCurveFiles(["sample-curves/dot-02.tsv", "sample-curves/series/curves"]).slice(0, 3);
 * // => ["sample-curves/dot-02.tsv", "sample-curves/series/curves/qd-7-s01-1.csv", "sample-curves/series/curves/qd-7-s01-2.csv"]
 * ```
 */
export function listCurveFiles(paths: readonly string[]): string[] {
  if (!Array.isArray(paths)) {
    throw new DotspecError("io/bad-path", `listCurveFiles: paths must be a list of files and folders; got ${typeof paths}`);
  }
  const out: string[] = [];
  const seen = new Set<string>();
  const add = (p: string) => {
    const key = resolve(p);
    if (!seen.has(key)) {
      seen.add(key);
      out.push(p);
    }
  };
  for (const p of paths) {
    if (typeof p !== "string" || p === "") {
      throw new DotspecError("io/bad-path", `listCurveFiles: every path must be a non-empty string; got ${JSON.stringify(p)}`);
    }
    const stats = statOrThrow(p);
    if (!stats.isDirectory()) {
      add(p);
      continue;
    }
    let names: string[];
    try {
      names = readdirSync(p);
    } catch (err) {
      throw fsError(p, err);
    }
    names.sort();
    for (const name of names) {
      if (name.startsWith(".") || !CURVE_FILE_EXTENSIONS.includes(extname(name).toLowerCase())) continue;
      const full = join(p, name);
      let s: Stats;
      try {
        s = statSync(full);
      } catch {
        continue; // a dangling link: not a curve file
      }
      if (s.isFile()) add(full);
    }
  }
  return out;
}
