// BIC of nested linear models against a hand calculation (closed form: least squares of a
// constant and of a straight line on six points with σ = 1, BIC = χ² + k·ln n; G. Schwarz,
// Ann. Stat. 6, 461 (1978)), the χ² coming from the fit's own Levenberg–Marquardt loop; weights
// exp(−Δ/2)/Σ (K. P. Burnham and D. R. Anderson, Model Selection and Multimodel Inference, 2nd ed.,
// Springer 2002, §2.9) computed by hand.
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { bayesianInformationCriterion, evidenceWeights } from "../../../lib/model/fit/informationCriterion.ts";
import { levenbergMarquardtLoop } from "../../../lib/model/fit/levenbergMarquardtLoop.ts";

// y at x = 0 … 5, σ = 1. By hand: ȳ = 3.5, Syy = Σ(y − ȳ)² = 17.5, x̄ = 2.5, Sxx = 17.5,
// Sxy = 15.5; constant: χ² = Syy = 17.5; line: χ² = Syy − Sxy²/Sxx = 17.5 − 240.25/17.5 = 3.7714286.
const x = [0, 1, 2, 3, 4, 5];
const y = [1, 3, 2, 5, 4, 6];
const settings = { maxIterations: 200, timeLimitMs: 5000, chunkIterations: 4, convergenceTolerance: 1e-12 };

describe("bayesianInformationCriterion(chiSquare, k, n)", () => {
  it("scores a constant and a straight line fitted to the same six points as the hand calculation", () => {
    const constant = levenbergMarquardtLoop({ x, y }, (p) => () => p[0], { ...settings, initialValues: [0], minValues: [-100], maxValues: [100], gradientDifference: [1e-6] });
    const line = levenbergMarquardtLoop({ x, y }, (p) => (v) => p[0] + p[1] * v, { ...settings, initialValues: [0, 0], minValues: [-100, -100], maxValues: [100, 100], gradientDifference: [1e-6, 1e-6] });
    expectClose(constant.chiSquare, 17.5, { rtol: 1e-6, what: "χ² of the constant (hand: Syy)" });
    expectClose(line.chiSquare, 17.5 - 15.5 ** 2 / 17.5, { rtol: 1e-6, what: "χ² of the line (hand: Syy − Sxy²/Sxx)" });
    const bicConstant = bayesianInformationCriterion(constant.chiSquare, 1, 6);
    const bicLine = bayesianInformationCriterion(line.chiSquare, 2, 6);
    // Hand: 17.5 + ln 6 = 19.2917595; 3.7714286 + 2 ln 6 = 7.3549470 (ln 6 = 1.7917595).
    expectClose(bicConstant, 19.2917595, { rtol: 1e-6, what: "BIC constant" });
    expectClose(bicLine, 7.354947, { rtol: 1e-6, what: "BIC line" });
    // The extra parameter costs ln 6 but buys 13.73 of χ²: the line wins by ΔBIC = 11.936812.
    expectClose(bicConstant - bicLine, 11.936812, { rtol: 1e-6, what: "ΔBIC" });
  });

  it("charges ln n per parameter: with the same χ², one more parameter on 800 points costs ln 800 = 6.6846117", () => {
    expectClose(bayesianInformationCriterion(100, 11, 800) - bayesianInformationCriterion(100, 10, 800), 6.6846117, { rtol: 1e-7 });
  });
});

describe("evidenceWeights(scores)", () => {
  it("gives exp(−Δ/2)/Σ: for ΔBIC = 11.936812 the line carries 1/(1 + e^−5.968406) = 0.9974482 (hand)", () => {
    const [constant, line] = evidenceWeights([19.2917595, 7.354947]);
    expectClose(line, 0.9974482, { rtol: 1e-6 });
    expectClose(constant + line, 1, { rtol: 1e-12 });
  });

  it("gives non-finite scores weight 0, and all 0 when none is finite", () => {
    expect(evidenceWeights([5, Infinity, 5])).toEqual([0.5, 0, 0.5]);
    expect(evidenceWeights([Infinity, NaN])).toEqual([0, 0]);
  });
});
