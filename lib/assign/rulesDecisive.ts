/**
 * Whether the rule-based assignment of a curve is decisive, or leaves the reading open in a way
 * that a model comparison can settle: the cheap test that decides which curves
 * `dotspec analyze --compare-models` fits.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { REGIME_LIMITS } from "../model/regimeLimits.ts";
import { checkFinite, checkRange } from "../util/check.ts";
import type { Assignment } from "./assignSpectrum.ts";

/** What {@link rulesDecisive} reads: the peaks, their assignment and the bias window. */
export interface RulesDecisiveInput {
  /** The peaks the assignment names by index (`biasV`, `biasUncertaintyV`, `fwhmV` in V). */
  peaks: readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[];
  /** The rules' assignment of those peaks. */
  assignment: Pick<Assignment, "regime" | "evidence" | "multiplets" | "quantities" | "uncertainties" | "noLevels">;
  /** The bias window of the curve, [lowest, highest], V. */
  biasRangeV: readonly [number, number];
}

/** Options of {@link rulesDecisive}; every field optional (defaults in {@link RULES_DECISIVE_DEFAULTS}). */
export interface RulesDecisiveOptions {
  /**
   * Margin added on both sides of the crossover band of the s doublet's step ratio,
   * [r/(1 + r) at 3/7, r/(1 + r) at 1.5] = [0.3, 0.6]; dimensionless. Default 0.1 (a measured
   * step ratio scatters by about ± 0.1).
   */
  stepRatioMargin?: number;
  /**
   * A missing charging peak of a shell counts as inside the window when it would sit at least
   * this many of its shell's FWHM below the window's end, in FWHM. Default 1.
   */
  edgeFwhms?: number;
  /**
   * Spacings of a shell-tunnelling CB ladder count as alike when every one lies within this
   * fraction of their mean (or within `ladderSigmas` of their combined errors, whichever is
   * wider); dimensionless. Default 0.15.
   */
  ladderTolerance?: number;
  /** The same in combined standard errors of the two peak positions. Default 3. */
  ladderSigmas?: number;
}

/** The verdict of {@link rulesDecisive}. */
export interface RulesDecisive {
  /** True when none of the reasons below applies: the rules' answer stands without a fit. */
  decisive: boolean;
  /** Why the rules are not decisive, in words with the numbers (empty when decisive). */
  reasons: string[];
}

/** Defaults of {@link rulesDecisive} (locked by test/assign/rulesDecisive.test.ts). */
export const RULES_DECISIVE_DEFAULTS = Object.freeze({
  /** Margin on the crossover band of the s doublet's step ratio (a measured ratio scatters by about ± 0.1). */
  stepRatioMargin: 0.1,
  /** A missing charging peak counts as inside the window this many FWHM below its end. */
  edgeFwhms: 1,
  /** Alike ladder spacings: within this fraction of their mean … */
  ladderTolerance: 0.15,
  /** … or within this many combined standard errors. */
  ladderSigmas: 3,
});

