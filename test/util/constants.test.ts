// Constants checked against mathjs's physical constants (general-purpose reference library,
// CODATA 2018 values) and the closed form of the Fermi-derivative width.
import { describe, it } from "vitest";
import { create, all, type Unit } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import * as C from "../../lib/util/constants.ts";

const math = create(all);
const si = (u: unknown, unit: string) => (u as Unit).toNumber(unit);

describe("constants", () => {
  it("match mathjs (CODATA 2018)", () => {
    expectClose(C.ELEMENTARY_CHARGE_C, si(math.elementaryCharge, "C"), { rtol: 1e-12, what: "e" });
    expectClose(C.BOLTZMANN_J_PER_K, si(math.boltzmann, "J/K"), { rtol: 1e-12, what: "kB" });
    expectClose(C.PLANCK_J_S, si(math.planckConstant, "J s"), { rtol: 1e-12, what: "h" });
    expectClose(C.HBAR_J_S, si(math.reducedPlanckConstant, "J s"), { rtol: 1e-9, what: "hbar" });
    expectClose(C.ELECTRON_MASS_KG, si(math.electronMass, "kg"), { rtol: 1e-9, what: "m_e" });
    expectClose(C.VACUUM_PERMITTIVITY_F_PER_M, si(math.electricConstant, "F/m"), { rtol: 1e-9, what: "eps0" });
  });

  it("kB in eV/K is 8.617333262e-5 (CODATA 2018 table value)", () => {
    expectClose(C.BOLTZMANN_EV_PER_K, 8.617333262e-5, { rtol: 1e-9 });
  });

  it("Fermi-derivative FWHM is 3.5255 kT and 1.27 meV at 4.2 K (closed form 2·ln(3+2√2))", () => {
    expectClose(C.FERMI_DERIVATIVE_FWHM_KT, 3.5255, { atol: 5e-5 });
    expectClose(C.FERMI_DERIVATIVE_FWHM_KT * C.BOLTZMANN_EV_PER_K * 4.2 * 1e3, 1.276, { atol: 1e-3, what: "meV at 4.2 K" });
  });

  it("a Gaussian's area is 1.0645 × height × FWHM (closed form √(π/(4 ln 2)); checked by summing a sampled Gaussian)", () => {
    expectClose(C.GAUSSIAN_AREA_PER_HEIGHT_FWHM, Math.sqrt(Math.PI / (4 * Math.LN2)), { rtol: 1e-12 });
    const sigma = 0.01, h = sigma / 200;
    let area = 0;
    for (let x = -10 * sigma; x <= 10 * sigma; x += h) area += Math.exp((-0.5 * x * x) / (sigma * sigma)) * h;
    expectClose(area / (C.GAUSSIAN_FWHM_PER_SIGMA * sigma), C.GAUSSIAN_AREA_PER_HEIGHT_FWHM, { rtol: 1e-6, what: "sampled area / (height × FWHM)" });
  });
});
