/**
 * `dotspec fit FILE...`: fit the orthodox-theory model to measured curves, starting from the
 * peak-based assignment of `dotspec analyze`.
 */
import type { Command } from "commander";
import {
  fitCurve,
  fitToJson,
  formatFitText,
  listCurveFiles,
  loadModelFigure,
  makeProvenance,
  svgWithProvenance,
  writeTextFile,
  FIT_DEFAULTS,
  type AnalyzeOptions,
  type CurveAnalysis,
  type CurveFit,
  type FitOptions,
  type ReadCurveOptions,
  type FitJson,
  type ModelFigureRenderer,
  type Provenance,
} from "../../index.ts";
import { join, basename, extname } from "node:path";
import { failureReason, readAndAnalyze } from "../analyzeFile.ts";
import { batchCount } from "../batchCount.ts";
import { cliOptionNames } from "../cliOptionNames.ts";
import { EXIT, type CliContext } from "../context.ts";
import { numberOption } from "../optionValue.ts";
import { addUnitOptions, etaOption, readOptions, type CurveCliOptions } from "../curveOptions.ts";
import { claimOutputFolder, sealOutputFolder } from "../outputFolder.ts";
import type { CliCommand } from "./command.ts";

/** Options of `dotspec fit` as commander hands them over. */
export interface FitCliOptions extends CurveCliOptions {
  json?: boolean;
  out?: string;
  timeLimitMs?: number;
  maxEvaluations?: number;
  maxIterations?: number;
  compareModels?: boolean;
  force?: boolean;
}

const HELP_AFTER = `
The fit starts from the peak-based assignment (as dotspec analyze finds it) and adjusts the level
energies, the charging energy, the tip/substrate rate ratio, the rate scale, the level broadening,
a current offset and a smooth background (b1·V + b3·V³). η is held fixed: one curve barely
constrains it (it trades off against every level energy); give the value you trust.

Each fit gets a status from its reduced χ² and the errors of Ec and Γtip/Γsub, not from the
optimiser: good, poor, or failed ("NO FIT": no start describes the curve; exit status 1). When the
first fit does not describe the curve, or the regime is undetermined (or with --compare-models),
other groupings of the CB peaks are compared on the CB side of the curve: the regimes forced, and
charging ladders with p whole, 2+4 or 2+2+2 read in filling order or entered from the empty dot;
the best few are fitted to the whole curve, checked for plausibility (Ec against the gap, level
order, degeneracies) and the lowest BIC wins (JSON: "alternatives", "evidence"). The regime follows
the fitted Γtip/Γsub and its error: shell filling, shell tunnelling, intermediate, or undetermined. The peak-based result is always included in the
JSON output (field "peakBased").

Each fit has a work budget, --max-evaluations model evaluations over all its starts and
hypotheses: where it is reached the fit stops at the same point on every machine, says so (JSON
"work": evaluations used, the budget, what stopped it) and its status is at best poor. The default
cuts none of the benchmark's fits. --time-limit-ms adds a wall-clock limit (off by default): where
it stops then depends on the machine and its load, and the record warns so.

The fitted rate ratio is a property of the recorded curve, not an instrument setting; any change
to the tip height or setpoint it suggests must be checked against the instrument's own limits.

Example:
  dotspec fit dot-07.csv --eta 0.85 --json > fit.json
`;

export const fitCommand: CliCommand = {
  name: "fit",
  register(program: Command, ctx: CliContext) {
    const command = program
      .command("fit")
      .description("Fit the orthodox-theory model of a dot in a double-barrier junction to measured I–V curves.")
      .argument("<FILE...>", "curve files or folders of curve files")
      .option(
        "--eta <η>",
        "voltage-division factor η in (0, 1], held fixed (default: the file's `# eta:` metadata line, else 1)",
        etaOption,
      );
    addUnitOptions(command)
      .option("--json", "print one JSON array, one record per file")
      .option("--out <DIR>", "write DIR/<name>.fit.json and DIR/<name>.fit.svg (curve, fitted model, residuals) per file")
      .option("--force", "with --out: write into DIR even if it holds files dotspec did not write (files of the same name are replaced)")
      .option(
        "--max-evaluations <n>",
        `work budget of each fit: most model evaluations over all its runs, the same on every machine (default: ${FIT_DEFAULTS.maxEvaluations})`,
        numberOption({ min: 1, integer: true, accepted: "a whole number of at least 1" }),
      )
      .option(
        "--time-limit-ms <ms>",
        "also stop each fit after this long (off by default; where it stops then depends on the machine and its load)",
        numberOption({ min: 0, minExclusive: true, accepted: "a time in milliseconds greater than 0" }),
      )
      .option(
        "--max-iterations <n>",
        `most Levenberg–Marquardt iterations (default: ${FIT_DEFAULTS.maxIterations})`,
        numberOption({ min: 1, integer: true, accepted: "a whole number of at least 1" }),
      )
      .option("--compare-models", "compare every grouping of the peaks by BIC even where the rules are decisive (slower)")
      .addHelpText("after", HELP_AFTER)
      .action(async (files: string[], opts: FitCliOptions) => {
        ctx.exitCode = await runFit(files, opts, ctx);
      });
  },
};

/** A fit's JSON record with its provenance (the same shape analyze records carry). */
export type FitRecord = FitJson & { provenance: Provenance };

/** The warning of a fit stopped by the time limit asked for: where it stopped depends on the machine. */
export const TIME_LIMIT_WARNING =
  "the fit stopped at its time limit, so where it stopped depends on this machine's speed and load: the numbers may differ on another run; " +
  "leave out --time-limit-ms (the fit then stops at convergence or at its work budget, --max-evaluations, the same on every machine)";

