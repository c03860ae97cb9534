/**
 * Sequential tunnelling through the discrete levels of one band of a dot (orthodox theory):
 * the occupation state space, the rates at a given bias, the steady state of the master
 * equation and the current.
 *
 * One band is modelled as a ladder of electron-like levels with energies ε_j (eV, relative to the
 * common Fermi level at zero bias) and degeneracies g_j. The valence band uses the same code:
 * holes are electrons of the mirrored ladder (ε → −ε) at the mirrored bias (V → −V); see
 * {@link bandLadders}.
 *
 * Energetics (tip Fermi level = 0, substrate Fermi level = −e·V, a fraction η of the bias across
 * the tip junction): adding an electron to level j of a dot that holds N extra electrons costs
 *
 *     E_j(N) = ε_j + Ec·(N + ½) − η·e·V          relative to the tip's Fermi level,
 *     E_j(N) + e·V                                relative to the substrate's.
 *
 * Rates, with f(x) = 1/(1 + eˣ) and x in units of kB·T:
 *
 *     tip → level j        Γ_tip · (g_j − n_j) · f(E_j(N)/kT)
 *     level j → tip        Γ_tip · n_j · f(−E_j(N−1)/kT)
 *     substrate → level j  Γ_sub · (g_j − n_j) · f((E_j(N) + eV)/kT)
 *     level j → substrate  Γ_sub · n_j · f(−(E_j(N−1) + eV)/kT)
 *     level k → level j    Γ_relax · n_k   (j the lowest non-full level with ε_j < ε_k)
 *
 * The current is e × the net electron flow from the tip into the dot.
 *
 * References: D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena in Solids (Elsevier,
 * 1991); H. Grabert and M. H. Devoret (eds.), Single Charge Tunneling (Plenum, 1992);
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991) (discrete levels).
 */
import { ELEMENTARY_CHARGE_C, BOLTZMANN_EV_PER_K } from "../util/constants.ts";
import { fermi } from "../util/special.ts";
import { stationaryDistribution } from "./stationaryDistribution.ts";
import type { Level } from "./scenario.ts";

/** Rates and energetics shared by both bands. */
export interface JunctionParams {
  /** Addition energy in eV. */
  chargingEnergyEV: number;
  /** Voltage-division factor η (0 < η ≤ 1). */
  eta: number;
  /** Tip-barrier rate per free slot, 1/s. */
  tipRatePerS: number;
  /** Substrate-barrier rate per occupied slot, 1/s. */
  substrateRatePerS: number;
  /** In-dot relaxation rate per carrier, 1/s. */
  relaxationRatePerS: number;
  /** Temperature in K. */
  temperatureK: number;
}

/**
 * The bias-independent structure of one band: states, transitions and the energies at which
 * the rates switch on. Build once with {@link buildLadder}, evaluate at many biases.
 */
export interface Ladder {
  levels: readonly Level[];
  chargingEnergyEV: number;
  /** Number of occupation states (product of g_j + 1). */
  nStates: number;
  /** Total carriers of each state; states are sorted by it (state 0 is the empty dot). */
  carriers: Int32Array;
  /** Occupation of each level per state: occupation[state * nLevels + j]. */
  occupation: Int32Array;
  /** For each state, the first state index of the block with one carrier fewer (band limit of the solver). */
  lowerBlockStart: Int32Array;
  /** Addition energies ε_j + Ec·(N + ½) in eV, indexed key = j·maxCarriers + N. */
  keyEnergyEV: Float64Array;
  /** Tunnelling transitions: from, to, multiplicity (free or occupied slots), key, +1 add / −1 remove. */
  tunnelFrom: Int32Array;
  tunnelTo: Int32Array;
  tunnelSlots: Float64Array;
  tunnelKey: Int32Array;
  tunnelSign: Int8Array;
  /** Relaxation transitions: from, to, carriers in the upper level. */
  relaxFrom: Int32Array;
  relaxTo: Int32Array;
  relaxCarriers: Float64Array;
}

