// combineCurves / flagOutliers: the curves of one dot combined. Expected values are computed by
// hand from the inputs (mean, sample SD, SE = SD/√n: closed forms) and the outlier rule is the
// modified z-score of B. Iglewicz and D. C. Hoaglin, How to Detect and Handle Outliers (ASQC
// Quality Press, 1993): |x − median| / (1.4826·MAD) > 3.5 (from memory).
import { describe, it, expect } from "vitest";
import { combineCurves, flagOutliers, COMBINE_DEFAULTS } from "../../lib/sizes/combineCurves.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { curveValues } from "./curveValuesFixture.ts";

const curve = (file: string, spec: Parameters<typeof curveValues>[0]) => ({ file, values: curveValues(spec) });

describe("combineCurves(curves, options)", () => {
  it("COMBINE_DEFAULTS is locked", () => {
    expect(COMBINE_DEFAULTS).toEqual({ outlierScore: 3.5, pairScore: 3.5, madToSigma: 1.4826 });
  });

  it("mean, sample SD and SE = SD/√n by hand (closed form: SD of a, a+h, a+2h is h)", () => {
    const d = combineCurves([
      curve("a", { gapV: 2.0, chargingEnergyV: 0.1, eta: 0.8 }),
      curve("b", { gapV: 2.02, chargingEnergyV: 0.1, eta: 0.8 }),
      curve("c", { gapV: 2.04, chargingEnergyV: 0.1, eta: 0.8 }),
    ]);
    expectClose(d.bias.gapV!.mean, 2.02, { rtol: 1e-12 });
    expectClose(d.bias.gapV!.sd!, 0.02, { rtol: 1e-9 });
    expectClose(d.bias.gapV!.standardError!, 0.02 / Math.sqrt(3), { rtol: 1e-9 });
    expect(d.bias.gapV!.n).toBe(3);
    // Energies: η × bias (the project's convention), same statistics scaled by η.
    expectClose(d.energies.gapEV!.mean, 0.8 * 2.02, { rtol: 1e-12 });
    expectClose(d.energies.gapEV!.standardError!, (0.8 * 0.02) / Math.sqrt(3), { rtol: 1e-9 });
    // Single-particle gap = gap − Ec per curve (the project's definition).
    expectClose(d.bias.singleParticleGapV!.mean, 1.92, { rtol: 1e-12 });
    expect(d.flags).toEqual([]);
  });

  it("the SE is at least the curves' own 1σ propagated to the mean, rms(σ)/√n (closed form)", () => {
    const d = combineCurves([curve("a", { gapV: 2.0, sigmaV: 0.01 }), curve("b", { gapV: 2.0, sigmaV: 0.01 })]);
    expect(d.bias.gapV!.sd).toBe(0);
    expectClose(d.bias.gapV!.standardError!, 0.01 / Math.sqrt(2), { rtol: 1e-12 });
  });

  it("one curve: its value and its own 1σ", () => {
    const d = combineCurves([curve("a", { gapV: 2.1, sigmaV: 0.003, chargingEnergyV: 0.12 })]);
    expect(d.bias.gapV).toEqual({ mean: 2.1, standardError: 0.003, sd: null, n: 1, files: ["a"] });
  });

  it("an outlier among five curves is flagged with the reason and left out of that quantity's mean only", () => {
    // gap 1.00, 1.01, 0.99, 1.02, 1.50 V (η = 1): median 1.01, MAD 0.01, score of 1.50 = 0.49 / 0.014826 = 33.05.
    const gaps = [1.0, 1.01, 0.99, 1.02, 1.5];
    const d = combineCurves(gaps.map((g, i) => curve(`c${i}`, { gapV: g, levelSpacingSPV: 0.3, eta: 1, sigmaV: 0.001 })));
    expect(d.flags).toHaveLength(1);
    const f = d.flags[0];
    expect(f).toMatchObject({ file: "c4", quantity: "gap", excluded: true });
    expectClose(f.score, 0.49 / (1.4826 * 0.01), { rtol: 1e-9 });
    expectClose(f.referenceEV, 1.01, { rtol: 1e-12 });
    expect(f.reason).toContain("left out of the mean");
    expectClose(d.bias.gapV!.mean, (1.0 + 1.01 + 0.99 + 1.02) / 4, { rtol: 1e-12 });
    expect(d.bias.gapV!.files).toEqual(["c0", "c1", "c2", "c3"]);
    expect(d.bias.levelSpacingSPV!.n).toBe(5);
  });

  it("two curves that disagree are both flagged and both kept, with a warning", () => {
    // |1.0 − 1.1| / √(0.01² + 0.01²) = 7.07 > 3.5 (closed form).
    const d = combineCurves([curve("a", { gapV: 1.0, eta: 1, sigmaV: 0.01 }), curve("b", { gapV: 1.1, eta: 1, sigmaV: 0.01 })]);
    expect(d.flags.map((f) => [f.file, f.excluded])).toEqual([["a", false], ["b", false]]);
    expectClose(d.flags[0].score, 0.1 / Math.hypot(0.01, 0.01), { rtol: 1e-9 });
    expectClose(d.bias.gapV!.mean, 1.05, { rtol: 1e-12 });
    expect(d.warnings.join(" ")).toContain("two curves disagree in gap");
    const agree = combineCurves([curve("a", { gapV: 1.0, eta: 1, sigmaV: 0.01 }), curve("b", { gapV: 1.02, eta: 1, sigmaV: 0.01 })]);
    expect(agree.flags).toEqual([]);
  });

  it("curves are compared in energy, so different η do not make outliers", () => {
    // The same level 1.6 eV seen through η = 0.8 and 0.9 (bias 2.0 and 1.777… V) and 0.85.
    const d = combineCurves([0.8, 0.9, 0.85].map((eta, i) => curve(`c${i}`, { gapV: 1.6 / eta, eta, sigmaV: 0.001 })));
    expect(d.flags).toEqual([]);
    expectClose(d.energies.gapEV!.mean, 1.6, { rtol: 1e-12 });
    expect(d.energies.etas).toEqual([0.8, 0.85, 0.9]);
  });

  it("regime by majority with the votes; a tie is undetermined with a warning", () => {
    const d = combineCurves([
      curve("a", { gapV: 2, chargingEnergyV: 0.1 }),
      curve("b", { gapV: 2, chargingEnergyV: 0.1 }),
      curve("c", { gapV: 2 }),
    ]);
    expect(d.regime).toBe("shell-filling");
    expect(d.regimeVotes).toEqual({ "shell-filling": 2, "shell-tunneling": 1, undetermined: 0 });
    const tie = combineCurves([curve("a", { gapV: 2, chargingEnergyV: 0.1 }), curve("b", { gapV: 2 })]);
    expect(tie.regime).toBe("undetermined");
    expect(tie.warnings.join(" ")).toContain("split evenly");
  });

  it("VB spacings are combined by their index from the gap edge", () => {
    const d = combineCurves([curve("a", { gapV: 2, valenceSpacingsV: [0.1, 0.2] }), curve("b", { gapV: 2, valenceSpacingsV: [0.12] })]);
    expectClose(d.bias.valenceSpacingsV[0]!.mean, 0.11, { rtol: 1e-12 });
    expect(d.bias.valenceSpacingsV[1]).toMatchObject({ mean: 0.2, n: 1 });
  });

  it("refuses an empty list and bad thresholds", () => {
    expectError(() => combineCurves([]), "sizes/no-curves");
    expectError(() => combineCurves([curve("a", { gapV: 2 })], { outlierScore: 0 }), "options/not-positive", "outlierScore");
    expectError(() => combineCurves([curve("a", { gapV: 2 })], { madToSigma: 1 } as never), "options/unknown-key", "madToSigma");
  });
});

describe("flagOutliers(values, sigmas, options)", () => {
  it("the cut-off is 3.5 robust σ: 0.0515 passes, 0.0525 is flagged (median 0, MAD 0.01, by hand)", () => {
    // 3.5 × 1.4826 × 0.01 = 0.051891.
    expect(flagOutliers([-0.01, 0, 0, 0.01, 0.0515], [null, null, null, null, null])[4].outlier).toBe(false);
    expect(flagOutliers([-0.01, 0, 0, 0.01, 0.0525], [null, null, null, null, null])[4].outlier).toBe(true);
  });
  it("the robust scale is floored at the median 1σ: when most curves coincide (MAD 0) noise-level differences pass", () => {
    const v = flagOutliers([1, 1, 1, 1.0005], [0.001, 0.001, 0.001, 0.001]);
    expect(v.map((x) => x.outlier)).toEqual([false, false, false, false]);
    expectClose(v[3].score, 0.5, { rtol: 1e-9 });
  });
  it("one value is never an outlier", () => {
    expect(flagOutliers([5], [null])).toEqual([{ score: 0, reference: 5, outlier: false }]);
  });
});
