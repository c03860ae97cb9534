/**
 * `dotspec fit FILE...`: fit the orthodox-theory model to measured curves, starting from the
 * peak-based assignment of `dotspec analyze`.
 */
import type { Command } from "commander";
import {
  analysisToJson,
  analyzeCurve,
  fitCurve,
  fitToJson,
  formatFitText,
  listCurveFiles,
  loadModelFigure,
  readCurveFile,
  writeTextFile,
  FIT_DEFAULTS,
  type FitJson,
  type ModelFigureRenderer,
} from "../../index.ts";
import { join, basename, extname } from "node:path";
import { failureReason } from "../analyzeFile.ts";
import { EXIT, type CliContext } from "../context.ts";
import { numberOption } from "../optionValue.ts";
import { addUnitOptions, etaForCurve, etaOption, readOptions, type CurveCliOptions } from "../curveOptions.ts";
import { claimOutputFolder, sealOutputFolder } from "../outputFolder.ts";
import type { CliCommand } from "./command.ts";

/** Options of `dotspec fit` as commander hands them over. */
export interface FitCliOptions extends CurveCliOptions {
  json?: boolean;
  out?: string;
  timeLimitMs?: number;
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
JSON output (field "peakBased"). The fit stops at --time-limit-ms in any case.

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
        "--time-limit-ms <ms>",
        `stop each fit after this long (default: ${FIT_DEFAULTS.timeLimitMs})`,
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

/**
 * Runs `dotspec fit`: 0 when every file was fitted (converged or not: a non-converged fit is
 * reported, not an error), 1 when a file could not be read or analysed or no start of the fit
 * described it (status "failed": the record is still printed, with the reasons).
 */
export async function runFit(args: string[], opts: FitCliOptions, ctx: CliContext): Promise<number> {
  let failed = false;
  const files: string[] = [];
  for (const arg of args) {
    try {
      files.push(...listCurveFiles([arg]));
    } catch (err) {
      ctx.error(`${arg}: ${failureReason(arg, err)}`);
      failed = true;
    }
  }
  const records: FitJson[] = [];
  let figure: ModelFigureRenderer | null = null;
  // The output folder may hold only dotspec's own files (its manifest), unless --force.
  const planned = files.flatMap((file) => [".fit.json", ".fit.svg"].map((ext) => basename(file, extname(file)) + ext));
  if (opts.out) claimOutputFolder(opts.out, planned, opts.force === true);
  for (const file of files) {
    try {
      const { curve, record } = readCurveFile(file, readOptions(opts));
      const { eta, note } = etaForCurve(opts.eta, curve);
      const analysis = analyzeCurve(curve, eta === undefined ? {} : { eta });
      const fit = fitCurve(analysis, { timeLimitMs: opts.timeLimitMs, maxIterations: opts.maxIterations, compareModels: opts.compareModels });
      if (note) fit.warnings.unshift(note);
      const json = fitToJson(fit, analysisToJson(analysis, record));
      records.push(json);
      if (opts.out) {
        figure ??= await loadModelFigure();
        const name = basename(file, extname(file));
        writeTextFile(join(opts.out, name + ".fit.json"), JSON.stringify(json, null, 2) + "\n");
        writeTextFile(join(opts.out, name + ".fit.svg"), figure(analysis, { fit }));
      }
      if (!opts.json && !ctx.stdoutGone()) ctx.stdout.write(formatFitText(json) + "\n");
      if (fit.status === "failed") {
        // Reported in full above (or in the JSON); the file still counts as failed.
        ctx.error(`${file}: no fit (${fit.statusReasons[0]})`);
        failed = true;
      }
    } catch (err) {
      ctx.error(`${file}: ${failureReason(file, err)}`);
      failed = true;
    }
  }
  if (opts.json && !ctx.stdoutGone()) ctx.stdout.write(JSON.stringify(records) + "\n");
  if (opts.out) sealOutputFolder(opts.out, planned);
  return failed ? EXIT.failed : EXIT.ok;
}
