/**
 * The peaks of one spectrum sorted into the two bands, each peak keeping its index in the list
 * it came from, so every later stage can name a peak by that index.
 */
import type { Peak } from "../peaks/findPeaks.ts";

/** Conduction band (positive sample bias) or valence band (negative). */
export type Band = "CB" | "VB";

/** A peak as the assignment stages handle it. */
export interface BandPeak {
  /** The peak itself. */
  peak: Peak;
  /** Distance from 0 V, |biasV|, V: grows from the gap edge outward in both bands. */
  x: number;
  /** Index of the peak in the list given to {@link bandPeaks} (and to `assignSpectrum`). */
  index: number;
}

/**
 * Split a peak list into conduction-band and valence-band peaks.
 *
 * Parameters
 * ----------
 * peaks : readonly Peak[]
 *     Peaks of one conductance curve, positions `biasV` in V, ordered by ascending bias (as
 *     `findPeaks` returns them).
 *
 * Returns
 * -------
 * { cb: BandPeak[]; vb: BandPeak[] }
 *     `cb`: the peaks at positive bias, in the given order (from the gap edge outward for an
 *     ascending list). `vb`: the peaks at negative bias, sorted by |bias| from the gap edge
 *     outward. Each entry carries `x` = |biasV| (V) and `index`, the peak's position in `peaks`.
 *     A peak at exactly 0 V belongs to neither band.
 *
 * Notes
 * -----
 * 1. CB peaks are those at positive sample bias, VB peaks those at negative (the sign convention
 *    of the whole library).
 * 2. Every entry keeps its index in `peaks`: the multiplets and the satellites the assignment
 *    returns name their peaks by it.
 *
 * Example
 * -------
 * ```ts
 * const p = (biasV: number) => ({ biasV, biasUncertaintyV: 0.001, index: 0, heightS: 1e-9,
 *   prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30 });
 * const { cb, vb } = bandPeaks([p(-0.9), p(-0.7), p(0.6)]);
 * cb.map((b) => b.index);  // => [2]
 * vb.map((b) => b.index);  // => [1, 0]
 * ```
 */
export function bandPeaks(peaks: readonly Peak[]): { cb: BandPeak[]; vb: BandPeak[] } {
  const all = peaks.map((peak, index) => ({ peak, index }));
  const cb: BandPeak[] = all.filter(({ peak }) => peak.biasV > 0).map(({ peak, index }) => ({ peak, x: peak.biasV, index }));
  const vb: BandPeak[] = all
    .filter(({ peak }) => peak.biasV < 0)
    .map(({ peak, index }) => ({ peak, x: -peak.biasV, index }))
    .sort((a, b) => a.x - b.x);
  return { cb, vb };
}
