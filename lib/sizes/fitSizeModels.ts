/**
 * The physics models of a size series, each fitted to the quantities it describes: confinement
 * in a sphere (infinite, finite, non-parabolic), the charging energy of a sphere, a power law,
 * user formulas, and the Brus optical gap as a comparison curve.
 */
import { DotspecError } from "../util/errors.ts";
import { brusGap } from "./brus.ts";
import { chargingEnergyEV } from "./chargingEnergy.ts";
import { fitSizeModel, type SizeModelFit, type SizeModelParameter } from "./fitSizeModel.ts";
import { parseSizeFormula, type SizeFormula } from "./formula.ts";
import type { Material } from "./materials.ts";
import { SIZE_QUANTITIES, type SizeQuantity } from "./sizeQuantities.ts";
import { sphereLevelEV, type SphereLevelOptions } from "./sphereLevels.ts";

export { SIZE_QUANTITIES, type SizeQuantity } from "./sizeQuantities.ts";

/** One dot's value of a quantity at its radius. */
export interface SizePoint {
  /** Dot id. */
  dot: string;
  /** Dot radius, nm. */
  radiusNM: number;
  /** The quantity, eV. */
  value: number;
  /** Its 1σ uncertainty, eV, or null when unknown. */
  sigma: number | null;
}

/** One model fitted to (or, for "brus", compared with) one quantity. */
export interface SizeFit {
  /** The quantity the model was fitted to. */
  quantity: SizeQuantity;
  /** "sphere-infinite", "sphere-finite", "sphere-nonparabolic", "charging-sphere", "power-law", "brus" or "formula: <text>". */
  model: string;
  /** Fitted values (and values derived from them, such as the masses from the mass scale), by name; empty for a failed fit. */
  params: Record<string, number>;
  /** 1σ standard errors by name; null where not available. */
  stderr: Record<string, number | null>;
  /** χ²/(N − M); null with no degrees of freedom or no fit. */
  reducedChiSquare: number | null;
  /** Points that entered the fit. */
  pointsUsed: number;
  /** The dots of those points. */
  dotsUsed: string[];
  /** "ok"; "poor" (χ²_red above the limit with stated σ, a parameter on a bound, or no convergence); "failed" (no fit). */
  status: "ok" | "poor" | "failed";
  /** What went wrong or was assumed, in words. */
  warnings: string[];
}

/** Options of {@link fitSizeModels}. */
export interface FitSizeModelsOptions {
  /** Bulk parameters of the dots' material (see resolveMaterial). Required. */
  material: Material;
  /**
   * User formulas (see parseSizeFormula). One with a "quantity:" prefix is fitted to that
   * quantity only; one without, to every quantity that has points. Default none.
   */
  formulas?: string[];
  /** A fit with stated σ is "poor" when χ²_red exceeds this. Default 4 (residuals about twice their error bars). */
  poorReducedChiSquare?: number;
}

/** Defaults and bounds of {@link fitSizeModels} (locked by test/sizes/defaults.test.ts). */
export const FIT_SIZE_MODELS_DEFAULTS = Object.freeze({
  /** χ²_red above which a fit with stated σ is "poor" (common practice, no source). */
  poorReducedChiSquare: 4,
  /** Bounds of the common mass scale of the sphere models of the single-particle gap. */
  massScaleRange: Object.freeze([0.05, 20] as const),
  /** Bounds of the electron mass (mₑ) in the sphere models of Δsp. */
  electronMassRangeE: Object.freeze([0.002, 5] as const),
  /** Bounds of ε_eff in the charging model. */
  dielectricConstantRange: Object.freeze([0.5, 1000] as const),
  /** Bounds of the exponent n of the power law. */
  powerLawExponentRange: Object.freeze([0.2, 4] as const),
  /** Exponents tried to start the power law (a linear fit at each; the best one starts the full fit). */
  powerLawStartExponents: Object.freeze([0.5, 1, 1.5, 2]),
});

/** Which built-in models describe which quantity (the power law and the formulas go with every one). */
export const SIZE_MODELS_BY_QUANTITY: Readonly<Record<SizeQuantity, readonly string[]>> = Object.freeze({
  gapEV: Object.freeze(["power-law"]),
  singleParticleGapEV: Object.freeze(["sphere-infinite", "sphere-finite", "sphere-nonparabolic", "power-law", "brus"]),
  chargingEnergyEV: Object.freeze(["charging-sphere", "power-law"]),
  levelSpacingSPEV: Object.freeze(["sphere-infinite", "sphere-finite", "sphere-nonparabolic", "power-law"]),
  valenceSpacing1EV: Object.freeze(["power-law"]),
});

