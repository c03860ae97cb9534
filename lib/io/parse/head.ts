/**
 * The head of a curve text: the first lines, enough for the importer's stages 1–5 to decide the
 * format, the header and the columns exactly as they would on the whole text. Used by the
 * streamed file reader and by the fast lane for plain numeric tables.
 */
import { isDataRow, splitLine, startsLikeNumber, type Delimiter, type DelimiterGuess } from "../cells.ts";
import { detectFormat, SAMPLE_LINES } from "./format.ts";
import { splitLines } from "./lines.ts";

/** Data rows the head holds after the first (the importer looks at the first 10 for a row-number column). */
export const HEAD_DATA_ROWS = 10;

/**
 * Collects the lines of a text's head, one at a time, and says when it is complete.
 *
 * Parameters
 * ----------
 * src : string
 *     Label of the text (for the format detection's messages).
 * delimiter : "auto" | Delimiter
 *     The importer's `delimiter` option.
 * dataRows : number, optional
 *     Data rows the head holds after the first. Default {@link HEAD_DATA_ROWS}.
 *
 * Notes
 * -----
 * 1. The head holds lines until {@link SAMPLE_LINES} content lines that start like a number have
 *    been seen (the importer's sample for the delimiter), the first data row has appeared and
 *    `dataRows` content rows follow it.
 * 2. The delimiter is detected on the head once the sample is full (the whole text gives the same
 *    sample); the first data row is then looked for among the content lines so far, and after
 *    that on each new line.
 *
 * Example
 * -------
 * ```ts
 * const head = new HeadLines("(text)", "auto", 1);
 * const lines = ["V,I", ...Array.from({ length: 60 }, (_, k) => `${k},${2 * k}`)];
 * lines.findIndex((l) => head.push(l));  // => 50
 * ```
 */
export class HeadLines {
  /** The lines pushed so far. */
  readonly lines: string[] = [];
  /** The delimiter and decimal separator, once the sample is full; null before. */
  format: DelimiterGuess | null = null;
  private numberLike = 0;
  private contentSeen = 0;
  private firstData = -1;

  constructor(
    private readonly src: string,
    private readonly delimiter: "auto" | Delimiter,
    private readonly dataRows: number = HEAD_DATA_ROWS,
  ) {}

  /** Adds the next line (without its line end); true when the head is complete with it. */
  push(line: string): boolean {
    this.lines.push(line);
    if (!isContent(line)) return false;
    this.contentSeen++;
    if (this.numberLike < SAMPLE_LINES && startsLikeNumber(line)) this.numberLike++;
    if (this.format === null) {
      if (this.numberLike < SAMPLE_LINES) return false;
      const format = detectFormat(splitLines(this.lines.join("\n"), this.src), this.delimiter);
      this.format = format;
      // The first data row among the content lines so far.
      let k = 0;
      for (const l of this.lines) {
        if (!isContent(l)) continue;
        if (isDataRow(splitLine(l, format.delimiter), format.decimalComma)) {
          this.firstData = k;
          break;
        }
        k++;
      }
    } else if (this.firstData < 0 && isDataRow(splitLine(line, this.format.delimiter), this.format.decimalComma)) this.firstData = this.contentSeen - 1;
    return this.firstData >= 0 && this.contentSeen - 1 - this.firstData >= this.dataRows;
  }
}

/** A content line: neither blank nor a comment (first non-space character `#` or `%`). */
function isContent(line: string): boolean {
  const s = line.trimStart();
  return s !== "" && s.charCodeAt(0) !== 35 && s.charCodeAt(0) !== 37;
}
