/**
 * Further starts of a fitted CB-side grouping with its p shell split at the sub-level spacings the
 * peaks show, and its rate ratio read from the s doublet's steps.
 */
import type { LevelSeed } from "./levelsToFit.ts";
import { parameterIndex } from "./parameterModel.ts";
import { rateRatioFromStepRatio } from "../regimeLimits.ts";
import { refinementStart, type RefinementStart, type StartLevel } from "./refinementStarts.ts";

/** Constants of {@link splitGridStarts} (locked by test/model/fit/splitGridStarts.test.ts). */
export const SPLIT_GRID_DEFAULTS = Object.freeze({
  /** Range of the candidate sub-level spacings, as fractions of the fitted Ec (a p shell split by less merges with its own charging peaks; by more, the upper sub-level is a shell of its own). */
  spacingEcRange: Object.freeze([0.25, 1.4]) as readonly number[],
  /** Most candidate spacings (the nearest to the first p peak first). */
  maxSpacings: 3,
  /** Candidate spacings closer than this fraction of Ec to one already taken are the same. */
  sameSpacingEc: 0.1,
  /** The first p peak is the CB peak nearest the fitted lowest p level's entry, (ε + Ec/2)/η, within this many Ec/η; else the entry itself. */
  entrySnapEc: 0.4,
  /** The first two CB peaks are the s doublet when they lie this close, relative, to one Ec/η apart … */
  doubletSpacingTolerance: 0.3,
  /** … and the first lies within this many Ec/η of the fitted s level's entry. */
  doubletEntryEc: 0.3,
  /** Peaks whose step is below this fraction of the CB peaks' median step are not used (noise-level peaks; a sub-level's entry steps 0.2–0.5 of the first CB step on the crossover benchmark). */
  minStepOfMedian: 0.15,
  /** Largest second-over-first step ratio read as a rate ratio (q → 1 is r → ∞: shell filling, where a step ratio barely tells r). */
  maxStepRatio: 0.9,
});

/** Options of {@link splitGridStarts}; every field optional. */
export interface SplitGridOptions {
  /**
   * Take the first p peak V₁ to be the first CB peak (of those used) after the s doublet (after
   * s's first peak where the first two are no doublet) instead of the peak nearest the fitted p
   * entry: the start for a grouping whose p level settled one entry off (fitCurve's rescue of a
   * poor comparison, {@link compareGroupings}). Default false.
   */
  firstPeakAfterS?: boolean;
}

/** A CB peak: its bias (V) and current step (A). */
export interface GridPeak {
  biasV: number;
  stepA: number;
}

/**
 * The p shell of a fitted CB-side grouping split at the spacings the peaks show.
 *
 * Parameters
 * ----------
 * seeds : readonly LevelSeed[]
 *     The grouping's CB levels (an s level and one or more p levels), in the order of its parameters.
 * parameters : readonly number[]
 *     Its fitted nonlinear parameters: |ε| per level (eV), Ec (eV), log₁₀ Γtip/Γsub, log₁₀ σ.
 * eta : number
 *     Voltage-division factor η.
 * peaks : readonly GridPeak[]
 *     The curve's peaks (bias in V, step in A); those at positive bias are used.
 * options : SplitGridOptions, optional
 *     `firstPeakAfterS` (default false): V₁ is the first CB peak after the s doublet.
 *
 * Returns
 * -------
 * RefinementStart[]
 *     For each candidate spacing δ (nearest first, at most D.maxSpacings), p split 2+4 (ε₁, ε₁ + δ),
 *     2+2+2 (ε₁, ε₁ + δ, ε₁ + 2δ) and, where δ/2 is in range too, 2+2+2 (ε₁, ε₁ + δ/2, ε₁ + δ: the
 *     peak the third sub-level's entry, the second's hidden), with s, Ec and σ as fitted (with
 *     `firstPeakAfterS`, all of them again with ε₁ one Ec lower); empty without an s and a p level.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * With D = SPLIT_GRID_DEFAULTS, Ec the fitted charging energy and P₀ < P₁ < … the CB peaks whose
 * step is at least D.minStepOfMedian × their median step:
 * 1. The first p peak V₁ is the peak nearest the lowest p level's entry from the empty dot,
 *    (ε_p + Ec/2)/η, within D.entrySnapEc·Ec/η (else that entry); ε₁ = η·V₁ − Ec/2. With
 *    `firstPeakAfterS`, V₁ is the first peak after the s doublet (P₂; P₁ where P₀ and P₁ are no
 *    doublet as in 3; no starts without one): at an intermediate rate ratio the p sub-levels are
 *    entered before s is full, so the first peak after the doublet is p's entry from the empty dot
 *    (ε₁ = η·V₁ − Ec/2) or, where that one is too weak to be found, its entry with one electron on
 *    the dot (ε₁ = η·V₁ − 3Ec/2): both are started, whatever level a poor fit settled at (crossover
 *    benchmark: starts 122 and 1077 the first, 545 the second).
 * 2. Each later peak V_k with δ = η·(V_k − V₁) within D.spacingEcRange × Ec is a candidate second
 *    sub-level entered from the empty dot (at an intermediate or small rate ratio a level's first
 *    peak is its entry, (ε + Ec/2)/η); spacings within D.sameSpacingEc·Ec of a nearer one are left out.
 * 3. Γtip/Γsub: where P₀ lies within D.doubletEntryEc·Ec/η of the fitted s entry and P₁ − P₀ within
 *    D.doubletSpacingTolerance of Ec/η (the s doublet), r = q/(1 − q) from the step ratio
 *    q = step(P₁)/step(P₀) < D.maxStepRatio (the closed form of `rateRatioFromStepRatio`); else
 *    the fitted value. A split p shell fitted at the wrong spacing settles at a wrong rate ratio
 *    too (at 0.3 for a true 0.6 on the benchmark), and the spacing is found only from a start near both.
 * 4. The levels are relabelled and their first-peak biases set as in {@link refinementStart}.
 *
 * Example
 * -------
 * ```ts
 * const seeds = [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.765, before: 0 },
 *   { band: "CB", label: "p", degeneracy: 6, firstPeakV: 1.176, before: 2 }] as LevelSeed[];
 * const peaks = [0.765, 0.882, 1.118, 1.235, 1.294].map((biasV, i) => ({ biasV, stepA: i === 1 ? 0.5 : 1 }));
 * splitGridStarts(seeds, [0.6, 0.9, 0.1, 0, -2], 0.85, peaks).map((s) => s.change);
 * // => ["p split 2+4 at the peaks, sub-levels 100 meV apart, Γtip/Γsub 1 (s step ratio)", "p split 2+2+2 at the peaks, …", "p split 2+4 …, 150 meV apart, …", …]
 * ```
 */
