/**
 * `dotspec analyze --replay RECORD.json`: runs a recorded analysis (or model fit) again, on the
 * recorded file with the recorded options, and says whether the numbers match.
 */
import { existsSync } from "node:fs";
import { DOTSPEC_VERSION, failureReason, isDotspecError, readJsonFile, type AnalyzeOptions, type ReadCurveOptions } from "../index.ts";
import { analyzeCurveFile } from "./analyzeCurveFile.ts";
import { fitCurveFile } from "./commands/fit.ts";
import { cliOptionNames } from "./cliOptionNames.ts";
import { EXIT, type CliContext } from "./context.ts";

/** Differences listed in full before "… and N more". */
const LISTED = 8;

/** One value that differs between the record and the replay. */
export interface ReplayDifference {
  /** Where in the record, e.g. `peaks[3].biasV`. */
  path: string;
  recorded: unknown;
  replayed: unknown;
}

/**
 * The leaves of two JSON values that differ (numbers, strings, booleans, null), with how many
 * leaves were compared. `provenance` at the top level is skipped (it is compared apart).
 *
 * Example
 * -------
 * ```ts
 * compareRecords({ gapV: 1.2, peaks: [] }, { gapV: 1.3, peaks: [] });
 * // => { compared: 1, differences: [{ path: "gapV", recorded: 1.2, replayed: 1.3 }] }
 * ```
 */
export function compareRecords(recorded: unknown, replayed: unknown): { compared: number; differences: ReplayDifference[] } {
  const differences: ReplayDifference[] = [];
  let compared = 0;
  const walk = (a: unknown, b: unknown, path: string) => {
    if (Array.isArray(a) && Array.isArray(b)) {
      if (a.length !== b.length) differences.push({ path: `${path}.length`, recorded: a.length, replayed: b.length });
      for (let i = 0; i < Math.min(a.length, b.length); i++) walk(a[i], b[i], `${path}[${i}]`);
      return;
    }
    if (a && b && typeof a === "object" && typeof b === "object" && !Array.isArray(a) && !Array.isArray(b)) {
      const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
      for (const k of keys) {
        if (path === "" && k === "provenance") continue;
        walk((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], path ? `${path}.${k}` : k);
      }
      return;
    }
    compared++;
    if (!Object.is(a, b)) differences.push({ path, recorded: a, replayed: b });
  };
  walk(recorded, replayed, "");
  return { compared, differences };
}

/** The recorded provenance, checked enough to replay. */
interface ReplayableProvenance {
  version: string;
  /** "fit" for a record of `dotspec fit`; otherwise an analysis. */
  command?: string;
  input: { name: string; bytes: number; sha256: string };
  options: { analyze: AnalyzeOptions; read: ReadCurveOptions; compareModels?: unknown; fit?: Record<string, unknown>; maxEvaluations?: unknown; timeLimitMs?: unknown };
}

/** The work budget a record's fit ran with (its `work.maxEvaluations`), to re-run it with the same; undefined when not recorded. */
function recordedBudget(work: unknown): number | undefined {
  const n = (work as { maxEvaluations?: unknown } | null | undefined)?.maxEvaluations;
  return typeof n === "number" && Number.isInteger(n) && n >= 1 ? n : undefined;
}

function replayable(record: unknown): ReplayableProvenance | null {
  const p = (record as { provenance?: unknown } | null)?.provenance as Partial<ReplayableProvenance> | null | undefined;
  if (!p || !p.input || typeof p.input.name !== "string" || typeof p.input.sha256 !== "string") return null;
  if (!p.options || typeof p.options.analyze !== "object" || typeof p.options.read !== "object") return null;
  return p as ReplayableProvenance;
}

