/**
 * `dotspec grid INPUT`: maps of each assigned state across a dot from a grid of I–V sweeps.
 */
import { InvalidArgumentError, type Command } from "commander";
import { availableParallelism } from "node:os";
import { dirname, join, resolve } from "node:path";
import {
  fileBytes,
  formatCsv,
  gridMapFileNames,
  gridProfileRows,
  gridToJson,
  loadCurveFigure,
  loadGridMapFigure,
  readGridFile,
  writeTextFile,
  GRID_PROFILE_COLUMNS,
  type AnalyzeGridOptions,
  type GridJson,
} from "../../index.ts";
import { failureReason } from "../analyzeFile.ts";
import { EXIT, UsageError, type CliContext } from "../context.ts";
import { claimOutputFolder, sealOutputFolder } from "../outputFolder.ts";
import { etaOption } from "../curveOptions.ts";
import { numberOption } from "../optionValue.ts";
import { startProgress, type Progress } from "../progress.ts";
import { runGridAnalysis, sharedCube, startGridPool, GRID_JOBS_DEFAULTS, type GridPool } from "../gridPool.ts";
import type { CliCommand } from "./command.ts";

/** Options of `dotspec grid` as commander hands them over. */
export interface GridCliOptions {
  sidecar?: string;
  eta?: number;
  at?: number[];
  out?: string;
  json?: boolean;
  jobs?: number;
  referencePixel?: [number, number];
  referenceCircle?: [number, number, number];
  floorSigma?: number;
  force?: boolean;
}

const HELP_AFTER = `
Input layouts:
  INPUT.npy   float32 or float64, C order, shape [ny, nx, nbias] of current, with a JSON sidecar
              (default INPUT.json): {"xNM": [x0, dx, nx], "yNM": [y0, dy, ny],
              "biasV": [v0, dv, nbias], "currentUnit": "A"}
  other       a long table: delimited text with columns x (nm), y (nm), bias and current (units
              as for curves), one row per sample; pixels missing from the grid are reported

The mean spectrum over the grid (or --reference-pixel) is analysed as dotspec analyze does; its
assigned peaks set the map biases (or --at). Every pixel uses the same Savitzky–Golay filter.
Maps: dI/dV at each peak, ∫ dI/dV over each multiplet, the current. Each map is thresholded at
--floor-sigma × its noise before its centre, RMS radius, radial profile and dip depth are measured.

--out DIR writes DIR/summary.json, DIR/profiles.csv, DIR/reference.svg and DIR/maps/<label>.svg.

These are analysis settings; a map that suggests measuring again with other settings (bias, grid
spacing, setpoint) must be checked against the instrument's own limits and local practice.

Example:
  dotspec grid dot-03.npy --eta 0.8 --out grid-03
  dotspec grid dot-03.csv --eta 0.8 --at 0.7,1.05 --json > grid-03.json
`;

function biasList(raw: string): number[] {
  const parts = raw.split(",").map((s) => s.trim());
  const values = parts.map(Number);
  if (!parts.length || parts.some((s) => s === "") || !values.every(Number.isFinite)) {
    throw new InvalidArgumentError(`--at expects biases in V separated by commas, e.g. --at 0.7,1.05; got ${JSON.stringify(raw)}`);
  }
  return values;
}

function pixelPair(raw: string): [number, number] {
  const v = raw.split(",").map((s) => Number(s.trim()));
  if (v.length !== 2 || !v.every((x) => Number.isInteger(x) && x >= 0)) throw new InvalidArgumentError(`--reference-pixel expects IX,IY (column and row from 0), e.g. 8,8; got ${JSON.stringify(raw)}`);
  return [v[0], v[1]];
}

function circle(raw: string): [number, number, number] {
  const v = raw.split(",").map((s) => Number(s.trim()));
  if (v.length !== 3 || !v.every(Number.isFinite) || !(v[2] > 0)) throw new InvalidArgumentError(`--reference-circle expects X,Y,R in nm with R > 0, e.g. 0,0,2.5; got ${JSON.stringify(raw)}`);
  return [v[0], v[1], v[2]];
}

