/**
 * The curves of one dot combined: mean ± standard error of each quantity, in bias and in energy,
 * with curves that disagree with the others flagged and left out, and the regime by majority.
 */
import type { Regime } from "../assign/assignSpectrum.ts";
import type { AnalysisJson } from "../report/analysisJson.ts";
import { checkKnownKeys, checkPositive } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";

/** What {@link combineCurves} reads of one curve's analysis (an `AnalysisJson` has all of it). */
export type CurveValues = Pick<
  AnalysisJson,
  "regime" | "gapV" | "chargingEnergyV" | "singleParticleGapV" | "levelSpacingSPV" | "valenceSpacingsV" | "uncertainties" | "energies"
>;

/** One curve of a dot: its file and its analysis. */
export interface DotCurve {
  file: string;
  values: CurveValues;
}

/** The scalar quantities combined per dot (bias key `<name>V`, energy key `<name>EV`). */
export const COMBINED_QUANTITIES = Object.freeze(["gap", "chargingEnergy", "singleParticleGap", "levelSpacingSP"] as const);
/** One of {@link COMBINED_QUANTITIES}. */
export type CombinedQuantity = (typeof COMBINED_QUANTITIES)[number];

/** A quantity over the curves of a dot. */
export interface CombinedValue {
  /** Mean of the curves kept. */
  mean: number;
  /**
   * Standard error of the mean. With n ≥ 2 curves the larger of SD/√n (the scatter) and
   * rms(σᵢ)/√n (the curves' own 1σ propagated to the mean); with one curve, its own 1σ (null
   * when it has none).
   */
  standardError: number | null;
  /** Sample standard deviation (n − 1), null with one curve. */
  sd: number | null;
  /** Curves in the mean. */
  n: number;
  /** The files in the mean. */
  files: string[];
}

/** A curve that disagrees with the others of its dot in one quantity. */
export interface CurveFlag {
  file: string;
  /** `gap`, `chargingEnergy`, `singleParticleGap`, `levelSpacingSP` or `valenceSpacing1`, `valenceSpacing2`, … */
  quantity: string;
  /** The curve's value, eV. */
  valueEV: number;
  /** The reference it was compared with (median of the dot's curves; with two curves the other one), eV. */
  referenceEV: number;
  /** The distance in units of the robust spread (see {@link flagOutliers}). */
  score: number;
  /** Whether the curve was left out of this quantity's mean. */
  excluded: boolean;
  /** In words. */
  reason: string;
}

/** Bias-referred results of a dot, V. */
export interface CombinedBias {
  gapV: CombinedValue | null;
  chargingEnergyV: CombinedValue | null;
  singleParticleGapV: CombinedValue | null;
  levelSpacingSPV: CombinedValue | null;
  /** Per VB spacing from the gap edge (index 0: v1→v2); null where no curve has it. */
  valenceSpacingsV: (CombinedValue | null)[];
}

/** Energy results of a dot, eV (each curve's values after its own η). */
export interface CombinedEnergies {
  gapEV: CombinedValue | null;
  chargingEnergyEV: CombinedValue | null;
  singleParticleGapEV: CombinedValue | null;
  levelSpacingSPEV: CombinedValue | null;
  valenceSpacingsEV: (CombinedValue | null)[];
  /** The distinct η the curves used. */
  etas: number[];
  /** False when some curve had no η (1 was used: its energies equal its bias values). */
  etaGiven: boolean;
}

/** The curves of one dot, combined. */
export interface DotCombination {
  /** Curves combined. */
  curves: number;
  /** The regime most curves have; "undetermined" on a tie. */
  regime: Regime;
  /** Curves per regime. */
  regimeVotes: Record<Regime, number>;
  bias: CombinedBias;
  energies: CombinedEnergies;
  flags: CurveFlag[];
  warnings: string[];
}

/** Options of {@link combineCurves}. */
export interface CombineCurvesOptions {
  /**
   * A curve is an outlier when its distance from the median exceeds this many robust standard
   * deviations (1.4826·MAD, floored at the median 1σ of the curves). Default 3.5 (Iglewicz &
   * Hoaglin's cut-off for the modified z-score).
   */
  outlierScore?: number;
  /**
   * With two curves: they disagree when |a − b| exceeds this many combined 1σ
   * (√(σa² + σb²)). Default 3.5.
   */
  pairScore?: number;
}

