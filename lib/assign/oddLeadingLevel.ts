/**
 * A shell-filling p whose first sub-group is odd (or whose ladder runs on past six), led by a peak
 * where a VB level's second-junction resonance lies: that peak is the resonance, not p's first
 * charging peak.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import type { Multiplet } from "./multiplets.ts";
import { matchToleranceV, type SecondJunctionResonance } from "./secondJunction.ts";
import { ladderPredictions } from "./ladderResonances.ts";

/** Limits of {@link oddLeadingLevel} (locked by test/assign/oddLeadingLevel.test.ts). */
export const ODD_LEADING_LEVEL_DEFAULTS = Object.freeze({
  /**
   * Carriers in the VB levels below a source set aside as a resonance itself (its level is not
   * known): the empty band, one doublet, a doublet and a level of four, … at most the VB peaks
   * nearer 0 V than it.
   */
  carriersBelow: Object.freeze([0, 2, 4, 6]) as readonly number[],
  /**
   * The next shell's first peak continues p's ladder when it lies (1 ± this) × Ec_V after p's
   * last (the reach of `completeShells` and of the sub-groups' spacing, a quarter of Ec).
   */
  continuationTolerance: 0.25,
});

/**
 * The first peak of a shell-filling p read with an odd first sub-group, where it lies at a VB
 * peak's predicted second-junction resonance.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[]
 *     The peak list of the assignment (positions, 1σ and FWHM in V).
 * multiplets : readonly Pick<Multiplet, "band" | "label" | "degeneracy" | "peakIndices" | "subgroups">[]
 *     The shell-filling assignment's multiplets.
 * resonances : readonly SecondJunctionResonance[]
 *     The peaks the assignment set aside as resonances.
 * chargingEnergyV : number
 *     Ec_V, the ladder's spacing in bias, V (> 0).
 * eta : number
 *     Voltage-division factor η in (0, 1).
 *
 * Returns
 * -------
 * SecondJunctionResonance | null
 *     p's first peak as a resonance of the VB peak whose prediction lies nearest it within
 *     tolerance; null when p's first sub-group is even and its ladder stops at six, p is missing,
 *     or no prediction reaches it.
 *
 * Notes
 * -----
 * 1. Every orbital sub-level of p holds two electrons (spin), so the charging peaks of a split p
 *    come in even sub-groups (2 + 4, 2 + 2 + 2, or 6 whole): an odd first sub-group says a peak
 *    too many (or too few) at p's start. So does a p of six whose ladder goes on: the next
 *    shell's first peak (1 ± `continuationTolerance`) × Ec_V after p's last, where a d shell lies
 *    its level spacing beyond (a seventh charging peak of one spacing is no p peak, and one of the
 *    six before it is).
 * 2. A VB peak at V predicts a resonance through the substrate junction at
 *    η/(1 − η)·(|V| − N·Ec_V) at positive bias, N the carriers in the VB levels below its own
 *    (`ladderResonances`, note 2). For the peaks of the VB groups that is `ladderPredictions`.
 *    A VB peak that shares its position with a CB level's own resonance is often set aside as
 *    that resonance, and its own prediction is then lost: such a peak is a source too, with each
 *    N of `ODD_LEADING_LEVEL_DEFAULTS.carriersBelow` up to the number of VB peaks nearer 0 V.
 * 3. The tolerance is that of the other matches (`matchToleranceV`): max(3σ, FWHM/2), σ
 *    combining the peak's and the source's scaled by η/(1 − η).
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991); C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6 (gain 1.5), Ec_V = 0.2 V: v1 doublet at −1.0, −1.2 V; a VB peak at −1.8 V set aside
 * // (a CB level's resonance lies there too); p read as 2.1 | 2.4 … 3.2 V. The peak at −1.8 V,
 * // behind the doublet (N = 2), predicts 1.5·(1.8 − 0.4) = 2.1 V.
 * const at = (biasV: number) => ({ biasV, biasUncertaintyV: 0.002, fwhmV: 0.04 });
 * const peaks = [-1.8, -1.2, -1.0, 2.1, 2.4, 2.6, 2.8, 3.0, 3.2].map(at);
 * const p = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [3, 4, 5, 6, 7, 8], subgroups: [1, 5] };
 * const v1 = { band: "VB" as const, label: "v1", degeneracy: null, peakIndices: [2, 1], subgroups: [2] };
 * oddLeadingLevel(peaks, [p, v1], [{ index: 0, sourceIndex: 4, predictedV: -1.8 }], 0.2, 0.6);
 * // => { index: 3, sourceIndex: 0, predictedV: 2.1000… }
 * ```
 */