/**
 * Says whether the rules' reading of a curve is decisive, or which of its features leave another
 * reading open (a model comparison can then decide).
 *
 * Parameters
 * ----------
 * input : RulesDecisiveInput
 *     The peaks (positions, 1σ and FWHM in V), their assignment and the bias window [lowest,
 *     highest] in V.
 * options : RulesDecisiveOptions, optional
 *     `stepRatioMargin` (dimensionless, default 0.1), `edgeFwhms` (FWHM, default 1),
 *     `ladderTolerance` (fraction, default 0.15), `ladderSigmas` (σ, default 3).
 *
 * Returns
 * -------
 * RulesDecisive
 *     `decisive` and the reasons it is not, in words. A curve with no levels (`noLevels` set) is
 *     decisive: there is nothing to compare.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an option that is not a finite number in its range, or a bias range that is
 *     not two finite numbers in ascending order.
 *
 * Notes
 * -----
 * No fitting: a few comparisons on the peaks, microseconds per curve. Not decisive when any of:
 * 1. The regime is undetermined.
 * 2. The second CB step over the first (`evidence.secondToFirstStepRatio`) lies within the
 *    crossover band r/(1 + r) for Γtip/Γsub between 3/7 and 1.5 (0.3–0.6, `REGIME_LIMITS`)
 *    widened by `stepRatioMargin` on both sides, while the rules named a regime: the s doublet's
 *    second step (or the satellite) is close to a regime boundary.
 * 3. Shell filling with an s or p multiplet short of its degeneracy (fewer than 2 or 6 charging
 *    peaks) while the next charging peak, one Ec after its last, would lie at least `edgeFwhms`
 *    FWHM inside the window: near Γtip/Γsub = 1.5–4 the last charging steps of p carry a few per
 *    cent of the first and are missed, and the peaks found can be grouped more than one way.
 * 4. Shell tunnelling with at least three CB peaks (levels and charging satellites) whose
 *    successive spacings are all alike (each within `ladderTolerance` of their mean, or within
 *    `ladderSigmas` combined errors): an even ladder that a charging multiplet explains as well as
 *    a series of levels (Δsp ≈ Ec).
 * 5. Shell tunnelling with Ec measured from a charging satellite and Δsp within `ladderTolerance`
 *    × Ec of it: the satellite of s coincides with p.
 * 6. Shell tunnelling with a CB level split into sub-levels spaced within `ladderTolerance` × Ec
 *    of Ec: sub-levels one Ec apart can be that level's charging peaks.
 * 7. Shell tunnelling with more levels in a shell than its states make spin pairs (more than 3
 *    in p): the extra peaks are likely charging peaks of its levels (near Γtip/Γsub = 0.2–0.4 a
 *    level of g states charges with steps of order g·r).
 *
 * References
 * ----------
 * The step ratio r/(1 + r) of the s doublet: orthodox theory, C. W. J. Beenakker, Phys. Rev. B 44,
 * 1646 (1991); E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002) (see
 * `secondToFirstStepRatio`).
 *
 * Example
 * -------
 * ```ts
 * // ε_s = 0.5, ε_p = 0.8, ε_v = −0.6 eV, Ec = 0.1 eV, η = 0.8: peaks at ±(|ε| + Ec(n + ½))/η;
 * // p shows 5 of its 6 charging peaks, and the window reaches past the sixth (1.9375 V).
 * const peak = (biasV: number): Peak => ({ biasV, biasUncertaintyV: 0.001, index: 0, heightS: 2e-10,
 *   prominenceS: 2e-10, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30 });
 * const peaks = [-0.9375, -0.8125, 0.6875, 0.8125, 1.3125, 1.4375, 1.5625, 1.6875, 1.8125].map(peak);
 * const assignment = assignSpectrum(peaks, { eta: 0.8 });   // shell filling, s 2, p 5
 * rulesDecisive({ peaks, assignment, biasRangeV: [-2, 2.2] }).reasons;
 * // => ["shell filling with 5 of the p multiplet's 6 charging peaks, although the next one (near 1.938 V, one Ec after the last) lies inside the window (to 2.200 V): a weak last charging step may be missed, or the peaks grouped another way"]
 * ```
 */
