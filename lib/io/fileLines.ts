/**
 * The lines of a text file, read in chunks: bounded memory for files of any size (the whole text
 * is never held), decoded as every reader decodes text. Node only.
 */
import { closeSync, fstatSync, openSync, readSync } from "node:fs";
import { DotspecError } from "../util/errors.ts";
import { binaryFileError } from "./decodeTextBytes.ts";

/** The text encodings a file is read in. */
export type FileEncoding = "utf-8" | "utf-16le" | "utf-16be" | "windows-1252";

/** Options of {@link forEachFileLine}. */
export interface FileLinesOptions {
  /** Bytes read per call. Default: FILE_LINES_DEFAULTS.chunkBytes (1048576, 1 MiB). */
  chunkBytes?: number;
  /** Called after each chunk with the bytes read so far and the file's size. Default: none. */
  onBytes?: (doneBytes: number, totalBytes: number) => void;
  /** What the file should be, for the binary-file message. Default "a text table". */
  what?: string;
  /** What to do about a binary file, for its message. Default "save it as UTF-8 text". */
  binaryFix?: string;
}

/** Defaults of {@link forEachFileLine} (locked by a test). */
export const FILE_LINES_DEFAULTS = Object.freeze({
  chunkBytes: 1024 * 1024,
});

/** The code thrown when a file read as UTF-8 is not valid UTF-8 (the caller reads it again as Windows-1252). */
export const NOT_UTF8 = "io/not-utf8";

/**
 * The encoding a file announces with its byte-order mark: UTF-16 LE or BE, else UTF-8.
 *
 * Example
 * -------
 * ```ts
 * fileEncoding("table.csv"); // => "utf-8"
 * ```
 */
export function fileEncoding(path: string): FileEncoding {
  const fd = open(path);
  try {
    const head = new Uint8Array(2);
    const got = readSync(fd, head, 0, 2, 0);
    if (got === 2 && head[0] === 0xff && head[1] === 0xfe) return "utf-16le";
    if (got === 2 && head[0] === 0xfe && head[1] === 0xff) return "utf-16be";
    return "utf-8";
  } finally {
    closeSync(fd);
  }
}

function open(path: string): number {
  try {
    return openSync(path, "r");
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new DotspecError(code === "ENOENT" ? "io/not-found" : "io/read-failed", `${path}: cannot be read (${code === "ENOENT" ? "no such file" : (err as Error).message})`);
  }
}

/**
 * Calls `visit` with every line of a file, in order, reading it in chunks.
 *
 * Parameters
 * ----------
 * path : string
 *     The file (opened read-only).
 * encoding : FileEncoding
 *     From {@link fileEncoding}; "windows-1252" after a UTF-8 read failed with {@link NOT_UTF8}.
 * visit : (line: string, index: number) => void
 *     Called with each line (without its line end) and its index from 0, exactly the lines of
 *     `text.split(/\r\n|\r|\n/)` on the whole decoded text (a byte-order mark dropped).
 * options : FileLinesOptions, optional
 *     chunkBytes (default 1 MiB), onBytes (progress), what (for messages).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/not-found`, `io/read-failed`; `io/binary` for a NUL byte outside UTF-16;
 *     {@link NOT_UTF8} when the file is read as UTF-8 and is not valid UTF-8; and whatever
 *     `visit` throws.
 *
 * Notes
 * -----
 * 1. Each chunk is decoded with a streaming TextDecoder (a character split between chunks is
 *    kept for the next).
 * 2. The text after the last line end is carried into the next chunk; a CR at the very end of a
 *    chunk is held back too, in case the chunk cut a CRLF in two.
 *
 * Example
 * -------
 * ```ts
 * let lines = 0;
 * forEachFileLine("sample-curves/dot-01.csv", "utf-8", () => lines++);
 * lines; // => 2009
 * ```
 */
export function forEachFileLine(path: string, encoding: FileEncoding, visit: (line: string, index: number) => void, options: FileLinesOptions = {}): void {
  const chunkBytes = options.chunkBytes ?? FILE_LINES_DEFAULTS.chunkBytes;
  if (!(Number.isInteger(chunkBytes) && chunkBytes >= 16)) throw new DotspecError("options/not-integer", `chunkBytes must be an integer of at least 16; got ${chunkBytes}`);
  const what = options.what ?? "a text table";
  const fd = open(path);
  try {
    const total = fstatSync(fd).size;
    const decoder = new TextDecoder(encoding, { fatal: encoding === "utf-8" });
    const buffer = new Uint8Array(chunkBytes);
    const checkNul = encoding === "utf-8" || encoding === "windows-1252";
    let carry = "";
    let index = 0;
    let done = 0;
    const lineEnd = /\r\n|\r|\n/g;
    const emit = (text: string, final: boolean) => {
      const t = carry + text;
      let from = 0;
      lineEnd.lastIndex = 0;
      for (let m = lineEnd.exec(t); m; m = lineEnd.exec(t)) {
        if (!final && m[0] === "\r" && m.index === t.length - 1) break; // maybe half of a CRLF
        visit(t.slice(from, m.index), index++);
        from = m.index + m[0].length;
      }
      carry = t.slice(from);
      if (final) visit(carry, index++);
    };
    for (;;) {
      const got = readSync(fd, buffer, 0, chunkBytes, done);
      if (got <= 0) break;
      const bytes = buffer.subarray(0, got);
      if (checkNul && bytes.indexOf(0) >= 0) throw binaryFileError(path, what, options.binaryFix ?? "save it as UTF-8 text");
      let text: string;
      try {
        text = decoder.decode(bytes, { stream: true });
      } catch {
        throw new DotspecError(NOT_UTF8, `${path}: not valid UTF-8 near byte ${done}`);
      }
      done += got;
      emit(text, false);
      options.onBytes?.(done, total);
    }
    let rest: string;
    try {
      rest = decoder.decode();
    } catch {
      throw new DotspecError(NOT_UTF8, `${path}: not valid UTF-8 at its end`);
    }
    emit(rest, true);
  } finally {
    closeSync(fd);
  }
}

/**
 * Runs a reading pass over a file in the encoding its start announces, once more as
 * Windows-1252 when it turns out not to be valid UTF-8.
 *
 * Parameters
 * ----------
 * path : string
 *     The file to read.
 * pass : (encoding: FileEncoding) => void
 *     The reading pass; called once with the announced encoding, and once more with
 *     "windows-1252" when that pass throws `io/not-utf8`.
 *
 * Returns
 * -------
 * { encoding: FileEncoding; warning: string | null }
 *     The encoding the last pass ran in, and a warning when it fell back to Windows-1252 (null
 *     otherwise).
 *
 * Example
 * -------
 * ```ts
 * let lines = 0;
 * const { encoding } = withFileEncoding("sample-curves/dot-01.csv", (enc) => forEachFileLine("sample-curves/dot-01.csv", enc, () => lines++));
 * encoding; // => "utf-8"
 * ```
 */
export function withFileEncoding(path: string, pass: (encoding: FileEncoding) => void): { encoding: FileEncoding; warning: string | null } {
  const first = fileEncoding(path);
  try {
    pass(first);
    return { encoding: first, warning: null };
  } catch (err) {
    if (!(err instanceof DotspecError && err.code === NOT_UTF8)) throw err;
  }
  pass("windows-1252");
  return { encoding: "windows-1252", warning: "the file is not valid UTF-8; read as Windows-1252 (Latin-1) text" };
}
