/**
 * The work `dotspec analyze` does on one file, the same in the main thread and in a worker
 * thread: read, analyse, record, and with --out write the JSON and the figure.
 */
import { join } from "node:path";
import {
  analysisToJson,
  analyzeCurve,
  failedSummaryRow,
  failureReason,
  formatAnalysisText,
  inputDigest,
  makeProvenance,
  readCurveFileWithDigest,
  summaryRow,
  svgWithProvenance,
  writeTextFile,
  type AnalysisJson,
  type AnalyzeOptions,
  type CompareModelsScope,
  type Curve,
  type CurveAnalysis,
  type InputDigest,
  type Provenance,
  type ReadCurveOptions,
  type CurveFigureRenderer,
  type SummaryRow,
} from "../index.ts";
import { cliOptionNames } from "./cliOptionNames.ts";
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
  /** `--compare-models`: which curves get the model comparison; absent: none. */
  compareModels?: CompareModelsScope;
  /** `--max-evaluations`: work budget of each comparison fit (model evaluations); absent: FIT_DEFAULTS.maxEvaluations. */
  maxEvaluations?: number;
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

/**
 * What one file gave: its printed output, summary row (with --out), warnings and notes, or the
 * reason it failed and its summary row.
 */
export type AnalyzeJobResult =
  | { index: number; ok: true; output: string; row: SummaryRow | null; warnings: string[]; notes: string[] }
  | { index: number; ok: false; error: string; row?: SummaryRow };

/** File names inside an --out folder. */
export const ANALYZE_OUTPUT = Object.freeze({
  summary: "summary.csv",
  jsonExtension: ".json",
  figureExtension: ".svg",
});

/** The reason of a failure (the library's, shared with the notebooks). */
export { failureReason };

/**
 * The warning of a model comparison stopped by a wall-clock limit. The comparison runs with no
 * time limit (only its work budget, the same on every machine), so this appears only where a
 * caller asked for one (`RecordedOptions.timeLimitMs`).
 */
export const COMPARISON_TIME_LIMIT_WARNING =
  "the model comparison stopped at the fit's time limit, so where it stopped depends on this machine's speed and load: the numbers may differ on another run; " +
  "without a time limit it stops at convergence or at its work budget, the same on every machine";

/** The options as given, recorded in a record's provenance (and read back by `--replay`). */
export interface RecordedOptions {
  /** Options of analyzeCurve as given (η only when --eta was given). */
  analyze: AnalyzeOptions;
  /** Importer options as given. */
  read: ReadCurveOptions;
  /**
   * `--compare-models`: fit the orthodox model with every grouping of the peaks to the curves where
   * the rules are not decisive ("undecided", `rulesDecisive`) or to every curve ("all"); absent: no fit.
   */
  compareModels?: CompareModelsScope;
  /** Work budget of the comparison's fit, model evaluations (FitOptions.maxEvaluations). Default: FIT_DEFAULTS.maxEvaluations; `--replay` gives the recorded one. */
  maxEvaluations?: number;
  /** Opt-in wall-clock limit of the comparison's fit, ms (machine-dependent). Default: none. */
  timeLimitMs?: number;
}

/** One file read and analysed, with its JSON record. */
export interface AnalyzedFile {
  curve: Curve;
  analysis: CurveAnalysis;
  json: AnalysisJson;
}

/**
 * Reads and analyses one file and makes its JSON record: the analysis, the importer's record,
 * the file's metadata lines, the notes (where η came from) and the provenance (version, the
 * file's name, size and SHA-256, the options as given, `--compare-models` included). Runs no
 * model comparison: that is `analyzeCurveFile` (lib/cli/analyzeCurveFile.ts), which loads
 * the model fit, so that an analysis without it starts without the fit's code. Throws what the
 * reader or the analysis throws.
 *
 * Example
 * -------
 * ```ts
 * readAndAnalyze("dot-01.csv", { analyze: {}, read: {} }).json.energies.eta; // => 0.88 (from its `# eta:` line)
 * ```
 */
