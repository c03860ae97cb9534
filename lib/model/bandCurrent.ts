/**
 * The current of a whole dot, both bands, at many biases: exact (thermal Fermi functions, every
 * bias solved) or as a sum of broadened steps between zero-temperature plateaus (fast, for fitting).
 */
import { buildLadder, ladderCrossings, ladderCurrent, ladderWorkspace, SATURATION_KT, type JunctionParams, type Ladder, type LadderWorkspace } from "./ladder.ts";
import { zeroTemperaturePattern } from "./zeroTemperaturePattern.ts";
import { fermi } from "../util/special.ts";
import { normalCdfHermite } from "../util/normalCdfHermite.ts";
import type { Level } from "./scenario.ts";

/** A dot: its levels per band and the junction. */
export interface DotModel extends JunctionParams {
  /** Conduction-band levels, ascending energy. */
  cb: readonly Level[];
  /** Valence-band levels, descending energy (nearest the gap first). */
  vb: readonly Level[];
}

/** The two bands as electron-like ladders: CB as is; VB holes as the mirrored ladder (ε → −ε) evaluated at −V. */
export interface BandLadders {
  cb: Ladder | null;
  vb: Ladder | null;
}

/**
 * Builds the ladders of both bands of a dot.
 *
 * Parameters
 * ----------
 * model : DotModel
 *     CB levels (ascending), VB levels (descending), charging energy (eV) and the junction.
 *
 * Returns
 * -------
 * BandLadders
 *     `{ cb, vb }`: the CB ladder as is and the VB as the mirrored hole ladder (ε → −ε); null
 *     for a band without levels.
 *
 * Throws
 * ------
 * Nothing: the model comes validated ({@link parseScenario}).
 *
 * Notes
 * -----
 * 1. CB: {@link buildLadder} of the CB levels with Ec.
 * 2. VB: {@link buildLadder} of the VB levels with ε → −ε: holes are electrons of the mirrored
 *    ladder, evaluated at −V.
 * Carriers of the two bands are counted separately (an electron and a hole never share the dot
 * in this model: each band's charging counts its own carriers).
 *
 * Example
 * -------
 * ```ts
 * const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * const ladders = bandLadders(model);
 * ladders.cb?.nStates; // => 3
 * ladders.vb;          // => null
 * ```
 */
export function bandLadders(model: DotModel): BandLadders {
  return {
    cb: model.cb.length ? buildLadder(model.cb, model.chargingEnergyEV) : null,
    vb: model.vb.length ? buildLadder(model.vb.map((l) => ({ energyEV: -l.energyEV, degeneracy: l.degeneracy })), model.chargingEnergyEV) : null,
  };
}

/** Sign of the band's bias and current: +1 for CB electrons, −1 for VB holes. */
const BANDS = [
  ["cb", 1],
  ["vb", -1],
] as const;

/**
 * Exact current of a dot at each bias, both bands, with thermal Fermi functions.
 *
 * Parameters
 * ----------
 * model : DotModel
 *     The dot and the junction.
 * biasV : ArrayLike<number>
 *     Sample biases in V, any order.
 * ladders : BandLadders, optional
 *     Prebuilt ladders. Default: bandLadders(model).
 *
 * Returns
 * -------
 * Float64Array
 *     Current in A at each bias (CB electrons at positive bias, VB holes at negative bias, with
 *     the sign of the bias).
 *
 * Throws
 * ------
 * Nothing: the model comes validated.
 *
 * Notes
 * -----
 * 1. Per band, the crossings of {@link ladderCrossings} split the bias axis into intervals.
 * 2. A bias farther than {@link SATURATION_KT} kB·T from every crossing lies on a plateau, where
 *    all Fermi factors are saturated: the first such bias of an interval is solved
 *    ({@link ladderCurrent}) and the others reuse its current.
 * 3. Biases near a crossing (the thermal steps) are solved one by one.
 * 4. The VB hole ladder is evaluated at −V and its current enters with sign −1.
 *
 * References
 * ----------
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * exactCurrent(model, [0, 0.75, 1]);
 * // => [0, 1.526e-11, 2.913e-11] (A; plateaus e·Γsub·2r/(1 + 2r) and e·Γsub·2r/(1 + r), r = 10)
 * ```
 */
