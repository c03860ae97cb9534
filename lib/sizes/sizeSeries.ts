/**
 * A size series: analysed curves of many dots → one row per dot, size bins, model fits of the
 * size dependence, and (with optical data) the pairing of optical peaks with tunnelling levels.
 */
import { checkKnownKeys } from "../util/check.ts";
import { DotspecError } from "../util/errors.ts";
import { combineCurves, COMBINE_DEFAULTS, type CombineCurvesOptions, type CurveValues, type DotCombination } from "./combineCurves.ts";
import { fitSizeModels, type SizeFit, type SizePoint } from "./fitSizeModels.ts";
import { SIZE_QUANTITIES, type SizeQuantity } from "./sizeQuantities.ts";
import type { Material } from "./materials.ts";
import { pairOptical, type OpticalPairing, type OpticalRow } from "./opticalPairing.ts";
import { sizeBins, SIZE_BINS_DEFAULTS, type SizeBin } from "./sizeBins.ts";

/** One analysed curve of a series, with the dot and size it belongs to. */
export interface SeriesCurveInput {
  /** The curve file (as given; used in flags and tables). */
  file: string;
  /** Dot id, or null (the curve is then its own dot, named after the file). */
  dot: string | null;
  /** Radius, nm, or null when the curve has no size: it is listed as unassigned. */
  radiusNM: number | null;
  /** The curve's analysis (an `AnalysisJson` record). */
  values: CurveValues;
  /** Why the curve has no size (shown with the unassigned curves), when `radiusNM` is null. */
  unassignedReason?: string;
}

/** One dot of the series: its curves combined. */
export interface SeriesDot extends DotCombination {
  dot: string;
  radiusNM: number;
  /** The dot's curve files, in input order. */
  files: string[];
}

/** A curve with no size: kept in the report, not in the dots, bins or fits. */
export interface UnassignedCurve {
  file: string;
  dot: string | null;
  reason: string;
  regime: CurveValues["regime"];
  gapV: number | null;
  chargingEnergyV: number | null;
  levelSpacingSPV: number | null;
}

/** Options of {@link sizeSeries}. */
export interface SizeSeriesOptions extends CombineCurvesOptions {
  /**
   * The dots' material, for the model fits, the Brus comparison and the optical pairing.
   * Default null: dots and bins only, with a warning.
   */
  material?: Material | null;
  /** User formulas to fit besides the built-in models (see fitSizeModels). Default none. */
  formulas?: string[];
  /** Ensemble optical peaks, one row per size. Default null (no pairing). */
  optical?: OpticalRow[] | null;
  /** Width of the size bins, nm. Default 0.25. */
  binNM?: number;
}

/** Defaults of {@link sizeSeries} (locked by a test). */
export const SIZE_SERIES_DEFAULTS = Object.freeze({
  material: null,
  formulas: Object.freeze([] as string[]),
  optical: null,
  binNM: SIZE_BINS_DEFAULTS.binNM,
  outlierScore: COMBINE_DEFAULTS.outlierScore,
  pairScore: COMBINE_DEFAULTS.pairScore,
});

/** The per-dot energies that are binned and fitted against the radius (those of the size models). */
export const SERIES_QUANTITIES: readonly SizeQuantity[] = SIZE_QUANTITIES;

/** The whole series. */
export interface SizeSeries {
  /** By increasing radius (then dot id). */
  dots: SeriesDot[];
  unassigned: UnassignedCurve[];
  bins: SizeBin[];
  /** The points handed to the fits: one per dot and quantity (mean, eV; σ = its standard error). */
  points: Record<SizeQuantity, SizePoint[]>;
  /** Model fits; empty without a material. */
  fits: SizeFit[];
  /** Optical pairing; null without optical data or a material. */
  optical: OpticalPairing[] | null;
  /** The optical rows given, for the figures; null without. */
  opticalRows: OpticalRow[] | null;
  material: Material | null;
  settings: { binNM: number; outlierScore: number; pairScore: number; formulas: string[] };
  warnings: string[];
}

