// The size models fitted to noiseless data made from known parameters, with the data computed
// from closed forms here (ħ²/2mₑ from mathjs's CODATA constants, A&S Table 10.6 zeros,
// e²/(4πε₀) = 1.439965 eV·nm by hand from CODATA 2018) where a closed form exists, and from
// the library's own finite-wall levels for the finite-wall model (recovering a known parameter).
import { describe, expect, it } from "vitest";
import { create, all, type Unit } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { evaluateSizeFit, fitSizeModels, type SizeFit, type SizePoint } from "../../lib/sizes/fitSizeModels.ts";
import { MATERIALS } from "../../lib/sizes/materials.ts";
import { sphereLevelEV } from "../../lib/sizes/sphereLevels.ts";
import { brusGap } from "../../lib/sizes/brus.ts";

const math = create(all);
const si = (u: unknown, unit: string) => (u as Unit).toNumber(unit);
const C = (si(math.reducedPlanckConstant, "J s") ** 2 / (2 * si(math.electronMass, "kg"))) / si(math.elementaryCharge, "C") * 1e18; // ħ²/2mₑ, eV·nm²
const inp = MATERIALS.InP; // Eg 1.421, mₑ 0.08, m_h 0.6, ε 12.5, α = 1/Eg, barrier 4 eV, barrier mass 1
const radii = [1.2, 1.5, 1.8, 2.2, 2.6, 3.1];
const pointsOf = (f: (r: number) => number, sigma: number | null = 0.01): SizePoint[] =>
  radii.map((r, i) => ({ dot: `d${i + 1}`, radiusNM: r, value: f(r), sigma }));
const find = (fits: SizeFit[], quantity: string, model: string) => {
  const fit = fits.find((f) => f.quantity === quantity && f.model === model);
  if (!fit) throw new Error(`no fit ${quantity} / ${model}`);
  return fit;
};
// Kane: E(1 + αE) = E0 ⇒ E = (−1 + √(1 + 4αE0))/(2α) (closed form)
const kane = (e0: number, a: number) => (-1 + Math.sqrt(1 + 4 * a * e0)) / (2 * a);

