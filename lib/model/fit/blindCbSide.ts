/**
 * A CB side too short to tell the groupings of the CB peaks apart (it ends before p), or one that
 * runs to the curve's end across the VB levels' crossings, and the choice among the groupings by
 * their whole-curve fits instead.
 */
import type { FitTrial } from "./fitTrial.ts";
import type { cbSideEndV } from "./cbSideEnd.ts";
import type { heldShellLevels } from "./heldValenceLevels.ts";

/** One analysed peak as {@link blindCbSide} reads it. */
export interface BlindSidePeak {
  /** Position, V. */
  biasV: number;
  /** The peak's role in the assignment; "second-junction" peaks do not count. */
  role: string;
}

/**
 * Whether the CB side of a fit shows too few CB peaks to tell the groupings of the CB peaks apart.
 *
 * Parameters
 * ----------
 * peaks : readonly BlindSidePeak[]
 *     The analysed peaks (bias V, role).
 * cbSideBiasV : ArrayLike<number>
 *     The biases (V) of the CB side's points ({@link cbSideEndV}).
 * maxPeaks : number
 *     Most peaks a blind side shows (FIT_DEFAULTS.blindSidePeaks, 2: the s doublet).
 * curveTopV : number
 *     The highest bias of the whole curve, V.
 *
 * Returns
 * -------
 * boolean
 *     True when the CB side ends below curveTopV and holds at most maxPeaks
 *     peaks above 0 V that are not second-junction resonances.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. At η 0.55–0.65 the CB side ends below the first hole's crossing of the substrate's Fermi
 *    level ({@link cbSideEndV}), which may fall right after the s doublet. The groupings differ
 *    in p only (whole, split, in filling order or entered from the empty dot), and a side with
 *    the s doublet alone fits every one of them to the noise: their CB-side BICs then differ by
 *    their parameter counts alone (k·ln n), and the fewest levels win whatever p is.
 * 2. A side that runs to the end of the curve (no crossing on it) is never blind: it shows every
 *    CB peak there is.
 *
 * Example
 * -------
 * ```ts
 * blindCbSide([{ biasV: 1.67, role: "unassigned" }, { biasV: 1.93, role: "satellite" }, { biasV: 2.49, role: "second-junction" },
 *   { biasV: 2.82, role: "unassigned" }], [0.01, 1.5, 2.57], 2, 4.5);
 * // => true (1.67 and 1.93 V on a side ending at 2.57 V)
 * ```
 */
export function blindCbSide(peaks: readonly BlindSidePeak[], cbSideBiasV: ArrayLike<number>, maxPeaks: number, curveTopV: number): boolean {
  const topV = cbSideTopV(cbSideBiasV);
  if (!(topV < curveTopV)) return false;
  return peaks.filter((p) => p.biasV > 0 && p.biasV <= topV && p.role !== "second-junction").length <= maxPeaks;
}

/**
 * Whether the CB side of a fit runs to the end of the curve although the first VB level's
 * crossing of the substrate's Fermi level lies on it: the side could not be cut below that
 * crossing without losing the s doublet.
 *
 * Parameters
 * ----------
 * peaks : readonly BlindSidePeak[]
 *     The analysed peaks (bias V, role); "second-junction" peaks do not count.
 * cbSideBiasV : ArrayLike<number>
 *     The biases (V) of the CB side's points ({@link cbSideEndV}).
 * eta : number
 *     Voltage-division factor η, 0 < η ≤ 1.
 * curveTopV : number
 *     The highest bias of the whole curve (the same thinned points), V.
 *
 * Returns
 * -------
 * boolean
 *     True when η < 1, the CB side reaches curveTopV and η·|V₁|/(1 − η) < curveTopV for the peak
 *     V₁ < 0 nearest 0 V that is not a second-junction resonance; false otherwise.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. At η 0.55–0.65 the first hole's substrate-junction crossing η·|V₁|/(1 − η)
 *    ({@link cbSideEndV}, note 1) may fall before or within the s doublet; {@link cbSideEndV} then
 *    keeps the whole positive side (a side without the s doublet tells no grouping apart). That
 *    side holds every VB level's crossings beyond V₁ too, and a model of the CB levels alone fits
 *    every grouping badly there: on the low-η mix with the comparison (seeds 1–200), 19 of the 45
 *    intermediate spectra the fit left wrong or undecided had such a side, most with Ec 1.5–4
 *    times the simulated one and Γtip/Γsub read deep in shell tunnelling. The comparison then
 *    holds the VB levels in the CB-side model ({@link heldShellLevels}) and the whole-curve fits
 *    decide among the groupings ({@link wholeCurveChoice}).
 * 2. Measured with the comparison on the low-η mix: intermediate 150 → 156 of 200 (seeds
 *    1–200; one right answer lost to the work budget), 139 → 149 (1001–1200), 139 → 145
 *    (2001–2200, held out); shell filling 164 → 164, 160 → 162, 168 → 169; tunnelling 195 → 196,
 *    196 → 196, 200 → 200. The default and crossover mixes and `bench:fit` unchanged (no such side:
 *    its results digest the same). The cost: about a tenth more time on such a side (eight of
 *    those draws fitted one after another, old and new in turn: 41 → 45 s in all), for the VB band
 *    each CB-side model solves and the five groupings fitted to the whole curve.
 *
 * Example
 * -------
 * ```ts
 * crossedCbSide([{ biasV: -1.38, role: "level" }, { biasV: 1.9, role: "level" }, { biasV: 2.08, role: "level" }], [0.01, 3.95], 0.564, 3.95);
 * // => true (0.564·1.38/0.436 = 1.79 V < 3.95 V, on a side that runs to the end)
 * ```
 */