/**
 * The energy of a dot for one series quantity (mean and SE), or null.
 *
 * Parameters
 * ----------
 * dot : SeriesDot
 *     One dot of a series ({@link sizeSeries}).
 * q : SizeQuantity
 *     The quantity, e.g. "gapEV" or "chargingEnergyEV" ({@link SIZE_QUANTITIES}).
 *
 * Returns
 * -------
 * { value: number; sigma: number | null } | null
 *     The dot's mean (eV) and its standard error (null from a single curve), or null when no curve
 *     of the dot gives the quantity.
 *
 * Example
 * -------
 * ```ts
 * const curves = ["qd-7-s01-1.csv", "qd-7-s01-2.csv"].map((file) => ({
 *   file, dot: "QD-7-S01", radiusNM: 1.5, values: analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: 0.86 })),
 * }));
 * dotQuantity(sizeSeries(curves).dots[0], "gapEV")?.value; // => 2.949 (eV)
 * ```
 */
export function dotQuantity(dot: SeriesDot, q: SizeQuantity): { value: number; sigma: number | null } | null {
  const e = dot.energies;
  const c = q === "valenceSpacing1EV" ? (e.valenceSpacingsEV[0] ?? null) : e[q as Exclude<SizeQuantity, "valenceSpacing1EV">];
  return c ? { value: c.mean, sigma: c.standardError } : null;
}

/**
 * Combines a series of analysed curves by dot and size.
 *
 * Parameters
 * ----------
 * curves : SeriesCurveInput[]
 *     Every analysed curve with its dot and radius (nm), or a null radius.
 * options : SizeSeriesOptions, optional
 *     material (default none), formulas, optical rows, binNM (default 0.25 nm), outlier
 *     thresholds (see {@link COMBINE_DEFAULTS}).
 *
 * Returns
 * -------
 * SizeSeries
 *     Dots, unassigned curves, bins, fit points, fits, optical pairing and warnings.
 *
 * Throws
 * ------
 * DotspecError
 *     `sizes/radius-mismatch` when the curves of one dot state different radii (naming both
 *     files); `options/…` for bad options; and the errors of the model fits.
 *
 * Notes
 * -----
 * 1. Curves without a radius are set aside as unassigned, with the reason.
 * 2. The others are grouped by dot id (a curve without one is its own dot, named after its
 *    file) and combined with {@link combineCurves}: means and standard errors in bias and in
 *    energy, outliers flagged and left out, regime by majority.
 * 3. Dots are binned by radius with {@link sizeBins} (energies, eV).
 * 4. For each quantity of {@link SERIES_QUANTITIES}, each dot that has it gives one point
 *    (radius, mean energy, its standard error), and `fitSizeModels` fits the models of the
 *    material (and the user's formulas) to those points.
 * 5. With optical rows, `pairOptical` pairs each optical peak with (VB, CB) level pairs of the
 *    dots of that size.
 *
 * Example
 * -------
 * ```ts
 * const curves = ["qd-7-s01-1.csv", "qd-7-s01-2.csv", "qd-7-s05-1.csv", "qd-7-s05-2.csv"].map((file, i) => ({
 *   file, dot: i < 2 ? "QD-7-S01" : "QD-7-S05", radiusNM: i < 2 ? 1.5 : 2,
 *   values: analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: i < 2 ? 0.86 : 0.87 })),
 * }));
 * const series = sizeSeries(curves, { material: resolveMaterial("InP") });
 * series.dots.map((d) => [d.dot, d.radiusNM, d.energies.gapEV?.mean]);
 * // => [["QD-7-S01", 1.5, 2.949…], ["QD-7-S05", 2, 2.430…]] (part of the invented demo series)
 * series.dots[0].energies.gapEV!.mean; // => 2.949
 * ```
 */
