/**
 * Further readings of the VB peaks: a level's first peak taken as its entry with one carrier in
 * the levels nearer the gap, and a long run of peaks split into a doublet and the rest.
 */
import { seedKey, type LevelSeed } from "./levelsToFit.ts";

/** Relative tolerance on Ec/η of the spacing at which a level's first peak is read as the charging peak of the level before it (reading (c) of {@link laterEntryReadings}). */
const SATELLITE_TOLERANCE = 0.15;

/**
 * The readings of the VB peaks with each level after the first entered with one carrier before it.
 *
 * Parameters
 * ----------
 * readings : readonly (readonly LevelSeed[])[]
 *     The readings tried so far (VB seeds, from the gap outward).
 * vbPeaksV : readonly number[]
 *     The VB peaks' biases (V, negative), in any order.
 * chargingEnergyV : number | null, optional
 *     Ec/η in V (the CB side's fitted Ec), for reading (c); null: no such reading. Default null.
 *
 * Returns
 * -------
 * LevelSeed[][]
 *     New readings only (none equal to one given): (a) each reading of two or more levels with every
 *     level after the first entered with one carrier before it (`before` 1); (b) each reading of one
 *     level holding four or more, split into a doublet at its first peak and the rest (g − 2) at the
 *     third peak from it, entered with one carrier before it; (c) with chargingEnergyV, each reading of
 *     three or more levels in which a level's first peak lies Ec/η (within 15 %) beyond the previous
 *     level's first peak, with that level merged into the one before (its degeneracies added): in
 *     shell tunnelling a level's charging peaks, read as single levels, follow it one Ec apart.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A level's first step lies at (ε + Ec·(N + ½))/η for the N carriers already in the dot. Read in
 *    filling order, the second VB level enters after the first is full (N = 2 for a doublet); read
 *    from the empty dot, with N = 0. Between the regimes (Γtip/Γsub near 1–2) its first peak is often
 *    its entry with one carrier in the doublet (N = 1), and the fit's level starts an Ec away from
 *    either reading, beyond the reach its bounds allow.
 * 2. A doublet and a level of four with the second's entry at N = 1 show six peaks about one Ec
 *    apart, which the rules may read as one level of six; its third peak is then the second
 *    level's entry.
 *
 * Example
 * -------
 * ```ts
 * laterEntryReadings([[{ band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.613, before: 0 },
 *   { band: "VB", label: "v2", degeneracy: 4, firstPeakV: -1.958, before: 2 }]], []).map((r) => r.map((s) => s.before));
 * // => [[0, 1]]
 * ```
 */
export function laterEntryReadings(readings: readonly (readonly LevelSeed[])[], vbPeaksV: readonly number[], chargingEnergyV: number | null = null): LevelSeed[][] {
  const seen = new Set(readings.map(seedKey));
  const out: LevelSeed[][] = [];
  const add = (r: LevelSeed[]) => {
    const k = seedKey(r);
    if (seen.has(k)) return;
    seen.add(k);
    out.push(r);
  };
  const peaks = [...vbPeaksV].sort((a, b) => Math.abs(a) - Math.abs(b));
  for (const r of readings) {
    // (c) Levels whose first peaks follow a level's one Ec/η apart are its charging peaks.
    if (chargingEnergyV !== null && chargingEnergyV > 0 && r.length >= 3) {
      const merged: LevelSeed[] = [];
      let lastV = NaN;
      for (const s of r) {
        const prev = merged[merged.length - 1];
        if (prev && Math.abs(Math.abs(s.firstPeakV - lastV) - chargingEnergyV) <= SATELLITE_TOLERANCE * chargingEnergyV) prev.degeneracy += s.degeneracy;
        else merged.push({ ...s });
        lastV = s.firstPeakV;
      }
      if (merged.length < r.length) add(merged.map((s, i) => ({ ...s, label: `v${i + 1}` })));
    }
    if (r.length >= 2) add(r.map((s, i) => (i === 0 ? { ...s } : { ...s, before: 1 })));
    else if (r.length === 1 && r[0].degeneracy >= 4 && peaks.length) {
      const k = peaks.reduce((m, v, i) => (Math.abs(v - r[0].firstPeakV) < Math.abs(peaks[m] - r[0].firstPeakV) ? i : m), 0);
      if (k + 2 < peaks.length) add([{ ...r[0], label: "v1", degeneracy: 2 }, { band: "VB", label: "v2", degeneracy: r[0].degeneracy - 2, firstPeakV: peaks[k + 2], before: 1 }]);
    }
  }
  return out;
}