/**
 * Builds the state space and transition lists of one band.
 *
 * Parameters
 * ----------
 * levels : readonly Level[]
 *     Levels in the order carriers fill them (lowest cost first): energy in eV relative to the
 *     Fermi level at zero bias, degeneracy (carriers the level holds).
 * chargingEnergyEV : number
 *     Addition energy Ec in eV.
 *
 * Returns
 * -------
 * Ladder
 *     The occupation states sorted by carrier number, their occupations, the addition energies
 *     and the tunnelling and relaxation transitions, all bias-independent.
 *
 * Throws
 * ------
 * Nothing: the levels come validated ({@link parseScenario}, which also bounds the number of
 * states).
 *
 * Notes
 * -----
 * 1. Enumerate every occupation (n_1 … n_L), 0 ≤ n_j ≤ g_j, in mixed radix: ∏(g_j + 1) states.
 * 2. Sort them (stably) by the total carriers N, so every transition links block N to N ± 1;
 *    record for each state the first state of block N − 1 (the band limit of
 *    {@link stationaryDistribution}).
 * 3. Addition energies ε_j + Ec·(N + ½), one per level j and carrier number N (the "key" of a
 *    transition).
 * 4. Tunnelling transitions: into level j from state s with g_j − n_j free slots (key j, N), out
 *    of level j with n_j occupied slots (key j, N − 1).
 * 5. Relaxation transitions: a carrier of level k drops to the lowest non-full level of lower
 *    energy, at a rate proportional to n_k.
 *
 * References
 * ----------
 * C. W. J. Beenakker, "Theory of Coulomb-blockade oscillations in the conductance of a quantum
 * dot", Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * const ladder = buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1);
 * ladder.nStates;            // => 3 (0, 1 or 2 electrons)
 * ladder.keyEnergyEV;        // => [0.55, 0.65] (eV: ε + Ec/2, ε + 3Ec/2)
 * ladder.tunnelFrom.length;  // => 4 (0⇄1, 1⇄2)
 * ```
 */
export function buildLadder(levels: readonly Level[], chargingEnergyEV: number): Ladder {
  const nLevels = levels.length;
  const maxCarriers = levels.reduce((s, l) => s + l.degeneracy, 0);
  // Enumerate occupations in mixed radix, then sort by total carriers (stable).
  let total = 1;
  for (const l of levels) total *= l.degeneracy + 1;
  const raw: number[][] = [];
  for (let code = 0; code < total; code++) {
    const occ: number[] = [];
    let c = code;
    for (const l of levels) {
      occ.push(c % (l.degeneracy + 1));
      c = Math.floor(c / (l.degeneracy + 1));
    }
    raw.push(occ);
  }
  const sum = (o: number[]) => o.reduce((a, b) => a + b, 0);
  raw.sort((a, b) => sum(a) - sum(b));
  const nStates = raw.length;
  const carriers = new Int32Array(nStates);
  const occupation = new Int32Array(nStates * Math.max(nLevels, 1));
  const index = new Map<string, number>();
  raw.forEach((occ, s) => {
    carriers[s] = sum(occ);
    occ.forEach((n, j) => (occupation[s * nLevels + j] = n));
    index.set(occ.join(","), s);
  });
  const blockStart = new Int32Array(maxCarriers + 2);
  for (let N = 0, s = 0; N <= maxCarriers + 1; N++) {
    while (s < nStates && carriers[s] < N) s++;
    blockStart[N] = s;
  }
  const lowerBlockStart = new Int32Array(nStates);
  for (let s = 0; s < nStates; s++) lowerBlockStart[s] = blockStart[Math.max(carriers[s] - 1, 0)];

  const keyCount = Math.max(maxCarriers, 1);
  const keyEnergyEV = new Float64Array(nLevels * keyCount);
  for (let j = 0; j < nLevels; j++) {
    for (let N = 0; N < keyCount; N++) keyEnergyEV[j * keyCount + N] = levels[j].energyEV + chargingEnergyEV * (N + 0.5);
  }

  const tFrom: number[] = [], tTo: number[] = [], tSlots: number[] = [], tKey: number[] = [], tSign: number[] = [];
  const rFrom: number[] = [], rTo: number[] = [], rCarriers: number[] = [];
  raw.forEach((occ, s) => {
    const N = carriers[s];
    for (let j = 0; j < nLevels; j++) {
      const g = levels[j].degeneracy;
      if (occ[j] < g) {
        const next = occ.slice();
        next[j]++;
        tFrom.push(s), tTo.push(index.get(next.join(","))!), tSlots.push(g - occ[j]), tKey.push(j * keyCount + N), tSign.push(1);
      }
      if (occ[j] > 0) {
        const next = occ.slice();
        next[j]--;
        tFrom.push(s), tTo.push(index.get(next.join(","))!), tSlots.push(occ[j]), tKey.push(j * keyCount + N - 1), tSign.push(-1);
      }
    }
    // Relaxation: a carrier in level k drops to the lowest non-full level of lower energy.
    for (let k = 1; k < nLevels; k++) {
      if (occ[k] === 0) continue;
      let target = -1;
      for (let j = 0; j < k; j++) {
        if (occ[j] < levels[j].degeneracy && levels[j].energyEV < levels[k].energyEV) {
          target = j;
          break;
        }
      }
      if (target < 0) continue;
      const next = occ.slice();
      next[k]--;
      next[target]++;
      rFrom.push(s), rTo.push(index.get(next.join(","))!), rCarriers.push(occ[k]);
    }
  });

  return {
    levels,
    chargingEnergyEV,
    nStates,
    carriers,
    occupation,
    lowerBlockStart,
    keyEnergyEV,
    tunnelFrom: Int32Array.from(tFrom),
    tunnelTo: Int32Array.from(tTo),
    tunnelSlots: Float64Array.from(tSlots),
    tunnelKey: Int32Array.from(tKey),
    tunnelSign: Int8Array.from(tSign),
    relaxFrom: Int32Array.from(rFrom),
    relaxTo: Int32Array.from(rTo),
    relaxCarriers: Float64Array.from(rCarriers),
  };
}

