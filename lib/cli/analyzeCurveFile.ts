/**
 * One file read, analysed and, with `--compare-models`, given the model comparison: the part of
 * `dotspec analyze` that needs the model fit, in its own module so that the command loads the
 * fit only where a comparison was asked for (an `import()` away from lib/cli/analyzeFile.ts).
 */
import { compareModelsReasons, failedModelComparison, fitCurve, fitToJson, isDotspecError, modelComparisonJson } from "../index.ts";
import { COMPARISON_TIME_LIMIT_WARNING, fitLimits, readAndAnalyze, type AnalyzedFile, type RecordedOptions } from "./analyzeFile.ts";

/**
 * Reads and analyses one file and makes its JSON record ({@link readAndAnalyze}); with
 * `options.compareModels`, the orthodox model is fitted with every grouping of the peaks where the
 * scope asks for it, and the record gains `modelComparison`.
 *
 * Parameters
 * ----------
 * file : string
 *     The curve file, as given.
 * options : RecordedOptions
 *     Analysis and importer options; `compareModels` ("undecided" or "all") and the fit's work
 *     budget (`maxEvaluations`, model evaluations) and opt-in `timeLimitMs` (ms).
 * command : string, optional
 *     The command named in the provenance. Default "analyze".
 * onReadProgress : (fraction) => void, optional
 *     Hears how far a streamed (large) file has been read, 0 … 1.
 *
 * Returns
 * -------
 * AnalyzedFile
 *     The curve, the analysis and the JSON record (with `modelComparison` where the comparison
 *     ran: the fit's record, or why it could not start).
 *
 * Throws
 * ------
 * What the reader or the analysis throws; a curve the fit cannot start on keeps its analysis and
 * its comparison says why.
 *
 * Example
 * -------
 * ```ts
 * analyzeCurveFile("dot-01.csv", { analyze: {}, read: {}, compareModels: "all" }).json.modelComparison?.status; // => "good"
 * ```
 */
export function analyzeCurveFile(file: string, options: RecordedOptions, command = "analyze", onReadProgress?: (fraction: number) => void): AnalyzedFile {
  const analyzed = readAndAnalyze(file, options, command, onReadProgress);
  const { analysis, json } = analyzed;
  const scope = options.compareModels;
  const ranBecause = scope ? compareModelsReasons(analysis, scope) : null;
  if (!scope || !ranBecause) return analyzed;
  // The comparison of every grouping of the peaks, within its work budget; a fit stopped by a
  // wall-clock limit asked for says so (where it stopped depends on the machine).
  let comparison;
  try {
    const fit = fitCurve(analysis, { compareModels: true, ...fitLimits(options) });
    comparison = modelComparisonJson(fitToJson(fit, json), scope, { ranBecause, rules: { regime: json.regime, chargingEnergyEV: analysis.assignment.energies.chargingEnergyEV } });
    if (fit.work.stoppedBy === "time") comparison.warnings.push(COMPARISON_TIME_LIMIT_WARNING);
  } catch (err) {
    // A curve the fit cannot start on (no multiplet to fit) keeps its analysis; the comparison says why.
    if (!isDotspecError(err)) throw err;
    comparison = failedModelComparison(err.message, scope, ranBecause);
  }
  return { ...analyzed, json: { ...json, modelComparison: comparison } };
}
