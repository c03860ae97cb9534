/**
 * The importer of delimited text: `parseCurveText` and the types of its options and record. The
 * stage modules of this folder are internal; their file list reads as the method (lines, format,
 * dataRows, header, columns, columnUnits, assumptions, groups, numbers, resolution, completeRows, sweeps,
 * commonBias, curve, record); `head` and `fastRows` are the fast lane for plain numeric tables.
 */
export { parseCurveText, type ParsedCurve } from "./parseCurveText.ts";
export { PARSE_DEFAULTS, type ColumnRef, type ParseOptions } from "./options.ts";
export type { BiasDirection } from "./sweeps.ts";
export type { ImportColumn } from "./columns.ts";
export type { ImportRecord } from "./record.ts";
