// Where the CB side of a fit ends at low η, and what that does to a fit at η = 0.64.
// Expected values: closed form (the substrate-junction crossing η·|V₁|/(1 − η) of the double-barrier
// junction, E. P. A. M. Bakkers et al., Nano Lett. 1, 551 (2001), from memory) and, for the fit,
// the simulated dot's own parameters (the bar: Ec within 3 %, Γtip/Γsub within × 1.5).
import { describe, expect, it } from "vitest";
import { cbSideEndV } from "../../../lib/model/fit/cbSideEnd.ts";
import { fitCurve } from "../../../lib/model/fit/fitCurve.ts";
import { simulateCurve } from "../../../lib/model/simulate.ts";
import { analyzeCurve } from "../../../lib/pipeline/analyzeCurve.ts";
import { expectClose } from "../../helpers/expectClose.ts";

describe("cbSideEndV(peaks, eta, marginFwhm)", () => {
  it("ends the CB side marginFwhm FWHM below η·|V₁|/(1 − η) of the VB level peak nearest 0 V (closed form)", () => {
    const peaks = [
      { biasV: -2.0, fwhmV: 0.08, role: "level" },
      { biasV: -1.5, fwhmV: 0.05, role: "level" },
      { biasV: -1.2, fwhmV: 0.05, role: "second-junction" }, // not a level: ignored
      { biasV: 1.3, fwhmV: 0.05, role: "level" },
    ];
    expectClose(cbSideEndV(peaks, 0.6, 2), (0.6 * 1.5) / 0.4 - 2 * 0.05, { rtol: 1e-12 });
    expectClose(cbSideEndV(peaks, 0.85, 0), (0.85 * 1.5) / 0.15, { rtol: 1e-12 });
  });

  it("leaves the CB side open where its end would cut off the second CB level step (closed form: 0.6·1.5/0.4 − 2·0.05 = 2.15 V < 2.2 + 0.05 V)", () => {
    const peaks = [
      { biasV: -1.5, fwhmV: 0.05, role: "level" },
      { biasV: 1.9, fwhmV: 0.05, role: "level" },
      { biasV: 2.2, fwhmV: 0.05, role: "level" },
    ];
    expect(cbSideEndV(peaks, 0.6, 2)).toBe(Infinity);
    expectClose(cbSideEndV(peaks.slice(0, 2), 0.6, 2), 2.15, { rtol: 1e-12 });
  });

  it("leaves the CB side open without a VB level peak or at η = 1", () => {
    expect(cbSideEndV([{ biasV: 1.3, fwhmV: 0.05, role: "level" }], 0.6, 2)).toBe(Infinity);
    expect(cbSideEndV([{ biasV: -1.5, fwhmV: 0.05, role: "level" }], 1, 2)).toBe(Infinity);
  });
});

describe("fitCurve at low η, VB crossings among the CB steps", () => {
  it("compares the groupings below the first VB crossing and recovers Ec within 3 % and Γtip/Γsub within × 1.5 (η = 0.64, r = 43)", () => {
    // p split 2+2+2; the VB levels' substrate-junction crossings at about 2.9 and 3.3 V lie among p's charging steps (2.9–4.7 V).
    const eta = 0.6444728619651869;
    const sim = simulateCurve(
      {
        cb: [
          { energyEV: 0.9709364224106838, degeneracy: 2 },
          { energyEV: 1.4054922183391472, degeneracy: 2 },
          { energyEV: 1.464824651812466, degeneracy: 2 },
          { energyEV: 1.5241570852857849, degeneracy: 2 },
        ],
        vb: [
          { energyEV: -1.0458569204553196, degeneracy: 2 },
          { energyEV: -1.1874837915997187, degeneracy: 4 },
        ],
        chargingEnergyEV: 0.19699155852198602,
        eta,
        tipRatePerS: 4266175860.2931023,
        substrateRatePerS: 1e8,
        temperatureK: 4.5,
        broadeningEV: 0.017436363561202605,
        relaxationRatePerS: 4266175860293.1025,
        bias: { fromV: -3.8285537621406522, toV: 4.962280958196748, stepV: 0.004397616168252827 },
        noise: { relative: 0.0030335993859916927, seed: 401 },
      },
      { method: "fast" },
    );
    const analysis = analyzeCurve({ biasV: sim.biasV, currentA: sim.currentA, sweeps: [sim.currentA], didvS: null, meta: { source: "sim", metadata: {} } }, { eta });
    const fit = fitCurve(analysis, { compareModels: true });
    expect(fit.status).toBe("good");
    expectClose(fit.chargingEnergyEV.value, 0.19699155852198602, { rtol: 0.03, what: "Ec" });
    const r = fit.rateRatio.value / (4266175860.2931023 / 1e8);
    expect(r).toBeGreaterThan(1 / 1.5);
    expect(r).toBeLessThan(1.5);
  }, 60_000);
});
