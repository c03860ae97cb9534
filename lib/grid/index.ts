/**
 * Grid spectroscopy: maps of each assigned state across a dot, with their size and shape.
 */
export { axisValues, checkGridCube, pixelCount, type GridAxis, type GridCube } from "./gridCube.ts";
export { runPixelPass, combinePixelPass, type PixelPass, type PixelPassPart, type PixelFunctional } from "./pixelPass.ts";
export { mapFunctional, indexRange, type GridFilter, type MapMeasure } from "./mapFunctional.ts";
export { gridConductance } from "./gridConductance.ts";
export { gridCurrentNoise, functionalNoise, GRID_NOISE_DEFAULTS, type GridCurrentNoiseOptions } from "./gridNoise.ts";
export { referenceCurve, referenceMask, type ReferenceSelection } from "./referenceSpectrum.ts";
export { planGridMaps, GRID_MAP_DEFAULTS, type GridMapSpec, type PlanGridMapsOptions } from "./planGridMaps.ts";
export type { MapImage } from "./mapImage.ts";
export { thresholdMap } from "./thresholdMap.ts";
export { mapCentre } from "./mapCentre.ts";
export { rmsRadius } from "./rmsRadius.ts";
export { mapRoundness } from "./mapRoundness.ts";
export { radialProfile, type RadialProfile, type RadialProfileOptions } from "./radialProfile.ts";
export { dipDepth } from "./dipDepth.ts";
export { analyzeGrid, gridAnalysisSteps, ANALYZE_GRID_DEFAULTS, type AnalyzeGridOptions, type GridAnalysis, type GridMap } from "./analyzeGrid.ts";
