// simulateCurve: line widths against closed forms, noise statistics, scenario validation.
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { fwhm } from "../helpers/lineShape.ts";
import { EXAMPLE_SCENARIO } from "../fixtures/exampleScenario.ts";
import { simulateCurve, lockInKernel, SIMULATE_DEFAULTS } from "../../lib/model/simulate.ts";
import { parseScenario, SCENARIO_DEFAULTS } from "../../lib/model/scenario.ts";
import { GAUSSIAN_FWHM_PER_SIGMA, BOLTZMANN_EV_PER_K } from "../../lib/util/constants.ts";
import { DotspecError } from "../../lib/util/errors.ts";

const base = EXAMPLE_SCENARIO;


/** One tunnelling-limited level at 0.5 eV, probed around its peak. */
function singleLine(extra: Record<string, unknown>) {
  return {
    cb: [{ energyEV: 0.5, degeneracy: 1 }],
    chargingEnergyEV: 0.1,
    eta: 0.8,
    tipRatePerS: 1e5,
    substrateRatePerS: 1e9,
    temperatureK: 0.5,
    bias: { fromV: 0.55 / 0.8 - 0.06, toV: 0.55 / 0.8 + 0.06, stepV: 0.0002 },
    ...extra,
  };
}

describe("simulateCurve(scenario)", () => {
  it("Gaussian level broadening σ gives a dI/dV peak of FWHM 2√(2 ln 2)·σ/η (closed form; thermal width added in quadrature)", () => {
    const sigmaEV = 0.008;
    const r = simulateCurve(singleLine({ broadeningEV: sigmaEV }));
    const thermalSigmaV = ((Math.PI / Math.sqrt(3)) * BOLTZMANN_EV_PER_K * 0.5) / 0.8;
    const expected = GAUSSIAN_FWHM_PER_SIGMA * Math.hypot(sigmaEV / 0.8, thermalSigmaV);
    expectClose(fwhm(r.biasV, r.didvS!), expected, { rtol: 5e-3 });
  });

  it("lock-in modulation Vp gives the semicircle instrument function of FWHM √3·Vp (derived; J. Klein et al., Phys. Rev. B 7, 2336 (1973), from memory)", () => {
    const vrms = 0.005;
    const r = simulateCurve(singleLine({ lockInVrms: vrms }));
    // Thermal width 3.5·kT/η ≈ 0.19 mV widens the 12.2 mV semicircle by well under 1 %.
    expectClose(fwhm(r.biasV, r.didvS!), Math.sqrt(3) * Math.SQRT2 * vrms, { rtol: 1e-2 });
    const k = lockInKernel(0.01, 0.00001);
    expectClose(fwhm(Array.from(k, (_, i) => i * 0.00001), k), Math.sqrt(3) * 0.01, { rtol: 1e-3, what: "kernel itself" });
  });

  it("the dI/dV is the derivative of the current (its integral gives back the current step; fundamental theorem of calculus)", () => {
    const r = simulateCurve({ ...base, noise: null });
    let integral = r.cleanCurrentA[0];
    for (let i = 1; i < r.biasV.length; i++) integral += ((r.cleanDidvS![i] + r.cleanDidvS![i - 1]) / 2) * (r.biasV[i] - r.biasV[i - 1]);
    const last = r.cleanCurrentA[r.cleanCurrentA.length - 1];
    expectClose(integral, last, { rtol: 2e-3 });
  });

  it("adds Gaussian noise of the requested relative size, reproducibly for a seed (definition of the option)", () => {
    const a = simulateCurve(base);
    const b = simulateCurve(base);
    expect(Array.from(a.currentA)).toEqual(Array.from(b.currentA));
    const residual = a.currentA.map((v, i) => v - a.cleanCurrentA[i]);
    const sd = Math.sqrt(residual.reduce((s, v) => s + v * v, 0) / residual.length);
    let full = 0;
    for (const v of a.cleanCurrentA) full = Math.max(full, Math.abs(v));
    // 761 samples: the sample σ is within ±10 % of the true σ with overwhelming probability (χ² statistics).
    expectClose(sd, 0.003 * full, { rtol: 0.1 });
    const c = simulateCurve({ ...base, noise: { relative: 0.003, seed: 8 } });
    expect(c.currentA[100]).not.toBe(a.currentA[100]);
  });

  it("the fast method agrees with the exact one within 0.2 % (I) and 1 % (dI/dV) of full scale at 1 K with 10 meV broadening (approximation limit, derived: its steps ignore the kB·T·ln g shift of degenerate levels, ≈ 0.2 mV here)", () => {
    const cold = { ...base, temperatureK: 1, noise: null };
    const exact = simulateCurve(cold);
    const fast = simulateCurve(cold, { method: "fast" });
    let full = 0, fullG = 0;
    for (const v of exact.cleanCurrentA) full = Math.max(full, Math.abs(v));
    for (const v of exact.cleanDidvS!) fullG = Math.max(fullG, Math.abs(v));
    expectClose(fast.cleanCurrentA, exact.cleanCurrentA, { atol: 0.002 * full });
    expectClose(fast.cleanDidvS!, exact.cleanDidvS!, { atol: 0.01 * fullG });
  });

  it("SIMULATE_DEFAULTS and SCENARIO_DEFAULTS are as documented (locked)", () => {
    expect(SIMULATE_DEFAULTS).toEqual({ method: "exact", conductance: true, fineStepPerThermalWidth: 1 / 3, kernelReachSigma: 8, maxFinePoints: 20_000_000, maxKernelWork: 2_000_000_000 });
    expect(SCENARIO_DEFAULTS).toEqual({ broadeningEV: 0, relaxationRateFactor: 1000, lockInVrms: 0, noiseSeed: 1, maxStates: 1200, maxPoints: 1_000_000 });
  });
});

