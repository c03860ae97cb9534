/**
 * Further starts around the best grouping the comparison found: its p shell split into
 * sub-levels about the fitted p level, and its rate ratio moved either way, from its own fitted
 * values.
 */
import type { LevelSeed } from "./levelsToFit.ts";
import { parameterIndex } from "./parameterModel.ts";

/** Constants of {@link refinementStarts} (locked by test/model/fit/refinementStarts.test.ts). */
export const REFINEMENT_DEFAULTS = Object.freeze({
  /**
   * Sub-level spacings of the split starts, as fractions of the fitted Ec: a whole p level fitted
   * to a split shell settles between its sub-levels with Ec too high by a share of the spacing,
   * and Levenberg–Marquardt finds the split only from a start on the right side of it.
   */
  splitSpacingsEc: Object.freeze([0.35, 0.9]) as readonly number[],
  /**
   * Offset of log₁₀ Γtip/Γsub of a further 2+2+2 split start of a whole p level fitted below
   * Γtip/Γsub = 1: on the tunnelling side a whole p level fitted to a split shell also inflates the
   * rate ratio (1.5–1.9 × the truth on the benchmark's wrong fits), and the split at the inflated
   * ratio settles there.
   */
  splitRateRatioOffsetLog10: -0.5,
  /**
   * Least relative drop from the fitted Ec to the peak-based Ec (the rules' shell-filling Ec, from
   * the spacing of the charging peaks) for a further 2+2+2 split start of a whole p level at the
   * peak-based Ec: a whole p ladder fitted to a split shell also stretches Ec over the sub-level
   * spacing (its mean peak spacing is Ec + 2δ/5 for 2+2+2), which a split at the fitted Ec does
   * not undo in a few iterations. Each level is placed so that its peaks keep the centroid they
   * have in the fitted ladder (note 4).
   */
  peakEcMinDrop: 0.05,
  /** Offsets of log₁₀ Γtip/Γsub of the restarts from the fitted value (× 1/3 and × 3). */
  rateRatioOffsetsLog10: Object.freeze([-0.5, 0.5]) as readonly number[],
});

/** One further start: the CB levels to fit and the nonlinear parameters to start from. */
export interface RefinementStart {
  /** CB levels (band, label, degeneracy, the bias of a first charging peak consistent with the start, carriers before). */
  seeds: LevelSeed[];
  /** |ε| per level (eV), Ec (eV), log₁₀ Γtip/Γsub, log₁₀ σ (σ in eV): the {@link parameterIndex} layout. */
  parameters: number[];
  /** What changed, in words ("p split 2+2+2, sub-levels 60 meV apart", "Γtip/Γsub × 3"). */
  change: string;
  /** CB degeneracies, e.g. "2+2+2+2". */
  layout: string;
}

/**
 * The further starts of a fitted CB-side grouping.
 *
 * Parameters
 * ----------
 * seeds : readonly LevelSeed[]
 *     The grouping's CB levels, in the order of its parameters.
 * parameters : readonly number[]
 *     Its fitted nonlinear parameters: |ε| per level (eV), Ec (eV), log₁₀ Γtip/Γsub, log₁₀ σ.
 * eta : number
 *     Voltage-division factor η.
 * peakChargingEnergyEV : number | null, optional
 *     The peak-based Ec in eV (the rules' shell-filling Ec), or null. Default null.
 *
 * Returns
 * -------
 * RefinementStart[]
 *     The splits first (p whole into 2+4 and 2+2+2, a p sub-level of 4 into 2+2, at each spacing;
 *     then p whole into 2+2+2 at the peak-based Ec, when given and lower), then the rate-ratio
 *     restarts with the levels as fitted.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * With D = REFINEMENT_DEFAULTS, ε_p the fitted level, Ec the fitted charging energy and δ each
 * of D.splitSpacingsEc × Ec:
 * 1. p whole (degeneracy 6) → 2+4 at ε_p − 2δ/3 and ε_p + δ/3, and 2+2+2 at ε_p − δ, ε_p, ε_p + δ
 *    (the degeneracy-weighted mean stays at ε_p); where the fitted Γtip/Γsub is below 1, the 2+2+2
 *    split once more with log₁₀ Γtip/Γsub moved by D.splitRateRatioOffsetLog10.
 * 2. A p sub-level of 4 → 2+2 at its ε ∓ δ/2.
 * 3. The p levels are relabelled p1, p2, … in order; each level's `before` counts the CB carriers
 *    of the levels before it, and its first-peak bias is (ε + Ec·(before + ½))/η, so that
 *    {@link startingValues} started from Ec reproduces ε (and bounds each level about it).
 * 4. With a whole p level and a peak-based Ec E' below (1 − D.peakEcMinDrop)·Ec: the p level split
 *    2+2+2 at Ec = E', each level (g carriers after b before it) at ε + (Ec − E')·(b + g/2), where
 *    its peaks, ε + E'·(N + ½) for N = b … b + g − 1, have the centroid that the fitted ladder
 *    gives those carriers (the sub-levels end up 2·(Ec − E') apart).
 * 5. The same levels, Ec and σ with log₁₀ Γtip/Γsub moved by each of D.rateRatioOffsetsLog10.
 *
 * Example
 * -------
 * ```ts
 * const seeds = [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.76, before: 0 },
 *   { band: "CB", label: "p", degeneracy: 6, firstPeakV: 1.18, before: 2 }] as const;
 * refinementStarts(seeds, [0.6, 0.9, 0.1, 0, -2], 0.85).map((s) => s.layout);
 * // => ["2+2+4", "2+2+2+2", "2+2+4", "2+2+2+2", "2+6", "2+6"]
 * ```
 */
