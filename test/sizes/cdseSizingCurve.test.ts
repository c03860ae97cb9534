// The Brus gap against the empirical CdSe sizing curve of W. W. Yu, L. Qu, W. Guo and X. Peng,
// Chem. Mater. 15, 2854 (2003) (coefficients from memory). That the simple effective-mass model
// overestimates the first exciton of small crystallites, the more the smaller they are (finite
// barriers and non-parabolic bands lower the confinement), is from memory.
import { describe, expect, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { brusVersusCdSeSizing, cdseDiameterNM, cdseFirstExcitonWavelengthNM } from "../../lib/sizes/cdseSizingCurve.ts";

describe("CdSe sizing curve", () => {
  it("D(λ) = 1.6122e-9λ⁴ − 2.6575e-6λ³ + 1.6242e-3λ² − 0.4277λ + 41.57 (Yu et al. 2003, from memory) at λ = 550 nm", () => {
    const l = 550;
    expectClose(cdseDiameterNM(l), 1.6122e-9 * l ** 4 - 2.6575e-6 * l ** 3 + 1.6242e-3 * l ** 2 - 0.4277 * l + 41.57, { rtol: 1e-12 });
  });
  it("inverts D(λ): λ(D(λ)) = λ (closed form of the inverse)", () => {
    for (const l of [450, 520, 590, 650]) expectClose(cdseFirstExcitonWavelengthNM(cdseDiameterNM(l)), l, { rtol: 1e-12 });
  });
  it("refuses diameters outside the curve", () => {
    expectError(() => cdseFirstExcitonWavelengthNM(20), "options/out-of-range", "diameterNM");
  });
  it("Brus overestimates the gap, the more the smaller the crystallite (2–8 nm)", () => {
    const rows = brusVersusCdSeSizing([2, 3, 4, 5, 6, 7, 8]);
    for (const r of rows) expect(r.deviationEV).toBeGreaterThan(0);
    for (let i = 1; i < rows.length; i++) expect(rows[i].deviationEV).toBeLessThan(rows[i - 1].deviationEV);
    expect(rows[0].deviationEV).toBeGreaterThan(0.5);
  });
});
