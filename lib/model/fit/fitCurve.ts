/**
 * Fitting the orthodox-theory model to a measured I–V curve, starting from the peak-based
 * assignment: level energies, charging energy, tip/substrate rate ratio, rate scale,
 * broadening, offset and a smooth background, with standard errors.
 */
import type { CurveAnalysis } from "../../pipeline/analyzeCurve.ts";
import type { REGIME_LIMITS } from "../regimeLimits.ts";
import { checkEta, checkInteger, checkKnownKeys, checkPositive } from "../../util/check.ts";
import { DotspecError } from "../../util/errors.ts";
import { SCENARIO_DEFAULTS } from "../scenario.ts";
import { parameterIndex } from "./parameterModel.ts";
import type { bandStepsMemo } from "./bandStepsMemo.ts";
import type { ladderSolveWork } from "./solveWork.ts";
import type { heldShellLevels, heldValenceLevels } from "./heldValenceLevels.ts";
import type { cbSideEndV, heldHoleEntry } from "./cbSideEnd.ts";
import { continueRun, fitRunner } from "./fitRunner.ts";
import { linearProjector, projectLinear } from "./projectLinear.ts";
import { levenbergMarquardtLoop } from "./levenbergMarquardtLoop.ts";
import { peakChargingEnergy, FIT_STATUS_DEFAULTS, type fitStatus } from "./fitStatus.ts";
import { fitHypotheses, type HypothesisKind } from "./fitHypotheses.ts";
import { boundReason, hypothesisPlausibility } from "./hypothesisPlausibility.ts";
import { bayesianInformationCriterion, evidenceWeights } from "./informationCriterion.ts";
import { plausibilityInput, type DataSet, type FitTrial } from "./fitTrial.ts";
import { fitEvidence } from "./fitEvidence.ts";
import { trialErrors } from "./trialErrors.ts";
import { standardErrors } from "./standardErrors.ts";
import type { fitVerdict } from "./fitVerdict.ts";
import { compareGroupings } from "./compareGroupings.ts";
import type { orderLevels } from "./orderLevels.ts";
import { residualStructure } from "./residualStructure.ts";
import { blindCbSide, cbSideTopV, crossedCbSide, wholeCurveChoice } from "./blindCbSide.ts";
import { ecRestartedWhole, wholeCurveEcStarts, type valenceSpacingEcEV } from "./wholeCurveRestarts.ts";
import { startingValues } from "./startingValues.ts";
import { wholeCurveSplits } from "./wholeCurveSplits.ts";
import { peakStartWholeFits } from "./peakStartWholeFits.ts";
import { laterEntryWholeFits } from "./laterEntryWholeFits.ts";
import { unseenSPeakWholeFits } from "./unseenSPeakWholeFits.ts";
import { droppedPeakWholeFits, DROPPED_PEAK_DEFAULTS, valencePeaksV } from "./droppedPeakWholeFits.ts";
import { mergedPeakWholeFits, MERGED_PEAK_DEFAULTS } from "./mergedPeakWholeFits.ts";
import { ecGridWholeFits, EC_GRID_DEFAULTS } from "./ecGridWholeFits.ts";
import { cbSideEcLadderWholeFits, CB_SIDE_EC_LADDER_DEFAULTS } from "./cbSideEcLadderWholeFits.ts";
import { tunnelingEcStarts, TUNNELING_EC_STARTS_DEFAULTS } from "./tunnelingEcStarts.ts";
import { weightedWholeFits } from "./weightedWholeFits.ts";
import { structuredWholeSplit } from "./structuredWholeSplit.ts";
import { heldWholeValues } from "./heldWholeValues.ts";
import { tiedSplitRefinement } from "./tiedSplitRefinement.ts";
import { tiedWholeChoice } from "./tiedWholeChoice.ts";
import { penaltyTiedWholeChoice } from "./penaltyTiedWholeChoice.ts";
import type { rateRatioLimit } from "./rateRatioLimit.ts";
import { ecProfile } from "./ecProfile.ts";
import { fitRecord } from "./fitRecord.ts";
import type { CurveFit } from "./curveFit.ts";
import { FIT_DEFAULTS } from "./fitDefaults.ts";

export { FIT_DEFAULTS };
export type { CurveFit, FitAlternative, FittedLevel, FittedValue, FitWork } from "./curveFit.ts";
/** Options of {@link fitCurve}. */
export interface FitOptions {
  /** Voltage-division factor η, 0 < η ≤ 1 (held fixed: one curve barely constrains it). Default: the analysis' η. */
  eta?: number;
  /** Temperature in K (sets the thermal step width; barely matters next to the broadening). Default: FIT_DEFAULTS.temperatureK (4.5). */
  temperatureK?: number;
  /** Most Levenberg–Marquardt iterations. Default: FIT_DEFAULTS.maxIterations (60). */
  maxIterations?: number;
  /**
   * The work budget: most model evaluations of the whole fit (all starts and hypotheses); where it is reached the fit stops
   * the same way on every machine, says so, and is at best poor. Its other part, FIT_DEFAULTS.maxEliminationSteps, weighs
   * what the evaluations solve. Default: FIT_DEFAULTS.maxEvaluations.
   */
  maxEvaluations?: number;
  /** Opt-in wall-clock limit in ms: where it stops the fit depends on the machine and its load. Default: none. */
  timeLimitMs?: number;
  /** Most data points used (the curve is thinned evenly beyond this). Default: FIT_DEFAULTS.maxPoints (800). */
  maxPoints?: number;
  /** Starting charging energy in eV where the peaks do not give one (shell tunnelling). Default: FIT_DEFAULTS.chargingEnergyGuessEV (0.1). */
  chargingEnergyGuessEV?: number;
  /**
   * Also fit the other regimes' groupings of the same peaks (shell filling and shell tunnelling
   * forced), each from every rate-ratio start, and keep the best by BIC; without it only the
   * assignment's own grouping is fitted (from the whole rate-ratio grid when its first fit does not
   * describe the curve). Slower: a grouping with many single levels has a large state space.
   * Default: FIT_DEFAULTS.compareModels (false).
   */
  compareModels?: boolean;
}

