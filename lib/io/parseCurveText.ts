/**
 * Reading an I–V sweep from delimited text, whatever instrument wrote it.
 */
import type { Curve } from "../curve.ts";
import { DotspecError } from "../util/errors.ts";
import { checkInteger, checkKnownKeys, checkOneOf } from "../util/check.ts";
import {
  detectDelimiter,
  endsBlank,
  isDataRow,
  parseNumberCell,
  splitLine,
  startsLikeNumber,
  type Delimiter,
  type DelimiterGuess,
} from "./cells.ts";
import { isUnitsRow, readColumnHeader, splitSpacedHeader, stripBrackets, type ColumnRole } from "./readColumnHeader.ts";
import { ACCEPTED_UNITS, SI_UNIT, findUnit, parseUnit, toSI, type Quantity, type UnitInfo } from "./units.ts";
import { chooseSweeps, interpolateOnto, mergeDuplicates, splitMonotonic, type Segment } from "./sweepSegments.ts";

/** A column chosen by its header (name with or without unit, any letter case) or its index from 0. */
export type ColumnRef = string | number;

/** Options of {@link parseCurveText}. Every field is optional; defaults are in {@link PARSE_DEFAULTS}. */
export interface ParseOptions {
  /** Label stored as `curve.meta.source` and put in front of every error message. Default `"(text)"`. */
  source?: string;
  /**
   * Cell separator: `","`, `";"`, `"\t"`, `"whitespace"` (runs of spaces/tabs), or `"auto"` to detect
   * it from the data lines. Default `"auto"`. A decimal comma (`1,25`) is detected in every case
   * (with `","` only in quoted cells, `"1,25"`).
   */
  delimiter?: "auto" | Delimiter;
  /**
   * Unit of the bias column when its header has none, or when the file has no header: `"V"`, `"mV"`,
   * `"µV"`… Default null: the header's unit, else V with a warning. A unit in the header wins.
   */
  biasUnit?: string | null;
  /**
   * Unit of the current columns when their header has none (or no header): `"A"`, `"mA"`, `"µA"`,
   * `"nA"`, `"pA"`, `"fA"`. Default null: the header's unit, else A with a warning.
   */
  currentUnit?: string | null;
  /**
   * Unit of measured conductance (dI/dV) columns when their header has none: `"S"`, `"mS"`, `"µS"`,
   * `"nS"`, `"pS"` or the same as `A/V`. Default null: the header's unit, else S with a warning.
   */
  conductanceUnit?: string | null;
  /**
   * The bias column, by header or by index from 0, when the names do not say it. Default null:
   * found from the names (`bias`, `voltage`, `V`, `U`, `sample bias`…), or column 0 without header.
   */
  biasColumn?: ColumnRef | null;
  /**
   * The current columns (several = repeated sweeps), by header or index from 0. Default null: found
   * from the names (`current`, `I`, `It`…), or every column after the first without header.
   */
  currentColumns?: readonly ColumnRef[] | null;
  /** Fewest distinct bias points a curve may have after cleaning, in samples. Default 5. */
  minPoints?: number;
}

/** Defaults of {@link ParseOptions}. */
export const PARSE_DEFAULTS = Object.freeze({
  source: "(text)",
  delimiter: "auto" as "auto" | Delimiter,
  biasUnit: null as string | null,
  currentUnit: null as string | null,
  conductanceUnit: null as string | null,
  biasColumn: null as ColumnRef | null,
  currentColumns: null as readonly ColumnRef[] | null,
  minPoints: 5,
});

/** How a column of the file was read. */
export interface ImportColumn {
  /** Position in the row, from 0. */
  index: number;
  /** Header cell as written (trimmed); `""` when the file has no header. */
  header: string;
  /** Header without its unit; `"column 0"`, `"column 1"`… when the file has no header. */
  name: string;
  /** What the column was used as; `"other"` columns were ignored. */
  role: ColumnRole;
  /** The unit used (`"pA"`), or null for ignored columns. */
  unit: string | null;
  /** SI value of one unit (1e-12 for pA), or null for ignored columns. */
  scale: number | null;
  /** Where the unit came from: the header, an option, or the SI default (with a warning). */
  unitFrom: "header" | "option" | "default" | null;
}

/** Order of the bias values found in the file. */
export type BiasDirection = "ascending" | "descending" | "both" | "unordered";

/** What {@link parseCurveText} understood of the file: enough to trace every number back to it. */
export interface ImportRecord {
  /** The `source` option (the file path for {@link readCurveFile}). */
  source: string;
  /** Cell separator used. */
  delimiter: Delimiter;
  /** Decimal separator of the numbers. */
  decimalSeparator: "." | ",";
  /** True when the file has a header line. */
  hasHeader: boolean;
  /** Line number (from 1) of the header, or null; may be a `#` comment line just above the data. */
  headerLine: number | null;
  /** Every column of the file. */
  columns: ImportColumn[];
  /** Headers (or names) of the columns that were ignored. */
  ignoredColumns: string[];
  /** Data rows read (lines after the header that are not comments or blank). */
  dataRows: number;
  /** Data rows left out for missing or non-numeric values in a bias, current or conductance cell. */
  rowsDropped: number;
  /** Rows merged into another row with the same bias (within one sweep), counted once per extra row. */
  duplicatesMerged: number;
  /** Number of sweeps in `curve.sweeps`: current columns × monotonic bias segments. */
  sweeps: number;
  /** Monotonic bias segments used, summed over bias columns (2 for one there-and-back column). */
  segments: number;
  /** Order of the bias in the file: one direction, both (sweeps split), or unordered (sorted). */
  biasDirection: BiasDirection;
  /** Number of bias points of the curve. */
  points: number;
  /** First and last bias of the curve, V. */
  biasRangeV: [number, number];
  /** Median bias step of the curve, V. */
  biasStepV: number;
  /** True when every step is within 1 % of the median step. Resampling is left to the signal stage. */
  uniformStep: boolean;
  /** Keys of the `key: value` / `key = value` metadata, in file order. */
  metadataKeys: string[];
  /** Everything assumed or repaired, in plain words. */
  warnings: string[];
}