type Wall = "sphere-infinite" | "sphere-finite" | "sphere-nonparabolic";

function levelOptions(model: Wall, material: Material, l: number): SphereLevelOptions {
  if (model === "sphere-finite") return { l, wall: "finite", barrierEV: material.barrierEV, barrierMassE: material.barrierMassE };
  if (model === "sphere-nonparabolic") return { l, nonParabolicityPerEV: material.nonParabolicityPerEV };
  return { l };
}

/** Eg + E_e(1S) + E_h(1S), masses scaled by s; NaN when a finite well binds no level. */
function singleParticleGap(model: Wall, material: Material, radiusNM: number, massScale: number): number {
  const o = levelOptions(model, material, 0);
  const e = sphereLevelEV(radiusNM, massScale * material.electronMassE, o);
  const h = sphereLevelEV(radiusNM, massScale * material.holeMassE, o);
  return e === null || h === null ? NaN : material.bandGapEV + e + h;
}

/** E_1P − E_1S of the electron with mass mₑ* (in mₑ); NaN when a finite well binds no 1P level. */
function spSpacing(model: Wall, material: Material, radiusNM: number, electronMassE: number): number {
  const s = sphereLevelEV(radiusNM, electronMassE, levelOptions(model, material, 0));
  const p = sphereLevelEV(radiusNM, electronMassE, levelOptions(model, material, 1));
  return s === null || p === null ? NaN : p - s;
}

const formulaCache = new Map<string, SizeFormula>();
function formulaOf(text: string): SizeFormula {
  let f = formulaCache.get(text);
  if (!f) {
    f = parseSizeFormula(text);
    if (formulaCache.size >= 100) formulaCache.clear();
    formulaCache.set(text, f);
  }
  return f;
}

interface ModelSpec {
  parameters: SizeModelParameter[];
  model: (radiusNM: number, p: readonly number[]) => number;
  /** Values reported besides the fitted ones, with their standard errors. */
  derived?: (p: Record<string, number>, se: Record<string, number | null>) => { params: Record<string, number>; stderr: Record<string, number | null> };
}

function powerLawStart(points: readonly SizePoint[]): { bulkEV: number; amplitudeEVNM: number; exponent: number } {
  let best = { bulkEV: 0, amplitudeEVNM: 1, exponent: 1, chi2: Infinity };
  for (const n of FIT_SIZE_MODELS_DEFAULTS.powerLawStartExponents) {
    // Linear least squares of y = b + A·u, u = R⁻ⁿ (unit weights: only a start).
    const u = points.map((p) => p.radiusNM ** -n);
    const N = points.length;
    const su = u.reduce((a, b) => a + b, 0), sy = points.reduce((a, p) => a + p.value, 0);
    const suu = u.reduce((a, b) => a + b * b, 0), suy = u.reduce((a, b, i) => a + b * points[i].value, 0);
    const det = N * suu - su * su;
    if (!(Math.abs(det) > 0)) continue;
    const A = (N * suy - su * sy) / det, b = (sy - A * su) / N;
    const chi2 = points.reduce((acc, p, i) => acc + (p.value - b - A * u[i]) ** 2, 0);
    if (chi2 < best.chi2) best = { bulkEV: b, amplitudeEVNM: A, exponent: n, chi2 };
  }
  return best;
}

function specFor(quantity: SizeQuantity, model: string, material: Material, points: readonly SizePoint[]): ModelSpec {
  const D = FIT_SIZE_MODELS_DEFAULTS;
  if (model === "power-law") {
    const s = powerLawStart(points);
    return {
      parameters: [
        { name: "bulkEV", initial: s.bulkEV },
        { name: "amplitudeEVNM", initial: s.amplitudeEVNM },
        { name: "exponent", initial: s.exponent, min: D.powerLawExponentRange[0], max: D.powerLawExponentRange[1] },
      ],
      model: (R, [b, A, n]) => b + A / R ** n,
    };
  }
  if (model === "charging-sphere") {
    return {
      parameters: [
        { name: "dielectricConstantEff", initial: material.dielectricConstant / 2, min: D.dielectricConstantRange[0], max: D.dielectricConstantRange[1] },
        { name: "offsetEV", initial: 0 },
      ],
      model: (R, [eps, c0]) => chargingEnergyEV(R, { dielectricConstant: eps, offsetEV: c0 }),
    };
  }
  if (model.startsWith("formula: ")) {
    const f = formulaOf(model.slice("formula: ".length));
    return {
      parameters: f.parameters.map((name) => ({ name, initial: f.initialValues[name] })),
      model: (R, p) => f.evaluate(R, p),
    };
  }
  const wall = model as Wall;
  if (quantity === "singleParticleGapEV") {
    return {
      parameters: [{ name: "massScale", initial: 1, min: D.massScaleRange[0], max: D.massScaleRange[1] }],
      model: (R, [s]) => singleParticleGap(wall, material, R, s),
      derived: (p, se) => ({
        params: { electronMassE: p.massScale * material.electronMassE, holeMassE: p.massScale * material.holeMassE },
        stderr: {
          electronMassE: se.massScale === null ? null : se.massScale * material.electronMassE,
          holeMassE: se.massScale === null ? null : se.massScale * material.holeMassE,
        },
      }),
    };
  }
  return {
    parameters: [{ name: "electronMassE", initial: material.electronMassE, min: D.electronMassRangeE[0], max: D.electronMassRangeE[1] }],
    model: (R, [m]) => spSpacing(wall, material, R, m),
  };
}

