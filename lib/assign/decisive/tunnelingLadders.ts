/**
 * Three tests of `rulesDecisive` (its notes 4, 10, and 5 with 6) on a shell-tunnelling reading
 * whose levels may be one level's charging peaks: an even ladder of CB peaks, a split shell
 * whose sub-levels and satellites form one, and spacings one Ec long.
 */
import type { Peak } from "../../peaks/findPeaks.ts";
import type { RulesDecisiveInput } from "../rulesDecisive.ts";

/** The codes of this module's tests, by note of `rulesDecisive`: 4, 10, 5, 6. */
export type TunnelingLadderCode = "even-ladder" | "split-ladder" | "satellite-at-p" | "sublevels-one-ec";

/** One reason of {@link evenLadderReasons}, {@link splitLadderReasons} or {@link ecSpacingReasons}. */
export interface TunnelingLadderReason {
  code: TunnelingLadderCode;
  /** In words, with the numbers. */
  text: string;
}

/** What an even ladder is (`ladderTolerance` and `ladderSigmas` of `rulesDecisive`, checked there). */
export interface EvenLadderLimits {
  /** Alike spacings lie within this fraction of their mean, dimensionless … */
  tolerance: number;
  /** … or within this many combined standard errors of the two peak positions. */
  sigmas: number;
}

/**
 * The CB's levels and charging satellites read by a shell-tunnelling reading, by bias: the peaks
 * of the CB multiplets and the peaks set aside as satellites (those include the VB's; only peaks
 * above zero bias are kept).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index.
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (its CB multiplets and `evidence.satellitePeakIndices`).
 *
 * Returns
 * -------
 * RulesDecisiveInput["peaks"]
 *     The peaks themselves (the same objects), ascending in bias.
 */
export function cbLadderPeaks(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"]): RulesDecisiveInput["peaks"] {
  const cbIndices = assignment.multiplets.filter((m) => m.band === "CB").flatMap((m) => m.peakIndices);
  const indices = [...new Set([...cbIndices, ...assignment.evidence.satellitePeakIndices])];
  return indices.map((i) => peaks[i]).filter((p) => p.biasV > 0).sort((x, y) => x.biasV - y.biasV);
}

/**
 * The reason to doubt a shell-tunnelling reading of an even ladder of CB peaks (note 4 of
 * `rulesDecisive`).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`biasV`, `biasUncertaintyV` in V are read).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets, the peaks set aside).
 * limits : EvenLadderLimits
 *     What counts as alike spacings.
 *
 * Returns
 * -------
 * TunnelingLadderReason[]
 *     One reason or none; none outside shell tunnelling.
 *
 * Notes
 * -----
 * Shell tunnelling with at least three CB peaks (levels and charging satellites) whose successive
 * spacings are all alike (each within `tolerance` of their mean, or within `sigmas` combined
 * errors): an even ladder that a charging multiplet explains as well as a series of levels
 * (Δsp ≈ Ec). Likewise at least four CB levels after s: near Γtip/Γsub = 0.3–0.4 a whole p level's
 * charging peaks read as sub-levels and a d level while s's satellite, r/(1 + r) ≈ 0.25 of s, is
 * not found (three alike remain a split p).
 */
export function evenLadderReasons(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"], limits: EvenLadderLimits): TunnelingLadderReason[] {
  const { tolerance, sigmas } = limits;
  if (assignment.regime !== "shell-tunneling") return [];
  const cbPeaks = cbLadderPeaks(peaks, assignment);
  const even = evenLadder(cbPeaks, tolerance, sigmas);
  // … or the levels after s, at least four: the charging ladder of a p level, s's satellite unseen.
  const cbIndices = assignment.multiplets.filter((m) => m.band === "CB").flatMap((m) => m.peakIndices);
  const afterS = cbIndices.map((i) => peaks[i]).sort((x, y) => x.biasV - y.biasV).slice(1);
  const evenAfterS = even || afterS.length < 4 ? null : evenLadder(afterS, tolerance, sigmas);
  if (!even && !evenAfterS) return [];
  const [run, spacings] = even ? [cbPeaks, even] : [afterS, evenAfterS!];
  return [{
    code: "even-ladder",
    text: `shell tunnelling read from ${run.length} CB peaks${even ? "" : " after s"} whose ${spacings.length} spacings are alike (${spacings.map((d) => (d * 1e3).toFixed(0)).join(", ")} mV, each within ${tolerance} of their mean or ${sigmas}σ): an even ladder that a charging multiplet fits as well as single levels`,
  }];
}

/**
 * The reasons to doubt a shell-tunnelling reading of a split shell whose sub-levels, with the
 * satellites after them, form an even ladder (note 10 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`biasV`, `biasUncertaintyV` in V, `stepA` in A).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets, the peaks set aside).
 * limits : EvenLadderLimits
 *     What counts as alike spacings.
 * satelliteMin, satelliteMax : number
 *     The range of the first satellite's step over the peak before it, dimensionless
 *     (`ladderSatelliteMin` and `ladderSatelliteMax` of `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * TunnelingLadderReason[]
 *     One reason per such shell; empty outside shell tunnelling.
 *
 * Notes
 * -----
 * Shell tunnelling with a shell split into sub-levels that, with the satellites after them, form
 * an even ladder (as in note 4), when the first satellite after the last sub-level steps
 * `satelliteMin`–`satelliteMax` × the peak before it: charging peaks that strong mean Γtip/Γsub is
 * no longer small, and one level's charging peaks read as sub-levels give just such a ladder (deep
 * in shell tunnelling, sub-levels alike and no strong satellite: not flagged).
 */
