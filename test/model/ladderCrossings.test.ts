// ladderCrossings checked against its notes written out plainly (common practice, no source):
// each distinct addition energy E gives a tip crossing E/η (width kB·T/η) and, for η < 1, a
// substrate crossing −E/(1 − η) (width kB·T/(1 − η)), stably sorted by bias; and against the
// documented closed-form example (ε + Ec·(N + ½))/η and −(ε + Ec·(N + ½))/(1 − η).
import { describe, it, expect } from "vitest";
import { buildLadder, ladderCrossings } from "../../lib/model/ladder.ts";
import { BOLTZMANN_EV_PER_K as KB } from "../../lib/util/constants.ts";
import { seededRandom } from "../../lib/util/random.ts";

const params = (eta: number) => ({ chargingEnergyEV: 0.1, eta, tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 });

/** The notes of ladderCrossings as written: the crossings of each distinct energy in key order, then a stable sort. */
function reference(keyEnergyEV: Float64Array, eta: number, temperatureK = 4.5) {
  const kT = KB * temperatureK;
  const out: { biasV: number; thermalWidthV: number }[] = [];
  for (const e of new Set(keyEnergyEV)) {
    out.push({ biasV: e / eta, thermalWidthV: kT / eta });
    if (eta < 1) out.push({ biasV: -e / (1 - eta), thermalWidthV: kT / (1 - eta) });
  }
  return out.sort((a, b) => a.biasV - b.biasV);
}

describe("ladderCrossings(ladder, params)", () => {
  it("has the documented crossings of an s doublet (closed form (ε + Ec·(N + ½))/η, −(ε + Ec·(N + ½))/(1 − η))", () => {
    const got = ladderCrossings(buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1), params(0.8));
    expect(got.map((c) => c.biasV)).toEqual([-0.65 / (1 - 0.8), -0.55 / (1 - 0.8), 0.55 / 0.8, 0.65 / 0.8]);
    expect(got.map((c) => c.thermalWidthV)).toEqual([1, 1, 0, 0].map((sub) => (KB * 4.5) / (sub ? 1 - 0.8 : 0.8)));
  });

  it("equals the plain construction bit for bit on random ladders: both signs of energy, repeated energies, η = 1, equal tip and substrate biases, a zero energy", () => {
    const rng = seededRandom(5);
    for (let trial = 0; trial < 60; trial++) {
      const n = 1 + Math.floor(3 * rng.uniform());
      // Energies on a coarse grid (so that some addition energies repeat), either sign.
      const levels = Array.from({ length: n }, () => ({ energyEV: Math.round(40 * rng.uniform() - 20) / 40, degeneracy: 1 + Math.floor(3 * rng.uniform()) }));
      const ladder = buildLadder(levels, Math.round(8 * rng.uniform() + 1) / 40);
      for (const eta of [0.5, 0.8, 1]) expect(ladderCrossings(ladder, params(eta))).toEqual(reference(ladder.keyEnergyEV, eta));
    }
    // η = 0.75, Ec = 0: the tip crossing of 0.75 eV and the substrate crossing of −0.25 eV are both
    // at 1 V (exact in binary), with different widths; the energy seen first comes first.
    for (const order of [[0.75, -0.25], [-0.25, 0.75]]) {
      const tie = buildLadder(order.map((energyEV) => ({ energyEV, degeneracy: 1 })), 0);
      const got = ladderCrossings(tie, params(0.75));
      expect(got).toEqual(reference(tie.keyEnergyEV, 0.75));
      expect(got.filter((c) => c.biasV === 1).map((c) => c.thermalWidthV)).toEqual(order[0] > 0 ? [(KB * 4.5) / 0.75, (KB * 4.5) / 0.25] : [(KB * 4.5) / 0.25, (KB * 4.5) / 0.75]);
    }
    const zero = buildLadder([{ energyEV: -0.05, degeneracy: 2 }], 0.1);
    expect(zero.keyEnergyEV[0]).toBe(0);
    expect(ladderCrossings(zero, params(0.8))).toEqual(reference(zero.keyEnergyEV, 0.8));
  });
});
