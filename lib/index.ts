/**
 * dotspec: tunnelling spectroscopy of single quantum dots, from I–V sweeps to assigned shells,
 * gaps and charging energies. The public API for Node (the CLI imports only this module): the
 * browser-safe entry `lib/core.ts` plus reading and writing files.
 */
export * from "./core.ts";

// File I/O (Node only).
export { CURVE_FILE_EXTENSIONS, MAX_CURVE_FILE_BYTES, STREAM_CURVE_FILE_BYTES, listCurveFiles, readCurveFile, readCurveFileWithDigest, type ReadCurveOptions } from "./io/readCurveFile.ts";
export { CURVE_STREAM_DEFAULTS, readCurveStream, type CurveStreamOptions } from "./io/readCurveStream.ts";
export { FILE_LINES_DEFAULTS, forEachFileLine, withFileEncoding, type FileEncoding, type FileLinesOptions } from "./io/fileLines.ts";
export { readJsonFile } from "./io/readJsonFile.ts";
export { writeTextFile } from "./io/writeTextFile.ts";
export { readSizeMetaFile, readOpticalFile, readTextFile, type ReadTableOptions, type SizeMetaFileRow } from "./io/readSizeTables.ts";
export { TEMP_FILE_PATTERN } from "./io/writeTextFile.ts";
export { inputDigest, sha256Hex, type InputDigest } from "./io/inputDigest.ts";
export {
  checkOutputFolder,
  OUTPUT_MANIFEST_NAME,
  readOutputManifest,
  writeOutputManifest,
  type OutputFolderCheck,
  type OutputManifest,
} from "./io/outputManifest.ts";

// Grid spectroscopy, Node-only parts: reading cubes from files (the readers of bytes are in lib/core.ts).
export { readNpyGrid, READ_NPY_DEFAULTS, type ReadNpyGridOptions } from "./io/readNpyGrid.ts";
export { readGridFile, fileBytes, type ReadGridFileOptions } from "./io/readGridFile.ts";
export { readGridTableFile, type ReadGridTableFileOptions } from "./io/readGridTableFile.ts";
