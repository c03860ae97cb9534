/**
 * The JSON record of a size series: what `dotspec sizes --json` prints and `--out` writes as
 * `sizes.json`. Plain data; bias-referred values in V, energies in eV, radii in nm.
 */
import type { CombinedValue, CurveFlag } from "../sizes/combineCurves.ts";
import type { SizeFit } from "../sizes/fitSizeModels.ts";
import type { Material } from "../sizes/materials.ts";
import type { OpticalPairing } from "../sizes/opticalPairing.ts";
import type { SizeBin } from "../sizes/sizeBins.ts";
import type { SizeSeries, UnassignedCurve } from "../sizes/sizeSeries.ts";
import type { Regime } from "../assign/assignSpectrum.ts";

/** Version of the record layout; bumped when a field changes meaning. */
export const SIZE_SERIES_JSON_VERSION = 1;

/** Mean, standard error, SD and count of the scalar quantities, by key. */
type Scalars<K extends string> = Record<K, number | null>;

/** One dot of the JSON record. */
export interface SizeDotJson {
  dot: string;
  radiusNM: number;
  /** Curves of the dot. */
  curves: number;
  files: string[];
  regime: Regime;
  /** Curves per regime. */
  regimeVotes: Record<Regime, number>;
  /** Means over the curves kept, V. */
  gapV: number | null;
  chargingEnergyV: number | null;
  singleParticleGapV: number | null;
  levelSpacingSPV: number | null;
  valenceSpacingsV: (number | null)[];
  /** The same as energies (each curve after its own η), eV, with their standard errors. */
  energies: Scalars<"gapEV" | "chargingEnergyEV" | "singleParticleGapEV" | "levelSpacingSPEV"> & {
    valenceSpacingsEV: (number | null)[];
    etas: number[];
    etaGiven: boolean;
    uncertainties: Scalars<"gapEV" | "chargingEnergyEV" | "singleParticleGapEV" | "levelSpacingSPEV"> & { valenceSpacingsEV: (number | null)[] };
  };
  /** Standard errors of the means in bias, V (see combineCurves). */
  uncertainties: Scalars<"gapV" | "chargingEnergyV" | "singleParticleGapV" | "levelSpacingSPV"> & { valenceSpacingsV: (number | null)[] };
  /** Curves in each mean. */
  counts: Scalars<"gapV" | "chargingEnergyV" | "singleParticleGapV" | "levelSpacingSPV"> & { valenceSpacingsV: (number | null)[] };
  /** Sample SD between the curves, V (null with fewer than two). */
  sd: Scalars<"gapV" | "chargingEnergyV" | "singleParticleGapV" | "levelSpacingSPV"> & { valenceSpacingsV: (number | null)[] };
  flags: CurveFlag[];
  warnings: string[];
}

/** The JSON record of a series. */
export interface SizeSeriesJson {
  version: number;
  material: Material | null;
  dots: SizeDotJson[];
  unassigned: UnassignedCurve[];
  bins: SizeBin[];
  fits: SizeFit[];
  optical: OpticalPairing[] | null;
  settings: SizeSeries["settings"];
  warnings: string[];
}

const mean = (c: CombinedValue | null) => c?.mean ?? null;
const se = (c: CombinedValue | null) => c?.standardError ?? null;
const count = (c: CombinedValue | null) => c?.n ?? null;
const sd = (c: CombinedValue | null) => c?.sd ?? null;

/**
 * Turns a size series into its JSON record.
 *
 * Parameters
 * ----------
 * series : SizeSeries
 *     From sizeSeries.
 *
 * Returns
 * -------
 * SizeSeriesJson
 *     `{ version, material, dots: [{ dot, radiusNM, curves, files, regime, regimeVotes, gapV,
 *     chargingEnergyV, singleParticleGapV, levelSpacingSPV, valenceSpacingsV, energies: {…,
 *     uncertainties}, uncertainties, counts, sd, flags, warnings }], unassigned, bins, fits,
 *     optical, settings, warnings }`.
 *
 * Example
 * -------
 * ```ts
 * const curves = ["qd-7-s01-1.csv", "qd-7-s01-2.csv", "qd-7-s05-1.csv", "qd-7-s05-2.csv"].map((file, i) => ({
 *   file, dot: i < 2 ? "QD-7-S01" : "QD-7-S05", radiusNM: i < 2 ? 1.5 : 2,
 *   values: analysisToJson(analyzeCurve(readCurveFile(`sample-curves/series/curves/${file}`).curve, { eta: i < 2 ? 0.86 : 0.87 })),
 * }));
 * sizeSeriesToJson(sizeSeries(curves, { material: resolveMaterial("InP") })).dots.length; // => 2
 * ```
 */
export function sizeSeriesToJson(series: SizeSeries): SizeSeriesJson {
  return {
    version: SIZE_SERIES_JSON_VERSION,
    material: series.material,
    dots: series.dots.map((d) => {
      const b = d.bias;
      const e = d.energies;
      return {
        dot: d.dot,
        radiusNM: d.radiusNM,
        curves: d.curves,
        files: d.files,
        regime: d.regime,
        regimeVotes: d.regimeVotes,
        gapV: mean(b.gapV),
        chargingEnergyV: mean(b.chargingEnergyV),
        singleParticleGapV: mean(b.singleParticleGapV),
        levelSpacingSPV: mean(b.levelSpacingSPV),
        valenceSpacingsV: b.valenceSpacingsV.map(mean),
        energies: {
          gapEV: mean(e.gapEV),
          chargingEnergyEV: mean(e.chargingEnergyEV),
          singleParticleGapEV: mean(e.singleParticleGapEV),
          levelSpacingSPEV: mean(e.levelSpacingSPEV),
          valenceSpacingsEV: e.valenceSpacingsEV.map(mean),
          etas: e.etas,
          etaGiven: e.etaGiven,
          uncertainties: {
            gapEV: se(e.gapEV),
            chargingEnergyEV: se(e.chargingEnergyEV),
            singleParticleGapEV: se(e.singleParticleGapEV),
            levelSpacingSPEV: se(e.levelSpacingSPEV),
            valenceSpacingsEV: e.valenceSpacingsEV.map(se),
          },
        },
        uncertainties: {
          gapV: se(b.gapV),
          chargingEnergyV: se(b.chargingEnergyV),
          singleParticleGapV: se(b.singleParticleGapV),
          levelSpacingSPV: se(b.levelSpacingSPV),
          valenceSpacingsV: b.valenceSpacingsV.map(se),
        },
        counts: {
          gapV: count(b.gapV),
          chargingEnergyV: count(b.chargingEnergyV),
          singleParticleGapV: count(b.singleParticleGapV),
          levelSpacingSPV: count(b.levelSpacingSPV),
          valenceSpacingsV: b.valenceSpacingsV.map(count),
        },
        sd: {
          gapV: sd(b.gapV),
          chargingEnergyV: sd(b.chargingEnergyV),
          singleParticleGapV: sd(b.singleParticleGapV),
          levelSpacingSPV: sd(b.levelSpacingSPV),
          valenceSpacingsV: b.valenceSpacingsV.map(sd),
        },
        flags: d.flags,
        warnings: d.warnings,
      };
    }),
    unassigned: series.unassigned,
    bins: series.bins,
    fits: series.fits,
    optical: series.optical,
    settings: series.settings,
    warnings: series.warnings,
  };
}
