/**
 * The comparison stage of a fit: the groupings of the CB peaks explored, finished, shifted and
 * refined on the CB side of the curve, then the finalists fitted to the whole curve with each
 * reading of the VB peaks until one is plausible.
 */
import type { FitHypothesis } from "./fitHypotheses.ts";
import { continueRun, type FitRun } from "./fitRunner.ts";
import type { DataSet, FitTrial } from "./fitTrial.ts";
import type { FIT_DEFAULTS } from "./fitDefaults.ts";
import { startingValues } from "./startingValues.ts";
import { SCENARIO_DEFAULTS, stateCount } from "../scenario.ts";
import { refineGrouping } from "./refineGrouping.ts";
import { sameFit } from "./sameFit.ts";
import { shiftGrouping } from "./shiftGrouping.ts";
import { laterEntryReadings } from "./laterEntryReadings.ts";
import { hiddenEntryReading, inFillingOrder, shellValenceReading } from "./shellValenceReading.ts";
import { seedKey, type LevelSeed } from "./levelsToFit.ts";
import { heldShellLevels, heldValenceLevels } from "./heldValenceLevels.ts";
import type { crossedCbSide } from "./blindCbSide.ts";
import { heldHoleEntry } from "./cbSideEnd.ts";
import { valencePeaksV } from "./droppedPeakWholeFits.ts";
import { levelAtReachEdge, recentredSeeds, valenceSpacingEcEV, WHOLE_CURVE_RESTART_DEFAULTS, type wholeCurveEcStarts } from "./wholeCurveRestarts.ts";

/** Constants of {@link compareGroupings} (locked by test/model/fit/laterEntryReadings.test.ts). */
export const COMPARE_GROUPINGS_DEFAULTS = Object.freeze({
  /**
   * A finalist whose best whole-curve fit ends above this many times its CB side's reduced χ² (or
   * 1, if that is lower), and at most FIT_DEFAULTS.poorFitChiSquare (10), is also fitted with the VB readings of {@link laterEntryReadings} (each
   * level after the first entered with one carrier before it; a run of six split 2 + 4), and such a
   * reading is kept only where it ends at or below the same limit and is plausible. A right
   * VB reading leaves the reduced χ² where the CB side has it (about 1 on the crossover benchmark,
   * which scatters by √(2/n) ≈ 0.05 over its 800 points); a VB level started one Ec away settled
   * 1.3–5 times higher there. Above poorFitChiSquare no reading comes near the curve and the
   * retries (a third of all whole-curve fits on `bench:fit`, seeds 1–60; without them every count
   * there is the same) cost 6 % of the model evaluations.
   */
  vbRetryRatio: 1.2,
});

/** What {@link compareGroupings} works with: fitCurve's hypotheses, runs and settings. */
export interface CompareContext {
  /** Every hypothesis, the assignment's first. */
  hypotheses: readonly FitHypothesis[];
  /** One Levenberg–Marquardt run ({@link FitRun}). */
  run: FitRun;
  /** The CB side of the curve (bias > 0, below the first VB level's substrate-junction crossing). */
  cbSide: DataSet;
  /** Reduced χ² of a run. */
  reduced: (t: FitTrial) => number;
  /** Every run tried; the comparison's runs are added. */
  trials: FitTrial[];
  /** The finalists so far (the assignment's run, if any); the comparison's finalists are added. */
  finals: FitTrial[];
  /** Whole-curve fit → the CB-side fit it was started from; filled here. */
  cbSideOf: Map<FitTrial, FitTrial>;
  /** The plausibility check of a run (its reasons; empty: plausible). */
  plausibilityOf: (t: FitTrial) => string[];
  /** Voltage-division factor η. */
  eta: number;
  /** Iterations of a finishing run. */
  maxIterations: number;
  /** Iterations of an explored start. */
  exploreIterations: number;
  /** Starting Ec where the peaks give none, eV. */
  chargingEnergyGuessEV: number;
  /** The peak-based Ec in eV (the rules' shell-filling Ec) or null. */
  peakChargingEnergyEV: number | null;
  /** fitCurve's constants ({@link FIT_DEFAULTS}). */
  limits: typeof FIT_DEFAULTS;
  /** Whether a CB-side run is poor by fitStatus' reduced-χ² or residual-structure limit (absent: no rescue). */
  poorOf?: (t: FitTrial) => boolean;
  /**
   * Whether the CB side runs to the curve's end across the VB levels' crossings
   * ({@link crossedCbSide}): its hypotheses then hold the VB shell reading ({@link heldShellLevels}).
   * Default false.
   */
  crossedSide?: boolean;
  /** Whether the CB side ends below the curve's end (cut below a VB level's crossing). Default false. */
  cutSide?: boolean;
}

