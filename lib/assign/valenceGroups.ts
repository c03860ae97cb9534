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

/**
 * The VB gap-edge level's missing charging peak among the peaks set aside as second-junction
 * resonances (shell filling).
 *
 * Parameters
 * ----------
 * groups : readonly BandPeak[][]
 *     The VB groups from {@link valenceGroups} in shell filling, from the gap edge outward.
 * setAside : readonly BandPeak[]
 *     VB peaks set aside as second-junction resonances (`x` = |bias|, V).
 * chargingEnergyV : number
 *     Ec in bias from the CB ladder, V; > 0.
 *
 * Returns
 * -------
 * BandPeak | null
 *     The set-aside peak that is the gap-edge group's first charging peak, or null.
 *
 * Notes
 * -----
 * Spin alone puts two carriers on every level, so in shell filling each level shows at least two
 * charging peaks Ec apart. A gap-edge group of one peak lacks one, and not further out (a peak one
 * Ec beyond would have joined it): where a peak set aside as a resonance lies one Ec nearer the
 * gap, to within (1 ± `ASSIGN_DEFAULTS.valenceChargingTolerance`)·Ec, and steps at least
 * `ASSIGN_DEFAULTS.fillingStepRatio[0]` × the group's peak (it holds the level's step and the
 * resonance's), the level and the resonance share that peak. Set aside, it moves the gap edge one
 * Ec out. Of two such peaks the one nearer one Ec is taken.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: -x, stepA: 1e-12 } as Peak });
 * // v1 read as −1.3 V alone, a resonance set aside at −1.0 V, Ec = 0.3 V in bias.
 * valenceEdgePartner([[at(1.3, 1)], [at(1.9, 0)]], [at(1.0, 2)], 0.3)?.index;  // => 2
 * ```
 */
export function valenceEdgePartner(groups: readonly BandPeak[][], setAside: readonly BandPeak[], chargingEnergyV: number): BandPeak | null {
  const edge = groups[0];
  if (!edge || edge.length !== 1 || !(chargingEnergyV > 0)) return null;
  const t = ASSIGN_DEFAULTS.valenceChargingTolerance;
  const miss = (p: BandPeak) => Math.abs(edge[0].x - p.x - chargingEnergyV);
  const candidates = setAside
    .filter((p) => p.x < edge[0].x && miss(p) <= t * chargingEnergyV && p.peak.stepA >= ASSIGN_DEFAULTS.fillingStepRatio[0] * edge[0].peak.stepA)
    .sort((a, b) => miss(a) - miss(b));
  return candidates[0] ?? null;
}