/**
 * Fits the model of a dot in a double-barrier junction to one measured curve, starting from its
 * peak-based analysis.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     The peak-based analysis of the curve ({@link analyzeCurve}): its conductance record (bias in
 *     V, current in A, current noise in A), assignment and settings.
 * options : FitOptions, optional
 *     eta (default the analysis' η); temperatureK (K, default 4.5); maxIterations (default 60);
 *     maxEvaluations (default 22,000); timeLimitMs (ms, default none); maxPoints (default 800);
 *     chargingEnergyGuessEV (eV, default 0.1); compareModels (default false: compare only where
 *     the rules are not decisive). Defaults in {@link FIT_DEFAULTS}.
 *
 * Returns
 * -------
 * CurveFit
 *     Each fitted level (energy in eV and referred to bias in V), Ec (eV and V), Γtip/Γsub, Γsub
 *     (1/s), the broadening (eV), offset (A) and background, all with standard errors; the
 *     reduced χ², the regime the fitted rate ratio implies and why, the hypothesis the values
 *     come from, every run tried (`alternatives`, with BIC, plausibility and weight), the
 *     evidence in words, the residuals, whether it converged and why it stopped, and warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `fit/no-levels` when the assignment gives no level to fit; `fit/too-many-states` when the
 *     assignment's grouping is the only one to fit and has more charge states in a band than
 *     SCENARIO_DEFAULTS.maxStates (1200; e.g. a dozen single VB levels where the rules found no
 *     CB level); `options/unknown-key`,
 *     `options/not-positive`, `options/not-finite`, `options/out-of-range` (η outside (0, 1]),
 *     `options/not-integer` (maxEvaluations not a whole number ≥ 1) for a bad option.
 *
 * Notes
 * -----
 * The stages are the modules of lib/model/fit (its index.ts lists them in this order).
 * 1. Start ({@link levelsToFit}, {@link startingValues}): the levels, their degeneracies and Ec from the assignment (shell filling: one level
 *    per multiplet or sub-group, ε = η·V_first − Ec·(N_before + ½); shell tunnelling: one level
 *    per peak, ε = η·V − Ec/2, Ec from `chargingEnergyGuessEV`); rate ratio 10 (filling),
 *    0.02 (tunnelling) or 1; broadening from the measured peak width.
 * 2. Model ({@link parameterModel}, {@link bandStepsMemo}, {@link projectLinear}): the fast form of the orthodox master equation (zero-temperature plateaus joined by
 *    Gaussian-broadened steps, {@link fastCurrent}) plus offset + b1·V + b3·V³. The rate scale,
 *    offset and background enter linearly and are solved by least squares inside every model
 *    evaluation (variable projection); Levenberg–Marquardt adjusts the level energies, Ec,
 *    log₁₀(Γtip/Γsub) and the broadening on residuals scaled by the current noise.
 * 3. Iterations ({@link levenbergMarquardtLoop}): stops when χ² improves by less than 1e-5 (relative) over 4 iterations, after maxIterations,
 *    or when the fit's work budget (maxEvaluations model evaluations over all runs, or
 *    FIT_DEFAULTS.maxEliminationSteps master-equation elimination steps, {@link ladderSolveWork},
 *    whichever comes first) or the opt-in timeLimitMs is spent (then later runs keep their starts, `work.stoppedBy` says which, a
 *    warning says so and the status is at best poor). A late whole-curve stage's run (note 5) stopped by the
 *    budget is not the fit's stop: that stage only searched for a better fit than the one found.
 * 4. Standard errors ({@link standardErrors}) from the Jacobian of all parameters at the optimum:
 *    cov = (JᵀJ)⁻¹·max(1, χ²_red) on noise-scaled residuals (common practice: scale by the
 *    reduced χ² when the model does not reach the noise); a parameter that does not move the
 *    model on the points fitted (p beyond a CB side that ends after the s doublet) is reported
 *    undetermined (NaN) alone, the others' errors from the rest of JᵀJ. Where the satellite steps r/(1 + r) are at most 5 %, Ec's error comes
 *    from a χ² profile over it ({@link ecProfile}): a lower χ² moves the fit, a flat profile leaves Ec undetermined (NaN, a warning in words).
 * 5. Comparison ({@link fitHypotheses}, {@link bayesianInformationCriterion},
 *    {@link hypothesisPlausibility}): when the rules left the regime undetermined, or the
 *    assignment's fit has a reduced χ² above FIT_DEFAULTS.decisiveChiSquare (2), structured
 *    residuals or an Ec far from the peak-based one (see decisiveChiSquare), or
 *    compareModels is set, the groupings of the CB peaks (the regimes forced; charging ladders
 *    with p whole, 2+4 or 2+2+2, in filling order or entered from the empty dot) are each
 *    explored for exploreIterations (8) from their starts on the CB side of the curve (bias > 0,
 *    up to cbSideResonanceMarginFwhm (2) FWHM below the first VB level's substrate-junction
 *    crossing η·|V₁|/(1 − η), which at low η falls among the CB steps ({@link cbSideEndV});
 *    where that end would leave out p, the first hole's entry is held in every CB-side model
 *    instead, at the energy its peak gives, and the side ends below the next entry's crossing,
 *    cbSideHeldHole, {@link heldHoleEntry}, {@link heldValenceLevels}):
 *    the VB reading, which they share, stays out of the comparison; a start whose reduced χ²
 *    after the first 4 is above exploreDropRatio (4) times the best is not explored further); the best
 *    finishedHypotheses (3) by BIC = χ² + k·ln n are finished there (a finalist above reduced χ² shiftChiSquare (2) is also
 *    run with every CB start shifted by −Ec and by +Ec, for a first charging peak missed or one
 *    too many, and the better by BIC kept); the best refinedGroupings (2) of them are refined (the
 *    second not when it ended at the same fit as the first, {@link sameFit})
 *    ({@link refineGrouping}, {@link refinementStarts}: the p shell split 2+4 or 2+2+2 about the
 *    fitted p level (and 2+2+2 at the peak-based Ec when lower), a p sub-level of 4 split 2+2, the rate ratio × 1/3 and × 3;
 *    in the first round also p split 2+4 and 2+2+2 at the spacings the peaks show, with Γtip/Γsub
 *    from the s doublet's step ratio, {@link splitGridStarts}; each explored for
 *    refinementIterations (4) from the fitted values, the best two finished and the better kept as a further
 *    finalist when its BIC is lower), and the best again while it is a refined one
 *    (refinementRounds (2) rounds in all); where the best is then still poor (reduced χ² above 3
 *    or residual structure above 5 σ on the CB side), once more from p split at the peaks'
 *    spacings counted from the first CB peak after the s doublet (`firstPeakAfterS` of
 *    {@link splitGridStarts}: a p level settled one entry off); the finalists are then fitted to the whole
 *    curve with each reading of the VB peaks (the best kept; where none fits as well as the CB
 *    side, also with each VB level after the first entered one carrier earlier,
 *    {@link laterEntryReadings}, then as a doublet and a level of four, {@link shellValenceReading},
 *    each kept only where it does and is plausible) ({@link compareGroupings}), and checked for plausibility (on
 *    the CB side, and on the whole curve where that fit describes it; a whole-curve Ec or
 *    Γtip/Γsub on its bound counts only where the CB side's is on its bound too: otherwise it is
 *    the VB reading that does not fit with the CB values: see the held values below). The lowest CB-side BIC
 *    among the plausible finalists wins (where the CB side is blind to p, the s doublet alone on
 *    it, at most blindSidePeaks (2) peaks before the first hole's crossing, {@link blindCbSide}:
 *    every grouping fits it and their BICs differ by their parameter counts alone; or where it
 *    runs to the curve's end though the first VB crossing lies on it, {@link crossedCbSide}, its
 *    models then holding the VB peaks' shell reading, {@link heldShellLevels}, and its charging
 *    ladders also started from the VB peaks' own spacing, {@link valenceSpacingEcEV}: so the
 *    best blindSideGroupings (5) groupings explored are fitted to the whole curve and the
 *    lowest whole-curve BIC among those that reach reduced χ² wholeCurveChiSquare (3) without
 *    residual structure and are plausible wins (the assignment's own whole-curve run looked at too, blindSideAssigned), their whole-curve BICs the weights,
 *    {@link wholeCurveChoice}); where the winner's whole-curve fit has reduced χ² above
 *    wholeCurveChiSquare (3) and wholeCurveRatio (2) times the CB side's, it is fitted again with
 *    every reading from other Ec starts ({@link wholeCurveEcStarts}: the rules' Ec, the VB peaks'
 *    own spacing, the CB side's × ½, ⅔, 3⁄2: a CB side that ends near the s doublet may fit a
 *    wrong ladder to the noise), and the best by BIC of those that reach wholeCurveChiSquare
 *    without residual structure and are plausible replaces it (a warning says so); where none does at η < 1, the best whole-curve fit so far with its
 *    p level split ({@link wholeCurveSplits}; the split grouping then fitted on the CB side from it), or else each compared grouping fitted to the whole curve from its own peak-based starts ({@link peakStartWholeFits}), or else (wherever the whole curve's reduced χ² is above wholeCurveChiSquare) the same with the VB level of four entered at each later VB peak and the best such fit's p split ({@link laterEntryWholeFits}: a resonance or spurious peak taken for its entry), or else the filling-order ladder read with one of s's two charging peaks unseen ({@link unseenSPeakWholeFits}: a CB-edge peak missing from the peak list), or else with one CB charging peak read as a VB level's unlabelled resonance ({@link droppedPeakWholeFits}), or else from a grid of Ec starts below a quarter of the gap with the CB and VB peaks read by each one's ladder ({@link ecGridWholeFits}: no peak spacing gives an Ec near the optimum), or else matched to the CB peaks among resonances, peaks passed over read as resonances alone and a sub-level without peaks placed midway ({@link mergedPeakWholeFits}), or else the same at the CB side's Ec where the VB spacing gave another, the VB peaks matched alike ({@link cbSideEcLadderWholeFits}), or else, for a shell-tunnelling reading whose whole curve is not described (reduced χ² or residual structure), the same reading from a grid of Ec starts with each level's first entry kept at its peak ({@link tunnelingEcStarts}), does, if it reaches the same bar (and where the winner's whole-curve fit is within wholeCurveChiSquare but its residuals show structure, it is split likewise and the split replaces it at a lower whole-curve BIC, {@link structuredWholeSplit}, as also where a CB-side refinement of the winner with its p split ties with it, {@link tiedSplitRefinement}; before these, where the winner's whole-curve fit is within wholeCurveChiSquare with residual structure left and a CB-side finalist tied with it has a whole-curve fit that describes the curve, that finalist wins, {@link tiedWholeChoice}, as does a CB-side run whose χ² ties with the winner's and that is behind by its parameter penalty alone, where its whole-curve fit describes the curve at a lower whole-curve BIC, {@link penaltyTiedWholeChoice}); its whole-curve values stand unless their reduced χ² is
 *    above wholeCurveChiSquare (3) and wholeCurveRatio (2) times the CB side's, or their residuals show structure ({@link residualStructure}, above FIT_STATUS_DEFAULTS.poorResidualZ, 5) only outside the CB side's points while the CB side's show none (then the CB-side values, a
 *    warning says so: no reading of the VB peaks fits with them); when the whole-curve Ec or log₁₀ Γtip/Γsub lies more than
 *    wholeCurveEcSigmas (1) combined standard errors from the CB side's and the CB side, its levels
 *    refitted with them held, rises by more than wholeCurveCbChiSquare (5.99, the 95 % point of χ²
 *    for two parameters; within it the two agree and the whole curve's values stand, said in a
 *    warning), the whole curve is also fitted with Ec and Γtip/Γsub held at the CB side's values ({@link heldWholeValues}).
 *    The held fit stands (with the CB side's errors for the two, said in a warning and the
 *    evidence) only where the free whole-curve fit's residuals show structure (above
 *    poorResidualZ) that the held fit's do not: the free fit then missed a step the CB side's
 *    values place. Otherwise the whole curve's values stand, and a warning says that the CB side
 *    disagrees with them (on the crossover's simulated curves, holding elsewhere made no fit meet
 *    the accuracy bar that missed it free, and some that met it free miss it). An assignment with more than maxAssignedStates (100) charge
 *    states in a band is not fitted when groupings can be compared instead. Without a rival, the assignment alone
 *    is restarted from Γtip/Γsub = 0.01 … 100 (rateRatioStartsLog10) when it does not describe
 *    the curve. Every other CB-side finalist that carries BIC weight is fitted to the whole curve too, for the answer it gives there ({@link weightedWholeFits}, `FitAlternative.wholeCurve`).
 * 6. Verdict ({@link fitVerdict}): the regime from the fitted Γtip/Γsub and its error: shell
 *    filling at ≥ FIT_DEFAULTS.fillingRatioMin (1.5), shell tunnelling at ≤
 *    FIT_DEFAULTS.tunnelingRatioMax (3/7), intermediate between ({@link REGIME_LIMITS});
 *    undetermined when the regimeSigmas (2) σ range reaches both, or there is no fit. Where
 *    Γtip/Γsub ran onto a bound (10⁻⁴, 10⁴: deep in a regime the steps no longer change with it),
 *    the one-sided 95 % limit the curve sets on it ({@link rateRatioLimit}, profiled from the
 *    bound, on whole-curve fits only) reads the regime instead when it lies inside one, and is
 *    reported (`rateRatioLimit`). Γtip/Γsub alone on a bound does not make a whole-curve fit
 *    implausible (with Ec too it does); on the CB side it does, unless the grouping's whole-curve
 *    fit describes the curve and is plausible (on the low-η benchmark, CB-side fits on the bound
 *    that the whole curve rejected were wrong groupings). A reduced
 *    χ² above FIT_DEFAULTS.poorFitChiSquare (10) gives a warning; the status is
 *    {@link fitStatus}'s, "failed" also when no hypothesis is plausible. It looks beyond the
 *    reduced χ²: residuals with structure over a peak's width ({@link residualStructure}; a
 *    run of one sign above 5 σ, where the model misses, adds or misplaces a step) and, where the
 *    rules and the fit both read a charging ladder with p whole, an Ec more than 5 combined σ from
 *    the peak-based Ec make it poor, with the reason in words (a fit with p split into sub-levels
 *    reads another ladder than the rules' one over p: a warning says its Ec is not compared).
 * The model current is the fast one throughout; for speed, each band's steps are solved only over
 * the data's bias range, once per distinct band parameters and shared by all runs, and each
 * zero-temperature plateau once per rate matrix ({@link bandStepsMemo}): the same current to
 * round-off.
 * The levels of a split p shell are reported in energy order ({@link orderLevels}).
 * η is not fitted: one curve barely constrains it (it trades off against every level energy).
 *
 * References
 * ----------
 * K. Levenberg, "A method for the solution of certain non-linear problems in least squares",
 * Q. Appl. Math. 2, 164 (1944); D. W. Marquardt, "An algorithm for least-squares estimation of
 * nonlinear parameters", J. SIAM 11, 431 (1963); G. H. Golub and V. Pereyra, "The
 * differentiation of pseudo-inverses and nonlinear least squares problems whose variables
 * separate", SIAM J. Numer. Anal. 10, 413 (1973) (variable projection); G. Schwarz, "Estimating
 * the dimension of a model", Ann. Stat. 6, 461 (1978) (BIC).
 *
 * Example
 * -------
 * ```ts
 * const sim = simulateCurve({ cb: [{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }],
 *   vb: [{ energyEV: -1.2, degeneracy: 2 }], chargingEnergyEV: 0.1, eta: 0.85, tipRatePerS: 1e9,
 *   substrateRatePerS: 1e8, temperatureK: 4.5, broadeningEV: 0.01,
 *   bias: { fromV: -2, toV: 2.2, stepV: 0.002 }, noise: { relative: 0.003, seed: 1 } }, { method: "fast" });
 * const curve = { biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "demo", metadata: {} } };
 * const fit = fitCurve(analyzeCurve(curve, { eta: 0.85 }));
 * fit.regime;                       // => "shell-filling"
 * fit.chargingEnergyEV;             // => { value: 0.1000, standardError: 0.00009 } (eV; simulated 0.1)
 * fit.rateRatio.value;              // => 10.1 (± 0.15; simulated 10)
 * fit.levels.map((l) => l.energyEV.value); // => [0.6001, 0.9001, -1.2000] (eV; simulated 0.6, 0.9, −1.2)
 * ```
 */
