/**
 * The χ² profile over Ec of a shell-tunnelling fit: Ec held on a grid, the other parameters
 * refitted at each point. A lower χ² elsewhere moves the fit there; a profile that stays flat far
 * from the best Ec leaves Ec undetermined; otherwise its error is no smaller than the profile's.
 */
import { parameterIndex } from "./parameterModel.ts";
import { hypothesisPlausibility } from "./hypothesisPlausibility.ts";
import { plausibilityInput, type FitTrial } from "./fitTrial.ts";
import { trialErrors, type TrialErrors } from "./trialErrors.ts";
import { ecGridStartsEV } from "./ecGridWholeFits.ts";
import { secondToFirstStepRatio } from "../regimeLimits.ts";
import type { FitRun } from "./fitRunner.ts";

/** Defaults of {@link ecProfile} (locked by test/model/fit/ecProfile.test.ts). */
export const EC_PROFILE_DEFAULTS = Object.freeze({
  /**
   * Ec is profiled where the fitted satellite (charging) steps are at most this fraction of their
   * levels' steps, r/(1 + r) with r = Γtip/Γsub ({@link secondToFirstStepRatio}, orthodox theory): 5 %, a few times the
   * noise of a level's step on the low-η benchmark's curves (low η, seed 1001: the fits that were
   * good with a wrong Ec had r/(1 + r) of 0.01–3 %). Not tuned.
   */
  maxSatelliteFraction: 0.05,
  /** The grid: Ec = gapFraction × gap × k / gridSteps, k = 1 … gridSteps, gap = η·(first CB peak − first VB peak) ({@link ecGridStartsEV}); half the gap holds one Ec (common practice, no source). */
  gapFraction: 0.5,
  gridSteps: 10,
  /** … and the best Ec times each of these (a second minimum near a simple fraction or multiple of it). Not tuned. */
  bestFactors: Object.freeze([0.5, 2 / 3, 1.5, 2]) as readonly number[],
  /** Levenberg–Marquardt iterations at each grid point, Ec held (a short bounded run). Not tuned. */
  profileIterations: 6,
  /** Δχ² (scaled by max(1, reduced χ²)) of ±1 standard error of one parameter (closed form: the normal distribution's 1σ). */
  oneSigmaChiSquare: 1,
  /**
   * Δχ² (scaled likewise) within which an Ec far from the best is not excluded: 3.84, the 95 %
   * point of χ² for one parameter (closed form, 1.96²). A grid point that far from the best Ec
   * within it leaves Ec undetermined.
   */
  undeterminedChiSquare: 3.84,
  /** "Far": more than this fraction of the best Ec away from it (FIT_STATUS_DEFAULTS.poorRelativeError). */
  farFraction: 0.25,
  /** A grid point moves the fit when its χ² is below the fit's by more than this. Not tuned. */
  moveChiSquare: 1,
  /** The profile runs only while at most this fraction of the work budget is spent (as EC_GRID_DEFAULTS.maxBudgetSpent). Not tuned. */
  maxBudgetSpent: 0.75,
});

/** What {@link profileReading} makes of a χ² profile. */
export interface ProfileReading {
  /** Whether a point far from the best Ec lies within the undetermined level (Ec not determined). */
  determined: boolean;
  /** The profile's 1σ half-width about the best Ec: the larger of the two sides' d·√(level/rise) from the nearest point on each; 0 where neither side has a point. */
  halfWidth: number;
  /** The smallest and largest Ec whose χ² lies within the undetermined level (the best Ec included). */
  withinLowEV: number;
  withinHighEV: number;
}

/**
 * Reads a χ² profile over Ec about its best point.
 *
 * Parameters
 * ----------
 * ecEV : readonly number[]
 *     Ec at each profile point, eV (any order).
 * chiSquare : readonly number[]
 *     χ² at each, the other parameters refitted.
 * bestEcEV, bestChiSquare : number
 *     The fit's Ec (eV) and χ² (the profile's least).
 * scale : number
 *     max(1, reduced χ²): the Δχ² levels are scaled by it (as the standard errors are).
 * settings : Pick<typeof EC_PROFILE_DEFAULTS, "oneSigmaChiSquare" | "undeterminedChiSquare" | "farFraction">, optional
 *
 * Returns
 * -------
 * ProfileReading
 *
 * Notes
 * -----
 * 1. Half-width: on each side the nearest point at distance d with rise Δχ² > 0 gives
 *    d·√(oneSigmaChiSquare·scale/Δχ²): exact where the profile is a parabola (Δχ² = (d/σ)²); d
 *    itself where it does not rise.
 * 2. Undetermined where any point more than farFraction·Ec from the best lies within
 *    undeterminedChiSquare·scale of its χ².
 *
 * Example
 * -------
 * ```ts
 * profileReading([0.09, 0.11], [4, 4], 0.1, 0, 1).halfWidth; // => 0.005 (a parabola of σ 5 meV)
 * ```
 */