/** Defaults of {@link combineCurves} (locked by a test). */
export const COMBINE_DEFAULTS = Object.freeze({
  outlierScore: 3.5,
  pairScore: 3.5,
  /** 1.4826 · MAD estimates σ of a normal distribution (1 / Φ⁻¹(3/4)). */
  madToSigma: 1.4826,
});

/** The verdict of {@link flagOutliers} on one value. */
export interface OutlierVerdict {
  score: number;
  reference: number;
  outlier: boolean;
}

function median(sorted: readonly number[]): number {
  const n = sorted.length;
  return n % 2 ? sorted[(n - 1) / 2] : (sorted[n / 2 - 1] + sorted[n / 2]) / 2;
}

/**
 * The robust outlier rule used per dot.
 *
 * Parameters
 * ----------
 * values : number[]
 *     One value per curve (at least 2).
 * sigmas : (number | null)[]
 *     Each value's own 1σ, or null.
 * options : CombineCurvesOptions, optional
 *     Thresholds.
 *
 * Returns
 * -------
 * OutlierVerdict[]
 *     Per value: score, reference and whether it is an outlier.
 *
 * Notes
 * -----
 * 1. Three or more values: the modified z-score of Iglewicz & Hoaglin, score = |x − median| /
 *    (1.4826·MAD), with MAD the median absolute deviation from the median; an outlier has
 *    score > 3.5. The scale is floored at the median of the values' own 1σ, so that curves
 *    which agree within their uncertainties are never flagged (when most curves coincide, the
 *    MAD alone can be near 0).
 * 2. Two values: no median can say which is off. score = |a − b| / √(σa² + σb²) (σ = 0 when
 *    unknown); above `pairScore` both are flagged as disagreeing (and both kept by
 *    {@link combineCurves}).
 * 3. One value: never an outlier.
 *
 * References
 * ----------
 * B. Iglewicz and D. C. Hoaglin, *How to Detect and Handle Outliers*, ASQC Basic References in
 * Quality Control vol. 16, ASQ Quality Press, Milwaukee (1993) — modified z-score and the 3.5
 * cut-off (from memory).
 *
 * Example
 * -------
 * ```ts
 * flagOutliers([1.00, 1.01, 0.99, 1.50], [0.01, 0.01, 0.01, 0.01]).map((v) => v.outlier);
 * // => [false, false, false, true]
 * ```
 */
export function flagOutliers(values: readonly number[], sigmas: readonly (number | null)[], options: CombineCurvesOptions = {}): OutlierVerdict[] {
  const { outlierScore, pairScore } = { ...COMBINE_DEFAULTS, ...options };
  const n = values.length;
  if (n < 2) return values.map((v) => ({ score: 0, reference: v, outlier: false }));
  if (n === 2) {
    const [a, b] = values;
    const s = Math.hypot(sigmas[0] ?? 0, sigmas[1] ?? 0);
    const d = Math.abs(a - b);
    const score = s > 0 ? d / s : d > 0 ? Infinity : 0;
    return [
      { score, reference: b, outlier: score > pairScore },
      { score, reference: a, outlier: score > pairScore },
    ];
  }
  const med = median([...values].sort((x, y) => x - y));
  const mad = median(values.map((v) => Math.abs(v - med)).sort((x, y) => x - y));
  const known = sigmas.filter((s): s is number => s !== null && Number.isFinite(s) && s > 0).sort((x, y) => x - y);
  const floor = known.length ? median(known) : 0;
  const scale = Math.max(COMBINE_DEFAULTS.madToSigma * mad, floor);
  return values.map((v) => {
    const d = Math.abs(v - med);
    const score = scale > 0 ? d / scale : d > 0 ? Infinity : 0;
    return { score, reference: med, outlier: score > outlierScore };
  });
}

