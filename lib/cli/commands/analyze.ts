/**
 * `dotspec analyze FILE...`: analyse curve files and print a readable report, JSON, or write a
 * report folder (JSON per file, summary.csv, a figure per file).
 */
import { existsSync } from "node:fs";
import { basename, dirname, extname, join, resolve } from "node:path";
import { InvalidArgumentError, type Command } from "commander";
import {
  CURVE_FILE_EXTENSIONS,
  failedSummaryRow,
  FIT_DEFAULTS,
  formatCsv,
  listCurveFiles,
  summaryColumns,
  writeTextFile,
  type AnalyzeOptions,
  type CompareModelsScope,
  type SummaryRow,
} from "../../index.ts";
import { cliOptionNames } from "../cliOptionNames.ts";
import { batchCount } from "../batchCount.ts";
import { claimOutputFolder, sealOutputFolder, outputNames } from "../outputFolder.ts";
import { ANALYZE_OUTPUT, failureReason, type AnalyzeBatchSettings, type AnalyzeJob, type AnalyzeJobResult } from "../analyzeFile.ts";
import { EXIT, UsageError, type CliContext } from "../context.ts";
import { numberOption } from "../optionValue.ts";
import { PROGRESS_DEFAULTS, startProgress, type Progress } from "../progress.ts";
import { runAnalyzeJobs } from "../runAnalyzeJobs.ts";
import { addAnalysisOptions, addUnitOptions, etaOption, readOptions, type AnalysisCliOptions } from "../curveOptions.ts";
import type { CliCommand } from "./command.ts";

/** Options of `dotspec analyze` as commander hands them over. */
export interface AnalyzeCliOptions extends AnalysisCliOptions {
  replay?: string;
  /** `--compare-models` alone (true), or with "undecided" or "all". */
  compareModels?: true | CompareModelsScope;
  maxEvaluations?: number;
}

const COMPARE_MODELS_SCOPES: readonly string[] = ["undecided", "all"];

/**
 * `--compare-models FILE …`: commander takes the word after an option with an optional value as
 * that value, so the file would be read as a scope. A word after `--compare-models` that is no
 * scope but an existing file or folder stays an argument: the option gets its default scope
 * explicitly. Any other word is left to be refused as a scope.
 */
export function separateCompareModelsScope(argv: readonly string[]): string[] {
  const end = argv.indexOf("--");
  return argv.map((word, i) => {
    const next = argv[i + 1];
    if (word !== "--compare-models" || next === undefined || (end >= 0 && i > end)) return word;
    const isPath = !next.startsWith("-") && !COMPARE_MODELS_SCOPES.includes(next) && existsSync(next);
    return isPath ? "--compare-models=undecided" : word;
  });
}

/** The value of `--compare-models [SCOPE]`. */
function compareModelsOption(value: string): CompareModelsScope {
  if (value === "undecided" || value === "all") return value;
  throw new InvalidArgumentError(`expected "undecided" (the curves where the rules are not decisive, the default) or "all"; got ${JSON.stringify(value)} (not a scope, nor a file or folder that exists)`);
}

