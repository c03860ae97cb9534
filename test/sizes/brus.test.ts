// The Brus gap, term by term. Check values: ħ, mₑ, e, ε₀ from mathjs (CODATA 2018, reference
// library); the Rydberg energy 13.605693122994 eV (CODATA 2018 table value); the coefficients
// 1.786 (L. E. Brus, J. Chem. Phys. 80, 4403 (1984)) and 0.248 (Y. Kayanuma, Phys. Rev. B 38,
// 9797 (1988)); the CdSe parameters are the table's (sourced there).
import { describe, expect, it } from "vitest";
import { create, all, type Unit } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { brusGap } from "../../lib/sizes/brus.ts";
import { MATERIALS } from "../../lib/sizes/materials.ts";

const math = create(all);
const si = (u: unknown, unit: string) => (u as Unit).toNumber(unit);
const HBAR = si(math.reducedPlanckConstant, "J s");
const ME = si(math.electronMass, "kg");
const E = si(math.elementaryCharge, "C");
const EPS0 = si(math.electricConstant, "F/m");

describe("brusGap(radiusNM, material)", () => {
  const cdse = MATERIALS.CdSe; // mₑ 0.13, m_h 0.45, ε 9.5, Eg 1.84
  const R = 2e-9;
  const g = brusGap(2, cdse);

  it("confinement ħ²π²/(2R²)(1/mₑ + 1/m_h) in SI units, converted to eV (mathjs constants)", () => {
    const expected = ((HBAR ** 2 * Math.PI ** 2) / (2 * R * R * ME)) * (1 / 0.13 + 1 / 0.45) / E;
    expectClose(g.confinementEV, expected, { rtol: 1e-9 });
  });
  it("Coulomb 1.786·e²/(4πε₀εR) in SI units, converted to eV (mathjs constants)", () => {
    expectClose(g.coulombEV, (1.786 * E) / (4 * Math.PI * EPS0 * 9.5 * R), { rtol: 1e-9 });
  });
  it("correlation 0.248·13.605693 eV·μ/ε² (CODATA Rydberg)", () => {
    const mu = (0.13 * 0.45) / (0.13 + 0.45);
    expectClose(g.excitonRydbergEV, (13.605693122994 * mu) / 9.5 ** 2, { rtol: 1e-9 });
    expectClose(g.correlationEV, 0.248 * g.excitonRydbergEV, { rtol: 1e-15 });
  });
  it("adds up: E = Eg + confinement − Coulomb − correlation", () => {
    expectClose(g.gapEV, 1.84 + g.confinementEV - g.coulombEV - g.correlationEV, { rtol: 1e-15 });
  });
  it("scales as 1/R² (confinement) and 1/R (Coulomb), and tends to Eg − 0.248·E*_Ry for large R (closed form)", () => {
    const g4 = brusGap(4, cdse);
    expectClose(g4.confinementEV, g.confinementEV / 4, { rtol: 1e-12 });
    expectClose(g4.coulombEV, g.coulombEV / 2, { rtol: 1e-12 });
    expectClose(brusGap(1e6, cdse).gapEV, 1.84 - g.correlationEV, { atol: 1e-6 });
  });
  it("is above the bulk gap for small crystallites", () => {
    expect(g.gapEV).toBeGreaterThan(cdse.bandGapEV);
  });
});
