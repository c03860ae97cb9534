/**
 * `dotspec sizes DIR...`: analyse the curves of a size series, combine them per dot, bin them by
 * radius, fit the size models and pair optical peaks; print a summary, JSON, or write a report.
 */
import { basename, dirname, extname, join, relative, resolve } from "node:path";
import type { Command } from "commander";
import {
  CURVE_FILE_EXTENSIONS,
  SIZE_BINS_DEFAULTS,
  SIZE_FIGURE_FILES,
  SIZE_TABLE_FILES,
  failedSummaryRow,
  formatCsv,
  inputDigest,
  makeProvenance,
  summaryColumns,
  svgWithProvenance,
  tableWithProvenance,
  formatSizeSeriesText,
  isDotspecError,
  listCurveFiles,
  loadSizeFigures,
  parseMaterialJson,
  parseSizeFormula,
  planSizeCurves,
  PLAN_SIZE_CURVES_DEFAULTS,
  readCurveFile,
  readOpticalFile,
  readSizeMetaFile,
  readTextFile,
  resolveMaterial,
  sizeSeries,
  sizeSeriesTables,
  sizeSeriesToJson,
  writeTextFile,
  type AnalysisJson,
  type AnalyzeOptions,
  type Material,
  type OpticalRow,
  type SeriesCurveInput,
  type SeriesFile,
  type SeriesTableRow,
  type SizeFigureName,
  type SummaryRow,
} from "../../index.ts";
import { batchCount } from "../batchCount.ts";
import { claimOutputFolder, sealOutputFolder, outputNames } from "../outputFolder.ts";
import { ANALYZE_OUTPUT, failureReason, type AnalyzeBatchSettings, type AnalyzeJob, type AnalyzeJobResult } from "../analyzeFile.ts";
import { EXIT, UsageError, type CliContext } from "../context.ts";
import { numberOption } from "../optionValue.ts";
import { startProgress } from "../progress.ts";
import { runAnalyzeJobs } from "../runAnalyzeJobs.ts";
import { addAnalysisOptions, addUnitOptions, etaOption, readOptions, type AnalysisCliOptions } from "../curveOptions.ts";
import type { CliCommand } from "./command.ts";

/** Options of `dotspec sizes` as commander hands them over. */
export interface SizesCliOptions extends AnalysisCliOptions {
  meta?: string;
  material?: string;
  materialFile?: string;
  optical?: string;
  formula?: string[];
  binNm?: number;
}

/** Names inside the --out folder. */
export const SIZES_OUTPUT = Object.freeze({
  json: "sizes.json",
  /** Sub-folder of the per-curve JSON records and figures (as `analyze --out` writes them). */
  curveRecords: "curves",
  ...SIZE_TABLE_FILES,
  ...SIZE_FIGURE_FILES,
});

const HELP_AFTER = `
DIR is a folder of curve files (${CURVE_FILE_EXTENSIONS.join(", ")}; not its sub-folders) or a curve
file. Each curve's dot and radius come from
  --meta META.csv   one row per curve: file (relative to DIR), dot, radius_nm or diameter_nm,
                    optional eta and notes (one DIR only); curves of DIR not listed are
                    analysed and reported as unassigned
  otherwise         the file's own metadata lines: "# dot: …", "# radius_nm: …" or
                    "# diameter_nm: …", "# eta: …"; a curve without a size is unassigned
η per curve: the META.csv eta column, else --eta, else the file's "# eta:" line, else 1 (warned).

The options are analysis settings, not instrument settings; anything carried over to the
instrument must be checked against the instrument's own limits and local practice.

Output:
  default       a summary on stdout: one row per dot, flagged and unassigned curves, size bins,
                model fits and the optical pairing
  --json        one JSON object { dots, unassigned, bins, fits, optical, … } on stdout
  --out DIR     DIR/sizes.json, DIR/sizes-{curves,dots,bins,fits}.csv, DIR/sizes-*.svg figures,
                and DIR/curves/<name>.json, <name>.svg and summary.csv (as analyze --out writes them);
                DIR may hold only files dotspec wrote (listed in DIR/.dotspec-manifest.json) unless
                --force is given; every file is written under a temporary name and renamed

Exit status: 0 every curve analysed, 1 some curve or table failed (one "dotspec: …" line each on
stderr; the rest is still reported), 2 usage error. The run ends with one line on stderr: done,
failed, warnings.

Examples:
  dotspec sizes series/ --material InP
  dotspec sizes series/ --meta series/META.csv --optical optical.csv --material InP --out report
  dotspec sizes series/ --material CdSe --formula "Eg + a / R^2 - b / R ; a=1, b=0.5" --json
`;