/**
 * The key of a ladder's structure: what {@link buildLadder} builds beyond the addition energies.
 *
 * Parameters
 * ----------
 * levels : readonly Level[]
 *     Levels in filling order: energy (eV) and degeneracy.
 *
 * Returns
 * -------
 * string
 *     The degeneracies in order, and every pair j < k whose energies are not strictly ascending
 *     (the relaxation transitions depend on that order and on nothing else of the energies).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Two level lists with the same key give ladders that differ only in `levels`,
 *    `chargingEnergyEV` and `keyEnergyEV` ({@link ladderWithEnergies}).
 *
 * Example
 * -------
 * ```ts
 * ladderStructureKey([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }]); // => "2,6|"
 * ladderStructureKey([{ energyEV: 0.8, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 4 }]); // => "2,4|0<1"
 * ```
 */
export function ladderStructureKey(levels: readonly Level[]): string {
  const ties: string[] = [];
  for (let k = 1; k < levels.length; k++) for (let j = 0; j < k; j++) if (!(levels[j].energyEV < levels[k].energyEV)) ties.push(`${j}<${k}`);
  return `${levels.map((l) => l.degeneracy).join(",")}|${ties.join(" ")}`;
}

/**
 * A ladder of the same structure at new level energies and Ec, without enumerating its states
 * again.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder}, of levels with the same {@link ladderStructureKey} as `levels`.
 * levels : readonly Level[]
 *     The new levels (eV, same degeneracies, same order).
 * chargingEnergyEV : number
 *     The new Ec in eV.
 *
 * Returns
 * -------
 * Ladder
 *     Equal to buildLadder(levels, chargingEnergyEV): the states and transitions shared with
 *     `ladder`, new addition energies.
 *
 * Throws
 * ------
 * Nothing (the caller checks the structure key).
 *
 * Notes
 * -----
 * 1. keyEnergyEV[j·maxCarriers + N] = ε_j + Ec·(N + ½), as in {@link buildLadder} step 3.
 *
 * Example
 * -------
 * ```ts
 * const a = buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1);
 * ladderWithEnergies(a, [{ energyEV: 0.6, degeneracy: 2 }], 0.2).keyEnergyEV; // => [0.7, 0.9]
 * ```
 */
export function ladderWithEnergies(ladder: Ladder, levels: readonly Level[], chargingEnergyEV: number): Ladder {
  const keyCount = Math.max(levels.reduce((s, l) => s + l.degeneracy, 0), 1);
  const keyEnergyEV = new Float64Array(levels.length * keyCount);
  for (let j = 0; j < levels.length; j++) {
    for (let N = 0; N < keyCount; N++) keyEnergyEV[j * keyCount + N] = levels[j].energyEV + chargingEnergyEV * (N + 0.5);
  }
  return { ...ladder, levels, chargingEnergyEV, keyEnergyEV };
}

