/**
 * The description of a simulated measurement: the dot's levels, the junction and the sweep.
 *
 * A scenario is plain JSON (the `dotspec simulate --config` file). {@link parseScenario}
 * validates it once, at the boundary, and fills the defaults; everything downstream trusts it.
 */
import { DotspecError } from "../util/errors.ts";
import { checkFinite, checkInteger, checkKnownKeys, checkNonNegative, checkPositive, checkRange } from "../util/check.ts";

/** One single-particle level of the dot. */
export interface Level {
  /** Level energy in eV relative to the common Fermi level at zero bias. */
  energyEV: number;
  /** Number of electrons (holes) the level holds: 2 for s, 6 for p, 10 for d. */
  degeneracy: number;
}

/** The sampled bias axis of a simulated curve. */
export interface BiasSweep {
  /** First bias in V. */
  fromV: number;
  /** Last bias in V (greater than fromV). */
  toV: number;
  /** Bias step in V (> 0). */
  stepV: number;
}

/** Gaussian noise added to the simulated signals. */
export interface NoiseSpec {
  /** Standard deviation as a fraction of the full-scale (largest |value|) signal, e.g. 0.003. */
  relative: number;
  /** Seed of the pseudo-random generator (integer 0 … 2³² − 1): the same seed gives the same noise. Default: SCENARIO_DEFAULTS.noiseSeed (1). */
  seed?: number;
}

/** A complete scenario (all defaults filled by {@link parseScenario}). */
export interface Scenario {
  /** Conduction-band levels, probed at positive sample bias, in ascending energy. */
  cb: Level[];
  /** Valence-band levels, probed at negative sample bias, in descending energy (from the gap edge down). */
  vb: Level[];
  /** Addition (charging) energy Ec = e²/CΣ in eV, the same for electrons and holes. */
  chargingEnergyEV: number;
  /** Voltage-division factor η = C2/(C1 + C2), the fraction of the bias across the tip junction; 0 < η ≤ 1. */
  eta: number;
  /** Tunnelling rate through the tip barrier per free slot, 1/s. */
  tipRatePerS: number;
  /** Tunnelling rate through the substrate barrier per occupied slot, 1/s. */
  substrateRatePerS: number;
  /** Temperature of both electrodes in K. */
  temperatureK: number;
  /** Standard deviation of a Gaussian spread of the level energies, eV (0 = none). Default: SCENARIO_DEFAULTS.broadeningEV (0). */
  broadeningEV: number;
  /**
   * Rate at which a carrier in a higher level drops to the lowest free level, 1/s.
   * Default: SCENARIO_DEFAULTS.relaxationRateFactor (1000) × the faster tunnelling rate.
   */
  relaxationRatePerS: number;
  /** Lock-in modulation amplitude in V rms for the simulated dI/dV (0 = exact derivative). Default: SCENARIO_DEFAULTS.lockInVrms (0). */
  lockInVrms: number;
  /** Bias axis of the output. */
  bias: BiasSweep;
  /** Noise; null for none. Default: none. */
  noise: NoiseSpec | null;
}

/** Defaults of the optional scenario keys and the size limits (locked by test/model/simulate.test.ts). */
export const SCENARIO_DEFAULTS = Object.freeze({
  broadeningEV: 0,
  /** Relaxation rate as a multiple of the faster of the two tunnelling rates. */
  relaxationRateFactor: 1000,
  lockInVrms: 0,
  noiseSeed: 1,
  /** The state space (product of degeneracy + 1 over levels, per band) may not exceed this. */
  maxStates: 1200,
  /** The output may not have more points than this. */
  maxPoints: 1_000_000,
});

const SCENARIO_KEYS = [
  "cb",
  "vb",
  "chargingEnergyEV",
  "eta",
  "tipRatePerS",
  "substrateRatePerS",
  "temperatureK",
  "broadeningEV",
  "relaxationRatePerS",
  "lockInVrms",
  "bias",
  "noise",
  "description",
] as const;

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function parseLevels(key: "cb" | "vb", value: unknown): Level[] {
  if (value === undefined) return [];
  if (!Array.isArray(value)) throw new DotspecError("scenario/bad-levels", `scenario.${key} must be an array of {energyEV, degeneracy}; got ${typeof value}`);
  const levels = value.map((item, i): Level => {
    const where = `scenario.${key}[${i}]`;
    if (!isObject(item)) throw new DotspecError("scenario/bad-levels", `${where} must be an object {energyEV, degeneracy}`);
    checkKnownKeys(where, item, ["energyEV", "degeneracy", "label"]);
    if (item.energyEV === undefined) throw new DotspecError("scenario/missing-key", `${where}.energyEV is missing`);
    if (item.degeneracy === undefined) throw new DotspecError("scenario/missing-key", `${where}.degeneracy is missing`);
    return {
      energyEV: checkFinite(`${where}.energyEV`, item.energyEV),
      degeneracy: checkInteger(`${where}.degeneracy`, item.degeneracy, 1, 18),
    };
  });
  for (let i = 1; i < levels.length; i++) {
    const ok = key === "cb" ? levels[i].energyEV > levels[i - 1].energyEV : levels[i].energyEV < levels[i - 1].energyEV;
    if (!ok) {
      const order = key === "cb" ? "ascending (lowest CB level first)" : "descending (VB level nearest the gap first)";
      throw new DotspecError(
        "scenario/levels-out-of-order",
        `scenario.${key} must be in ${order} energy; ${key}[${i}].energyEV = ${levels[i].energyEV} follows ${levels[i - 1].energyEV}`,
      );
    }
  }
  return levels;
}