const HELP_AFTER = `
The options are analysis settings (how a recorded curve is processed), not instrument settings;
anything carried over to the instrument (bias range, setpoint) must be checked against the
instrument's own limits.

FILE may be a curve file (delimited text) or a folder, whose ${CURVE_FILE_EXTENSIONS.join(", ")} files
are analysed (not its sub-folders). Input files are only read, never written.

Output:
  default       a readable report per file on stdout
  --json        one JSON array on stdout, one record per file that succeeded (warnings also
                on stderr, one "dotspec: FILE: warning: …" line each)
  --out DIR     DIR/<name>.json and DIR/<name>.svg per file and DIR/summary.csv (one row per
                input, failed ones with status "failed" and the reason); DIR is created if
                missing, must not be the folder of an input file, and may hold only files
                dotspec wrote (listed in DIR/.dotspec-manifest.json) unless --force is given
  --compare-models [undecided|all]
                also fit the orthodox model with every grouping of the peaks (shell filling
                or tunnelling, p whole or split, ladders) and compare them by BIC, on the
                curves where the rules are not decisive (default: regime undetermined, s
                step ratio near a regime boundary, a shell short of its charging peaks, an
                even tunnelling ladder) or on all; the record gains "modelComparison" (why it
                ran, regime from the fitted Γtip/Γsub, Ec and Γtip/Γsub with their ±, status,
                alternatives, and "decides": true where the record stands by a good fit with
                the BIC weight of its answer ≥ 0.9 instead of the rules). Slow: about
                0.3–2 s per curve fitted
  --replay R    re-run the analysis recorded in R (a JSON record or array of records) on the
                recorded file with the recorded options, and say whether the numbers match;
                a record of dotspec fit is re-fitted, with the work budget it names

Every file is written under a temporary name and renamed into place, so an interrupted run
leaves no half-written file. The run ends with one line on stderr: done, failed, warnings.

Exit status: 0 every file analysed (--replay: the numbers match), 1 some file failed (one
"dotspec: FILE: reason" line each on stderr; the other files are still analysed; --replay: the
numbers differ or the file changed), 2 usage error.

Examples:
  dotspec analyze dot-07.csv --eta 0.85
  dotspec analyze data/ --eta 0.85 --out report
  dotspec analyze data/*.csv --json > results.json
  dotspec analyze --replay report/dot-07.json
`;

export const analyzeCommand: CliCommand = {
  name: "analyze",
  prepareArgs: separateCompareModelsScope,
  register(program: Command, ctx: CliContext) {
    const command = program
      .command("analyze")
      .description("Analyse I–V curves of single quantum dots: dI/dV, peaks, shells, gap, charging energy and level spacings.")
      .argument("[FILE...]", "curve files or folders of curve files")
      .option(
        "--eta <η>",
        "voltage-division factor η in (0, 1] that converts bias to energy (default: the file's `# eta:` metadata line, else 1: energies then equal bias values)",
        etaOption,
      );
    addAnalysisOptions(command);
    addUnitOptions(command)
      .option("--json", "print one JSON array of the analysis records on stdout instead of the report")
      .option("--out <DIR>", "write DIR/<name>.json, DIR/<name>.svg per file and DIR/summary.csv")
      .option(
        "--jobs <n>",
        "analyse on this many threads, this one included, 1 to 64 (default: 1); worth it for large batches on idle cores",
        numberOption({ min: 1, max: 64, integer: true, accepted: "a whole number of threads from 1 to 64" }),
      )
      .option("--force", "with --out: write into DIR even if it holds files dotspec did not write (files of the same name are replaced)")
      .option(
        "--compare-models [scope]",
        "also fit the model with every grouping of the peaks and compare them, on the curves where the rules are not decisive (\"undecided\", the default) or on \"all\" (slow)",
        compareModelsOption,
      )
      .option(
        "--max-evaluations <n>",
        `with --compare-models: work budget of each comparison fit, most model evaluations over all its runs, the same on every machine (default: ${FIT_DEFAULTS.maxEvaluations})`,
        numberOption({ min: 1, integer: true, accepted: "a whole number of at least 1" }),
      )
      .option("--replay <RECORD.json>", "re-run a recorded analysis on its file with its options and compare the numbers")
      .addHelpText("after", HELP_AFTER)
      .action(async (files: string[], opts: AnalyzeCliOptions) => {
        if (opts.replay !== undefined) {
          if (files.length) throw new UsageError("--replay takes no FILE: the record names its file");
          ctx.exitCode = await (await import("../replay.ts")).runReplay(opts.replay, ctx);
          return;
        }
        if (!files.length) throw new UsageError("missing FILE: give curve files or folders (or --replay RECORD.json)");
        if (opts.maxEvaluations !== undefined && opts.compareModels === undefined) {
          throw new UsageError("--max-evaluations sets the work budget of the model comparison's fits; add --compare-models (or use dotspec fit --max-evaluations)");
        }
        ctx.exitCode = await runAnalyze(files, opts, ctx);
      });
  },
};

