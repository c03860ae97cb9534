/**
 * Stage 9 of the importer, the record: how the file was read, from the results of every stage.
 */
import type { Curve } from "../../curve.ts";
import type { Delimiter, DelimiterGuess } from "../cells.ts";
import { biasStep } from "../../util/biasGrid.ts";
import type { Column, ImportColumn } from "./columns.ts";
import type { Header } from "./header.ts";
import type { BiasDirection, Sweeps } from "./sweeps.ts";

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
  /**
   * Resolution of the written current numbers, A: RMS over the current columns of each column's
   * `resolutionSI`; null when no cell was a plain decimal number. The signal stage never puts the
   * current noise below resolution/√12.
   */
  currentResolutionA: number | null;
  /** The same over the conductance columns, S; null without one. */
  conductanceResolutionS: number | null;
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
  /** The electrode the file's bias was applied to (option `biasPolarity`); the curve is in sample bias either way. */
  biasPolarity: "sample" | "tip";
  /** Everything assumed or repaired, in plain words. */
  warnings: string[];
}

/** What happened to the data rows, for the record and the io/too-few-points message. */
export interface RowCounts {
  /** Data rows read. */
  dataRows: number;
  /** Data rows left out for a missing or non-numeric value. */
  rowsDropped: number;
  /** Rows merged into another row with the same bias. */
  duplicatesMerged: number;
}

/** Everything the {@link ImportRecord} reports, from the stages. */
export interface RecordParts {
  src: string;
  format: DelimiterGuess;
  header: Header;
  columns: readonly Column[];
  /** Per column, the RMS quantum of its written numbers in SI units, or null. */
  resolutions: readonly (number | null)[];
  counts: RowCounts;
  sweeps: Sweeps;
  curve: Curve;
  metadata: Map<string, string>;
  warnings: string[];
  biasPolarity: "sample" | "tip";
}

/**
 * Make the {@link ImportRecord}.
 *
 * Parameters
 * ----------
 * parts : RecordParts
 *     The source label, format, header, columns, row counts, sweeps, curve, metadata and
 *     warnings of the stages.
 *
 * Returns
 * -------
 * ImportRecord
 *     Plain data; the columns without their internal fields; `warnings` is the array given.
 *
 * Notes
 * -----
 * 1. `biasDirection`: "unordered" when a group was sorted, the one direction seen, else "both".
 * 2. `biasStepV` and `uniformStep` from {@link biasStep}.
 * 3. Ignored columns are listed by header (or name without header).
 *
 * Example
 * -------
 * ```ts
 * parseCurveText("bias (mV),current (pA)\n-2,-5\n-1,-1\n0,0\n1,1\n2,5\n").record.biasDirection;  // => "ascending"
 * ```
 */
export function makeRecord({ src, format, header, columns, resolutions, counts, sweeps, curve, metadata, warnings, biasPolarity }: RecordParts): ImportRecord {
  const grid = curve.biasV;
  const step = biasStep(grid);
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
      resolutionSI: resolutions[c.index] ?? null,
    })),
    currentResolutionA: curve.meta.currentResolutionA ?? null,
    conductanceResolutionS: curve.meta.conductanceResolutionS ?? null,
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
    biasPolarity,
    warnings,
  };
}