export function exactCurrent(model: DotModel, biasV: ArrayLike<number>, ladders: BandLadders = bandLadders(model)): Float64Array {
  const out = new Float64Array(biasV.length);
  for (const [band, sign] of BANDS) {
    const ladder = ladders[band];
    if (!ladder) continue;
    const work = ladderWorkspace(ladder);
    const crossings = ladderCrossings(ladder, model);
    const cuts = crossings.map((c) => c.biasV);
    const reach = crossings.map((c) => SATURATION_KT * c.thermalWidthV);
    const plateau = new Map<number, number>();
    for (let i = 0; i < biasV.length; i++) {
      const v = sign * biasV[i];
      // Interval index = number of crossings below v; saturated when no crossing is within reach.
      let lo = 0, hi = cuts.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (cuts[mid] < v) lo = mid + 1;
        else hi = mid;
      }
      const near = (lo > 0 && v - cuts[lo - 1] <= reach[lo - 1]) || (lo < cuts.length && cuts[lo] - v <= reach[lo]);
      let current: number;
      if (near) {
        current = ladderCurrent(ladder, model, v, work);
      } else {
        const cached = plateau.get(lo);
        if (cached === undefined) {
          current = ladderCurrent(ladder, model, v, work);
          plateau.set(lo, current);
        } else current = cached;
      }
      out[i] += sign * current;
    }
  }
  return out;
}

/** One broadened step of the fast model: where, how high, how wide. */
export interface CurrentStep {
  /** Bias of the crossing in V (sample bias). */
  biasV: number;
  /** Change of the current across the step in A. */
  heightA: number;
  /** Thermal width of the step, kB·T/(e·η) or kB·T/(e·(1 − η)), V. */
  thermalWidthV: number;
}

/** Options of {@link currentSteps}. */
export interface CurrentStepsOptions {
  /**
   * Lowest sample bias in V whose steps are wanted: steps below it are left out and their
   * heights go into baseA (the current at fromV is unchanged). Default: −Infinity (every step).
   */
  fromV?: number;
  /** Highest sample bias in V whose steps are wanted (steps above it are left out). Default: +Infinity (every step). */
  toV?: number;
  /**
   * Plateau currents already solved, by band ("cb", "vb") and {@link zeroTemperaturePattern}:
   * read and filled in, so that models of the same ladder structure (the same degeneracies and
   * order; a caller that varies the energies keeps one store per structure) solve each
   * zero-temperature rate matrix once. Default: none (every plateau solved).
   */
  plateauStore?: { cb: Map<string, number>; vb: Map<string, number> };
  /**
   * Buffers of {@link ladderWorkspace} to solve in, by band, for a caller that solves ladders of
   * one structure many times (each must fit its band's ladder: the same number of states and
   * addition energies). Default: new buffers per call.
   */
  workspaces?: { cb?: LadderWorkspace; vb?: LadderWorkspace };
}

