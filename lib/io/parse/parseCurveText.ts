/**
 * Reading an I–V sweep from delimited text, whatever instrument wrote it: the stages of the
 * importer composed, one module each in this folder, in the order of the Notes below.
 */
import type { Curve } from "../../curve.ts";
import { DotspecError } from "../../util/errors.ts";
import { warnColumnAssumptions } from "./assumptions.ts";
import { assignUnits } from "./columnUnits.ts";
import { nameColumns, type Column } from "./columns.ts";
import { ontoCommonBias } from "./commonBias.ts";
import { keepCompleteRows } from "./completeRows.ts";
import { makeCurve, toSampleBias } from "./curve.ts";
import { findDataRows, type DataRows } from "./dataRows.ts";
import { detectFormat } from "./format.ts";
import { groupColumns, type ColumnGroup } from "./groups.ts";
import { findHeader, type Header } from "./header.ts";
import { plainHead, readPlainRows } from "./fastRows.ts";
import { splitLines, type TextLines } from "./lines.ts";
import { readNumbers, type ColumnValues } from "./numbers.ts";
import { columnResolutions } from "./resolution.ts";
import { resolveParseOptions, type ParseOptions, type ResolvedOptions } from "./options.ts";
import type { DelimiterGuess } from "../cells.ts";
import { makeRecord, type ImportRecord, type RowCounts } from "./record.ts";
import { cutSweeps } from "./sweeps.ts";

/** Result of {@link parseCurveText}: the curve and how it was read. */
export interface ParsedCurve {
  curve: Curve;
  record: ImportRecord;
}

/**
 * Read one I–V measurement from delimited text.
 *
 * Parameters
 * ----------
 * text : string
 *     The whole file, as text. Comma, semicolon, tab or whitespace separated; CRLF or LF line ends;
 *     a UTF-8 byte-order mark is ignored.
 * options : ParseOptions, optional
 *     Source label, delimiter, units for columns without one, column choice, minimum points. See
 *     {@link ParseOptions}; defaults in {@link PARSE_DEFAULTS}.
 *
 * Returns
 * -------
 * ParsedCurve
 *     `curve`: bias in V strictly ascending, each sweep's current in A, their mean, the mean measured
 *     conductance in S (or null), and the metadata. `record`: how the file was read (see
 *     {@link ImportRecord}), including every assumption as a warning.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/empty` (nothing in the text), `io/no-numeric-rows` (no row of numbers), `io/one-column`,
 *     `io/ragged-row` (a row with another number of cells; names the line), `io/unknown-unit`
 *     (names the column and lists the accepted units), `io/no-bias-column`,
 *     `io/no-current-column`, `io/no-such-column` (a column option that matches nothing),
 *     `io/too-many-bad-rows` (more than half the rows unreadable), `io/no-common-range` (sweeps
 *     that share no bias range), `io/too-few-points` (fewer than `minPoints` distinct bias points),
 *     `options/*` for invalid options.
 *
 * Notes
 * -----
 * Each step names the module of this folder that does it.
 * 1. Lines (`lines.ts`): a BOM is dropped, lines split at CRLF/LF/CR. Blank lines are skipped;
 *    lines starting with `#` or `%` are comments, and a comment `key: value` or `key = value`
 *    becomes metadata (a repeated key keeps every value, joined by `; `).
 * 2. Format (`format.ts`): delimiter and decimal separator from up to 50 lines that start like a
 *    number (see `detectDelimiter`).
 * 3. Data and header (`dataRows.ts`, `header.ts`): the first row that is mostly numbers starts
 *    the data. The line just before it is the header (a row of units only, such as `V,pA`, is
 *    joined to the row of names above it); earlier non-comment lines are a preamble, read for
 *    metadata and reported. Without a header line, a `#` comment line just above the data is
 *    used as the header when it names a bias and a current column; otherwise column 0 (or
 *    `biasColumn`) is the bias and the other columns (or `currentColumns`) are currents, with a
 *    warning when column 0 looks like a row number.
 * 4. Columns (`columns.ts`, `columnUnits.ts`, `assumptions.ts`): each header gives a name, a unit
 *    and a role (see `readColumnHeader`). Units convert to V, A and S. Columns of other roles are
 *    ignored and listed.
 * 5. Groups (`groups.ts`): each current or conductance column belongs to the nearest bias column
 *    to its left (or the first bias column); a bias column with no current column is ignored.
 * 6. Numbers and rows (`numbers.ts`, `completeRows.ts`): rows with a missing or non-finite value
 *    in a used cell are dropped (per bias column).
 * 6b. Resolution (`resolution.ts`): per current and conductance column, the RMS over its cells of
 *    the value of one unit in the last written digit (in A or S); the curve's
 *    `meta.currentResolutionA` and `meta.conductanceResolutionS` are the RMS over the columns used.
 * 6c. Fast lane (`fastRows.ts`): a plain numeric table of at least 200 data rows (LF or CRLF, a
 *    decimal point, no quotes, comments or blank lines in the data, plain decimal numbers) has
 *    only its head read by steps 1–5; its rows are then read in one pass over the text, to the
 *    same values, resolutions and messages as step 6. Any other text takes steps 1–6 as above.
 * 7. Sweeps (`sweeps.ts`): a bias column that changes direction is cut into monotonic segments
 *    (see `splitMonotonic`). Segments that cover at least 90 % of the column's bias span are
 *    sweeps; up to two shorter segments (an interrupted sweep) are dropped with a warning. A
 *    column with more direction changes than that is sorted by bias and read as one sweep.
 * 8. Each sweep is sorted ascending and repeated bias values are averaged (`sweeps.ts`).
 * 9. Common bias (`commonBias.ts`): when the sweeps do not share the same bias points they are
 *    carried by linear interpolation onto the points of the first sweep inside their common
 *    range.
 * 10. Curve and record (`curve.ts`, `record.ts`; the step rule is `lib/util/biasGrid.ts`): `currentA` is the mean of the
 *    sweeps; `didvS` the mean of the conductance columns; the record reports the median bias
 *    step and whether the steps are uniform.
 *
 * Example
 * -------
 * ```ts
 * const { curve, record } = parseCurveText("bias (mV),current (pA)\n-2,-5\n-1,-1\n0,0\n1,1\n2,5\n");
 * curve.biasV;  // => Float64Array [-0.002, -0.001, 0, 0.001, 0.002]
 * curve.currentA[4];  // => 5e-12
 * record.biasStepV;  // => 0.001
 * ```
 */
