// The regime boundaries: the step-ratio reading r/(1 + r) is a closed form of the master equation
// of a spin-degenerate level (derived in lib/model/regimeLimits.ts; E. Bonet, M. M. Deshmukh and
// D. C. Ralph, Phys. Rev. B 65, 045317 (2002) for the rate equations); here it is checked against
// the project's own master-equation solver, which test/model/ladder.test.ts checks against the
// closed-form plateau currents.
import { describe, it, expect } from "vitest";
import { REGIME_LIMITS, levelStepRatio, rateRatioFromStepRatio, secondToFirstStepRatio, substrateToTipStepRatio } from "../../lib/model/regimeLimits.ts";
import { exactCurrent, type DotModel } from "../../lib/model/bandCurrent.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { simulateCurve } from "../../lib/model/simulate.ts";

function sLevel(rateRatio: number): DotModel {
  return {
    cb: [{ energyEV: 0.5, degeneracy: 2 }],
    vb: [],
    chargingEnergyEV: 0.2,
    eta: 0.8,
    tipRatePerS: rateRatio * 1e8,
    substrateRatePerS: 1e8,
    relaxationRatePerS: 1e12,
    temperatureK: 4.5,
  };
}

describe("secondToFirstStepRatio(r)", () => {
  it("is the ratio of the second to the first current step of the s doublet in the master equation", () => {
    for (const r of [0.05, 3 / 7, 1, 1.5, 20]) {
      // Plateaus after the first and second charging steps at (ε + Ec/2)/η and (ε + 3Ec/2)/η.
      const [first, second] = exactCurrent(sLevel(r), [(0.5 + 0.2) / 0.8, (0.5 + 0.4) / 0.8]);
      expectClose((second - first) / first, secondToFirstStepRatio(r), { rtol: 1e-8, what: `r = ${r}` });
    }
  });

  it("is the ratio of the first two CB steps of a whole simulated curve (simulateCurve, exact and fast), closed form r/(1 + r)", () => {
    // One spin-degenerate s level at 0.5 eV, Ec = 0.2 eV, η = 0.8, no noise: steps at
    // (0.5 + 0.1)/0.8 = 0.75 V and (0.5 + 0.3)/0.8 = 1.0 V; plateaus read at 0.875 V and 1.125 V.
    for (const method of ["exact", "fast"] as const) {
      for (const r of [0.2, 0.5, 1, 5]) {
        const sim = simulateCurve({
          cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [], chargingEnergyEV: 0.2, eta: 0.8, tipRatePerS: r * 1e8, substrateRatePerS: 1e8,
          temperatureK: 4.5, broadeningEV: 0.005, bias: { fromV: 0, toV: 1.25, stepV: 0.005 }, noise: null,
        }, { method, conductance: false });
        const at = (v: number) => sim.currentA[Math.round(v / 0.005)];
        const first = at(0.875), second = at(1.125);
        expectClose((second - first) / first, r / (1 + r), { rtol: 1e-3, what: `${method}, r = ${r}` });
      }
    }
  });

  it("has rateRatioFromStepRatio as its inverse (closed form q/(1 − q))", () => {
    for (const r of [0.01, 0.43, 1.5, 50]) expectClose(rateRatioFromStepRatio(secondToFirstStepRatio(r)), r, { rtol: 1e-12 });
  });
});

describe("levelStepRatio(g1, g2, r)", () => {
  // Closed form g2/(g1(1 + (g1 + g2)r)) (derived in lib/model/regimeLimits.ts from the master
  // equation with one extra carrier), checked against the project's master-equation solver: an s
  // level (g 2) at 0.5 eV and a second level at 0.8 eV, Ec = 1 eV so that a second carrier stays
  // blocked (its step at (0.5 + 1.5)/0.8 = 2.5 V); steps at 1.25 V and 1.625 V, plateaus read at
  // 1.4 V and 2.0 V.
  it("is the ratio of the two level steps of the master equation in shell tunnelling", () => {
    for (const g2 of [2, 4, 6]) {
      for (const r of [0.003, 0.03, 0.2, 1]) {
        const model: DotModel = { ...sLevel(r), cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: g2 }], chargingEnergyEV: 1 };
        const [first, second] = exactCurrent(model, [1.4, 2.0]);
        expectClose((second - first) / first, levelStepRatio(2, g2, r), { rtol: 1e-6, what: `g2 = ${g2}, r = ${r}` });
      }
    }
  });

  it("tends to the degeneracy ratio g2/g1 for r → 0 and is ≈ 1 for s then a doubly degenerate sub-level (closed form)", () => {
    expectClose(levelStepRatio(2, 6, 1e-9), 3, { rtol: 1e-6 });
    expectClose(levelStepRatio(2, 2, 0.01), 1 / 1.04, { rtol: 1e-12 });
  });
});