export function rulesDecisive(input: RulesDecisiveInput, options: RulesDecisiveOptions = {}): RulesDecisive {
  const D = RULES_DECISIVE_DEFAULTS;
  const margin = checkRange("stepRatioMargin", options.stepRatioMargin ?? D.stepRatioMargin, 0, 0.5);
  const edgeFwhms = checkRange("edgeFwhms", options.edgeFwhms ?? D.edgeFwhms, 0, 100);
  const tolerance = checkRange("ladderTolerance", options.ladderTolerance ?? D.ladderTolerance, 0, 1);
  const sigmas = checkRange("ladderSigmas", options.ladderSigmas ?? D.ladderSigmas, 0, 100);
  const [fromV, toV] = input.biasRangeV;
  checkFinite("biasRangeV[0]", fromV);
  checkFinite("biasRangeV[1]", toV);
  checkRange("biasRangeV[1]", toV, fromV, Infinity);
  const { peaks, assignment: a } = input;
  const reasons: string[] = [];
  if (a.noLevels !== null) return { decisive: true, reasons };
  if (a.regime === "undetermined") {
    reasons.push("the rules left the regime undetermined");
    return { decisive: false, reasons };
  }
  // 2. The s doublet's step ratio near a regime boundary.
  const q = a.evidence.secondToFirstStepRatio;
  const low = REGIME_LIMITS.tunnelingStepRatioMax - margin;
  const high = REGIME_LIMITS.fillingStepRatioMin + margin;
  if (q !== null && q >= low && q <= high) {
    reasons.push(
      `the second CB step is ${q.toFixed(2)} × the first, within the crossover band ${low.toFixed(2)}–${high.toFixed(2)} (r/(1 + r) for Γtip/Γsub from 3/7 to 1.5, ± ${margin}): the rate ratio may be near a regime boundary`,
    );
  }
  const cb = a.multiplets.filter((m) => m.band === "CB");
  const ecV = a.quantities.chargingEnergyV;
  if (a.regime === "shell-filling" && ecV !== null && ecV > 0) {
    // 3. A shell short of its degeneracy whose next charging peak lies inside the window.
    for (const m of cb) {
      if ((m.label !== "s" && m.label !== "p") || m.degeneracy === null || m.found === 0 || m.found >= m.degeneracy) continue;
      const lastV = m.peaksV[m.peaksV.length - 1];
      const fwhmV = Math.max(...m.peakIndices.map((i) => peaks[i].fwhmV));
      const nextV = lastV + ecV;
      if (nextV + edgeFwhms * fwhmV <= toV) {
        reasons.push(
          `shell filling with ${m.found} of the ${m.label} multiplet's ${m.degeneracy} charging peaks, although the next one (near ${nextV.toFixed(3)} V, one Ec after the last) lies inside the window (to ${toV.toFixed(3)} V): a weak last charging step may be missed, or the peaks grouped another way`,
        );
      }
    }
  }
  if (a.regime === "shell-tunneling") {
    // 4. An even ladder of CB peaks.
    const indices = [...new Set([...cb.flatMap((m) => m.peakIndices), ...a.evidence.satellitePeakIndices])];
    const cbPeaks = indices.map((i) => peaks[i]).sort((x, y) => x.biasV - y.biasV);
    if (cbPeaks.length >= 3) {
      const spacings = cbPeaks.slice(1).map((p, i) => ({ v: p.biasV - cbPeaks[i].biasV, sigma: Math.hypot(p.biasUncertaintyV, cbPeaks[i].biasUncertaintyV) }));
      const mean = spacings.reduce((s, d) => s + d.v, 0) / spacings.length;
      if (spacings.every((d) => Math.abs(d.v - mean) <= Math.max(tolerance * mean, sigmas * d.sigma))) {
        reasons.push(
          `shell tunnelling read from ${cbPeaks.length} CB peaks whose ${spacings.length} spacings are alike (${spacings.map((d) => (d.v * 1e3).toFixed(0)).join(", ")} mV, each within ${tolerance} of their mean or ${sigmas}σ): an even ladder that a charging multiplet fits as well as single levels`,
        );
      }
    }
    // 7. More levels in a shell than it has spin pairs.
    for (const m of cb) {
      if (m.degeneracy !== null && m.found > m.degeneracy / 2) {
        reasons.push(`shell tunnelling with ${m.found} levels in ${m.label}, more than its ${m.degeneracy} states hold in spin pairs (${m.degeneracy / 2}): some may be charging peaks`);
      }
    }
    const spV = a.quantities.levelSpacingSPV;
    if (ecV !== null && ecV > 0) {
      // 5. Δsp ≈ Ec: the satellite of s coincides with p.
      if (spV !== null && Math.abs(spV - ecV) <= tolerance * ecV) {
        reasons.push(`shell tunnelling with Δsp ${(spV * 1e3).toFixed(0)} mV within ${tolerance} × Ec (${(ecV * 1e3).toFixed(0)} mV, from a charging satellite): s's charging peak coincides with p`);
      }
      // 6. Sub-levels one Ec apart.
      for (const m of cb) {
        const gaps = m.peaksV.slice(1).map((v, i) => v - m.peaksV[i]);
        if (gaps.length && gaps.some((g) => Math.abs(g - ecV) <= tolerance * ecV)) {
          reasons.push(`shell tunnelling with ${m.label} split into ${m.found} sub-levels, ${gaps.map((g) => (g * 1e3).toFixed(0)).join(", ")} mV apart, within ${tolerance} × Ec (${(ecV * 1e3).toFixed(0)} mV) of Ec: they may be ${m.label}'s charging peaks`);
        }
      }
    }
  }
  return { decisive: reasons.length === 0, reasons };
}
