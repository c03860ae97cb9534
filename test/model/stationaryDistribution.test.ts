// The state-reduction solver checked against a dense linear solve by ml-matrix (general-purpose
// reference library) and against detailed balance of a birth–death chain (closed form).
import { describe, it } from "vitest";
import { Matrix, solve } from "ml-matrix";
import { expectClose } from "../helpers/expectClose.ts";
import { stationaryDistribution } from "../../lib/model/stationaryDistribution.ts";
import { seededRandom } from "../../lib/util/random.ts";

describe("stationaryDistribution(rates, n, lowerBlockStart, out)", () => {
  it("agrees with a dense solve of πQ = 0, Σπ = 1 (ml-matrix) on random dense chains", () => {
    const rng = seededRandom(11);
    for (const n of [2, 5, 12]) {
      const q = new Float64Array(n * n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j) q[i * n + j] = rng.uniform() * 10 ** (4 * rng.uniform());
      // Dense reference: Qᵀπ = 0 with the last equation replaced by normalisation.
      const a = Matrix.zeros(n, n);
      for (let i = 0; i < n; i++) {
        let out = 0;
        for (let j = 0; j < n; j++) if (j !== i) out += q[i * n + j];
        for (let j = 0; j < n; j++) a.set(j, i, j === i ? -out : q[i * n + j]);
      }
      for (let i = 0; i < n; i++) a.set(n - 1, i, 1);
      const b = Matrix.zeros(n, 1);
      b.set(n - 1, 0, 1);
      const ref = solve(a, b).getColumn(0);
      const got = new Float64Array(n);
      stationaryDistribution(q.slice(), n, new Int32Array(n), got);
      expectClose(got, ref, { rtol: 1e-9, atol: 1e-15, what: `n=${n}` });
    }
  });

  it("gives the detailed-balance solution π_{k+1}/π_k = λ_k/μ_{k+1} of a birth–death chain with rates spanning 30 decades (closed form)", () => {
    const n = 8;
    const up = [1e12, 3e-6, 5, 1e9, 2, 7e3, 1e-10];
    const down = [4, 1e14, 2e-3, 6, 1e10, 3, 9e-5];
    const q = new Float64Array(n * n);
    for (let k = 0; k < n - 1; k++) {
      q[k * n + k + 1] = up[k];
      q[(k + 1) * n + k] = down[k];
    }
    const lower = Int32Array.from({ length: n }, (_, k) => Math.max(k - 1, 0));
    const got = new Float64Array(n);
    stationaryDistribution(q, n, lower, got);
    const ref = [1];
    for (let k = 0; k < n - 1; k++) ref.push((ref[k] * up[k]) / down[k]);
    const total = ref.reduce((a, b) => a + b, 0);
    expectClose(got, ref.map((r) => r / total), { rtol: 1e-12, atol: 1e-300 });
  });
});
