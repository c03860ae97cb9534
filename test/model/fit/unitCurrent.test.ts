// unitCurrent and parameterModel checked against the closed-form plateaus of a spin-degenerate
// level with strong charging at Γsub = 1/s: I₁ = e·2r/(1 + 2r), I₂ = e·2r/(1 + r) (E. Bonet,
// M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002); derivation in
// lib/model/regimeLimits.ts).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { unitCurrent } from "../../../lib/model/fit/unitCurrent.ts";
import { parameterIndex, parameterModel } from "../../../lib/model/fit/parameterModel.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";

const e = 1.602176634e-19; // C, exact (SI 2019)

describe("unitCurrent(p, seeds, eta, temperatureK, biasV)", () => {
  it("has the closed-form plateaus of an s doublet at unit substrate rate, CB at +V and VB at −V", () => {
    const seeds: LevelSeed[] = [
      { band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 },
      { band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.3, before: 0 },
    ];
    const r = 10;
    // |ε| 0.6 (CB) and 1.0 (VB) eV, Ec 0.1 eV, r = 10, σ = 5 meV, η = 0.85: CB steps at 0.765 and
    // 0.882 V, VB steps at −1.235 and −1.353 V (closed form (|ε| + Ec·(N + ½))/η).
    const p = [0.6, 1.0, 0.1, Math.log10(r), Math.log10(0.005)];
    const i = unitCurrent(p, seeds, 0.85, 4.5, [0.82, 1.2, -1.29, -1.6]);
    const i1 = (e * 2 * r) / (1 + 2 * r), i2 = (e * 2 * r) / (1 + r);
    expectClose(Array.from(i), [i1, i2, -i1, -i2], { rtol: 1e-6 });
  });
});

describe("parameterModel(p, seeds, eta, temperatureK) and parameterIndex(levelCount)", () => {
  it("puts CB levels at +|ε| in ascending order and VB levels at −|ε| in descending order, rates at Γsub = 1/s", () => {
    const seeds: LevelSeed[] = [
      { band: "CB", label: "p", degeneracy: 6, firstPeakV: 1.2, before: 2 },
      { band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 },
      { band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.3, before: 0 },
      { band: "VB", label: "v2", degeneracy: 4, firstPeakV: -1.6, before: 2 },
    ];
    const at = parameterIndex(seeds.length);
    const p = [0.9, 0.6, 1.0, 1.25, 0.1, 2, -2];
    expect(at.chargingEnergy).toBe(4);
    const m = parameterModel(p, seeds, 0.85, 4.5);
    expect(m.cb).toEqual([{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }]);
    expect(m.vb).toEqual([{ energyEV: -1.0, degeneracy: 2 }, { energyEV: -1.25, degeneracy: 4 }]);
    expect([m.chargingEnergyEV, m.tipRatePerS, m.substrateRatePerS]).toEqual([0.1, 100, 1]);
  });
});