/** |x| (in kB·T) beyond which a Fermi factor is taken as exactly 0 or 1 (e^−36 ≈ 2e−16). */
export const SATURATION_KT = 36;

/** Reusable buffers for one ladder, so evaluating many biases allocates nothing. */
export interface LadderWorkspace {
  rates: Float64Array;
  probability: Float64Array;
  tipIn: Float64Array;
  tipOut: Float64Array;
  subIn: Float64Array;
  subOut: Float64Array;
}

/**
 * Allocates the buffers {@link ladderCurrent} works in, once per ladder.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder}.
 *
 * Returns
 * -------
 * LadderWorkspace
 *     Zeroed arrays: the n×n rate matrix, the n state probabilities and the four Fermi factors
 *     per addition energy.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. One workspace serves any number of biases of one ladder; it is not shared between threads.
 *
 * Example
 * -------
 * ```ts
 * const work = ladderWorkspace(buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1));
 * work.rates.length;        // => 9 (3 × 3 states)
 * work.probability.length;  // => 3
 * ```
 */
export function ladderWorkspace(ladder: Ladder): LadderWorkspace {
  const k = ladder.keyEnergyEV.length;
  return {
    rates: new Float64Array(ladder.nStates * ladder.nStates),
    probability: new Float64Array(ladder.nStates),
    tipIn: new Float64Array(k),
    tipOut: new Float64Array(k),
    subIn: new Float64Array(k),
    subOut: new Float64Array(k),
  };
}

function saturatedFermi(x: number, hard: boolean): number {
  if (hard) return x > 0 ? 0 : x < 0 ? 1 : 0.5;
  if (x > SATURATION_KT) return 0;
  if (x < -SATURATION_KT) return 1;
  return fermi(x);
}

/**
 * How many states (from the empty dot, in the ladder's order) a carrier can reach: those of the
 * blocks of N = 0 … N* carriers, N* the first block from which every addition has rate 0 (its
 * rate Γtip·f_tip + Γsub·f_sub is 0 for every level), or the full dot.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder} (states sorted by carriers).
 * tipRatePerS, substrateRatePerS : number
 *     Γtip and Γsub, 1/s.
 * tipIn, subIn : Float64Array
 *     The Fermi factors of adding a carrier from the tip and from the substrate, per addition
 *     energy (key j·maxCarriers + N).
 *
 * Returns
 * -------
 * number
 *     The count of states with at most N* carriers; every rate from them to the states above is 0.
 *
 * Notes
 * -----
 * Only an addition raises N, so a block above N* is entered from no state below it. Every level j
 * has a state in block N with a free slot in j for N < maxCarriers, so block N's additions are
 * exactly the keys j·maxCarriers + N.
 */
