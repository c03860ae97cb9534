// Closed-form checks of the orthodox-theory master equation (lib/model). Each expected value
// names its source: closed forms derived from the same master equation, published results, or
// the Fermi-function width.
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { fwhm } from "../helpers/lineShape.ts";
import { dotModel } from "../helpers/dotModel.ts";
import { bandLadders, exactCurrent, currentSteps, fastCurrent } from "../../lib/model/bandCurrent.ts";
import { buildLadder, ladderCurrent, ladderStructureKey, ladderWithEnergies, ladderWorkspace } from "../../lib/model/ladder.ts";
import { zeroTemperaturePattern } from "../../lib/model/zeroTemperaturePattern.ts";
import { ELEMENTARY_CHARGE_C as E, BOLTZMANN_EV_PER_K as KB, FERMI_DERIVATIVE_FWHM_KT } from "../../lib/util/constants.ts";



describe("exactCurrent(model, biasV): plateau currents", () => {
  it("one non-degenerate level carries e·Γ1·Γ2/(Γ1 + Γ2) (orthodox theory, closed form)", () => {
    for (const [gt, gs] of [[1e9, 1e8], [1e7, 3e9], [2e8, 2e8]]) {
      const m = dotModel({ cb: [{ energyEV: 0.5, degeneracy: 1 }], tipRatePerS: gt, substrateRatePerS: gs });
      const [i] = exactCurrent(m, [1.2]);
      expectClose(i, (E * gt * gs) / (gt + gs), { rtol: 1e-10, what: `Γtip=${gt}, Γsub=${gs}` });
    }
  });

  it("a g-fold level holding one extra electron carries e·g·Γin·Γout/(g·Γin + Γout) (Bonet, Deshmukh & Ralph, PRB 65, 045317 (2002) for g = 2; general g derived from the same master equation)", () => {
    for (const g of [2, 4, 6]) {
      // Ec = 1 eV keeps a second electron out: one enters at 1.25 V, a second would need 2.5 V.
      const m = dotModel({ cb: [{ energyEV: 0.5, degeneracy: g }], chargingEnergyEV: 1, tipRatePerS: 1e9, substrateRatePerS: 2e8 });
      const [plus] = exactCurrent(m, [1.8]); // enters through the tip
      expectClose(plus, (E * g * 1e9 * 2e8) / (g * 1e9 + 2e8), { rtol: 1e-10, what: `g=${g}, in through the tip` });
      // Below −(ε + Ec/2)/(1 − η) = −5 V the electron enters from the substrate and leaves to the tip (a second needs −10 V).
      const [minus] = exactCurrent(m, [-7]);
      expectClose(minus, -(E * g * 2e8 * 1e9) / (g * 2e8 + 1e9), { rtol: 1e-10, what: `g=${g}, in through the substrate` });
    }
  });

  it("the spin-degenerate s level: plateaus 2eΓtΓs/(2Γt + Γs) after the first and 2eΓtΓs/(Γt + Γs) after the second charging step (derived from the master equation of states 0, 1, 2)", () => {
    for (const r of [0.01, 0.3, 1, 10, 100]) {
      const gs = 1e8;
      const gt = r * gs;
      const m = dotModel({ cb: [{ energyEV: 0.5, degeneracy: 2 }], chargingEnergyEV: 0.2, tipRatePerS: gt, substrateRatePerS: gs });
      const [first, second] = exactCurrent(m, [(0.5 + 0.2) / 0.8, (0.5 + 0.4) / 0.8]);
      expectClose(first, (2 * E * gt * gs) / (2 * gt + gs), { rtol: 1e-9, what: `first plateau r=${r}` });
      expectClose(second, (2 * E * gt * gs) / (gt + gs), { rtol: 1e-9, what: `second plateau r=${r}` });
      // Height of the second step relative to the first is r/(1 + r): 1 in shell filling, → 0 in shell tunnelling.
      expectClose((second - first) / first, r / (1 + r), { rtol: 1e-9 });
    }
  });

  it("in shell tunnelling the s and p steps approach 2:6 (orthodox theory, degeneracy counting; U. Banin, Y. Cao, D. Katz and O. Millo, Nature 400, 542 (1999), from memory)", () => {
    const m = dotModel({
      cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }],
      chargingEnergyEV: 0.1,
      tipRatePerS: 1e5,
      substrateRatePerS: 1e9,
    });
    const [s, sp] = exactCurrent(m, [(0.5 + 0.05 + 0.05) / 0.8, (0.8 + 0.05 + 0.05) / 0.8]);
    expectClose((sp - s) / s, 3, { rtol: 2e-3, what: "p step / s step" });
    expectClose(sp, 8 * E * 1e5, { rtol: 2e-3, what: "s + p plateau ≈ 8·e·Γtip" });
  });

  it("gives no current inside the gap (Coulomb blockade, orthodox theory)", () => {
    const m = dotModel({ cb: [{ energyEV: 0.5, degeneracy: 2 }], vb: [{ energyEV: -0.6, degeneracy: 2 }] });
    const i = exactCurrent(m, [-0.6, 0, 0.5]);
    for (const v of i) expect(Math.abs(v)).toBeLessThan(1e-25);
  });
});

