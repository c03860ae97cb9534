/**
 * The cost of one master-equation solve of a band's ladder, counted in elimination steps: what
 * the fit's work budget weighs its model evaluations by.
 */
import type { Ladder } from "../ladder.ts";

/**
 * The elimination steps of one state reduction of a ladder's master equation.
 *
 * Parameters
 * ----------
 * ladder : Ladder
 *     From {@link buildLadder}: its state count and, per state, the first state of the block with
 *     one carrier fewer (`lowerBlockStart`).
 *
 * Returns
 * -------
 * number
 *     W = Σ_{k=1}^{n−1} (k − lowerBlockStart[k])², the updates of the innermost loop of
 *     {@link stationaryDistribution} when every rate is non-zero (an upper bound of its work).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. State reduction censors the states from the last down; censoring state k updates the
 *    (k − lo)² entries between the first state of the block below it (lo) and k.
 * 2. With the states sorted by carrier number N into blocks of b_N states (b_N: the number of
 *    occupations with N carriers, the coefficient of x^N in Π_j (1 + x + … + x^{g_j})), the state
 *    i of block N (i = 0 … b_N − 1) has k − lo = b_{N−1} + i: W = Σ_{N≥1} Σ_{i<b_N} (b_{N−1} + i)².
 *    One level of degeneracy g: every block holds one state, W = g. An s doublet and a p sextet
 *    (21 states, blocks 1, 2, 3, 3, 3, 3, 3, 2, 1): W = 263.
 * 3. The time of a solve grows with W (about n·b² for blocks of size b): a ladder of many single
 *    levels costs far more per evaluation than an s doublet and a p shell, which is why the work
 *    budget counts W and not only evaluations.
 *
 * References
 * ----------
 * W. K. Grassmann, M. I. Taksar and D. P. Heyman, "Regenerative analysis and steady state
 * distributions for Markov chains", Operations Research 33, 1107 (1985) (state reduction).
 *
 * Example
 * -------
 * ```ts
 * ladderSolveWork(buildLadder([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.7, degeneracy: 2 }], 0.1));
 * // => 63 (blocks 1, 2, 3, 2, 1: 1 + 4 + 4 + 9 + 16 + 9 + 16 + 4)
 * ```
 */
export function ladderSolveWork(ladder: Ladder): number {
  let work = 0;
  for (let k = 1; k < ladder.nStates; k++) work += (k - ladder.lowerBlockStart[k]) ** 2;
  return work;
}