/**
 * Runs `dotspec analyze`.
 *
 * Parameters
 * ----------
 * inputs : string[]
 *     Files and folders as given on the command line.
 * opts : AnalyzeCliOptions
 *     The parsed options (numbers already checked).
 * ctx : CliContext
 *     Streams.
 *
 * Returns
 * -------
 * Promise<number>
 *     The exit code: 0 all files analysed, 1 some file failed.
 *
 * Throws
 * ------
 * UsageError
 *     When --out is the folder of an input file (or an input file itself), or holds files dotspec
 *     did not write (or that changed since) and --force is not given.
 *
 * Notes
 * -----
 * 1. Each argument is expanded on its own (`listCurveFiles`), so a missing path fails alone;
 *    a file reached twice is analysed once.
 * 2. Each file ({@link analyzeFile}): readCurveFile → analyzeCurve → analysisToJson, and with
 *    --out the figure, DIR/<name>.json and DIR/<name>.svg; a failure prints one line and the
 *    batch goes on.
 * 3. With --jobs N > 1 the files are spread over this thread and N − 1 worker threads; results are printed in the order
 *    of the files all the same. Not the default: on a machine whose cores are busy with other
 *    work the threads cost more than they give (measured while developing: 1,000 files took
 *    longer with 2 threads than with 1 on a shared 2-core machine).
 * 4. Observable Plot and jsdom are loaded only with --out, at the first figure.
 * 5. With --json the array is printed at the end; the readable report is printed file by file,
 *    and the batch stops early when nobody reads stdout any more.
 * 6. With --out, the folder's manifest lists the files this run writes before any is written
 *    and their SHA-256 after (lib/cli/outputFolder.ts); each file is written under a temporary
 *    name and renamed. summary.csv has one row per input, failed ones with status and reason.
 * 7. The run ends with `batchCount` on stderr.
 */
