/**
 * Block averaging of an oversampled curve: adjacent samples averaged in blocks, so that the
 * smoothing, the peak tests and their local fits keep a bounded number of samples per peak.
 */

/** Result of {@link blockAverageUnchecked}. */
export interface BlockAveraged {
  /** Samples per block (1: the input unchanged). */
  blockSamples: number;
  /** Bias at the centre of each block, V (uniform, step blockSamples × the input step). */
  biasV: Float64Array;
  /** Each series averaged over the same blocks. */
  series: Float64Array[];
}

/**
 * Averages a uniformly sampled curve in blocks of `blockSamples` adjacent samples; the samples
 * after the last whole block (fewer than one block) are left out.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias on a uniform grid, V.
 * series : readonly ArrayLike<number>[]
 *     Series on the same grid (current, sweeps, a measured conductance).
 * blockSamples : number
 *     Samples per block, an integer ≥ 1 (assumed valid).
 *
 * Returns
 * -------
 * BlockAveraged
 *
 * Notes
 * -----
 * 1. On a uniform grid the mean bias of a block is the centre of the block, so the averaged
 *    grid is uniform with the step multiplied by the block size.
 * 2. White noise of σ per sample becomes σ/√b per block mean, b the block size (the mean of b
 *    independent values); a smooth curve keeps its shape as long as a block is much narrower
 *    than its narrowest feature (the block mean of a straight line is its value at the centre;
 *    of a curve with second derivative y″, off by y″·h²(b² − 1)/24, h the step).
 *
 * Example
 * -------
 * ```ts
 * blockAverageUnchecked([0, 1, 2, 3, 4, 5, 6], [[0, 2, 4, 6, 8, 10, 12]], 3);
 * // => { blockSamples: 3, biasV: [1, 4], series: [[2, 8]] }
 * ```
 */
export function blockAverageUnchecked(biasV: ArrayLike<number>, series: readonly ArrayLike<number>[], blockSamples: number): BlockAveraged {
  const b = blockSamples;
  const m = Math.floor(biasV.length / b);
  const average = (y: ArrayLike<number>): Float64Array => {
    const out = new Float64Array(m);
    for (let k = 0; k < m; k++) {
      let s = 0;
      for (let j = k * b; j < (k + 1) * b; j++) s += y[j];
      out[k] = s / b;
    }
    return out;
  };
  return { blockSamples: b, biasV: average(biasV), series: series.map(average) };
}