describe("exactCurrent(model, biasV): positions and line shapes", () => {
  it("the n-th added electron appears at (ε + Ec·(n + ½))/η in shell filling (orthodox theory: C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991))", () => {
    const eta = 0.85, ec = 0.12, es = 0.4, ep = 0.7;
    const m = dotModel({
      cb: [{ energyEV: es, degeneracy: 2 }, { energyEV: ep, degeneracy: 6 }],
      chargingEnergyEV: ec,
      eta,
      tipRatePerS: 1e10,
      substrateRatePerS: 1e7,
      temperatureK: 1,
    });
    const expected = [es + ec * 0.5, es + ec * 1.5, ...[2, 3, 4, 5, 6, 7].map((n) => ep + ec * (n + 0.5))].map((e) => e / eta);
    for (const [n, v0] of expected.entries()) {
      // The step midpoint: the current halfway between the plateaus on either side.
      const [below, above] = exactCurrent(m, [v0 - 0.02, v0 + 0.02]);
      // Bisect for the half-way bias.
      let lo = v0 - 0.02, hi = v0 + 0.02;
      for (let k = 0; k < 60; k++) {
        const mid = (lo + hi) / 2;
        const [i] = exactCurrent(m, [mid]);
        if (i < (below + above) / 2) lo = mid;
        else hi = mid;
      }
      // Tolerance 3·kB·T/(e·η): the step centre of a g-fold level shifts by about kB·T·ln(g)/e.
      expectClose(lo, v0, { atol: (3 * KB * 1) / eta, what: `electron ${n + 1}` });
    }
  });

  it("a single level, tunnelling-limited, has dI/dV of FWHM 3.5255·kB·T/(e·η) (closed form: derivative of the Fermi function)", () => {
    for (const [t, eta] of [[4.5, 0.8], [1.2, 0.95]]) {
      const m = dotModel({ cb: [{ energyEV: 0.5, degeneracy: 1 }], eta, temperatureK: t, tipRatePerS: 1e4, substrateRatePerS: 1e9 });
      const v0 = (0.5 + 0.05) / eta;
      const w = (KB * t) / eta;
      const h = w / 200;
      const x = Array.from({ length: 4001 }, (_, i) => v0 + (i - 2000) * h);
      const iv = exactCurrent(m, x);
      const g = Array.from({ length: 3999 }, (_, i) => (iv[i + 2] - iv[i]) / (2 * h));
      expectClose(fwhm(x.slice(1, -1), g), FERMI_DERIVATIVE_FWHM_KT * w, { rtol: 1e-3, what: `T=${t} K, η=${eta}` });
      expectClose(FERMI_DERIVATIVE_FWHM_KT, 3.5255, { atol: 1e-4, what: "closed form 2·ln(3 + 2√2)" });
    }
  });

  it("metallic limit: the blockade opens at ±e/(2·C2) = ±72.8 mV for C1 = 0.1 aF, C2 = 1.1 aF (Hanna & Tinkham, PRB 44, 5919 (1991), from memory; orthodox theory)", () => {
    const c1 = 0.1e-18, c2 = 1.1e-18;
    const ec = E / (c1 + c2); // e²/CΣ in eV
    const eta = c2 / (c1 + c2);
    const spacing = 0.0002; // closely spaced levels (0.2 meV) around the Fermi level
    const levels = (sign: number) => [0, 1, 2, 3].map((k) => ({ energyEV: sign * (k + 0.5) * spacing, degeneracy: 2 }));
    const m = dotModel({ cb: levels(1), vb: levels(-1), chargingEnergyEV: ec, eta, temperatureK: 0.3, tipRatePerS: 1e9, substrateRatePerS: 1e9 });
    const threshold = E / (2 * c2);
    expectClose(threshold, 0.0728, { atol: 5e-5, what: "e/(2·C2)" });
    const onset = (sign: number) => {
      // Bisect for the bias where |I| first reaches 1 % of its first plateau.
      const plateau = Math.abs(exactCurrent(m, [sign * (threshold + 0.003)])[0]);
      let lo = 0.05, hi = 0.1;
      for (let k = 0; k < 50; k++) {
        const mid = (lo + hi) / 2;
        if (Math.abs(exactCurrent(m, [sign * mid])[0]) < 0.01 * plateau) lo = mid;
        else hi = mid;
      }
      return lo;
    };
    // The lowest level sits spacing/2 above the Fermi level, so the onset lies within (spacing/2)/η + a few kT of the limit.
    expectClose(onset(1), threshold, { atol: spacing / eta, what: "positive bias" });
    expectClose(onset(-1), threshold, { atol: spacing / eta, what: "negative bias" });
  });
});

