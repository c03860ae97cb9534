/**
 * Dots grouped by radius into bins of equal width: means, standard deviations and counts.
 */
import { checkKnownKeys, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";

/** One dot as {@link sizeBins} reads it: radius and energies (eV, null where not measured). */
export interface BinnedDot {
  dot: string;
  radiusNM: number;
  values: Record<string, number | null>;
}

/** A quantity over the dots of a bin. */
export interface BinStat {
  /** Mean over the dots that have the quantity. */
  mean: number;
  /** Sample standard deviation (n − 1) between those dots; null with one dot. */
  sd: number | null;
  /** Dots that have the quantity. */
  count: number;
}

/** One size bin. */
export interface SizeBin {
  /** Lower edge (included), nm. */
  fromNM: number;
  /** Upper edge (excluded), nm. */
  toNM: number;
  /** Dots in the bin. */
  dots: string[];
  /** Mean radius of the dots, nm. */
  radiusNM: number;
  /** Per quantity (the keys of the dots' `values`), or null where no dot of the bin has it. */
  values: Record<string, BinStat | null>;
}

/** Options of {@link sizeBins}. */
export interface SizeBinsOptions {
  /** Bin width, nm. Default 0.25. */
  binNM?: number;
}

/** Defaults of {@link sizeBins} (locked by a test). */
export const SIZE_BINS_DEFAULTS = Object.freeze({
  binNM: 0.25,
});

/**
 * Groups dots into radius bins.
 *
 * Parameters
 * ----------
 * dots : BinnedDot[]
 *     Dots with their radius (nm) and a record of values (eV or any unit; each key is binned
 *     on its own).
 * options : SizeBinsOptions, optional
 *     `binNM`, bin width in nm (default 0.25).
 *
 * Returns
 * -------
 * SizeBin[]
 *     The bins that hold at least one dot, by increasing radius.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/not-positive` for a width ≤ 0; `sizes/bad-radius` for a radius ≤ 0.
 *
 * Notes
 * -----
 * 1. Bin k covers [k·w, (k + 1)·w) nm; a radius on an edge goes to the bin above. Edges are
 *    computed as k·w, with the radius nudged by 1e-9 nm so that 0.75 / 0.25 lands in bin 3
 *    despite rounding.
 * 2. Each dot counts once (its own mean over curves); the SD is the spread between dots, the
 *    dispersion of the batch at that size, not the uncertainty of a mean.
 *
 * Example
 * -------
 * ```ts
 * sizeBins([{ dot: "a", radiusNM: 1.6, values: { gapEV: 2.9 } }, { dot: "b", radiusNM: 1.7, values: { gapEV: 2.8 } }]);
 * // => [{ fromNM: 1.5, toNM: 1.75, dots: ["a", "b"], radiusNM: 1.65,
 * //       values: { gapEV: { mean: 2.85, sd: 0.0707, count: 2 } } }]
 * ```
 */
export function sizeBins(dots: readonly BinnedDot[], options: SizeBinsOptions = {}): SizeBin[] {
  checkKnownKeys("sizeBins options", options, Object.keys(SIZE_BINS_DEFAULTS));
  const w = checkPositive("binNM", options.binNM ?? SIZE_BINS_DEFAULTS.binNM);
  const groups = new Map<number, BinnedDot[]>();
  for (const d of dots) {
    if (!(d.radiusNM > 0) || !Number.isFinite(d.radiusNM)) {
      throw new DotspecError("sizes/bad-radius", `sizeBins: dot "${d.dot}" has radius ${d.radiusNM} nm; a radius must be a number greater than 0`);
    }
    const k = Math.floor((d.radiusNM + 1e-9) / w);
    const list = groups.get(k) ?? [];
    list.push(d);
    groups.set(k, list);
  }
  return [...groups.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([k, list]) => {
      const keys = [...new Set(list.flatMap((d) => Object.keys(d.values)))];
      const values: Record<string, BinStat | null> = {};
      for (const key of keys) {
        const xs = list.map((d) => d.values[key]).filter((v): v is number => v !== null && v !== undefined && Number.isFinite(v));
        if (xs.length === 0) {
          values[key] = null;
          continue;
        }
        const mean = xs.reduce((s, v) => s + v, 0) / xs.length;
        const sd = xs.length > 1 ? Math.sqrt(xs.reduce((s, v) => s + (v - mean) ** 2, 0) / (xs.length - 1)) : null;
        values[key] = { mean, sd, count: xs.length };
      }
      return {
        fromNM: k * w,
        toNM: (k + 1) * w,
        dots: list.map((d) => d.dot),
        radiusNM: list.reduce((s, d) => s + d.radiusNM, 0) / list.length,
        values,
      };
    });
}
