// The weighted least-squares fit against the closed-form weighted linear regression
// (P. R. Bevington and D. K. Robinson, Data Reduction and Error Analysis for the Physical
// Sciences, 3rd ed., McGraw-Hill 2003, eqs. 6.12 and 6.21–6.22):
//   Δ = S·Sxx − Sx², a = (Sxx·Sy − Sx·Sxy)/Δ, b = (S·Sxy − Sx·Sy)/Δ, σa² = Sxx/Δ, σb² = S/Δ,
// with S = Σ1/σ², Sx = Σx/σ², … ; and on noiseless data from known parameters.
import { describe, expect, it } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";
import { fitSizeModel, type SizeModelPoint } from "../../lib/sizes/fitSizeModel.ts";

function weightedLine(points: SizeModelPoint[]) {
  let S = 0, Sx = 0, Sy = 0, Sxx = 0, Sxy = 0;
  for (const p of points) {
    const w = 1 / (p.sigma ?? 1) ** 2;
    S += w; Sx += w * p.radiusNM; Sy += w * p.value; Sxx += w * p.radiusNM ** 2; Sxy += w * p.radiusNM * p.value;
  }
  const D = S * Sxx - Sx * Sx;
  return { a: (Sxx * Sy - Sx * Sxy) / D, b: (S * Sxy - Sx * Sy) / D, sa: Math.sqrt(Sxx / D), sb: Math.sqrt(S / D) };
}

const line = { model: (r: number, [a, b]: readonly number[]) => a + b * r, parameters: [{ name: "a", initial: 0 }, { name: "b", initial: 0 }] };
// Scattered points (not on a line) with unequal uncertainties: inputs for the closed form only.
const scattered: SizeModelPoint[] = [
  { radiusNM: 1.1, value: 2.31, sigma: 0.02 }, { radiusNM: 1.6, value: 2.05, sigma: 0.05 },
  { radiusNM: 2.0, value: 1.98, sigma: 0.01 }, { radiusNM: 2.7, value: 1.71, sigma: 0.03 },
  { radiusNM: 3.3, value: 1.60, sigma: 0.04 },
];

