/**
 * Stationary distribution of a continuous-time Markov chain by state reduction (the
 * Grassmann–Taksar–Heyman algorithm): subtraction-free, so it stays accurate when rates span
 * many orders of magnitude (fast relaxation next to thermally suppressed tunnelling).
 */

/**
 * The stationary probabilities π of a continuous-time Markov chain whose transitions change the
 * state's block (carrier number) by at most one, in place.
 *
 * Parameters
 * ----------
 * rates : Float64Array
 *     Row-major transition rates q_ij (i → j, i ≠ j) in 1/s, row i at offset i·stride; the
 *     diagonal is ignored. Overwritten (rows and columns below n only).
 * n : number
 *     Number of states solved: the first n of the matrix (the rest, if any, must be unreachable
 *     from them: no rate from a state below n to one at or above it).
 * lowerBlockStart : Int32Array
 *     For each state, the lowest state index it (or its fill-in) can reach: the first state of
 *     the block with one carrier fewer ({@link Ladder}.lowerBlockStart).
 * out : Float64Array
 *     Receives the probabilities of the first n states (summing to 1); entries from n on are
 *     not written.
 * stride : number, optional
 *     Row length of `rates`. Default n. A larger stride solves the chain of the first n states of
 *     a bigger matrix, which gives the bigger chain's probabilities exactly (bit for bit) when no
 *     rate leads from those states to the others: censoring an unreachable state adds nothing to
 *     the rows below it, and its probability is exactly 0.
 *
 * Returns
 * -------
 * void
 *     The result is written to `out`.
 *
 * Throws
 * ------
 * Nothing. A state with no way down is treated as absorbing (it collects the probability).
 *
 * Notes
 * -----
 * 1. For k = n−1 down to 1: s_k = Σ_{j<k} q_kj; q_ik ← q_ik/s_k for i < k;
 *    q_ij ← q_ij + q_ik·q_kj for i, j < k (state k is censored out of the chain).
 * 2. π_0 = 1; π_k = Σ_{i<k} π_i·q_ik for k = 1 … n−1; normalise.
 * The chains of this project change the carrier number by at most one per transition and
 * their states are sorted by carrier number, so the fill-in stays inside the blocks N−1 and N;
 * `lowerBlockStart[k]` (the first state of block N(k) − 1) bounds every loop, which makes the
 * cost about n·b² for blocks of size b instead of n³/3.
 * 3. Censoring k updates only the columns from the first to the last non-zero entry of row k below
 *    k (the others would add exactly 0): at zero temperature many rates are 0 and the rows of
 *    the crossover's ladders begin or end with zeros (a fifth of the updates skipped, the same
 *    bits).
 * 4. Rows i are read at i·stride, so a caller can solve only the states it can reach
 *    ({@link ladderCurrent} leaves out the blocks above the highest one a carrier can enter).
 *
 * References
 * ----------
 * W. K. Grassmann, M. I. Taksar and D. P. Heyman, "Regenerative analysis and steady state
 * distributions for Markov chains", Operations Research 33, 1107 (1985).
 *
 * Example
 * -------
 * ```ts
 * // Two states: 0 → 1 at 1/s, 1 → 0 at 3/s.
 * const out = new Float64Array(2);
 * stationaryDistribution(Float64Array.of(0, 1, 3, 0), 2, Int32Array.of(0, 0), out);
 * out; // => [0.75, 0.25] (detailed balance: π₀·1 = π₁·3)
 * ```
 */
export function stationaryDistribution(rates: Float64Array, n: number, lowerBlockStart: Int32Array, out: Float64Array, stride = n): void {
  for (let k = n - 1; k >= 1; k--) {
    const lo = lowerBlockStart[k];
    const rowK = k * stride;
    let s = 0;
    // The first and last non-zero entries of row k below k: the updates reach only those columns.
    let first = k, end = lo;
    for (let j = lo; j < k; j++) {
      const qkj = rates[rowK + j];
      s += qkj;
      if (qkj !== 0) {
        if (first === k) first = j;
        end = j + 1;
      }
    }
    // A state with no way down is absorbing in the censored chain: give it a vanishing exit so
    // it collects the probability, as it does physically.
    if (!(s > 0)) s = Number.MIN_VALUE;
    for (let i = lo; i < k; i++) {
      const rowI = i * stride;
      const qik = rates[rowI + k];
      if (qik === 0) continue;
      const f = qik / s;
      rates[rowI + k] = f;
      for (let j = first; j < end; j++) {
        const qkj = rates[rowK + j];
        if (qkj !== 0) rates[rowI + j] += f * qkj;
      }
    }
  }
  out[0] = 1;
  let total = 1;
  for (let k = 1; k < n; k++) {
    let p = 0;
    for (let i = lowerBlockStart[k]; i < k; i++) p += out[i] * rates[i * stride + k];
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