describe("fastCurrent(currentSteps(model), biasV, broadeningV)", () => {
  it("matches the exact current within 0.2 % of full scale when the broadening is much wider than kB·T (the approximation's own limit, derived)", () => {
    const m = dotModel({
      cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }],
      vb: [{ energyEV: -0.6, degeneracy: 2 }, { energyEV: -0.8, degeneracy: 4 }],
      tipRatePerS: 1e9,
      substrateRatePerS: 3e8,
    });
    const sigma = 0.015 / 0.8;
    // Reference: exact current convolved with the Gaussian by brute force on a fine grid.
    const h = 0.0001;
    const x = Array.from({ length: 40001 }, (_, i) => -2 + i * h);
    const raw = exactCurrent(m, x);
    const probe = [-1.3, -0.95, -0.81, 0.69, 0.8, 1.31, 1.5, 1.9];
    const fast = fastCurrent(currentSteps(m, bandLadders(m)), probe, sigma);
    let full = 0;
    for (const v of raw) full = Math.max(full, Math.abs(v));
    probe.forEach((v, k) => {
      let s = 0, w = 0;
      for (let i = 0; i < x.length; i++) {
        const g = Math.exp(-0.5 * ((x[i] - v) / sigma) ** 2);
        s += g * raw[i];
        w += g;
      }
      expectClose(fast[k], s / w, { atol: 2e-3 * full, what: `V=${v}` });
    });
  });
});

describe("ladderStructureKey, ladderWithEnergies, zeroTemperaturePattern: one structure, new energies", () => {
  const params = { chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
  it("keys the structure by degeneracies and ties only (exact)", () => {
    expect(ladderStructureKey([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }])).toBe("2,6|");
    expect(ladderStructureKey([{ energyEV: 0.8, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 4 }])).toBe("2,4|0<1");
    expect(ladderStructureKey([{ energyEV: 0.6, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 6 }])).toBe(ladderStructureKey([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }]));
  });
  it("gives the ladder buildLadder builds at the new energies, with the addition energies ε + Ec·(N + ½) (closed form)", () => {
    const a = buildLadder([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 4 }], 0.1);
    const levels = [{ energyEV: 0.55, degeneracy: 2 }, { energyEV: 0.7, degeneracy: 4 }];
    const moved = ladderWithEnergies(a, levels, 0.12);
    expect(moved).toEqual(buildLadder(levels, 0.12));
    expectClose(Array.from(moved.keyEnergyEV.slice(0, 2)), [0.55 + 0.06, 0.55 + 0.18], { rtol: 1e-15 });
  });
  it("zero-temperature currents agree wherever the pattern agrees, and the example pattern is as documented", () => {
    const ladder = buildLadder([{ energyEV: 0.5, degeneracy: 2 }], 0.1);
    expect(zeroTemperaturePattern(ladder, params, 0.75)).toBe("1000000000|100000000|1000000000000|-+++");
    // 0.7 and 0.8 V lie between the same crossings (0.6875, 0.8125): one pattern, one current,
    // the closed form e·Γs·2r/(1 + 2r) at r = 10.
    expect(zeroTemperaturePattern(ladder, params, 0.7)).toBe(zeroTemperaturePattern(ladder, params, 0.8));
    const at = (v: number) => ladderCurrent(ladder, params, v, ladderWorkspace(ladder), true);
    expect(at(0.7)).toBe(at(0.8));
    expectClose(at(0.7), (E * 1e8 * 20) / 21, { rtol: 1e-9, what: "e·Γs·2r/(1 + 2r)" });
    expect(zeroTemperaturePattern(ladder, params, 0.85)).not.toBe(zeroTemperaturePattern(ladder, params, 0.8));
  });
});

describe("ladderCurrent: only the states a carrier can reach are solved", () => {
  it("a p level no carrier can enter gets probability exactly 0, and the s level its closed form (1, 2r, r²)/(1 + r)² and current e·Γs·2r/(1 + r) (derived from the master equation of states 0, 1, 2)", () => {
    // s (0.5 eV, g = 2) and p (1.5 eV, g = 2), Ec = 0.1 eV, η = 0.8, at 1 V: the s addition
    // energies 0.55 and 0.65 eV lie below η·V = 0.8 eV, p's lowest (1.55 eV) far above, so no
    // carrier ever enters p (every addition from N = 2 has rate 0, thermal factors included).
    const ladder = buildLadder([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 1.5, degeneracy: 2 }], 0.1);
    const params = { chargingEnergyEV: 0.1, eta: 0.8, tipRatePerS: 1e9, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
    const r = 10;
    for (const zeroTemperature of [true, false]) {
      const work = ladderWorkspace(ladder);
      work.probability.fill(0.5); // stale values from an earlier bias must not survive
      const current = ladderCurrent(ladder, params, 1, work, zeroTemperature);
      expectClose(current, (E * 1e8 * 2 * r) / (1 + r), { rtol: 1e-12, what: `current, zeroTemperature ${zeroTemperature}` });
      for (let state = 0; state < ladder.nStates; state++) {
        const sOcc = ladder.occupation[2 * state], pOcc = ladder.occupation[2 * state + 1];
        const expected = pOcc > 0 ? 0 : [1, 2 * r, r * r][sOcc] / (1 + r) ** 2;
        if (pOcc > 0) expect(work.probability[state]).toBe(0);
        else expectClose(work.probability[state], expected, { rtol: 1e-12, what: `state s${sOcc}` });
      }
    }
  });
});