/** Tuning of `dotspec sizes`. */
export const SIZES_CLI_DEFAULTS = Object.freeze({
  /**
   * With --jobs > 1, a group of curves sharing one η is spread over worker threads only when it
   * holds at least this many curves; smaller groups (a size table with an η per dot) run in this
   * thread, since starting a pool of workers costs about as much as analysing a few dozen curves.
   */
  minCurvesPerPool: 40,
});

/** Collects a repeatable option. */
const collect = (value: string, previous: string[] = []) => [...previous, value];

export const sizesCommand: CliCommand = {
  name: "sizes",
  register(program: Command, ctx: CliContext) {
    const command = program
      .command("sizes")
      .description(
        "Analyse the curves of a size series, combine them per dot (mean ± standard error, outliers flagged), bin the dots by radius, fit the size models of the material and pair optical peaks with the tunnelling levels.",
      )
      .argument("<DIR...>", "folders of curve files (or curve files)")
      .option("--meta <META.csv>", "size table: file, dot, radius_nm or diameter_nm, optional eta and notes (default: each file's metadata lines)")
      .option("--eta <η>", "voltage-division factor η in (0, 1] for curves whose META.csv row gives none (default: the file's `# eta:` line, else 1)", etaOption)
      .option("--material <name>", "the dots' material for the models: InP, CdSe, CdTe, PbS, InAs (default: none, no model fits)")
      .option("--material-file <M.json>", "the material as JSON: a built-in `base` with fields changed, or every field")
      .option("--optical <OPTICAL.csv>", "ensemble optical peaks: radius_nm (or diameter_nm), peak_ev_1, peak_ev_2, …")
      .option("--formula <EXPR>", 'fit a formula in R (nm) too, e.g. "Eg + a / R^2 - b / R ; a=1, b=0.5"; repeatable', collect)
      .option(
        "--bin-nm <nm>",
        `width of the size bins in nm (default: ${SIZE_BINS_DEFAULTS.binNM})`,
        numberOption({ min: 0, minExclusive: true, accepted: "a width in nm greater than 0 (e.g. 0.25)" }),
      );
    addAnalysisOptions(command);
    addUnitOptions(command)
      .option("--json", "print one JSON object of the series on stdout instead of the summary")
      .option("--out <DIR>", "write the series report (tables, figures, sizes.json) and the per-curve records to DIR")
      .option("--force", "with --out: write into DIR even if it holds files dotspec did not write (files of the same name are replaced)")
      .option(
        "--jobs <n>",
        "analyse on this many threads, this one included, 1 to 64 (default: 1)",
        numberOption({ min: 1, max: 64, integer: true, accepted: "a whole number of threads from 1 to 64" }),
      )
      .addHelpText("after", HELP_AFTER)
      .action(async (dirs: string[], opts: SizesCliOptions) => {
        ctx.exitCode = await runSizes(dirs, opts, ctx);
      });
  },
};

/** The material of --material / --material-file, or null; a bad one is a usage error. */
function materialOf(opts: SizesCliOptions, onWarning: (message: string) => void): Material | null {
  if (opts.material !== undefined && opts.materialFile !== undefined) {
    throw new UsageError("give --material or --material-file, not both (a material file can start from a built-in with \"base\")");
  }
  try {
    if (opts.material !== undefined) return resolveMaterial(opts.material, "--material");
    if (opts.materialFile !== undefined) return parseMaterialJson(readTextFile(opts.materialFile, "material file", { onWarning }), opts.materialFile);
  } catch (err) {
    if (isDotspecError(err)) throw new UsageError(err.message);
    throw err;
  }
  return null;
}