/**
 * Compares the groupings of the CB peaks (fitCurve's notes, step 5).
 *
 * Parameters
 * ----------
 * stage : CompareContext
 *     The hypotheses, the run function, the CB side of the curve, the lists it adds to, η, the
 *     iteration budgets, the peak-based Ec and fitCurve's constants.
 *
 * Returns
 * -------
 * (cbDone: FitTrial, ecStartEV?: number) => FitTrial
 *     The function that fits a CB-side finalist to the whole curve with each reading of its VB
 *     peaks and keeps the best (for a winner whose whole-curve fit the search did not need); with
 *     ecStartEV, every reading starts from that Ec (eV) instead of the CB side's, the CB levels
 *     placed by it from their peaks, the rate ratio and broadening the CB side's
 *     ({@link wholeCurveEcStarts}).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Each hypothesis with CB levels (at most maxAssignedStates charge states) becomes a CB-side
 *    hypothesis (holding the first hole's entry where it falls on the CB side, FIT_DEFAULTS.cbSideHeldHole,
 *    {@link heldValenceLevels}; on a side that runs to the curve's end across the VB crossings,
 *    `crossedSide`, the VB peaks' shell reading from the hypothesis' starting Ec instead,
 *    {@link heldShellLevels}), explored from its rate-ratio starts for exploreIterations in two halves (a start
 *    far behind after the first is not continued). On such a side each charging ladder is also
 *    started from the VB peaks' own spacing ({@link valenceSpacingEcEV}; where it differs from the
 *    ladder's Ec start, η times the first two CB peaks' spacing, by minRelativeGap or more of
 *    {@link WHOLE_CURVE_RESTART_DEFAULTS}), its held VB levels placed by that Ec: where the s
 *    doublet's second peak is unseen or taken for a resonance, the CB spacing is off by ×0.4–5
 *    (low-η mix with the comparison, seeds 1–200: about a dozen wrong intermediate spectra on such
 *    sides), and every grouping started there settles far off; the VB peaks' spacing lay within
 *    10 % of the simulated Ec in most of them. The grouping's fits from both starts compete by BIC
 *    and plausibility as any two starts do. Measured with the comparison on the low-η mix:
 *    intermediate 156 → 162 of 200 (seeds 1–200), 150 → 152 (1001–1200); shell filling 173 → 173
 *    and 169 → 169, tunnelling 196 → 196 on both; the default and crossover mixes and `bench:fit`
 *    unchanged (its results digest the same). The cost on ten such draws fitted one after
 *    another: model evaluations 55.8k → 65.2k (one, draw 188, now reaches the work budget), time
 *    12.3 → 12.2 s. A side cut below the first VB crossing (`cutSide`: it ends before the curve
 *    does) has the same trouble where its first two CB peaks misplace Ec: there every grouping is
 *    also started from the VB peaks' spacing (its held hole as before), these starts explored
 *    after the others in the order of their BIC, so that the first half's drop limit stays the
 *    groupings' own. Measured with the comparison on the low-η mix, together with note 6 and
 *    FIT_DEFAULTS.maxEvaluations 15,000 (which the further starts need): intermediate 162 → 170
 *    of 200 (seeds 1–200), 154 → 157 (1001–1200); shell filling 178 → 178 and 175 → 177,
 *    tunnelling 196 → 196 on both.
 * 2. The best finishedHypotheses by BIC are finished; a finalist above reduced χ² shiftChiSquare
 *    is retried with its CB starts shifted by ∓Ec ({@link shiftGrouping}).
 * 3. The best refinedGroupings are refined ({@link refineGrouping}, with the split starts at the
 *    peaks' spacings), the second not when it ended at the same fit ({@link sameFit}); the best
 *    again (without those) while a refined one is best, up to refinementRounds.
 * 4. Where the best so far is poor (`poorOf`: fitStatus' reduced χ² above 3 or residual structure
 *    above 5 σ on the CB side), it is refined once more from the split starts of
 *    {@link splitGridStarts} with the first p peak the first CB peak after the s doublet
 *    (`firstPeakAfterS`), and the result kept as a further finalist when its BIC is lower: a p
 *    level that settled one entry off (crossover benchmark, starts 122 and 1077: p 2+2+2 fitted as
 *    three sub-levels within 13 meV at Γtip/Γsub 5.6–6.7 for a true 0.7–0.8; 545: p 2+4 fitted whole
 *    at 6.1 for 0.9) hides the right split from the starts about it. It runs on the poor fits alone
 *    (a few in a hundred).
 * 5. By CB-side BIC, each finalist plausible on the CB side is fitted to the whole curve with each
 *    VB reading (a further reading only with at most maxAssignedStates charge states); the first whose whole-curve fit is plausible (or does not describe the curve) ends
 *    the search. With none plausible, the lowest BIC's whole-curve fit is kept. Where no reading
 *    fits as well as the CB side (vbRetryRatio), also those of {@link laterEntryReadings} (when one
 *    comes near, reduced χ² at most poorFitChiSquare), then the shell readings of
 *    {@link shellValenceReading} (a doublet and a level of four walked from the gap, the second's
 *    entry also at the first's second peak, {@link hiddenEntryReading}, each from the empty dot
 *    and in filling order, {@link inFillingOrder}), each kept only where it fits as well as the CB
 *    side and is plausible: between the regimes the groupings' own readings (filling groups, or
 *    runs of peaks one level each) may read neither VB level whole (crossover benchmark, seeds
 *    3001–3200: five spectra whose whole curve stayed at reduced χ² 8–37, Ec from the CB side alone
 *    3.2–4.8 % off).
 * 6. Where no finalist is plausible on the CB side, the next finishedHypotheses groupings
 *    explored (by BIC, those not finished yet) are finished and looked at in the same way, until
 *    one decides; with none plausible still, the lowest BIC's whole-curve fit is kept. On a cut
 *    side the ladders started from the VB peaks' spacing may fit the s doublet to the noise with
 *    Ec or Γtip/Γsub on a bound and take every finalist's place (low-η draw 1056: the grouping
 *    that the whole curve reads right was explored but not finished).
 * 7. Fitted to the whole curve from another Ec start (`ecStartEV`, {@link wholeCurveEcStarts}), a
 *    reading whose fit ends at reduced χ² at most poorFitChiSquare with a level on the edge of its
 *    reach ({@link levelAtReachEdge}) is run on with every level's reach centred on its fitted
 *    value ({@link recentredSeeds}), up to reachRecentrings times of
 *    {@link WHOLE_CURVE_RESTART_DEFAULTS}, each run kept where it lowers χ². A level placed from
 *    the wrong peak by a far Ec start (a p entry on s's second charging peak) otherwise stays on
 *    that edge while Ec moves to the optimum (low-η draw 93: reduced χ² 1.97 with p 18 meV off and
 *    residual structure at its second peak; run on, 1.04 at the simulated Ec and Γtip/Γsub).
 *    Only the restarts run it, so fits that take none are unchanged. Measured with the comparison
 *    on the low-η mix: intermediate 171 → 173 of 200 (seeds 1–200: 93, 160), 157 → 158
 *    (1001–1200); shell filling 180 → 181 (166) and 182 → 182, tunnelling 197 and 196 unchanged;
 *    `bench:fit` 60/60 with the same median evaluations (two fits take the restarts there: one
 *    the same result, one closer to the simulated Ec).
 *
 * Example
 * -------
 * ```ts
 * const wholeFit = compareGroupings(context); // context.finals and context.cbSideOf now hold the finalists
 * ```
 */
