/**
 * Two tests of `rulesDecisive` (its notes 8 and 12) on CB peaks a shell-tunnelling reading set
 * aside as charging satellites that may hide a level: one too broad, one stepping too much.
 */
import { medianInPlace } from "../../util/medianInPlace.ts";
import type { RulesDecisiveInput } from "../rulesDecisive.ts";
import { cbLadderPeaks } from "./tunnelingLadders.ts";

/** The codes of this module's tests, by note of `rulesDecisive`: 8, 12. */
export type TunnelingSatelliteCode = "broad-satellite" | "strong-satellite";

/** One reason of {@link broadSatelliteReasons} or {@link strongSatelliteReasons}. */
export interface TunnelingSatelliteReason {
  code: TunnelingSatelliteCode;
  /** In words, with the numbers. */
  text: string;
}

/**
 * The reasons to doubt a shell-tunnelling reading that set aside a broad CB peak as a charging
 * satellite (note 8 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`biasV`, `fwhmV` in V are read).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets, the peaks set aside).
 * broadRatio : number
 *     The least multiple of the median FWHM that counts as broad, dimensionless (`broadFwhmRatio`
 *     of `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * TunnelingSatelliteReason[]
 *     One reason per such peak, by bias; empty outside shell tunnelling or with fewer than two CB
 *     peaks read.
 *
 * Notes
 * -----
 * Shell tunnelling with a CB peak set aside as a charging satellite, between the first and the
 * last CB peak read, at least `broadRatio` × the median FWHM of those peaks (satellites between
 * included) wide: unresolved peaks (near Γtip/Γsub = 0.2–0.3 a split p's sub-level merged with a
 * charging peak), among which a level may hide.
 */
export function broadSatelliteReasons(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"], broadRatio: number): TunnelingSatelliteReason[] {
  const a = assignment;
  const cbIndices = a.multiplets.filter((m) => m.band === "CB").flatMap((m) => m.peakIndices);
  if (a.regime !== "shell-tunneling" || cbIndices.length < 2) return [];
  const cbV = cbIndices.map((i) => peaks[i].biasV);
  const [firstV, lastV] = [Math.min(...cbV), Math.max(...cbV)];
  const between = a.evidence.satellitePeakIndices.filter((i) => peaks[i].biasV > firstV && peaks[i].biasV < lastV);
  const typicalV = medianInPlace(Float64Array.from([...cbIndices, ...between].map((i) => peaks[i].fwhmV)));
  return between.filter((k) => peaks[k].fwhmV >= broadRatio * typicalV).sort((x, y) => peaks[x].biasV - peaks[y].biasV).map((i): TunnelingSatelliteReason => ({
    code: "broad-satellite",
    text: `shell tunnelling with the CB peak at ${peaks[i].biasV.toFixed(3)} V set aside as a charging satellite although it is ${(peaks[i].fwhmV * 1e3).toFixed(0)} mV wide, ${(peaks[i].fwhmV / typicalV).toFixed(1)} × the median FWHM of the CB peaks read (${(typicalV * 1e3).toFixed(0)} mV; ≥ ${broadRatio}): unresolved peaks, among which a level (a sub-level of p merged with a charging peak) may hide`,
  }));
}

/**
 * The reasons to doubt a shell-tunnelling reading that set aside, as a charging satellite, a CB
 * peak stepping nearly as much as the peak before it (note 12 of `rulesDecisive`).
 *
 * Parameters
 * ----------
 * peaks : RulesDecisiveInput["peaks"]
 *     The peaks the assignment names by index (`biasV` in V, `stepA` in A are read).
 * assignment : RulesDecisiveInput["assignment"]
 *     The rules' assignment (regime, CB multiplets, the peaks set aside).
 * satelliteMax : number
 *     The least step over the CB peak before it that flags a satellite, dimensionless
 *     (`ladderSatelliteMax` of `rulesDecisive`, checked there).
 *
 * Returns
 * -------
 * TunnelingSatelliteReason[]
 *     One reason per such peak, by bias; empty outside shell tunnelling.
 *
 * Notes
 * -----
 * Shell tunnelling with a CB peak after the first set aside as a charging satellite although it
 * steps at least `satelliteMax` × the CB peak before it (levels and satellites, `cbLadderPeaks`):
 * a level's charging peak steps less than the peak before it (as in note 10), so it may be a
 * sub-level the rules did not count.
 */
export function strongSatelliteReasons(peaks: RulesDecisiveInput["peaks"], assignment: RulesDecisiveInput["assignment"], satelliteMax: number): TunnelingSatelliteReason[] {
  const a = assignment;
  const out: TunnelingSatelliteReason[] = [];
  if (a.regime !== "shell-tunneling") return out;
  const cbPeaks = cbLadderPeaks(peaks, a);
  const cbIndices = a.multiplets.filter((m) => m.band === "CB").flatMap((m) => m.peakIndices);
  const firstCbV = cbPeaks.length ? Math.min(...cbIndices.map((i) => peaks[i].biasV)) : Infinity;
  cbPeaks.forEach((p, j) => {
    const i = peaks.indexOf(p);
    if (j === 0 || p.biasV <= firstCbV || !a.evidence.satellitePeakIndices.includes(i) || p.stepA < satelliteMax * cbPeaks[j - 1].stepA) return;
    out.push({
      code: "strong-satellite",
      text: `shell tunnelling with the CB peak at ${p.biasV.toFixed(3)} V set aside as a charging satellite although it steps ${(p.stepA / cbPeaks[j - 1].stepA).toFixed(2)} × the peak before it (≥ ${satelliteMax}; a level's charging peak steps less): it may be a sub-level the rules did not count`,
    });
  });
  return out;
}
