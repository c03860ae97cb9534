/**
 * The multiplets the assignment reports: groups of peaks that belong to one level (or one
 * charging multiplet of one level), each naming its peaks by index.
 */
import type { Band, BandPeak } from "./bandPeaks.ts";
import type { Regime } from "./regime.ts";
import { SHELLS } from "./shells.ts";

/** A group of peaks that belong to one level (or one charging multiplet of one level). */
export interface Multiplet {
  band: Band;
  /** "s", "p", "d" for the conduction band; "v1", "v2", … from the gap edge for the valence band. */
  label: string;
  /** Expected number of electrons of the shell (2, 6, 10); null for valence-band groups. */
  degeneracy: number | null;
  /**
   * Indices of the multiplet's peaks in the peak list given to `assignSpectrum` (for an analysis,
   * `CurveAnalysis.peaks`), ordered from the gap edge outward like `peaksV`:
   * `peaksV[k] === peaks[peakIndices[k]].biasV`.
   */
  peakIndices: number[];
  /** Peak positions in V, ordered from the gap edge outward (the positions of `peakIndices`). */
  peaksV: number[];
  /** Their 1σ uncertainties in V. */
  peakUncertaintiesV: number[];
  /** Peaks found in the multiplet. */
  found: number;
  /**
   * Peaks expected: the degeneracy in shell filling (one per added electron), 1 per level in
   * shell tunnelling, null where degeneracy is not assumed (valence band).
   */
  expected: number | null;
  /** Sizes of the sub-groups when a multiplet is split (e.g. [2, 4] for a p sextet split by shape anisotropy); [found] otherwise. */
  subgroups: number[];
}

/**
 * The CB multiplets (shells) from their grouped peaks.
 *
 * Parameters
 * ----------
 * cbGroups : readonly BandPeak[][][]
 *     Per shell (s, p, d, f in order) its sub-groups of peaks, from the gap edge outward.
 * regime : Regime
 *     "shell-filling" expects `degeneracy` peaks per shell; otherwise one per level found.
 * warnings : string[]
 *     Receives a warning for each shell-filling multiplet below the last that shows fewer peaks
 *     than its degeneracy (partly resolved).
 *
 * Returns
 * -------
 * Multiplet[]
 *     One per shell, labelled s, p, d, f, with its peak indices, positions (V), 1σ (V) and
 *     sub-group sizes.
 *
 * Notes
 * -----
 * 1. The peaks of a shell are its sub-groups concatenated; `peaksV` and `peakUncertaintiesV` are
 *    read from the peaks that `peakIndices` names.
 * 2. `expected` is the degeneracy in shell filling (one charging peak per carrier), else the
 *    number of levels found.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: x, biasUncertaintyV: 0.001 } as Peak });
 * const [s] = shellMultiplets([[[at(0.6875, 3), at(0.8125, 4)]]], "shell-filling", []);
 * [s.label, s.peakIndices, s.found, s.expected];  // => ["s", [3, 4], 2, 2]
 * ```
 */
export function shellMultiplets(cbGroups: readonly (readonly BandPeak[][])[], regime: Regime, warnings: string[]): Multiplet[] {
  return cbGroups.map((subgroups, i) => {
    const shell = SHELLS[i];
    const list = subgroups.flat();
    if (regime === "shell-filling" && list.length < shell.degeneracy && i < cbGroups.length - 1) {
      warnings.push(`the ${shell.label} multiplet shows ${list.length} of ${shell.degeneracy} charging peaks (partly resolved)`);
    }
    return multiplet("CB", shell.label, shell.degeneracy, list, regime === "shell-filling" ? shell.degeneracy : list.length, subgroups.map((g) => g.length));
  });
}

/**
 * The VB multiplets from the valence groups.
 *
 * Parameters
 * ----------
 * vbGroups : readonly BandPeak[][]
 *     The groups of `valenceGroups`, from the gap edge outward.
 *
 * Returns
 * -------
 * Multiplet[]
 *     One per group, labelled v1, v2, … from the gap edge; degeneracy and expected count null
 *     (not assumed in the valence band); one sub-group.
 *
 * Example
 * -------
 * ```ts
 * const at = (x: number, index: number) => ({ x, index, peak: { biasV: -x, biasUncertaintyV: 0.001 } as Peak });
 * valenceMultiplets([[at(0.8125, 1), at(0.9375, 0)]]).map((m) => [m.label, m.peakIndices]);  // => [["v1", [1, 0]]]
 * ```
 */
export function valenceMultiplets(vbGroups: readonly BandPeak[][]): Multiplet[] {
  return vbGroups.map((g, i) => multiplet("VB", `v${i + 1}`, null, g, null, [g.length]));
}

/** One multiplet of `list` (ordered from the gap edge outward). */
function multiplet(band: Band, label: string, degeneracy: number | null, list: readonly BandPeak[], expected: number | null, subgroups: number[]): Multiplet {
  return {
    band,
    label,
    degeneracy,
    peakIndices: list.map((p) => p.index),
    peaksV: list.map((p) => p.peak.biasV),
    peakUncertaintiesV: list.map((p) => p.peak.biasUncertaintyV),
    found: list.length,
    expected,
    subgroups,
  };
}

/**
 * The sub-groups of a multiplet in order, each with the offset of its first peak within the
 * multiplet (an index into `peaksV`, `peakIndices`), its size and its peaks' indices into the
 * peak list. A multiplet with no sub-group sizes (`subgroups` empty) is one sub-group of all its
 * peaks.
 *
 * Example
 * -------
 * ```ts
 * subgroupSpans({ subgroups: [2, 4], peakIndices: [3, 4, 6, 7, 8, 9] }).map((g) => g.start);  // => [0, 2]
 * ```
 */
export function subgroupSpans(m: Pick<Multiplet, "subgroups" | "peakIndices">): { start: number; size: number; indices: number[] }[] {
  const spans: { start: number; size: number; indices: number[] }[] = [];
  let start = 0;
  for (const size of m.subgroups.length ? m.subgroups : [m.peakIndices.length]) {
    spans.push({ start, size, indices: m.peakIndices.slice(start, start + size) });
    start += size;
  }
  return spans;
}