export function splitLadderReasons(
  peaks: RulesDecisiveInput["peaks"],
  assignment: RulesDecisiveInput["assignment"],
  limits: EvenLadderLimits,
  satelliteMin: number,
  satelliteMax: number,
): TunnelingLadderReason[] {
  const { tolerance, sigmas } = limits;
  const a = assignment;
  const out: TunnelingLadderReason[] = [];
  if (a.regime !== "shell-tunneling") return out;
  const cb = a.multiplets.filter((m) => m.band === "CB");
  cb.forEach((m, k) => {
    if (m.found < 2) return;
    const endV = cb[k + 1]?.peaksV[0] ?? Infinity;
    const after = a.evidence.satellitePeakIndices.filter((i) => peaks[i].biasV > m.peaksV[0] && peaks[i].biasV < endV);
    const run = [...new Set([...m.peakIndices, ...after])].map((i) => peaks[i]).sort((x, y) => x.biasV - y.biasV);
    const ladder = evenLadder(run, tolerance, sigmas);
    // The first satellite after the last sub-level, over the step of the peak before it.
    const lastSub = run.indexOf(peaks[m.peakIndices[m.peakIndices.length - 1]]);
    const next = run[lastSub + 1];
    const stepRatio = next ? next.stepA / run[lastSub].stepA : 0;
    if (!ladder || stepRatio < satelliteMin || stepRatio > satelliteMax) return;
    out.push({
      code: "split-ladder",
      text: `shell tunnelling with ${m.label} split into ${m.found} sub-levels that, with the ${after.length} peak(s) after them set aside as satellites (the first ${stepRatio.toFixed(2)} × the step before it, within ${satelliteMin}–${satelliteMax}: a charging peak of Γtip/Γsub no longer small), form an even ladder (${ladder.map((d) => (d * 1e3).toFixed(0)).join(", ")} mV, each within ${tolerance} of their mean or ${sigmas}σ): they may be one level's charging peaks`,
    });
  });
  return out;
}

/**
 * The reasons to doubt a shell-tunnelling reading with a spacing one Ec long: Δsp (note 5 of
 * `rulesDecisive`), then the sub-levels of each CB multiplet (note 6).
 *
 * Parameters
 * ----------
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets, Ec and Δsp in bias).
 * tolerance : number
 *     A spacing within this fraction of Ec of Ec is one Ec long, dimensionless (`ladderTolerance`
 *     of `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * TunnelingLadderReason[]
 *     The reasons; empty outside shell tunnelling or without a positive Ec.
 *
 * Notes
 * -----
 * 1. (note 5) Shell tunnelling with Ec measured from a charging satellite and Δsp within
 *    `tolerance` × Ec of it: the satellite of s coincides with p.
 * 2. (note 6) Shell tunnelling with a CB level split into sub-levels spaced within `tolerance` × Ec
 *    of Ec: sub-levels one Ec apart can be that level's charging peaks.
 */
export function ecSpacingReasons(assignment: RulesDecisiveInput["assignment"], tolerance: number): TunnelingLadderReason[] {
  const a = assignment;
  const ecV = a.quantities.chargingEnergyV;
  const spV = a.quantities.levelSpacingSPV;
  const out: TunnelingLadderReason[] = [];
  if (a.regime !== "shell-tunneling" || ecV === null || !(ecV > 0)) return out;
  // Δsp ≈ Ec: the satellite of s coincides with p.
  if (spV !== null && Math.abs(spV - ecV) <= tolerance * ecV) {
    out.push({ code: "satellite-at-p", text: `shell tunnelling with Δsp ${(spV * 1e3).toFixed(0)} mV within ${tolerance} × Ec (${(ecV * 1e3).toFixed(0)} mV, from a charging satellite): s's charging peak coincides with p` });
  }
  // Sub-levels one Ec apart.
  for (const m of a.multiplets.filter((x) => x.band === "CB")) {
    const gaps = m.peaksV.slice(1).map((v, i) => v - m.peaksV[i]);
    if (gaps.length && gaps.some((g) => Math.abs(g - ecV) <= tolerance * ecV)) {
      out.push({ code: "sublevels-one-ec", text: `shell tunnelling with ${m.label} split into ${m.found} sub-levels, ${gaps.map((g) => (g * 1e3).toFixed(0)).join(", ")} mV apart, within ${tolerance} × Ec (${(ecV * 1e3).toFixed(0)} mV) of Ec: they may be ${m.label}'s charging peaks` });
    }
  }
  return out;
}

/**
 * The spacings of peaks (sorted by bias, at least three) when they form an even ladder: every
 * spacing within `tolerance` × their mean or `sigmas` combined standard errors of it; else null.
 */
function evenLadder(sorted: readonly Pick<Peak, "biasV" | "biasUncertaintyV">[], tolerance: number, sigmas: number): number[] | null {
  if (sorted.length < 3) return null;
  const spacings = sorted.slice(1).map((p, i) => ({ v: p.biasV - sorted[i].biasV, sigma: Math.hypot(p.biasUncertaintyV, sorted[i].biasUncertaintyV) }));
  const mean = spacings.reduce((s, d) => s + d.v, 0) / spacings.length;
  return spacings.every((d) => Math.abs(d.v - mean) <= Math.max(tolerance * mean, sigmas * d.sigma)) ? spacings.map((d) => d.v) : null;
}
