// symmetricInverse checked against ml-matrix's general inverse (reference library) and the
// identity A·A⁻¹ = I.
import { describe, it, expect } from "vitest";
import { Matrix, inverse } from "ml-matrix";
import { expectClose } from "../helpers/expectClose.ts";
import { symmetricInverse } from "../../lib/util/smallSymmetric.ts";
import { seededRandom } from "../../lib/util/random.ts";

describe("symmetricInverse(a, m)", () => {
  it("matches ml-matrix's inverse on random symmetric positive-definite matrices (m = 1…9)", () => {
    const rng = seededRandom(21);
    for (let m = 1; m <= 9; m++) {
      const b = Matrix.zeros(m, m);
      for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) b.set(i, j, rng.normal());
      const spd = b.mmul(b.transpose()).add(Matrix.eye(m, m).mul(0.1));
      const got = symmetricInverse(Float64Array.from(spd.to1DArray()), m)!;
      expectClose(got, inverse(spd).to1DArray(), { rtol: 1e-8, atol: 1e-10, what: `m=${m}` });
    }
  });

  it("returns null for a singular matrix", () => {
    expect(symmetricInverse(Float64Array.from([1, 1, 1, 1]), 2)).toBeNull();
  });
});