/**
 * Runs `dotspec sizes`.
 *
 * Parameters
 * ----------
 * dirs : string[]
 *     Folders (or files) as given on the command line.
 * opts : SizesCliOptions
 *     The parsed options.
 * ctx : CliContext
 *     Streams.
 *
 * Returns
 * -------
 * Promise<number>
 *     0 every curve analysed and the report made, 1 some curve or table failed.
 *
 * Throws
 * ------
 * UsageError
 *     Conflicting options, --meta with several folders, an unknown material, a formula that
 *     does not parse, --out pointing at an input folder.
 *
 * Notes
 * -----
 * 1. The plan (planSizeCurves): with --meta, the table's rows (each file checked to exist
 *    inside DIR) plus the other curve files of DIR as unassigned; without, every curve file of
 *    the arguments with the dot and size of its metadata lines (read with the importer).
 * 2. The curves are analysed by the same code as `analyze` (analyzeFile, on worker threads with
 *    --jobs for groups of at least {@link SIZES_CLI_DEFAULTS}.minCurvesPerPool curves), in
 *    groups of equal η so that a size table's per-curve η is used; with --out each curve's JSON
 *    and figure go to DIR/curves as `analyze --out` writes them.
 * 3. The analysed curves go to sizeSeries (dots, bins, fits, optical pairing); the result is
 *    printed or written.
 */