/**
 * Charge states of one band's levels, ∏(g + 1): the size of the band's master equation.
 *
 * Parameters
 * ----------
 * levels : readonly Pick<Level, "degeneracy">[]
 *     The band's levels.
 *
 * Returns
 * -------
 * number
 *     The number of charge states (1 for no level).
 *
 * Example
 * -------
 * ```ts
 * stateCount([{ degeneracy: 2 }, { degeneracy: 6 }]); // => 21
 * ```
 */
export function stateCount(levels: readonly Pick<Level, "degeneracy">[]): number {
  return levels.reduce((n, l) => n * (l.degeneracy + 1), 1);
}

/**
 * Validates a scenario object (for example parsed from JSON) and fills its defaults.
 *
 * Parameters
 * ----------
 * input : unknown
 *     The scenario as plain data: cb and vb levels ({energyEV (eV), degeneracy 1–18}, optional
 *     label), chargingEnergyEV (eV, ≥ 0), eta (0 < η ≤ 1), tipRatePerS and substrateRatePerS
 *     (1/s, > 0), temperatureK (K, > 0), bias {fromV, toV, stepV} (V); optional broadeningEV (eV,
 *     default 0), relaxationRatePerS (1/s, default 1000 × the faster tunnelling rate),
 *     lockInVrms (V rms, default 0), noise {relative, seed (default 1)} (default none),
 *     description (ignored). Defaults in {@link SCENARIO_DEFAULTS}.
 *
 * Returns
 * -------
 * Scenario
 *     A complete scenario: new objects, every default filled.
 *
 * Throws
 * ------
 * DotspecError
 *     Naming the key: `scenario/not-object`, `scenario/missing-key`, `scenario/bad-levels`,
 *     `scenario/no-levels`, `scenario/levels-out-of-order` (CB ascending, VB descending, CB above
 *     VB), `scenario/too-many-states` (∏(g + 1) per band above SCENARIO_DEFAULTS.maxStates),
 *     `scenario/bad-bias` (toV ≤ fromV, or fewer than 5 or more than SCENARIO_DEFAULTS.maxPoints
 *     points), `scenario/bad-noise`; `options/…` for an unknown key, a non-finite, negative or
 *     out-of-range number (η outside (0, 1], relative noise outside [0, 1]).
 *
 * Notes
 * -----
 * 1. Check the keys (unknown and required ones), then the levels of each band (order, degeneracy)
 *    and the size of each band's state space.
 * 2. Rates, temperature, bias sweep and noise, each against its rule.
 * 3. Fill the defaults: relaxation rate = relaxationRateFactor × max(Γtip, Γsub), broadening 0,
 *    lock-in 0, noise seed 1.
 *
 * Example
 * -------
 * ```ts
 * parseScenario({ cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, temperatureK: 4.5,
 *   bias: { fromV: -1, toV: 1.5, stepV: 0.005 } }).relaxationRatePerS;
 * // => 1e12 (1/s: 1000 × the tip rate)
 * ```
 */
