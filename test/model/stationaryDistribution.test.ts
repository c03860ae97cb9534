// The state-reduction solver checked against a dense linear solve by ml-matrix (general-purpose
// reference library) and against detailed balance of a birth–death chain (closed form).
import { describe, it, expect } from "vitest";
import { Matrix, solve } from "ml-matrix";
import { expectClose } from "../helpers/expectClose.ts";
import { stationaryDistribution } from "../../lib/model/stationaryDistribution.ts";
import { seededRandom } from "../../lib/util/random.ts";

/** A birth–death chain: k → k + 1 at up[k], k + 1 → k at down[k]; each state reaches down to k − 1. */
function birthDeath(up: number[], down: number[]) {
  const n = up.length + 1;
  const q = new Float64Array(n * n);
  for (let k = 0; k < n - 1; k++) {
    q[k * n + k + 1] = up[k];
    q[(k + 1) * n + k] = down[k];
  }
  return { n, q, lower: Int32Array.from({ length: n }, (_, k) => Math.max(k - 1, 0)) };
}

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
    const up = [1e12, 3e-6, 5, 1e9, 2, 7e3, 1e-10];
    const down = [4, 1e14, 2e-3, 6, 1e10, 3, 9e-5];
    const { n, q, lower } = birthDeath(up, down);
    const got = new Float64Array(n);
    stationaryDistribution(q, n, lower, got);
    const ref = [1];
    for (let k = 0; k < n - 1; k++) ref.push((ref[k] * up[k]) / down[k]);
    const total = ref.reduce((a, b) => a + b, 0);
    expectClose(got, ref.map((r) => r / total), { rtol: 1e-12, atol: 1e-300 });
  });

  it("solves the first n states of a bigger matrix (stride) exactly as the whole chain when no rate leaves them: bit for bit, the rest 0 (exact)", () => {
    // A birth–death chain of 6 states whose step 2 → 3 has rate 0: states 3…5 are unreachable
    // from the empty state, so the whole chain gives them probability 0.
    const { n, q, lower } = birthDeath([3, 0.5, 0, 2, 7], [1, 4, 9, 0.2, 5]);
    const whole = new Float64Array(n);
    stationaryDistribution(q.slice(), n, lower, whole);
    const part = new Float64Array(n).fill(-1);
    stationaryDistribution(q.slice(), 3, lower, part, n);
    expect(Array.from(part.slice(0, 3))).toEqual(Array.from(whole.slice(0, 3)));
    expect(Array.from(whole.slice(3))).toEqual([0, 0, 0]);
    expect(Array.from(part.slice(3))).toEqual([-1, -1, -1]); // not written
    // Detailed balance of the three reachable states (closed form): 1 : 3 : 3·0.5/4.
    const ref = [1, 3, 0.375];
    expectClose(Array.from(part.slice(0, 3)), ref.map((r) => r / 4.375), { rtol: 1e-14 });
  });
});
