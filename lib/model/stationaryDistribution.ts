/**
 * Stationary distribution of a continuous-time Markov chain by state reduction (the
 * Grassmann–Taksar–Heyman algorithm): subtraction-free, so it stays accurate when rates span
 * many orders of magnitude (fast relaxation next to thermally suppressed tunnelling).
 *
 * Notes:
 * 1. For k = n−1 down to 1: s_k = Σ_{j<k} q_kj; q_ik ← q_ik/s_k for i < k;
 *    q_ij ← q_ij + q_ik·q_kj for i, j < k (state k is censored out of the chain).
 * 2. π_0 = 1; π_k = Σ_{i<k} π_i·q_ik for k = 1 … n−1; normalise.
 * The chains of this project change the carrier number by at most one per transition and
 * their states are sorted by carrier number, so the fill-in stays inside the blocks N−1 and N;
 * `lowerBlockStart[k]` (the first state of block N(k) − 1) bounds every loop, which makes the
 * cost about n·b² for blocks of size b instead of n³/3.
 *
 * Reference: W. K. Grassmann, M. I. Taksar and D. P. Heyman, "Regenerative analysis and
 * steady state distributions for Markov chains", Operations Research 33, 1107 (1985).
 *
 * @param rates - n×n row-major transition rates q_ij (i → j, i ≠ j), overwritten.
 * @param n - number of states.
 * @param lowerBlockStart - for each state, the lowest state index it (or its fill-in) can reach.
 * @param out - receives the probabilities (length n).
 */
export function stationaryDistribution(rates: Float64Array, n: number, lowerBlockStart: Int32Array, out: Float64Array): void {
  for (let k = n - 1; k >= 1; k--) {
    const lo = lowerBlockStart[k];
    const rowK = k * n;
    let s = 0;
    for (let j = lo; j < k; j++) s += rates[rowK + j];
    // A state with no way down is absorbing in the censored chain: give it a vanishing exit so
    // it collects the probability, as it does physically.
    if (!(s > 0)) s = Number.MIN_VALUE;
    for (let i = lo; i < k; i++) {
      const rowI = i * n;
      const qik = rates[rowI + k];
      if (qik === 0) continue;
      const f = qik / s;
      rates[rowI + k] = f;
      for (let j = lo; j < k; j++) {
        const qkj = rates[rowK + j];
        if (qkj !== 0) rates[rowI + j] += f * qkj;
      }
    }
  }
  out[0] = 1;
  let total = 1;
  for (let k = 1; k < n; k++) {
    let p = 0;
    for (let i = lowerBlockStart[k]; i < k; i++) p += out[i] * rates[i * n + k];
    out[k] = p;
    total += p;
  }
  if (!Number.isFinite(total)) {
    // Overflow from an absorbing state: keep only the infinite entries, equally weighted.
    let count = 0;
    for (let k = 0; k < n; k++) if (!Number.isFinite(out[k])) count++;
    for (let k = 0; k < n; k++) out[k] = Number.isFinite(out[k]) ? 0 : 1 / count;
    return;
  }
  for (let k = 0; k < n; k++) out[k] /= total;
}