/** Mean, SD and SE of the kept values. */
function summarize(values: readonly number[], sigmas: readonly (number | null)[], files: readonly string[]): CombinedValue | null {
  const n = values.length;
  if (n === 0) return null;
  const mean = values.reduce((s, v) => s + v, 0) / n;
  if (n === 1) return { mean, standardError: sigmas[0] ?? null, sd: null, n, files: [...files] };
  const sd = Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1));
  // The larger of the scatter's SE and the curves' own 1σ propagated to the mean (rms σ / √n):
  // two or three curves can agree by chance far better than their noise allows.
  const known = sigmas.filter((x): x is number => x !== null && Number.isFinite(x));
  const propagated = known.length === n ? Math.sqrt(known.reduce((s, x) => s + x * x, 0) / n) / Math.sqrt(n) : 0;
  return { mean, standardError: Math.max(sd / Math.sqrt(n), propagated), sd, n, files: [...files] };
}

interface Column {
  quantity: string;
  v: (number | null)[];
  sv: (number | null)[];
  e: (number | null)[];
  se: (number | null)[];
}

/**
 * Combines the curves of one dot.
 *
 * Parameters
 * ----------
 * curves : DotCurve[]
 *     The dot's curves with their analyses (at least one).
 * options : CombineCurvesOptions, optional
 *     Outlier thresholds (see {@link COMBINE_DEFAULTS}).
 *
 * Returns
 * -------
 * DotCombination
 *     Per quantity, in bias (V) and in energy (eV): mean, standard error, SD, count and the
 *     files used; the regime by majority with the votes; flags; warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/no-curves` for an empty list; `options/…` for bad thresholds.
 *
 * Notes
 * -----
 * 1. For each quantity (gap, Ec, single-particle gap, Δsp, and each VB spacing by its index from
 *    the gap edge), the curves that have it are tested with {@link flagOutliers} on their
 *    energies (each curve's η applied, so curves with different η compare fairly) and 1σ.
 * 2. With three or more curves an outlier is flagged with the reason and left out of that
 *    quantity's mean (bias and energy alike); it stays in the others. Two curves that disagree
 *    are both flagged and both kept (which one is off cannot be told), with a warning.
 * 3. Mean of the curves kept. Standard error for n ≥ 2: the larger of SD/√n (the scatter
 *    between repeated sweeps of the dot) and rms(σᵢ)/√n (their own 1σ propagated to the mean),
 *    since two or three curves can agree by chance far better than their noise allows (common
 *    practice, no source); with one curve its own 1σ.
 * 4. Regime: the one most curves have; a tie gives "undetermined". Curves of another regime stay
 *    in the means (gap and Δsp are defined in both regimes; Ec only in shell filling).
 *
 * Example
 * -------
 * ```ts
 * const analysed = (file: string) => analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: 0.86 }));
 * const dot = combineCurves([{ file: "qd-7-s01-1.csv", values: analysed("qd-7-s01-1.csv") }, { file: "qd-7-s01-2.csv", values: analysed("qd-7-s01-2.csv") }]);
 * dot.bias.gapV;
 * // => { mean: 3.42927…, standardError: 0.00088…, sd: 0.00045…, n: 2, files: ["qd-7-s01-1.csv", "qd-7-s01-2.csv"] }
 * dot.energies.gapEV!.mean; // => 2.949 (eV: η·gapV per curve, then the mean)
 * ```
 */
