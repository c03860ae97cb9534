/**
 * dotspec I/O: reading I–V sweeps from delimited text, bytes and files, writing tables and text
 * files. The only module that touches the file system (readCurveFile, readJsonFile, writeTextFile);
 * the browser-safe entry lib/core.ts takes the other modules one by one.
 */
export {
  ACCEPTED_UNITS,
  BIAS_UNITS,
  CONDUCTANCE_UNITS,
  CURRENT_UNITS,
  SI_UNIT,
  findUnit,
  parseUnit,
  toSI,
  type Quantity,
  type UnitInfo,
} from "./units.ts";
export {
  PARSE_DEFAULTS,
  parseCurveText,
  type BiasDirection,
  type ColumnRef,
  type ImportColumn,
  type ImportRecord,
  type ParseOptions,
  type ParsedCurve,
} from "./parse/index.ts";
export type { ColumnRole } from "./readColumnHeader.ts";
export type { Delimiter } from "./cells.ts";
export {
  CURVE_FILE_EXTENSIONS,
  MAX_CURVE_FILE_BYTES,
  listCurveFiles,
  readCurveFile,
  readCurveFileWithDigest,
  type ReadCurveOptions,
} from "./readCurveFile.ts";
export { parseCurveBytes } from "./parseCurveBytes.ts";
export { decodeTextBytes, type DecodedText } from "./decodeTextBytes.ts";
export { parseJsonText } from "./parseJsonText.ts";
export { STREAM_CURVE_FILE_BYTES } from "./readCurveFile.ts";
export { CURVE_STREAM_DEFAULTS, readCurveStream, type CurveStreamOptions } from "./readCurveStream.ts";
export { FILE_LINES_DEFAULTS, forEachFileLine, withFileEncoding, type FileEncoding, type FileLinesOptions } from "./fileLines.ts";
export { CURVE_CSV_DIGITS, escapeFormulaCell, formatCsv, formatCurveCsv, type CellValue, type CurveColumns, type FormatCurveCsvOptions } from "./formatCsv.ts";
export { writeTextFile } from "./writeTextFile.ts";
export { etaFromMetadata, ETA_METADATA_KEYS } from "./etaFromMetadata.ts";
export { etaForCurve, type CurveEta } from "./etaForCurve.ts";
export { readJsonFile } from "./readJsonFile.ts";
export { parseSizeMeta, SIZE_META_COLUMNS, type SizeMetaRow } from "./parseSizeMeta.ts";
export { parseOpticalTable, OPTICAL_PEAK_RANGE_EV, type OpticalTableRow } from "./parseOpticalTable.ts";
export { readSizeMetaFile, readOpticalFile, readTextFile, type ReadTableOptions, type SizeMetaFileRow } from "./readSizeTables.ts";
export { sizeFromMetadata, SIZE_METADATA_KEYS, type MetadataSize } from "./sizeFromMetadata.ts";
export { inputDigest, sha256Hex, type InputDigest } from "./inputDigest.ts";
export { checkOutputFolder, OUTPUT_MANIFEST_NAME, readOutputManifest, writeOutputManifest, type OutputFolderCheck, type OutputManifest } from "./outputManifest.ts";
