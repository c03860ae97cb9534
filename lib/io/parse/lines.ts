/**
 * Stage 1 of the importer: the text as lines, sorted into content and comments, and the
 * `key: value` metadata of the comments.
 */
import { DotspecError } from "../../util/errors.ts";

/** The text as lines, sorted into content and comments. */
export interface TextLines {
  /** Every line of the text (BOM dropped), without its line end. */
  lines: string[];
  /** Indices in `lines` of the lines that are neither blank nor comments, in file order. */
  content: number[];
  /** Indices in `lines` of the comment lines (first non-space character `#` or `%`). */
  comments: number[];
  /** The `key: value` / `key = value` metadata of the comments; stage 3 adds that of a preamble. */
  metadata: Map<string, string>;
}

/**
 * Cut a text into lines and sort them into content and comments.
 *
 * Parameters
 * ----------
 * text : string
 *     The whole file. CRLF, LF or CR line ends; a UTF-8 byte-order mark is dropped.
 * src : string
 *     Label of the text, put in front of error messages.
 *
 * Returns
 * -------
 * TextLines
 *     Every line, the indices of the content and comment lines, and the metadata of the comments.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/empty` for a text of white space only; `io/no-numeric-rows` when every non-blank line
 *     is a comment.
 *
 * Notes
 * -----
 * 1. A leading BOM (U+FEFF) is dropped; lines are split at CRLF, LF or CR.
 * 2. Blank lines are skipped. A line whose first non-space character is `#` or `%` is a comment;
 *    its `key: value` or `key = value` goes into the metadata ({@link readMetadata}).
 * 3. Every other line is content, in file order.
 *
 * Example
 * -------
 * ```ts
 * const t = splitLines("# eta: 0.85\nbias,current\n0,1\n", "(text)");
 * t.content;                 // => [1, 2]
 * t.metadata.get("eta");     // => "0.85"
 * ```
 */
export function splitLines(text: string, src: string): TextLines {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === "") {
    throw new DotspecError(
      "io/empty",
      `${src}: the file is empty; expected a header such as "bias (V),current (A)" followed by rows of numbers`,
    );
  }
  const lines = body.indexOf("\r") < 0 ? body.split("\n") : body.split(/\r\n|\r|\n/);
  const content: number[] = [];
  const comments: number[] = [];
  const metadata = new Map<string, string>();
  for (let i = 0; i < lines.length; i++) {
    const s = lines[i].trimStart();
    if (s === "") continue;
    const c = s.charCodeAt(0);
    if (c === 35 || c === 37) {
      comments.push(i);
      readMetadata(s, metadata);
    } else {
      content.push(i);
    }
  }
  if (content.length === 0) {
    throw new DotspecError(
      "io/no-numeric-rows",
      `${src}: the file has only comment lines (${comments.length}) and no rows of numbers; ` +
        `expected rows like "-1.5,2.3e-12" below the header`,
    );
  }
  return { lines, content, comments, metadata };
}

/**
 * Add the `key: value` or `key = value` of a comment or preamble line to the metadata.
 *
 * Parameters
 * ----------
 * line : string
 *     One line; leading `#` and `%` characters are skipped.
 * into : Map<string, string>
 *     The metadata, changed in place: a repeated key joins its values with `; `.
 *
 * Returns
 * -------
 * void
 *
 * Notes
 * -----
 * 1. The key is the text before the first `:` or `=`, trimmed; it must start with a letter or
 *    `_` and be at most 80 characters long, otherwise the line is not metadata.
 * 2. The value is the rest of the line, trimmed (it may be empty).
 *
 * Example
 * -------
 * ```ts
 * const m = new Map<string, string>();
 * readMetadata("# T = 4.5 K", m);
 * readMetadata("% T: 4.6 K", m);
 * m.get("T");  // => "4.5 K; 4.6 K"
 * ```
 */
export function readMetadata(line: string, into: Map<string, string>): void {
  let s = line.trimStart();
  let k = 0;
  while (k < s.length && (s[k] === "#" || s[k] === "%")) k++;
  s = s.slice(k).trim();
  const colon = s.indexOf(":");
  const equals = s.indexOf("=");
  const at = colon < 0 ? equals : equals < 0 ? colon : Math.min(colon, equals);
  if (at <= 0) return;
  const key = s.slice(0, at).trim();
  if (key.length === 0 || key.length > 80 || !/^[A-Za-z_]/.test(key)) return;
  const value = s.slice(at + 1).trim();
  const prev = into.get(key);
  into.set(key, prev === undefined ? value : `${prev}; ${value}`);
}

/**
 * Line number (from 1) of a content row.
 *
 * Parameters
 * ----------
 * file : TextLines
 * r : number
 *     Index of the row among the content lines, from 0.
 *
 * Returns
 * -------
 * number
 *     Its line number in the file, from 1 (for messages).
 *
 * Example
 * -------
 * ```ts
 * lineNumber(splitLines("# c\n1,2\n", "(text)"), 0);  // => 2
 * ```
 */
export function lineNumber(file: TextLines, r: number): number {
  return file.content[r] + 1;
}

/**
 * A content row as written.
 *
 * Parameters
 * ----------
 * file : TextLines
 * r : number
 *     Index of the row among the content lines, from 0.
 *
 * Returns
 * -------
 * string
 *     The line, without its line end.
 *
 * Example
 * -------
 * ```ts
 * lineText(splitLines("# c\n1,2\n", "(text)"), 0);  // => "1,2"
 * ```
 */
export function lineText(file: TextLines, r: number): string {
  return file.lines[file.content[r]];
}

/**
 * An array whose elements are computed when read: for `TextLines.lines` and `.content` of a text
 * read without a string per line (only messages ask for a line, so nothing per line is stored).
 *
 * Parameters
 * ----------
 * at : (i: number) => T
 *     The element at index i.
 *
 * Returns
 * -------
 * T[]
 *     A proxy of an empty array: an index reads `at(i)`; other properties are the empty array's
 *     (its length is 0).
 *
 * Example
 * -------
 * ```ts
 * lazyArray((i) => 2 * i)[21];  // => 42
 * ```
 */
export function lazyArray<T>(at: (i: number) => T): T[] {
  return new Proxy([] as T[], {
    get: (target, prop) => (typeof prop === "string" && /^\d+$/.test(prop) ? at(Number(prop)) : Reflect.get(target, prop)),
  });
}
