/**
 * Reading an I–V sweep from delimited text, whatever instrument wrote it.
 */
import type { Curve } from "../curve.ts";
import { DotspecError } from "../util/errors.ts";
import { checkInteger, checkKnownKeys, checkOneOf } from "../util/check.ts";
import { detectDelimiter, isMissingCell, parseNumberCell, splitLine, type Delimiter } from "./cells.ts";
import { readColumnHeader, type ColumnRole } from "./readColumnHeader.ts";
import { ACCEPTED_UNITS, SI_UNIT, findUnit, parseUnit, toSI, type Quantity, type UnitInfo } from "./units.ts";
import { interpolateOnto, mergeDuplicates, splitMonotonic, type Segment } from "./sweepSegments.ts";

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

interface Column extends ImportColumn {
  unitText: string | null;
  tipBias: boolean;
  unitInfo: UnitInfo | null;
}

interface SweepSet {
  biasV: Float64Array;
  currents: Float64Array[];
  conductances: Float64Array[];
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
  const metadata = new Map<string, string>();

  // 1. Lines, comments, metadata.
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

  // 2. Delimiter and decimal separator.
  const sample: string[] = [];
  for (const i of content) {
    if (sample.length >= SAMPLE_LINES) break;
    if (startsLikeNumber(lines[i])) sample.push(lines[i]);
  }
  if (sample.length === 0) for (const i of content.slice(0, SAMPLE_LINES)) sample.push(lines[i]);
  const guess = detectDelimiter(sample, o.delimiter === "auto" ? undefined : [o.delimiter]);
  const delimiter = guess.delimiter;
  const decimalComma = guess.decimalComma;

