/**
 * The plan of a size series before any curve is analysed: which curve belongs to which dot, its
 * radius and η, and which curves have no size. Shared by `dotspec sizes` and the size-series
 * notebook, so that both read a size table and the files' metadata the same way.
 */
import { sizeFromMetadata } from "../io/sizeFromMetadata.ts";
import { checkEta, checkKnownKeys } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";

/** A curve file of the series, before analysis. */
export interface SeriesFile {
  /** The file as the caller names it (a path, or a name in a browser); shown in every output. */
  file: string;
  /**
   * The file's metadata lines (`curve.meta.metadata`), read only without a size table; null or
   * absent when the file could not be read (the analysis then says why).
   */
  metadata?: Record<string, string> | null;
}

/** A row of the size table (see parseSizeMeta), with `file` named as in {@link SeriesFile}. */
export interface SeriesTableRow {
  /** The row's 1-based line in the table, for messages. */
  line: number;
  /** The curve file, named as the caller names its files (a CLI joins it with the folder). */
  file: string;
  /** Dot id. */
  dot: string;
  /** Radius, nm. */
  radiusNM: number;
  /** η of this curve, or null when the row gives none. */
  eta: number | null;
}

/** A curve to analyse, with what is known of its dot before the analysis. */
export interface PlannedSeriesCurve {
  file: string;
  /** Dot id, or null. */
  dot: string | null;
  /** Radius, nm, or null (the curve is then unassigned). */
  radiusNM: number | null;
  /** η given for this curve (the table's, else the caller's), or undefined: the file's own line, else 1. */
  eta: number | undefined;
  /** Why the curve has no size, when `radiusNM` is null. */
  unassignedReason?: string;
}

/** The plan: curves in analysis order, and one-line problems that do not stop the series. */
export interface SeriesPlan {
  curves: PlannedSeriesCurve[];
  /** `file: problem; fix` for a size line that cannot be used (the curve is listed as unassigned). */
  problems: string[];
}

/** Options of {@link planSizeCurves}. */
export interface PlanSizeCurvesOptions {
  /** The size table's rows; null: each file's own metadata lines. Default null. */
  meta?: readonly SeriesTableRow[] | null;
  /** The size table's name, in the reason of a curve it does not list. Default "the size table". */
  metaSource?: string;
  /** η, in (0, 1], of curves whose table row gives none (`--eta`). Default undefined (the file's own line, else 1). */
  eta?: number;
  /** Turns a file's name into the key that says two names are one file (the CLI resolves paths). Default the name itself. */
  fileKey?: (file: string) => string;
}

/** Defaults of {@link planSizeCurves} (locked by a test). */
export const PLAN_SIZE_CURVES_DEFAULTS = Object.freeze({
  meta: null,
  metaSource: "the size table",
  eta: undefined,
  fileKey: (file: string): string => file,
});

/**
 * Plans a size series: the dot, radius and η of every curve, from a size table or from each
 * file's metadata lines.
 *
 * Parameters
 * ----------
 * files : SeriesFile[]
 *     Every curve file of the series (not the tables themselves), with its metadata when it
 *     could be read.
 * options : PlanSizeCurvesOptions, optional
 *     meta (the size table's rows; default none), metaSource, eta (for rows without one),
 *     fileKey.
 *
 * Returns
 * -------
 * SeriesPlan
 *     The curves to analyse with dot, radius (nm) and η, and the problems to report.
 *
 * Throws
 * ------
 * DotspecError
 *     `io/meta-missing-file` when a table row names a file that is not among `files` (naming the
 *     table, the line and the file); `options/unknown-key` for an unknown option;
 *     `options/out-of-range` for an η outside (0, 1].
 *
 * Notes
 * -----
 * 1. With a size table: one curve per row, in the table's order, with the row's dot and radius
 *    and η = the row's `eta`, else `options.eta`; then every file the table does not list, as
 *    unassigned ("not listed in META.csv"), with η = `options.eta`.
 * 2. Without: every file in the given order, with the dot and radius of its own metadata lines
 *    (sizeFromMetadata) and η = `options.eta`; a file without a size line is unassigned ("no
 *    radius_nm or diameter_nm metadata line"); a size line that cannot be used (not a number,
 *    ≤ 0) makes the curve unassigned with that reason and adds a problem line.
 * 3. A curve whose η is still undefined is analysed with its file's `# eta:` line, else 1
 *    (etaForCurve; the analysis warns).
 *
 * Example
 * -------
 * ```ts
 * planSizeCurves([{ file: "a.csv" }, { file: "b.csv" }], {
 *   meta: [{ line: 2, file: "a.csv", dot: "D1", radiusNM: 1.5, eta: 0.86 }], metaSource: "META.csv",
 * }).curves;
 * // => [{ file: "a.csv", dot: "D1", radiusNM: 1.5, eta: 0.86 },
 * //     { file: "b.csv", dot: null, radiusNM: null, eta: undefined, unassignedReason: "not listed in META.csv" }]
 * ```
 */
export function planSizeCurves(files: readonly SeriesFile[], options: PlanSizeCurvesOptions = {}): SeriesPlan {
  checkKnownKeys("planSizeCurves options", options, Object.keys(PLAN_SIZE_CURVES_DEFAULTS));
  const key = options.fileKey ?? PLAN_SIZE_CURVES_DEFAULTS.fileKey;
  const metaSource = options.metaSource ?? PLAN_SIZE_CURVES_DEFAULTS.metaSource;
  const eta = options.eta === undefined ? undefined : checkEta("planSizeCurves options.eta", options.eta);
  const curves: PlannedSeriesCurve[] = [];
  const problems: string[] = [];
  const meta = options.meta ?? null;
  if (meta !== null) {
    const present = new Set(files.map((f) => key(f.file)));
    const listed = new Set<string>();
    for (const row of meta) {
      const k = key(row.file);
      if (!present.has(k)) {
        throw new DotspecError("io/meta-missing-file", `${metaSource}: line ${row.line} (${row.file}): not among the curve files given; add the file, or remove the row`);
      }
      listed.add(k);
      curves.push({ file: row.file, dot: row.dot, radiusNM: row.radiusNM, eta: row.eta ?? eta });
    }
    for (const f of files) {
      if (listed.has(key(f.file))) continue;
      curves.push({ file: f.file, dot: null, radiusNM: null, eta, unassignedReason: `not listed in ${metaSource}` });
    }
    return { curves, problems };
  }
  for (const f of files) {
    const size = f.metadata ? sizeFromMetadata(f.metadata) : { dot: null, radiusNM: null, key: null, problem: null };
    if (size.problem) problems.push(`${f.file}: ${size.problem}; fix the line, or remove it to list the curve as unassigned`);
    curves.push({
      file: f.file,
      dot: size.dot,
      radiusNM: size.radiusNM,
      eta,
      ...(size.radiusNM === null ? { unassignedReason: size.problem ?? "no radius_nm or diameter_nm metadata line" } : {}),
    });
  }
  return { curves, problems };
}