describe("fitSizeModels(points, options)", () => {
  it("single-particle gap, infinite wall: recovers the mass scale 1.3 (closed form Eg + ħ²π²/2R²·(1/mₑ + 1/m_h)/s)", () => {
    const s = 1.3;
    const pts = pointsOf((r) => inp.bandGapEV + ((C * Math.PI ** 2) / (r * r)) * (1 / (s * 0.08) + 1 / (s * 0.6)));
    const fit = find(fitSizeModels({ singleParticleGapEV: pts }, { material: inp }), "singleParticleGapEV", "sphere-infinite");
    expectClose(fit.params.massScale, s, { rtol: 1e-7 });
    expectClose(fit.params.electronMassE, s * 0.08, { rtol: 1e-7 });
    expectClose(fit.params.holeMassE, s * 0.6, { rtol: 1e-7 });
    expect(fit.status).toBe("ok");
    expect(fit.pointsUsed).toBe(6);
    expect(fit.dotsUsed).toEqual(["d1", "d2", "d3", "d4", "d5", "d6"]);
    expectClose(fit.stderr.electronMassE!, fit.stderr.massScale! * 0.08, { rtol: 1e-12 });
  });

  it("single-particle gap, non-parabolic: recovers the mass scale 0.9 (closed-form Kane levels, α = 1/Eg)", () => {
    const s = 0.9, a = 1 / inp.bandGapEV;
    const pts = pointsOf((r) => {
      const e0 = (C * Math.PI ** 2) / (r * r);
      return inp.bandGapEV + kane(e0 / (s * 0.08), a) + kane(e0 / (s * 0.6), a);
    });
    const fit = find(fitSizeModels({ singleParticleGapEV: pts }, { material: inp }), "singleParticleGapEV", "sphere-nonparabolic");
    expectClose(fit.params.massScale, s, { rtol: 1e-7 });
    expect(fit.status).toBe("ok");
  });

  it("single-particle gap, finite wall: recovers a known mass scale 0.7 from the finite-wall levels", () => {
    const s = 0.7;
    const o = { wall: "finite" as const, barrierEV: inp.barrierEV, barrierMassE: inp.barrierMassE };
    const pts = pointsOf((r) => inp.bandGapEV + sphereLevelEV(r, s * 0.08, o)! + sphereLevelEV(r, s * 0.6, o)!);
    const fit = find(fitSizeModels({ singleParticleGapEV: pts }, { material: inp }), "singleParticleGapEV", "sphere-finite");
    expectClose(fit.params.massScale, s, { rtol: 1e-6 });
  });

  it("Δsp, infinite wall: recovers mₑ* = 0.065 from (x_11² − π²)·ħ²/(2mₑ*R²) (A&S Table 10.6: x_11 = 4.493409)", () => {
    const m = 0.065;
    const pts = pointsOf((r) => (C * (4.493409457909064 ** 2 - Math.PI ** 2)) / (m * r * r));
    const fits = fitSizeModels({ levelSpacingSPEV: pts }, { material: inp });
    expectClose(find(fits, "levelSpacingSPEV", "sphere-infinite").params.electronMassE, m, { rtol: 1e-7 });
    expect(fits.filter((f) => f.quantity === "levelSpacingSPEV").map((f) => f.model)).toEqual(["sphere-infinite", "sphere-finite", "sphere-nonparabolic", "power-law"]);
  });

  it("Δsp, non-parabolic: recovers mₑ* = 0.05 from Kane levels E(1 + αE) = ħ²x²/(2mₑ*R²), α = 1/Eg (closed form, A&S x_11)", () => {
    const m = 0.05, a = 1 / inp.bandGapEV;
    const pts = pointsOf((r) => kane((C * 4.493409457909064 ** 2) / (m * r * r), a) - kane((C * Math.PI ** 2) / (m * r * r), a));
    expectClose(find(fitSizeModels({ levelSpacingSPEV: pts }, { material: inp }), "levelSpacingSPEV", "sphere-nonparabolic").params.electronMassE, m, { rtol: 1e-7 });
  });

  it("Δsp, finite wall: recovers a known mₑ* = 0.12 from the finite-wall 1S and 1P levels", () => {
    const o = { wall: "finite" as const, barrierEV: inp.barrierEV, barrierMassE: inp.barrierMassE };
    const pts = pointsOf((r) => sphereLevelEV(r, 0.12, { ...o, l: 1 })! - sphereLevelEV(r, 0.12, o)!);
    expectClose(find(fitSizeModels({ levelSpacingSPEV: pts }, { material: inp }), "levelSpacingSPEV", "sphere-finite").params.electronMassE, 0.12, { rtol: 1e-6 });
  });

  it("charging energy: recovers ε_eff = 5.5 and c₀ = 0.015 eV from 1.439965/(εR) + c₀ (CODATA 2018 by hand)", () => {
    const pts = pointsOf((r) => 1.439965 / (5.5 * r) + 0.015, 0.002);
    const fit = find(fitSizeModels({ chargingEnergyEV: pts }, { material: inp }), "chargingEnergyEV", "charging-sphere");
    expectClose(fit.params.dielectricConstantEff, 5.5, { rtol: 1e-5 });
    expectClose(fit.params.offsetEV, 0.015, { atol: 1e-7 });
    expect(fit.reducedChiSquare!).toBeLessThan(1e-6);
  });

  it("power law on any quantity: recovers 0.05 + 0.2/R^1.4", () => {
    const pts = pointsOf((r) => 0.05 + 0.2 / r ** 1.4, null);
    const fit = find(fitSizeModels({ valenceSpacing1EV: pts }, { material: inp }), "valenceSpacing1EV", "power-law");
    expectClose([fit.params.bulkEV, fit.params.amplitudeEVNM, fit.params.exponent], [0.05, 0.2, 1.4], { rtol: 1e-6 });
  });

  it("fits only the quantities that have points, in the documented order of models", () => {
    const pts = pointsOf((r) => 1 / r);
    const fits = fitSizeModels({ chargingEnergyEV: pts, gapEV: [] }, { material: inp });
    expect(fits.map((f) => `${f.quantity}/${f.model}`)).toEqual(["chargingEnergyEV/charging-sphere", "chargingEnergyEV/power-law"]);
  });

  it("formulas: without prefix on every quantity with points, with a prefix on that one only (failed entry when it has none)", () => {
    const pts = pointsOf((r) => 0.3 / r + 0.01);
    const fits = fitSizeModels(
      { chargingEnergyEV: pts, gapEV: pts },
      { material: inp, formulas: ["a / R + b", "chargingEnergyEV: c / R", "levelSpacingSPEV: d / R^2"] },
    );
    const formulaFits = fits.filter((f) => f.model.startsWith("formula: "));
    expect(formulaFits.map((f) => `${f.quantity}/${f.model}`)).toEqual([
      "gapEV/formula: a / R + b",
      "chargingEnergyEV/formula: a / R + b",
      "chargingEnergyEV/formula: chargingEnergyEV: c / R",
      "levelSpacingSPEV/formula: levelSpacingSPEV: d / R^2",
    ]);
    expectClose([formulaFits[0].params.a, formulaFits[0].params.b], [0.3, 0.01], { rtol: 1e-7 });
    expect(formulaFits[3].status).toBe("failed");
    expect(formulaFits[3].warnings.join(" ")).toContain("no points");
  });

  it("refuses a bad formula before fitting, and a missing material", () => {
    expectError(() => fitSizeModels({ gapEV: pointsOf((r) => r) }, { material: inp, formulas: ["a / R^^2"] }), "sizes/formula", "character");
    expectError(() => fitSizeModels({}, {} as never), "sizes/missing-material", "material");
  });

  it("Brus: a comparison curve (no parameters, status ok); evaluateSizeFit gives brusGap", () => {
    const fits = fitSizeModels({ singleParticleGapEV: pointsOf((r) => 2 + 1 / r) }, { material: MATERIALS.CdSe });
    const brus = find(fits, "singleParticleGapEV", "brus");
    expect(brus.status).toBe("ok");
    expect(brus.params).toEqual({});
    expect(evaluateSizeFit(brus, 2.3, MATERIALS.CdSe)).toBe(brusGap(2.3, MATERIALS.CdSe).gapEV);
  });

  it("status poor when the points scatter far beyond their σ, failed with too few points", () => {
    const noisy = pointsOf((r) => 1.439965 / (5 * r), 0.0001).map((p, i) => ({ ...p, value: p.value + (i % 2 ? 0.01 : -0.01) }));
    const fit = find(fitSizeModels({ chargingEnergyEV: noisy }, { material: inp }), "chargingEnergyEV", "charging-sphere");
    expect(fit.status).toBe("poor");
    expect(fit.warnings.join(" ")).toContain("reduced χ²");
    const few = find(fitSizeModels({ chargingEnergyEV: noisy.slice(0, 2) }, { material: inp }), "chargingEnergyEV", "power-law");
    expect(few.status).toBe("failed");
    expect(few.params).toEqual({});
  });

  it("evaluateSizeFit reproduces the fitted curve at the data (noiseless), and is NaN for a failed fit", () => {
    const pts = pointsOf((r) => 1.439965 / (4 * r) + 0.02);
    const fits = fitSizeModels({ chargingEnergyEV: pts }, { material: inp, formulas: ["k / R + q"] });
    for (const fit of fits) {
      for (const p of pts) expectClose(evaluateSizeFit(fit, p.radiusNM, inp), p.value, { rtol: 1e-6, what: fit.model });
    }
    const failed = { ...fits[0], status: "failed" as const };
    expect(evaluateSizeFit(failed, 2, inp)).toBeNaN();
  });
});