  // 3. Rows, start of the data, header.
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
  const lineOf = (r: number) => content[r] + 1;
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
      `${src}: the data rows have a single column (line ${lineOf(first)}: ${quote(lines[content[first]])}); ` +
        `a curve needs a bias column and at least one current column, separated by commas, semicolons, tabs or spaces`,
    );
  }

  let headerCells: string[] | null = null;
  let headerLine: number | null = null;
  if (first > 0) {
    let h = first - 1;
    headerCells = rows[h];
    if (headerCells.length === ncols + 1 && endsBlank(headerCells)) headerCells = headerCells.slice(0, -1);
    if (delimiter === "whitespace" && headerCells.length !== ncols) headerCells = splitSpacedHeader(lines[content[h]], ncols);
    // A row of units under a row of names ("Bias,Current" then "V,pA"): join them.
    if (h > 0 && headerCells.length === ncols && isUnitsRow(headerCells)) {
      let names = rows[h - 1];
      if (names.length === ncols + 1 && endsBlank(names)) names = names.slice(0, -1);
      if (delimiter === "whitespace" && names.length !== ncols) names = splitSpacedHeader(lines[content[h - 1]], ncols);
      if (names.length === ncols) {
        const units = headerCells;
        headerCells = names.map((name, i) => (units[i].trim() === "" ? name : `${name.trim()} (${stripBrackets(units[i])})`));
        h--;
      }
    }
    headerLine = lineOf(h);
    if (headerCells.length !== ncols) {
      throw new DotspecError(
        "io/ragged-row",
        `${src}: line ${headerLine} (the header) has ${headerCells.length} cells but the data rows from line ` +
          `${lineOf(first)} have ${ncols}; give every column one header cell` +
          (delimiter === "whitespace" ? " (with space-separated columns, write names without spaces, e.g. bias_V current_nA)" : ""),
      );
    }
    if (h > 0) {
      for (let r = 0; r < h; r++) readMetadata(lines[content[r]], metadata);
      warnings.push(
        `lines ${lineOf(0)}–${lineOf(h - 1)} above the header are not data; read for key: value metadata and otherwise skipped`,
      );
    }
  } else {
    const above = comments.filter((i) => i < content[first]);
    if (above.length > 0) {
      const line = lines[above[above.length - 1]].trimStart().replace(/^[#%]+/, "");
      const cells = delimiter === "whitespace" ? splitSpacedHeader(line, ncols) : splitLine(line, delimiter);
      if (cells.length === ncols + 1 && endsBlank(cells)) cells.pop();
      const roles = cells.map((c) => readColumnHeader(c).role);
      if (cells.length === ncols && roles.includes("bias") && roles.includes("current")) {
        headerCells = cells;
        headerLine = above[above.length - 1] + 1;
      }
    }
  }

  // 4. Columns: names, roles, overrides, units.
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

  const defaulted: string[] = [];
  for (const c of columns) {
    if (c.role === "other") continue;
    const q = c.role;
    const optionUnit = o.units[q];
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
      defaulted.push(headerCells ? `${quote(c.header)} as ${SI_UNIT[q]}` : `column ${c.index} (${q}) as ${SI_UNIT[q]}`);
    }
  }
  if (!headerCells) {
    const currents = columns.filter((c) => c.role === "current").map((c) => c.index);
    const bias = columns.find((c) => c.role === "bias")!.index;
    warnings.push(`no header line: column ${bias} read as bias, column${currents.length > 1 ? "s" : ""} ${currents.join(", ")} as current`);
    if (ncols >= 3 && looksLikeIndex(rows, first, bias, decimalComma)) {
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

  // 5. Group current and conductance columns with their bias column.
  const biasIdx = columns.filter((c) => c.role === "bias").map((c) => c.index);
  const groups = new Map<number, { currents: number[]; conductances: number[] }>();
  for (const b of biasIdx) groups.set(b, { currents: [], conductances: [] });
  for (const c of columns) {
    if (c.role !== "current" && c.role !== "conductance") continue;
    let b = biasIdx[0];
    for (const k of biasIdx) if (k < c.index) b = k;
    const g = groups.get(b)!;
    (c.role === "current" ? g.currents : g.conductances).push(c.index);
  }
  for (const [b, g] of groups) {
    if (g.currents.length > 0) continue;
    columns[b].role = "other";
    for (const k of g.conductances) columns[k].role = "other";
    groups.delete(b);
    warnings.push(`column ${describeColumn(columns[b])} is a further bias column with no current column after it; ignored`);
  }

  // 6. Numbers.
  const nData = rows.length - first;
  const values: (Float64Array | null)[] = columns.map((c) => (c.role === "other" ? null : new Float64Array(nData)));
  const used = columns.filter((c) => c.role !== "other");
  for (let r = first; r < rows.length; r++) {
    const row = rows[r];
    if (row.length !== ncols) {
      throw new DotspecError(
        "io/ragged-row",
        `${src}: line ${lineOf(r)} has ${row.length} cell${row.length === 1 ? "" : "s"} but the ` +
          `${headerLine !== null ? `header (line ${headerLine})` : `first data row (line ${lineOf(first)})`} has ${ncols}: ` +
          `${quote(lines[content[r]])}; give every row the same number of cells or delete the line` +
          (delimiter === "whitespace" ? " (with space-separated columns, write NaN for a missing value)" : ""),
      );
    }
    for (const c of used) values[c.index]![r - first] = toSI(parseNumberCell(row[c.index], decimalComma), c.unitInfo!);
  }

  // 7. Rows per group, segments, sweeps.
  const rowBad = new Uint8Array(nData);
  const sets: SweepSet[] = [];
  const directions = new Set<BiasDirection>();
  let segmentsUsed = 0;
  let duplicatesMerged = 0;
  const keep: { b: number; g: { currents: number[]; conductances: number[] }; idx: number[] }[] = [];
  for (const [b, g] of groups) {
    const cols = [b, ...g.currents, ...g.conductances].map((k) => values[k]!);
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
    keep.push({ b, g, idx });
  }
  let rowsDropped = 0;
  let firstBad = -1;
  for (let r = 0; r < nData; r++) {
    if (rowBad[r]) {
      rowsDropped++;
      if (firstBad < 0) firstBad = r;
    }
  }
  if (rowsDropped * 2 > nData) {
    throw new DotspecError(
      "io/too-many-bad-rows",
      `${src}: ${rowsDropped} of ${nData} data rows have a missing or non-numeric value in a bias, current or ` +
        `conductance column (first: line ${lineOf(first + firstBad)}, ${quote(lines[content[first + firstBad]])}); ` +
        `delimiter read as ${delimiterName(delimiter)} with decimal ${decimalComma ? "comma" : "point"}: ` +
        `if that is wrong pass the option delimiter, otherwise clean the file`,
    );
  }
  if (rowsDropped > 0) {
    warnings.push(
      `${rowsDropped} data row${rowsDropped === 1 ? "" : "s"} with a missing or non-numeric value (NaN, inf, -, empty…) ` +
        `left out (first: line ${lineOf(first + firstBad)})`,
    );
  }

  for (const { b, g, idx } of keep) {
    const gb = new Float64Array(idx.length);
    for (let i = 0; i < idx.length; i++) gb[i] = values[b]![idx[i]];
    const gcols = [...g.currents, ...g.conductances].map((k) => {
      const col = values[k]!;
      const out = new Float64Array(idx.length);
      for (let i = 0; i < idx.length; i++) out[i] = col[idx[i]];
      return out;
    });
    const nc = g.currents.length;
    const toSet = (order: ArrayLike<number>): SweepSet => {
      const m = mergeDuplicates(gb, gcols, order);
      duplicatesMerged += m.merged;
      return { biasV: m.biasV, currents: m.values.slice(0, nc), conductances: m.values.slice(nc) };
    };
    const segs = splitMonotonic(gb);
    const fullSegs = segs.length === 1 ? segs : chooseSweeps(gb, segs, o.minPoints);
    const name = describeColumn(columns[b]);
    const lineRange = (s: Segment) => `lines ${lineOf(first + idx[s.start])}–${lineOf(first + idx[s.end])}`;
    if (fullSegs) {
      for (const s of fullSegs) {
        const order: number[] = [];
        if (s.direction >= 0) for (let i = s.start; i <= s.end; i++) order.push(i);
        else for (let i = s.end; i >= s.start; i--) order.push(i);
        sets.push(toSet(order));
        directions.add(s.direction >= 0 ? "ascending" : "descending");
      }
      segmentsUsed += fullSegs.length;
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
      segmentsUsed += 1;
      warnings.push(
        `bias column ${name} is not monotonic (${segs.length - 1} changes of direction that do not form whole sweeps); ` +
          `rows sorted by bias and read as one sweep`,
      );
    }
  }
  if (duplicatesMerged > 0) {
    warnings.push(`${duplicatesMerged} repeated bias value${duplicatesMerged === 1 ? "" : "s"} within a sweep averaged with the row${duplicatesMerged === 1 ? "" : "s"} of the same bias`);
  }

  // 8. Common bias points.
  const tooFew = (n: number, where = "after cleaning") =>
    new DotspecError(
      "io/too-few-points",
      `${src}: only ${n} distinct bias point${n === 1 ? "" : "s"} ${where}; at least ${o.minPoints} are needed ` +
        `(${nData} data rows, ${rowsDropped} left out, ${duplicatesMerged} repeated bias values merged); ` +
        `check that the bias column (${biasIdx.map((k) => describeColumn(columns[k])).join(", ")}) is the swept one`,
    );
  for (const s of sets) if (s.biasV.length < o.minPoints) throw tooFew(s.biasV.length);
  let grid = sets[0].biasV;
  if (!sets.every((s) => sameValues(s.biasV, grid))) {
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
    while (grid[a] < lo) a++;
    let z = grid.length;
    while (grid[z - 1] > hi) z--;
    const lost = grid.length - (z - a);
    grid = grid.slice(a, z);
    for (const s of sets) {
      s.currents = s.currents.map((v) => interpolateOnto(s.biasV, v, grid));
      s.conductances = s.conductances.map((v) => interpolateOnto(s.biasV, v, grid));
      s.biasV = grid;
    }
    warnings.push(
      `the sweeps have different bias points: carried by linear interpolation onto the ${grid.length} points of the first ` +
        `sweep inside their common range ${lo} to ${hi} V` + (lost > 0 ? ` (${lost} points outside it left out)` : ""),
    );
    if (grid.length < o.minPoints) throw tooFew(grid.length, `inside the bias range shared by all sweeps (${lo} to ${hi} V)`);
  }

  // 9. Curve and record.
  const sweeps = sets.flatMap((s) => s.currents);
  const conductances = sets.flatMap((s) => s.conductances);
  const curve: Curve = {
    biasV: grid,
    currentA: mean(sweeps, grid.length),
    sweeps,
    didvS: conductances.length > 0 ? mean(conductances, grid.length) : null,
    meta: { source: src, metadata: Object.fromEntries(metadata) },
  };
  const step = stepOf(grid);
  const record: ImportRecord = {
    source: src,
    delimiter,
    decimalSeparator: decimalComma ? "," : ".",
    hasHeader: headerCells !== null,
    headerLine,
    columns: columns.map(({ index, header, name, role, unitInfo }) => ({
      index,
      header,
      name,
      role,
      unit: role === "other" ? null : unitInfo!.unit,
      scale: role === "other" ? null : unitInfo!.scale,
      unitFrom: role === "other" ? null : columns[index].unitFrom,
    })),
    ignoredColumns: columns.filter((c) => c.role === "other").map((c) => c.header || c.name),
    dataRows: nData,
    rowsDropped,
    duplicatesMerged,
    sweeps: sweeps.length,
    segments: segmentsUsed,
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
  return { curve, record };
}

/* ---------------------------------------------------------------------------------------------- */

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

function startsLikeNumber(line: string): boolean {
  const s = line.trimStart();
  const c = s.charCodeAt(0);
  return (c >= 48 && c <= 57) || c === 43 || c === 45 || c === 46 || c === 0x2212;
}

/** Mostly numbers: at least one finite number, and words in fewer than half the cells. */
function isDataRow(cells: readonly string[], decimalComma: boolean): boolean {
  let numbers = 0;
  let words = 0;
  for (const cell of cells) {
    if (Number.isFinite(parseNumberCell(cell, decimalComma))) numbers++;
    else if (!isMissingCell(cell)) words++;
  }
  return numbers > 0 && words * 2 < cells.length;
}

/** Every cell empty or a unit, at least one unit: `V,pA` or `[V]\t[pA]`. */
function isUnitsRow(cells: readonly string[]): boolean {
  let units = 0;
  for (const cell of cells) {
    if (cell.trim() === "") continue;
    if (findUnit(stripBrackets(cell)) === null) return false;
    units++;
  }
  return units > 0;
}

function stripBrackets(cell: string): string {
  const t = cell.trim();
  return /^[([{].*[)\]}]$/.test(t) ? t.slice(1, -1).trim() : t;
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

function endsBlank(cells: readonly string[]): boolean {
  return cells.length > 1 && cells[cells.length - 1].trim() === "";
}

/** A space-separated header whose names contain spaces: try tabs or 2+ spaces, then join `(unit)` tokens. */
function splitSpacedHeader(line: string, n: number): string[] {
  const t = line.trim();
  if (t.indexOf('"') >= 0) {
    const quoted = (t.match(/"[^"]*"|[^\s"]+/g) ?? []).map((c) => c.replace(/^"|"$/g, ""));
    if (quoted.length === n) return quoted;
  }
  const wide = t.split(/\t|\s{2,}/);
  if (wide.length === n) return wide;
  const tokens = t.split(/\s+/);
  const joined: string[] = [];
  for (const tok of tokens) {
    if (joined.length > 0 && /^[([{]/.test(tok)) joined[joined.length - 1] += " " + tok;
    else joined.push(tok);
  }
  return joined.length === n ? joined : tokens;
}

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

function describeColumn(c: Pick<Column, "header" | "name">): string {
  return c.header ? quote(c.header) : c.name;
}

function quote(s: string): string {
  const t = s.length > 60 ? s.slice(0, 57) + "..." : s;
  return JSON.stringify(t);
}

function delimiterName(d: Delimiter): string {
  return d === "\t" ? "tab" : d === "," ? "comma" : d === ";" ? "semicolon" : "whitespace";
}

/** Full sweeps among several monotonic segments, or null when the column is not a set of sweeps. */
function chooseSweeps(biasV: Float64Array, segs: Segment[], minPoints: number): Segment[] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < biasV.length; i++) {
    if (biasV[i] < lo) lo = biasV[i];
    if (biasV[i] > hi) hi = biasV[i];
  }
  const span = hi / 2 - lo / 2;
  const full = segs.filter((s) => {
    const segSpan = Math.abs(biasV[s.end] / 2 - biasV[s.start] / 2);
    if (!(segSpan >= FULL_SWEEP_SHARE * span)) return false;
    let distinct = 1;
    for (let i = s.start + 1; i <= s.end; i++) if (biasV[i] !== biasV[i - 1]) distinct++;
    return distinct >= minPoints;
  });
  return full.length >= 1 && segs.length - full.length <= 2 ? full : null;
}

function sameValues(a: Float64Array, b: Float64Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function mean(arrays: readonly Float64Array[], n: number): Float64Array {
  if (arrays.length === 1) return Float64Array.from(arrays[0]);
  const out = new Float64Array(n);
  const k = arrays.length;
  for (const a of arrays) for (let i = 0; i < n; i++) out[i] += a[i] / k;
  return out;
}

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
