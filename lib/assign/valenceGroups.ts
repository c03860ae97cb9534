/**
 * Valence-band peaks grouped into charging multiplets (shell filling) or single levels.
 */
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { BandPeak } from "./bandPeaks.ts";
import type { Regime } from "./regime.ts";

/**
 * Group the VB main peaks.
 *
 * Parameters
 * ----------
 * vb : readonly BandPeak[]
 *     VB main peaks (noise and satellites set aside), from the gap edge outward (`x` = |bias|, V).
 * chargingEnergyV : number | null
 *     Ec in bias from the CB ladder, V; null when not measured.
 * regime : Regime
 *     Only "shell-filling" groups peaks; otherwise every peak is its own group.
 *
 * Returns
 * -------
 * BandPeak[][]
 *     The groups, from the gap edge outward.
 *
 * Notes
 * -----
 * 1. In shell filling with a measured Ec, a peak whose distance to the last peak of the current
 *    group is within (1 ± `ASSIGN_DEFAULTS.valenceChargingTolerance`)·Ec joins that group (a
 *    charging multiplet); any other peak starts a new group.
 * 2. Degeneracy is not assumed: a valence spacing close to Ec merges two groups.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: -x } as Peak });
 * // −0.8125, −0.9375 V (one level, Ec = 0.125 V in bias), then −1.3125 V.
 * valenceGroups([at(0.8125, 2), at(0.9375, 1), at(1.3125, 0)], 0.125, "shell-filling")
 *   .map((g) => g.map((p) => p.index));  // => [[2, 1], [0]]
 * ```
 */
export function valenceGroups(vb: readonly BandPeak[], chargingEnergyV: number | null, regime: Regime): BandPeak[][] {
  const groups: BandPeak[][] = [];
  for (const p of vb) {
    const last = groups[groups.length - 1];
    if (last && regime === "shell-filling" && chargingEnergyV !== null) {
      const d = p.x - last[last.length - 1].x;
      if (Math.abs(d - chargingEnergyV) <= ASSIGN_DEFAULTS.valenceChargingTolerance * chargingEnergyV) {
        last.push(p);
        continue;
      }
    }
    groups.push([p]);
  }
  return groups;
}