export function readAndAnalyze(file: string, options: RecordedOptions, command = "analyze", onReadProgress?: (fraction: number) => void): AnalyzedFile {
  // A large file is streamed; onReadProgress hears how far (it is not an option: nothing is recorded).
  const {
    parsed: { curve, record },
    input: digest,
  } = readCurveFileWithDigest(file, options.read, onReadProgress);
  // Without --eta, a file may state its own η in a metadata line (`# eta: 0.88`).
  const { eta, note } = etaForCurve(options.analyze.eta, curve);
  const analysis = analyzeCurve(curve, eta === undefined ? options.analyze : { ...options.analyze, eta });
  const provenance = makeProvenance(command, digest, recordedOf(options));
  const json = analysisToJson(analysis, record, { notes: note ? [note] : [], metadata: curve.meta.metadata, provenance });
  return { curve, analysis, json };
}

/** The provenance of an input that failed: its size and SHA-256 when it can be read. */
function failedProvenance(file: string, options: RecordedOptions, command: string): Provenance {
  let digest: InputDigest | null = null;
  try {
    digest = inputDigest(file);
  } catch {
    // Unreadable: the reason says so.
  }
  return makeProvenance(command, digest, recordedOf(options));
}

/** The options as a provenance records them: analysis, import and, when given, --compare-models (no other keys). */
function recordedOf(options: RecordedOptions): Record<string, unknown> {
  return { analyze: options.analyze, read: options.read, ...(options.compareModels ? { compareModels: options.compareModels } : {}), ...fitLimits(options) };
}

/** The comparison fit's limits that were given (work budget, opt-in time limit), as fitCurve and the provenance take them. */
export function fitLimits(options: RecordedOptions): { maxEvaluations?: number; timeLimitMs?: number } {
  return {
    ...(options.maxEvaluations !== undefined ? { maxEvaluations: options.maxEvaluations } : {}),
    ...(options.timeLimitMs !== undefined ? { timeLimitMs: options.timeLimitMs } : {}),
  };
}

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
 * onReadProgress : (file, fraction) => void, optional
 *     Hears how far a streamed (large) file has been read, 0 … 1 (in this thread only).
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
export async function analyzeFile(
  job: AnalyzeJob,
  settings: AnalyzeBatchSettings,
  figure: () => Promise<CurveFigureRenderer>,
  onReadProgress?: (file: string, fraction: number) => void,
): Promise<AnalyzeJobResult> {
  const { index, file } = job;
  const options: RecordedOptions = {
    analyze: settings.options,
    read: settings.read,
    ...(settings.compareModels ? { compareModels: settings.compareModels } : {}),
    ...(settings.compareModels && settings.maxEvaluations !== undefined ? { maxEvaluations: settings.maxEvaluations } : {}),
  };
  try {
    const onRead = onReadProgress ? (f: number) => onReadProgress(file, f) : undefined;
    // The model fit loads only where a comparison was asked for.
    const { curve, analysis, json: result } = options.compareModels
      ? (await import("./analyzeCurveFile.ts")).analyzeCurveFile(file, options, "analyze", onRead)
      : readAndAnalyze(file, options, "analyze", onRead);
    let row: SummaryRow | null = null;
    if (settings.outDir !== null && job.outName !== null) {
      const svg = svgWithProvenance((await figure())(analysis, { curve }), result.provenance!);
      writeTextFile(join(settings.outDir, job.outName + ANALYZE_OUTPUT.jsonExtension), JSON.stringify(result, null, 2) + "\n");
      writeTextFile(join(settings.outDir, job.outName + ANALYZE_OUTPUT.figureExtension), svg);
      row = summaryRow(result);
    }
    const output = settings.json ? JSON.stringify(result) : cliOptionNames(formatAnalysisText(result, { color: settings.color }));
    return { index, ok: true, output, row, warnings: result.warnings, notes: result.notes };
  } catch (err) {
    const error = cliOptionNames(failureReason(file, err));
    return { index, ok: false, error, row: failedSummaryRow(file, error, failedProvenance(file, options, "analyze")) };
  }
}
