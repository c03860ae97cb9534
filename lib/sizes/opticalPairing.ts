/**
 * Pairing of ensemble optical transitions with the tunnelling levels of dots of the same size.
 */
import { checkInteger, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import type { Material } from "./materials.ts";
import { BRUS_DEFAULTS } from "./brus.ts";
import { COULOMB_EV_NM } from "./sizeConstants.ts";

/** One dot's tunnelling levels, eV (energies after η). */
export interface DotLevels {
  /** Dot id. */
  dot: string;
  /** Radius, nm. */
  radiusNM: number;
  /** Single-particle gap (gap − Ec), eV: the CB s level above the VB h1 level. */
  singleParticleGapEV: number;
  /** CB s–p spacing Δsp, eV, or null. */
  levelSpacingSPEV: number | null;
  /** VB spacings from the gap edge (h1→h2, h2→h3, …), eV. */
  valenceSpacingsEV: number[];
}

/** Optical peaks (absorption or emission transitions) of an ensemble of one mean radius. */
export interface OpticalRow {
  /** Mean radius of the ensemble, nm. */
  radiusNM: number;
  /** Transition energies, eV (any order). */
  peaksEV: number[];
}

/** Options of {@link pairOptical}. */
export interface PairOpticalOptions {
  /** Dots whose radius lies within this distance of the optical row's radius are averaged, nm. Default 0.3. */
  radiusToleranceNM?: number;
  /** VB levels considered (h1…hK), 1…6. Default 3. */
  maxValenceLevels?: number;
  /** Cost of a peak whose assigned pair does not exist at that size, eV (enters squared). Default 0.5. */
  missingPairPenaltyEV?: number;
}

/** Defaults of {@link pairOptical} (locked by test/sizes/defaults.test.ts). */
export const PAIR_OPTICAL_DEFAULTS = Object.freeze({
  radiusToleranceNM: 0.3,
  maxValenceLevels: 3,
  missingPairPenaltyEV: 0.5,
});

/** A (VB, CB) level pair as a candidate for an optical peak. */
export interface PairCandidate {
  /** "h1-s", "h2-p", … */
  label: string;
  /** VB level: "h1", "h2", … */
  valence: string;
  /** CB level: "s" or "p". */
  conduction: string;
  /** Predicted transition E_CB − E_VB − J_eh, eV. */
  predictedEV: number;
  /** Peak − predicted, eV. */
  mismatchEV: number;
}

/** One optical peak with its candidates and its assignment. */
export interface OpticalPeakPairing {
  /** The peak, eV. */
  peakEV: number;
  /** Candidates by increasing |mismatch|. */
  candidates: PairCandidate[];
  /** The pair chosen consistently across sizes; null where that pair is not available at this size. */
  assigned: PairCandidate | null;
}

/** The pairing of one optical row. */
export interface OpticalPairing {
  /** The row's radius, nm. */
  radiusNM: number;
  /** Dots averaged for the levels. */
  dotsUsed: string[];
  /** J_eh = 1.786·e²/(4πε₀εR) at this radius, eV. */
  coulombEV: number;
  /** Averaged levels, eV: CB s, p above h1 = 0; VB h2, h3… below (negative). Absent where no dot has them. */
  levelsEV: Record<string, number>;
  /** The peaks, by increasing energy. */
  peaks: OpticalPeakPairing[];
  /** What was missing, in words. */
  warnings: string[];
}

function mean(xs: number[]): number | null {
  return xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null;
}

/**
 * Pairs optical transitions with tunnelling levels: for each optical peak, the (VB, CB) pairs
 * of dots of that size ranked by mismatch, and one assignment consistent across sizes.
 *
 * Parameters
 * ----------
 * dots : readonly DotLevels[]
 *     Tunnelling levels per dot ({@link DotLevels}).
 * optical : readonly OpticalRow[]
 *     Optical rows ({@link OpticalRow}).
 * material : Material
 *     For the dielectric constant in J_eh.
 * options : PairOpticalOptions, optional
 *     Tolerance, VB levels, penalty ({@link PairOpticalOptions}); default {}: each field at its
 *     documented default.
 *
 * Returns
 * -------
 * OpticalPairing[]
 *     One {@link OpticalPairing} per optical row, in input order.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/*` for invalid options; `sizes/optical-row` for a row with a non-positive radius.
 *
 * Notes
 * -----
 * 1. Levels of a dot, eV: VB h1 at 0, h2 at −vs₁, h3 at −(vs₁ + vs₂), …; CB s at the
 *    single-particle gap, p at the gap + Δsp.
 * 2. For an optical row of radius R, the dots within `radiusToleranceNM` of R are taken (not
 *    interpolated: dot sizes scatter, and an average of neighbours does not extrapolate); each
 *    level is averaged over the dots that have it.
 * 3. Predicted transition of pair (h, c): E_c − E_h − J_eh with J_eh = 1.786·e²/(4πε₀·ε·R)
 *    (ε the material's static constant); mismatch = peak − predicted.
 * 4. Consistent assignment: the k-th optical peak (by energy) gets the same pair label at every
 *    size, different labels for different k; among all such maps the one with the least
 *    Σ mismatch² over rows and peaks is chosen (exhaustive search; a pair missing at a size
 *    costs `missingPairPenaltyEV`²).
 *
 * References
 * ----------
 * L. E. Brus, J. Chem. Phys. 80, 4403 (1984) (the 1.786 Coulomb term); the comparison of tunnelling
 * and optical gaps follows common practice (no source).
 *
 * Example
 * -------
 * ```ts
 * const material = resolveMaterial("InP");
 * pairOptical([{ dot: "a", radiusNM: 2, singleParticleGapEV: 2, levelSpacingSPEV: 0.3, valenceSpacingsEV: [0.1] }],
 *   [{ radiusNM: 2, peaksEV: [1.9] }], material)[0].peaks[0].assigned.label; // => "h1-s"
 * ```
 */
export function pairOptical(dots: readonly DotLevels[], optical: readonly OpticalRow[], material: Material, options: PairOpticalOptions = {}): OpticalPairing[] {
  const tol = checkPositive("radiusToleranceNM", options.radiusToleranceNM ?? PAIR_OPTICAL_DEFAULTS.radiusToleranceNM);
  const maxVB = checkInteger("maxValenceLevels", options.maxValenceLevels ?? PAIR_OPTICAL_DEFAULTS.maxValenceLevels, 1, 6);
  const penalty = checkPositive("missingPairPenaltyEV", options.missingPairPenaltyEV ?? PAIR_OPTICAL_DEFAULTS.missingPairPenaltyEV);
  const eps = checkPositive("material.dielectricConstant", material.dielectricConstant);

  // 1–3. Levels and candidates per row.
  const rows = optical.map((row, r) => {
    if (!(Number.isFinite(row.radiusNM) && row.radiusNM > 0)) {
      throw new DotspecError("sizes/optical-row", `optical row ${r + 1}: radiusNM must be a positive number of nm; got ${row.radiusNM}`);
    }
    const near = dots.filter((d) => Math.abs(d.radiusNM - row.radiusNM) <= tol + 1e-12 && Number.isFinite(d.singleParticleGapEV));
    const warnings: string[] = [];
    const coulombEV = (BRUS_DEFAULTS.coulombCoefficient * COULOMB_EV_NM) / (eps * row.radiusNM);
    const levelsEV: Record<string, number> = {};
    const s = mean(near.map((d) => d.singleParticleGapEV));
    if (s !== null) levelsEV.s = s;
    const p = mean(near.flatMap((d) => (d.levelSpacingSPEV !== null && Number.isFinite(d.levelSpacingSPEV) ? [d.singleParticleGapEV + d.levelSpacingSPEV] : [])));
    if (p !== null) levelsEV.p = p;
    levelsEV.h1 = 0;
    for (let k = 2; k <= maxVB; k++) {
      const h = mean(near.flatMap((d) => {
        const vs = d.valenceSpacingsEV.slice(0, k - 1);
        return vs.length === k - 1 && vs.every(Number.isFinite) ? [-vs.reduce((a, b) => a + b, 0)] : [];
      }));
      if (h !== null) levelsEV[`h${k}`] = h;
    }
    if (near.length === 0) {
      delete levelsEV.h1;
      warnings.push(`no dot within ${tol} nm of ${row.radiusNM} nm: no levels to pair with`);
    }
    const peaksSorted = [...row.peaksEV].filter(Number.isFinite).sort((a, b) => a - b);
    const pairs: { label: string; valence: string; conduction: string; predictedEV: number }[] = [];
    for (const c of ["s", "p"]) {
      if (levelsEV[c] === undefined) continue;
      for (let k = 1; k <= maxVB; k++) {
        const v = `h${k}`;
        if (levelsEV[v] === undefined) continue;
        pairs.push({ label: `${v}-${c}`, valence: v, conduction: c, predictedEV: levelsEV[c] - levelsEV[v] - coulombEV });
      }
    }
    const peaks = peaksSorted.map((peakEV) => ({
      peakEV,
      candidates: pairs.map((q) => ({ ...q, mismatchEV: peakEV - q.predictedEV })).sort((a, b) => Math.abs(a.mismatchEV) - Math.abs(b.mismatchEV)),
      assigned: null as PairCandidate | null,
    }));
    return { radiusNM: row.radiusNM, dotsUsed: near.map((d) => d.dot), coulombEV, levelsEV, peaks, warnings };
  });

  // 4. One label per peak index, the same at every size.
  const labels = [...new Set(rows.flatMap((r) => r.peaks.flatMap((pk) => pk.candidates.map((c) => c.label))))].sort();
  // Peaks beyond what an exhaustive search can afford (about 2·10⁵ label maps) stay unassigned.
  let K = Math.min(Math.max(0, ...rows.map((r) => r.peaks.length)), labels.length);
  for (let maps = 1, k = 0; k < K; k++) {
    maps *= labels.length - k;
    if (maps > 2e5) K = k;
  }
  const cost = (k: number, label: string): number => {
    let c = 0;
    for (const r of rows) {
      const pk = r.peaks[k];
      if (!pk || r.dotsUsed.length === 0) continue;
      const cand = pk.candidates.find((x) => x.label === label);
      c += cand ? cand.mismatchEV ** 2 : penalty ** 2;
    }
    return c;
  };
  const table = Array.from({ length: K }, (_, k) => labels.map((l) => cost(k, l)));
  let best: number[] = [];
  let bestCost = Infinity;
  const chosen: number[] = [];
  const used = new Set<number>();
  const search = (k: number, acc: number) => {
    if (acc >= bestCost) return;
    if (k === K) {
      best = [...chosen];
      bestCost = acc;
      return;
    }
    for (let j = 0; j < labels.length; j++) {
      if (used.has(j)) continue;
      used.add(j);
      chosen.push(j);
      search(k + 1, acc + table[k][j]);
      chosen.pop();
      used.delete(j);
    }
  };
  search(0, 0);
  for (const r of rows) {
    r.peaks.forEach((pk, k) => {
      if (k >= best.length) return;
      pk.assigned = pk.candidates.find((c) => c.label === labels[best[k]]) ?? null;
      if (!pk.assigned && r.dotsUsed.length) r.warnings.push(`peak ${k + 1} (${pk.peakEV.toFixed(3)} eV): pair ${labels[best[k]]} is not available at this size`);
    });
    const extra = r.peaks.length - best.length;
    if (extra > 0) r.warnings.push(`${extra} peak(s) beyond the first ${best.length} were left unassigned (${labels.length} level pairs available)`);
  }
  return rows;
}