export function parseCurveText(text: string, options: ParseOptions = {}): ParsedCurve {
  const o = resolveParseOptions(options);
  const src = o.source;
  if (typeof text !== "string") {
    throw new DotspecError("io/not-text", `${src}: the input must be text (a string); got ${typeof text}`);
  }
  return fastLane(text, o) ?? generalPath(text, o);
}

/**
 * {@link parseCurveText} without the fast lane: every text through the general path. For tests
 * that compare the two roads; not exported from the library.
 */
export function parseCurveTextGeneral(text: string, options: ParseOptions = {}): ParsedCurve {
  return generalPath(text, resolveParseOptions(options));
}

/** Stages 1–9 on the whole text, a string per line and per cell. */
function generalPath(text: string, o: ResolvedOptions): ParsedCurve {
  const { file, format, table, header, columns, groups, biasColumns, warnings } = curveHead(text, o);

  // 6. Numbers.
  const values = readNumbers(file, format, table, header, columns, o.source);
  const resolutions = columnResolutions(table, columns, values, format.decimalComma);

  // 7.–9.
  return finishCurve({ o, file, format, table, header, columns, groups, biasColumns, values, resolutions, metadata: file.metadata, warnings });
}

/**
 * Stages 1–5 on the head of a plain numeric table, stage 6 by one pass over the rest of the text
 * (`fastRows.ts`), then stages 7–9; null when the text is not such a table (or the head alone
 * fails a stage: the general path then throws its own error on the whole text).
 */
function fastLane(text: string, o: ResolvedOptions): ParsedCurve | null {
  const head = plainHead(text, o);
  if (head === null) return null;
  let stages: ReturnType<typeof curveHead>;
  try {
    stages = curveHead(head.text, o, head.format);
  } catch (err) {
    if (err instanceof DotspecError) return null;
    throw err;
  }
  const rows = readPlainRows(text, head, stages);
  if (rows === null) return null;
  const { format, header, columns, groups, biasColumns, warnings } = stages;
  return finishCurve({ o, format, header, columns, groups, biasColumns, warnings, ...rows, metadata: rows.file.metadata });
}