function fitOne(quantity: SizeQuantity, model: string, material: Material, points: readonly SizePoint[], poorChi2: number): SizeFit {
  if (points.length === 0) {
    return { quantity, model, params: {}, stderr: {}, reducedChiSquare: null, pointsUsed: 0, dotsUsed: [], status: "failed", warnings: [`no points for ${quantity}`] };
  }
  if (model === "brus") {
    const used = points.filter((p) => Number.isFinite(p.radiusNM) && p.radiusNM > 0 && Number.isFinite(p.value));
    return {
      quantity, model, params: {}, stderr: {}, reducedChiSquare: null, pointsUsed: used.length, dotsUsed: used.map((p) => p.dot),
      status: "ok", warnings: [],
    };
  }
  const spec = specFor(quantity, model, material, points);
  const fit: SizeModelFit = fitSizeModel(points, { model: spec.model, parameters: spec.parameters });
  const warnings = [...fit.warnings];
  let status: SizeFit["status"] = "ok";
  if (!Number.isFinite(fit.chiSquare) || fit.pointsUsed < spec.parameters.length) status = "failed";
  else {
    if (!fit.converged || fit.atBound.length > 0) status = "poor";
    if (fit.weighting !== "none" && fit.reducedChiSquare !== null && fit.reducedChiSquare > poorChi2) {
      status = "poor";
      warnings.push(`reduced χ² ${fit.reducedChiSquare.toPrecision(3)} exceeds ${poorChi2}: the model does not describe the points within their uncertainties`);
    }
  }
  // A failed fit reports no values (its starting values would read like results).
  let params: Record<string, number> = status === "failed" ? {} : { ...fit.params };
  let stderr: Record<string, number | null> = status === "failed" ? {} : { ...fit.stderr };
  if (spec.derived && status !== "failed") {
    const extra = spec.derived(fit.params, fit.stderr);
    params = { ...params, ...extra.params };
    stderr = { ...stderr, ...extra.stderr };
  }
  return {
    quantity, model, params, stderr, reducedChiSquare: fit.reducedChiSquare, pointsUsed: fit.pointsUsed,
    dotsUsed: fit.indicesUsed.map((i) => points[i].dot), status, warnings,
  };
}