export function fitCurve(analysis: CurveAnalysis, options: FitOptions = {}): CurveFit {
  checkKnownKeys("fit options", options, ["eta", "temperatureK", "maxIterations", "maxEvaluations", "timeLimitMs", "maxPoints", "chargingEnergyGuessEV", "compareModels"]);
  const F = FIT_DEFAULTS;
  const eta = options.eta === undefined ? analysis.assignment.energies.eta : checkEta("eta", options.eta);
  const temperatureK = checkPositive("temperatureK", options.temperatureK ?? F.temperatureK);
  const maxIterations = checkPositive("maxIterations", options.maxIterations ?? F.maxIterations);
  const maxEvaluations = checkInteger("maxEvaluations", options.maxEvaluations ?? F.maxEvaluations, 1);
  const timeLimitMs = options.timeLimitMs === undefined ? null : checkPositive("timeLimitMs", options.timeLimitMs);
  const maxPoints = checkPositive("maxPoints", options.maxPoints ?? F.maxPoints);
  const compareModels = options.compareModels ?? F.compareModels;
  const guessEC = options.chargingEnergyGuessEV ?? F.chargingEnergyGuessEV;
  const warnings: string[] = [];
  if (!analysis.assignment.energies.etaGiven && options.eta === undefined) warnings.push("eta not given: the fit used η = 1");

  // 1. Hypotheses: the assignment as it stands first; the others (regimes forced, charging
  // ladders with p whole or split) only when they are compared.
  const hypotheses = fitHypotheses(analysis, eta, true);
  if (!hypotheses.length || hypotheses[0].kind !== "assigned") {
    throw new DotspecError("fit/no-levels", `${analysis.source}: the assignment has no multiplets to start the fit from (regime ${analysis.assignment.regime}); nothing to fit`);
  }

  // Data, thinned evenly: the same points and the same noise σ for every hypothesis; the CB side
  // (bias > 0, below the first VB crossing) alone for comparing groupings of the CB peaks. Band solutions are shared by every
  // run: hypotheses that share a band's levels, and the runs of one hypothesis (explored,
  // finished, fitted to the whole curve), solve it once.
  const runner = fitRunner(analysis, { eta, temperatureK, maxPoints, maxEvaluations, maxEliminationSteps: F.maxEliminationSteps, timeLimitMs, maxIterations, chargingEnergyGuessEV: guessEC, chunkIterations: F.chunkIterations, convergenceTolerance: F.convergenceTolerance, cbSideMarginFwhm: F.cbSideResonanceMarginFwhm, cbSideHeldHole: F.cbSideHeldHole });
  const { all, cbSide, noiseA, run, projectorOf, bandStore, reduced, work } = runner;
  /** The larger part of the work budget spent so far (evaluations or elimination steps), 0–1. */
  const budgetSpent = () => Math.max(work().evaluations / maxEvaluations, work().eliminationSteps / F.maxEliminationSteps);

  // 2. Starts. The assignment's hypothesis from its own rate ratio first. When that does not
  // describe the curve, or the rules left the regime undetermined (or when asked to compare),
  // the groupings of the CB peaks are compared on the CB side of the curve (where they differ;
  // the VB reading stays out of the comparison): each explored from its starts, the best few
  // finished there, then each finalist fitted to the whole curve with each reading of its VB
  // peaks, checked for plausibility; the lowest BIC among the plausible ones wins.
  const explore = Math.min(maxIterations, F.exploreIterations);
  const undetermined = analysis.assignment.regime === "undetermined";
  const alone = hypotheses.length === 1;
  const trials: FitTrial[] = [];
  // When the rules left the regime undetermined, their grouping (single levels) is fitted to the
  // whole curve only if no grouping of CB peaks can be compared with it.
  const comparable = hypotheses.some((h) => h.seeds.some((x) => x.band === "CB"));
  // An assignment too large to fit in time (many degenerate single levels) is left to the
  // comparison when there is one.
  const tooLarge = hypotheses[0].states > F.maxAssignedStates && !alone && comparable;
  const runAssigned = (!undetermined && !tooLarge) || alone || !comparable;
  if (runAssigned && hypotheses[0].states > SCENARIO_DEFAULTS.maxStates) {
    const count = (band: "CB" | "VB") => hypotheses[0].seeds.filter((x) => x.band === band).length;
    throw new DotspecError(
      "fit/too-many-states",
      `${analysis.source}: the assignment's levels (regime ${analysis.assignment.regime}; ${count("CB")} CB and ${count("VB")} VB levels) make ${hypotheses[0].states} charge states in one band, more than the ${SCENARIO_DEFAULTS.maxStates} the master equation solves, and no grouping of CB peaks can be fitted instead; nothing to fit`,
    );
  }
  if (runAssigned) trials.push(run(hypotheses[0], null, maxIterations));
  const assignedTrial = trials.length ? trials[0] : null;
  // Nor is it decisive when the status would call it poor for what the reduced χ² hides: structured
  // residuals, or an Ec far from the peak-based one.
  const structureOf = (t: FitTrial) => {
    const model = projectorOf(t.set)(runner.currentOf(t.hypothesis)(t.loop.parameters, t.set.biasV)).out;
    return residualStructure(t.set.biasV, t.set.dataA.map((v, i) => v - model[i]), noiseA, analysis.settings.peakWidthMV / 1000);
  };
  /** A whole-curve fit describes the curve: reduced χ² at most wholeCurveChiSquare and no residual structure. */
  const describes = (t: FitTrial) => reduced(t) <= F.wholeCurveChiSquare && structureOf(t).largestZ <= FIT_STATUS_DEFAULTS.poorResidualZ;
  const hidden = (t: FitTrial) => {
    const z = structureOf(t).largestZ;
    const peakEc = peakChargingEnergy(analysis, eta);
    const ec = t.loop.parameters[parameterIndex(t.hypothesis.seeds.length).chargingEnergy];
    return z > FIT_STATUS_DEFAULTS.poorResidualZ || (peakEc !== null && Math.abs(ec - peakEc.valueEV) > FIT_STATUS_DEFAULTS.poorChargingSigmas * peakEc.standardErrorEV);
  };
  const decisive = assignedTrial !== null && !undetermined && reduced(assignedTrial) <= F.decisiveChiSquare && !hidden(assignedTrial);
  const compared = (compareModels || !decisive) && !alone && comparable;
  const finals: FitTrial[] = assignedTrial ? [assignedTrial] : [];
  /** Whole-curve fit → the CB-side fit it was started from. */
  const cbSideOf = new Map<FitTrial, FitTrial>();
  /** Fits a CB-side finalist to the whole curve (set where groupings are compared). */
  let wholeFitOf: ((cbDone: FitTrial, ecStartEV?: number) => FitTrial) | null = null;
  // Γtip/Γsub alone on a bound is deep in a regime on the whole curve (its limit read on the answer,
  // rateRatioLimit); on the CB side it is a claim the whole curve must bear out (excused below).
  const ratioBound = boundReason("Γtip/Γsub");
  const ratioOnlyBound = (t: FitTrial) => plausibilityInput(t).atBound.join() === "Γtip/Γsub";
  const plausibilityOf = (t: FitTrial) => (t.implausible ??= hypothesisPlausibility(plausibilityInput(t)));
  if (!compared && !decisive && assignedTrial) {
    // The assignment alone: restarts from the rate-ratio grid.
    const startLog0 = assignedTrial.start.initialValues[parameterIndex(hypotheses[0].seeds.length).logRateRatio];
    for (const logRatio of F.rateRatioStartsLog10.filter((l) => Math.abs(l - startLog0) >= 0.5)) trials.push(run(hypotheses[0], logRatio, explore));
    const bestStart = trials.reduce((x, y) => (y.bic < x.bic ? y : x));
    if (bestStart !== assignedTrial) {
      const done = continueRun(run, bestStart, maxIterations, undefined, { hypothesis: hypotheses[0] });
      trials.push(done);
      finals.push(done);
    }
  }
  let curveTopV = -Infinity;
  for (const v of all.biasV) curveTopV = Math.max(curveTopV, v);
  // A CB side that runs to the curve's end across the VB crossings: held VB levels, whole-curve choice.
  const crossed = crossedCbSide(analysis.peaks, cbSide.biasV, eta, curveTopV);
  if (compared) {
    const poorOf = (t: FitTrial) => reduced(t) > FIT_STATUS_DEFAULTS.poorChiSquare || structureOf(t).largestZ > FIT_STATUS_DEFAULTS.poorResidualZ;
    wholeFitOf = compareGroupings({ hypotheses, run, cbSide, reduced, trials, finals, cbSideOf, plausibilityOf, eta, maxIterations, exploreIterations: explore, chargingEnergyGuessEV: guessEC, peakChargingEnergyEV: peakChargingEnergy(analysis, eta)?.valueEV ?? null, limits: F, poorOf, crossedSide: crossed, cutSide: cbSideTopV(cbSide.biasV) < curveTopV });
  }
  const poor = (t: FitTrial) => reduced(t) > F.poorFitChiSquare;
  // The finalists: when groupings were compared, their CB-side fits (all on the same points),
  // each implausible by its CB side or by its whole-curve fit where that one describes the curve;
  // otherwise the assignment's whole-curve runs.
  const wholeOf = new Map([...cbSideOf].map(([whole, cb]) => [cb, whole]));
  const finalists = wholeOf.size ? finals.filter((t) => t.side === "CB") : finals;
  // A whole-curve fit whose Ec or Γtip/Γsub ran onto a bound while its CB side's stayed inside is
  // a VB reading that does not fit with the CB values (tried held at the CB side's below), not a
  // degenerate grouping: its bound does not count against the grouping.
  const wholePlausibility = (whole: FitTrial, cb: FitTrial) =>
    plausibilityInput(cb).atBound.length ? plausibilityOf(whole) : hypothesisPlausibility({ ...plausibilityInput(whole), atBound: [] });
  const implausibleOf = (t: FitTrial) => {
    const whole = wholeOf.get(t);
    const wholeReasons = whole ? wholePlausibility(whole, t) : [];
    // A CB side on the ratio's bound whose whole-curve fit describes the curve and is plausible: deep in the regime the whole curve reads.
    const excused = whole && t.side === "CB" && ratioOnlyBound(t) && !wholeReasons.length && describes(whole);
    return [...plausibilityOf(t).filter((r) => !excused || r !== ratioBound), ...(whole && !poor(whole) ? wholeReasons : [])];
  };
  const plausible = finalists.filter((t) => implausibleOf(t).length === 0);
  const pool = plausible.length ? plausible : finalists;
  // The lowest BIC; within bicTieMargin of it, the hypothesis listed first (the assignment before the forced regimes before the ladders): readings that reach the same levels are one model.
  const lowest = Math.min(...pool.map((t) => t.bic));
  // Retried and refined groupings come after every listed one.
  const order = (t: FitTrial) => {
    const k = hypotheses.findIndex((h) => h.name === t.hypothesis.name.replace(/ [\u2212+]Ec$/, ""));
    return k < 0 ? hypotheses.length : k;
  };
  let winner = pool.filter((t) => t.bic - lowest < F.bicTieMargin).reduce((x, y) => (order(y) < order(x) ? y : x));
  // A CB side that ends before p tells the groupings apart by their parameter counts alone, and
  // one across the VB crossings by held VB levels read from the peaks: the best few groupings'
  // whole-curve fits decide instead (the lowest whole-curve BIC).
  let blindWholeBic: Map<FitTrial, number> | null = null;
  if (wholeFitOf && (crossed || blindCbSide(analysis.peaks, cbSide.biasV, F.blindSidePeaks, curveTopV))) {
    // The assignment's own whole-curve run (already made) is looked at too, for its CB side ({@link wholeCurveChoice}, note 3).
    const assignedCb = F.blindSideAssigned && assignedTrial?.side === "both" ? trials.filter((t) => t.side === "CB" && t.hypothesis.kind === "assigned").reduce<FitTrial | null>((x, y) => (!x || y.bic < x.bic ? y : x), null) : null;
    const always = assignedCb ? { cb: assignedCb, whole: wholeOf.get(assignedCb) ?? assignedTrial! } : null;
    const wholeFor = (t: FitTrial) => {
      let w = wholeOf.get(t);
      if (!w) {
        w = wholeFitOf!(t);
        cbSideOf.set(w, t);
        wholeOf.set(t, w);
      }
      return w;
    };
    const candidates = trials.filter((t) => t.side === "CB" && plausibilityOf(t).length === 0);
    const choice = wholeCurveChoice(candidates, wholeFor, (w, cb) => wholePlausibility(w, cb).length === 0 && describes(w), F.blindSideGroupings, always);
    if (always && choice.wholeBic.has(always.cb) && !wholeOf.has(always.cb)) (cbSideOf.set(always.whole, always.cb), wholeOf.set(always.cb, always.whole));
    if (choice.chosen) {
      winner = choice.chosen;
      blindWholeBic = choice.wholeBic;
      for (const t of choice.wholeBic.keys()) if (!finalists.includes(t)) finalists.push(t);
      // The choice is plausible on both sides even where no finalist of the CB-side search was.
      for (const t of choice.wholeBic.keys()) if (!plausible.includes(t) && implausibleOf(t).length === 0) plausible.push(t);
    }
  }
  let whole = wholeOf.get(winner);
  if (!whole && wholeFitOf && winner.side === "CB") {
    // A tie went to a grouping whose whole-curve fit the search did not need (it stopped at a tied rival's): fit it now, so that the VB levels and the gap are not lost.
    whole = wholeFitOf(winner);
    cbSideOf.set(whole, winner);
    wholeOf.set(winner, whole);
  }
  // Where the CB side's Ec gives no whole-curve fit that describes the curve, the whole curve is fitted again from other Ec starts ({@link ecRestartedWhole}).
  if (whole && wholeFitOf && winner.side === "CB" && reduced(whole) > F.wholeCurveChiSquare && reduced(whole) > F.wholeCurveRatio * reduced(winner)) {
    const starts = wholeCurveEcStarts(winner.loop.parameters[parameterIndex(winner.hypothesis.seeds.length).chargingEnergy], peakChargingEnergy(analysis, eta)?.valueEV ?? null, valencePeaksV(analysis.peaks), eta);
    const better = ecRestartedWhole(starts, (ec) => wholeFitOf!(winner, ec), (t) => wholePlausibility(t, winner).length === 0 && describes(t));
    if (better) {
      warnings.push(`the whole curve started from the CB side's Ec stayed at reduced χ² ${reduced(whole).toPrecision(3)}; started from another Ec it reaches ${reduced(better).toPrecision(3)} at Ec ${(better.loop.parameters[parameterIndex(better.hypothesis.seeds.length).chargingEnergy] * 1000).toFixed(1)} meV`);
      (cbSideOf.set(better, winner), wholeOf.set(winner, better), (whole = better));
    }
  }
  // A CB-side tie whose winner's whole-curve fit does not describe the curve goes to a tied grouping's that does ({@link tiedWholeChoice}).
  const retied = whole && wholeFitOf && !blindWholeBic ? tiedWholeChoice({ winner, whole, plausible, wholeOf, cbSideOf, wholeFitOf, reduced, wholeCurveChiSquare: F.wholeCurveChiSquare, describes, acceptable: (w, cb) => wholePlausibility(w, cb).length === 0 }) : null;
  if (retied) (warnings.push(retied.note), ([winner, whole] = [retied.cb, retied.whole]));
  // A rival whose CB-side χ² ties with the winner's, behind by its parameter penalty alone, goes to the whole curve ({@link penaltyTiedWholeChoice}); the two then weighed by their whole-curve BICs.
  const finish = (t: FitTrial) => (t.finished ? t : (trials.push((t = continueRun(run, t, maxIterations, cbSide))), t));
  const carried = whole && wholeFitOf && !blindWholeBic && !retied ? penaltyTiedWholeChoice({ winner, whole, trials, finish, plausible: (t) => plausibilityOf(t).length === 0, wholeOf, cbSideOf, wholeFitOf, describes, reduced, wholeCurveChiSquare: F.wholeCurveChiSquare, acceptable: (w, cb) => wholePlausibility(w, cb).length === 0 }) : null;
  if (carried) (warnings.push(carried.note), finalists.push(carried.cb), plausible.push(carried.cb), (blindWholeBic = new Map([[winner, whole!.bic], [carried.cb, carried.whole.bic]])), ([winner, whole] = [carried.cb, carried.whole]));
  // At η < 1, p split on the whole curve (note 5): about the best whole-curve fit where none describes the curve ({@link wholeCurveSplits}; else the VB level of four entered later, {@link laterEntryWholeFits}, or an s peak unseen, {@link unseenSPeakWholeFits}, or a CB peak a resonance, {@link droppedPeakWholeFits}, or an Ec start from a grid, {@link ecGridWholeFits}, or the ladders matched among resonances, {@link mergedPeakWholeFits}, and at the CB side's Ec, {@link cbSideEcLadderWholeFits}, each while at most its maxBudgetSpent of the work budget is spent), about the winner's where it does but leaves residual structure ({@link structuredWholeSplit}); a split found wins.
  const split = { trials, run, cbSide, eta, exploreIterations: explore, maxIterations, reduced, describes, acceptable: (w: FitTrial, cb: FitTrial) => plausibilityOf(cb).length === 0 && wholePlausibility(w, cb).length === 0 };
  const adoptSplit = (f: { cb: FitTrial; whole: FitTrial }) => (finalists.push(f.cb), plausible.push(f.cb), cbSideOf.set(f.whole, f.cb), wholeOf.set(f.cb, f.whole), [f.cb, f.whole] as const);
  const poorWhole = !!whole && !!wholeFitOf && eta < 1 && winner.side === "CB" && reduced(whole) > F.wholeCurveChiSquare;
  // The stages search for a better fit than the one found: one that finds none before the budget is spent has not cut the fit short ({@link fitRunner}'s search).
  const stageSplit = { ...split, run: runner.search };
  const wholeContext = { ...stageSplit, heldVb: winner.hypothesis.heldVb, hypotheses: hypotheses.filter((h) => h.kind !== "assigned" || runAssigned), vbPeaksV: analysis.peaks.filter((x) => x.biasV < 0).map((x) => x.biasV) };
  // The peaks' biases with the second-junction resonances left out: the gap the Ec grids of tunnelingEcStarts and ecProfile span.
  const levelPeaksV = analysis.peaks.filter((x) => x.role !== "second-junction").map((x) => x.biasV);
  // The stages in order, each run only where every earlier one found nothing; the first found wins.
  const wholeStages = [
    ...(poorWhole && reduced(whole!) > F.wholeCurveRatio * reduced(winner) ? [() => wholeCurveSplits({ ...stageSplit, heldVb: winner.hypothesis.heldVb }), () => peakStartWholeFits(wholeContext)] : []),
    ...(poorWhole ? [() => laterEntryWholeFits(wholeContext), () => unseenSPeakWholeFits(wholeContext), () => (budgetSpent() <= DROPPED_PEAK_DEFAULTS.maxBudgetSpent ? droppedPeakWholeFits(wholeContext) : null), () => (budgetSpent() <= EC_GRID_DEFAULTS.maxBudgetSpent ? ecGridWholeFits(wholeContext) : null), () => (budgetSpent() <= MERGED_PEAK_DEFAULTS.maxBudgetSpent ? mergedPeakWholeFits(wholeContext) : null)] : []),
    // The same ladders matched at the CB side's Ec, where the VB spacing gave another ({@link cbSideEcLadderWholeFits}).
    ...(poorWhole ? [() => (budgetSpent() <= CB_SIDE_EC_LADDER_DEFAULTS.maxBudgetSpent ? cbSideEcLadderWholeFits({ ...wholeContext, cbSideEcEV: winner.loop.parameters[parameterIndex(winner.hypothesis.seeds.length).chargingEnergy], cbSideWinner: winner }) : null)] : []),
    // A tunnelling reading whose whole curve is not described: Ec starts from a grid, each level's first entry kept ({@link tunnelingEcStarts}).
    ...(whole && wholeFitOf && eta < 1 && winner.side === "CB" ? [() => (budgetSpent() <= TUNNELING_EC_STARTS_DEFAULTS.maxBudgetSpent ? tunnelingEcStarts({ ...stageSplit, whole: whole!, peaksV: levelPeaksV }) : null)] : []),
  ];
  let found: { cb: FitTrial; whole: FitTrial } | null = null;
  for (const stage of wholeStages) if ((found = stage())) break;
  if (found) {
    warnings.push(`no grouping's whole-curve fit from its CB side describes the curve; ${found.whole.hypothesis.label} does (reduced χ² ${reduced(found.whole).toPrecision(3)})`);
    [winner, whole] = adoptSplit(found);
    blindWholeBic = new Map([[winner, whole.bic]]); // only its whole-curve fit describes the curve: it alone carries weight, as on a blind side
  }
  const resplit = whole && wholeFitOf && eta < 1 && winner.side === "CB" ? structuredWholeSplit({ ...split, heldVb: winner.hypothesis.heldVb, whole, wholeCurveChiSquare: F.wholeCurveChiSquare, structureZ: (t) => structureOf(t).largestZ, tied: tiedSplitRefinement(winner, trials) }) : null;
  if (resplit) {
    warnings.push(resplit.note);
    blindWholeBic = new Map([...(blindWholeBic ?? [[winner, whole!.bic] as const]), [resplit.cb, resplit.whole.bic]]); // the split against the fit it replaced
    [winner, whole] = adoptSplit(resplit);
  }
  let best = whole ?? winner;
  // The whole-curve fit's residual structure, computed once (a whole-curve evaluation) where it is read.
  let wholeStructure: ReturnType<typeof structureOf> | null = null;
  // When no reading of the VB peaks fits together with the CB values, the result is the CB side
  // alone (its Ec, rate ratio and CB levels), said in a warning.
  if (whole && reduced(whole) > F.wholeCurveChiSquare && reduced(whole) > F.wholeCurveRatio * reduced(winner)) {
    warnings.push(
      `no reading of the VB peaks fits together with the CB values (reduced χ² ${reduced(whole).toPrecision(3)} over the whole curve, ${reduced(winner).toPrecision(3)} on the CB side): the values come from the CB side alone and no VB level is reported`,
    );
    best = winner;
  } else if (whole) {
    // Nor when the whole curve's residuals show structure only outside the points of the CB side,
    // whose own residuals show none: the VB reading misses its peaks, and the CB values stand.
    const wholeZ = (wholeStructure = structureOf(whole));
    const cbV = winner.set.biasV;
    const [fromV, toV] = [Math.min(cbV[0], cbV[cbV.length - 1]), Math.max(cbV[0], cbV[cbV.length - 1])];
    if (wholeZ.largestZ > FIT_STATUS_DEFAULTS.poorResidualZ && (wholeZ.atBiasV < fromV || wholeZ.atBiasV > toV) && structureOf(winner).largestZ <= FIT_STATUS_DEFAULTS.poorResidualZ) {
      warnings.push(
        `no reading of the VB peaks fits together with the CB values (the whole curve's residuals show structure near ${wholeZ.atBiasV.toFixed(3)} V, ${wholeZ.largestZ.toFixed(1)} σ > ${FIT_STATUS_DEFAULTS.poorResidualZ}, outside the CB side, whose residuals show none): the values come from the CB side alone and no VB level is reported`,
      );
      best = winner;
    }
  }
  // When the whole-curve fit moves Ec or Γtip/Γsub more than wholeCurveEcSigmas combined standard
  // errors from its CB side's and the CB side does not accept them, the whole curve is also fitted
  // with the two held at the CB side's values ({@link heldWholeValues}); that fit stands only where
  // it removes residual structure the free fit leaves.
  const currentOf = (t: FitTrial) => runner.currentOf(t.hypothesis);
  let errors = trialErrors(best, currentOf(best), noiseA, warnings);
  let heldNote: string | null = null;
  if (whole && best === whole) {
    const structureZ = (t: FitTrial) => (t === whole && wholeStructure ? wholeStructure : structureOf(t)).largestZ;
    ({ best, errors, heldNote } = heldWholeValues({ whole, winner, errors, run, all, maxIterations, currentOf, noiseA, structureZ, limits: F, trials, warnings }));
  }
  // Where the satellite steps are small, Ec from a χ² profile over it: a lower χ² moves the fit, a flat one leaves Ec undetermined ({@link ecProfile}).
  const fromCbSide = best === winner;
  ({ trial: best, errors } = ecProfile({ trial: best, errors, run: runner.search, maxIterations, currentOf, noiseA, eta, peaksV: levelPeaksV, budgetSpent, trials, warnings }));
  // On a blind CB side the whole-curve BICs weigh the groupings (the CB side's differ by k·ln n alone).
  const weights = evidenceWeights(finalists.map((t) => (blindWholeBic ? (blindWholeBic.get(t) ?? Infinity) : implausibleOf(t).length ? Infinity : t.bic)));
  const { hypothesis } = best;
  const { seeds } = hypothesis;
  const at = parameterIndex(seeds.length);
  const { parameters: params, iterations, converged, message } = best.loop;
  if (!converged) warnings.push(`the fit did not converge (${message}); the values are the best found so far`);
  const { stoppedBy, budgetPart, searchStopped } = work();
  const budgetWords = budgetPart === "evaluations" ? `${maxEvaluations} model evaluations` : `${F.maxEliminationSteps.toExponential(1)} master-equation elimination steps`;
  const cutShort = stoppedBy && `the fit was cut short at its ${stoppedBy === "budget" ? `work budget of ${budgetWords} (the same on every machine)` : `time limit of ${timeLimitMs} ms (where depends on the machine and its load)`}: runs after that kept their starts, a better fit may have been missed`;
  if (cutShort) warnings.push(cutShort);
  else if (searchStopped) warnings.push("a search for a better whole-curve reading stopped at the fit's work budget: the fit found stands, but a reading the search did not reach may describe the curve better");
  const wholeAnswers = wholeFitOf ? weightedWholeFits({ finalists, weights, wholeOf, wholeFitOf, describes: split.describes, reduced }) : new Map(); // the weighted groupings' own whole-curve answers, after the fit's result (its work counted, the budget's stop not)
  // The winner's whole-curve fit may have been replaced since plausibility was first read (other Ec starts): a CB side on the ratio's bound is read again against it.
  if (!plausible.includes(winner) && wholeOf.get(winner) === whole && ratioOnlyBound(winner) && implausibleOf(winner).length === 0) plausible.push(winner);
  if (!plausible.length) warnings.push(`no hypothesis tried is physically plausible (${implausibleOf(winner).join("; ")}); the values are those of the lowest BIC`);
  const evidence = fitEvidence(winner, finalists, assignedTrial, implausibleOf, compared, F.bicTieMargin);
  if (fromCbSide && whole) evidence.push("its values come from the CB side of the curve alone: no reading of the VB peaks fits together with them");
  if (heldNote) evidence.push(`its Ec and Γtip/Γsub come from the CB side of the curve: ${heldNote}`);
  if (hypothesis.kind !== "assigned" && (!assignedTrial || assignedTrial.side !== best.side || assignedTrial.bic - best.bic >= F.bicTieMargin)) {
    warnings.push(`${hypothesis.label} describes the curve better than the assignment it started from` + (assignedTrial ? ` (BIC lower by ${(assignedTrial.bic - best.bic).toFixed(0)})` : " (the assignment's single levels were too many to fit)"));
  }
  if (analysis.assignment.regime === "undetermined" && hypothesis.kind === "assigned") warnings.push("regime undetermined: the fit starts from single levels");

  // 3–4. Final values, the verdict, the status and the record ({@link fitRecord}).
  return fitRecord({ analysis, best, errors, eta, noiseA, assignedTrial, winner, plausible, implausibleOf, reduced, run, maxIterations, limits: F, cutShort: cutShort || null, evidence, warnings, trials, finalists, weights, wholeAnswers, work: () => ({ evaluations: work().evaluations, maxEvaluations, timeLimitMs, stoppedBy }) });
}