describe("fitSizeModel(points, options)", () => {
  it("a straight line equals the closed-form weighted linear regression, values and standard errors", () => {
    const fit = fitSizeModel(scattered, line);
    const ref = weightedLine(scattered);
    expectClose(fit.params.a, ref.a, { rtol: 1e-8, what: "a" });
    expectClose(fit.params.b, ref.b, { rtol: 1e-8, what: "b" });
    expectClose(fit.stderr.a!, ref.sa, { rtol: 1e-6, what: "σa" });
    expectClose(fit.stderr.b!, ref.sb, { rtol: 1e-6, what: "σb" });
    expect(fit.weighting).toBe("given");
    expect(fit.stderrScaledByReducedChiSquare).toBe(false);
    expect(fit.degreesOfFreedom).toBe(3);
    const chi2 = scattered.reduce((s, p) => s + ((p.value - ref.a - ref.b * p.radiusNM) / p.sigma!) ** 2, 0);
    expectClose(fit.reducedChiSquare!, chi2 / 3, { rtol: 1e-8, what: "χ²_red (closed form)" });
    expect(fit.converged).toBe(true);
  });

  it("without σ: unit weights, standard errors scaled by √χ²_red (closed form: s·√(Sxx/Δ) with s² = χ²/(N−2))", () => {
    const pts = scattered.map((p) => ({ ...p, sigma: null }));
    const fit = fitSizeModel(pts, line);
    const ref = weightedLine(pts);
    const chi2 = pts.reduce((s, p) => s + (p.value - ref.a - ref.b * p.radiusNM) ** 2, 0);
    const s = Math.sqrt(chi2 / 3);
    expectClose(fit.stderr.a!, ref.sa * s, { rtol: 1e-6 });
    expectClose(fit.stderr.b!, ref.sb * s, { rtol: 1e-6 });
    expect(fit.stderrScaledByReducedChiSquare).toBe(true);
    expect(fit.warnings.join(" ")).toContain("scaled by √χ²_red");
  });

  it("gives points without σ the median of the others and says so", () => {
    const pts = scattered.map((p, i) => (i === 1 ? { ...p, sigma: null } : p));
    const fit = fitSizeModel(pts, line);
    const ref = weightedLine(pts.map((p) => ({ ...p, sigma: p.sigma ?? 0.025 }))); // median of 0.02, 0.01, 0.03, 0.04
    expectClose(fit.params.b, ref.b, { rtol: 1e-8 });
    expect(fit.weighting).toBe("median");
    expect(fit.warnings.join(" ")).toContain("median");
  });

  it("recovers known parameters from noiseless data of a nonlinear model, E = b + a/Rⁿ (a = 3.1, b = 1.42, n = 1.7)", () => {
    const truth = [1.42, 3.1, 1.7];
    const model = (r: number, [b, a, n]: readonly number[]) => b + a / r ** n;
    const pts = [1, 1.3, 1.7, 2.2, 2.8, 3.5, 4.4].map((r) => ({ radiusNM: r, value: model(r, truth), sigma: 0.01 }));
    const fit = fitSizeModel(pts, {
      model,
      parameters: [{ name: "b", initial: 1 }, { name: "a", initial: 1 }, { name: "n", initial: 1, min: 0.2, max: 4 }],
    });
    expectClose([fit.params.b, fit.params.a, fit.params.n], truth, { rtol: 1e-7 });
    expect(fit.reducedChiSquare!).toBeLessThan(1e-12);
    expect(fit.converged).toBe(true);
  });

  it("warns when a parameter ends on its bound", () => {
    const pts = [1, 2, 3].map((r) => ({ radiusNM: r, value: 5 / r, sigma: 0.01 }));
    const fit = fitSizeModel(pts, { model: (r, [a]) => a / r, parameters: [{ name: "a", initial: 1, min: 0, max: 2 }] });
    expect(fit.params.a).toBe(2);
    expect(fit.atBound).toEqual(["a"]);
    expect(fit.warnings.join(" ")).toContain("bound");
  });

  it("warns when it does not converge within maxIterations", () => {
    const fit = fitSizeModel(scattered, { ...line, maxIterations: 1 });
    expect(fit.converged).toBe(false);
    expect(fit.warnings.join(" ")).toContain("did not converge");
  });

  it("too few points: no fit, a warning; as many as parameters: no χ²_red", () => {
    const one = fitSizeModel(scattered.slice(0, 1), line);
    expect(one.warnings.join(" ")).toContain("too few points");
    expect(one.stderr.a).toBeNull();
    const two = fitSizeModel(scattered.slice(0, 2), line);
    expect(two.reducedChiSquare).toBeNull();
    expect(two.warnings.join(" ")).toContain("no reduced χ²");
  });

  it("leaves out points with a bad radius or value, and reports which were used", () => {
    const pts = [...scattered, { radiusNM: 0, value: 1, sigma: 0.1 }, { radiusNM: 2, value: NaN, sigma: 0.1 }];
    const fit = fitSizeModel(pts, line);
    expect(fit.pointsUsed).toBe(5);
    expect(fit.indicesUsed).toEqual([0, 1, 2, 3, 4]);
    expect(fit.warnings.join(" ")).toContain("2 point(s)");
  });

  it("reports a singular covariance (a parameter the model ignores)", () => {
    const fit = fitSizeModel(scattered, { model: (r, [a]) => a + 0 * r, parameters: [{ name: "a", initial: 0 }, { name: "unused", initial: 1 }] });
    expect(fit.stderr.unused).toBeNull();
    expect(fit.warnings.join(" ")).toContain("singular");
  });

  it("stops with a warning, not a false convergence, where the model is undefined next to the start", () => {
    const fit = fitSizeModel(scattered, { model: (r, [a]) => Math.sqrt(a) * r, parameters: [{ name: "a", initial: 0 }] });
    expect(fit.converged).toBe(false);
    expect(fit.warnings.join(" ")).toContain("not finite");
  });

  it("refuses a start outside the bounds and an empty parameter list", () => {
    expectError(() => fitSizeModel(scattered, { model: (r, [a]) => a, parameters: [{ name: "a", initial: 5, max: 1 }] }), "sizes/bad-parameter", "a", "bounds");
    expectError(() => fitSizeModel(scattered, { model: () => 0, parameters: [] }), "sizes/bad-parameter", "1 to 10");
  });
});
