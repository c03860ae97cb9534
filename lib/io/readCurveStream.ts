/**
 * Reading a large curve file with bounded memory: the file is streamed in chunks; its head
 * (enough lines to decide the format, the header and the first data rows) goes through the
 * importer's own stages, and every later row is read in batches straight into the columns of
 * numbers. Neither the whole text nor a string per row is ever held. Node only.
 */
import { findDataRows, type DataRows } from "./parse/dataRows.ts";
import { findHeader } from "./parse/header.ts";
import { HEAD_DATA_ROWS, HeadLines } from "./parse/head.ts";
import { lazyArray, readMetadata, splitLines, type TextLines } from "./parse/lines.ts";
import { readNumbers, type ColumnValues } from "./parse/numbers.ts";
import { resolveParseOptions, type ParseOptions } from "./parse/options.ts";
import { curveHead, finishCurve, parseCurveText, type ParsedCurve } from "./parse/parseCurveText.ts";
import { addResolutions, finishResolutions, resolutionSums } from "./parse/resolution.ts";
import { endsBlank, splitLine, type DelimiterGuess } from "./cells.ts";
import { forEachFileLine, withFileEncoding } from "./fileLines.ts";
import { statSync } from "node:fs";

/** Options of {@link readCurveStream} besides those of the importer. */
export interface CurveStreamOptions {
  /** Bytes read per call. Default: FILE_LINES_DEFAULTS.chunkBytes (1048576, 1 MiB). */
  chunkBytes?: number;
  /** Data rows read into numbers at a time. Default: CURVE_STREAM_DEFAULTS.batchRows (4096). */
  batchRows?: number;
  /** Called as the file is read, with the fraction done (0 … 1). Default: none. */
  onProgress?: (fraction: number) => void;
}

/** Defaults of {@link readCurveStream} (locked by a test). */
export const CURVE_STREAM_DEFAULTS = Object.freeze({
  batchRows: 4096,
  /** Data rows the head holds after the first (the importer looks at the first 10 for a row-number column). */
  headDataRows: HEAD_DATA_ROWS,
  /** A head that needs more lines than this is not a table worth streaming: the file is read whole. */
  maxHeadLines: 200_000,
  /** Texts of rows with a missing value kept for messages (the first of them is named). */
  keptBadRows: 10_000,
});

/** What to do about a binary file (the curve importer's words). */
const BINARY_FIX = "export the sweep as CSV or plain text";

/** The file is read whole instead (a case the streamed reading does not decide alone). */
class ReadWhole extends Error {}

/**
 * A column of numbers allocated once at an estimate of its final length (from the file's size and
 * the bytes per row of the head), grown by a quarter when the estimate falls short, and handed on
 * as a view of its first `length` values: no copy at the end.
 */
class Column {
  private values: Float64Array;
  length = 0;
  constructor(capacity: number) {
    this.values = new Float64Array(capacity);
  }
  push(x: number): void {
    if (this.length === this.values.length) {
      const grown = new Float64Array(Math.ceil(this.values.length * 1.25) + 1024);
      grown.set(this.values);
      this.values = grown;
    }
    this.values[this.length++] = x;
  }
  take(): Float64Array {
    return this.length === this.values.length ? this.values : this.values.subarray(0, this.length);
  }
}

/**
 * The line index of each data row, kept as runs of consecutive lines (a run per comment or blank
 * line inside the data): a few numbers instead of one per row.
 */
class LineRuns {
  private rows: number[] = [];
  private lines: number[] = [];
  private next = -1;
  count = 0;
  push(line: number): void {
    if (line !== this.next) {
      this.rows.push(this.count);
      this.lines.push(line);
    }
    this.next = line + 1;
    this.count++;
  }
  /** The line index of data row k (from 0). */
  at(k: number): number {
    let lo = 0, hi = this.rows.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.rows[mid] <= k) lo = mid;
      else hi = mid - 1;
    }
    return this.lines[lo] + (k - this.rows[lo]);
  }
}