/**
 * Reads, analyses and fits one file and makes its record, as `dotspec fit` does (and `--replay`
 * again): the fit's record with the peak-based one inside and the provenance (the options as given).
 *
 * Parameters
 * ----------
 * file : string
 *     The curve file.
 * options : { analyze: AnalyzeOptions; read: ReadCurveOptions; fit: FitOptions }
 *     Analysis, importer and fit options as given (recorded in the provenance).
 *
 * Returns
 * -------
 * { analysis, fit, json, provenance }
 *     The analysis, the fit (a time-limit warning added when the time limit asked for stopped it),
 *     its record and the provenance.
 *
 * Throws
 * ------
 * What reading, analysing or fitting the file throws (DotspecError).
 *
 * Example
 * -------
 * ```ts
 * fitCurveFile("dot-07.csv", { analyze: { eta: 0.85 }, read: {}, fit: {} }).json.work.stoppedBy; // => null
 * ```
 */
export function fitCurveFile(file: string, options: { analyze: AnalyzeOptions; read: ReadCurveOptions; fit: FitOptions }): { analysis: CurveAnalysis; fit: CurveFit; json: FitRecord; provenance: Provenance } {
  const { analyze, read, fit: fitOptions } = options;
  const { analysis, json: peakBased } = readAndAnalyze(file, { analyze, read }, "fit");
  const fit = fitCurve(analysis, fitOptions);
  if (fit.work.stoppedBy === "time") fit.warnings.push(TIME_LIMIT_WARNING);
  const provenance = makeProvenance("fit", peakBased.provenance?.input ?? null, { analyze, read, fit: fitOptions });
  return { analysis, fit, json: { ...fitToJson(fit, peakBased), provenance }, provenance };
}

/**
 * Runs `dotspec fit`: 0 when every file was fitted (converged or not: a non-converged fit is
 * reported, not an error), 1 when a file could not be read or analysed or no start of the fit
 * described it (status "failed": the record is still printed, with the reasons).
 *
 * Notes
 * -----
 * 1. Each file is read and analysed as `dotspec analyze` does it (`readAndAnalyze`: the
 *    record with the file's metadata, notes and provenance), then fitted.
 * 2. The fit's record, and its figure, carry the provenance: tool version, command, the input's
 *    name, size and SHA-256, and the options as given (analysis, import and fit options).
 * 3. A fit stopped by the wall-clock limit asked for (--time-limit-ms) gets a warning (its result
 *    depends on the machine); one stopped by its work budget (--max-evaluations) says so in the
 *    fit's own warning and `work` (the same on every machine).
 * 4. The run ends with the count line on stderr (done, failed, warnings), as analyze does.
 */
export async function runFit(args: string[], opts: FitCliOptions, ctx: CliContext): Promise<number> {
  let failed = 0;
  let done = 0;
  let warnings = 0;
  let warned = 0;
  const files: string[] = [];
  for (const arg of args) {
    try {
      files.push(...listCurveFiles([arg]));
    } catch (err) {
      ctx.error(`${arg}: ${failureReason(arg, err)}`);
      failed++;
    }
  }
  const records: FitRecord[] = [];
  let figure: ModelFigureRenderer | null = null;
  // The output folder may hold only dotspec's own files (its manifest), unless --force.
  const planned = files.flatMap((file) => [".fit.json", ".fit.svg"].map((ext) => basename(file, extname(file)) + ext));
  if (opts.out) claimOutputFolder(opts.out, planned, opts.force === true);
  const analyze: AnalyzeOptions = opts.eta === undefined ? {} : { eta: opts.eta };
  const read = readOptions(opts);
  const fitOptions = {
    ...(opts.maxEvaluations !== undefined ? { maxEvaluations: opts.maxEvaluations } : {}),
    ...(opts.timeLimitMs !== undefined ? { timeLimitMs: opts.timeLimitMs } : {}),
    ...(opts.maxIterations !== undefined ? { maxIterations: opts.maxIterations } : {}),
    ...(opts.compareModels ? { compareModels: true } : {}),
  };
  for (const file of files) {
    try {
      const { analysis, fit, json, provenance } = fitCurveFile(file, { analyze, read, fit: fitOptions });
      records.push(json);
      if (opts.out) {
        figure ??= await loadModelFigure();
        const name = basename(file, extname(file));
        writeTextFile(join(opts.out, name + ".fit.json"), JSON.stringify(json, null, 2) + "\n");
        writeTextFile(join(opts.out, name + ".fit.svg"), svgWithProvenance(figure(analysis, { fit }), provenance));
      }
      if (!opts.json && !ctx.stdoutGone()) ctx.stdout.write(cliOptionNames(formatFitText(json)) + "\n");
      else if (opts.json) for (const w of json.warnings) ctx.error(`${file}: warning: ${w}`);
      if (fit.status === "failed") {
        // Reported in full above (or in the JSON); the file still counts as failed.
        ctx.error(`${file}: no fit (${fit.statusReasons[0]})`);
        failed++;
      } else done++;
      warnings += json.warnings.length;
      if (json.warnings.length) warned++;
    } catch (err) {
      ctx.error(`${file}: ${failureReason(file, err)}`);
      failed++;
    }
  }
  if (opts.json && !ctx.stdoutGone()) ctx.stdout.write(JSON.stringify(records) + "\n");
  if (opts.out) sealOutputFolder(opts.out, planned);
  if (!ctx.stdoutGone()) ctx.stderr.write(batchCount(done, failed, warnings, warned));
  return failed ? EXIT.failed : EXIT.ok;
}