export function splitGridStarts(seeds: readonly LevelSeed[], parameters: readonly number[], eta: number, peaks: readonly GridPeak[], options: SplitGridOptions = {}): RefinementStart[] {
  const D = SPLIT_GRID_DEFAULTS;
  const at = parameterIndex(seeds.length);
  const ec = parameters[at.chargingEnergy];
  const sIndex = seeds.findIndex((s) => s.label === "s");
  const pIndex = seeds.map((s, j) => (/^p/.test(s.label) ? j : -1)).filter((j) => j >= 0);
  if (sIndex < 0 || !pIndex.length || !(ec > 0)) return [];
  const ecV = ec / eta;
  const positive = peaks.filter((p) => p.biasV > 0);
  const steps = positive.map((p) => p.stepA).sort((a, b) => a - b);
  const median = steps.length ? steps[Math.floor(steps.length / 2)] : 0;
  const cb = positive.filter((p) => p.stepA >= D.minStepOfMedian * median).sort((a, b) => a.biasV - b.biasV);
  const pLowest = Math.min(...pIndex.map((j) => parameters[j]));
  const entryV = (pLowest + ec / 2) / eta;
  const nearest = cb.reduce<GridPeak | null>((m, p) => (!m || Math.abs(p.biasV - entryV) < Math.abs(m.biasV - entryV) ? p : m), null);
  const sEntryV = (parameters[sIndex] + ec / 2) / eta;
  const doublet = cb.length >= 2 && Math.abs(cb[0].biasV - sEntryV) <= D.doubletEntryEc * ecV && Math.abs(cb[1].biasV - cb[0].biasV - ecV) <= D.doubletSpacingTolerance * ecV;
  // Where asked, the first p peak is the first CB peak after the s doublet (or after s's first).
  const afterS = options.firstPeakAfterS ? cb[doublet ? 2 : 1] ?? null : null;
  if (options.firstPeakAfterS && !afterS) return [];
  const firstV = afterS ? afterS.biasV : nearest && Math.abs(nearest.biasV - entryV) <= D.entrySnapEc * ecV ? nearest.biasV : entryV;
  const e1 = eta * firstV - ec / 2;
  const spacings: number[] = [];
  for (const p of cb) {
    const delta = eta * (p.biasV - firstV);
    if (delta < D.spacingEcRange[0] * ec || delta > D.spacingEcRange[1] * ec) continue;
    if (spacings.some((d) => Math.abs(d - delta) < D.sameSpacingEc * ec)) continue;
    if (spacings.length < D.maxSpacings) spacings.push(delta);
  }
  let logRatio = parameters[at.logRateRatio];
  let ratioWords = "Γtip/Γsub as fitted";
  if (doublet) {
    const q = cb[1].stepA / cb[0].stepA;
    if (q > 0 && q < D.maxStepRatio) {
      const r = rateRatioFromStepRatio(q);
      logRatio = Math.log10(r);
      ratioWords = `Γtip/Γsub ${r.toPrecision(2)} (s step ratio)`;
    }
  }
  const rest = [ec, logRatio, ...parameters.slice(at.logBroadening, at.logBroadening + 1)];
  const s: StartLevel = { label: "s", degeneracy: seeds[sIndex].degeneracy, energyEV: parameters[sIndex] };
  const sub = (g: number, e: number): StartLevel => ({ label: "p", degeneracy: g, energyEV: e });
  const out: RefinementStart[] = [];
  // After s, V₁ may also be p's entry with one electron on the dot (its entry from the empty dot unseen): ε₁ one Ec lower.
  const firsts: [number, string][] = afterS ? [[e1, ""], [e1 - ec, ", V₁ its entry with one electron"]] : [[e1, ""]];
  for (const [e, entryWords] of firsts) {
    for (const delta of spacings) {
      const words = `sub-levels ${(delta * 1000).toFixed(0)} meV apart, ${ratioWords}${entryWords}`;
      out.push(refinementStart([s, sub(2, e), sub(4, e + delta)], `p split 2+4 at the peaks, ${words}`, rest, eta));
      out.push(refinementStart([s, sub(2, e), sub(2, e + delta), sub(2, e + 2 * delta)], `p split 2+2+2 at the peaks, ${words}`, rest, eta));
      // The peak may be the third sub-level's entry, the second's hidden between.
      if (delta / 2 >= D.spacingEcRange[0] * ec) {
        out.push(refinementStart([s, sub(2, e), sub(2, e + delta / 2), sub(2, e + delta)], `p split 2+2+2 at the peaks, sub-levels ${((delta / 2) * 1000).toFixed(0)} meV apart (the peak the third's entry), ${ratioWords}${entryWords}`, rest, eta));
      }
    }
  }
  return out;
}