/**
 * Reads a curve file, streamed; the same result as {@link parseCurveBytes} on the whole file.
 *
 * Parameters
 * ----------
 * path : string
 *     The file.
 * options : ParseOptions, optional
 *     As for {@link parseCurveText}; `source` defaults to the path.
 * stream : CurveStreamOptions, optional
 *     chunkBytes (1 MiB), batchRows (4,096), onProgress.
 *
 * Returns
 * -------
 * ParsedCurve
 *     The curve and its record, equal to those of the whole-text importer.
 *
 * Throws
 * ------
 * DotspecError
 *     Every error of {@link parseCurveText} (naming the same lines), `io/binary`, `io/not-found`,
 *     `io/read-failed`.
 *
 * Notes
 * -----
 * 1. Lines come from {@link forEachFileLine} (UTF-16 by its byte-order mark, UTF-8, else
 *    Windows-1252 on a second read, with the importer's warning).
 * 2. The head: lines until {@link SAMPLE_LINES} content lines that start like a number have been
 *    seen (the importer's sample for the delimiter), the first data row has appeared and
 *    `headDataRows` rows follow it. A file that ends within its head is parsed whole
 *    (parseCurveText): it is small.
 * 3. The head goes through the importer's stages 1–5 (lines, format, data rows, header, columns,
 *    units, groups), which need nothing beyond it.
 * 4. Every data row (the head's and all later ones) is split and read into numbers in batches of
 *    `batchRows` by the importer's own `readNumbers` (so a ragged row fails with the same
 *    message and line), with the running resolution sums; comment lines further down add their
 *    metadata in file order.
 * 5. The importer's last stages (complete rows, sweeps, common bias, curve and record) run on
 *    the columns ({@link finishCurve}).
 * 6. One case is left to the whole-text importer: a head whose data rows all end in an empty
 *    cell (a trailing delimiter, dropped) followed by a row that does not. The file is then read
 *    whole, and so is a file whose head would exceed `maxHeadLines` lines.
 * Memory: one chunk of text and one batch of rows, and the columns of numbers (8 bytes per value,
 * allocated once at an estimate of the row count from the file's size, 5 % spare; line numbers
 * are kept as runs), then what the last stages allocate: for a single ascending sweep with no
 * missing values only the mean current (the columns are not copied).
 *
 * Example
 * -------
 * ```ts
 * readCurveStream("sample-curves/dot-01.csv").curve.biasV.length; // => 2000
 * ```
 */
export function readCurveStream(path: string, options: ParseOptions = {}, stream: CurveStreamOptions = {}): ParsedCurve {
  const opts: ParseOptions = { ...options, source: options.source ?? path };
  const batchRows = stream.batchRows ?? CURVE_STREAM_DEFAULTS.batchRows;
  let result: ParsedCurve | null = null;
  try {
    const { warning } = withFileEncoding(path, (encoding) => {
      result = readPass(path, encoding, opts, batchRows, stream);
    });
    if (warning) result!.record.warnings.unshift(warning);
    return result!;
  } catch (err) {
    if (!(err instanceof ReadWhole)) throw err;
  }
  // The rare layouts the streamed reading leaves to the whole-text importer (see Notes, 6).
  const lines: string[] = [];
  const { warning } = withFileEncoding(path, (encoding) => {
    lines.length = 0;
    forEachFileLine(path, encoding, (line) => void lines.push(line), { binaryFix: BINARY_FIX });
  });
  const whole = parseCurveText(lines.join("\n"), opts);
  if (warning) whole.record.warnings.unshift(warning);
  return whole;
}