export const gridCommand: CliCommand = {
  name: "grid",
  register(program: Command, ctx: CliContext) {
    program
      .command("grid")
      .description("Analyse a grid of I–V sweeps over one dot: dI/dV maps at each assigned peak and over each multiplet, with centre, RMS radius, radial profile and dip depth.")
      .argument("<INPUT>", "a .npy current cube (with its JSON sidecar) or a long table (x, y, bias, current)")
      .option("--sidecar <S.json>", "the sidecar of an .npy input (default: INPUT with .json)")
      .option("--eta <η>", "voltage-division factor η in (0, 1] (default 1, with a warning)", etaOption)
      .option("--at <V,...>", "map biases in V instead of the assigned peaks, e.g. 0.7,1.05", biasList)
      .option("--reference-pixel <IX,IY>", "analyse this pixel's spectrum instead of the mean over the grid", pixelPair)
      .option("--reference-circle <X,Y,R>", "analyse the mean spectrum of the pixels within R nm of (X, Y) nm", circle)
      .option("--floor-sigma <k>", "noise floor of the shape measures in σ of each map (default 3)", numberOption({ min: 0, accepted: "a number of σ, 0 or more" }))
      .option("--out <DIR>", "write summary.json, profiles.csv, reference.svg and maps/*.svg")
      .option("--force", "with --out: write into DIR even if it holds files dotspec did not write (files of the same name are replaced)")
      .option("--json", "print the JSON summary")
      .option("--jobs <n>", "worker threads for the per-pixel work (default: the CPU count for inputs of 1 GiB or more, else 1)", numberOption({ min: 1, integer: true, accepted: "a whole number of at least 1" }))
      .addHelpText("after", HELP_AFTER)
      .action(async (input: string, opts: GridCliOptions) => {
        ctx.exitCode = await runGrid(input, opts, ctx);
      });
  },
};

/** Files `dotspec grid --out` writes besides one SVG per map in `maps/`. */
export const GRID_OUTPUT = Object.freeze({
  summary: "summary.json",
  profiles: "profiles.csv",
  reference: "reference.svg",
  mapsFolder: "maps",
});

/** Paths of the map figures under the output folder: maps/NAME.svg, with the names the grid notebook uses too ({@link gridMapFileNames}). */
function mapFileNames(labels: readonly string[]): string[] {
  return gridMapFileNames(labels).map((name) => `${GRID_OUTPUT.mapsFolder}/${name}.svg`);
}

/**
 * Runs `dotspec grid`: 0 on success, 1 when the input cannot be read or analysed.
 *
 * Throws
 * ------
 * UsageError
 *     With --out: the folder is the input's folder, or holds files dotspec did not write (or
 *     changed since) and --force is not given. Nothing is written then.
 *
 * Notes
 * -----
 * 1. With --out the folder is claimed before the input is read (its fixed files) and again with
 *    the map figures once the maps are known, before the first write; the manifest is sealed
 *    after the last (the same check as analyze, sizes and fit).
 * 2. A long-table input is streamed; a progress bar shows the reading on a terminal.
 */