export function sizeSeries(curves: readonly SeriesCurveInput[], options: SizeSeriesOptions = {}): SizeSeries {
  checkKnownKeys("sizeSeries options", options, Object.keys(SIZE_SERIES_DEFAULTS));
  if (!Array.isArray(curves)) throw new DotspecError("sizes/no-curves", `sizeSeries: curves must be a list of analysed curves; got ${typeof curves}`);
  const list = curves as readonly SeriesCurveInput[];
  const material = options.material ?? null;
  const formulas = [...(options.formulas ?? [])];
  const combineOptions: CombineCurvesOptions = {};
  if (options.outlierScore !== undefined) combineOptions.outlierScore = options.outlierScore;
  if (options.pairScore !== undefined) combineOptions.pairScore = options.pairScore;
  const warnings: string[] = [];

  const unassigned: UnassignedCurve[] = [];
  const groups = new Map<string, { radiusNM: number; firstFile: string; curves: { file: string; values: CurveValues }[] }>();
  for (const c of list) {
    if (c.radiusNM === null) {
      unassigned.push({
        file: c.file,
        dot: c.dot,
        reason: c.unassignedReason ?? "no size given",
        regime: c.values.regime,
        gapV: c.values.gapV,
        chargingEnergyV: c.values.chargingEnergyV,
        levelSpacingSPV: c.values.levelSpacingSPV,
      });
      continue;
    }
    if (!(c.radiusNM > 0) || !Number.isFinite(c.radiusNM)) {
      throw new DotspecError("sizes/bad-radius", `sizeSeries: ${c.file}: the radius must be a number greater than 0 nm; got ${c.radiusNM}`);
    }
    const id = c.dot ?? c.file;
    const g = groups.get(id);
    if (!g) {
      groups.set(id, { radiusNM: c.radiusNM, firstFile: c.file, curves: [{ file: c.file, values: c.values }] });
      continue;
    }
    if (Math.abs(g.radiusNM - c.radiusNM) > 1e-6 * g.radiusNM) {
      throw new DotspecError(
        "sizes/radius-mismatch",
        `dot "${id}": ${c.file} gives radius ${c.radiusNM} nm but ${g.firstFile} gives ${g.radiusNM} nm; one dot has one size (correct the size, or give the curves different dot ids)`,
      );
    }
    g.curves.push({ file: c.file, values: c.values });
  }
  if (unassigned.length) warnings.push(`${unassigned.length} curve(s) have no size and are listed as unassigned (not in the dots, bins or fits)`);

  const dots: SeriesDot[] = [...groups.entries()]
    .map(([dot, g]) => ({ dot, radiusNM: g.radiusNM, files: g.curves.map((c) => c.file), ...combineCurves(g.curves, combineOptions) }))
    .sort((a, b) => a.radiusNM - b.radiusNM || (a.dot < b.dot ? -1 : a.dot > b.dot ? 1 : 0));

  const bins = sizeBins(
    dots.map((d) => ({
      dot: d.dot,
      radiusNM: d.radiusNM,
      values: Object.fromEntries(SERIES_QUANTITIES.map((q) => [q, dotQuantity(d, q)?.value ?? null])),
    })),
    { binNM: options.binNM ?? SIZE_SERIES_DEFAULTS.binNM },
  );

  const points = Object.fromEntries(
    SERIES_QUANTITIES.map((q) => [
      q,
      dots.flatMap((d) => {
        const v = dotQuantity(d, q);
        return v ? [{ dot: d.dot, radiusNM: d.radiusNM, value: v.value, sigma: v.sigma }] : [];
      }),
    ]),
  ) as Record<SizeQuantity, SizePoint[]>;

  let fits: SizeFit[] = [];
  let optical: OpticalPairing[] | null = null;
  const opticalRows = options.optical ?? null;
  if (material === null) {
    if (dots.length) warnings.push("no material given: no model fits, Brus comparison or optical pairing (name one, e.g. InP)");
  } else if (dots.length) {
    fits = fitSizeModels(points, { material, formulas });
    if (opticalRows && opticalRows.length) {
      const levels = dots.flatMap((d) => {
        const sp = d.energies.singleParticleGapEV;
        if (!sp) return [];
        return [
          {
            dot: d.dot,
            radiusNM: d.radiusNM,
            singleParticleGapEV: sp.mean,
            levelSpacingSPEV: d.energies.levelSpacingSPEV?.mean ?? null,
            valenceSpacingsEV: d.energies.valenceSpacingsEV.flatMap((v) => (v ? [v.mean] : [])),
          },
        ];
      });
      if (levels.length) optical = pairOptical(levels, opticalRows, material);
      else warnings.push("optical pairing skipped: no dot has a single-particle gap (that needs shell filling, where Ec is measured)");
    }
  }
  if (opticalRows && material === null) warnings.push("optical table given but no material: the pairing needs the dielectric constant for J_eh");

  return {
    dots,
    unassigned,
    bins,
    points,
    fits,
    optical,
    opticalRows,
    material,
    settings: {
      binNM: options.binNM ?? SIZE_SERIES_DEFAULTS.binNM,
      outlierScore: options.outlierScore ?? COMBINE_DEFAULTS.outlierScore,
      pairScore: options.pairScore ?? COMBINE_DEFAULTS.pairScore,
      formulas,
    },
    warnings,
  };
}