/** Result of {@link parseCurveText}: the curve and how it was read. */
export interface ParsedCurve {
  curve: Curve;
  record: ImportRecord;
}

/** Share of the span of the whole bias column a segment must cover to count as a full sweep. */
const FULL_SWEEP_SHARE = 0.9;
/** Tolerance of {@link ImportRecord.uniformStep}, as a fraction of the median step. */
const UNIFORM_STEP_RTOL = 0.01;
/** Lines used to detect the delimiter. */
const SAMPLE_LINES = 50;

/** {@link ParseOptions} checked, with the defaults filled in and the unit options parsed. */
type ResolvedOptions = ReturnType<typeof resolveOptions>;

/** Stage 1: the text as lines, sorted into content and comments. */
interface TextLines {
  /** Every line of the text (BOM dropped), without its line end. */
  lines: string[];
  /** Indices in `lines` of the lines that are neither blank nor comments, in file order. */
  content: number[];
  /** Indices in `lines` of the comment lines (first non-space character `#` or `%`). */
  comments: number[];
  /** The `key: value` / `key = value` metadata of the comments; stage 3 adds that of a preamble. */
  metadata: Map<string, string>;
}

/** Stage 3: the content lines as cells, and where the data starts. */
interface DataRows {
  /** Cells of every content line: `rows[r]` is line `content[r]`. */
  rows: string[][];
  /** Index in `rows` of the first data row; the data runs to the last row. */
  first: number;
  /** Cells per data row (an empty last column already dropped). */
  ncols: number;
}

/** Stage 3: the header of the columns. */
interface Header {
  /** One cell per column (a row of units already joined to the names); null when the file has no header. */
  cells: string[] | null;
  /** Line number (from 1) of the header, or null. */
  line: number | null;
}

/** A column while it is read: {@link ImportColumn} and what its header says. */
interface Column extends ImportColumn {
  /** The unit as written in the header (not yet validated), or null. */
  unitText: string | null;
  /** The header names a tip bias. */
  tipBias: boolean;
  /** The unit used, chosen in stage 4; null for ignored columns. */
  unitInfo: UnitInfo | null;
}

/** Stage 5: a bias column with the current and conductance columns read against it. */
interface ColumnGroup {
  /** Index of the bias column. */
  bias: number;
  /** Indices of its current columns (at least one). */
  currents: number[];
  /** Indices of its conductance columns. */
  conductances: number[];
}

/** Stage 5: the columns grouped. */
interface ColumnGroups {
  /** Every column read as bias in stage 4, ignored ones included (named in io/too-few-points). */
  biasColumns: Column[];
  /** The groups that have a current column, in column order. */
  groups: ColumnGroup[];
}

/** Stage 6: the numbers of the used columns in SI units, indexed by column then data row; null for ignored columns. */
type ColumnValues = (Float64Array | null)[];

/** Stage 7: the data rows each group keeps. */
interface KeptRows {
  /** Per group (same order), the data rows (from 0) with a finite value in every cell of the group. */
  perGroup: number[][];
  /** Data rows left out of at least one group. */
  dropped: number;
}

/** Sweeps on a common bias: one bias array, the current and conductance columns on it. */
interface SweepSet {
  /** Strictly ascending bias, V. */
  biasV: Float64Array;
  /** Current of each sweep on `biasV`, A. */
  currents: Float64Array[];
  /** Measured conductance of each conductance column on `biasV`, S. */
  conductances: Float64Array[];
}

/** Stage 7: the sweeps of every group. */
interface Sweeps {
  /** One set per segment used (or per sorted group), in column order then file order. */
  sets: SweepSet[];
  /** Directions of the bias of the segments used; `"unordered"` for a sorted group. */
  directions: Set<BiasDirection>;
  /** Monotonic bias segments used, summed over the groups. */
  segments: number;
  /** Rows merged into another row with the same bias. */
  duplicatesMerged: number;
}

/** Stages 6 and 7: what happened to the data rows, for the record and the io/too-few-points message. */
interface RowCounts {
  /** Data rows read. */
  dataRows: number;
  /** Data rows left out for a missing or non-numeric value. */
  rowsDropped: number;
  /** Rows merged into another row with the same bias. */
  duplicatesMerged: number;
}