function readPass(path: string, encoding: Parameters<typeof forEachFileLine>[1], opts: ParseOptions, batchRows: number, stream: CurveStreamOptions): ParsedCurve {
  const o = resolveParseOptions(opts);
  const fileBytes = statSync(path).size;
  const src = o.source;
  const D = CURVE_STREAM_DEFAULTS;
  const headLines = new HeadLines(src, o.delimiter, D.headDataRows);
  const head = headLines.lines;
  let format: DelimiterGuess | null = null;
  let headDone = false;

  // State after the head.
  let file!: TextLines;
  let table!: DataRows;
  let stages!: Omit<ReturnType<typeof curveHead>, "file" | "table">;
  let drop = false;
  let firstCells: string[] = [];
  let firstAbs = 0;
  const later: string[] = []; // comment lines after the head (metadata)
  let batchCells: string[][] = [];
  let batchAbs: number[] = [];
  let batchText: string[] = [];
  let columnsOut: (Column | null)[] = [];
  const abs = new LineRuns();
  const badText = new Map<number, string>();
  let sums!: ReturnType<typeof resolutionSums>;

  const flush = () => {
    if (!batchCells.length) return;
    const lines: string[] = [];
    lines[firstAbs] = head[firstAbs] ?? "";
    batchAbs.forEach((a, k) => (lines[a] = batchText[k]));
    const bFile: TextLines = { lines, content: [firstAbs, ...batchAbs], comments: [], metadata: file.metadata };
    const bTable: DataRows = { rows: [firstCells, ...batchCells], first: 0, ncols: table.ncols };
    const values = readNumbers(bFile, format!, bTable, stages.header, stages.columns, src);
    const shifted: ColumnValues = values.map((v) => (v ? v.subarray(1) : null));
    addResolutions(sums, { rows: bTable.rows, first: 1, ncols: table.ncols }, stages.columns, shifted, format!.decimalComma);
    for (let k = 0; k < batchAbs.length; k++) {
      let bad = false;
      for (let c = 0; c < shifted.length; c++) {
        const v = shifted[c];
        if (!v) continue;
        const x = v[k];
        columnsOut[c]!.push(x);
        if (!Number.isFinite(x)) bad = true;
      }
      abs.push(batchAbs[k]);
      if (bad && badText.size < D.keptBadRows) badText.set(batchAbs[k], batchText[k]);
    }
    batchCells = [];
    batchAbs = [];
    batchText = [];
  };

  const dataRow = (line: string, li: number) => {
    const cells = splitLine(line, format!.delimiter);
    if (drop) {
      if (!(cells.length === table.ncols + 1 && endsBlank(cells))) throw new ReadWhole();
      cells.pop();
    }
    batchCells.push(cells);
    batchAbs.push(li);
    batchText.push(line);
    if (batchCells.length >= batchRows) flush();
  };

  const finishHead = () => {
    headDone = true;
    const h = curveHead(head.join("\n"), o, format);
    file = h.file;
    table = h.table;
    stages = h;
    // Did the importer drop a trailing empty column? (its rows then have one cell fewer than the line)
    const firstLine = file.lines[file.content[table.first]];
    drop = format!.delimiter !== "whitespace" && splitLine(firstLine, format!.delimiter).length === table.ncols + 1;
    firstAbs = file.content[table.first];
    firstCells = table.rows[table.first];
    // The columns' final length, estimated from the bytes per data row of the head (5 % spare).
    let headBytes = 0;
    for (const l of head) headBytes += l.length + 1;
    let rowBytes = 0;
    for (let r = table.first; r < table.rows.length; r++) rowBytes += file.lines[file.content[r]].length + 1;
    const perChar = encoding === "utf-16le" || encoding === "utf-16be" ? 2 : 1;
    const headRows = table.rows.length - table.first;
    const estimate = headRows + Math.max(0, (fileBytes - perChar * headBytes) / ((perChar * rowBytes) / headRows));
    const capacity = Math.min(2 ** 31 - 1, Math.ceil(1.05 * estimate) + 1024);
    columnsOut = stages.columns.map((c) => (c.role === "other" ? null : new Column(capacity)));
    sums = resolutionSums(stages.columns);
    for (let r = table.first; r < table.rows.length; r++) {
      batchCells.push(table.rows[r]);
      batchAbs.push(file.content[r]);
      batchText.push(file.lines[file.content[r]]);
      if (batchCells.length >= batchRows) flush();
    }
  };

  forEachFileLine(
    path,
    encoding,
    (line, li) => {
      if (headDone) {
        const s = line.trimStart();
        if (s === "") return;
        const c = s.charCodeAt(0);
        if (c === 35 || c === 37) later.push(s);
        else dataRow(line, li);
        return;
      }
      if (headLines.lines.length >= D.maxHeadLines) throw new ReadWhole();
      if (headLines.push(line)) {
        format = headLines.format;
        finishHead();
      }
    },
    { chunkBytes: stream.chunkBytes, binaryFix: BINARY_FIX, onBytes: stream.onProgress ? (done, total) => stream.onProgress!(done / Math.max(1, total)) : undefined },
  );
  // A file that ends within its head is small: the importer reads it whole.
  if (!headDone) return parseCurveText(head.join("\n"), opts);
  flush();

  // Comments below the head add their metadata in file order, before the preamble's (as the importer orders them).
  let metadata = file.metadata;
  if (later.some((l) => {
    const m = new Map<string, string>();
    readMetadata(l, m);
    return m.size > 0;
  })) {
    const again = splitLines(head.join("\n"), src);
    for (const l of later) readMetadata(l, again.metadata);
    findHeader(again, format!.delimiter, findDataRows(again, format!, src), src, []);
    metadata = again.metadata;
  }

  const nData = abs.count;
  // Content row r: a head row before the data, else data row r − first (read from the runs; only
  // messages ask, so nothing per row is stored).
  const headContent = file.content;
  const first = table.first;
  const content = lazyArray((r) => (r < first ? headContent[r] : abs.at(r - first)));
  const lines = lazyArray((li) => badText.get(li) ?? file.lines[li] ?? "");
  const finalFile: TextLines = { lines, content, comments: [], metadata };
  const finalTable: DataRows = { rows: { length: table.first + nData } as unknown as string[][], first: table.first, ncols: table.ncols };
  const values: ColumnValues = columnsOut.map((c) => (c ? c.take() : null));
  return finishCurve({
    o,
    file: finalFile,
    format: format!,
    table: finalTable,
    header: stages.header,
    columns: stages.columns,
    groups: stages.groups,
    biasColumns: stages.biasColumns,
    values,
    resolutions: finishResolutions(sums, stages.columns),
    metadata,
    warnings: stages.warnings,
  });
}
