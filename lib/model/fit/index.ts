/**
 * The model fit, stage by stage: the levels from the assignment, the hypotheses compared (with the CB peaks that may be the VB peaks' resonances, and
 * their plausibility checks and information criterion), the starting values, the
 * parameter vector and its dot model, the model current at unit scale, the linear projection of
 * scale, offset and background, the cost of one master-equation solve (what the work budget counts), the Levenberg–Marquardt loop and the runs built on it, the first hole's entry held on the CB side at low η, the comparison
 * of the groupings (and the choice by the whole curve where the CB side is blind to p), the refinement starts about the best grouping (and at the p sub-level spacings
 * the peaks show), the further readings of the VB peaks (and the whole curve's further Ec starts), the χ² profile over Ec in shell tunnelling, the fitted levels in energy order, the standard errors, the residual structure, the status, the verdict, and
 * fitCurve, which composes them.
 */
export { fitCurve, type FitOptions } from "./fitCurve.ts";
export { FIT_DEFAULTS } from "./fitDefaults.ts";
export type { CurveFit, FitAlternative, FittedLevel, FittedValue, FitWork } from "./curveFit.ts";
export { fitHypotheses, FIT_HYPOTHESES_DEFAULTS, type FitHypothesis, type HypothesisKind } from "./fitHypotheses.ts";
export { hypothesisPlausibility, PLAUSIBILITY_DEFAULTS, type PlausibilityInput, type PlausibilityLevel } from "./hypothesisPlausibility.ts";
export { bayesianInformationCriterion, evidenceWeights } from "./informationCriterion.ts";
export { levelsToFit, type LevelSeed } from "./levelsToFit.ts";
export { resonanceSuspects, RESONANCE_SUSPECT_DEFAULTS } from "./resonanceSuspects.ts";
export { fitStart, type FitStart } from "./fitStart.ts";
export { startingValues, type StartingValues } from "./startingValues.ts";
export { parameterIndex, parameterModel, type ParameterIndex } from "./parameterModel.ts";
export { unitCurrent } from "./unitCurrent.ts";
export { bandStepsMemo, bandStepsStore, BAND_STEPS_MEMO_DEFAULTS, type BandStepsStore } from "./bandStepsMemo.ts";
export { linearProjector, projectLinear, type LinearProjection } from "./projectLinear.ts";
export { levenbergMarquardtLoop, type LoopSettings, type LoopResult } from "./levenbergMarquardtLoop.ts";
export { cbSideEndV, heldHoleEntry, type CbSideEndPeak } from "./cbSideEnd.ts";
export { heldShellLevels, heldValenceLevels, withHeldLevels } from "./heldValenceLevels.ts";
export { ladderSolveWork } from "./solveWork.ts";
export { fitRunner, type FitRun, type FitRunner, type FitRunnerSettings } from "./fitRunner.ts";
export { refinementStarts, refinementStart, REFINEMENT_DEFAULTS, type RefinementStart, type StartLevel } from "./refinementStarts.ts";
export { splitGridStarts, SPLIT_GRID_DEFAULTS, type GridPeak, type SplitGridOptions } from "./splitGridStarts.ts";
export { standardErrors } from "./standardErrors.ts";
export { trialErrors, type TrialErrors } from "./trialErrors.ts";
export { residualStructure, type ResidualStructure } from "./residualStructure.ts";
export { fitStatus, FIT_STATUS_DEFAULTS, type FitStatus, type FitStatusInput } from "./fitStatus.ts";
export { fitVerdict, type FitVerdict, type FitVerdictLimits } from "./fitVerdict.ts";
export { refineGrouping, REFINE_GROUPING_DEFAULTS, type RefineContext } from "./refineGrouping.ts";
export { compareGroupings, COMPARE_GROUPINGS_DEFAULTS, type CompareContext } from "./compareGroupings.ts";
export { blindCbSide, crossedCbSide, wholeCurveChoice, type BlindSidePeak } from "./blindCbSide.ts";
export { laterEntryReadings } from "./laterEntryReadings.ts";
export { valenceSpacingEcEV, wholeCurveEcStarts, WHOLE_CURVE_RESTART_DEFAULTS } from "./wholeCurveRestarts.ts";
export { wholeCurveSplits, WHOLE_CURVE_SPLIT_DEFAULTS } from "./wholeCurveSplits.ts";
export { peakStartWholeFits, PEAK_START_WHOLE_DEFAULTS, type PeakStartWholeContext } from "./peakStartWholeFits.ts";
export { unseenSPeakReadings, unseenSPeakWholeFits, UNSEEN_S_PEAK_DEFAULTS, type UnseenSPeakContext } from "./unseenSPeakWholeFits.ts";
export { droppedPeakWholeFits, fillingOrderReading, DROPPED_PEAK_DEFAULTS } from "./droppedPeakWholeFits.ts";
export { ecGridStartsEV, ecGridWholeFits, ecValenceReadings, EC_GRID_DEFAULTS } from "./ecGridWholeFits.ts";
export { ecProfile, profileReading, EC_PROFILE_DEFAULTS, type EcProfileInput, type ProfileReading } from "./ecProfile.ts";
export { matchedLadderReadings, matchedLadderWholeFits, mergedPeakEcEV, mergedPeakWholeFits, MERGED_PEAK_DEFAULTS } from "./mergedPeakWholeFits.ts";
export { cbSideEcLadderWholeFits, matchedValenceReadings, CB_SIDE_EC_LADDER_DEFAULTS, type CbSideEcLadderContext } from "./cbSideEcLadderWholeFits.ts";
export { structuredWholeSplit, STRUCTURED_WHOLE_SPLIT_DEFAULTS, type StructuredWholeSplitContext } from "./structuredWholeSplit.ts";
export { orderLevels } from "./orderLevels.ts";
export { shiftGrouping } from "./shiftGrouping.ts";
export { sameFit, SAME_FIT_DEFAULTS } from "./sameFit.ts";
