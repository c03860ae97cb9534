// residualStructure: a run of equal residuals gives |Σ r|/√w exactly (closed form: 10 points at
// 2σ → 20/√10 = 6.325); pure Gaussian noise from the project's seeded generator stays below the
// status limit 5 (closed form: each window's statistic is standard normal, 2·(1 − Φ(5)) = 5.7e-7).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { residualStructure } from "../../../lib/model/fit/residualStructure.ts";
import { seededRandom } from "../../../lib/util/random.ts";

describe("residualStructure(biasV, residualA, noiseA, windowV)", () => {
  const biasV = Array.from({ length: 100 }, (_, i) => i * 0.01);

  it("finds a run of ten residuals at 2σ: 20/√10, at its middle", () => {
    const residualA = biasV.map((_, i) => (i >= 50 && i < 60 ? 2e-12 : 0));
    const r = residualStructure(biasV, residualA, 1e-12, 0.1);
    expect(r.windowPoints).toBe(10);
    expectClose(r.largestZ, 20 / Math.sqrt(10), { rtol: 1e-12, what: "20/√10" });
    expectClose(r.atBiasV, 0.545, { rtol: 1e-12, what: "middle of points 50–59" });
  });

  it("stays below 5 on Gaussian noise alone (1,000 points, windows of 10)", () => {
    const rng = seededRandom(7);
    const bias = Array.from({ length: 1000 }, (_, i) => i * 0.001);
    const noise = bias.map(() => 3e-12 * rng.normal());
    expect(residualStructure(bias, noise, 3e-12, 0.01).largestZ).toBeLessThan(5);
  });

  it("uses at least 3 points per window and gives 0 for fewer than 3 points", () => {
    expect(residualStructure(biasV, biasV.map(() => 0), 1e-12, 0).windowPoints).toBe(3);
    expect(residualStructure([0, 1], [1, 1], 1, 1).largestZ).toBe(0);
  });
});
