/**
 * The value every stage passes on: one I–V measurement over one dot.
 *
 * Arrays are typed and never shared between stages: a stage returns new arrays and leaves its
 * input untouched.
 */

/** Where a curve came from and what its file said about itself. */
export interface CurveMeta {
  /** The file name as the user gave it, or a label for curves made in memory. */
  source: string;
  /**
   * `key: value` (or `key = value`) pairs read from `#` comment lines of the file, keys as
   * written. Empty when the file had none.
   */
  metadata: Record<string, string>;
  /**
   * Resolution of the written current numbers, A: the root mean square over the cells of the
   * value of one unit in the last written digit (1e-16 A for `-1.52849e-11` in A), over every
   * current column. Set by the importer; absent (or null) for curves made in memory or when the
   * cells were not plain decimal numbers. The signal stage keeps its current-noise estimate at
   * or above resolution/√12, the standard deviation of a rounding error.
   */
  currentResolutionA?: number | null;
  /** The same for the measured conductance columns, S; absent or null without one. */
  conductanceResolutionS?: number | null;
}

/** One I–V curve: the bias axis, the mean current, the individual sweeps and (optionally) a measured dI/dV. */
export interface Curve {
  /** Sample bias in volts, strictly ascending. */
  biasV: Float64Array;
  /** Current in amperes at each bias: the mean over `sweeps`. */
  currentA: Float64Array;
  /** Each recorded sweep's current in amperes on the same bias points (at least one). */
  sweeps: Float64Array[];
  /** Measured conductance (for example from a lock-in) in siemens, averaged over its columns; null when absent. */
  didvS: Float64Array | null;
  meta: CurveMeta;
}