export async function runGrid(input: string, opts: GridCliOptions, ctx: CliContext): Promise<number> {
  if (opts.referencePixel && opts.referenceCircle) {
    ctx.error("give --reference-pixel or --reference-circle, not both");
    return EXIT.usage;
  }
  const fixed = [GRID_OUTPUT.summary, GRID_OUTPUT.profiles, GRID_OUTPUT.reference];
  if (opts.out !== undefined) {
    const out = resolve(opts.out);
    for (const f of [input, opts.sidecar ?? input]) {
      if (resolve(f) === out) throw new UsageError(`--out ${opts.out} is an input file; give a folder for the report`);
      if (resolve(dirname(f)) === out) throw new UsageError(`--out ${opts.out} is the folder of the input ${f}; write the report to another folder (dotspec does not write next to its inputs)`);
    }
    claimOutputFolder(opts.out, fixed, opts.force === true);
  }
  let threads = opts.jobs ?? Math.max(1, availableParallelism());
  const bytes = fileBytes(input);
  if (opts.jobs === undefined && !(bytes >= GRID_JOBS_DEFAULTS.autoWorkersMinBytes)) threads = 1;
  // No cube under this size reaches minSamplesForWorkers (4 bytes per sample at least).
  if (!(bytes >= 4 * GRID_JOBS_DEFAULTS.minSamplesForWorkers)) threads = 1;
  // Workers load the library while this thread reads the file.
  let pool: GridPool | null = threads > 1 ? startGridPool(threads) : null;
  let progress: Progress | null = null;
  let reading: Progress | null = null;
  try {
    // Reading a long table streams it; its bar shows only on a terminal, in MB read.
    const sizeMB = Number.isFinite(bytes) && !/\.npy$/i.test(input) ? Math.ceil(bytes / 1e6) : 0;
    reading = startProgress(sizeMB, ctx.stderr, "read", "MB");
    let readMB = 0;
    const file = readGridFile(input, {
      sidecar: opts.sidecar,
      shared: pool !== null,
      onProgress: (fraction) => {
        for (const to = Math.floor(fraction * sizeMB); readMB < to; readMB++) reading!.tick();
      },
    });
    reading.stop();
    // The bar shows only on a terminal (stderr); it moves per finished part of a pass on workers.
    progress = startProgress(100, ctx.stderr, "grid", "%");
    let cube = file.cube;
    if (pool && !(cube.currentA.buffer instanceof SharedArrayBuffer)) cube = sharedCube(cube);
    const options: AnalyzeGridOptions = {
      ...(opts.eta !== undefined ? { eta: opts.eta } : {}),
      ...(opts.at ? { atV: opts.at } : {}),
      ...(opts.referencePixel ? { reference: { pixel: opts.referencePixel } } : {}),
      ...(opts.referenceCircle ? { reference: { centreNM: [opts.referenceCircle[0], opts.referenceCircle[1]] as [number, number], radiusNM: opts.referenceCircle[2] } } : {}),
      ...(opts.floorSigma !== undefined ? { floorSigma: opts.floorSigma } : {}),
    };
    let shown = 0;
    const grid = await runGridAnalysis(cube, options, pool, (done, total) => {
      const pct = Math.round((100 * done) / total);
      for (; shown < pct; shown++) progress!.tick();
    });
    if (pool) {
      await pool.close();
      pool = null;
    }
    const missing = cube.missing ? cube.missing.reduce((a, b) => a + b, 0) : 0;
    const json = gridToJson(grid, missing, file.warnings);
    if (opts.out) {
      const mapFiles = mapFileNames(grid.maps.map((m) => m.label));
      const planned = [...fixed, ...mapFiles];
      claimOutputFolder(opts.out, planned, opts.force === true);
      const [drawMap, drawCurve] = await Promise.all([loadGridMapFigure(), loadCurveFigure()]);
      writeTextFile(join(opts.out, GRID_OUTPUT.summary), JSON.stringify(json, null, 2) + "\n");
      writeTextFile(join(opts.out, GRID_OUTPUT.profiles), formatCsv(gridProfileRows(grid), GRID_PROFILE_COLUMNS));
      writeTextFile(join(opts.out, GRID_OUTPUT.reference), drawCurve(grid.reference.analysis, { curve: grid.reference.curve }));
      grid.maps.forEach((m, i) => writeTextFile(join(opts.out!, mapFiles[i]), drawMap(m)));
      sealOutputFolder(opts.out, planned);
    }
    progress.stop();
    if (ctx.stdoutGone()) return EXIT.ok;
    if (opts.json) ctx.stdout.write(JSON.stringify(json) + "\n");
    else ctx.stdout.write(formatGridText(json) + "\n");
    return EXIT.ok;
  } catch (err) {
    reading?.stop();
    progress?.stop();
    if (err instanceof UsageError) throw err;
    ctx.error(`${input}: ${failureReason(input, err)}`);
    return EXIT.failed;
  } finally {
    if (pool) await pool.close();
  }
}

/** The readable report of `dotspec grid`: the reference assignment and one line per map. */
export function formatGridText(json: GridJson): string {
  const a = json.reference.analysis;
  const g = json.grid;
  const lines = [
    `${json.source}: ${g.nx} × ${g.ny} pixels (${Number(g.xNM.step.toPrecision(6))} × ${Number(g.yNM.step.toPrecision(6))} nm), ${g.nbias} bias points${g.missingPixels ? `, ${g.missingPixels} missing` : ""}`,
    `reference: ${json.reference.pixels} pixel${json.reference.pixels === 1 ? "" : "s"}, ${a.regime}, multiplets ${a.multiplets.map((m) => m.label).join(" ") || "none"}; Savitzky–Golay ${json.filter.windowSamples} samples (${json.filter.windowMV.toFixed(1)} mV), order ${json.filter.order}`,
    "",
    `${"map".padEnd(16)} ${"bias (V)".padStart(9)} ${"RMS r (nm)".padStart(10)} ${"centre (nm)".padStart(15)} ${"dip".padStart(5)} ${"round".padStart(5)} ${"pixels".padStart(6)}`,
  ];
  const f = (v: number | null, d: number, w: number) => (v === null ? "–" : v.toFixed(d)).padStart(w);
  for (const m of json.maps) {
    const c = m.centreNM ? `${m.centreNM[0].toFixed(2)}, ${m.centreNM[1].toFixed(2)}` : "–";
    lines.push(`${m.label.padEnd(16)} ${f(m.biasV, 3, 9)} ${f(m.rmsRadiusNM, 2, 10)} ${c.padStart(15)} ${f(m.dipDepth, 2, 5)} ${f(m.roundness, 2, 5)} ${String(m.pixelsAboveFloor).padStart(6)}`);
  }
  for (const w of json.warnings) lines.push(`warning: ${w}`);
  return lines.join("\n");
}