export function profileReading(ecEV: readonly number[], chiSquare: readonly number[], bestEcEV: number, bestChiSquare: number, scale: number, settings: Pick<typeof EC_PROFILE_DEFAULTS, "oneSigmaChiSquare" | "undeterminedChiSquare" | "farFraction"> = EC_PROFILE_DEFAULTS): ProfileReading {
  const one = settings.oneSigmaChiSquare * scale;
  const flat = settings.undeterminedChiSquare * scale;
  let halfWidth = 0;
  let [withinLowEV, withinHighEV] = [bestEcEV, bestEcEV];
  let determined = true;
  for (const side of [-1, 1]) {
    let nearest = -1;
    ecEV.forEach((ec, k) => {
      const d = side * (ec - bestEcEV);
      if (d > 0 && (nearest < 0 || d < side * (ecEV[nearest] - bestEcEV))) nearest = k;
    });
    if (nearest >= 0) {
      const rise = Math.max(chiSquare[nearest] - bestChiSquare, 0);
      const d = Math.abs(ecEV[nearest] - bestEcEV);
      halfWidth = Math.max(halfWidth, rise > 0 ? d * Math.sqrt(one / rise) : d);
    }
  }
  ecEV.forEach((ec, k) => {
    if (chiSquare[k] - bestChiSquare > flat) return;
    [withinLowEV, withinHighEV] = [Math.min(withinLowEV, ec), Math.max(withinHighEV, ec)];
    if (Math.abs(ec - bestEcEV) > settings.farFraction * bestEcEV) determined = false;
  });
  return { determined, halfWidth, withinLowEV, withinHighEV };
}

/** What {@link ecProfile} reads. */
export interface EcProfileInput {
  /** The fit that stands so far. */
  trial: FitTrial;
  /** Its standard errors. */
  errors: TrialErrors;
  /** The run function (a search's: its stop at the budget is not the fit's). */
  run: FitRun;
  maxIterations: number;
  /** The model current at unit rate scale for a run's hypothesis. */
  currentOf: (t: FitTrial) => (p: ArrayLike<number>, biasV: Float64Array) => Float64Array;
  noiseA: number;
  eta: number;
  /** The peaks' biases, V (CB positive, VB negative), for the grid's gap. */
  peaksV: readonly number[];
  /** The larger part of the work budget spent so far, 0–1. */
  budgetSpent: () => number;
  /** Runs are added here; warnings are pushed here. */
  trials: FitTrial[];
  warnings: string[];
  settings?: typeof EC_PROFILE_DEFAULTS;
}

/**
 * Profiles χ² over Ec where the fitted satellite steps are small, and reads Ec off the profile.
 *
 * Parameters
 * ----------
 * input : EcProfileInput
 *     The fit (its points, parameters, hypothesis), its errors, the run function, the work spent,
 *     η, the peaks (V) and where runs and warnings go.
 *
 * Returns
 * -------
 * { trial: FitTrial; errors: TrialErrors }
 *     The fit and its errors: unchanged where the profile is skipped; the fit finished from a grid
 *     point with a lower χ² where there is one; Ec's standard error NaN where Ec is not determined
 *     (a warning says so, in words), else at least the profile's half-width.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Skipped where r/(1 + r) > maxSatelliteFraction ({@link secondToFirstStepRatio}: the satellite
 *    steps then place Ec) or more than maxBudgetSpent of the work budget is spent.
 * 2. Grid: {@link ecGridStartsEV} up to half the gap, and the best Ec × ½, ⅔, 3⁄2, 2. At each grid
 *    point Ec is held and the rest refitted for profileIterations from the fit's values, every
 *    level moved by −ΔEc/2 so that its first step stays where it was: in shell tunnelling the dot
 *    is empty between entries, and each level's large step lies at ε + Ec/2 whatever its place in a ladder.
 * 3. A point with χ² lower than the fit's by more than moveChiSquare is finished with Ec free;
 *    that run replaces the fit where it ends lower and is plausible ({@link hypothesisPlausibility}).
 * 4. The profile is read by {@link profileReading}: undetermined where a point far from the best
 *    Ec is not excluded at 95 %; else the error is max(JᵀJ's, the profile's half-width). An
 *    undetermined Ec in shell tunnelling leaves the status to the rest (the regime and the levels
 *    do not need it, {@link fitStatus}); elsewhere fitStatus calls the fit failed.
 *
 * References
 * ----------
 * W. H. Press et al., Numerical Recipes, 3rd ed., §15.6 (confidence limits from Δχ² with the
 * other parameters refitted; from memory).
 *
 * Example
 * -------
 * ```ts
 * const { errors } = ecProfile({ trial, errors: trialErrors(trial, current, noiseA, []), run, maxIterations: 60, currentOf, noiseA, eta: 0.6, peaksV, budgetSpent, trials, warnings });
 * Number.isNaN(errors.se[parameterIndex(trial.hypothesis.seeds.length).chargingEnergy]); // => true where Ec is not determined
 * ```
 */
