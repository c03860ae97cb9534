/// <reference lib="dom" preserve="true" />
/**
 * dotspec's browser-safe public entry: everything of the library that touches neither the file
 * system nor jsdom — the parsers of curve text and bytes, CSV formatting, the signal stage, peaks,
 * assignment, the pipeline, the model and its fit, the JSON/text/summary reports and the figure
 * loader. The notebooks import only this module; `lib/index.ts` re-exports it and adds file I/O.
 *
 * The reference to the DOM library above is kept in the declarations: the figure functions take
 * an optional DOM `Document` (jsdom's in Node), so a consumer's type check needs the DOM types.
 */
export type { Curve, CurveMeta } from "./curve.ts";
export { DotspecError, failureReason, isDotspecError } from "./util/errors.ts";
export * as constants from "./util/constants.ts";
export { seededRandom, type SeededRandom } from "./util/random.ts";

// Import and export without files: text and bytes in, CSV text out.
export {
  ACCEPTED_UNITS,
  BIAS_UNITS,
  CONDUCTANCE_UNITS,
  CURRENT_UNITS,
  SI_UNIT,
  findUnit,
  parseUnit,
  toSI,
  type Quantity,
  type UnitInfo,
} from "./io/units.ts";
export {
  PARSE_DEFAULTS,
  parseCurveText,
  type BiasDirection,
  type ColumnRef,
  type ImportColumn,
  type ImportRecord,
  type ParseOptions,
  type ParsedCurve,
} from "./io/parse/index.ts";
export type { ColumnRole } from "./io/readColumnHeader.ts";
export type { Delimiter } from "./io/cells.ts";
export { parseCurveBytes } from "./io/parseCurveBytes.ts";
export { decodeTextBytes, type DecodedText } from "./io/decodeTextBytes.ts";
export { parseJsonText } from "./io/parseJsonText.ts";
export { CURVE_CSV_DIGITS, escapeFormulaCell, formatCsv, formatCurveCsv, type CellValue, type CurveColumns, type FormatCurveCsvOptions } from "./io/formatCsv.ts";
export { DOTSPEC_VERSION } from "./util/version.ts";
export { etaFromMetadata, ETA_METADATA_KEYS } from "./io/etaFromMetadata.ts";
export { etaForCurve, type CurveEta } from "./io/etaForCurve.ts";
export { parseSizeMeta, SIZE_META_COLUMNS, type SizeMetaRow } from "./io/parseSizeMeta.ts";
export { parseOpticalTable, OPTICAL_PEAK_RANGE_EV, type OpticalTableRow } from "./io/parseOpticalTable.ts";
export { sizeFromMetadata, SIZE_METADATA_KEYS, type MetadataSize } from "./io/sizeFromMetadata.ts";

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
  secondJunctionResonances,
  SECOND_JUNCTION_DEFAULTS,
  type SecondJunctionResonance,
} from "./assign/assignSpectrum.ts";
export { peakRoles, type PeakRole } from "./assign/peakMultiplets.ts";
export { gapEdges, GAP_EDGES_DEFAULTS, type GapEdgesOptions } from "./assign/gapEdges.ts";
export { noLevels, NO_LEVELS_DEFAULTS, type NoLevels, type NoLevelsCode, type NoLevelsInput } from "./assign/noLevels.ts";
export { fitLadderSpacing, type LadderSpacing } from "./assign/ladderFit.ts";
export { rulesDecisive, RULES_DECISIVE_DEFAULTS, type RulesDecisive, type RulesDecisiveCode, type RulesDecisiveInput, type RulesDecisiveOptions } from "./assign/rulesDecisive.ts";

// The whole job on one curve.
export { analyzeCurve, ANALYZE_DEFAULTS, type AnalyzeOptions, type AnalyzeSettings, type AnalyzedPeak, type CurveAnalysis } from "./pipeline/analyzeCurve.ts";
export { subtractionWarning, type SubtractedResonances } from "./pipeline/valenceLadder.ts";

// Physics model.
export { parseScenario, biasAxis, SCENARIO_DEFAULTS, type Scenario, type Level, type BiasSweep, type NoiseSpec } from "./model/scenario.ts";
export { simulateCurve, lockInKernel, scenarioModel, SIMULATE_DEFAULTS, type SimulateOptions, type SimulatedCurve } from "./model/simulate.ts";
export { bandLadders, exactCurrent, currentSteps, fastCurrent, fastConductance, type DotModel, type CurrentStep, type CurrentStepsOptions } from "./model/bandCurrent.ts";
export { syntheticSpectrum, SYNTHETIC_DEFAULTS, type SyntheticRegime, type SyntheticRanges, type SyntheticTruth } from "./model/syntheticSpectrum.ts";
export { REGIME_LIMITS, secondToFirstStepRatio, rateRatioFromStepRatio, levelStepRatio, substrateToTipStepRatio } from "./model/regimeLimits.ts";

