// projectLinear checked against closed forms: data built from known coefficients lie in the
// column space, so linear least squares returns those coefficients exactly.
import { describe, it } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { linearProjector, projectLinear } from "../../../lib/model/fit/projectLinear.ts";

describe("projectLinear(unitA, biasV, cubeV3, dataA)", () => {
  it("recovers scale, offset, b1 and b3 of noise-free data built from them (closed form: exact least-squares solution)", () => {
    const biasV = Float64Array.from({ length: 201 }, (_, i) => -2 + i * 0.02);
    const unitA = biasV.map((v) => 1.6e-19 * (1 / (1 + Math.exp(-(v - 0.8) / 0.02)) - 1 / (1 + Math.exp((v + 1.1) / 0.02))));
    const cube = biasV.map((v) => v ** 3);
    const truth = [2e8, 3e-12, -4e-12, 5e-13];
    const dataA = biasV.map((v, i) => truth[0] * unitA[i] + truth[1] + truth[2] * v + truth[3] * cube[i]);
    const r = projectLinear(unitA, biasV, cube, dataA);
    expectClose(r.coef, truth, { rtol: 1e-9, what: "coefficients" });
    expectClose(Array.from(r.out), Array.from(dataA), { rtol: 1e-9, atol: 1e-22, what: "model current" });
  });

  it("gives zero coefficients when the normal equations are singular (a unit current identical to the offset column)", () => {
    const biasV = [0, 1, 2, 3];
    const r = projectLinear([1, 1, 1, 1], biasV, biasV.map((v) => v ** 3), [1, 2, 3, 4]);
    expectClose(r.coef, [0, 0, 0, 0], { atol: 0, what: "coefficients" });
  });

  it("linearProjector recovers the coefficients of data built from each of two unit currents on the same points (closed form: exact solution)", () => {
    const biasV = Float64Array.from({ length: 121 }, (_, i) => -1.2 + i * 0.02);
    const cube = biasV.map((v) => v ** 3);
    const shapes = [biasV.map((v) => 1e-19 / (1 + Math.exp(-(v - 0.3) / 0.03))), biasV.map((v) => 2e-19 / (1 + Math.exp(-(v + 0.5) / 0.05)))];
    const truth = [
      [1e8, 2e-12, 1e-12, -3e-13],
      [5e7, -1e-12, 4e-12, 2e-13],
    ];
    for (const [k, unitA] of shapes.entries()) {
      const dataA = biasV.map((v, i) => truth[k][0] * unitA[i] + truth[k][1] + truth[k][2] * v + truth[k][3] * cube[i]);
      const project = linearProjector(biasV, cube, dataA);
      expectClose(project(unitA).coef, truth[k], { rtol: 1e-8, what: `coefficients, shape ${k}` });
    }
  });
});