describe("substrateToTipStepRatio(g, r)", () => {
  // Closed form (g·r + 1)/(g + r) (derived in lib/model/regimeLimits.ts), checked against the
  // master equation: an s level (g 2) at 0.5 eV, Ec = 0.2 eV, η = 0.6. Through the tip junction its
  // first step is at (0.5 + 0.1)/0.6 = 1.0 V (plateau read at 1.1 V, before the second carrier at
  // 0.8/0.6 = 1.333 V); through the substrate junction at −0.6/0.4 = −1.5 V (plateau read at
  // −1.75 V, before −0.8/0.4 = −2.0 V).
  it("is the substrate-side first step over the tip-side first step of the master equation", () => {
    for (const g of [2, 4]) {
      for (const r of [0.01, 0.2, 1, 5, 30]) {
        const model: DotModel = { ...sLevel(r), cb: [{ energyEV: 0.5, degeneracy: g }], eta: 0.6 };
        const [sub, tip] = exactCurrent(model, [-1.75, 1.1]);
        expectClose(Math.abs(sub) / tip, substrateToTipStepRatio(g, r), { rtol: 1e-6, what: `g = ${g}, r = ${r}` });
      }
    }
  });

  it("is g deep in shell filling, 1/g deep in shell tunnelling and 1 at r = 1 (closed form)", () => {
    expectClose(substrateToTipStepRatio(2, 1e9), 2, { rtol: 1e-6 });
    expectClose(substrateToTipStepRatio(2, 1e-9), 0.5, { rtol: 1e-6 });
    expectClose(substrateToTipStepRatio(2, 1), 1, { rtol: 1e-12 });
    expectClose(substrateToTipStepRatio(2, 3 / 7), 13 / 17, { rtol: 1e-12 });
  });
});

describe("secondToFirstStepRatio(1/r): the doublet's steps through the substrate junction", () => {
  // The junctions swap roles through the substrate junction (in at Γs, out at Γt), so the s
  // doublet's second step there over its first is r'/(1 + r') with r' = 1/r: 1/(1 + r) (closed
  // form), checked against the master equation. s level (g 2) at 0.5 eV, Ec = 0.2 eV, η = 0.6:
  // substrate-side steps at −0.6/0.4 = −1.5 V and −0.8/0.4 = −2.0 V, plateaus read at −1.75 and −2.25 V.
  it("is 1/(1 + r) in the master equation", () => {
    for (const r of [0.05, 1, 1.5, 5, 28]) {
      const [first, both] = exactCurrent({ ...sLevel(r), eta: 0.6 }, [-1.75, -2.25]);
      expectClose((both - first) / first, secondToFirstStepRatio(1 / r), { rtol: 1e-6, what: `r = ${r}` });
      expectClose(secondToFirstStepRatio(1 / r), 1 / (1 + r), { rtol: 1e-12 });
    }
  });
});

describe("REGIME_LIMITS", () => {
  it("are locked: filling at r ≥ 1.5 (step ratio 0.6), tunnelling at r ≤ 3/7 (step ratio 0.3) — common practice (no source)", () => {
    expect(Object.isFrozen(REGIME_LIMITS)).toBe(true);
    expect(REGIME_LIMITS.fillingRateRatioMin).toBe(1.5);
    expectClose(REGIME_LIMITS.tunnelingRateRatioMax, 3 / 7);
    expectClose(REGIME_LIMITS.fillingStepRatioMin, 0.6, { rtol: 1e-12 });
    expectClose(REGIME_LIMITS.tunnelingStepRatioMax, 0.3, { rtol: 1e-12 });
  });
});
