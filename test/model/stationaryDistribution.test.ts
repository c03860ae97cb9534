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

/**
 * Textbook state reduction over every pair of states (Grassmann–Taksar–Heyman 1985, from memory):
 * no band limits, no entries skipped.
 */
function denseStateReduction(rates: Float64Array, n: number): Float64Array {
  const q = rates.slice();
  for (let k = n - 1; k >= 1; k--) {
    let s = 0;
    for (let j = 0; j < k; j++) s += q[k * n + j];
    if (!(s > 0)) s = Number.MIN_VALUE;
    for (let i = 0; i < k; i++) {
      q[i * n + k] /= s;
      for (let j = 0; j < k; j++) q[i * n + j] += q[i * n + k] * q[k * n + j];
    }
  }
  const out = new Float64Array(n);
  out[0] = 1;
  let total = 1;
  for (let k = 1; k < n; k++) {
    for (let i = 0; i < k; i++) out[k] += out[i] * q[i * n + k];
    total += out[k];
  }
  return out.map((p) => p / total);
}

/** A random chain of states in blocks (sizes given) with rates only within a block and between neighbouring blocks, about half of them 0. */
function sparseBlockChain(sizes: number[], rng: ReturnType<typeof seededRandom>) {
  const block: number[] = sizes.flatMap((b, N) => Array<number>(b).fill(N));
  const n = block.length;
  const start = sizes.map((_, N) => sizes.slice(0, N).reduce((a, b) => a + b, 0));
  const q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j && Math.abs(block[i] - block[j]) <= 1 && rng.uniform() < 0.5) q[i * n + j] = 10 ** (8 * rng.uniform() - 4);
  // Every state keeps one way down and one way up, so that the chain is irreducible.
  for (let i = 1; i < n; i++) q[i * n + (block[i] > 0 ? start[block[i] - 1] : 0)] ||= 1;
  for (let i = 0; i + 1 < n; i++) q[i * n + i + 1] ||= 1;
  return { n, q, lower: Int32Array.from(block, (N) => start[Math.max(N - 1, 0)]) };
}

describe("stationaryDistribution(rates, n, lowerBlockStart, out)", () => {
  it("gives bit for bit the textbook state reduction over every pair of states on sparse block chains (the band limits and the zero columns it skips change nothing)", () => {
    const rng = seededRandom(23);
    for (const sizes of [[1, 3, 3, 1], [1, 4, 6, 4, 1], [1, 2, 5, 7, 5, 2, 1]]) {
      for (let trial = 0; trial < 20; trial++) {
        const { n, q, lower } = sparseBlockChain(sizes, rng);
        const got = new Float64Array(n);
        stationaryDistribution(q.slice(), n, lower, got);
        expect(Array.from(got)).toEqual(Array.from(denseStateReduction(q, n)));
      }
    }
  });

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