export async function runAnalyze(inputs: readonly string[], opts: AnalyzeCliOptions, ctx: CliContext): Promise<number> {
  let failed = 0;
  const files: string[] = [];
  const seen = new Set<string>();
  // Every input gets a row in summary.csv, also one that could not be listed.
  const rows: SummaryRow[] = [];
  const failInput = (input: string, reason: string) => {
    ctx.error(`${input}: ${reason}`);
    rows.push(failedSummaryRow(input, cliOptionNames(reason)));
    failed++;
  };
  for (const input of inputs) {
    let list: string[];
    try {
      list = listCurveFiles([input]);
    } catch (err) {
      failInput(input, failureReason(input, err));
      continue;
    }
    if (list.length === 0) failInput(input, `no curve files (${CURVE_FILE_EXTENSIONS.join(", ")}) in this folder`);
    for (const f of list) {
      const key = resolve(f);
      if (!seen.has(key)) {
        seen.add(key);
        files.push(f);
      }
    }
  }

  const outDir = opts.out;
  if (outDir !== undefined) {
    const out = resolve(outDir);
    for (const f of files) {
      if (resolve(f) === out) throw new UsageError(`--out ${outDir} is an input file; give a folder for the report`);
      if (resolve(dirname(f)) === out) {
        throw new UsageError(`--out ${outDir} is the folder of the input file ${f}; write the report to another folder (dotspec does not write next to its inputs)`);
      }
    }
  }
  const names = outDir !== undefined ? outputNames(files, [basename(ANALYZE_OUTPUT.summary, extname(ANALYZE_OUTPUT.summary))]) : null;
  const planned = names ? [...names.flatMap((n) => [n + ANALYZE_OUTPUT.jsonExtension, n + ANALYZE_OUTPUT.figureExtension]), ANALYZE_OUTPUT.summary] : [];
  // Refuses a folder holding files dotspec did not write (unless --force); lists what this run writes.
  if (outDir !== undefined) claimOutputFolder(outDir, planned, opts.force === true);

  const analyzeOptions: AnalyzeOptions = {};
  if (opts.eta !== undefined) analyzeOptions.eta = opts.eta;
  if (opts.windowMv !== undefined) analyzeOptions.windowMV = opts.windowMv;
  if (opts.order !== undefined) analyzeOptions.order = opts.order;
  if (opts.minStepSigma !== undefined) analyzeOptions.minStepSigma = opts.minStepSigma;
  if (opts.useMeasured) analyzeOptions.useMeasured = true;

  const json = opts.json === true;
  const settings: AnalyzeBatchSettings = {
    options: analyzeOptions,
    read: readOptions(opts),
    ...(opts.compareModels !== undefined ? { compareModels: opts.compareModels === true ? "undecided" : opts.compareModels } : {}),
    ...(opts.maxEvaluations !== undefined ? { maxEvaluations: opts.maxEvaluations } : {}),
    json,
    color: ctx.stdout.isTTY === true && !ctx.env.NO_COLOR && !json,
    outDir: outDir ?? null,
  };
  const jobs: AnalyzeJob[] = files.map((file, index) => ({ index, file, outName: names ? names[index] : null }));

  // Text to a terminal shows its own progress; a bar would interleave with it.
  const progress = startProgress(json || ctx.stdout.isTTY !== true ? files.length : 0, ctx.stderr, "analyze");
  const records: string[] = [];
  let printed = 0;
  let done = 0;
  let warnings = 0;
  let warned = 0;
  // Results may arrive out of order from worker threads; they are printed in the batch's order.
  const pending = new Map<number, AnalyzeJobResult>();
  let next = 0;
  const emit = (r: AnalyzeJobResult) => {
    if (!r.ok) {
      progress.log(`dotspec: ${files[r.index]}: ${r.error}\n`);
      rows.push(r.row ?? failedSummaryRow(files[r.index], r.error));
      failed++;
      return;
    }
    done++;
    warnings += r.warnings.length;
    if (r.warnings.length) warned++;
    // The readable report shows the warnings; JSON on stdout is for programs, so people see them here.
    if (json) for (const w of r.warnings) progress.log(`dotspec: ${files[r.index]}: warning: ${cliOptionNames(w)}\n`);
    if (r.row) rows.push(r.row);
    if (json) records.push(r.output);
    else ctx.stdout.write((printed++ ? "\n" : "") + r.output);
  };
  const reading = readProgress(files.length, ctx);
  await runAnalyzeJobs(
    jobs,
    settings,
    opts.jobs ?? 1,
    (r) => {
      reading?.finished(files[r.index]);
      progress.tick();
      pending.set(r.index, r);
      while (pending.has(next)) {
        emit(pending.get(next)!);
        pending.delete(next++);
      }
    },
    // Nobody reads the output any more (`dotspec analyze … | head`): stop early.
    () => ctx.stdoutGone(),
    // A large file is streamed: its own bar (on a terminal, when the batch has no bar of its own).
    reading?.report,
  );
  progress.stop();

  if (json) ctx.stdout.write(records.length ? `[\n${records.join(",\n")}\n]\n` : "[]\n");
  if (outDir !== undefined) {
    const path = join(outDir, ANALYZE_OUTPUT.summary);
    try {
      writeTextFile(path, formatCsv(rows, summaryColumns(rows)));
      sealOutputFolder(outDir, planned);
    } catch (err) {
      ctx.error(failureReason("", err));
      failed++;
    }
  }
  // Stopped early because nobody reads the output any more (`… | head`): stop quietly.
  if (!ctx.stdoutGone()) ctx.stderr.write(batchCount(done, failed, warnings, warned));
  return failed ? EXIT.failed : EXIT.ok;
}

/**
 * The reading bar of large (streamed) files: one bar per file, in % read, on a terminal, for
 * batches too small for the batch's own bar. With worker threads two files may be read at once:
 * the bar follows one file until it is read (or its result comes: a file that fails halfway
 * never reports the end), and another file's reports start a bar only after that.
 */
function readProgress(files: number, ctx: CliContext): { report: (file: string, fraction: number) => void; finished: (file: string) => void } | undefined {
  if (files > PROGRESS_DEFAULTS.minFiles) return undefined;
  let current: { file: string; bar: Progress; shown: number } | null = null;
  const finished = (file: string) => {
    if (current?.file !== file) return;
    current.bar.stop();
    current = null;
  };
  const report = (file: string, fraction: number) => {
    if (current !== null && current.file !== file) return;
    current ??= { file, bar: startProgress(100, ctx.stderr, `read ${basename(file)}`, "%"), shown: 0 };
    for (const to = Math.floor(100 * fraction); current.shown < to; current.shown++) current.bar.tick();
    if (fraction >= 1) finished(file);
  };
  return { report, finished };
}