export function oddLeadingLevel(
  peaks: readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[],
  multiplets: readonly Pick<Multiplet, "band" | "label" | "degeneracy" | "peakIndices" | "subgroups">[],
  resonances: readonly SecondJunctionResonance[],
  chargingEnergyV: number,
  eta: number,
): SecondJunctionResonance | null {
  if (!(eta > 0 && eta < 1) || !(chargingEnergyV > 0)) return null;
  const cb = multiplets.filter((m) => m.band === "CB");
  const k = cb.findIndex((m) => m.label === "p");
  const p = cb[k];
  if (!p || !p.peakIndices.length) return null;
  const odd = (p.subgroups[0] ?? p.peakIndices.length) % 2 !== 0;
  // The next shell's first peak one Ec_V after p's last: p's ladder goes on past six.
  const next = cb[k + 1]?.peakIndices[0];
  const last = p.peakIndices[p.peakIndices.length - 1];
  const step = next === undefined ? NaN : (peaks[next].biasV - peaks[last].biasV) / chargingEnergyV;
  const continues = p.peakIndices.length === 6 && Math.abs(step - 1) <= ODD_LEADING_LEVEL_DEFAULTS.continuationTolerance;
  if (!odd && !continues) return null;
  const gain = eta / (1 - eta);
  const index = p.peakIndices[0];
  const peak = peaks[index];
  const candidates: { sourceIndex: number; predictedV: number }[] = ladderPredictions(peaks, {
    multiplets: multiplets.filter((m) => m.band === "VB"),
    chargingEnergyV,
    eta,
  });
  candidates.push(...setAsideSourcePredictions(peaks, resonances, chargingEnergyV, eta));
  let best: SecondJunctionResonance | null = null;
  let bestMiss = Infinity;
  for (const { sourceIndex, predictedV } of candidates) {
    const miss = Math.abs(peak.biasV - predictedV);
    if (miss <= matchToleranceV(peaks[sourceIndex], peak, gain) && miss < bestMiss) {
      best = { index, sourceIndex, predictedV };
      bestMiss = miss;
    }
  }
  return best;
}

/**
 * The resonances that VB peaks set aside as resonances would predict if they held a level too
 * (note 2 of {@link oddLeadingLevel}): for each, η/(1 − η)·(|V| − N·Ec_V) for every N of
 * `ODD_LEADING_LEVEL_DEFAULTS.carriersBelow` up to the number of VB peaks nearer 0 V, V (positive
 * bias), with the peak's index as `sourceIndex`. Empty for η outside (0, 1).
 */
export function setAsideSourcePredictions(
  peaks: readonly Pick<Peak, "biasV">[],
  resonances: readonly Pick<SecondJunctionResonance, "index">[],
  chargingEnergyV: number,
  eta: number,
): { sourceIndex: number; predictedV: number }[] {
  if (!(eta > 0 && eta < 1)) return [];
  const gain = eta / (1 - eta);
  const out: { sourceIndex: number; predictedV: number }[] = [];
  for (const r of resonances) {
    const src = peaks[r.index];
    if (!(src.biasV < 0)) continue;
    const nearer = peaks.filter((q) => q.biasV < 0 && q.biasV > src.biasV).length;
    for (const n of ODD_LEADING_LEVEL_DEFAULTS.carriersBelow) if (n <= nearer) out.push({ sourceIndex: r.index, predictedV: gain * (Math.abs(src.biasV) - n * chargingEnergyV) });
  }
  return out;
}
