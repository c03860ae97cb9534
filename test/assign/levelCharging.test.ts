// satelliteChargingEnergy / levelChargingPeaks on closed-form positions of a shell-tunnelling dot
// near the crossover (orthodox theory: a level's carriers enter at (ε + Ec·(n + ½))/η; C. W. J.
// Beenakker, Phys. Rev. B 44, 1646 (1991)). ε_s = 0.5, ε_p = 0.8 eV, Ec = 0.1 eV, η = 0.8; the
// satellite's step r/(1 + r) of the s step (closed form, secondToFirstStepRatio) at r = 0.3.
import { describe, it, expect } from "vitest";
import { levelChargingPeaks, satelliteChargingEnergy } from "../../lib/assign/levelCharging.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { secondToFirstStepRatio } from "../../lib/model/regimeLimits.ts";
import { expectClose } from "../helpers/expectClose.ts";

const eta = 0.8, ec = 0.1;
const V = (e: number, n: number) => (e + ec * (n + 0.5)) / eta;
const at = (x: number, index: number, stepA = 1e-11): BandPeak => ({ x, index, peak: { biasV: x, stepA } as Peak });

describe("satelliteChargingEnergy(bands)", () => {
  it("reads Ec/η from the s level's charging satellite (closed form spacing (ε + 3Ec/2 − ε − Ec/2)/η)", () => {
    const q = secondToFirstStepRatio(0.3);
    const cb = { main: [at(V(0.5, 0), 0), at(V(0.8, 0), 2)], satellites: [at(V(0.5, 1), 1, q * 1e-11)] };
    const got = satelliteChargingEnergy([cb])!;
    expectClose(got.chargingEnergyV, ec / eta, { rtol: 1e-12 });
    expect(got.sigmaV).toBe(0); // the helper's peaks carry no position uncertainty
  });
  it("ignores a satellite too weak to be the level's second carrier, and bands without one", () => {
    const cb = { main: [at(V(0.5, 0), 0), at(V(0.8, 0), 2)], satellites: [at(V(0.5, 1), 1, 0.05e-11)] };
    expect(satelliteChargingEnergy([cb, { main: [], satellites: [] }])).toBeNull();
  });
});

describe("levelChargingPeaks(main, chargingEnergyV)", () => {
  it("keeps s and p as levels and sets aside p's charging peaks one Ec apart (n = 1, 2, 3)", () => {
    const main = [V(0.5, 0), V(0.8, 0), V(0.8, 1), V(0.8, 2), V(0.8, 3)].map((x, i) => at(x, i));
    const r = levelChargingPeaks(main, ec / eta);
    expect(r.levels.map((p) => p.index)).toEqual([0, 1]);
    expect(r.charging.map((p) => p.index)).toEqual([2, 3, 4]);
  });
  it("keeps a p sub-level split by less than Ec (0.05 eV) as a level", () => {
    const main = [V(0.5, 0), V(0.8, 0), V(0.85, 0)].map((x, i) => at(x, i));
    expect(levelChargingPeaks(main, ec / eta).charging).toEqual([]);
  });
});
