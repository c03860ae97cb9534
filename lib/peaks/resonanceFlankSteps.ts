/**
 * Levels on the flank of a predicted second-junction resonance: the current around the
 * resonance refitted as the resonance's step, held where it is predicted, and level steps beside
 * it. Internal to lib/peaks (not re-exported from the public entry).
 */
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";
import { fitSteps, stepSearch, type StepsScratch, type StepSearchProblem } from "./splitPeaks.ts";

/** Limits of {@link resonanceFlankSteps}, in expected FWHM (locked by test/peaks/resonanceFlankSteps.test.ts). */
export const RESONANCE_FLANK_DEFAULTS = Object.freeze({
  /** Half-width of the fitted stretch around the resonance (that of the step test and the split). */
  windowFwhm: 3,
  /**
   * A level step lies at least this far from the resonance and from every other peak:
   * closer, two Gaussian-broadened steps differ from one wider step by their fourth moment alone
   * (`SPLIT_PEAKS_DEFAULTS.minSeparationFwhm`, the same bound).
   */
  minSeparationFwhm: 0.5,
  /** … and at most this far from the resonance (a level further out shows a maximum of its own). */
  maxDistanceFwhm: 2,
  /** The common width of the level steps stays within these multiples of the expected width (that of the gap-edge steps, less or more the error of its measurement). */
  widthBounds: [0.8, 1.25] as readonly [number, number],
  /** The resonance's step may move this far from its prediction (η and the source's position are known to a few %). */
  resonanceMoveFwhm: 0.25,
  /** A level's step is at least this fraction of the resonance's (a level steps comparably to the resonance it sits beside; a sliver is the line shape's mismatch). */
  minStepPerResonance: 0.2,
  /** The Gauss–Newton search stops when its step moves the positions by less than this fraction of a FWHM. */
  searchTolFwhm: 1 / 64,
});

/** One level step found beside a resonance. */
export interface FlankStep {
  /** Position, V. */
  biasV: number;
  /** Position σ from the fit's covariance (widened by the residual RMS where larger), V. */
  uncertaintyV: number;
  /** Current step, A. */
  stepA: number;
  /** Step height over its standard error. */
  significance: number;
}

/** What {@link resonanceFlankSteps} found: the resonance's own step and the level steps beside it. */
export interface FlankStepsResult {
  /** The resonance's position in the final fit, V (within `RESONANCE_FLANK_DEFAULTS.resonanceMoveFwhm` FWHM of the prediction). */
  resonanceV: number;
  /** The resonance's step in the final fit, A, and its height over its standard error. */
  resonanceStepA: number;
  resonanceSignificance: number;
  /** The level steps found, ascending (one or two; empty never returned: null instead). */
  levels: FlankStep[];
  /** FWHM of the level steps (common), V. */
  fwhmV: number;
}

/**
 * Level steps beside a predicted second-junction resonance, from the raw current.
 *
 * Parameters
 * ----------
 * biasV : Float64Array
 *     Bias, V (uniform, ascending).
 * currentA : Float64Array
 *     Raw current, A.
 * noiseA : number
 *     Current noise σ, A.
 * resonanceV : number
 *     The predicted resonance, V: its step is held there.
 * neighboursV : readonly number[]
 *     The other peaks' positions, V (their steps fitted at those positions); the peak taken as
 *     the resonance is left out.
 * expectedFwhmV : number
 *     The expected FWHM of a step, V (the resonance's and the neighbours' width).
 * minStepSigma : number
 *     The step test's threshold.
 * shared : { levelStepMinA: number }, optional
 *     Where a peak is known to hold the resonance and a level together (a shared peak, note 5):
 *     the least current step of the level, A. Default: none (a level must show itself).
 *
 * Returns
 * -------
 * FlankStepsResult | null
 *     The level steps the current shows beside the resonance, or null where it shows none.
 *
 * Notes
 * -----
 * With w the expected FWHM and D = `RESONANCE_FLANK_DEFAULTS`:
 * 1. The current over resonanceV ± D.windowFwhm·w is fitted by linear least squares as a line,
 *    a Gaussian-broadened step at each neighbour in or near the stretch and one at the resonance
 *    (width w), and free level steps of a common width ({@link fitSteps}).
 * 2. Where the resonance alone leaves less than minStepSigma² of χ²/σ² beyond the degrees of
 *    freedom of a fit with one more level (a screen, as in the split of a wide peak), null.
 *    One level on each side of the resonance in turn: its position (between D.minSeparationFwhm
 *    and D.maxDistanceFwhm expected FWHM from the resonance, D.minSeparationFwhm clear of every
 *    neighbour) and width are found by Gauss–Newton ({@link stepSearch}), from one FWHM out.
 *    A side's level is kept when χ² drops by at least minStepSigma² from the resonance alone and
 *    the level's step reaches minStepSigma standard errors (σ: the noise, or the residual RMS
 *    where larger), as in the step test.
 * 3. Where a side keeps a level, a level on each side is fitted together (from the singles'
 *    positions, or one FWHM out on a side that kept none: a level on the other side can hide
 *    it from the single fit) and kept if χ² drops by minStepSigma² from the better single and
 *    both steps pass; otherwise the better single stands. Every level's step is at least
 *    D.minStepPerResonance × the resonance's, and the resonance's step may move
 *    D.resonanceMoveFwhm FWHM from its prediction.
 * 4. The resonance's own step must stay positive in the final fit; otherwise null (a level
 *    alone explains the current, nothing is added).
 * 5. With `shared` the peak is known to hold a level beside the resonance, and the fit only
 *    places it: no screen and no χ² drop is asked (a level half a FWHM to a FWHM from the
 *    resonance makes, with it, a step that one wider step fits nearly as well), and no fit of
 *    both sides is made; a side's level is kept where its step reaches `levelStepMinA` and
 *    minStepSigma standard errors and the resonance's step minStepSigma standard errors. The
 *    better side (lower χ²) stands.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991) (the two junctions' steps); P. R. Bevington and
 * D. K. Robinson, Data Reduction and Error Analysis for the Physical Sciences, 3rd ed.
 * (McGraw-Hill, 2003), ch. 8 (Gauss–Newton).
 */
