/**
 * The current of a whole dot, both bands, at many biases: exact (thermal Fermi functions, every
 * bias solved) or as a sum of broadened steps between zero-temperature plateaus (fast, for fitting).
 */
import { buildLadder, ladderCrossings, ladderCurrent, ladderWorkspace, SATURATION_KT, type JunctionParams, type Ladder } from "./ladder.ts";
import { normalCdf, fermi } from "../util/special.ts";
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
 * Builds both ladders. Carriers of the two bands are counted separately (an electron and a
 * hole never share the dot in this model: each band's charging counts its own carriers).
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
 * Exact current at each bias (thermal Fermi functions). Biases whose Fermi factors are all
 * saturated (more than {@link SATURATION_KT} kB·T from every crossing) lie on a plateau and share
 * one solution, so only the thermal steps cost a solve each.
 *
 * @param model - the dot.
 * @param biasV - sample biases in V, any order.
 * @param ladders - prebuilt ladders (optional).
 * @returns current in A at each bias.
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

/**
 * The zero-temperature current as plateaus and steps: I(V) = baseA + Σ heightA·H(V − biasV).
 * Each plateau is one master-equation solve with step Fermi functions.
 */
export function currentSteps(model: DotModel, ladders: BandLadders = bandLadders(model)): { baseA: number; steps: CurrentStep[] } {
  let baseA = 0;
  const steps: CurrentStep[] = [];
  for (const [band, sign] of BANDS) {
    const ladder = ladders[band];
    if (!ladder) continue;
    const work = ladderWorkspace(ladder);
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
      return sign * ladderCurrent(ladder, model, (left + right) / 2, work, true);
    };
    let previous = plateauAt(0);
    const plateaus = [previous];
    for (let i = 1; i <= merged.length; i++) {
      const current = plateauAt(i);
      plateaus.push(current);
      previous = current;
    }
    // In sample bias: the hole ladder runs at −V, so its crossings and steps mirror.
    if (sign > 0) {
      baseA += plateaus[0];
      merged.forEach((c, i) => {
        const h = plateaus[i + 1] - plateaus[i];
        if (h !== 0) steps.push({ biasV: c.biasV, heightA: h, thermalWidthV: c.thermalWidthV });
      });
    } else {
      baseA += plateaus[plateaus.length - 1];
      merged.forEach((c, i) => {
        const h = plateaus[i] - plateaus[i + 1];
        if (h !== 0) steps.push({ biasV: -c.biasV, heightA: h, thermalWidthV: c.thermalWidthV });
      });
    }
  }
  steps.sort((a, b) => a.biasV - b.biasV);
  return { baseA, steps };
}

/**
 * Fast current: zero-temperature steps, each broadened by a Gaussian of standard deviation
 * √(σ_b² + σ_T²) where σ_b is the level broadening in bias and σ_T = π·kB·T/(√3·e·η) has the
 * variance of the thermal (logistic) step. With σ_b = 0 the thermal step is a Fermi function.
 * Accurate when σ_b ≫ kB·T/(e·η), the usual case (peaks tens of mV wide, kB·T/e ≈ 0.4 mV).
 * It places every step at its zero-temperature crossing and so ignores the shift of about
 * kB·T·ln g/(e·η) of the step of a g-fold degenerate level; the dI/dV error that causes is about
 * that shift over σ_b of the peak height (≈ 4 % at 4.5 K and σ_b = 12.5 mV, < 1 % at 1 K).
 *
 * @param broadeningV - Gaussian level broadening expressed in bias (σ in V).
 */
export function fastCurrent(
  steps: { baseA: number; steps: CurrentStep[] },
  biasV: ArrayLike<number>,
  broadeningV: number,
): Float64Array {
  return fastSum(steps, biasV, broadeningV, false);
}

/** dI/dV in S of {@link fastCurrent}, differentiated analytically. */
export function fastConductance(
  steps: { baseA: number; steps: CurrentStep[] },
  biasV: ArrayLike<number>,
  broadeningV: number,
): Float64Array {
  return fastSum(steps, biasV, broadeningV, true);
}

const INV_SQRT_2PI = 1 / Math.sqrt(2 * Math.PI);

function fastSum(steps: { baseA: number; steps: CurrentStep[] }, biasV: ArrayLike<number>, broadeningV: number, derivative: boolean): Float64Array {
  const out = new Float64Array(biasV.length).fill(derivative ? 0 : steps.baseA);
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
        } else out[i] += d > reach ? h : d < -reach ? 0 : h * normalCdf(d / sigma);
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
