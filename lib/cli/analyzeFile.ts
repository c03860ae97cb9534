/**
 * The work `dotspec analyze` does on one file, the same in the main thread and in a worker
 * thread: read, analyse, record, and with --out write the JSON and the figure.
 */
import { join } from "node:path";
import {
  analysisToJson,
  analyzeCurve,
  failureReason,
  formatAnalysisText,
  readCurveFile,
  summaryRow,
  writeTextFile,
  type AnalyzeOptions,
  type ReadCurveOptions,
  type CurveFigureRenderer,
  type SummaryRow,
} from "../index.ts";
import { etaForCurve } from "./curveOptions.ts";

/** Settings shared by every file of a batch (plain data: it is sent to worker threads). */
export interface AnalyzeBatchSettings {
  /** Options for analyzeCurve. */
  options: AnalyzeOptions;
  /** Importer options (units for headers that give none). */
  read: ReadCurveOptions;
  /** Output JSON (true) or the readable report (false). */
  json: boolean;
  /** ANSI emphasis in the readable report. */
  color: boolean;
  /** The --out folder, or null. */
  outDir: string | null;
}

/** One file of a batch. */
export interface AnalyzeJob {
  /** Position in the batch (results are printed in this order). */
  index: number;
  /** The file, as given. */
  file: string;
  /** Base name of its outputs in the --out folder (unique in the batch), or null without --out. */
  outName: string | null;
}

/** What one file gave: its printed output and summary row, or the reason it failed. */
export type AnalyzeJobResult =
  | { index: number; ok: true; output: string; row: SummaryRow | null }
  | { index: number; ok: false; error: string };

/** File names inside an --out folder. */
export const ANALYZE_OUTPUT = Object.freeze({
  summary: "summary.csv",
  jsonExtension: ".json",
  figureExtension: ".svg",
});

/** The reason of a failure (the library's, shared with the notebooks). */
export { failureReason };

/**
 * Analyses one file of a batch.
 *
 * Parameters
 * ----------
 * job : AnalyzeJob
 *     The file and its place in the batch.
 * settings : AnalyzeBatchSettings
 *     Analysis options and output choices.
 * figure : () => Promise<CurveFigureRenderer>
 *     Supplies the figure function (loaded once by the caller), called only with --out.
 *
 * Returns
 * -------
 * Promise<AnalyzeJobResult>
 *     `output` is the JSON record (one line) or the readable report; `row` the summary row
 *     with --out. Never rejects: a failure comes back as `{ ok: false, error }`.
 *
 * Notes
 * -----
 * With --out, the figure is drawn before anything is written, and the JSON and SVG are written
 * before the result counts as a success.
 */
export async function analyzeFile(job: AnalyzeJob, settings: AnalyzeBatchSettings, figure: () => Promise<CurveFigureRenderer>): Promise<AnalyzeJobResult> {
  const { index, file } = job;
  try {
    const { curve, record } = readCurveFile(file, settings.read);
    // Without --eta, a file may state its own η in a metadata line (`# eta: 0.88`).
    const { eta, note } = etaForCurve(settings.options.eta, curve);
    const analysis = analyzeCurve(curve, eta === undefined ? settings.options : { ...settings.options, eta });
    if (note) analysis.warnings.unshift(note);
    const result = analysisToJson(analysis, record);
    let row: SummaryRow | null = null;
    if (settings.outDir !== null && job.outName !== null) {
      const svg = (await figure())(analysis, { curve });
      writeTextFile(join(settings.outDir, job.outName + ANALYZE_OUTPUT.jsonExtension), JSON.stringify(result, null, 2) + "\n");
      writeTextFile(join(settings.outDir, job.outName + ANALYZE_OUTPUT.figureExtension), svg);
      row = summaryRow(result);
    }
    const output = settings.json ? JSON.stringify(result) : formatAnalysisText(result, { color: settings.color });
    return { index, ok: true, output, row };
  } catch (err) {
    return { index, ok: false, error: failureReason(file, err) };
  }
}