/**
 * The zero-temperature current of a dot as plateaus and steps:
 * I(V) = baseA + Σ heightA·H(V − biasV).
 *
 * Parameters
 * ----------
 * model : DotModel
 *     The dot and the junction.
 * ladders : BandLadders, optional
 *     Prebuilt ladders. Default: bandLadders(model).
 * options : CurrentStepsOptions, optional
 *     fromV, toV: the window of sample bias (V) whose steps are wanted. Default: every step.
 *
 * Returns
 * -------
 * { baseA: number; steps: CurrentStep[] }
 *     The current below every step of the window (A) and the steps in it sorted by bias:
 *     position (V), height (A), thermal width (V).
 *
 * Throws
 * ------
 * Nothing: the model comes validated.
 *
 * Notes
 * -----
 * 1. Per band, the crossings of {@link ladderCrossings}, merging those closer than 1e-12 V.
 * 2. One master-equation solve with step Fermi functions ({@link ladderCurrent}, zero
 *    temperature) at the middle of each plateau (and 1 V beyond the outer crossings).
 * 3. Each step's height is the difference of the plateaus either side; zero steps are dropped.
 * 4. The VB hole ladder runs at −V: its crossings and steps mirror to negative sample bias.
 * 5. With a plateau store, a plateau whose zero-temperature rate matrix was solved before (the
 *    same {@link zeroTemperaturePattern}) takes the stored current: the same number.
 * 6. With a window, only the crossings inside it and the plateaus either side of them are
 *    solved; baseA is the plateau below the window's first step, so the current inside the
 *    window is the same (to round-off). A fit passes its data's bias range widened by the reach of
 *    the broadening (9σ in {@link fastCurrent}), which leaves its model current unchanged while
 *    the substrate-junction crossings far outside and the highest charge states are not solved.
 *
 * Example
 * -------
 * ```ts
 * const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * currentSteps(model).steps.map((s) => [s.biasV, s.heightA]);
 * // => [[-3.25, 2.43e-12], [-2.75, 2.67e-11], [0.6875, 1.526e-11], [0.8125, 1.387e-11]]
 * //    (V, A; the negative ones are the substrate-junction crossings −E/(1 − η))
 * ```
 */
export function currentSteps(model: DotModel, ladders: BandLadders = bandLadders(model), options: CurrentStepsOptions = {}): { baseA: number; steps: CurrentStep[] } {
  const fromV = options.fromV ?? -Infinity;
  const toV = options.toV ?? Infinity;
  let baseA = 0;
  const steps: CurrentStep[] = [];
  for (const [band, sign] of BANDS) {
    const ladder = ladders[band];
    if (!ladder) continue;
    let work: LadderWorkspace | null = options.workspaces?.[band] ?? null;
    const store = options.plateauStore?.[band];
    const ratesKey = `${model.tipRatePerS}|${model.substrateRatePerS}|${model.relaxationRatePerS}|`;
    const crossings = ladderCrossings(ladder, model);
    // Merge crossings closer than 1e-12 V (degenerate keys).
    const merged: typeof crossings = [];
    for (const c of crossings) {
      const last = merged[merged.length - 1];
      if (last && c.biasV - last.biasV < 1e-12) continue;
      merged.push(c);
    }
    const plateauAt = (i: number): number => {
      // Plateau i lies between merged[i−1] and merged[i].
      const left = i === 0 ? merged[0].biasV - 1 : merged[i - 1].biasV;
      const right = i === merged.length ? merged[merged.length - 1].biasV + 1 : merged[i].biasV;
      const v = (left + right) / 2;
      if (!store) return sign * ladderCurrent(ladder, model, v, (work ??= ladderWorkspace(ladder)), true);
      const key = zeroTemperaturePattern(ladder, model, v, ratesKey);
      let current = store.get(key);
      if (current === undefined) {
        current = ladderCurrent(ladder, model, v, (work ??= ladderWorkspace(ladder)), true);
        store.set(key, current);
      }
      return sign * current;
    };
    // The crossings inside the window (in this ladder's bias: the hole ladder runs at −V):
    // merged[first … last − 1]; the plateaus either side of them, first … last.
    const lo = sign > 0 ? fromV : -toV;
    const hi = sign > 0 ? toV : -fromV;
    let first = 0;
    while (first < merged.length && merged[first].biasV < lo) first++;
    let last = first;
    while (last < merged.length && merged[last].biasV <= hi) last++;
    const plateaus: number[] = [];
    for (let i = first; i <= last; i++) plateaus.push(plateauAt(i));
    // In sample bias: the hole ladder runs at −V, so its crossings and steps mirror.
    if (sign > 0) {
      baseA += plateaus[0];
      for (let i = first; i < last; i++) {
        const h = plateaus[i + 1 - first] - plateaus[i - first];
        if (h !== 0) steps.push({ biasV: merged[i].biasV, heightA: h, thermalWidthV: merged[i].thermalWidthV });
      }
    } else {
      baseA += plateaus[plateaus.length - 1];
      for (let i = first; i < last; i++) {
        const h = plateaus[i - first] - plateaus[i + 1 - first];
        if (h !== 0) steps.push({ biasV: -merged[i].biasV, heightA: h, thermalWidthV: merged[i].thermalWidthV });
      }
    }
  }
  steps.sort((a, b) => a.biasV - b.biasV);
  return { baseA, steps };
}

