/**
 * Second-junction resonances checked against a first assignment made without them: which of the
 * peaks found at a predicted resonance are resonances, and which are levels that the resonance
 * only overlaps.
 */
import type { Peak } from "../peaks/findPeaks.ts";
import { ASSIGN_DEFAULTS } from "./assignDefaults.ts";
import type { Multiplet } from "./multiplets.ts";
import type { Regime } from "./regime.ts";
import { SECOND_JUNCTION_DEFAULTS, type SecondJunctionResonance } from "./secondJunction.ts";

/** What {@link confirmResonances} reads from the first assignment. */
export interface ResonanceCheckInputs {
  /** The regime of the first assignment. */
  regime: Regime;
  /** Its multiplets (CB shells, VB groups), peaks named by index. */
  multiplets: readonly Multiplet[];
  /** Its Ec in bias, V, or null (not measured). */
  chargingEnergyV: number | null;
  /** Voltage-division factor η in (0, 1). */
  eta: number;
}

/** Result of {@link confirmResonances}. */
export interface ConfirmedResonances {
  /** The resonances that stand. */
  kept: SecondJunctionResonance[];
  /**
   * The candidates given back to the tip-junction ladder, with the reason in words and, for a
   * level that a resonance overlaps, the median step (A) of the multiplet it completes (the
   * level's share of the summed step); null otherwise.
   */
  released: { resonance: SecondJunctionResonance; reason: string; levelStepA: number | null }[];
}

/**
 * Keep the second-junction resonances that a first assignment supports.
 *
 * Parameters
 * ----------
 * candidates : readonly SecondJunctionResonance[]
 *     From `secondJunctionResonances`: peaks within tolerance of −η·V/(1 − η) of a tip-junction
 *     peak V.
 * peaks : readonly Peak[]
 *     The peak list of the assignment (positions `biasV` and 1σ `biasUncertaintyV` in V, `fwhmV`
 *     in V, current steps `stepA` in A).
 * first : ResonanceCheckInputs
 *     The assignment made with every candidate set aside.
 *
 * Returns
 * -------
 * ConfirmedResonances
 *     The candidates kept as resonances and those released as levels, with reasons.
 *
 * Notes
 * -----
 * Through the substrate junction the roles of the junctions swap: the rate ratio is 1/r for
 * r = Γtip/Γsub. With D = `ASSIGN_DEFAULTS`:
 * 1. Shell filling (r ≫ 1): the substrate side is in shell tunnelling and shows each level once,
 *    entered into the otherwise empty dot: at E = ε + Ec/2, where the tip side shows the level's
 *    first charging peak at V₁ = (ε + Ec·(N + ½))/η after N carriers of the lower levels of its
 *    band. So each multiplet predicts one resonance, at −η·(V₁ − N·Ec_V)/(1 − η) (Ec_V = Ec in
 *    bias; N = the degeneracies of the lower CB shells, or the peaks of the lower VB groups), and
 *    the peak within max(3σ, FWHM/2) of it (as in `secondJunctionResonances`) is that resonance.
 *    A level of four or more states (degeneracy, or peaks of a VB group) also predicts its entry
 *    by a second carrier, one Ec further (E = ε + 3Ec/2): its substrate-side occupation
 *    g/(g + r) is not small unless r ≫ g. The candidates matching no prediction are released (a
 *    later charging peak's resonance is a weak satellite at most, and the peak found there is
 *    something else).
 * 2. With Ec measured (shell filling), a candidate that sits one Ec (within
 *    ± `D.valenceChargingTolerance`·Ec) from both members of a pair of consecutive peaks of one
 *    multiplet that are two Ec apart fills a charging step of that multiplet: it is released (the
 *    level and the resonance overlap and cannot be told apart; the level is what the ladder
 *    needs). The same holds one Ec beyond the last peak of a CB shell that shows fewer peaks than
 *    its degeneracy, when the next shell starts more than Ec/2 beyond the candidate. The peak's
 *    step is the sum of the level's and the resonance's; the level's share is taken as the
 *    median step of that multiplet (`levelStepA`).
 * 3. Other regimes keep every candidate.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, in *Mesoscopic Phenomena in Solids*, ed. B. L. Altshuler,
 * P. A. Lee and R. A. Webb (Elsevier, 1991) (the two junctions of a double-barrier structure);
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991) (discrete levels).
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6; s doublet at 1.0 and 1.2 V (Ec = 0.2 V in bias); the second s peak predicts a
 * // resonance at −1.8 V, where a peak was found: released (only the level's first peak predicts).
 * const s = { band: "CB", label: "s", peakIndices: [1, 2] } as Multiplet;
 * confirmResonances([{ index: 0, sourceIndex: 2, predictedV: -1.8 }], [{ biasV: -1.79, stepA: 2e-11 }, { biasV: 1.0, stepA: 1e-11 }, { biasV: 1.2, stepA: 1e-11 }],
 *   { regime: "shell-filling", multiplets: [s], chargingEnergyV: 0.2 }).kept;  // => []
 * ```
 */
