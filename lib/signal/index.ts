/**
 * The signal stage: resampling, sweep averaging, noise estimates, Savitzky–Golay smoothing and
 * differentiation, the conductance dI/dV and the normalised conductance.
 */
export {
  savitzkyGolay,
  savitzkyGolayWeights,
  savitzkyGolayNoiseGain,
  minimumWindowSamples,
  SAVITZKY_GOLAY_DEFAULTS,
  type SavitzkyGolayOptions,
} from "./savitzkyGolay.ts";
export {
  median,
  medianAbsoluteDeviation,
  whiteNoiseSigma,
  MAD_TO_SIGMA,
  WHITE_NOISE_DEFAULTS,
  type WhiteNoiseSigmaOptions,
} from "./noise.ts";
export { isUniformStep, resampleUniform, RESAMPLE_DEFAULTS, type ResampledSeries } from "./resample.ts";
export { averageSweeps, type SweepAverage } from "./averageSweeps.ts";
export { findSaturation, SATURATION_DEFAULTS, type FindSaturationOptions, type SaturatedRange } from "./saturation.ts";
export { prepareCurve, PREPARE_CURVE_DEFAULTS, ROUNDING_SIGMA_PER_QUANTUM, type NoiseBound, type PrepareCurveOptions, type PreparedCurve } from "./prepareCurve.ts";
export { savitzkyGolayWindow, SAVITZKY_GOLAY_WINDOW_DEFAULTS, type WindowChoice, type WindowInput } from "./savitzkyGolayWindow.ts";
export {
  conductance,
  conductanceFromPrepared,
  CONDUCTANCE_DEFAULTS,
  type DifferentiateOptions,
  type ConductanceOptions,
  type ConductanceRecord,
  type ConductanceResult,
} from "./conductance.ts";
export {
  normalizedConductance,
  NORMALIZED_CONDUCTANCE_DEFAULTS,
  type NormalizedConductanceInput,
  type NormalizedConductanceOptions,
  type NormalizedConductanceResult,
} from "./normalizedConductance.ts";
