// symmetricInverse checked against ml-matrix's general inverse (reference library) and the
// identity A·A⁻¹ = I.
import { describe, it, expect } from "vitest";
import { Matrix, inverse } from "ml-matrix";
import { expectClose } from "../helpers/expectClose.ts";
import { scaledSymmetricInverse, symmetricInverse } from "../../lib/util/smallSymmetric.ts";
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

  it("scaledSymmetricInverse matches ml-matrix on normal equations whose columns span 10 decades (1, u, u², u³ with u in volts ~1e-2)", () => {
    const u = Array.from({ length: 40 }, (_, i) => (i - 20) * 5e-4);
    const cols = [u.map(() => 1), u, u.map((v) => v * v), u.map((v) => v ** 3)];
    const a = Matrix.zeros(4, 4);
    for (let r = 0; r < 4; r++) for (let c = 0; c < 4; c++) a.set(r, c, cols[r].reduce((acc, v, i) => acc + v * cols[c][i], 0));
    const got = scaledSymmetricInverse(Float64Array.from(a.to1DArray()), 4)!;
    const ref = inverse(a).to1DArray();
    ref.forEach((v, i) => expectClose(got[i], v, { rtol: 1e-6, atol: 1e-9 * Math.abs(ref[15]), what: `entry ${i}` }));
  });
});