/** Stage 9: everything the {@link ImportRecord} reports. */
interface RecordParts {
  src: string;
  format: DelimiterGuess;
  header: Header;
  columns: readonly Column[];
  counts: RowCounts;
  sweeps: Sweeps;
  curve: Curve;
  metadata: Map<string, string>;
  warnings: string[];
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
 * 1. Lines: a BOM is dropped, lines split at CRLF/LF/CR. Blank lines are skipped; lines starting
 *    with `#` or `%` are comments, and a comment `key: value` or `key = value` becomes metadata
 *    (a repeated key keeps every value, joined by `; `).
 * 2. Delimiter and decimal separator from up to 50 lines that start like a number (see
 *    `detectDelimiter`).
 * 3. The first row that is mostly numbers starts the data. The line just before it is the header
 *    (a row of units only, such as `V,pA`, is joined to the row of names above it); earlier
 *    non-comment lines are a preamble, read for metadata and reported. Without a header line, a
 *    `#` comment line just above the data is used as the header when it names a bias and a
 *    current column; otherwise column 0 (or `biasColumn`) is the bias and the other columns (or
 *    `currentColumns`) are currents, with a warning when column 0 looks like a row number.
 * 4. Each header gives a name, a unit and a role (see `readColumnHeader`). Units convert to V, A
 *    and S. Columns of other roles are ignored and listed.
 * 5. Each current or conductance column belongs to the nearest bias column to its left (or the
 *    first bias column); a bias column with no current column is ignored.
 * 6. Rows with a missing or non-finite value in a used cell are dropped (per bias column).
 * 7. A bias column that changes direction is cut into monotonic segments (see `splitMonotonic`).
 *    Segments that cover at least 90 % of the column's bias span are sweeps; up to two shorter
 *    segments (an interrupted sweep) are dropped with a warning. A column with more direction
 *    changes than that is sorted by bias and read as one sweep.
 * 8. Each sweep is sorted ascending and repeated bias values are averaged.
 * 9. When the sweeps do not share the same bias points they are carried by linear interpolation
 *    onto the points of the first sweep inside their common range.
 * 10. `currentA` is the mean of the sweeps; `didvS` the mean of the conductance columns.
 *
 * Example
 * -------
 * const { curve, record } = parseCurveText("bias (mV),current (pA)\n-2,-5\n-1,-1\n0,0\n1,1\n2,5\n");
 * curve.biasV;  // => Float64Array [-0.002, -0.001, 0, 0.001, 0.002]
 * curve.currentA[4];  // => 5e-12
 * record.biasStepV;  // => 0.001
 */
export function parseCurveText(text: string, options: ParseOptions = {}): ParsedCurve {
  const o = resolveOptions(options);
  const src = o.source;
  if (typeof text !== "string") {
    throw new DotspecError("io/not-text", `${src}: the input must be text (a string); got ${typeof text}`);
  }
  const warnings: string[] = [];

  // 1. Lines, comments, metadata.
  const file = splitLines(text, src);

  // 2. Delimiter and decimal separator.
  const format = detectFormat(file, o.delimiter);

  // 3. Rows, start of the data, header (and the preamble above it).
  const table = findDataRows(file, format, src);
  const header = findHeader(file, format.delimiter, table, src, warnings);

  // 4. Columns: names, roles, overrides, units.
  const columns = nameColumns(header, table.ncols, o, src);
  const defaulted = assignUnits(columns, header.cells !== null, o.units, src, warnings);
  warnColumnAssumptions(columns, header, table, format.decimalComma, defaulted, warnings);

  // 5. Group current and conductance columns with their bias column.
  const { biasColumns, groups } = groupColumns(columns, warnings);

  // 6. Numbers.
  const values = readNumbers(file, format, table, header, columns, src);

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
  const curve = makeCurve(common, src, file.metadata);
  const record = makeRecord({ src, format, header, columns, counts, sweeps, curve, metadata: file.metadata, warnings });
  return { curve, record };
}

/* ---------------------------------------------------------------------------------------------- */
/* Stages                                                                                          */

/**
 * Stage 1 (Notes 1): drop a BOM, cut the text into lines, sort them into content and comments,
 * and read the `key: value` metadata of the comments. Throws io/empty, and io/no-numeric-rows
 * when every line is a comment.
 */
function splitLines(text: string, src: string): TextLines {
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
 * Stage 2 (Notes 2): the delimiter and decimal separator, detected on up to {@link SAMPLE_LINES}
 * content lines that start like a number (the first content lines when none does). A `delimiter`
 * option other than `"auto"` is the only candidate: then only the decimal separator is detected.
 */
function detectFormat(file: TextLines, delimiter: "auto" | Delimiter): DelimiterGuess {
  const { lines, content } = file;
  const sample: string[] = [];
  for (const i of content) {
    if (sample.length >= SAMPLE_LINES) break;
    if (startsLikeNumber(lines[i])) sample.push(lines[i]);
  }
  if (sample.length === 0) for (const i of content.slice(0, SAMPLE_LINES)) sample.push(lines[i]);
  return detectDelimiter(sample, delimiter === "auto" ? undefined : [delimiter]);
}

/**
 * Stage 3 (Notes 3), the data: split every content line into cells and find the first row that is
 * mostly numbers. An empty last cell in every data row (a trailing delimiter) is dropped. Throws
 * io/no-numeric-rows and io/one-column.
 */
function findDataRows(file: TextLines, format: DelimiterGuess, src: string): DataRows {
  const { lines, content } = file;
  const { delimiter, decimalComma } = format;
  const rows = content.map((i) => splitLine(lines[i], delimiter));
  let first = -1;
  for (let r = 0; r < rows.length; r++) {
    if (isDataRow(rows[r], decimalComma)) {
      first = r;
      break;
    }
  }
  if (first < 0) {
    throw new DotspecError(
      "io/no-numeric-rows",
      `${src}: no row of numbers found in ${content.length} non-comment line(s) (line ${content[0] + 1}: ` +
        `${quote(lines[content[0]])}); expected rows like "-1.5,2.3e-12" below the header`,
    );
  }
  let ncols = rows[first].length;
  if (delimiter !== "whitespace" && endsBlank(rows[first])) {
    let all = true;
    for (let r = first; r < rows.length && all; r++) all = rows[r].length === ncols && endsBlank(rows[r]);
    if (all) {
      for (let r = first; r < rows.length; r++) rows[r].pop();
      ncols--;
    }
  }
  if (ncols < 2) {
    throw new DotspecError(
      "io/one-column",
      `${src}: the data rows have a single column (line ${lineNumber(file, first)}: ${quote(lineText(file, first))}); ` +
        `a curve needs a bias column and at least one current column, separated by commas, semicolons, tabs or spaces`,
    );
  }
  return { rows, first, ncols };
}

/**
 * Stage 3 (Notes 3), the header: the line just above the data (see {@link headerAbove}); when the
 * data starts on the first content line, a `#` comment line just above it that names a bias and a
 * current column (see {@link commentHeader}); otherwise none.
 */
function findHeader(file: TextLines, delimiter: Delimiter, table: DataRows, src: string, warnings: string[]): Header {
  return table.first > 0 ? headerAbove(file, delimiter, table, src, warnings) : commentHeader(file, delimiter, table);
}

/**
 * The header when content lines precede the data: the line just above it, joined to the row of
 * names above when it holds units only (`V,pA`). Earlier content lines are a preamble: read into
 * `file.metadata`, and reported. Throws io/ragged-row when the header has another number of cells.
 */
function headerAbove(file: TextLines, delimiter: Delimiter, table: DataRows, src: string, warnings: string[]): Header {
  const { rows, first, ncols } = table;
  let h = first - 1;
  let cells = headerCells(file, rows, h, ncols, delimiter);
  // A row of units under a row of names ("Bias,Current" then "V,pA"): join them.
  if (h > 0 && cells.length === ncols && isUnitsRow(cells)) {
    const names = headerCells(file, rows, h - 1, ncols, delimiter);
    if (names.length === ncols) {
      const units = cells;
      cells = names.map((name, i) => (units[i].trim() === "" ? name : `${name.trim()} (${stripBrackets(units[i])})`));
      h--;
    }
  }
  const line = lineNumber(file, h);
  if (cells.length !== ncols) {
    throw new DotspecError(
      "io/ragged-row",
      `${src}: line ${line} (the header) has ${cells.length} cells but the data rows from line ` +
        `${lineNumber(file, first)} have ${ncols}; give every column one header cell` +
        (delimiter === "whitespace" ? " (with space-separated columns, write names without spaces, e.g. bias_V current_nA)" : ""),
    );
  }
  if (h > 0) {
    for (let r = 0; r < h; r++) readMetadata(lineText(file, r), file.metadata);
    warnings.push(
      `lines ${lineNumber(file, 0)}–${lineNumber(file, h - 1)} above the header are not data; ` +
        `read for key: value metadata and otherwise skipped`,
    );
  }
  return { cells, line };
}

/**
 * The cells of content row `r` read as a header of `ncols` columns: an empty last cell beyond
 * `ncols` dropped, and a whitespace-separated line split again so that names may hold spaces.
 */
function headerCells(file: TextLines, rows: readonly string[][], r: number, ncols: number, delimiter: Delimiter): string[] {
  let cells = rows[r];
  if (cells.length === ncols + 1 && endsBlank(cells)) cells = cells.slice(0, -1);
  if (delimiter === "whitespace" && cells.length !== ncols) cells = splitSpacedHeader(lineText(file, r), ncols);
  return cells;
}

/**
 * The header of data that starts on the first content line: the last comment line above the data,
 * without its `#` or `%`, when it has one cell per column and names a bias and a current column.
 */
function commentHeader(file: TextLines, delimiter: Delimiter, table: DataRows): Header {
  const { lines, content, comments } = file;
  const { first, ncols } = table;
  const above = comments.filter((i) => i < content[first]);
  if (above.length > 0) {
    const line = lines[above[above.length - 1]].trimStart().replace(/^[#%]+/, "");
    const cells = delimiter === "whitespace" ? splitSpacedHeader(line, ncols) : splitLine(line, delimiter);
    if (cells.length === ncols + 1 && endsBlank(cells)) cells.pop();
    const roles = cells.map((c) => readColumnHeader(c).role);
    if (cells.length === ncols && roles.includes("bias") && roles.includes("current")) {
      return { cells, line: above[above.length - 1] + 1 };
    }
  }
  return { cells: null, line: null };
}

/**
 * Stage 4 (Notes 3–4), roles: one {@link Column} per data cell, named and given a role by its
 * header (see `readColumnHeader`); without header, column 0 is the bias and the others currents.
 * Then the options `biasColumn` and `currentColumns` override the roles. Throws io/no-such-column,
 * options/column-twice, io/no-bias-column and io/no-current-column.
 */
function nameColumns(header: Header, ncols: number, o: ResolvedOptions, src: string): Column[] {
  const headerCells = header.cells;
  const columns: Column[] = [];
  for (let index = 0; index < ncols; index++) {
    if (headerCells) {
      const h = readColumnHeader(headerCells[index]);
      columns.push({ index, header: h.header, name: h.name, role: h.role, unit: null, scale: null, unitFrom: null, unitText: h.unitText, tipBias: h.tipBias, unitInfo: null });
    } else {
      columns.push({ index, header: "", name: `column ${index}`, role: "other", unit: null, scale: null, unitFrom: null, unitText: null, tipBias: false, unitInfo: null });
    }
  }
  if (!headerCells) {
    // Without header: the bias is biasColumn (default 0), the currents are currentColumns (default all others).
    const b = o.biasColumn === null ? 0 : findColumn(src, "biasColumn", o.biasColumn, columns);
    for (const c of columns) c.role = c.index === b ? "bias" : o.currentColumns === null ? "current" : "other";
  }
  if (headerCells && o.biasColumn !== null) {
    const b = findColumn(src, "biasColumn", o.biasColumn, columns);
    for (const c of columns) if (c.role === "bias") c.role = "other";
    columns[b].role = "bias";
  }
  if (o.currentColumns !== null) {
    const picked = o.currentColumns.map((ref) => findColumn(src, "currentColumns", ref, columns));
    for (const c of columns) if (c.role === "current") c.role = "other";
    for (const i of picked) {
      if (o.biasColumn !== null && columns[i].role === "bias") {
        throw new DotspecError(
          "options/column-twice",
          `${src}: column ${i} (${describeColumn(columns[i])}) is named both in biasColumn and in currentColumns; name it in one only`,
        );
      }
      columns[i].role = "current";
    }
  }
  const listColumns = () => columns.map(describeColumn).join(", ");
  if (!columns.some((c) => c.role === "bias")) {
    throw new DotspecError(
      "io/no-bias-column",
      `${src}: no bias column among ${listColumns()}; name it in the header (for example "bias (V)", ` +
        `"V", "U", "voltage", "sample bias") or pass the option biasColumn (header or index from 0)`,
    );
  }
  if (!columns.some((c) => c.role === "current")) {
    throw new DotspecError(
      "io/no-current-column",
      `${src}: no current column among ${listColumns()}; name it in the header (for example "current (A)", ` +
        `"I", "It") or pass the option currentColumns (headers or indices from 0)`,
    );
  }
  return columns;
}

/**
 * Stage 4 (Notes 4), units: each used column takes the unit of its header, else the unit option of
 * its quantity (`biasUnit`, `currentUnit`, `conductanceUnit`), else the SI unit. A conductance column
 * in volts (a lock-in signal) is ignored. Returns the columns given the SI unit by default, described
 * for a warning. Throws io/unknown-unit.
 */
function assignUnits(
  columns: Column[],
  hasHeader: boolean,
  units: Record<Quantity, UnitInfo | null>,
  src: string,
  warnings: string[],
): string[] {
  const defaulted: string[] = [];
  for (const c of columns) {
    if (c.role === "other") continue;
    const q = c.role;
    const optionUnit = units[q];
    const optionName = `${q}Unit`;
    if (c.unitText !== null) {
      const u = findUnit(c.unitText, q);
      if (u) {
        c.unitInfo = u;
        c.unitFrom = "header";
        if (u.caseFolded) warnings.push(`unit ${quote(c.unitText)} of column ${describeColumn(c)} read as ${u.unit}`);
        if (optionUnit && optionUnit.exponent !== u.exponent) {
          warnings.push(`column ${describeColumn(c)} gives its unit (${u.unit}); option ${optionName} = ${optionUnit.unit} not used for it`);
        }
        continue;
      }
      const other = findUnit(c.unitText);
      if (q === "conductance" && other?.quantity === "bias") {
        c.role = "other";
        warnings.push(
          `column ${describeColumn(c)} is a conductance signal in ${other.unit}, which cannot be converted to siemens; ` +
            `ignored (dI/dV can be computed from the current)`,
        );
        continue;
      }
      if (!other && optionUnit) {
        c.unitInfo = optionUnit;
        c.unitFrom = "option";
        warnings.push(`column ${describeColumn(c)}: ${quote(c.unitText)} is not a unit; used ${optionName} = ${optionUnit.unit}`);
        continue;
      }
      throw new DotspecError(
        "io/unknown-unit",
        `${src}: column ${c.index} ${quote(c.header)} has unit ${quote(c.unitText)}, which is not a ${q} unit` +
          (other ? ` (it is a ${other.quantity} unit)` : "") +
          `; write one of ${ACCEPTED_UNITS[q].join(", ")} in the header, for example ${quote(`${c.name || q} (${SI_UNIT[q]})`)}` +
          (other ? "" : `, or pass the option ${optionName}`),
      );
    }
    if (optionUnit) {
      c.unitInfo = optionUnit;
      c.unitFrom = "option";
    } else {
      c.unitInfo = parseUnit(SI_UNIT[q], q);
      c.unitFrom = "default";
      defaulted.push(hasHeader ? `${quote(c.header)} as ${SI_UNIT[q]}` : `column ${c.index} (${q}) as ${SI_UNIT[q]}`);
    }
  }
  return defaulted;
}

/**
 * Stage 4 (Notes 3–4), warnings: the roles read without header (and a bias column that counts like a
 * row number), the units assumed (`defaulted`, from {@link assignUnits}), a tip bias read as sample bias.
 */
function warnColumnAssumptions(
  columns: readonly Column[],
  header: Header,
  table: DataRows,
  decimalComma: boolean,
  defaulted: readonly string[],
  warnings: string[],
): void {
  if (!header.cells) {
    const currents = columns.filter((c) => c.role === "current").map((c) => c.index);
    const bias = columns.find((c) => c.role === "bias")!.index;
    warnings.push(`no header line: column ${bias} read as bias, column${currents.length > 1 ? "s" : ""} ${currents.join(", ")} as current`);
    if (table.ncols >= 3 && looksLikeIndex(table.rows, table.first, bias, decimalComma)) {
      warnings.push(`column ${bias} counts 0, 1, 2… or 1, 2, 3… like a row number; if it is not the bias, pass biasColumn and currentColumns`);
    }
  }
  if (defaulted.length > 0) {
    warnings.push(
      `no unit given for ${defaulted.join(", ")} (SI assumed); write units in the header (for example "bias (mV)") ` +
        `or pass biasUnit / currentUnit / conductanceUnit`,
    );
  }
  for (const c of columns) {
    if (c.role === "bias" && c.tipBias) {
      warnings.push(`column ${describeColumn(c)} is read as sample bias without changing its sign; negate it if the bias was applied to the tip`);
    }
  }
}

/**
 * Stage 5 (Notes 5): each current and conductance column joins the nearest bias column to its left
 * (or the first bias column). A bias column with no current column is ignored, with its conductance
 * columns (their role set to `"other"`) and a warning.
 */
function groupColumns(columns: Column[], warnings: string[]): ColumnGroups {
  const biasColumns = columns.filter((c) => c.role === "bias");
  const all: ColumnGroup[] = biasColumns.map((c) => ({ bias: c.index, currents: [], conductances: [] }));
  for (const c of columns) {
    if (c.role !== "current" && c.role !== "conductance") continue;
    let g = all[0];
    for (const k of all) if (k.bias < c.index) g = k;
    (c.role === "current" ? g.currents : g.conductances).push(c.index);
  }
  const groups: ColumnGroup[] = [];
  for (const g of all) {
    if (g.currents.length > 0) {
      groups.push(g);
      continue;
    }
    columns[g.bias].role = "other";
    for (const k of g.conductances) columns[k].role = "other";
    warnings.push(`column ${describeColumn(columns[g.bias])} is a further bias column with no current column after it; ignored`);
  }
  return { biasColumns, groups };
}

/**
 * Stage 6 (Notes 4): every cell of the used columns read as a number and converted to SI (NaN for a
 * missing or non-numeric cell). Throws io/ragged-row for a data row with another number of cells.
 */
function readNumbers(
  file: TextLines,
  format: DelimiterGuess,
  table: DataRows,
  header: Header,
  columns: readonly Column[],
  src: string,
): ColumnValues {
  const { rows, first, ncols } = table;
  const { delimiter, decimalComma } = format;
  const nData = rows.length - first;
  const values: ColumnValues = columns.map((c) => (c.role === "other" ? null : new Float64Array(nData)));
  const used = columns.filter((c) => c.role !== "other");
  for (let r = first; r < rows.length; r++) {
    const row = rows[r];
    if (row.length !== ncols) {
      throw new DotspecError(
        "io/ragged-row",
        `${src}: line ${lineNumber(file, r)} has ${row.length} cell${row.length === 1 ? "" : "s"} but the ` +
          `${header.line !== null ? `header (line ${header.line})` : `first data row (line ${lineNumber(file, first)})`} has ${ncols}: ` +
          `${quote(lineText(file, r))}; give every row the same number of cells or delete the line` +
          (delimiter === "whitespace" ? " (with space-separated columns, write NaN for a missing value)" : ""),
      );
    }
    for (const c of used) values[c.index]![r - first] = toSI(parseNumberCell(row[c.index], decimalComma), c.unitInfo!);
  }
  return values;
}

/**
 * Stage 7 (Notes 6), rows: per group, the data rows whose bias, current and conductance values are
 * all finite. Throws io/too-many-bad-rows when more than half the data rows are left out of a group;
 * otherwise warns with the count and the first line left out.
 */
function keepCompleteRows(
  file: TextLines,
  format: DelimiterGuess,
  table: DataRows,
  groups: readonly ColumnGroup[],
  values: ColumnValues,
  src: string,
  warnings: string[],
): KeptRows {
  const first = table.first;
  const nData = table.rows.length - first;
  const rowBad = new Uint8Array(nData);
  const perGroup: number[][] = [];
  for (const g of groups) {
    const cols = [g.bias, ...g.currents, ...g.conductances].map((k) => values[k]!);
    const idx: number[] = [];
    for (let r = 0; r < nData; r++) {
      let ok = true;
      for (const col of cols) {
        const x = col[r];
        if (x !== x || x === Infinity || x === -Infinity) {
          ok = false;
          break;
        }
      }
      if (ok) idx.push(r);
      else rowBad[r] = 1;
    }
    perGroup.push(idx);
  }
  let dropped = 0;
  let firstBad = -1;
  for (let r = 0; r < nData; r++) {
    if (rowBad[r]) {
      dropped++;
      if (firstBad < 0) firstBad = r;
    }
  }
  if (dropped * 2 > nData) {
    throw new DotspecError(
      "io/too-many-bad-rows",
      `${src}: ${dropped} of ${nData} data rows have a missing or non-numeric value in a bias, current or ` +
        `conductance column (first: line ${lineNumber(file, first + firstBad)}, ${quote(lineText(file, first + firstBad))}); ` +
        `delimiter read as ${delimiterName(format.delimiter)} with decimal ${format.decimalComma ? "comma" : "point"}: ` +
        `if that is wrong pass the option delimiter, otherwise clean the file`,
    );
  }
  if (dropped > 0) {
    warnings.push(
      `${dropped} data row${dropped === 1 ? "" : "s"} with a missing or non-numeric value (NaN, inf, -, empty…) ` +
        `left out (first: line ${lineNumber(file, first + firstBad)})`,
    );
  }
  return { perGroup, dropped };
}

/**
 * Stage 7 (Notes 7–8), sweeps: each group's bias is cut into monotonic segments (see
 * `splitMonotonic`). The segments that are full sweeps (see `chooseSweeps`, with
 * {@link FULL_SWEEP_SHARE}) are read as sweeps and up to two partial ones left out, with warnings; a
 * group whose segments are not a set of sweeps is sorted by bias and read as one sweep. Each sweep
 * is ordered by ascending bias and its repeated bias values are averaged (see `mergeDuplicates`).
 */
function cutSweeps(
  file: TextLines,
  table: DataRows,
  columns: readonly Column[],
  groups: readonly ColumnGroup[],
  values: ColumnValues,
  kept: KeptRows,
  minPoints: number,
  warnings: string[],
): Sweeps {
  const sets: SweepSet[] = [];
  const directions = new Set<BiasDirection>();
  let segments = 0;
  let duplicatesMerged = 0;
  for (let k = 0; k < groups.length; k++) {
    const g = groups[k];
    const idx = kept.perGroup[k];
    const gb = pickRows(values[g.bias]!, idx);
    const gcols = [...g.currents, ...g.conductances].map((c) => pickRows(values[c]!, idx));
    const nc = g.currents.length;
    const toSet = (order: ArrayLike<number>): SweepSet => {
      const m = mergeDuplicates(gb, gcols, order);
      duplicatesMerged += m.merged;
      return { biasV: m.biasV, currents: m.values.slice(0, nc), conductances: m.values.slice(nc) };
    };
    const segs = splitMonotonic(gb);
    const fullSegs = segs.length === 1 ? segs : chooseSweeps(gb, segs, minPoints, FULL_SWEEP_SHARE);
    const name = describeColumn(columns[g.bias]);
    const lineRange = (s: Segment) =>
      `lines ${lineNumber(file, table.first + idx[s.start])}–${lineNumber(file, table.first + idx[s.end])}`;
    if (fullSegs) {
      for (const s of fullSegs) {
        const order: number[] = [];
        if (s.direction >= 0) for (let i = s.start; i <= s.end; i++) order.push(i);
        else for (let i = s.end; i >= s.start; i--) order.push(i);
        sets.push(toSet(order));
        directions.add(s.direction >= 0 ? "ascending" : "descending");
      }
      segments += fullSegs.length;
      if (segs.length > 1) {
        const parts = fullSegs.map((s) => `${s.direction >= 0 ? "up" : "down"} on ${lineRange(s)}`);
        warnings.push(`bias column ${name} changes direction: read as ${fullSegs.length} sweep${fullSegs.length > 1 ? "s" : ""} (${parts.join(", ")})`);
        const partial = segs.filter((s) => !fullSegs.includes(s));
        if (partial.length > 0) {
          warnings.push(
            `left out ${partial.length} partial sweep${partial.length > 1 ? "s" : ""} of ${name} covering less than ` +
              `${FULL_SWEEP_SHARE * 100} % of its bias range (${partial.map(lineRange).join(", ")})`,
          );
        }
      }
    } else {
      const order = Array.from(gb.keys()).sort((i, j) => gb[i] - gb[j] || i - j);
      sets.push(toSet(order));
      directions.add("unordered");
      segments += 1;
      warnings.push(
        `bias column ${name} is not monotonic (${segs.length - 1} changes of direction that do not form whole sweeps); ` +
          `rows sorted by bias and read as one sweep`,
      );
    }
  }
  if (duplicatesMerged > 0) {
    warnings.push(`${duplicatesMerged} repeated bias value${duplicatesMerged === 1 ? "" : "s"} within a sweep averaged with the row${duplicatesMerged === 1 ? "" : "s"} of the same bias`);
  }
  return { sets, directions, segments, duplicatesMerged };
}

/**
 * Stage 8 (Notes 9): every sweep on the same bias points. When the sweeps' points differ, each is
 * carried by linear interpolation (see `interpolateOnto`) onto the points of the first sweep inside
 * the range they all cover, with a warning. Returns one set holding every sweep, in order. Throws
 * io/too-few-points (for a sweep, or for the common points) and io/no-common-range.
 */
function ontoCommonBias(
  sets: readonly SweepSet[],
  minPoints: number,
  src: string,
  counts: RowCounts,
  biasColumns: readonly Column[],
  warnings: string[],
): SweepSet {
  const tooFew = (n: number, where = "after cleaning") =>
    new DotspecError(
      "io/too-few-points",
      `${src}: only ${n} distinct bias point${n === 1 ? "" : "s"} ${where}; at least ${minPoints} are needed ` +
        `(${counts.dataRows} data rows, ${counts.rowsDropped} left out, ${counts.duplicatesMerged} repeated bias values merged); ` +
        `check that the bias column (${biasColumns.map(describeColumn).join(", ")}) is the swept one`,
    );
  for (const s of sets) if (s.biasV.length < minPoints) throw tooFew(s.biasV.length);
  const first = sets[0].biasV;
  if (sets.every((s) => sameValues(s.biasV, first))) {
    return { biasV: first, currents: sets.flatMap((s) => s.currents), conductances: sets.flatMap((s) => s.conductances) };
  }
  let lo = -Infinity;
  let hi = Infinity;
  for (const s of sets) {
    lo = Math.max(lo, s.biasV[0]);
    hi = Math.min(hi, s.biasV[s.biasV.length - 1]);
  }
  if (!(lo < hi)) {
    throw new DotspecError(
      "io/no-common-range",
      `${src}: the sweeps cover bias ranges that do not overlap (${sets.map((s) => `${s.biasV[0]} to ${s.biasV[s.biasV.length - 1]} V`).join("; ")}); ` +
        `pass biasColumn and currentColumns to read one sweep`,
    );
  }
  let a = 0;
  while (first[a] < lo) a++;
  let z = first.length;
  while (first[z - 1] > hi) z--;
  const lost = first.length - (z - a);
  const grid = first.slice(a, z);
  const common: SweepSet = {
    biasV: grid,
    currents: sets.flatMap((s) => s.currents.map((v) => interpolateOnto(s.biasV, v, grid))),
    conductances: sets.flatMap((s) => s.conductances.map((v) => interpolateOnto(s.biasV, v, grid))),
  };
  warnings.push(
    `the sweeps have different bias points: carried by linear interpolation onto the ${grid.length} points of the first ` +
      `sweep inside their common range ${lo} to ${hi} V` + (lost > 0 ? ` (${lost} points outside it left out)` : ""),
  );
  if (grid.length < minPoints) throw tooFew(grid.length, `inside the bias range shared by all sweeps (${lo} to ${hi} V)`);
  return common;
}

/**
 * Stage 9 (Notes 10), the curve: the common bias, every sweep and their mean current, the mean of
 * the conductance columns (or null), and the metadata.
 */
function makeCurve(common: SweepSet, src: string, metadata: Map<string, string>): Curve {
  const grid = common.biasV;
  return {
    biasV: grid,
    currentA: mean(common.currents, grid.length),
    sweeps: common.currents,
    didvS: common.conductances.length > 0 ? mean(common.conductances, grid.length) : null,
    meta: { source: src, metadata: Object.fromEntries(metadata) },
  };
}

/** Stage 9, the record: how the file was read, from the results of every stage. */
function makeRecord({ src, format, header, columns, counts, sweeps, curve, metadata, warnings }: RecordParts): ImportRecord {
  const grid = curve.biasV;
  const step = stepOf(grid);
  const { directions } = sweeps;
  return {
    source: src,
    delimiter: format.delimiter,
    decimalSeparator: format.decimalComma ? "," : ".",
    hasHeader: header.cells !== null,
    headerLine: header.line,
    columns: columns.map((c) => ({
      index: c.index,
      header: c.header,
      name: c.name,
      role: c.role,
      unit: c.role === "other" ? null : c.unitInfo!.unit,
      scale: c.role === "other" ? null : c.unitInfo!.scale,
      unitFrom: c.role === "other" ? null : c.unitFrom,
    })),
    ignoredColumns: columns.filter((c) => c.role === "other").map((c) => c.header || c.name),
    dataRows: counts.dataRows,
    rowsDropped: counts.rowsDropped,
    duplicatesMerged: counts.duplicatesMerged,
    sweeps: curve.sweeps.length,
    segments: sweeps.segments,
    biasDirection: directions.has("unordered")
      ? "unordered"
      : directions.size === 1
        ? [...directions][0]
        : "both",
    points: grid.length,
    biasRangeV: [grid[0], grid[grid.length - 1]],
    biasStepV: step.medianV,
    uniformStep: step.uniform,
    metadataKeys: [...metadata.keys()],
    warnings,
  };
}

/* ---------------------------------------------------------------------------------------------- */
/* Helpers                                                                                         */

/**
 * The options checked and completed with {@link PARSE_DEFAULTS}; the unit options parsed into
 * `units`. Throws options/* errors naming the option.
 */
function resolveOptions(options: ParseOptions) {
  if (options === null || typeof options !== "object") {
    throw new DotspecError("options/not-object", `parseCurveText options must be an object; got ${options === null ? "null" : typeof options}`);
  }
  checkKnownKeys("parseCurveText options", options, Object.keys(PARSE_DEFAULTS));
  const o = { ...PARSE_DEFAULTS };
  for (const [k, v] of Object.entries(options)) if (v !== undefined) (o as Record<string, unknown>)[k] = v;
  if (typeof o.source !== "string") {
    throw new DotspecError("options/not-string", `source must be a string (a label for the curve); got ${typeof o.source}`);
  }
  checkOneOf("delimiter", o.delimiter, ["auto", ",", ";", "\t", "whitespace"] as const);
  checkInteger("minPoints", o.minPoints, 2);
  const unit = (name: string, value: unknown, q: Quantity): UnitInfo | null => {
    if (value === null) return null;
    if (typeof value !== "string") {
      throw new DotspecError("options/not-string", `${name} must be a unit such as ${ACCEPTED_UNITS[q].slice(0, 3).join(", ")}; got ${typeof value}`);
    }
    return parseUnit(value, q, `option ${name}`);
  };
  const units: Record<Quantity, UnitInfo | null> = {
    bias: unit("biasUnit", o.biasUnit, "bias"),
    current: unit("currentUnit", o.currentUnit, "current"),
    conductance: unit("conductanceUnit", o.conductanceUnit, "conductance"),
  };
  const checkRef = (name: string, ref: unknown) => {
    if (typeof ref === "string" ? ref.trim() === "" : !(typeof ref === "number" && Number.isInteger(ref) && ref >= 0)) {
      throw new DotspecError("options/not-column", `${name} must name a column by its header or by an index from 0; got ${JSON.stringify(ref)}`);
    }
  };
  if (o.biasColumn !== null) checkRef("biasColumn", o.biasColumn);
  if (o.currentColumns !== null) {
    if (!Array.isArray(o.currentColumns) || o.currentColumns.length === 0) {
      throw new DotspecError("options/not-column", `currentColumns must be a non-empty list of headers or indices from 0; got ${JSON.stringify(o.currentColumns)}`);
    }
    for (const ref of o.currentColumns) checkRef("currentColumns", ref);
  }
  return { ...o, units };
}

/** Line number (from 1) of content row `r`. */
function lineNumber(file: TextLines, r: number): number {
  return file.content[r] + 1;
}

/** Content row `r` as written. */
function lineText(file: TextLines, r: number): string {
  return file.lines[file.content[r]];
}

/** Add the `key: value` or `key = value` of a comment or preamble line to the metadata (a repeated key joins its values with `; `). */
function readMetadata(line: string, into: Map<string, string>): void {
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

/** The first rows of a column are 0, 1, 2… or 1, 2, 3… (a row number written by a spreadsheet or script). */
function looksLikeIndex(rows: readonly string[][], first: number, col: number, decimalComma: boolean): boolean {
  const n = Math.min(rows.length - first, 10);
  if (n < 3) return false;
  const start = parseNumberCell(rows[first][col], decimalComma);
  if (start !== 0 && start !== 1) return false;
  for (let i = 1; i < n; i++) if (parseNumberCell(rows[first + i][col] ?? "", decimalComma) !== start + i) return false;
  return true;
}

/** Index of the column a `biasColumn` or `currentColumns` option names. Throws io/no-such-column. */
function findColumn(src: string, option: string, ref: ColumnRef, columns: readonly Column[]): number {
  if (typeof ref === "number") {
    if (ref < columns.length) return ref;
  } else {
    const want = ref.trim().toLowerCase();
    const hit = columns.find((c) => c.header.toLowerCase() === want || c.name.toLowerCase() === want);
    if (hit) return hit.index;
  }
  throw new DotspecError(
    "io/no-such-column",
    `${src}: ${option} = ${JSON.stringify(ref)} matches no column; the columns are ` +
      `${columns.map((c) => `${c.index} ${describeColumn(c)}`).join(", ")} (give a header or an index from 0)`,
  );
}

/** A column as messages name it: its header, quoted, or `column 2` without header. */
function describeColumn(c: Pick<Column, "header" | "name">): string {
  return c.header ? quote(c.header) : c.name;
}

/** A text quoted for a message, cut to 60 characters. */
function quote(s: string): string {
  const t = s.length > 60 ? s.slice(0, 57) + "..." : s;
  return JSON.stringify(t);
}

/** The delimiter in words, for messages. */
function delimiterName(d: Delimiter): string {
  return d === "\t" ? "tab" : d === "," ? "comma" : d === ";" ? "semicolon" : "whitespace";
}

/** The values of `col` at the rows `idx`, as a new array. */
function pickRows(col: Float64Array, idx: readonly number[]): Float64Array {
  const out = new Float64Array(idx.length);
  for (let i = 0; i < idx.length; i++) out[i] = col[idx[i]];
  return out;
}

/** The same numbers in the same order. */
function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Element-wise mean of arrays of length `n` (summed as Σ a/k), always a new array. */
function mean(arrays: readonly Float64Array[], n: number): Float64Array {
  if (arrays.length === 1) return Float64Array.from(arrays[0]);
  const out = new Float64Array(n);
  const k = arrays.length;
  for (const a of arrays) for (let i = 0; i < n; i++) out[i] += a[i] / k;
  return out;
}

/** Median bias step, V, and whether every step is within {@link UNIFORM_STEP_RTOL} of it. */
function stepOf(biasV: Float64Array): { medianV: number; uniform: boolean } {
  const n = biasV.length - 1;
  const steps = new Float64Array(n);
  for (let i = 0; i < n; i++) steps[i] = biasV[i + 1] - biasV[i];
  const sorted = Float64Array.from(steps).sort();
  const medianV = n % 2 === 1 ? sorted[(n - 1) / 2] : sorted[n / 2 - 1] / 2 + sorted[n / 2] / 2;
  let uniform = true;
  for (let i = 0; i < n && uniform; i++) uniform = Math.abs(steps[i] - medianV) <= UNIFORM_STEP_RTOL * medianV;
  return { medianV, uniform };
}