// Reports.
export { analysisToJson, ANALYSIS_JSON_VERSION, type AnalysisJson, type AnalysisJsonExtras } from "./report/analysisJson.ts";
export { makeProvenance, svgWithProvenance, type Provenance } from "./report/provenance.ts";
export { tableWithProvenance, type ProvenanceTable } from "./report/tableWithProvenance.ts";
export { formatAnalysisText, FORMAT_TEXT_DEFAULTS, type FormatAnalysisTextOptions } from "./report/formatAnalysisText.ts";
export { formatEta, formatUncertain, FORMAT_UNCERTAIN_DEFAULTS, type FormatUncertainOptions } from "./report/formatUncertain.ts";
export { failedSummaryRow, summaryColumns, summaryRow, SUMMARY_COLUMNS, SUMMARY_METADATA_PREFIX, MODEL_SUMMARY_COLUMNS, type ModelSummaryColumn, type SummaryColumn, type SummaryRow } from "./report/summaryRow.ts";
export { multipletColor, MULTIPLET_COLORS, NO_MULTIPLET, SECOND_JUNCTION } from "./report/multipletColor.ts";
// Figures load Observable Plot (and jsdom in Node) on demand: `const curveFigure = await loadCurveFigure()`.
export { loadCurveFigure, loadModelFigure, type CurveFigureRenderer, type ModelFigureRenderer } from "./report/loadCurveFigure.ts";
export type { CurveFigureOptions } from "./report/curveFigure.ts";
export type { ModelCurve, ModelFigureOptions } from "./report/modelFigure.ts";

// Model fit.
export { fitCurve, fitStart, FIT_DEFAULTS, type CurveFit, type FitAlternative, type FitOptions, type FitStart, type FittedLevel, type FittedValue, type FitWork, type LevelSeed, type ResidualStructure } from "./model/fit/index.ts";
export { startingScenario, STARTING_SCENARIO_DEFAULTS, type StartingScenarioOptions } from "./model/startingScenario.ts";
export { fittedScenario, type FittedScenarioOptions } from "./model/fittedScenario.ts";
export { fitToJson, formatFitText, type FitJson } from "./report/fitJson.ts";
export { compareModelsReasons, failedModelComparison, modelComparisonJson, type CompareModelsScope, type ModelComparisonJson } from "./report/modelComparisonJson.ts";
export { comparisonDecision, MODEL_DECISION_DEFAULTS, type ComparisonDecision, type ComparisonDecisionOptions, type RulesAnswer } from "./report/comparisonDecision.ts";

// Size series: many dots → per-dot table, size bins, model fits, optical pairing.
export * from "./sizes/index.ts";
export { sizeSeriesToJson, SIZE_SERIES_JSON_VERSION, type SizeSeriesJson, type SizeDotJson } from "./report/sizeSeriesJson.ts";
export { formatSizeSeriesText, FORMAT_SIZES_TEXT_DEFAULTS, type FormatSizeSeriesTextOptions } from "./report/formatSizeSeriesText.ts";
export { sizeSeriesTables, SIZE_TABLE_FILES, type SizeSeriesTables, type SizeTable } from "./report/sizeSeriesTables.ts";
// Size figures load Observable Plot (and jsdom in Node) on demand: `const sizeFigures = await loadSizeFigures()`.
export { loadSizeFigures, SIZE_FIGURE_FILES, type SizeFiguresRenderer, type SizeFigureName } from "./report/loadSizeFigures.ts";
export type { SizeFiguresOptions } from "./report/sizeFigures.ts";

// Grid spectroscopy: maps of each assigned state across a dot (the cube in memory; files in lib/index.ts).
export * from "./grid/index.ts";
export { parseNpyHeader, type NpyHeader } from "./io/npyHeader.ts";
export { parseGridSidecar, type GridSidecar } from "./io/gridSidecar.ts";
export { parseGridTable, GRID_TABLE_DEFAULTS, type ParseGridTableOptions, type GridTableRecord } from "./io/parseGridTable.ts";
export { parseNpyGridBytes, npyGridDataBytes, npyGridCube, PARSE_NPY_GRID_BYTES_DEFAULTS, type NpyGridResult, type ParseNpyGridBytesOptions } from "./io/parseNpyGridBytes.ts";
export { parseGridBytes, gridSidecarName, isNpyGridName, PARSE_GRID_BYTES_DEFAULTS, type GridFileResult, type ParseGridBytesOptions } from "./io/parseGridBytes.ts";
export { gridToJson, gridProfileRows, GRID_JSON_VERSION, GRID_PROFILE_COLUMNS, type GridJson, type GridMapJson } from "./report/gridJson.ts";
// Grid map figures load Observable Plot (and jsdom with a PNG canvas in Node) on demand: `const draw = await loadGridMapFigure()`.
export { loadGridMapFigure, type GridMapFigureRenderer } from "./report/loadGridMapFigure.ts";
export type { GridMapFigureOptions } from "./report/gridMapFigure.ts";
export { gridMapFileNames } from "./report/gridMapFileNames.ts";