export async function runSizes(dirs: readonly string[], opts: SizesCliOptions, ctx: CliContext): Promise<number> {
  // How the tables were read (a size table saved as Windows-1252; at most one warning per table):
  // on stderr now, first among the series' warnings, and counted with the curves' warnings.
  const tableWarnings: string[] = [];
  const onWarning = (message: string) => {
    tableWarnings.push(message);
    ctx.error(`warning: ${message}`);
  };
  const material = materialOf(opts, onWarning);
  const formulas = opts.formula ?? [];
  for (const f of formulas) {
    try {
      parseSizeFormula(f);
    } catch (err) {
      if (isDotspecError(err)) throw new UsageError(`--formula: ${err.message}`);
      throw err;
    }
  }
  if (opts.meta !== undefined && dirs.length !== 1) {
    throw new UsageError(`--meta describes one folder, but ${dirs.length} were given; run dotspec sizes once per folder, or list every curve in one table`);
  }
  if (formulas.length && material === null) {
    throw new UsageError("--formula needs a material (--material or --material-file): the fits run with the material's models");
  }
  let failed = 0;

  // Tables first: a broken table stops before any curve is analysed.
  let optical: OpticalRow[] | null = null;
  if (opts.optical !== undefined) {
    try {
      optical = readOpticalFile(opts.optical, { onWarning });
    } catch (err) {
      ctx.error(failureReason("", err));
      return EXIT.failed;
    }
  }
  const tables = new Set([opts.meta, opts.optical].filter((p): p is string => p !== undefined).map((p) => resolve(p)));
  // The curve files, then the plan (dot, radius, η of each; the library's rule, shared with the
  // notebook): from the size table, or from each file's own metadata lines.
  const files: SeriesFile[] = [];
  let meta: SeriesTableRow[] | null = null;
  if (opts.meta !== undefined) {
    const dir = dirs[0];
    try {
      meta = readSizeMetaFile(opts.meta, dir, { onWarning }).map((row) => ({ ...row, file: row.path }));
    } catch (err) {
      ctx.error(failureReason("", err));
      return EXIT.failed;
    }
    let all: string[] = [];
    try {
      all = listCurveFiles([dir]);
    } catch (err) {
      ctx.error(`${dir}: ${failureReason(dir, err)}`);
      return EXIT.failed;
    }
    const seen = new Set<string>();
    for (const file of [...meta.map((row) => row.file), ...all]) {
      const key = resolve(file);
      if (seen.has(key) || tables.has(key)) continue;
      seen.add(key);
      files.push({ file });
    }
  } else {
    const seen = new Set<string>();
    for (const input of dirs) {
      let list: string[];
      try {
        list = listCurveFiles([input]);
      } catch (err) {
        ctx.error(`${input}: ${failureReason(input, err)}`);
        failed++;
        continue;
      }
      if (list.length === 0) {
        ctx.error(`${input}: no curve files (${CURVE_FILE_EXTENSIONS.join(", ")}) in this folder`);
        failed++;
      }
      for (const file of list) {
        const key = resolve(file);
        if (seen.has(key) || tables.has(key)) continue;
        seen.add(key);
        // A file that cannot be read fails in the analysis below, with the importer's message.
        let metadata: Record<string, string> | null = null;
        try {
          metadata = readCurveFile(file, readOptions(opts)).curve.meta.metadata;
        } catch {
          /* reported by the analysis */
        }
        files.push({ file, metadata });
      }
    }
  }
  const plan = planSizeCurves(files, { meta, metaSource: opts.meta ?? PLAN_SIZE_CURVES_DEFAULTS.metaSource, eta: opts.eta, fileKey: (f) => resolve(f) });
  for (const problem of plan.problems) {
    ctx.error(problem);
    failed++;
  }
  const planned = plan.curves;

  const outDir = opts.out;
  const curvesDir = outDir !== undefined ? join(outDir, SIZES_OUTPUT.curveRecords) : null;
  if (outDir !== undefined) {
    const out = resolve(outDir);
    for (const p of planned) {
      const d = resolve(dirname(p.file));
      if (resolve(p.file) === out || d === out || (curvesDir !== null && d === resolve(curvesDir))) {
        throw new UsageError(`--out ${outDir} is the folder of the input file ${p.file}; write the report to another folder (dotspec does not write next to its inputs)`);
      }
    }
  }

  // Analyse, in groups of equal η (a size table may give each curve its own).
  const analyzeOptions: AnalyzeOptions = {};
  if (opts.windowMv !== undefined) analyzeOptions.windowMV = opts.windowMv;
  if (opts.order !== undefined) analyzeOptions.order = opts.order;
  if (opts.minStepSigma !== undefined) analyzeOptions.minStepSigma = opts.minStepSigma;
  if (opts.useMeasured) analyzeOptions.useMeasured = true;
  const names = curvesDir !== null ? outputNames(planned.map((p) => p.file)) : null;
  // The files this run writes, relative to --out: refused when the folder holds others' files (unless --force).
  const plannedOutputs = names
    ? [
        SIZES_OUTPUT.json,
        ...Object.values(SIZE_TABLE_FILES),
        ...Object.values(SIZE_FIGURE_FILES),
        `${SIZES_OUTPUT.curveRecords}/${ANALYZE_OUTPUT.summary}`,
        ...names.flatMap((n) => [`${SIZES_OUTPUT.curveRecords}/${n}${ANALYZE_OUTPUT.jsonExtension}`, `${SIZES_OUTPUT.curveRecords}/${n}${ANALYZE_OUTPUT.figureExtension}`]),
      ]
    : [];
  if (outDir !== undefined) claimOutputFolder(outDir, plannedOutputs, opts.force === true);
  const groups = new Map<number | undefined, AnalyzeJob[]>();
  planned.forEach((p, index) => {
    const list = groups.get(p.eta) ?? [];
    list.push({ index, file: p.file, outName: names ? names[index] : null });
    groups.set(p.eta, list);
  });
  const progress = startProgress(planned.length, ctx.stderr, "sizes");
  const results: (AnalyzeJobResult | undefined)[] = new Array(planned.length);
  for (const [eta, jobs] of groups) {
    const settings: AnalyzeBatchSettings = {
      options: eta === undefined ? analyzeOptions : { ...analyzeOptions, eta },
      read: readOptions(opts),
      json: true,
      color: false,
      outDir: curvesDir,
    };
    const threads = jobs.length >= SIZES_CLI_DEFAULTS.minCurvesPerPool ? (opts.jobs ?? 1) : 1;
    await runAnalyzeJobs(jobs, settings, threads, (r) => {
      progress.tick();
      results[r.index] = r;
    });
  }
  progress.stop();

  const curves: SeriesCurveInput[] = [];
  let done = 0;
  let warnings = 0;
  let warned = 0;
  planned.forEach((p, i) => {
    const r = results[i];
    if (!r || !r.ok) {
      ctx.error(`${p.file}: ${r ? r.error : "not analysed"}`);
      failed++;
      return;
    }
    done++;
    warnings += r.warnings.length;
    if (r.warnings.length) warned++;
    const values = JSON.parse(r.output) as AnalysisJson;
    curves.push({
      file: p.file,
      dot: p.dot,
      radiusNM: p.radiusNM,
      values,
      ...(p.unassignedReason !== undefined ? { unassignedReason: p.unassignedReason } : {}),
    });
  });

  let series;
  try {
    series = sizeSeries(curves, { material, formulas, optical, ...(opts.binNm !== undefined ? { binNM: opts.binNm } : {}) });
  } catch (err) {
    ctx.error(failureReason("", err));
    return EXIT.failed;
  }
  const json = sizeSeriesToJson(series);
  const record = { ...json, warnings: [...tableWarnings, ...json.warnings], provenance: seriesProvenance(opts, analyzeOptions) };
  // Nobody reads stdout any more (`dotspec sizes … | head`): skip it, still write the report.
  if (!ctx.stdoutGone()) ctx.stdout.write(opts.json ? JSON.stringify(record, null, 2) + "\n" : formatSizeSeriesText(record));

  if (outDir !== undefined) {
    try {
      writeTextFile(join(outDir, SIZES_OUTPUT.json), JSON.stringify(record, null, 2) + "\n");
      // The per-curve summary, as `analyze --out` writes it, beside the per-curve records.
      // One row per curve, failed ones with status and reason.
      const rows: SummaryRow[] = planned.map((p, i) => {
        const r = results[i];
        if (r && r.ok && r.row) return r.row;
        return r?.row ?? failedSummaryRow(p.file, r && !r.ok ? r.error : "not analysed");
      });
      writeTextFile(join(curvesDir!, ANALYZE_OUTPUT.summary), formatCsv(rows, summaryColumns(rows)));
      const t = sizeSeriesTables(record, curves);
      // Each row carries the version and options; the per-curve table also each file's size and SHA-256.
      const inputs = new Map(curves.map((c) => [c.file, (c.values as { provenance?: AnalysisJson["provenance"] }).provenance?.input ?? null]));
      for (const key of ["curves", "dots", "bins", "fits"] as const) {
        const table = tableWithProvenance(t[key], record.provenance, key === "curves" ? (row) => inputs.get(String(row.file)) ?? null : undefined);
        writeTextFile(join(outDir, SIZE_TABLE_FILES[key]), formatCsv(table.rows, table.columns));
      }
      const draw = await loadSizeFigures();
      const figures = draw(series);
      for (const [name, svg] of Object.entries(figures) as [SizeFigureName, string][]) writeTextFile(join(outDir, SIZE_FIGURE_FILES[name]), svgWithProvenance(svg, record.provenance));
      sealOutputFolder(outDir, plannedOutputs);
      if (!opts.json) ctx.stderr.write(`dotspec: size-series report written to ${relative(process.cwd(), resolve(outDir)) || "."}\n`);
    } catch (err) {
      ctx.error(failureReason("", err));
      failed++;
    }
  }
  ctx.stderr.write(batchCount(done, failed, warnings + tableWarnings.length, warned + tableWarnings.length));
  return failed ? EXIT.failed : EXIT.ok;
}

/**
 * The provenance of a size series: the options as given, and the name, size and SHA-256 of the
 * tables (the curves' own are in their records).
 */
function seriesProvenance(opts: SizesCliOptions, analyzeOptions: AnalyzeOptions) {
  const tables: Record<string, unknown> = {};
  for (const [key, path] of [["meta", opts.meta], ["optical", opts.optical], ["materialFile", opts.materialFile]] as const) {
    if (path === undefined) continue;
    try {
      tables[key] = inputDigest(path);
    } catch {
      tables[key] = { name: path };
    }
  }
  const given: Record<string, unknown> = { analyze: opts.eta === undefined ? analyzeOptions : { ...analyzeOptions, eta: opts.eta }, read: readOptions(opts) };
  if (opts.material !== undefined) given.material = opts.material;
  if (opts.formula?.length) given.formulas = [...opts.formula];
  if (opts.binNm !== undefined) given.binNM = opts.binNm;
  given.tables = tables;
  return makeProvenance("sizes", null, given);
}
