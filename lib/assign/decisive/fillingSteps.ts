/**
 * Two tests of `rulesDecisive` (its notes 9 with 15, and 17) on the charging steps inside a
 * sub-group of a shell-filling multiplet: a dip or a rise among steps that should fall one after
 * another, and a sub-group of two whose second step is far larger than its first.
 */
import { subgroupSpans } from "../multiplets.ts";
import type { RulesDecisiveInput } from "../rulesDecisive.ts";

/** The codes of this module's tests, by note of `rulesDecisive`: 9, 15, 17. */
export type FillingStepCode = "charging-dip" | "charging-rise" | "pair-rise";

/** One reason of {@link chargingStepReasons} or {@link pairRiseReasons}. */
export interface FillingStepReason {
  code: FillingStepCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reasons to doubt a shell-filling reading whose charging steps inside a sub-group dip or rise
 * (notes 9 and 15 of `rulesDecisive`), sub-group by sub-group: its dips, then its rises.
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`stepA` in A is read).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets with their sub-groups).
 * dipRatio : number
 *     A step below this fraction of both neighbours' is a dip, and one above 1/`dipRatio` × the
 *     step before is a rise, dimensionless (`dipStepRatio` of `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * FillingStepReason[]
 *     One reason per dip and per rise; empty outside shell filling.
 *
 * Notes
 * -----
 * 1. (note 9) Shell filling with a dip inside a sub-group of a multiplet: a charging step below
 *    `dipRatio` × both its neighbours'. A level's charging steps fall one after another; a dip
 *    is a higher sub-level entered before the lower is full (near Γtip/Γsub = 2.5–3.5 in a p
 *    split 2+4 or 2+2+2), counted as a charging peak, which puts the rest of p one Ec low.
 * 2. (note 15) Shell filling with a rise inside a sub-group of three or more charging peaks: a
 *    step above 1/`dipRatio` (1.18) × the step before it, other than the rise after a dip (told
 *    by 1). One level of g states filled from the tip has P(N) ∝ C(g, N)·r^N on each plateau
 *    (detailed balance of in at (g − N)·Γtip, out at N·Γsub), so the plateau currents
 *    I_k ∝ Σ_{N ≤ k} N·C(g, N)·r^N / Σ_{N ≤ k} C(g, N)·r^N rise by steps that fall one after another
 *    (g = 6: successive ratios 0.99, 0.99, 0.98, 0.94, 0.80 at r = 10; 0.97 … 0.52 at r = 3; g = 2:
 *    r/(1 + r)); the margin is the dip's (a measured step scatters by about ± 0.1). A rise puts a
 *    peak of another sub-level (its entry, or a channel) among the level's charging peaks, and the
 *    peaks after it one charging peak off. On the crossover benchmark (fast model, seeds 1, 1001,
 *    2001, 200 spectra each, 2026-12-03) it fired on 7, 6 and 8 spectra, every one a failing
 *    reading of the rules, 3 of them sent to the fit by no other reason (all three then right); on
 *    the default mix on 2, 1 and 3 intermediate spectra, all fitted already, and on no spectrum of
 *    the two regimes.
 */
export function chargingStepReasons(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"], dipRatio: number): FillingStepReason[] {
  const out: FillingStepReason[] = [];
  if (assignment.regime !== "shell-filling") return out;
  for (const m of assignment.multiplets.filter((x) => x.band === "CB")) {
    for (const { start, indices } of subgroupSpans(m)) {
      const steps = indices.map((i) => peaks[i].stepA);
      const dips = new Set<number>();
      for (let j = 1; j < steps.length - 1; j++) {
        if (steps[j] < dipRatio * Math.min(steps[j - 1], steps[j + 1])) {
          dips.add(j);
          out.push({
            code: "charging-dip",
            text: `shell filling with a dip in ${m.label}'s charging steps: the peak at ${m.peaksV[start + j].toFixed(3)} V steps ${(steps[j] / steps[j - 1]).toFixed(2)} × the one before and ${(steps[j] / steps[j + 1]).toFixed(2)} × the one after (both < ${dipRatio}), whereas a level's charging steps fall one after another: a higher sub-level entered before the lower is full, counted as a charging peak`,
          });
        }
      }
      // A rise in the charging steps inside a sub-group of three or more (a dip's rise is told above).
      for (let j = 1; steps.length >= 3 && j < steps.length; j++) {
        if (!dips.has(j - 1) && steps[j - 1] < dipRatio * steps[j]) {
          out.push({
            code: "charging-rise",
            text: `shell filling with a rise in ${m.label}'s charging steps: the peak at ${m.peaksV[start + j].toFixed(3)} V steps ${(steps[j] / steps[j - 1]).toFixed(2)} × the one before (> 1/${dipRatio}), whereas a level's charging steps fall one after another: the peaks of two sub-levels (or a channel) may be counted as one level's`,
          });
        }
      }
    }
  }
  return out;
}

/**
 * The reasons to doubt a shell-filling reading with a sub-group of two whose second charging peak
 * steps far more than its first (note 17 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`stepA` in A is read).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets with their sub-groups).
 * pairRise : number
 *     The least multiple of the first step that flags the second, dimensionless (`pairRiseRatio`
 *     of `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * FillingStepReason[]
 *     One reason per such sub-group; empty outside shell filling.
 *
 * Notes
 * -----
 * Shell filling with a sub-group of two charging peaks (a 2-state level or sub-level) whose
 * second steps at least `pairRise` × its first. Filled from the tip, a 2-state level's second
 * charging step is r/(1 + r) × its first (< 1; as for the s doublet); one far larger carries the
 * step of another peak merged with it (at low η a resonance through the substrate junction), whose
 * position it pulls. Note 15 leaves sub-groups of two alone: at low η such merged steps are common
 * and mostly harmless. On the low-η benchmark (fast model, seeds 1, 1001, 2001, 200 spectra each,
 * 2026-12-05) it fired on 10, 15 and 12 shell-filling spectra the rules decided alone, 2, 1 and 1
 * of them failing readings: the fit then right on 2, 1 and 0 of those and none of the passing ones
 * broken; on the default mix and crossover seeds 1 and 1001 it sends none. With note 16, on the
 * held-out low-η seeds 3001 and 4001 the two send 13 and 14 such spectra: the fit right on 1 and 4
 * failing readings, and wrong on 1 passing one.
 */
export function pairRiseReasons(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"], pairRise: number): FillingStepReason[] {
  const out: FillingStepReason[] = [];
  if (assignment.regime !== "shell-filling") return out;
  for (const m of assignment.multiplets.filter((x) => x.band === "CB")) {
    for (const { start, size, indices } of subgroupSpans(m)) {
      const [first, second] = indices.map((i) => peaks[i].stepA);
      if (size === 2 && first > 0 && second >= pairRise * first) {
        out.push({
          code: "pair-rise",
          text: `shell filling with ${m.label}'s charging peak at ${m.peaksV[start + 1].toFixed(3)} V stepping ${(second / first).toFixed(2)} × the one before it in a sub-group of two (≥ ${pairRise}), whereas a 2-state level's second charging peak steps r/(1 + r) < 1 × its first: another peak (a resonance through the substrate junction) may be merged with it and pull its position`,
        });
      }
    }
  }
  return out;
}