/**
 * Stages 1–5 of the importer on a text (the whole file, or the head of a streamed one): lines,
 * comments and metadata; delimiter and decimal separator; data rows and header; columns with
 * their roles and units; current and conductance columns grouped with their bias column.
 * `knownFormat`, when given, is what stage 2 finds on this text (detected on the same sample
 * lines by the caller), and stage 2 is skipped.
 */
export function curveHead(text: string, o: ResolvedOptions, knownFormat: DelimiterGuess | null = null) {
  const src = o.source;
  const warnings: string[] = [];
  // 1. Lines, comments, metadata.
  const file = splitLines(text, src);
  // 2. Delimiter and decimal separator (unless already detected on the same sample).
  const format = knownFormat ?? detectFormat(file, o.delimiter);
  // 3. Rows, start of the data, header (and the preamble above it).
  const table = findDataRows(file, format, src);
  const header = findHeader(file, format.delimiter, table, src, warnings);
  // 4. Columns: names, roles, overrides, units.
  const columns = nameColumns(header, table.ncols, o, src);
  const defaulted = assignUnits(columns, header.cells !== null, o.units, src, warnings);
  warnColumnAssumptions(columns, header, table, format.decimalComma, defaulted, warnings);
  // 5. Group current and conductance columns with their bias column.
  const { biasColumns, groups } = groupColumns(columns, warnings);
  return { file, format, table, header, columns, groups, biasColumns, warnings };
}

/** What the stages up to the numbers found: the input of {@link finishCurve}. */
export interface CurveStages {
  o: ResolvedOptions;
  file: TextLines;
  format: DelimiterGuess;
  table: DataRows;
  header: Header;
  columns: Column[];
  groups: ColumnGroup[];
  biasColumns: Column[];
  values: ColumnValues;
  resolutions: (number | null)[];
  metadata: Map<string, string>;
  warnings: string[];
}

/**
 * Stages 7–9 of the importer: complete rows, sweeps, common bias, the curve and its record.
 * Shared by {@link parseCurveText} and the streaming file reader, which reach it with the same
 * values by another road. `file` and `table` are used for line numbers and counts only.
 */
export function finishCurve({ o, file, format, table, header, columns, groups, biasColumns, values, resolutions, metadata, warnings }: CurveStages): ParsedCurve {
  const src = o.source;
  // 7. Rows per group, segments, sweeps.
  const kept = keepCompleteRows(file, format, table, groups, values, src, warnings);
  const sweeps = cutSweeps(file, table, columns, groups, values, kept, o.minPoints, warnings);
  const counts: RowCounts = {
    dataRows: table.rows.length - table.first,
    rowsDropped: kept.dropped,
    duplicatesMerged: sweeps.duplicatesMerged,
  };

  // 8. Common bias points.
  const common = ontoCommonBias(sweeps.sets, o.minPoints, src, counts, biasColumns, warnings);

  // 9. Curve and record.
  const asRead = makeCurve(common, src, metadata, curveResolutions(groups, resolutions));
  const curve = o.biasPolarity === "tip" ? toSampleBias(asRead) : asRead;
  const record = makeRecord({ src, format, header, columns, resolutions, counts, sweeps, curve, metadata, warnings, biasPolarity: o.biasPolarity });
  return { curve, record };
}

/** RMS resolution over the current (and over the conductance) columns of the groups used; null when none is known. */
function curveResolutions(groups: readonly ColumnGroup[], resolutions: readonly (number | null)[]): { currentA: number | null; conductanceS: number | null } {
  const rms = (indices: number[]): number | null => {
    const known = indices.map((i) => resolutions[i]).filter((q): q is number => q !== null);
    if (!known.length) return null;
    const top = Math.max(...known);
    if (top === 0) return 0;
    return top * Math.sqrt(known.reduce((a, q) => a + (q / top) ** 2, 0) / known.length);
  };
  return { currentA: rms(groups.flatMap((g) => g.currents)), conductanceS: rms(groups.flatMap((g) => g.conductances)) };
}
