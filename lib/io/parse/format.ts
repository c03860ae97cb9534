/**
 * Stage 2 of the importer: the cell separator and the decimal separator of the data lines.
 */
import { detectDelimiter, startsLikeNumber, type Delimiter, type DelimiterGuess } from "../cells.ts";
import type { TextLines } from "./lines.ts";

/** Lines used to detect the delimiter. */
export const SAMPLE_LINES = 50;

/**
 * Detect the delimiter and the decimal separator.
 *
 * Parameters
 * ----------
 * file : TextLines
 *     The lines of stage 1.
 * delimiter : "auto" | Delimiter
 *     The `delimiter` option: `"auto"` tries every delimiter; any other value is the only
 *     candidate (then only the decimal separator is detected).
 *
 * Returns
 * -------
 * DelimiterGuess
 *     The delimiter and whether numbers use a decimal comma (see `detectDelimiter`).
 *
 * Notes
 * -----
 * 1. The sample: up to {@link SAMPLE_LINES} content lines that start like a number, in file
 *    order; the first {@link SAMPLE_LINES} content lines when none does.
 * 2. `detectDelimiter` scores each candidate on the sample (same cell count on every line,
 *    cells that read as numbers).
 *
 * Example
 * -------
 * ```ts
 * detectFormat(splitLines("V;I\n0,5;1\n1,5;2\n", "(text)"), "auto");
 * // => { delimiter: ";", decimalComma: true }
 * ```
 */
export function detectFormat(file: TextLines, delimiter: "auto" | Delimiter): DelimiterGuess {
  const { lines, content } = file;
  const sample: string[] = [];
  for (const i of content) {
    if (sample.length >= SAMPLE_LINES) break;
    if (startsLikeNumber(lines[i])) sample.push(lines[i]);
  }
  if (sample.length === 0) for (const i of content.slice(0, SAMPLE_LINES)) sample.push(lines[i]);
  return detectDelimiter(sample, delimiter === "auto" ? undefined : [delimiter]);
}