/**
 * Fast current: the zero-temperature steps of {@link currentSteps}, each broadened by a Gaussian.
 *
 * Parameters
 * ----------
 * steps : { baseA: number; steps: CurrentStep[] }
 *     From {@link currentSteps}.
 * biasV : ArrayLike<number>
 *     Sample biases in V, any order.
 * broadeningV : number
 *     Gaussian level broadening expressed in bias (σ in V, ≥ 0).
 *
 * Returns
 * -------
 * Float64Array
 *     Current in A at each bias.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Each step is broadened by a Gaussian of standard deviation √(σ_b² + σ_T²) where σ_b is the
 *    level broadening in bias and σ_T = π·kB·T/(√3·e·η) has the variance of the thermal
 *    (logistic) step: I(V) = baseA + Σ h·Φ((V − V_k)/σ), taken as 0 or h beyond 9σ.
 * 2. With σ_b = 0 the thermal step is a Fermi function: h·f(−(V − V_k)/w), w its thermal width.
 * Accurate when σ_b ≫ kB·T/(e·η), the usual case (peaks tens of mV wide, kB·T/e ≈ 0.4 mV).
 * It places every step at its zero-temperature crossing and so ignores the shift of about
 * kB·T·ln g/(e·η) of the step of a g-fold degenerate level; the dI/dV error that causes is about
 * that shift over σ_b of the peak height (≈ 4 % at 4.5 K and σ_b = 12.5 mV, < 1 % at 1 K).
 *
 * References
 * ----------
 * M. Abramowitz and I. A. Stegun (eds.), Handbook of Mathematical Functions (National Bureau of
 * Standards, 1964), 26.2 (the normal distribution function Φ).
 *
 * Example
 * -------
 * ```ts
 * const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * fastCurrent(currentSteps(model), [0.5, 0.75, 1], 0.01);
 * // => [0, 1.526e-11, 2.913e-11] (A; the exact plateaus, away from the steps)
 * ```
 */
export function fastCurrent(
  steps: { baseA: number; steps: CurrentStep[] },
  biasV: ArrayLike<number>,
  broadeningV: number,
): Float64Array {
  return fastSum(steps, biasV, broadeningV, false);
}

/**
 * dI/dV of {@link fastCurrent}, differentiated analytically.
 *
 * Parameters
 * ----------
 * steps : { baseA: number; steps: CurrentStep[] }
 *     From {@link currentSteps}.
 * biasV : ArrayLike<number>
 *     Sample biases in V, any order.
 * broadeningV : number
 *     Gaussian level broadening expressed in bias (σ in V, ≥ 0).
 *
 * Returns
 * -------
 * Float64Array
 *     Conductance in S at each bias.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Each step of height h contributes the Gaussian h·φ((V − V_k)/σ)/σ, σ as in note 1 of
 *    {@link fastCurrent}, taken as 0 beyond 9σ.
 * 2. With σ_b = 0: h·f·(1 − f)/w, the derivative of the Fermi step.
 *
 * Example
 * -------
 * ```ts
 * const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * fastConductance(currentSteps(model), [0.6875, 0.8125], 0.01);
 * // => [6.06e-10, 5.51e-10] (S; at the tops, ≈ h/(σ√(2π)) with σ ≈ 10 mV)
 * ```
 */
export function fastConductance(
  steps: { baseA: number; steps: CurrentStep[] },
  biasV: ArrayLike<number>,
  broadeningV: number,
): Float64Array {
  return fastSum(steps, biasV, broadeningV, true);
}

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

