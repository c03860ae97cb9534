// sizeSeries: curves → dots → bins → fit points → fits and optical pairing. Grouping and
// bookkeeping are checked by construction; the fit test uses charging energies made exactly by
// the closed form of a sphere's self-capacitance, Ec = e²/(4πε₀·ε·R) (CODATA constants through
// COULOMB_EV_NM), so the fitted ε_eff must come back.
import { describe, it, expect } from "vitest";
import { sizeSeries, SIZE_SERIES_DEFAULTS, SERIES_QUANTITIES } from "../../lib/sizes/sizeSeries.ts";
import { resolveMaterial } from "../../lib/sizes/materials.ts";
import { COULOMB_EV_NM } from "../../lib/sizes/sizeConstants.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { curveValues } from "./curveValuesFixture.ts";

const ETA = 0.8;
/** A dot of radius R with Ec from the sphere closed form (ε 7) and a gap that falls with R. */
function dotCurves(dot: string, radiusNM: number, n = 2) {
  const ecEV = COULOMB_EV_NM / (7 * radiusNM);
  return Array.from({ length: n }, (_, k) => ({
    file: `${dot}-${k + 1}.csv`,
    dot,
    radiusNM,
    values: curveValues({
      gapV: (1.5 + 1 / radiusNM ** 2 + ecEV) / ETA,
      chargingEnergyV: ecEV / ETA,
      levelSpacingSPV: 0.5 / radiusNM ** 2 / ETA,
      valenceSpacingsV: [0.2 / radiusNM / ETA],
      eta: ETA,
      sigmaV: 0.0005,
    }),
  }));
}

describe("sizeSeries(curves, options)", () => {
  it("SIZE_SERIES_DEFAULTS is locked", () => {
    expect(SIZE_SERIES_DEFAULTS).toEqual({ material: null, formulas: [], optical: null, binNM: 0.25, outlierScore: 3.5, pairScore: 3.5 });
    expect(SERIES_QUANTITIES).toEqual(["gapEV", "singleParticleGapEV", "chargingEnergyEV", "levelSpacingSPEV", "valenceSpacing1EV"]);
  });

  it("groups curves by dot, sorts dots by radius, and sets curves without a size aside", () => {
    const s = sizeSeries([
      ...dotCurves("B", 2.5),
      ...dotCurves("A", 1.5, 3),
      { file: "lone.csv", dot: null, radiusNM: null, values: curveValues({ gapV: 3 }), unassignedReason: "no radius_nm line" },
    ]);
    expect(s.dots.map((d) => [d.dot, d.radiusNM, d.curves])).toEqual([["A", 1.5, 3], ["B", 2.5, 2]]);
    expect(s.unassigned).toEqual([{ file: "lone.csv", dot: null, reason: "no radius_nm line", regime: "shell-tunneling", gapV: 3, chargingEnergyV: null, levelSpacingSPV: null }]);
    expect(s.warnings.join(" ")).toContain("1 curve(s) have no size");
    expect(s.warnings.join(" ")).toContain("no material given");
    expect(s.fits).toEqual([]);
    // One fit point per dot and quantity: the dot's mean energy with its standard error.
    expect(s.points.chargingEnergyEV.map((p) => p.dot)).toEqual(["A", "B"]);
    expectClose(s.points.chargingEnergyEV[0].value, COULOMB_EV_NM / (7 * 1.5), { rtol: 1e-12 });
    expectClose(s.points.chargingEnergyEV[0].sigma!, (ETA * 0.0005) / Math.sqrt(3), { rtol: 1e-9 });
    expect(s.bins.map((b) => b.dots)).toEqual([["A"], ["B"]]);
  });

  it("a curve without a dot id is its own dot, named after its file", () => {
    const s = sizeSeries([{ file: "x.csv", dot: null, radiusNM: 2, values: curveValues({ gapV: 2 }) }]);
    expect(s.dots[0].dot).toBe("x.csv");
  });

  it("refuses one dot with two radii, naming both files", () => {
    expectError(
      () => sizeSeries([...dotCurves("A", 1.5, 1), { ...dotCurves("A", 1.6, 1)[0], file: "other.csv" }]),
      "sizes/radius-mismatch",
      "other.csv",
      "A-1.csv",
    );
  });

  it("with a material, the fits recover ε_eff of charging energies made by the sphere closed form", () => {
    const radii = [1.5, 1.75, 2, 2.25, 2.5, 2.75, 3];
    const s = sizeSeries(radii.flatMap((r, i) => dotCurves(`D${i}`, r)), { material: resolveMaterial("InP") });
    const fit = s.fits.find((f) => f.quantity === "chargingEnergyEV" && f.model === "charging-sphere")!;
    expect(fit.pointsUsed).toBe(7);
    expectClose(fit.params.dielectricConstantEff, 7, { rtol: 1e-6 });
    expect(new Set(s.fits.map((f) => f.quantity))).toEqual(new Set(SERIES_QUANTITIES));
  });

  it("pairs optical rows when given, and says why not without a material", () => {
    const curves = [1.5, 2, 2.5].flatMap((r, i) => dotCurves(`D${i}`, r));
    // The h1→s transition of the dot at R = 2 nm: single-particle gap 1.5 + 1/R² less
    // J_eh = 1.786·e²/(4πε₀·ε·R) with InP's ε 12.5 (Brus 1984's coefficient, from memory).
    const optical = [{ radiusNM: 2, peaksEV: [1.5 + 1 / 4 - (1.786 * COULOMB_EV_NM) / (12.5 * 2)] }];
    const s = sizeSeries(curves, { material: resolveMaterial("InP"), optical });
    expect(s.optical).toHaveLength(1);
    expect(s.optical![0].peaks[0].assigned?.label).toBe("h1-s");
    expectClose(s.optical![0].peaks[0].assigned!.mismatchEV, 0, { atol: 1e-9 });
    const none = sizeSeries(curves, { optical });
    expect(none.optical).toBeNull();
    expect(none.warnings.join(" ")).toContain("needs the dielectric constant");
  });

  it("refuses unknown options", () => {
    expectError(() => sizeSeries([], { binWidth: 1 } as never), "options/unknown-key", "binWidth");
  });
});