describe("parseScenario(input)", () => {
  const fails = (input: unknown, code: string, words: RegExp) => {
    try {
      parseScenario(input);
    } catch (err) {
      expect(err).toBeInstanceOf(DotspecError);
      expect((err as DotspecError).code).toBe(code);
      expect((err as Error).message).toMatch(words);
      return;
    }
    expect.fail("expected a DotspecError");
  };

  it("fills the defaults (relaxation 1000 × the faster rate)", () => {
    const { relaxationRatePerS: _r, noise: _n, broadeningEV: _b, ...rest } = base;
    const s = parseScenario(rest);
    expect(s.relaxationRatePerS).toBe(1e12);
    expect(s.broadeningEV).toBe(0);
    expect(s.noise).toBeNull();
  });

  it("names the key of an unknown, missing or invalid entry", () => {
    fails({ ...base, tipRate: 1 }, "options/unknown-key", /tipRate/);
    const { eta: _eta, ...noEta } = base;
    fails(noEta, "scenario/missing-key", /scenario\.eta/);
    fails({ ...base, substrateRatePerS: -1 }, "options/not-positive", /substrateRatePerS/);
    fails({ ...base, temperatureK: -4 }, "options/not-positive", /temperatureK/);
    fails({ ...base, eta: 1.2 }, "options/out-of-range", /eta/);
    fails({ ...base, cb: [{ energyEV: 0.8, degeneracy: 6 }, { energyEV: 0.5, degeneracy: 2 }] }, "scenario/levels-out-of-order", /cb\[1\]/);
    fails({ ...base, vb: [{ energyEV: -0.8, degeneracy: 4 }, { energyEV: -0.6, degeneracy: 2 }] }, "scenario/levels-out-of-order", /vb\[1\]/);
    fails({ ...base, cb: [{ energyEV: 0.5, degeneracy: 2.5 }] }, "options/not-integer", /degeneracy/);
    fails({ ...base, bias: { fromV: 1, toV: 0, stepV: 0.01 } }, "scenario/bad-bias", /toV/);
    fails({ ...base, noise: { relative: 0.01, sed: 3 } }, "options/unknown-key", /sed/);
    fails({ ...base, cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }, { energyEV: 1.2, degeneracy: 10 }, { energyEV: 1.5, degeneracy: 14 }] }, "scenario/too-many-states", /states/);
    fails("nope", "scenario/not-object", /object/);
  });
});
