// The documented defaults of the size models, locked: change a default and its doc together,
// on purpose (common practice, no source).
import { describe, expect, it } from "vitest";
import { BRACKET_ROOT_DEFAULTS } from "../../lib/sizes/bracketRoot.ts";
import { SPHERE_LEVEL_DEFAULTS } from "../../lib/sizes/sphereLevels.ts";
import { BRUS_DEFAULTS } from "../../lib/sizes/brus.ts";
import { CHARGING_ENERGY_DEFAULTS } from "../../lib/sizes/chargingEnergy.ts";
import { FIT_SIZE_MODEL_DEFAULTS } from "../../lib/sizes/fitSizeModel.ts";
import { SIZE_FORMULA_DEFAULTS } from "../../lib/sizes/formula.ts";
import { FIT_SIZE_MODELS_DEFAULTS, SIZE_MODELS_BY_QUANTITY } from "../../lib/sizes/fitSizeModels.ts";
import { PAIR_OPTICAL_DEFAULTS } from "../../lib/sizes/opticalPairing.ts";
import { MATERIAL_RANGES } from "../../lib/sizes/materials.ts";
import { CDSE_SIZING_COEFFICIENTS } from "../../lib/sizes/cdseSizingCurve.ts";
import { SIZE_QUANTITIES } from "../../lib/sizes/sizeQuantities.ts";

describe("size-model defaults (locked)", () => {
  it("are frozen", () => {
    for (const d of [BRACKET_ROOT_DEFAULTS, SPHERE_LEVEL_DEFAULTS, BRUS_DEFAULTS, CHARGING_ENERGY_DEFAULTS, FIT_SIZE_MODEL_DEFAULTS,
      SIZE_FORMULA_DEFAULTS, FIT_SIZE_MODELS_DEFAULTS, SIZE_MODELS_BY_QUANTITY, PAIR_OPTICAL_DEFAULTS, MATERIAL_RANGES,
      CDSE_SIZING_COEFFICIENTS, SIZE_QUANTITIES]) {
      expect(Object.isFrozen(d)).toBe(true);
    }
  });

  it("have the documented values", () => {
    expect(BRACKET_ROOT_DEFAULTS).toEqual({ absoluteTolerance: 0, relativeTolerance: 4e-16, maxIterations: 200 });
    expect(SPHERE_LEVEL_DEFAULTS).toEqual({ l: 0, n: 1, wall: "infinite", barrierMassE: 1, nonParabolicityPerEV: 0 });
    expect(BRUS_DEFAULTS).toEqual({ coulombCoefficient: 1.786, correlationCoefficient: 0.248 });
    expect(CHARGING_ENERGY_DEFAULTS).toEqual({ dielectricConstant: 1, offsetEV: 0 });
    expect(FIT_SIZE_MODEL_DEFAULTS).toEqual({ maxIterations: 200, tolerance: 1e-12, differenceStep: 1e-6, initialDamping: 1e-3 });
    expect(SIZE_FORMULA_DEFAULTS).toEqual({
      maxLength: 300,
      maxParameters: 8,
      initialValue: 1,
      functions: ["sqrt", "cbrt", "exp", "log", "log10", "pow", "abs", "sin", "cos", "tan", "sinh", "cosh", "tanh", "atan"],
      operators: ["add", "subtract", "multiply", "divide", "pow", "unaryMinus", "unaryPlus"],
      reserved: ["R", "pi"],
    });
    expect(FIT_SIZE_MODELS_DEFAULTS).toEqual({
      poorReducedChiSquare: 4,
      massScaleRange: [0.05, 20],
      electronMassRangeE: [0.002, 5],
      dielectricConstantRange: [0.5, 1000],
      powerLawExponentRange: [0.2, 4],
      powerLawStartExponents: [0.5, 1, 1.5, 2],
    });
    expect(SIZE_MODELS_BY_QUANTITY).toEqual({
      gapEV: ["power-law"],
      singleParticleGapEV: ["sphere-infinite", "sphere-finite", "sphere-nonparabolic", "power-law", "brus"],
      chargingEnergyEV: ["charging-sphere", "power-law"],
      levelSpacingSPEV: ["sphere-infinite", "sphere-finite", "sphere-nonparabolic", "power-law"],
      valenceSpacing1EV: ["power-law"],
    });
    expect(PAIR_OPTICAL_DEFAULTS).toEqual({ radiusToleranceNM: 0.3, maxValenceLevels: 3, missingPairPenaltyEV: 0.5 });
    expect(MATERIAL_RANGES).toEqual({
      bandGapEV: { min: 0, max: 10, unit: "eV" },
      electronMassE: { min: 0, max: 10, unit: "mₑ", exclusiveMin: true },
      holeMassE: { min: 0, max: 10, unit: "mₑ", exclusiveMin: true },
      dielectricConstant: { min: 1, max: 1000, unit: "" },
      nonParabolicityPerEV: { min: 0, max: 100, unit: "1/eV" },
      barrierEV: { min: 0, max: 20, unit: "eV", exclusiveMin: true },
      barrierMassE: { min: 0, max: 10, unit: "mₑ", exclusiveMin: true },
    });
    expect(SIZE_QUANTITIES).toEqual(["gapEV", "singleParticleGapEV", "chargingEnergyEV", "levelSpacingSPEV", "valenceSpacing1EV"]);
  });
});
