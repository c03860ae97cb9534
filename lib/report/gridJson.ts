/**
 * The JSON summary of a grid analysis: what `dotspec grid --json` prints and writes as
 * `summary.json`.
 */
import type { GridAnalysis } from "../grid/analyzeGrid.ts";
import type { GridAxis } from "../grid/gridCube.ts";
import type { ReferenceSelection } from "../grid/referenceSpectrum.ts";
import { analysisToJson, type AnalysisJson } from "./analysisJson.ts";

/** Version of the summary layout; bumped when a field changes meaning. */
export const GRID_JSON_VERSION = 1;

/** One map in the summary (the image itself is in the SVG; the profile in the CSV). */
export interface GridMapJson {
  label: string;
  kind: "peak" | "bias" | "multiplet" | "current";
  /** Bias of the map, V. */
  biasV: number;
  /** Bias range averaged (peak, bias, current) or integrated (multiplet), V. */
  rangeV: [number, number];
  multiplet: string | null;
  /** Unit of the map values: S (dI/dV means) or A (integrals and currents). */
  unit: "S" | "A";
  /** RMS radius about the centre, nm (null: nothing above the noise floor). */
  rmsRadiusNM: number | null;
  /** Value-weighted centre [x, y], nm. */
  centreNM: [number, number] | null;
  /** (max − centre)/max of the radial profile: 0 compact, 1 ring. */
  dipDepth: number | null;
  /** √(λmin/λmax) of the second moments: 1 round. */
  roundness: number | null;
  maxValue: number;
  /** σ of one map value from the current noise, map unit. */
  noiseSigma: number;
  /** Values below this were set to 0 before the shape measures, map unit. */
  floor: number;
  pixelsAboveFloor: number;
}

/** The summary of one grid. */
export interface GridJson {
  version: number;
  source: string;
  grid: { nx: number; ny: number; nbias: number; xNM: GridAxis; yNM: GridAxis; biasV: GridAxis; missingPixels: number };
  reference: { selection: ReferenceSelection; pixels: number; analysis: AnalysisJson };
  /** The Savitzky–Golay filter of every pixel. */
  filter: { windowSamples: number; windowMV: number; order: number };
  noiseCurrentA: number;
  maps: GridMapJson[];
  settings: GridAnalysis["settings"];
  warnings: string[];
}

/**
 * The summary of a grid analysis as plain JSON data.
 *
 * Parameters
 * ----------
 * grid : GridAnalysis
 *     From {@link analyzeGrid}.
 * missingPixels : number, optional
 *     Pixels without data, for the record. Default 0.
 * warnings : string[], optional
 *     Further warnings (the reader's) put before the analysis's own. Default none.
 *
 * Returns
 * -------
 * GridJson
 *     `{ version, source, grid, reference, filter, noiseCurrentA, maps: [{ label, biasV,
 *     rmsRadiusNM, centreNM, dipDepth, … }], settings, warnings }`; the reference analysis in the
 *     layout of `dotspec analyze --json`.
 *
 * Example
 * -------
 * ```ts
 * const grid = analyzeGrid(readGridFile("sample-curves/grid/dot-grid.npy").cube, { eta: 0.8 });
 * const map = gridToJson(grid).maps[0];
 * [map.label, map.kind]; // => ["v1", "peak"]
 * map.rmsRadiusNM; // => 1.014
 * ```
 */
export function gridToJson(grid: GridAnalysis, missingPixels = 0, warnings: readonly string[] = []): GridJson {
  return {
    version: GRID_JSON_VERSION,
    source: grid.source,
    grid: {
      nx: grid.settings.nx,
      ny: grid.settings.ny,
      nbias: grid.settings.nbias,
      xNM: grid.axes.xNM,
      yNM: grid.axes.yNM,
      biasV: grid.axes.biasV,
      missingPixels,
    },
    reference: { selection: grid.reference.selection, pixels: grid.reference.pixels, analysis: analysisToJson(grid.reference.analysis) },
    filter: { windowSamples: grid.filter.windowSamples, windowMV: grid.reference.analysis.settings.windowMV, order: grid.filter.order },
    noiseCurrentA: grid.noiseCurrentA,
    maps: grid.maps.map((m) => ({
      label: m.label,
      kind: m.kind,
      biasV: m.biasV,
      rangeV: m.rangeV,
      multiplet: m.multiplet,
      unit: m.unit,
      rmsRadiusNM: m.rmsRadiusNM,
      centreNM: m.centreNM,
      dipDepth: m.dipDepth,
      roundness: m.roundness,
      maxValue: m.maxValue,
      noiseSigma: m.noiseSigma,
      floor: m.floor,
      pixelsAboveFloor: m.pixelsAboveFloor,
    })),
    settings: grid.settings,
    warnings: [...warnings, ...grid.warnings],
  };
}

/** Column order of {@link gridProfileRows}. */
export const GRID_PROFILE_COLUMNS = Object.freeze(["map", "unit", "radius_nm", "mean", "pixels"]);

/**
 * The radial profiles of every map as rows for one CSV (`profiles.csv`): map label, map unit, ring
 * centre radius (nm), mean of the thresholded map in the ring, pixels in the ring.
 *
 * Parameters
 * ----------
 * grid : GridAnalysis
 *     A grid's analysis ({@link analyzeGrid}).
 *
 * Returns
 * -------
 * Record<string, string | number>[]
 *     One row per map and ring, keys as {@link GRID_PROFILE_COLUMNS}: `map`, `unit`, `radius_nm`,
 *     `mean`, `pixels`.
 *
 * Example
 * -------
 * ```ts
 * const grid = analyzeGrid(readGridFile("sample-curves/grid/dot-grid.npy").cube, { eta: 0.8 });
 * formatCsv(gridProfileRows(grid), GRID_PROFILE_COLUMNS).split("\n").slice(0, 2);
 * // => ["map,unit,radius_nm,mean,pixels", "v1,S,0.15,1.6302171965210314e-10,4"]
 * ```
 */
export function gridProfileRows(grid: GridAnalysis): Record<string, string | number>[] {
  const rows: Record<string, string | number>[] = [];
  for (const m of grid.maps) {
    if (!m.profile) continue;
    const p = m.profile;
    for (let k = 0; k < p.radiusNM.length; k++) rows.push({ map: m.label, unit: m.unit, radius_nm: p.radiusNM[k], mean: p.mean[k], pixels: p.pixels[k] });
  }
  return rows;
}
