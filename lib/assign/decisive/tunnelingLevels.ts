/**
 * Two tests of `rulesDecisive` (its notes 14 and 7) on the levels a shell-tunnelling reading
 * counts in a shell: a d level close after a p that steps like a sub-level, and more levels in a
 * shell than it has spin pairs.
 */
import { ASSIGN_DEFAULTS } from "../assignDefaults.ts";
import type { RulesDecisiveInput } from "../rulesDecisive.ts";
import { stepsShortOfP } from "../shells.ts";

/** The codes of this module's tests, by note of `rulesDecisive`: 14, 7. */
export type TunnelingLevelCode = "d-near-split-p" | "levels-over-pairs";

/** One reason of {@link dNearSplitPReasons} or {@link levelsOverPairsReasons}. */
export interface TunnelingLevelReason {
  code: TunnelingLevelCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reason to doubt a shell-tunnelling reading of a d level close after a p that steps like a
 * sub-level (note 14 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`stepA` in A is read).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime and the CB multiplets s, p and d).
 *
 * Returns
 * -------
 * TunnelingLevelReason[]
 *     One reason or none; none outside shell tunnelling.
 *
 * Notes
 * -----
 * Shell tunnelling with a level read as d within `ASSIGN_DEFAULTS.tunnelingSublevelStepFraction`
 * (0.75) × the s→p distance of p's last level, p's first level stepping at most
 * `ASSIGN_DEFAULTS.tunnelingSublevelFirstStepMax` (1.3) × the s level and p's levels together
 * at most `tunnelingSublevelStepMax` (2.5) × (`stepsShortOfP`): a level of g states after s steps
 * g/(2(1 + (2 + g)r)) × s, so p looks short of its six states (a 2-state sub-level steps at most
 * 1 ×; the whole p 3/(1 + 8r)), and d lies at least one s→p distance above p in the usual
 * confinement potentials: the "d" may be p's other sub-level. The rules join it to p themselves
 * only deep in the regime (no charging satellite); nearer the crossover the whole p steps as
 * little and its charging peaks can sit as close.
 */
export function dNearSplitPReasons(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"]): TunnelingLevelReason[] {
  if (assignment.regime !== "shell-tunneling") return [];
  const cb = assignment.multiplets.filter((m) => m.band === "CB");
  const [sM, pM, dM] = ["s", "p", "d"].map((label) => cb.find((m) => m.label === label));
  if (!(sM && pM && dM && pM.found > 0 && dM.found > 0)) return [];
  const sStep = peaks[sM.peakIndices[0]].stepA;
  const pSteps = pM.peakIndices.map((i) => peaks[i].stepA);
  const spV = pM.peaksV[0] - sM.peaksV[0];
  const gapV = dM.peaksV[0] - pM.peaksV[pM.peaksV.length - 1];
  const A = ASSIGN_DEFAULTS;
  if (!(sStep > 0 && stepsShortOfP(sStep, pSteps) && gapV < A.tunnelingSublevelStepFraction * spV)) return [];
  return [{
    code: "d-near-split-p",
    text: `shell tunnelling with a d level ${(gapV * 1e3).toFixed(0)} mV after p's last, ${(gapV / spV).toFixed(2)} × the s→p distance (< ${A.tunnelingSublevelStepFraction}), while p's first level steps ${(pSteps[0] / sStep).toFixed(2)} × s (≤ ${A.tunnelingSublevelFirstStepMax}; a 2-state sub-level steps at most 1 ×, the whole p more deep in the regime): d may be p's other sub-level`,
  }];
}

/**
 * The reasons to doubt a shell-tunnelling reading with more levels in a shell than its states
 * make spin pairs (note 7 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime and CB multiplets).
 *
 * Returns
 * -------
 * TunnelingLevelReason[]
 *     One reason per such shell; empty outside shell tunnelling.
 *
 * Notes
 * -----
 * Shell tunnelling with more levels in a shell than its states make spin pairs (more than 3 in
 * p): the extra peaks are likely charging peaks of its levels (near Γtip/Γsub = 0.2–0.4 a level of
 * g states charges with steps of order g·r).
 */
export function levelsOverPairsReasons(assignment: RulesDecisiveInput["assignment"]): TunnelingLevelReason[] {
  if (assignment.regime !== "shell-tunneling") return [];
  return assignment.multiplets
    .filter((m) => m.band === "CB" && m.degeneracy !== null && m.found > m.degeneracy / 2)
    .map((m): TunnelingLevelReason => ({ code: "levels-over-pairs", text: `shell tunnelling with ${m.found} levels in ${m.label}, more than its ${m.degeneracy} states hold in spin pairs (${m.degeneracy! / 2}): some may be charging peaks` }));
}