/** Whether the biases ascend (not strictly). */
function ascending(biasV: ArrayLike<number>): boolean {
  for (let i = 1; i < biasV.length; i++) if (!(biasV[i] >= biasV[i - 1])) return false;
  return true;
}

/** First index i in [from, n) with biasV[i] − at > −reach (not below the reach), biasV ascending. */
function firstWithin(biasV: ArrayLike<number>, at: number, reach: number, from: number): number {
  let lo = from, hi = biasV.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (biasV[mid] - at < -reach) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index i in [from, n) with biasV[i] − at > reach (past the reach), biasV ascending. */
function firstBeyond(biasV: ArrayLike<number>, at: number, reach: number, from: number): number {
  let lo = from, hi = biasV.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (biasV[mid] - at > reach) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

function fastSum(steps: { baseA: number; steps: CurrentStep[] }, biasV: ArrayLike<number>, broadeningV: number, derivative: boolean): Float64Array {
  const out = new Float64Array(biasV.length).fill(derivative ? 0 : steps.baseA);
  // Ascending biases (a fit's data, a simulated sweep): each step touches only the points within
  // its reach, and the full heights of the steps passed are added once as a running sum.
  if (broadeningV > 0 && ascending(biasV)) return fastSumAscending(steps, biasV, broadeningV, derivative, out);
  for (const step of steps.steps) {
    const h = step.heightA;
    if (broadeningV > 0) {
      const thermalSigma = (Math.PI / Math.sqrt(3)) * step.thermalWidthV;
      const sigma = Math.sqrt(broadeningV * broadeningV + thermalSigma * thermalSigma);
      const reach = 9 * sigma;
      for (let i = 0; i < biasV.length; i++) {
        const d = biasV[i] - step.biasV;
        if (derivative) {
          if (Math.abs(d) < reach) out[i] += ((h * INV_SQRT_2PI) / sigma) * Math.exp((-0.5 * d * d) / (sigma * sigma));
        } else out[i] += d > reach ? h : d < -reach ? 0 : h * normalCdfHermite(d / sigma);
      }
    } else {
      const w = step.thermalWidthV;
      for (let i = 0; i < biasV.length; i++) {
        const f = fermi(-(biasV[i] - step.biasV) / w);
        out[i] += derivative ? (h * f * (1 - f)) / w : h * f;
      }
    }
  }
  return out;
}

/** {@link fastSum} on ascending biases: the same terms, each step evaluated only within its reach. */
function fastSumAscending(steps: { baseA: number; steps: CurrentStep[] }, biasV: ArrayLike<number>, broadeningV: number, derivative: boolean, out: Float64Array): Float64Array {
  const n = biasV.length;
  // passed[i]: the heights of the steps whose reach ends just before point i.
  const passed = derivative ? null : new Float64Array(n + 1);
  for (const step of steps.steps) {
    const h = step.heightA;
    const thermalSigma = (Math.PI / Math.sqrt(3)) * step.thermalWidthV;
    const sigma = Math.sqrt(broadeningV * broadeningV + thermalSigma * thermalSigma);
    const reach = 9 * sigma;
    const start = firstWithin(biasV, step.biasV, reach, 0);
    const end = firstBeyond(biasV, step.biasV, reach, start);
    if (derivative) {
      for (let i = start; i < end; i++) {
        const d = biasV[i] - step.biasV;
        if (Math.abs(d) < reach) out[i] += ((h * INV_SQRT_2PI) / sigma) * Math.exp((-0.5 * d * d) / (sigma * sigma));
      }
    } else {
      const inv = 1 / sigma;
      for (let i = start; i < end; i++) out[i] += h * normalCdfHermite((biasV[i] - step.biasV) * inv);
    }
    if (passed) passed[end] += h;
  }
  if (passed) {
    let sum = 0;
    for (let i = 0; i < n; i++) {
      sum += passed[i];
      out[i] += sum;
    }
  }
  return out;
}