export function resonanceFlankSteps(
  biasV: Float64Array,
  currentA: Float64Array,
  noiseA: number,
  resonanceV: number,
  neighboursV: readonly number[],
  expectedFwhmV: number,
  minStepSigma: number,
  shared?: { levelStepMinA: number },
): FlankStepsResult | null {
  const D = RESONANCE_FLANK_DEFAULTS;
  const n = biasV.length;
  if (n < 16 || !(expectedFwhmV > 0) || !(noiseA > 0)) return null;
  const h = (biasV[n - 1] - biasV[0]) / (n - 1);
  const w = expectedFwhmV;
  const s0 = w / GAUSSIAN_FWHM_PER_SIGMA;
  const lo = Math.max(0, Math.round((resonanceV - D.windowFwhm * w - biasV[0]) / h));
  const hi = Math.min(n - 1, Math.round((resonanceV + D.windowFwhm * w - biasV[0]) / h));
  if (hi - lo < 16) return null;
  const near = neighboursV.filter((v) => v >= biasV[lo] - w && v <= biasV[hi] + w);
  const scratch: StepsScratch = { cols: [] };
  const problem: StepSearchProblem = { x: biasV, current: currentA, lo, hi, neighboursV: near, neighbourSigmaV: s0, scratch };
  const sep = D.minSeparationFwhm * w;
  const sLo = D.widthBounds[0] * s0, sHi = D.widthBounds[1] * s0;
  const tol = D.searchTolFwhm * w;
  const need = minStepSigma * minStepSigma;
  // The resonance is a free step whose position is held (bounds at the prediction): it shares the
  // common width of the level steps, searched with their positions.
  const search = (startV: number[], lower: number[], upper: number[]) =>
    stepSearch(problem, [...startV, s0], [...lower, sLo], [...upper, sHi], [...startV.map((v) => (v === resonanceV ? m / 2 : w / 2)), s0 / 4], sep, tol);
  const m = D.resonanceMoveFwhm * w;
  const rLo = resonanceV - m, rHi = resonanceV + m;
  const alone = search([resonanceV], [rLo], [rHi]);
  if (!Number.isFinite(alone.value)) return null;
  // A screen (that of the split): a level worth keeping lowers χ² by minStepSigma², so the
  // resonance alone must leave at least that much beyond the degrees of freedom of a fit with one
  // more step (its height, position; four fewer than the resonance alone leaves with its own).
  const dof = hi - lo + 1 - (2 + near.length + 1 + 2) - 2;
  if (!shared && !(alone.value / (noiseA * noiseA) - dof >= need)) return null;
  // The range a level on one side may take: beyond sep of the resonance, within maxDistance, clear of neighbours.
  const range = (side: -1 | 1): [number, number] | null => {
    let a = side < 0 ? resonanceV - D.maxDistanceFwhm * w : resonanceV + sep - m;
    let b = side < 0 ? resonanceV - sep + m : resonanceV + D.maxDistanceFwhm * w;
    a = Math.max(a, biasV[lo]);
    b = Math.min(b, biasV[hi]);
    for (const v of near) {
      if (side < 0 && v < resonanceV) a = Math.max(a, v + sep);
      if (side > 0 && v > resonanceV) b = Math.min(b, v - sep);
    }
    return b - a > tol ? [a, b] : null;
  };
  // The fit at given positions (ascending, the resonance among them): each step's t and position σ.
  // Heights and their t from the fit at the positions found (as the step test reads a step); the
  // positions' σ from the fit with their shifts linearised.
  const judge = (freeV: number[], s: number) => {
    const fit = fitSteps(biasV, currentA, lo, hi, near, s0, freeV, s, false, scratch);
    const shifted = fit && fitSteps(biasV, currentA, lo, hi, near, s0, freeV, s, true, scratch);
    if (!fit || !shifted) return null;
    const sigma = Math.max(noiseA, Math.sqrt(fit.ss / Math.max(1, fit.rows - fit.columns - freeV.length)));
    const t = fit.steps.map((c, k) => (fit.stepVars[k] > 0 ? c / (sigma * Math.sqrt(fit.stepVars[k])) : 0));
    const se = shifted.shiftVars.map((v) => (Number.isFinite(v) && v > 0 ? sigma * Math.sqrt(v) : w / 2));
    return { fit, sigma, t, se };
  };
  type Found = { positions: number[]; width: number; value: number };
  const singles: { side: -1 | 1; at: number; found: Found }[] = [];
  for (const side of [-1, 1] as const) {
    const r = range(side);
    if (!r) continue;
    const start = Math.min(r[1], Math.max(r[0], resonanceV + side * w));
    const got = side < 0 ? search([start, resonanceV], [r[0], rLo], [r[1], rHi]) : search([resonanceV, start], [rLo, r[0]], [rHi, r[1]]);
    if (!Number.isFinite(got.value)) continue;
    const positions = got.p.slice(0, 2);
    const j = judge(positions, got.p[2]);
    const k = side < 0 ? 0 : 1;
    if (!j || !(j.t[k] >= minStepSigma)) continue;
    // A shared peak (note 5): the level steps like one and the resonance passes the step test; no χ² drop is asked.
    if (shared ? !(j.fit.steps[k] >= shared.levelStepMinA && j.t[1 - k] >= minStepSigma) : !(j.fit.steps[k] >= D.minStepPerResonance * j.fit.steps[1 - k]) || !((alone.value - got.value) / (j.sigma * j.sigma) >= need)) continue;
    singles.push({ side, at: positions[k], found: { positions, width: got.p[2], value: got.value } });
  }
  if (!singles.length) return null;
  let best = singles.reduce((a, b) => (b.found.value < a.found.value ? b : a)).found;
  const [l, r] = [range(-1), range(1)];
  if (l && r && !shared) {
    // Both sides together, from the singles' positions (one FWHM out where a side kept none: a
    // level on the other side can hide it from the single fit).
    const startOf = (side: -1 | 1, [a, b]: [number, number]) => singles.find((x) => x.side === side)?.at ?? Math.min(b, Math.max(a, resonanceV + side * w));
    const got = search([startOf(-1, l), resonanceV, startOf(1, r)], [l[0], rLo, r[0]], [l[1], rHi, r[1]]);
    const positions = got.p.slice(0, 3);
    const j = Number.isFinite(got.value) ? judge(positions, got.p[3]) : null;
    if (j && Math.min(j.t[0], j.t[2]) >= minStepSigma && Math.min(j.fit.steps[0], j.fit.steps[2]) >= D.minStepPerResonance * j.fit.steps[1] && (best.value - got.value) / (j.sigma * j.sigma) >= need) best = { positions, width: got.p[3], value: got.value };
  }
  const final = judge(best.positions, best.width);
  const at = best.positions.length === 3 ? 1 : best.positions.length === 1 ? 0 : singles.find((x) => x.found === best)!.side < 0 ? 1 : 0;
  if (!final || at < 0 || !(final.fit.steps[at] > 0)) return null;
  const levels = best.positions.map((v, k) => ({ biasV: v, uncertaintyV: final.se[k], stepA: final.fit.steps[k], significance: final.t[k] })).filter((_, k) => k !== at);
  return { resonanceV: best.positions[at], resonanceStepA: final.fit.steps[at], resonanceSignificance: final.t[at], levels, fwhmV: best.width * GAUSSIAN_FWHM_PER_SIGMA };
}