export function confirmResonances(
  candidates: readonly SecondJunctionResonance[],
  peaks: readonly Pick<Peak, "biasV" | "stepA" | "biasUncertaintyV" | "fwhmV">[],
  first: ResonanceCheckInputs,
): ConfirmedResonances {
  const kept: SecondJunctionResonance[] = [];
  const released: ConfirmedResonances["released"] = [];
  if (first.regime !== "shell-filling") return { kept: [...candidates], released };
  const tol = ASSIGN_DEFAULTS.valenceChargingTolerance;
  const ec = first.chargingEnergyV;
  const at = (i: number) => Math.abs(peaks[i].biasV);
  const near = (d: number) => ec !== null && Math.abs(d - ec) <= tol * ec;
  const predicted = levelResonances(peaks, first);
  const taken = new Set(predicted.map((c) => c.index));
  for (const c of candidates) {
    if (taken.has(c.index)) continue;
    released.push({ levelStepA: null, resonance: c, reason: `peak at ${peaks[c.index].biasV.toFixed(3)} V kept: the substrate side of shell filling shows each level once, at its first addition energy, and none lies there` });
  }
  for (const c of predicted) {
    const x = at(c.index);
    const side = Math.sign(peaks[c.index].biasV);
    let fills: Multiplet | undefined;
    for (const m of first.multiplets) {
      if (Math.sign(peaks[m.peakIndices[0]].biasV) !== side) continue;
      const xs = m.peakIndices.map(at);
      for (let k = 1; k < xs.length && !fills; k++) if (xs[k - 1] < x && x < xs[k] && near(x - xs[k - 1]) && near(xs[k] - x)) fills = m;
      if (!fills && m.band === "CB" && m.degeneracy !== null && m.found < m.degeneracy && near(x - xs[xs.length - 1])) {
        const next = first.multiplets.find((n) => n.band === "CB" && at(n.peakIndices[0]) > xs[xs.length - 1] && n !== m);
        if (!next || at(next.peakIndices[0]) > x + ec! / 2) fills = m;
      }
      if (fills) break;
    }
    if (fills) {
      const steps = fills.peakIndices.map((i) => peaks[i].stepA).sort((a, b) => a - b);
      released.push({ levelStepA: steps[steps.length >> 1], resonance: c, reason: `peak at ${peaks[c.index].biasV.toFixed(3)} V kept as a level: one Ec from its neighbours in ${fills.label}, it fills a charging step (the resonance at ${c.predictedV.toFixed(3)} V overlaps it)` });
      continue;
    }
    kept.push(c);
  }
  return { kept, released };
}

/** The peaks at the substrate-side resonance of each multiplet's level (note 1). */
function levelResonances(peaks: readonly Pick<Peak, "biasV" | "biasUncertaintyV" | "fwhmV">[], first: ResonanceCheckInputs): SecondJunctionResonance[] {
  const D = SECOND_JUNCTION_DEFAULTS;
  const ec = first.chargingEnergyV;
  if (ec === null) return [];
  const gain = first.eta / (1 - first.eta);
  const below = { CB: 0, VB: 0 };
  const out: SecondJunctionResonance[] = [];
  const used = new Set<number>();
  for (const m of first.multiplets) {
    const n = below[m.band];
    below[m.band] += m.band === "CB" && m.degeneracy !== null ? m.degeneracy : m.found;
    const source = m.peakIndices[0];
    const v1 = peaks[source].biasV;
    // The level entered first (k = 0), and by a second carrier (k = 1) for a level of four states
    // or more, whose occupation on the substrate side, g/(g + r), is no longer small.
    const entries = (m.degeneracy ?? m.found) >= 4 ? [0, 1] : [0];
    for (const k of entries) {
      const predictedV = -gain * Math.sign(v1) * (Math.abs(v1) - (n - k) * ec);
      let best = -1;
      let bestMiss = Infinity;
      peaks.forEach((p, i) => {
        if (Math.sign(p.biasV) === Math.sign(v1) || used.has(i)) return;
        const sigma = Math.hypot(gain * peaks[source].biasUncertaintyV, p.biasUncertaintyV);
        const miss = Math.abs(p.biasV - predictedV);
        if (miss <= Math.max(D.toleranceSigma * sigma, D.toleranceFwhmFraction * p.fwhmV) && miss < bestMiss) {
          best = i;
          bestMiss = miss;
        }
      });
      if (best >= 0) {
        used.add(best);
        out.push({ index: best, sourceIndex: source, predictedV });
      }
    }
  }
  return out;
}
