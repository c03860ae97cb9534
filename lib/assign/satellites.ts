/**
 * Weak peaks set aside before grouping: noise at the level of a band, and charging satellites
 * (a weak peak after a main one).
 */
import type { BandPeak } from "./bandPeaks.ts";

/**
 * Split the peaks of one band into main peaks and weak ones.
 *
 * Parameters
 * ----------
 * list : readonly BandPeak[]
 *     Peaks of one band, ordered from the gap edge outward.
 * ofMedian : number
 *     A peak whose current step `stepA` is below this fraction of the median step of `list` is
 *     weak (noise wherever it lies, also before the first level). 0 switches the rule off.
 * ofPrevious : number
 *     A peak whose step is below this fraction of the step of the preceding main peak is weak (a
 *     charging satellite). 0 switches the rule off.
 *
 * Returns
 * -------
 * { main: BandPeak[]; satellites: BandPeak[] }
 *     The same entries, each in one of the two lists, order kept.
 *
 * Notes
 * -----
 * 1. The typical step is the median of the steps (the upper one of the middle pair for an even
 *    count).
 * 2. The peaks are visited from the gap edge outward; a weak peak does not become the
 *    "preceding main peak" of the next one.
 *
 * References
 * ----------
 * The assignment uses it with `ASSIGN_DEFAULTS.noiseStepRatioMax` (noise) and
 * `ASSIGN_DEFAULTS.satelliteStepRatioMax` (charging satellites).
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, stepA: number, index: number) => ({ x, index, peak: { biasV: x, stepA } as Peak });
 * // Steps 10, 2 and 9 pA: the second is below 0.5 × the first (a charging satellite).
 * const { main, satellites } = splitSatellites([at(0.6, 10e-12, 0), at(0.7, 2e-12, 1), at(1.0, 9e-12, 2)], 0, 0.5);
 * main.map((p) => p.index);        // => [0, 2]
 * satellites.map((p) => p.index);  // => [1]
 * ```
 */
export function splitSatellites(list: readonly BandPeak[], ofMedian: number, ofPrevious: number): { main: BandPeak[]; satellites: BandPeak[] } {
  const main: BandPeak[] = [];
  const satellites: BandPeak[] = [];
  const steps = list.map((p) => p.peak.stepA).sort((a, b) => a - b);
  const typical = steps.length ? steps[steps.length >> 1] : 0;
  for (const p of list) {
    const prev = main[main.length - 1];
    const weak = p.peak.stepA < ofMedian * typical || (prev !== undefined && p.peak.stepA < ofPrevious * prev.peak.stepA);
    (weak ? satellites : main).push(p);
  }
  return { main, satellites };
}