export function parseScenario(input: unknown): Scenario {
  if (!isObject(input)) throw new DotspecError("scenario/not-object", "a scenario must be a JSON object");
  checkKnownKeys("scenario", input, SCENARIO_KEYS);
  for (const key of ["chargingEnergyEV", "eta", "tipRatePerS", "substrateRatePerS", "temperatureK", "bias"] as const) {
    if (input[key] === undefined) throw new DotspecError("scenario/missing-key", `scenario.${key} is missing`);
  }
  const cb = parseLevels("cb", input.cb);
  const vb = parseLevels("vb", input.vb);
  if (cb.length === 0 && vb.length === 0) throw new DotspecError("scenario/no-levels", "scenario needs at least one level in cb or vb");
  if (cb.length > 0 && vb.length > 0 && !(cb[0].energyEV > vb[0].energyEV)) {
    throw new DotspecError(
      "scenario/levels-out-of-order",
      `scenario.cb[0].energyEV (${cb[0].energyEV}) must lie above scenario.vb[0].energyEV (${vb[0].energyEV})`,
    );
  }
  for (const [key, levels] of [["cb", cb], ["vb", vb]] as const) {
    const n = stateCount(levels);
    if (n > SCENARIO_DEFAULTS.maxStates) {
      throw new DotspecError(
        "scenario/too-many-states",
        `scenario.${key} gives ${n} occupation states (product of degeneracy + 1); at most ${SCENARIO_DEFAULTS.maxStates} can be solved: use fewer or less degenerate levels`,
      );
    }
  }
  const tipRatePerS = checkPositive("scenario.tipRatePerS", input.tipRatePerS);
  const substrateRatePerS = checkPositive("scenario.substrateRatePerS", input.substrateRatePerS);
  const relaxationRatePerS =
    input.relaxationRatePerS === undefined
      ? SCENARIO_DEFAULTS.relaxationRateFactor * Math.max(tipRatePerS, substrateRatePerS)
      : checkPositive("scenario.relaxationRatePerS", input.relaxationRatePerS);

  const bias = input.bias;
  if (!isObject(bias)) throw new DotspecError("scenario/bad-bias", "scenario.bias must be an object {fromV, toV, stepV}");
  checkKnownKeys("scenario.bias", bias, ["fromV", "toV", "stepV"]);
  for (const key of ["fromV", "toV", "stepV"]) {
    if (bias[key] === undefined) throw new DotspecError("scenario/missing-key", `scenario.bias.${key} is missing`);
  }
  const fromV = checkFinite("scenario.bias.fromV", bias.fromV);
  const toV = checkFinite("scenario.bias.toV", bias.toV);
  const stepV = checkPositive("scenario.bias.stepV", bias.stepV);
  if (!(toV > fromV)) throw new DotspecError("scenario/bad-bias", `scenario.bias.toV (${toV}) must be greater than scenario.bias.fromV (${fromV})`);
  const points = Math.floor((toV - fromV) / stepV + 1e-9) + 1;
  if (points < 5 || points > SCENARIO_DEFAULTS.maxPoints) {
    throw new DotspecError("scenario/bad-bias", `scenario.bias gives ${points} points; between 5 and ${SCENARIO_DEFAULTS.maxPoints} are allowed: change stepV`);
  }

  let noise: NoiseSpec | null = null;
  if (input.noise !== undefined && input.noise !== null) {
    if (!isObject(input.noise)) throw new DotspecError("scenario/bad-noise", "scenario.noise must be an object {relative, seed}");
    checkKnownKeys("scenario.noise", input.noise, ["relative", "seed"]);
    if (input.noise.relative === undefined) throw new DotspecError("scenario/missing-key", "scenario.noise.relative is missing");
    noise = {
      relative: checkRange("scenario.noise.relative", input.noise.relative, 0, 1),
      seed: input.noise.seed === undefined ? SCENARIO_DEFAULTS.noiseSeed : checkInteger("scenario.noise.seed", input.noise.seed, 0, 2 ** 32 - 1),
    };
  }

  return {
    cb,
    vb,
    chargingEnergyEV: checkNonNegative("scenario.chargingEnergyEV", input.chargingEnergyEV),
    eta: (() => {
      const eta = checkFinite("scenario.eta", input.eta);
      if (!(eta > 0 && eta <= 1)) throw new DotspecError("options/out-of-range", `scenario.eta must be in (0, 1]; got ${eta}`);
      return eta;
    })(),
    tipRatePerS,
    substrateRatePerS,
    temperatureK: checkPositive("scenario.temperatureK", input.temperatureK),
    broadeningEV: input.broadeningEV === undefined ? SCENARIO_DEFAULTS.broadeningEV : checkNonNegative("scenario.broadeningEV", input.broadeningEV),
    relaxationRatePerS,
    lockInVrms: input.lockInVrms === undefined ? SCENARIO_DEFAULTS.lockInVrms : checkNonNegative("scenario.lockInVrms", input.lockInVrms),
    bias: { fromV, toV, stepV },
    noise,
  };
}

/**
 * The bias points of a sweep.
 *
 * Parameters
 * ----------
 * sweep : BiasSweep
 *     fromV, toV (V, toV > fromV) and stepV (V, > 0).
 *
 * Returns
 * -------
 * Float64Array
 *     fromV, fromV + stepV, … up to toV (inclusive within a rounding of 1e-9 steps), in V.
 *
 * Throws
 * ------
 * Nothing: the sweep comes validated ({@link parseScenario}).
 *
 * Notes
 * -----
 * 1. n = ⌊(toV − fromV)/stepV + 1e-9⌋ + 1 points; point i is fromV + i·stepV (no accumulated
 *    rounding).
 *
 * Example
 * -------
 * ```ts
 * biasAxis({ fromV: 0, toV: 0.01, stepV: 0.0025 }); // => [0, 0.0025, 0.005, 0.0075, 0.01] (V)
 * ```
 */
export function biasAxis(sweep: BiasSweep): Float64Array {
  const n = Math.floor((sweep.toV - sweep.fromV) / sweep.stepV + 1e-9) + 1;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = sweep.fromV + i * sweep.stepV;
  return out;
}