export function compareGroupings(stage: CompareContext): (cbDone: FitTrial, ecStartEV?: number) => FitTrial {
  const { hypotheses, run, cbSide, reduced, trials, finals, cbSideOf, plausibilityOf, eta, maxIterations, peakChargingEnergyEV, limits: F } = stage;
  const explore = stage.exploreIterations;
  const guessEC = stage.chargingEnergyGuessEV;
  const cbOnly = new Map<FitHypothesis, FitHypothesis>();
  // At low η the VB levels whose steps through the substrate junction fall on the CB side are
  // held in its model (at the energies their first peaks give), so that the CB side describes
  // every step in it.
  let topV = -Infinity;
  for (const v of cbSide.biasV) topV = Math.max(topV, v);
  const holeEntryV = heldHoleEntry(hypotheses[0].analysis.peaks, eta)?.entry.biasV ?? null;
  const vbPeaksV = valencePeaksV(hypotheses[0].analysis.peaks);
  // On a crossed side the charging ladders are also started from the VB peaks' own spacing (notes 1).
  const vbEcEV = stage.crossedSide || stage.cutSide ? valenceSpacingEcEV(vbPeaksV, eta) : null;
  const gap = WHOLE_CURVE_RESTART_DEFAULTS.minRelativeGap;
  const fromVb = (h: FitHypothesis): FitHypothesis[] =>
    vbEcEV !== null && h.chargingEnergyStartEV !== null && Math.abs(vbEcEV - h.chargingEnergyStartEV) >= gap * h.chargingEnergyStartEV
      ? [{ ...h, chargingEnergyStartEV: vbEcEV, label: `${h.label}, Ec started from the VB peaks' spacing` }]
      : [];
  /** The CB-side hypothesis of h (with its held VB levels), or null where it has no CB level or too many states. */
  const cbSideOfHypothesis = (h: FitHypothesis): FitHypothesis | null => {
    const seeds = h.seeds.filter((x) => x.band === "CB");
    // A side that runs to the curve's end across the VB crossings holds the VB levels' shell
    // reading instead, from the hypothesis' starting Ec.
    const ecStartV = (h.chargingEnergyStartEV ?? peakChargingEnergyEV ?? guessEC) / eta;
    const heldVb = stage.crossedSide ? heldShellLevels(vbPeaksV, ecStartV, eta, topV) : F.cbSideHeldHole ? heldValenceLevels(hypotheses[0].seeds, holeEntryV, eta, topV) : [];
    return seeds.length && stateCount(seeds) <= F.maxAssignedStates ? { ...h, seeds, vbReadings: [[]], ...(heldVb.length ? { heldVb } : {}) } : null;
  };
  const firstRound = stage.crossedSide ? hypotheses.flatMap((x) => [x, ...fromVb(x)]) : hypotheses;
  for (const h of firstRound) {
    const hc = cbSideOfHypothesis(h);
    if (hc) cbOnly.set(h, hc);
  }
  // Explored in two halves: after the first, a start far worse than the best so far (reduced χ²
  // above exploreDropRatio times the best) or already converged is not continued.
  const half = Math.min(explore, F.chunkIterations);
  const exploreAll = (entries: [FitHypothesis, FitHypothesis][], bestBefore: number): FitTrial[] => {
    const out: FitTrial[] = [];
    for (const [h, hc] of entries) {
      const starts = h.kind === "assigned" ? [null] : [null, ...(F.extraStartsLog10[h.kind] ?? [])];
      for (const logRatio of starts) out.push(run(hc, logRatio, half, undefined, cbSide));
    }
    const bestHalf = Math.min(bestBefore, ...out.map(reduced));
    out.forEach((t, i) => {
      if (explore <= half || t.loop.converged || reduced(t) > F.exploreDropRatio * bestHalf) return;
      const more = continueRun(run, t, explore - half, cbSide);
      out[i] = { ...more, loop: { ...more.loop, iterations: t.loop.iterations + more.loop.iterations } };
    });
    return out;
  };
  const explored = exploreAll([...cbOnly], Infinity);
  const bestOf = new Map<FitHypothesis, FitTrial>();
  const keepBest = (ts: FitTrial[]) => {
    for (const t of ts) {
      const b = bestOf.get(t.hypothesis);
      if (!b || t.bic < b.bic) bestOf.set(t.hypothesis, t);
    }
  };
  keepBest(explored);
  if (stage.cutSide && !stage.crossedSide && vbEcEV !== null) {
    // On a cut side, every grouping also from the VB peaks' spacing, explored after the others in
    // the order of their BIC (notes 1).
    const baseOf = new Map([...cbOnly].map(([h, hc]) => [hc, h]));
    const more: [FitHypothesis, FitHypothesis][] = [];
    for (const h of [...bestOf.values()].sort((x, y) => x.bic - y.bic).flatMap((t) => fromVb(baseOf.get(t.hypothesis)!))) {
      const hc = cbSideOfHypothesis(h);
      if (hc) {
        cbOnly.set(h, hc);
        more.push([h, hc]);
      }
    }
    const extra = exploreAll(more, Math.min(...explored.map(reduced)));
    explored.push(...extra);
    keepBest(extra);
  }
  trials.push(...explored);
  const ranked = [...bestOf.values()].sort((x, y) => x.bic - y.bic).slice(0, F.finishedHypotheses);
  const cbFinals = ranked.map((t) => continueRun(run, t, maxIterations, cbSide));
  trials.push(...cbFinals);
  // A grouping that settles well above the noise may be one Ec off (its first charging peak
  // weak and unseen, or one too many): the same grouping from every CB start shifted by ∓Ec.
  const context = { cbOnly, trials, eta, exploreIterations: explore, maxIterations, run: (hc: FitHypothesis, iterations: number, from?: number[]) => run(hc, null, iterations, from, cbSide), peakChargingEnergyEV };
  cbFinals.forEach((t, i) => {
    if (t.hypothesis.kind !== "assigned" && reduced(t) > F.shiftChiSquare) cbFinals[i] = shiftGrouping(t, context) ?? t;
  });
  // The best grouping so far from further starts about its own fitted values (its p shell split
  // about the fitted p level, its rate ratio moved either way): a whole p level fitted to a
  // split shell, or a ladder settled at the wrong rate ratio, reaches a low χ² with Ec off.
  // The split starts at the peaks' spacings in the first round only: about a refined grouping they
  // repeat the first round's (the same peaks, nearly the same first p level and Ec).
  const refine = (top: FitTrial, splitAtPeaks: boolean) => refineGrouping(top, { ...context, exploreIterations: Math.min(explore, F.refinementIterations), splitAtPeaks });
  // First round: the best refinedGroupings groupings; then the best again while refining helps.
  // Two groupings at the same fit (sameFit) would give the same refinements: the second is left out.
  const best2 = [...cbFinals].sort((x, y) => x.bic - y.bic).slice(0, F.refinedGroupings);
  let latest = best2.filter((t, i) => !best2.slice(0, i).some((u) => sameFit(u, t))).map((t, i) => refine(t, i === 0)).filter((t): t is FitTrial => t !== null);
  for (let round = 1; latest.length && round <= F.refinementRounds; round++) {
    cbFinals.push(...latest);
    const top = cbFinals.reduce((x, y) => (y.bic < x.bic ? y : x));
    if (round === F.refinementRounds || !latest.includes(top)) break;
    const next = refine(top, false);
    latest = next ? [next] : [];
  }
  // Rescue: where the best grouping so far is still poor, p split at the peaks' spacings from the
  // first peak after the s doublet (a p level settled one entry off hides the right split from
  // the starts about it).
  const bestSoFar = cbFinals.reduce((x, y) => (y.bic < x.bic ? y : x));
  if (stage.poorOf?.(bestSoFar)) {
    const rescued = refineGrouping(bestSoFar, { ...context, exploreIterations: Math.min(explore, F.refinementIterations), afterSOnly: true });
    if (rescued) cbFinals.push(rescued);
  }
  /** The whole curve: the CB values found, each reading of the VB peaks from its start; the best kept. */
  const wholeFit = (cbDone: FitTrial, ecStartEV?: number): FitTrial => {
    const h0 = [...cbOnly.entries()].find(([, hc]) => hc === cbDone.hypothesis)![0];
    let bestFull: FitTrial | null = null;
    const ncb = cbDone.hypothesis.seeds.length;
    // From another Ec: the CB levels placed by it from their peaks (and their reach about it), the rate ratio and broadening the CB side's.
    const h = ecStartEV === undefined ? h0 : { ...h0, chargingEnergyStartEV: ecStartEV };
    const p = ecStartEV === undefined ? cbDone.loop.parameters : [...startingValues(h.analysis, cbDone.hypothesis.seeds, eta, guessEC, { chargingEnergyEV: ecStartEV }).initialValues.slice(0, ncb + 1), ...cbDone.loop.parameters.slice(ncb + 1)];
    const fitReading = (vb: LevelSeed[], chargingEnergyEV: number | null, accept: (t: FitTrial) => boolean = () => true) => {
      const hv: FitHypothesis = { ...h, seeds: [...cbDone.hypothesis.seeds, ...vb] };
      const vbStart = startingValues(hv.analysis, hv.seeds, eta, guessEC, { chargingEnergyEV, rateRatioLog10: h.rateRatioStartLog10 }).initialValues;
      const from = [...p.slice(0, ncb), ...vbStart.slice(ncb, ncb + vb.length), ...p.slice(ncb)];
      let full = continueRun(run, cbDone, maxIterations, undefined, { hypothesis: hv, from });
      // From another Ec start, a level that ended on the edge of its reach runs on with the reach
      // centred on the fitted levels (note 7).
      for (let k = 0; ecStartEV !== undefined && k < WHOLE_CURVE_RESTART_DEFAULTS.reachRecentrings && reduced(full) <= F.poorFitChiSquare && levelAtReachEdge(full.loop.parameters, full.start, hv.seeds.length); k++) {
        const on = continueRun(run, cbDone, maxIterations, undefined, { hypothesis: { ...hv, seeds: recentredSeeds(hv.seeds, full.loop.parameters.slice(0, hv.seeds.length), eta, ecStartEV) }, from: full.loop.parameters });
        if (!(on.loop.chiSquare < full.loop.chiSquare)) break;
        full = on;
      }
      trials.push(full);
      if (accept(full) && (!bestFull || full.bic < bestFull.bic)) bestFull = full;
    };
    // The readings within the hypotheses' limit of charge states (one of eleven single levels has
    // 2,048: one evaluation then solves for seconds); the assignment's own reading also beyond it,
    // where the master equation solves it (its VB levels, read by their steps, can make 10⁵
    // states: degeneracies 2, 7, 8, 6, 5, 4, 4).
    const small = (vb: LevelSeed[]) => stateCount(vb) <= F.maxAssignedStates;
    h.vbReadings.forEach((vb, i) => (small(vb) || (i === 0 && h.kind === "assigned" && stateCount(vb) <= SCENARIO_DEFAULTS.maxStates)) && fitReading(vb, h.chargingEnergyStartEV));
    // No reading fits as well as the CB side does, though one comes near (reduced χ² at most
    // poorFitChiSquare; beyond, the reading is wrong by more than an entry): the VB levels entered
    // one carrier earlier (started from the CB side's Ec).
    // Such a reading replaces the best only where it fits as well as the CB side does and is
    // plausible: one that merely fits better pulls Ec and Γtip/Γsub as a wrong reading does.
    const asCbSide = (t: FitTrial | null) => t !== null && reduced(t) <= COMPARE_GROUPINGS_DEFAULTS.vbRetryRatio * Math.max(1, reduced(cbDone));
    if (bestFull && !asCbSide(bestFull) && reduced(bestFull) <= F.poorFitChiSquare) {
      const vbPeaksV = h.analysis.peaks.filter((x) => x.biasV < 0).map((x) => x.biasV);
      for (const vb of laterEntryReadings(h.vbReadings.filter((r) => r.length), vbPeaksV, p[ncb] / eta).filter(small)) fitReading(vb, p[ncb], (t) => asCbSide(t) && plausibilityOf(t).length === 0);
    }
    // Still none (or none near): the VB peaks read as a ladder with the shell degeneracies of the
    // model (a doublet, then a level of four), spaced by the CB side's Ec. A
    // grouping's own readings follow its regime (filling groups, or runs of peaks one level each),
    // which between the regimes may read neither VB level whole; kept on the same terms.
    if (!asCbSide(bestFull)) {
      // Both entries of each level: from the empty dot, and in filling order (after the levels nearer the gap are full).
      // The second level's entry may hide under the first level's second peak: that reading too.
      const vbPeaksV = h.analysis.peaks.filter((x) => x.biasV < 0).map((x) => x.biasV);
      const reading = shellValenceReading(vbPeaksV, p[ncb] / eta);
      const hidden = hiddenEntryReading(reading, vbPeaksV);
      const shellReadings = [reading, ...(hidden ? [hidden] : [])].filter((r) => r.length).flatMap((r) => [r, inFillingOrder(r)]);
      for (const vb of shellReadings) {
        if (!h.vbReadings.some((r) => seedKey(r) === seedKey(vb))) fitReading(vb, p[ncb], (t) => asCbSide(t) && plausibilityOf(t).length === 0);
      }
      // No reading could be solved at all (the first too large): the shell reading stands, or none.
      if (!bestFull) fitReading(shellReadings[0] ?? [], p[ncb]);
    }
    return bestFull!;
  };
  // By CB-side BIC: the first plausible on the CB side whose whole-curve fit is plausible too
  // (or does not describe the curve, then its VB reading is what fails) is the winner; the
  // whole curve is fitted only for the candidates looked at.
  /** Looks at a CB-side finalist: whether it ends the search (plausible, its whole curve plausible or not describing the curve). */
  const decides = (c: FitTrial): boolean => {
    if (plausibilityOf(c).length) return false;
    const whole = wholeFit(c);
    cbSideOf.set(whole, c);
    return whole.loop.chiSquare / Math.max(1, whole.n - whole.k) > F.poorFitChiSquare || plausibilityOf(whole).length === 0;
  };
  for (const c of [...cbFinals].sort((x, y) => x.bic - y.bic)) {
    finals.push(c);
    if (decides(c)) break;
  }
  for (const c of cbFinals) if (!finals.includes(c)) finals.push(c);
  if (![...cbSideOf.values()].length) {
    // None plausible on the CB side: the next groupings explored, finished, until one is (notes 6).
    const done = new Set(ranked.map((t) => t.hypothesis));
    for (const t of [...bestOf.values()].sort((x, y) => x.bic - y.bic).filter((x) => !done.has(x.hypothesis)).slice(0, F.finishedHypotheses)) {
      const c = continueRun(run, t, maxIterations, cbSide);
      trials.push(c);
      finals.push(c);
      if (decides(c)) break;
    }
  }
  if (![...cbSideOf.values()].length) {
    // None plausible on the CB side: the lowest BIC's whole-curve fit, reported as implausible.
    const c = finals.filter((t) => t.side === "CB").reduce((x, y) => (y.bic < x.bic ? y : x));
    cbSideOf.set(wholeFit(c), c);
  }
  return wholeFit;
}
