// symmetricInverse and scaledCholeskySolve checked against ml-matrix's general inverse and solve
// (reference library), and a 2×2 system solved by hand (closed form).
import { describe, it, expect } from "vitest";
import { Matrix, inverse, solve } from "ml-matrix";
import { expectClose } from "../helpers/expectClose.ts";
import { scaledCholeskySolve, scaledSymmetricInverse, symmetricInverse } from "../../lib/util/smallSymmetric.ts";
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

describe("scaledCholeskySolve(a, b, m, tail)", () => {
  it("solves the 2×2 system [[4, 2], [2, 3]]·x = (2, 1): x = (1/2, 0), (A⁻¹)₂₂ = 4/8 (closed form: Cramer's rule)", () => {
    const got = scaledCholeskySolve(Float64Array.of(4, 2, 2, 3), Float64Array.of(2, 1), 2, 1)!;
    expectClose(got.x, [0.5, 0], { rtol: 1e-14, atol: 1e-15 });
    expectClose(got.tailInverse, [0.5], { rtol: 1e-14 });
  });

  it("matches ml-matrix's solve and the trailing block of its inverse (m = 1…9, tail 0…m), columns spanning decades", () => {
    const rng = seededRandom(22);
    for (let m = 1; m <= 9; m++) {
      const b = Matrix.zeros(m, m);
      for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) b.set(i, j, rng.normal() * 10 ** (i - 4));
      const spd = b.mmul(b.transpose()).add(Matrix.diag(Array.from({ length: m }, (_, i) => 1e-3 * 10 ** (2 * (i - 4)))));
      const rhs = Array.from({ length: m }, () => rng.normal());
      const ref = solve(spd, Matrix.columnVector(rhs)).to1DArray();
      const inv = inverse(spd);
      for (let tail = 0; tail <= m; tail++) {
        const got = scaledCholeskySolve(Float64Array.from(spd.to1DArray()), rhs, m, tail)!;
        got.x.forEach((v, i) => expectClose(v, ref[i], { rtol: 1e-6, atol: 1e-9 * Math.max(...ref.map(Math.abs)), what: `m=${m} x[${i}]` }));
        for (let i = 0; i < tail; i++)
          for (let j = 0; j < tail; j++) {
            const want = inv.get(m - tail + i, m - tail + j);
            expectClose(got.tailInverse[i * tail + j], want, { rtol: 1e-6, atol: 1e-9 * Math.abs(inv.get(m - 1, m - 1)), what: `m=${m} tail=${tail} (${i},${j})` });
          }
      }
    }
  });

  it("returns null for a matrix that is not positive definite", () => {
    expect(scaledCholeskySolve(Float64Array.of(1, 2, 2, 1), Float64Array.of(1, 1), 2, 1)).toBeNull();
  });
});