function reachableStateCount(ladder: Ladder, tipRatePerS: number, substrateRatePerS: number, tipIn: Float64Array, subIn: Float64Array): number {
  const { carriers, nStates } = ladder;
  const nLevels = ladder.levels.length;
  if (!nLevels) return nStates;
  const keyCount = ladder.keyEnergyEV.length / nLevels;
  const full = carriers[nStates - 1];
  let highest = 0;
  for (; highest < full; highest++) {
    let open = false;
    for (let j = 0; j < nLevels && !open; j++) {
      const k = j * keyCount + highest;
      open = tipRatePerS * tipIn[k] + substrateRatePerS * subIn[k] !== 0;
    }
    if (!open) break;
  }
  let lo = 0, hi = nStates;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (carriers[mid] <= highest) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Steady-state occupation probabilities and current of one band at one bias.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder}.
 * params : JunctionParams
 *     Charging energy (eV), η, tip, substrate and relaxation rates (1/s), temperature (K).
 * biasV : number
 *     Sample bias in V (electron-like sign convention of this ladder).
 * work : LadderWorkspace
 *     Buffers from {@link ladderWorkspace}; `work.probability` holds the state probabilities
 *     afterwards.
 * zeroTemperature : boolean, optional
 *     Use step Fermi functions (the T → 0 limit) instead of thermal ones. Default false.
 *
 * Returns
 * -------
 * number
 *     The current in A (e × net electron flow from the tip into the dot).
 *
 * Throws
 * ------
 * Nothing: the parameters come validated.
 *
 * Notes
 * -----
 * 1. For each addition energy E = ε_j + Ec·(N + ½): a = (E − η·e·V)/kT (tip side) and
 *    b = a + e·V/kT (substrate side); the Fermi factors f(a), f(−a), f(b), f(−b), taken as exactly
 *    0 or 1 beyond {@link SATURATION_KT} (or steps when zeroTemperature).
 * 2. Rate matrix: each tunnelling transition gets slots × (Γ_tip·f_tip + Γ_sub·f_sub) (rates of
 *    the module notes); each relaxation transition Γ_relax × carriers in the upper level.
 * 3. Stationary probabilities by state reduction ({@link stationaryDistribution}) over the
 *    states a carrier can reach: the blocks of N carriers up to the first one from which every
 *    addition has rate 0 (above it the probabilities are exactly 0, and leaving those states out
 *    changes no bit of the others; {@link reachableStateCount}).
 * 4. Current = e·Σ_transitions P(from)·slots·Γ_tip·(f_tip in − f_tip out): the net flow through
 *    the tip junction.
 *
 * References
 * ----------
 * D. V. Averin and K. K. Likharev, "Single electronics: a correlated transfer of single electrons
 * and Cooper pairs in systems of small tunnel junctions", in Mesoscopic Phenomena in Solids,
 * B. L. Altshuler, P. A. Lee and R. A. Webb (eds.) (Elsevier, 1991), p. 173;
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991).
 *
 * Example
 * -------
 * ```ts
 * const ladder = buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1);
 * const work = ladderWorkspace(ladder);
 * const params = { chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * ladderCurrent(ladder, params, 1, work);  // => 2.913e-11 (A; closed form e·Γsub·2r/(1 + r), r = 10)
 * work.probability;                        // => [0.00826, 0.165, 0.826] (1, 2r, r² over (1 + r)²)
 * ```
 */
export function ladderCurrent(
  ladder: Ladder,
  params: JunctionParams,
  biasV: number,
  work: LadderWorkspace,
  zeroTemperature = false,
): number {
  const kT = BOLTZMANN_EV_PER_K * params.temperatureK;
  const { eta, tipRatePerS: gt, substrateRatePerS: gs } = params;
  const { keyEnergyEV, nStates } = ladder;
  const { tipIn, tipOut, subIn, subOut, rates, probability } = work;
  for (let k = 0; k < keyEnergyEV.length; k++) {
    const a = (keyEnergyEV[k] - eta * biasV) / kT;
    const b = a + biasV / kT;
    tipIn[k] = saturatedFermi(a, zeroTemperature);
    tipOut[k] = saturatedFermi(-a, zeroTemperature);
    subIn[k] = saturatedFermi(b, zeroTemperature);
    subOut[k] = saturatedFermi(-b, zeroTemperature);
  }
  // Only the reachable states' rows are written and solved (note 3).
  const reachable = reachableStateCount(ladder, gt, gs, tipIn, subIn);
  rates.fill(0, 0, reachable * nStates);
  const { tunnelFrom, tunnelTo, tunnelSlots, tunnelKey, tunnelSign } = ladder;
  for (let t = 0; t < tunnelFrom.length; t++) {
    if (tunnelFrom[t] >= reachable) continue;
    const k = tunnelKey[t];
    const r = tunnelSign[t] > 0 ? gt * tipIn[k] + gs * subIn[k] : gt * tipOut[k] + gs * subOut[k];
    rates[tunnelFrom[t] * nStates + tunnelTo[t]] = tunnelSlots[t] * r;
  }
  const { relaxFrom, relaxTo, relaxCarriers } = ladder;
  for (let t = 0; t < relaxFrom.length; t++) {
    if (relaxFrom[t] >= reachable) continue;
    rates[relaxFrom[t] * nStates + relaxTo[t]] += params.relaxationRatePerS * relaxCarriers[t];
  }
  stationaryDistribution(rates, reachable, ladder.lowerBlockStart, probability, nStates);
  probability.fill(0, reachable);
  let flow = 0;
  for (let t = 0; t < tunnelFrom.length; t++) {
    const p = probability[tunnelFrom[t]];
    if (p === 0) continue;
    const k = tunnelKey[t];
    flow += tunnelSign[t] > 0 ? p * tunnelSlots[t] * gt * tipIn[k] : -p * tunnelSlots[t] * gt * tipOut[k];
  }
  return ELEMENTARY_CHARGE_C * flow;
}