export function ecProfile(input: EcProfileInput): { trial: FitTrial; errors: TrialErrors } {
  const S = input.settings ?? EC_PROFILE_DEFAULTS;
  let { trial, errors } = input;
  const at = parameterIndex(trial.hypothesis.seeds.length);
  const p0 = trial.loop.parameters;
  const fraction = secondToFirstStepRatio(10 ** p0[at.logRateRatio]);
  if (fraction > S.maxSatelliteFraction || input.budgetSpent() > S.maxBudgetSpent) return { trial, errors };
  const ec0 = p0[at.chargingEnergy];
  const [minEc, maxEc] = [trial.start.minValues[at.chargingEnergy], trial.start.maxValues[at.chargingEnergy]];
  const grid = [...ecGridStartsEV(input.peaksV, input.peaksV, input.eta, S), ...S.bestFactors.map((f) => f * ec0)].filter((ec) => ec > minEc && ec < maxEc && Math.abs(ec - ec0) > 1e-3 * ec0);
  const heldAt = (ecEV: number) => {
    // The hypothesis started at this Ec: its level bounds centred where its levels now lie.
    const h = { ...trial.hypothesis, chargingEnergyStartEV: ecEV };
    const from = [...p0];
    trial.hypothesis.seeds.forEach((_, j) => (from[j] = p0[j] - 0.5 * (ecEV - ec0)));
    from[at.chargingEnergy] = ecEV;
    return input.run(h, null, S.profileIterations, from, trial.set, [at.chargingEnergy]);
  };
  const points = grid.map(heldAt);
  input.trials.push(...points);
  const lowest = points.reduce<FitTrial | null>((x, t) => (!x || t.loop.chiSquare < x.loop.chiSquare ? t : x), null);
  if (lowest && lowest.loop.chiSquare < trial.loop.chiSquare - S.moveChiSquare) {
    const moved = input.run(lowest.hypothesis, null, input.maxIterations, lowest.loop.parameters, trial.set);
    input.trials.push(moved);
    if (moved.loop.chiSquare < trial.loop.chiSquare && hypothesisPlausibility(plausibilityInput(moved)).length === 0) {
      input.warnings.push(`the χ² profile over Ec found a lower χ² at Ec ${(lowest.loop.parameters[at.chargingEnergy] * 1000).toFixed(1)} meV than at the fitted ${(ec0 * 1000).toFixed(1)} meV: the fit was finished from there (Ec ${(moved.loop.parameters[at.chargingEnergy] * 1000).toFixed(1)} meV)`);
      trial = moved;
      errors = trialErrors(moved, input.currentOf(moved), input.noiseA, input.warnings);
    }
  }
  const ec = trial.loop.parameters[at.chargingEnergy];
  const scale = Math.max(1, errors.reducedChiSquare);
  const reading = profileReading(points.map((t) => t.loop.parameters[at.chargingEnergy]), points.map((t) => t.loop.chiSquare), ec, trial.loop.chiSquare, scale, S);
  const se = [...errors.se];
  const r = secondToFirstStepRatio(10 ** trial.loop.parameters[at.logRateRatio]);
  if (!reading.determined) {
    se[at.chargingEnergy] = NaN;
    input.warnings.push(`Ec not determined: the satellite steps r/(1 + r) = ${(100 * r).toPrecision(2)} % of their levels' are at the noise, and χ² with Ec held (the rest refitted) stays within ${S.undeterminedChiSquare} × ${scale.toPrecision(3)} of its least from ${(reading.withinLowEV * 1000).toFixed(1)} to ${(reading.withinHighEV * 1000).toFixed(1)} meV; the fitted ${(ec * 1000).toFixed(1)} meV is one value among these`);
  } else if (reading.halfWidth > se[at.chargingEnergy]) se[at.chargingEnergy] = reading.halfWidth;
  return { trial, errors: { ...errors, se } };
}
