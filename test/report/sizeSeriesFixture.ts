// A small size series for the report tests: four dots (one with three curves, one of them far
// off), one unassigned curve, InP, one optical row. Values by construction (plumbing), with Ec
// from the sphere closed form e²/(4πε₀·ε·R), ε = 7.
import { sizeSeries, type SeriesCurveInput } from "../../lib/sizes/sizeSeries.ts";
import { resolveMaterial } from "../../lib/sizes/materials.ts";
import { COULOMB_EV_NM } from "../../lib/sizes/sizeConstants.ts";
import { curveValues } from "../sizes/curveValuesFixture.ts";

const ETA = 0.85;

function curve(file: string, dot: string | null, radiusNM: number | null, shift = 0, r = radiusNM ?? 2): SeriesCurveInput {
  const ecEV = COULOMB_EV_NM / (7 * r);
  return {
    file,
    dot,
    radiusNM,
    values: curveValues({
      gapV: (1.45 + 1.2 / r ** 1.5 + ecEV + shift) / ETA,
      chargingEnergyV: ecEV / ETA,
      levelSpacingSPV: 0.9 / r ** 2 / ETA,
      valenceSpacingsV: [0.3 / r / ETA],
      eta: ETA,
      sigmaV: 0.002,
    }),
  };
}

export const SERIES_CURVES: SeriesCurveInput[] = [
  curve("d1-1.csv", "D1", 1.5),
  curve("d1-2.csv", "D1", 1.5, 0.001),
  curve("d2-1.csv", "D2", 2),
  curve("d2-2.csv", "D2", 2, 0.002),
  curve("d2-3.csv", "D2", 2, 0.3),
  curve("d3-1.csv", "D3", 2.5),
  curve("d4-1.csv", "D4", 3),
  curve("d4-2.csv", "D4", 3, -0.001),
  { ...curve("lone.csv", "D9", null), unassignedReason: "no radius_nm or diameter_nm metadata line" },
];

export const SERIES = sizeSeries(SERIES_CURVES, { material: resolveMaterial("InP"), optical: [{ radiusNM: 2, peaksEV: [2.1, 2.6] }] });
