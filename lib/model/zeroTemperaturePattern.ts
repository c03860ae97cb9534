/**
 * The key of a zero-temperature plateau solve: what the master equation of one band depends on at
 * one bias when every Fermi factor is a step.
 */
import { BOLTZMANN_EV_PER_K } from "../util/constants.ts";
import type { JunctionParams, Ladder } from "./ladder.ts";

/**
 * What a zero-temperature solve of {@link ladderCurrent} depends on at one bias, as a string:
 * the rates and, for every addition energy, whether the tip and the substrate can add a carrier.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder}.
 * params : JunctionParams
 *     η and the tip, substrate and relaxation rates (1/s) are used.
 * biasV : number
 *     Bias in V (this ladder's electron-like sign).
 * ratesKey : string, optional
 *     The rates part of the pattern, for a caller that evaluates many biases at the same rates.
 *     Default: `${Γtip}|${Γsub}|${Γrelax}|`.
 *
 * Returns
 * -------
 * string
 *     Equal for two biases (or two ladders of one structure, {@link ladderStructureKey}) exactly
 *     when their zero-temperature rate matrices are equal, so that {@link ladderCurrent} with
 *     zeroTemperature gives the same current for both.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The rates Γtip, Γsub, Γrelax (the transitions are the structure's).
 * 2. Per addition energy E: the signs of a = (E − η·e·V)/kT and of b = a + e·V/kT ("+" above,
 *    "-" below, "0" on or undefined), computed as {@link ladderCurrent} computes them, which fix
 *    its step Fermi factors f(±a), f(±b) (its note 1).
 *
 * Example
 * -------
 * ```ts
 * const ladder = buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1);
 * const params = { chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
 * zeroTemperaturePattern(ladder, params, 0.75); // => "1000000000|100000000|1000000000000|-+++"
 * ```
 */
export function zeroTemperaturePattern(ladder: Ladder, params: JunctionParams, biasV: number, ratesKey = `${params.tipRatePerS}|${params.substrateRatePerS}|${params.relaxationRatePerS}|`): string {
  const { keyEnergyEV } = ladder;
  // The same arithmetic as ladderCurrent's, so that the signs are its signs.
  const kT = BOLTZMANN_EV_PER_K * params.temperatureK;
  const codes = new Array<number>(2 * keyEnergyEV.length);
  for (let k = 0; k < keyEnergyEV.length; k++) {
    const a = (keyEnergyEV[k] - params.eta * biasV) / kT;
    codes[2 * k] = sign(a);
    codes[2 * k + 1] = sign(a + biasV / kT);
  }
  return ratesKey + String.fromCharCode(...codes);
}

/** The character code of a sign: "+" above 0, "-" below, "0" on it or undefined (NaN). */
function sign(x: number): number {
  return x > 0 ? 43 : x < 0 ? 45 : 48;
}