/**
 * The biases at which some rate of the ladder switches on or off.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder}.
 * params : JunctionParams
 *     η and the temperature (K) are used.
 *
 * Returns
 * -------
 * { biasV: number; thermalWidthV: number }[]
 *     Crossings in V, ascending, duplicates merged, each with the bias width of its thermal step
 *     in V.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. For each distinct addition energy E (eV): the tip crossing at V = E/η, thermal width
 *    kB·T/(e·η), and, when η < 1, the substrate crossing at V = −E/(1 − η), thermal width
 *    kB·T/(e·(1 − η)).
 * 2. Sort by bias (stably: equal biases in the order of their energies' first occurrence). The
 *    tip crossings ascend with E and the substrate ones descend, so they are merged from the
 *    sorted distinct energies; the rare case of a tip and a substrate crossing at the same bias
 *    (or an energy of exactly 0) takes the sort as written.
 *
 * Example
 * -------
 * ```ts
 * const ladder = buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1);
 * ladderCrossings(ladder, { chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 })
 *   .map((c) => c.biasV);
 * // => [-3.25, -2.75, 0.6875, 0.8125] (V: −0.65/0.2, −0.55/0.2, 0.55/0.8, 0.65/0.8)
 * ```
 */
export function ladderCrossings(ladder: Ladder, params: JunctionParams): { biasV: number; thermalWidthV: number }[] {
  // The distinct energies ascending: the tip crossings ascend with them, the substrate ones
  // descend, so the two lists merge without a comparison sort (note 2).
  const { eta } = params;
  const kT = BOLTZMANN_EV_PER_K * params.temperatureK;
  const energies = Float64Array.from(ladder.keyEnergyEV).sort();
  let m = 0;
  for (let i = 0; i < energies.length; i++) {
    // A zero energy (±0) or NaN: the sort of note 2 as it is.
    if (energies[i] === 0 || Number.isNaN(energies[i])) return crossingsBySort(ladder, params);
    if (m === 0 || energies[i] !== energies[m - 1]) energies[m++] = energies[i];
  }
  const out: { biasV: number; thermalWidthV: number }[] = [];
  const tipWidthV = kT / eta, substrateWidthV = kT / (1 - eta);
  let i = 0, j = eta < 1 ? m - 1 : -1;
  while (i < m || j >= 0) {
    const tipV = i < m ? energies[i] / eta : Infinity;
    const substrateV = j >= 0 ? -energies[j] / (1 - eta) : Infinity;
    // Equal biases of a tip and a substrate crossing: the sort's order (by energy first seen).
    if (tipV === substrateV) return crossingsBySort(ladder, params);
    if (tipV < substrateV) out.push({ biasV: tipV, thermalWidthV: tipWidthV }), i++;
    else out.push({ biasV: substrateV, thermalWidthV: substrateWidthV }), j--;
  }
  return out;
}

/** {@link ladderCrossings} by its notes as written: each distinct energy's crossings, then a stable sort by bias. */
function crossingsBySort(ladder: Ladder, params: JunctionParams): { biasV: number; thermalWidthV: number }[] {
  const kT = BOLTZMANN_EV_PER_K * params.temperatureK;
  const out: { biasV: number; thermalWidthV: number }[] = [];
  const seen = new Set<number>();
  for (const e of ladder.keyEnergyEV) {
    if (seen.has(e)) continue;
    seen.add(e);
    out.push({ biasV: e / params.eta, thermalWidthV: kT / params.eta });
    if (params.eta < 1) out.push({ biasV: -e / (1 - params.eta), thermalWidthV: kT / (1 - params.eta) });
  }
  out.sort((a, b) => a.biasV - b.biasV);
  return out;
}