/**
 * Fits the size models to the quantities of a size series.
 *
 * Models by quantity ({@link SIZE_MODELS_BY_QUANTITY}):
 * - singleParticleGapEV: Eg + E_e(1S) + E_h(1S) with one free parameter, a common scale s of
 *   the material's electron and hole masses (their ratio kept; Eg fixed at the bulk value);
 *   "sphere-infinite", "sphere-finite" (the material's barrier and barrier mass) and
 *   "sphere-nonparabolic" (infinite wall, the material's α for both carriers). Reports s and the
 *   fitted masses electronMassE = s·mₑ*, holeMassE = s·m_h*. Also "brus": the Brus optical gap
 *   as a comparison curve (no parameter fitted; the optical gap lies below the single-particle
 *   gap by about the electron–hole Coulomb energy).
 * - levelSpacingSPEV: E_1P − E_1S of the electron with its mass mₑ* free (the same three walls).
 * - chargingEnergyEV: "charging-sphere", e²/(4πε₀·ε_eff·R) + c₀ (dielectricConstantEff, offsetEV).
 * - every quantity: "power-law", E_bulk + A/Rⁿ (bulkEV, amplitudeEVNM in eV·nmⁿ, exponent).
 * - user formulas: "formula: <text>", fitted to the quantity named by their prefix, or to every
 *   quantity that has points.
 *
 * Parameters
 * ----------
 * points : Partial<Record<SizeQuantity, SizePoint[]>>
 *     Per quantity, one point per dot ({@link SizePoint}).
 * options : FitSizeModelsOptions
 *     Material and formulas ({@link FitSizeModelsOptions}).
 *
 * Returns
 * -------
 * SizeFit[]
 *     One {@link SizeFit} per (quantity, model), in the order of {@link SIZE_QUANTITIES}.
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/formula` for a formula that does not parse or is not allowed, `sizes/missing-material`
 *     without a material.
 *
 * Notes
 * -----
 * 1. Quantities with no points get no built-in fit; a formula aimed at such a quantity gives a
 *    "failed" entry saying so.
 * 2. Each fit is {@link fitSizeModel} (weighted Levenberg–Marquardt with bounds). Status "failed":
 *    too few points or a model that cannot be evaluated; "poor": no convergence, a parameter on a
 *    bound, or χ²_red > `poorReducedChiSquare` with stated σ; else "ok".
 * 3. All formulas are parsed first, so a bad one is refused before any fit is run.
 *
 * Example
 * -------
 * ```ts
 * const material = resolveMaterial("InP");
 * // Charging energies of four invented dots, eV: e²/(4πε₀·ε_eff·R) with ε_eff = 6.
 * const points = [1.5, 2, 2.5, 3].map((radiusNM, i) => ({ dot: `d${i}`, radiusNM, value: 1.439965 / (6 * radiusNM), sigma: 0.005 }));
 * fitSizeModels({ chargingEnergyEV: points }, { material }).map((f) => f.model); // => ["charging-sphere", "power-law"]
 * ```
 */
export function fitSizeModels(points: Partial<Record<SizeQuantity, SizePoint[]>>, options: FitSizeModelsOptions): SizeFit[] {
  const material = options.material;
  if (!material || typeof material !== "object") {
    throw new DotspecError("sizes/missing-material", "fitSizeModels: options.material is required; resolve one with resolveMaterial(\"InP\") or a JSON file");
  }
  const poorChi2 = options.poorReducedChiSquare ?? FIT_SIZE_MODELS_DEFAULTS.poorReducedChiSquare;
  const formulas = (options.formulas ?? []).map((text) => formulaOf(text));
  const fits: SizeFit[] = [];
  for (const quantity of SIZE_QUANTITIES) {
    const pts = points[quantity] ?? [];
    if (pts.length > 0) for (const model of SIZE_MODELS_BY_QUANTITY[quantity]) fits.push(fitOne(quantity, model, material, pts, poorChi2));
    for (const f of formulas) {
      if (f.quantity === quantity || (f.quantity === null && pts.length > 0)) fits.push(fitOne(quantity, `formula: ${f.text}`, material, pts, poorChi2));
    }
  }
  return fits;
}

/**
 * The curve of a fitted model at one radius, for figures.
 *
 * Parameters
 * ----------
 * fit : SizeFit
 *     A {@link SizeFit} from {@link fitSizeModels}.
 * radiusNM : number
 *     Radius, nm (> 0).
 * material : Material
 *     The material the fit used.
 *
 * Returns
 * -------
 * number
 *     The model's value, eV (NaN for a failed fit or where the model is undefined, such as a finite
 *     well that binds no level).
 *
 * Notes
 * -----
 * 1. The model is rebuilt from `fit.model` and `fit.quantity` and evaluated with `fit.params`
 *    (formulas are parsed again from the text after "formula: ").
 * 2. "brus" gives the Brus optical gap of `material`.
 *
 * Example
 * -------
 * ```ts
 * const material = resolveMaterial("InP");
 * // Charging energies of four invented dots, eV: e²/(4πε₀·ε_eff·R) with ε_eff = 6.
 * const points = [1.5, 2, 2.5, 3].map((radiusNM, i) => ({ dot: `d${i}`, radiusNM, value: 1.439965 / (6 * radiusNM), sigma: 0.005 }));
 * const fit = fitSizeModels({ chargingEnergyEV: points }, { material })[0]; // charging-sphere
 * evaluateSizeFit(fit, 2, material); // => 0.12000 (1.439965/(ε_eff·2) + c₀ with ε_eff = 6, c₀ = 0)
 * ```
 */
export function evaluateSizeFit(fit: SizeFit, radiusNM: number, material: Material): number {
  if (fit.status === "failed" || !(radiusNM > 0)) return NaN;
  if (fit.model === "brus") return brusGap(radiusNM, material).gapEV;
  const spec = specFor(fit.quantity, fit.model, material, []);
  const values = spec.parameters.map((p) => fit.params[p.name]);
  if (values.some((v) => !Number.isFinite(v))) return NaN;
  return spec.model(radiusNM, values);
}
