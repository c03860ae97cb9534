/**
 * Grid spectroscopy, the whole job: reference spectrum, assignment, maps at each state, and the
 * shape of each map, with the record of how.
 */
import type { Curve } from "../curve.ts";
import { analyzeCurve, type AnalyzeOptions, type CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import { checkKnownKeys, checkNonNegative } from "../util/check.ts";
import { checkGridCube, pixelCount, type GridAxis, type GridCube } from "./gridCube.ts";
import { gridCurrentNoise, functionalNoise } from "./gridNoise.ts";
import type { GridFilter } from "./mapFunctional.ts";
import type { MapImage } from "./mapImage.ts";
import { combinePixelPass, runPixelPass, type PixelPass } from "./pixelPass.ts";
import { planGridMaps, type GridMapSpec, type PlanGridMapsOptions } from "./planGridMaps.ts";
import { referenceCurve, referenceMask, type ReferenceSelection } from "./referenceSpectrum.ts";
import { thresholdMap } from "./thresholdMap.ts";
import { mapCentre } from "./mapCentre.ts";
import { rmsRadius } from "./rmsRadius.ts";
import { mapRoundness } from "./mapRoundness.ts";
import { radialProfile, type RadialProfile } from "./radialProfile.ts";
import { dipDepth } from "./dipDepth.ts";

/** Options of {@link analyzeGrid}; every field optional. */
export interface AnalyzeGridOptions extends PlanGridMapsOptions {
  /** Voltage-division factor η in (0, 1]. Default: 1, with a note in the warnings. */
  eta?: number;
  /** Pixels whose mean is the reference spectrum. Default "mean" (every pixel with data). */
  reference?: ReferenceSelection;
  /** Further options of the reference spectrum's analysis ({@link analyzeCurve}), e.g. windowMV, order. Default none. */
  analyze?: Omit<AnalyzeOptions, "eta">;
  /** Values below this many σ of a map's noise are set to 0 before the shape measures. Default 3 (ANALYZE_GRID_DEFAULTS.floorSigma). */
  floorSigma?: number;
  /** Ring width of the radial profiles, nm. Default: the smaller pixel step. */
  profileBinNM?: number;
}

/** Defaults of {@link analyzeGrid} (locked by a test). */
export const ANALYZE_GRID_DEFAULTS = Object.freeze({
  reference: "mean" as ReferenceSelection,
  floorSigma: 3,
});

/** One map with its shape. */
export interface GridMap extends Omit<GridMapSpec, "functional"> {
  /** The map as computed (map unit; NaN for missing pixels). */
  image: MapImage;
  /** σ of one map value from the current's white noise, map unit. */
  noiseSigma: number;
  /** The floor (floorSigma × noiseSigma) below which values were set to 0, map unit. */
  floor: number;
  /** Pixels at or above the floor. */
  pixelsAboveFloor: number;
  /** Largest value, map unit. */
  maxValue: number;
  /** Value-weighted centre of the thresholded map, nm; null for an empty map. */
  centreNM: [number, number] | null;
  /** RMS radius about the centre, nm; null for an empty map. */
  rmsRadiusNM: number | null;
  /** √(λmin/λmax) of the second moments: 1 round; null for an empty map. */
  roundness: number | null;
  /** Azimuthally averaged profile of the thresholded map about its centre; null for an empty map. */
  profile: RadialProfile | null;
  /** (max − centre)/max of the profile: 0 compact, 1 ring; null for an empty map. */
  dipDepth: number | null;
}

/** Everything the analysis of a grid produced. */
export interface GridAnalysis {
  source: string;
  /** The reference spectrum and its analysis (assignment, peaks, settings). */
  reference: { selection: ReferenceSelection; pixels: number; curve: Curve; analysis: CurveAnalysis };
  /** The Savitzky–Golay filter every pixel shares (from the reference's analysis). */
  filter: GridFilter;
  /** White-noise σ of the current per sample (median over pixels), A. */
  noiseCurrentA: number;
  /** The cube's axes: x and y (nm), bias (V). */
  axes: { xNM: GridAxis; yNM: GridAxis; biasV: GridAxis };
  maps: GridMap[];
  settings: { floorSigma: number; eta: number; etaGiven: boolean; atV: number[] | null; profileBinNM: number; nx: number; ny: number; nbias: number };
  warnings: string[];
}

const KEYS = ["eta", "reference", "analyze", "floorSigma", "profileBinNM", "atV", "peakHalfWindowMV", "currentAtV"] as const;

/**
 * The steps of {@link analyzeGrid} as a generator: it yields each pass over the pixels and
 * expects its combined result back, so the passes can run in this thread or on worker threads
 * (the `dotspec grid` command) with one composition.
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     The cube, as {@link analyzeGrid} takes it.
 * options : AnalyzeGridOptions, optional
 *     As for {@link analyzeGrid}.
 *
 * Returns
 * -------
 * Generator<PixelPass, GridAnalysis, Float64Array>
 *     Yields each pass over the pixels; takes its combined result ({@link combinePixelPass}) back
 *     through `next`; returns the grid's analysis.
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/bad-axis`, `grid/bad-shape` or `grid/bad-dtype` ({@link checkGridCube}) for an
 *     inconsistent cube, `options/unknown-key` for an unknown option, `options/negative` for a
 *     negative floorSigma, and the codes of {@link analyzeCurve} for the reference curve.
 *
 * Example
 * -------
 * ```ts
 * const { cube } = readGridFile("sample-curves/grid/dot-grid.npy");
 * const steps = gridAnalysisSteps(cube, { eta: 0.8 });
 * let step = steps.next();
 * while (!step.done) step = steps.next(runPixelPass(cube, step.value, 0, pixelCount(cube)));
 * step.value.maps.length; // => 8
 * ```
 */
export function* gridAnalysisSteps(cube: GridCube, options: AnalyzeGridOptions = {}): Generator<PixelPass, GridAnalysis, Float64Array> {
  checkKnownKeys("grid options", options, KEYS);
  checkGridCube(cube);
  const floorSigma = options.floorSigma === undefined ? ANALYZE_GRID_DEFAULTS.floorSigma : checkNonNegative("floorSigma", options.floorSigma);
  const selection = options.reference ?? ANALYZE_GRID_DEFAULTS.reference;
  const mask = referenceMask(cube, selection);

  // 1. The reference spectrum and its assignment.
  const sums: Float64Array = yield { kind: "spectrumSum", mask };
  const curve = referenceCurve(cube, sums, selection);
  const analysis = analyzeCurve(curve, { ...(options.analyze ?? {}), ...(options.eta !== undefined ? { eta: options.eta } : {}) });
  const filter: GridFilter = { windowSamples: analysis.settings.windowSamples, order: analysis.settings.order };

  // 2. The maps, one pass over the pixels for all of them.
  const specs = planGridMaps(analysis, cube.biasV, filter, { atV: options.atV, peakHalfWindowMV: options.peakHalfWindowMV, currentAtV: options.currentAtV });
  const values: Float64Array = yield { kind: "maps", functionals: specs.map((s) => s.functional) };

  // 3. Noise floor and shapes.
  const nPix = pixelCount(cube);
  const noiseCurrentA = gridCurrentNoise(cube);
  const binNM = options.profileBinNM ?? Math.min(cube.xNM.step, cube.yNM.step);
  const warnings = [...analysis.warnings];
  const maps = specs.map((spec, m): GridMap => {
    const { functional, ...rest } = spec;
    const image: MapImage = { values: values.slice(m * nPix, (m + 1) * nPix), xNM: cube.xNM, yNM: cube.yNM };
    const noiseSigma = functionalNoise(functional, noiseCurrentA);
    const floor = floorSigma * noiseSigma;
    const { map: kept, kept: pixelsAboveFloor } = thresholdMap(image, floor);
    let maxValue = -Infinity;
    for (const v of image.values) if (v > maxValue) maxValue = v;
    const centreNM = mapCentre(kept);
    if (!centreNM) warnings.push(`map ${spec.label}: no pixel above the noise floor (${floorSigma} σ): no centre, size or profile`);
    const profile = centreNM ? radialProfile(kept, centreNM, { binNM }) : null;
    return {
      ...rest,
      image,
      noiseSigma,
      floor,
      pixelsAboveFloor,
      maxValue: Number.isFinite(maxValue) ? maxValue : NaN,
      centreNM,
      rmsRadiusNM: centreNM ? rmsRadius(kept, centreNM) : null,
      roundness: centreNM ? mapRoundness(kept, centreNM) : null,
      profile,
      dipDepth: profile ? dipDepth(profile) : null,
    };
  });
  return {
    source: cube.source,
    reference: { selection, pixels: sums[cube.biasV.count], curve, analysis },
    filter,
    noiseCurrentA,
    axes: { xNM: cube.xNM, yNM: cube.yNM, biasV: cube.biasV },
    maps,
    settings: {
      floorSigma,
      eta: analysis.settings.eta,
      etaGiven: analysis.settings.etaGiven,
      atV: options.atV ? [...options.atV] : null,
      profileBinNM: binNM,
      nx: cube.xNM.count,
      ny: cube.yNM.count,
      nbias: cube.biasV.count,
    },
    warnings,
  };
}

/**
 * Analyses a grid of I–V sweeps over one dot: where each assigned state lives.
 *
 * Parameters
 * ----------
 * cube : GridCube
 *     Current cube (A) on a regular (x, y) grid (nm) with one bias axis (V).
 * options : AnalyzeGridOptions, optional
 *     eta (default 1 with a warning), reference (default "mean"), analyze (options of the
 *     reference analysis), atV (V, default the assigned peaks), peakHalfWindowMV (mV, default
 *     0.25 × FWHM), currentAtV (V), floorSigma (default 3), profileBinNM (nm, default the pixel step).
 *
 * Returns
 * -------
 * GridAnalysis
 *     The reference spectrum and its assignment, the shared filter, every map with its centre,
 *     RMS radius, roundness, radial profile and dip depth, the settings and the warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `grid/…` for an inconsistent cube or reference, `options/…` for a bad option, and every
 *     error of {@link analyzeCurve} on the reference spectrum.
 *
 * Notes
 * -----
 * 1. Reference spectrum: the mean current of the selected pixels, analysed by
 *    {@link analyzeCurve} (conductance, peaks, assignment). Its Savitzky–Golay window and order
 *    are used for every pixel.
 * 2. Map plan ({@link planGridMaps}): dI/dV at each assigned peak (averaged over ±¼ FWHM) or at
 *    the given biases, ∫ dI/dV over each multiplet, and the current.
 * 3. One pass over the pixels computes every map: each is a fixed linear combination of a pixel's
 *    current (the Savitzky–Golay weights of the bias points it uses, {@link mapFunctional}).
 * 4. Noise floor: σ_I (median white noise of the pixels' current) × √(Σ w²) of the map's weights;
 *    values below floorSigma·σ (and negative values) are set to 0.
 * 5. Shape of each thresholded map: centre (value-weighted), RMS radius, roundness, radial
 *    profile in rings of one pixel, dip depth = (max − centre)/max of the profile.
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964) (the filter). The s-like and p-like
 * shapes follow from the particle in a sphere: ψ ∝ j_l(x_l1·r/R)·Y_lm with x_01 = π and
 * x_11 = 4.4934 (M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions, Dover 1965,
 * Table 10.6).
 *
 * Example
 * -------
 * ```ts
 * const g = analyzeGrid(readGridFile("sample-curves/grid/dot-grid.npy").cube, { eta: 0.8 });
 * g.maps.map((m) => [m.label, m.rmsRadiusNM?.toFixed(2), m.dipDepth?.toFixed(2)]).slice(0, 4);
 * // => [["v1", "1.01", "0.00"], ["s", "1.02", "0.00"], ["p1", "0.90", "0.00"], ["p2", "1.30", "0.86"]]
 * //    (the invented particle-in-a-sphere demo dot, R = 2.4 nm: p2 is the (px, py) ring)
 * ```
 */
export function analyzeGrid(cube: GridCube, options: AnalyzeGridOptions = {}): GridAnalysis {
  const steps = gridAnalysisSteps(cube, options);
  const nPix = pixelCount(cube);
  let step = steps.next();
  while (!step.done) {
    const pass = step.value;
    const part = runPixelPass(cube, pass, 0, nPix);
    step = steps.next(combinePixelPass(pass, [{ fromPixel: 0, toPixel: nPix, values: part }], nPix, cube.biasV.count));
  }
  return step.value;
}