export function refinementStarts(seeds: readonly LevelSeed[], parameters: readonly number[], eta: number, peakChargingEnergyEV: number | null = null): RefinementStart[] {
  const D = REFINEMENT_DEFAULTS;
  const at = parameterIndex(seeds.length);
  const ec = parameters[at.chargingEnergy];
  const tail = parameters.slice(seeds.length);
  const levels = seeds.map((s, j) => ({ label: s.label, degeneracy: s.degeneracy, energyEV: parameters[j] }));
  const out: RefinementStart[] = [];
  const make = (list: StartLevel[], change: string, rest: number[] = tail): RefinementStart => refinementStart(list, change, rest, eta);
  for (const spacing of D.splitSpacingsEc) {
    const delta = spacing * ec;
    const words = `${(delta * 1000).toFixed(0)} meV apart`;
    levels.forEach((l, j) => {
      if (!/^p/.test(l.label)) return;
      const before = levels.slice(0, j), after = levels.slice(j + 1);
      const sub = (g: number, e: number) => ({ label: "p", degeneracy: g, energyEV: e });
      if (l.degeneracy === 6) {
        out.push(make([...before, sub(2, l.energyEV - (2 * delta) / 3), sub(4, l.energyEV + delta / 3), ...after], `p split 2+4, sub-levels ${words}`));
        out.push(make([...before, sub(2, l.energyEV - delta), sub(2, l.energyEV), sub(2, l.energyEV + delta), ...after], `p split 2+2+2, sub-levels ${words}`));
        if (tail[1] < 0) {
          const slower = [tail[0], tail[1] + D.splitRateRatioOffsetLog10, ...tail.slice(2)];
          out.push(make([...before, sub(2, l.energyEV - delta), sub(2, l.energyEV), sub(2, l.energyEV + delta), ...after], `p split 2+2+2, sub-levels ${words}, Γtip/Γsub × ${(10 ** D.splitRateRatioOffsetLog10).toPrecision(2)}`, slower));
        }
      } else if (l.degeneracy === 4) {
        out.push(make([...before, sub(2, l.energyEV - delta / 2), sub(2, l.energyEV + delta / 2), ...after], `p sub-level of 4 split 2+2, ${words}`));
      }
    });
  }
  const whole = levels.findIndex((l) => /^p/.test(l.label) && l.degeneracy === 6);
  if (whole >= 0 && peakChargingEnergyEV !== null && peakChargingEnergyEV > 0 && peakChargingEnergyEV < ec * (1 - D.peakEcMinDrop)) {
    const dEc = ec - peakChargingEnergyEV;
    const shifted: StartLevel[] = [];
    let before = 0;
    levels.forEach((l, j) => {
      for (const g of j === whole ? [2, 2, 2] : [l.degeneracy]) {
        shifted.push({ label: l.label, degeneracy: g, energyEV: l.energyEV + dEc * (before + g / 2) });
        before += g;
      }
    });
    out.push(make(shifted, `p split 2+2+2 at the peak-based Ec ${(peakChargingEnergyEV * 1000).toFixed(0)} meV, sub-levels ${(2 * dEc * 1000).toFixed(0)} meV apart`, [peakChargingEnergyEV, ...tail.slice(1)]));
  }
  for (const offset of D.rateRatioOffsetsLog10) {
    const rest = [...tail];
    rest[1] += offset;
    out.push(make(levels, `Γtip/Γsub × ${(10 ** offset).toPrecision(2)}`, rest));
  }
  return out;
}

/** A CB level of a start: its label (s, p, …), degeneracy and |ε| in eV. */
export interface StartLevel {
  label: string;
  degeneracy: number;
  energyEV: number;
}

/**
 * One further start from a list of CB levels and the nonlinear parameters after them.
 *
 * Parameters
 * ----------
 * list : readonly StartLevel[]
 *     The CB levels in order (label, degeneracy, |ε| in eV).
 * change : string
 *     What changed, in words.
 * rest : readonly number[]
 *     Ec (eV), log₁₀ Γtip/Γsub, log₁₀ σ (σ in eV).
 * eta : number
 *     Voltage-division factor η.
 *
 * Returns
 * -------
 * RefinementStart
 *     The p levels relabelled p1, p2, … in order (p when there is one); each level's `before`
 *     counts the CB carriers of the levels before it and its first-peak bias is
 *     (ε + Ec·(before + ½))/η (note 3 of {@link refinementStarts}).
 *
 * Example
 * -------
 * ```ts
 * refinementStart([{ label: "s", degeneracy: 2, energyEV: 0.6 }, { label: "p", degeneracy: 6, energyEV: 0.9 }], "as fitted", [0.1, 0, -2], 0.85).seeds[1].firstPeakV;
 * // => 1.3529 (V: (0.9 + 0.1·2.5)/0.85)
 * ```
 */
export function refinementStart(list: readonly StartLevel[], change: string, rest: readonly number[], eta: number): RefinementStart {
  let p = 0;
  let before = 0;
  const pCount = list.filter((l) => /^p/.test(l.label)).length;
  const cb = list.map((l) => {
    const label = /^p/.test(l.label) ? (pCount > 1 ? `p${++p}` : "p") : l.label;
    const seed: LevelSeed = { band: "CB", label, degeneracy: l.degeneracy, firstPeakV: (l.energyEV + rest[0] * (before + 0.5)) / eta, before };
    before += l.degeneracy;
    return seed;
  });
  return { seeds: cb, parameters: [...list.map((l) => l.energyEV), ...rest], change, layout: cb.map((s) => s.degeneracy).join("+") };
}