/**
 * Runs `dotspec analyze --replay`.
 *
 * Parameters
 * ----------
 * recordPath : string
 *     A JSON record of `analyze --out` or `fit --out`, or the array of `analyze --json` or `fit --json`.
 * ctx : CliContext
 *     Streams: one line per record on stdout, problems on stderr.
 *
 * Returns
 * -------
 * Promise<number>
 *     0 every record's numbers match; 1 some differ, the file has changed or cannot be read, or
 *     the record carries no provenance.
 *
 * Notes
 * -----
 * 1. The file is the recorded name (a path as given, so run from the folder the batch ran in);
 *    its SHA-256 is compared with the recorded one first (a change is reported, and the numbers
 *    are compared all the same).
 * 2. The analysis runs with the recorded options (`provenance.options`), exactly as the batch
 *    did: η from the options or from the file's own `# eta:` line. A fit (a record of `dotspec
 *    fit`, or an analysis' model comparison) runs with the work budget the record names
 *    (`work.maxEvaluations`), so a fit cut short by its budget stops at the same point even where
 *    the default budget has changed since; a time limit, if one was asked for, is machine-dependent
 *    and may not give the same numbers.
 * 3. Every value of the new record except its provenance is compared with the recorded one
 *    exactly (the analysis is deterministic); the first differences are listed with both values.
 */
export async function runReplay(recordPath: string, ctx: CliContext): Promise<number> {
  let data: unknown;
  try {
    data = readJsonFile(recordPath);
  } catch (err) {
    if (!isDotspecError(err)) throw err;
    ctx.error(err.message);
    return EXIT.failed;
  }
  const records = Array.isArray(data) ? data : [data];
  let bad = 0;
  records.forEach((record, k) => {
    const label = records.length > 1 ? `${recordPath}[${k}]` : recordPath;
    const p = replayable(record);
    if (!p) {
      ctx.error(`${label}: no provenance (input file and options) to replay; records written by dotspec ${DOTSPEC_VERSION} with --json or --out carry it`);
      bad++;
      return;
    }
    const file = p.input.name;
    if (!existsSync(file)) {
      ctx.error(`${label}: the recorded file ${file} is not there; run --replay from the folder the batch was run in`);
      bad++;
      return;
    }
    let replayed;
    try {
      const r = record as { work?: unknown; modelComparison?: { work?: unknown } };
      if (p.command === "fit") {
        const budget = recordedBudget(r.work);
        replayed = fitCurveFile(file, { analyze: p.options.analyze, read: p.options.read, fit: { ...(p.options.fit ?? {}), ...(budget !== undefined ? { maxEvaluations: budget } : {}) } }).json;
      } else {
        const scope = p.options.compareModels;
        const compareModels = scope === "undecided" || scope === "all" ? { compareModels: scope as "undecided" | "all" } : {};
        const budget = recordedBudget(r.modelComparison?.work) ?? (typeof p.options.maxEvaluations === "number" ? p.options.maxEvaluations : undefined);
        const timeLimit = typeof p.options.timeLimitMs === "number" ? { timeLimitMs: p.options.timeLimitMs } : {};
        replayed = analyzeCurveFile(file, { analyze: p.options.analyze, read: p.options.read, ...compareModels, ...(budget !== undefined ? { maxEvaluations: budget } : {}), ...timeLimit }).json;
      }
    } catch (err) {
      ctx.error(`${label}: ${file}: ${cliOptionNames(failureReason(file, err))}`);
      bad++;
      return;
    }
    const now = replayed.provenance!.input!;
    const changed = now.sha256 !== p.input.sha256;
    if (changed) {
      ctx.error(`${label}: ${file} has changed since the record was made (SHA-256 ${p.input.sha256.slice(0, 12)}… then, ${now.sha256.slice(0, 12)}… now; ${p.input.bytes} → ${now.bytes} bytes)`);
    }
    const versionNote = p.version !== DOTSPEC_VERSION ? ` (recorded by dotspec ${p.version}, replayed by ${DOTSPEC_VERSION})` : "";
    const { compared, differences } = compareRecords(JSON.parse(JSON.stringify(record)), JSON.parse(JSON.stringify(replayed)));
    if (differences.length === 0) {
      ctx.stdout.write(`${label}: ${file}: the numbers match (${compared} values compared)${versionNote}\n`);
      if (changed) bad++;
      return;
    }
    bad++;
    const shown = differences.slice(0, LISTED).map((d) => `${d.path}: ${JSON.stringify(d.recorded)} recorded, ${JSON.stringify(d.replayed)} now`);
    const more = differences.length > LISTED ? `; … and ${differences.length - LISTED} more` : "";
    ctx.stdout.write(`${label}: ${file}: ${differences.length} of ${compared} values differ${versionNote}: ${shown.join("; ")}${more}\n`);
  });
  return bad ? EXIT.failed : EXIT.ok;
}
