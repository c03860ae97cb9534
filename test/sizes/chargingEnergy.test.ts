// Charging energy of a sphere. Check value by hand with CODATA 2018 numbers:
// e/(4πε₀R) = 1.602176634e-19 C / (4π · 8.8541878128e-12 F/m · 2e-9 m)
//           = 1.602176634e-19 / 2.2252999e-19 = 0.719982 V  → Ec = 0.71998 eV for R = 2 nm, ε = 1.
import { describe, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { chargingEnergyEV, sphereCapacitanceF } from "../../lib/sizes/chargingEnergy.ts";
import { COULOMB_EV_NM } from "../../lib/sizes/sizeConstants.ts";

describe("chargingEnergyEV(radiusNM, options)", () => {
  it("R = 2 nm, ε = 1 → 0.71998 eV (computed by hand, CODATA 2018)", () => {
    expectClose(chargingEnergyEV(2), 0.71998, { atol: 5e-6 });
  });
  it("e²/(4πε₀) = 1.439965 eV·nm (CODATA 2018, by hand: 1.602176634e-19/(4π·8.8541878128e-12)·1e9)", () => {
    expectClose(COULOMB_EV_NM, 1.439965, { atol: 1e-6 });
  });
  it("scales as 1/(εR) and adds the offset (closed form)", () => {
    expectClose(chargingEnergyEV(3, { dielectricConstant: 4, offsetEV: 0.02 }), 0.71998 * 2 / 12 + 0.02, { atol: 1e-6 });
  });
  it("equals e/C with C the sphere capacitance 4πε₀εR = 0.22253 aF at R = 2 nm, ε = 1 (by hand)", () => {
    expectClose(sphereCapacitanceF(2, 1), 2.2253e-19, { rtol: 5e-5 });
    expectClose(chargingEnergyEV(2.5, { dielectricConstant: 3 }), 1.602176634e-19 / sphereCapacitanceF(2.5, 3), { rtol: 1e-12 });
  });
  it("validates its inputs", () => {
    expectError(() => chargingEnergyEV(-1), "options/not-positive", "radiusNM");
    expectError(() => chargingEnergyEV(1, { dielectricConstant: 0 }), "options/not-positive", "dielectricConstant");
  });
});
