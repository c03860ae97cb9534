/**
 * dotspec: tunnelling spectroscopy of single quantum dots, from I–V sweeps to assigned shells,
 * gaps and charging energies. The public API: the CLI and the notebooks import only this module.
 */
export type { Curve, CurveMeta } from "./curve.ts";
export { DotspecError, isDotspecError } from "./util/errors.ts";
export * as constants from "./util/constants.ts";
export { seededRandom, type SeededRandom } from "./util/random.ts";

// Import and export.
export * from "./io/index.ts";

// Signal stage.
export * from "./signal/index.ts";

// Peaks.
export { findPeaks, FIND_PEAKS_DEFAULTS, type Peak, type FindPeaksOptions, type FindPeaksRecord } from "./peaks/findPeaks.ts";
export { peakAreas, type PeakAreasOptions, type PeakAreasResult } from "./peaks/peakAreas.ts";
export { edgeStepWidth, type EdgeStepWidthOptions } from "./peaks/edgeStepWidth.ts";

// Assignment.
export {
  assignSpectrum,
  ASSIGN_DEFAULTS,
  type Assignment,
  type AssignOptions,
  type Band,
  type Multiplet,
  type Regime,
  type RegimeEvidence,
  type SpectrumEnergies,
  type SpectrumQuantities,
  type SpectrumUncertainties,
} from "./assign/assignSpectrum.ts";
export { gapEdges, GAP_EDGES_DEFAULTS, type GapEdgesOptions } from "./assign/gapEdges.ts";
export { fitLadderSpacing, type LadderSpacing } from "./assign/ladderFit.ts";

// The whole job on one curve.
export { analyzeCurve, ANALYZE_DEFAULTS, type AnalyzeOptions, type AnalyzeSettings, type AnalyzedPeak, type CurveAnalysis } from "./pipeline/analyzeCurve.ts";

// Physics model.
export { parseScenario, biasAxis, SCENARIO_DEFAULTS, type Scenario, type Level, type BiasSweep, type NoiseSpec } from "./model/scenario.ts";
export { simulateCurve, lockInKernel, scenarioModel, SIMULATE_DEFAULTS, type SimulateOptions, type SimulatedCurve } from "./model/simulate.ts";
export { bandLadders, exactCurrent, currentSteps, fastCurrent, fastConductance, type DotModel, type CurrentStep } from "./model/bandCurrent.ts";
export { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRegime, type SyntheticRanges, type SyntheticTruth } from "./model/syntheticSpectrum.ts";

// Reports.
export { analysisToJson, ANALYSIS_JSON_VERSION, type AnalysisJson } from "./report/analysisJson.ts";
export { formatAnalysisText, FORMAT_TEXT_DEFAULTS, type FormatAnalysisTextOptions } from "./report/formatAnalysisText.ts";
export { summaryRow, SUMMARY_COLUMNS, type SummaryColumn, type SummaryRow } from "./report/summaryRow.ts";
export { multipletColor, MULTIPLET_COLORS } from "./report/multipletColor.ts";
// Figures load Observable Plot (and jsdom in Node) on demand: `const curveFigure = await loadCurveFigure()`.
export { loadCurveFigure, type CurveFigureRenderer } from "./report/loadCurveFigure.ts";
export type { CurveFigureOptions } from "./report/curveFigure.ts";

// Grid spectroscopy: maps of each assigned state across a dot.
export * from "./grid/index.ts";
export { parseNpyHeader, type NpyHeader } from "./io/npyHeader.ts";
export { parseGridSidecar, type GridSidecar } from "./io/gridSidecar.ts";
export { readNpyGrid, READ_NPY_DEFAULTS, type ReadNpyGridOptions, type NpyGridResult } from "./io/readNpyGrid.ts";
export { parseGridTable, GRID_TABLE_DEFAULTS, type ParseGridTableOptions, type GridTableRecord } from "./io/parseGridTable.ts";
export { readGridFile, fileBytes, type ReadGridFileOptions, type GridFileResult } from "./io/readGridFile.ts";
export { gridToJson, gridProfileRows, GRID_JSON_VERSION, GRID_PROFILE_COLUMNS, type GridJson, type GridMapJson } from "./report/gridJson.ts";
// Grid map figures load Observable Plot (and jsdom in Node) on demand: `const draw = await loadGridMapFigure()`.
export { loadGridMapFigure, type GridMapFigureRenderer } from "./report/loadGridMapFigure.ts";
export type { GridMapFigureOptions } from "./report/gridMapFigure.ts";

// Model fit.
export { fitCurve, FIT_DEFAULTS, type CurveFit, type FitOptions, type FittedLevel, type FittedValue } from "./model/fitCurve.ts";
export { fitToJson, formatFitText, type FitJson } from "./report/fitJson.ts";
