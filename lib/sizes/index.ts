// Size series: combining a dot's curves, binning by radius, and the physics models fitted to
// the quantities against radius (confinement, charging, Brus, power law, user formulas), with
// the pairing of optical transitions and tunnelling levels.

// Series (curves → dots → bins → points)
export { sizeSeries, dotQuantity, SIZE_SERIES_DEFAULTS, SERIES_QUANTITIES } from "./sizeSeries.ts";
export type { SeriesCurveInput, SeriesDot, UnassignedCurve, SizeSeriesOptions, SizeSeries } from "./sizeSeries.ts";
export { planSizeCurves, PLAN_SIZE_CURVES_DEFAULTS } from "./planSizeCurves.ts";
export type { SeriesFile, SeriesTableRow, PlannedSeriesCurve, SeriesPlan, PlanSizeCurvesOptions } from "./planSizeCurves.ts";
export { combineCurves, flagOutliers, COMBINE_DEFAULTS, COMBINED_QUANTITIES } from "./combineCurves.ts";
export type {
  CurveValues, DotCurve, CombinedQuantity, CombinedValue, CurveFlag, CombinedBias, CombinedEnergies, DotCombination,
  CombineCurvesOptions, OutlierVerdict,
} from "./combineCurves.ts";
export { sizeBins, SIZE_BINS_DEFAULTS } from "./sizeBins.ts";
export type { BinnedDot, BinStat, SizeBin, SizeBinsOptions } from "./sizeBins.ts";

// Models
export { SIZE_QUANTITIES } from "./sizeQuantities.ts";
export type { SizeQuantity } from "./sizeQuantities.ts";
export { MATERIALS, MATERIAL_RANGES, resolveMaterial, parseMaterialJson } from "./materials.ts";
export type { Material, MaterialOverrides } from "./materials.ts";
export { HBAR2_OVER_2ME_EV_NM2, COULOMB_EV_NM, RYDBERG_EV, HC_EV_NM } from "./sizeConstants.ts";
export { bracketRoot, BRACKET_ROOT_DEFAULTS } from "./bracketRoot.ts";
export type { BracketRootOptions } from "./bracketRoot.ts";
export { sphericalBesselJ, scaledModifiedSphericalBesselK } from "./sphericalBessel.ts";
export type { ValueAndSlope } from "./sphericalBessel.ts";
export { sphericalBesselZero } from "./sphericalBesselZeros.ts";
export { sphereLevelEV, SPHERE_LEVEL_DEFAULTS } from "./sphereLevels.ts";
export type { SphereLevelOptions } from "./sphereLevels.ts";
export { brusGap, BRUS_DEFAULTS } from "./brus.ts";
export type { BrusGap } from "./brus.ts";
export { cdseDiameterNM, cdseFirstExcitonWavelengthNM, brusVersusCdSeSizing, CDSE_SIZING_COEFFICIENTS } from "./cdseSizingCurve.ts";
export type { BrusDeviationRow } from "./cdseSizingCurve.ts";
export { chargingEnergyEV, sphereCapacitanceF, CHARGING_ENERGY_DEFAULTS } from "./chargingEnergy.ts";
export type { ChargingEnergyOptions } from "./chargingEnergy.ts";
export { fitSizeModel, FIT_SIZE_MODEL_DEFAULTS } from "./fitSizeModel.ts";
export type { SizeModelPoint, SizeModelParameter, FitSizeModelOptions, SizeModelFit } from "./fitSizeModel.ts";
export { parseSizeFormula, SIZE_FORMULA_DEFAULTS } from "./formula.ts";
export type { SizeFormula } from "./formula.ts";
export { fitSizeModels, evaluateSizeFit, FIT_SIZE_MODELS_DEFAULTS, SIZE_MODELS_BY_QUANTITY } from "./fitSizeModels.ts";
export type { SizePoint, SizeFit, FitSizeModelsOptions } from "./fitSizeModels.ts";
export { pairOptical, PAIR_OPTICAL_DEFAULTS } from "./opticalPairing.ts";
export type { DotLevels, OpticalRow, PairOpticalOptions, PairCandidate, OpticalPeakPairing, OpticalPairing } from "./opticalPairing.ts";