export function combineCurves(curves: readonly DotCurve[], options: CombineCurvesOptions = {}): DotCombination {
  if (!Array.isArray(curves) || curves.length === 0) {
    throw new DotspecError("sizes/no-curves", "combineCurves: curves must hold at least one analysed curve; got none");
  }
  checkKnownKeys("combineCurves options", options, Object.keys(COMBINE_DEFAULTS).filter((k) => k !== "madToSigma"));
  if (options.outlierScore !== undefined) checkPositive("outlierScore", options.outlierScore);
  if (options.pairScore !== undefined) checkPositive("pairScore", options.pairScore);

  const files = curves.map((c) => c.file);
  const columns: Column[] = COMBINED_QUANTITIES.map((q) => {
    const bk = `${q}V` as const;
    const ek = `${q}EV` as const;
    return {
      quantity: q,
      v: curves.map((c) => c.values[bk]),
      sv: curves.map((c) => c.values.uncertainties[bk]),
      e: curves.map((c) => c.values.energies[ek]),
      se: curves.map((c) => c.values.energies.uncertainties[ek]),
    };
  });
  const nValence = Math.max(0, ...curves.map((c) => c.values.valenceSpacingsV.length));
  for (let k = 0; k < nValence; k++) {
    columns.push({
      quantity: `valenceSpacing${k + 1}`,
      v: curves.map((c) => c.values.valenceSpacingsV[k] ?? null),
      sv: curves.map((c) => c.values.uncertainties.valenceSpacingsV[k] ?? null),
      e: curves.map((c) => c.values.energies.valenceSpacingsEV[k] ?? null),
      se: curves.map((c) => c.values.energies.uncertainties.valenceSpacingsEV[k] ?? null),
    });
  }

  const flags: CurveFlag[] = [];
  const warnings: string[] = [];
  const combined = columns.map((col) => {
    const idx = curves.map((_, i) => i).filter((i) => col.v[i] !== null && col.e[i] !== null && Number.isFinite(col.e[i]!));
    const verdicts = flagOutliers(
      idx.map((i) => col.e[i]!),
      idx.map((i) => col.se[i]),
      options,
    );
    const keep: number[] = [];
    verdicts.forEach((verdict, j) => {
      const i = idx[j];
      if (!verdict.outlier) {
        keep.push(i);
        return;
      }
      const pair = idx.length === 2;
      flags.push({
        file: files[i],
        quantity: col.quantity,
        valueEV: col.e[i]!,
        referenceEV: verdict.reference,
        score: verdict.score,
        excluded: !pair,
        reason: pair
          ? `${col.quantity} ${fmt(col.e[i]!)} eV disagrees with the other curve's ${fmt(verdict.reference)} eV by ${fmtScore(verdict.score)} combined σ; both kept (two curves cannot say which is off)`
          : `${col.quantity} ${fmt(col.e[i]!)} eV lies ${fmtScore(verdict.score)} robust σ from the median ${fmt(verdict.reference)} eV (modified z-score > ${options.outlierScore ?? COMBINE_DEFAULTS.outlierScore}); left out of the mean`,
      });
      if (pair) keep.push(i);
    });
    if (idx.length === 2 && verdicts[0].outlier) warnings.push(`the two curves disagree in ${col.quantity}; measure a third curve to tell which is off`);
    const kept = keep.map((i) => files[i]);
    return {
      bias: summarize(keep.map((i) => col.v[i]!), keep.map((i) => col.sv[i]), kept),
      energy: summarize(keep.map((i) => col.e[i]!), keep.map((i) => col.se[i]), kept),
    };
  });

  const votes: Record<Regime, number> = { "shell-filling": 0, "shell-tunneling": 0, undetermined: 0 };
  for (const c of curves as readonly DotCurve[]) votes[c.values.regime]++;
  const ranked = (Object.entries(votes) as [Regime, number][]).sort((a, b) => b[1] - a[1]);
  const regime: Regime = ranked[0][1] > ranked[1][1] ? ranked[0][0] : "undetermined";
  if (regime === "undetermined" && ranked[0][1] === ranked[1][1] && ranked[0][1] > 0) {
    warnings.push(`the curves split evenly between regimes (${ranked.filter((r) => r[1] > 0).map(([r, n]) => `${r} ${n}`).join(", ")})`);
  }
  const etas = [...new Set(curves.map((c) => c.values.energies.eta))].sort((a, b) => a - b);
  const nq = COMBINED_QUANTITIES.length;
  return {
    curves: curves.length,
    regime,
    regimeVotes: votes,
    bias: {
      gapV: combined[0].bias,
      chargingEnergyV: combined[1].bias,
      singleParticleGapV: combined[2].bias,
      levelSpacingSPV: combined[3].bias,
      valenceSpacingsV: combined.slice(nq).map((c) => c.bias),
    },
    energies: {
      gapEV: combined[0].energy,
      chargingEnergyEV: combined[1].energy,
      singleParticleGapEV: combined[2].energy,
      levelSpacingSPEV: combined[3].energy,
      valenceSpacingsEV: combined.slice(nq).map((c) => c.energy),
      etas,
      etaGiven: curves.every((c) => c.values.energies.etaGiven),
    },
    flags,
    warnings,
  };
}

const fmt = (v: number) => v.toFixed(4);
const fmtScore = (s: number) => (Number.isFinite(s) ? s.toFixed(1) : "∞");