export function crossedCbSide(peaks: readonly BlindSidePeak[], cbSideBiasV: ArrayLike<number>, eta: number, curveTopV: number): boolean {
  if (!(eta < 1)) return false;
  if (cbSideTopV(cbSideBiasV) < curveTopV) return false;
  const nearest = peaks.filter((p) => p.biasV < 0 && p.role !== "second-junction").sort((a, b) => b.biasV - a.biasV)[0];
  return nearest !== undefined && (eta * -nearest.biasV) / (1 - eta) < curveTopV;
}

/**
 * The CB-side finalist whose whole-curve fit has the lowest BIC, among the best of each grouping.
 *
 * Parameters
 * ----------
 * candidates : readonly FitTrial[]
 *     The plausible CB-side finalists (all on the same points).
 * wholeOf : (t: FitTrial) => FitTrial
 *     Its whole-curve fit (each reading of the VB peaks, the best kept; fitted where not yet).
 * acceptable : (whole: FitTrial, cb: FitTrial) => boolean
 *     Whether a whole-curve fit may decide (plausible, or not describing the curve at all).
 * maxGroupings : number
 *     Most groupings fitted to the whole curve (FIT_DEFAULTS.blindSideGroupings).
 * always : { cb: FitTrial; whole: FitTrial } | null
 *     A CB-side fit looked at besides them, whatever its CB-side BIC and plausibility, with the
 *     whole-curve fit that stands for it where it is not among them (the assignment's, note 3;
 *     FIT_DEFAULTS.blindSideAssigned); null (default): none.
 *
 * Returns
 * -------
 * { chosen: FitTrial | null; wholeBic: Map<FitTrial, number> }
 *     The CB-side fit of the chosen grouping (null without an acceptable whole-curve fit), and the
 *     whole-curve BIC of each acceptable grouping fitted, by its CB-side fit (for the BIC weights).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Groupings are told apart by their CB levels' degeneracies and entries (`before`): of the
 *    fits of one grouping (explored, finished, retried, refined), the lowest CB-side BIC stands
 *    for it; the best maxGroupings by CB-side BIC are fitted to the whole curve. On a blind side
 *    the finalists by CB-side BIC are those with the fewest levels, so every grouping explored
 *    is a candidate, not only the finalists.
 * 2. Every whole-curve fit covers the same points, so their BICs compare; p's peaks lie there,
 *    with the VB levels that the CB side leaves out.
 * 3. `always` is looked at after them, with its given whole-curve fit, where it is not one of them. The CB side, blind to p, can
 *    neither rank nor check a grouping by its p levels: those of a split p add k·ln n to its
 *    CB-side BIC with no χ² to gain there, and they wander off the side unfitted (a split p
 *    spanning more than its distance from s, implausible). So a split p that the rules read right
 *    never reached the whole curve (low-η shell-filling draw 190: the assignment's s + p 2+2+2,
 *    seventh by CB-side BIC and implausible on the CB side, fits the whole curve at reduced χ²
 *    1.15 where the winner's p whole leaves 2.80 and residual structure of 16 σ). Its whole-curve
 *    fit (the assignment's own run, already made) decides by the same bar as the others'.
 *
 * Example
 * -------
 * ```ts
 * const { chosen } = wholeCurveChoice(plausibleCbRuns, (t) => wholeFitOf(t), (w) => plausibilityOf(w).length === 0, 8);
 * ```
 */
export function wholeCurveChoice(candidates: readonly FitTrial[], wholeOf: (t: FitTrial) => FitTrial, acceptable: (whole: FitTrial, cb: FitTrial) => boolean, maxGroupings: number, always: { cb: FitTrial; whole: FitTrial } | null = null): { chosen: FitTrial | null; wholeBic: Map<FitTrial, number> } {
  const byGrouping = new Map<string, FitTrial>();
  for (const t of [...candidates].sort((x, y) => x.bic - y.bic)) {
    const key = t.hypothesis.seeds.map((s) => `${s.band}${s.degeneracy}/${s.before}`).join(" ");
    if (!byGrouping.has(key)) byGrouping.set(key, t);
  }
  const wholeBic = new Map<FitTrial, number>();
  let chosen: FitTrial | null = null;
  const tried = [...byGrouping.values()].slice(0, maxGroupings);
  const extra = always && !tried.includes(always.cb) ? always : null;
  for (const cb of extra ? [...tried, extra.cb] : tried) {
    const whole = cb === extra?.cb ? extra.whole : wholeOf(cb);
    if (!acceptable(whole, cb)) continue;
    wholeBic.set(cb, whole.bic);
    if (!chosen || whole.bic < wholeBic.get(chosen)!) chosen = cb;
  }
  return { chosen, wholeBic };
}

/** The highest bias of a CB side's points, V (−∞ for none): below the curve's top the side is cut. */
export function cbSideTopV(cbSideBiasV: ArrayLike<number>): number {
  let topV = -Infinity;
  for (let i = 0; i < cbSideBiasV.length; i++) topV = Math.max(topV, cbSideBiasV[i]);
  return topV;
}
