/**
 * The JSON record of one analysed curve: what `dotspec analyze --json` prints (one per file) and
 * `--out` writes. Plain data, bias-referred values in volts, energies in eV.
 */
import type { CurveAnalysis } from "../pipeline/analyzeCurve.ts";
import type { Multiplet, RegimeEvidence, SpectrumEnergies, SpectrumUncertainties } from "../assign/assignSpectrum.ts";
import type { ImportRecord } from "../io/parse/record.ts";
import type { PeakRole } from "../assign/peakMultiplets.ts";
import type { Provenance } from "./provenance.ts";
import type { ModelComparisonJson } from "./modelComparisonJson.ts";

/** Version of the record layout; bumped when a field changes meaning. */
export const ANALYSIS_JSON_VERSION = 1;

/** The JSON record of one analysed curve: what `dotspec analyze --json` prints per file and `--out` writes as <name>.json. */
export interface AnalysisJson {
  version: number;
  /** The file name as given. */
  source: string;
  regime: "shell-filling" | "shell-tunneling" | "undetermined";
  /** First CB peak − first VB peak, V; null when a band has no peak. */
  gapV: number | null;
  /** Zero-conductance region [negative edge, positive edge], V; null when none or when no levels were found. */
  gapEdgesV: [number, number] | null;
  /**
   * Set when the curve shows no dot levels (ohmic, noise, open circuit, a smooth exponential):
   * a stable code ("no-gap", "no-peaks", "faint-peaks", "lone-peak") and the reason; then there are no
   * multiplets and every quantity is null. Null otherwise.
   */
  noLevels: { code: string; reason: string } | null;
  /**
   * Flat runs of the current at its maximum or minimum at an end of the bias range (the current
   * amplifier's range), left out of the analysis: which end, bias range (V) and level (A).
   */
  saturation: { end: "negative" | "positive"; biasV: [number, number]; levelA: number }[];
  /** Charging energy in bias (mean spacing inside the CB multiplets), V; null outside shell filling. */
  chargingEnergyV: number | null;
  singleParticleGapV: number | null;
  /** s–p spacing in bias, V (regime-aware, see the docs). */
  levelSpacingSPV: number | null;
  levelSpacingPDV: number | null;
  /** Spacings between successive VB groups from the gap edge, V. */
  valenceSpacingsV: number[];
  /**
   * Peak positions of each multiplet sorted by |bias| from the gap edge, V; `peakIndices` name
   * the multiplet's peaks by their index in `peaks`.
   */
  multiplets: Multiplet[];
  peaks: {
    biasV: number;
    biasUncertaintyV: number;
    /** dI/dV at the peak, S. */
    height: number;
    prominenceS: number;
    fwhmV: number;
    /** Current step carried by the peak, A. */
    stepA: number;
    snr: number;
    stepSignificance: number | null;
    sweepSpreadV: number | null;
    /** Label of the multiplet holding the peak, or null (satellite or unassigned). */
    multiplet: string | null;
    /** Index in `multiplets` of the multiplet holding the peak, or null (satellite or unassigned). */
    multipletIndex: number | null;
    /** "level" (in a multiplet), "satellite", "second-junction" (a resonance through the substrate junction) or "unassigned". */
    role: PeakRole;
  }[];
  /**
   * The VB ladder's second-junction resonances taken out of the current before the CB peaks were
   * found (low η): each step's position (V) and height (A), with Γtip/Γsub and Ec (eV) of the
   * ladder's model. They are no peaks of `peaks`. Null where nothing was taken out.
   */
  subtractedResonances: { steps: { biasV: number; heightA: number }[]; rateRatio: number; chargingEnergyEV: number } | null;
  energies: SpectrumEnergies;
  /** 1σ uncertainties of the bias-referred quantities, V. */
  uncertainties: SpectrumUncertainties;
  evidence: RegimeEvidence;
  settings: CurveAnalysis["settings"] & {
    biasStepV: number;
    noiseCurrentA: number;
    /** Which bound set noiseCurrentA: "third-differences" (the data) or "resolution" (the rounding floor q/√12 of the written numbers). */
    noiseCurrentBound: "third-differences" | "resolution";
    /** The rounding floor q/√12 of the current, A; null when the resolution is not known. */
    noiseCurrentFloorA: number | null;
    noiseConductanceS: number;
    offsetA: number;
    resampled: boolean;
    windowReason: string;
  };
  /** What the importer understood, when the curve came from a file. */
  import: {
    delimiter: string;
    columns: { name: string; role: string; unit: string | null }[];
    sweeps: number;
    points: number;
    /** Resolution of the written current numbers (RMS over the cells of one unit in the last digit), A; null when unknown. */
    currentResolutionA: number | null;
    /** The same for a measured conductance, S; null without one. */
    conductanceResolutionS: number | null;
  } | null;
  /** Things that need attention: a result may be wrong or weak. */
  warnings: string[];
  /** Routine facts about how the result was made (for example where η came from). */
  notes: string[];
  /** The file's own `key: value` metadata lines (dot, radius, setpoint, date, …), keys as written. */
  metadata: Record<string, string>;
  /** Tool, version, input (name, size, SHA-256) and the options as given; null when not known. */
  provenance: Provenance | null;
  /**
   * The orthodox model fitted with every grouping of the peaks (`dotspec analyze
   * --compare-models`): regime from the fitted Γtip/Γsub, status, alternatives and the fit's
   * quantities. Absent when the comparison did not run.
   */
  modelComparison?: ModelComparisonJson;
}

/** What {@link analysisToJson} records beside the analysis. */
export interface AnalysisJsonExtras {
  /** Routine notes (kept apart from the warnings). Default: none. */
  notes?: readonly string[];
  /** The file's metadata lines (`ParsedCurve.curve.meta.metadata`). Default: none. */
  metadata?: Readonly<Record<string, string>>;
  /** Provenance of the record. Default: null. */
  provenance?: Provenance | null;
}

/**
 * Turns an analysis into its JSON record.
 *
 * Parameters
 * ----------
 * analysis : CurveAnalysis
 *     From analyzeCurve.
 * importRecord : ImportRecord, optional
 *     What the importer reported (optional).
 * extras : AnalysisJsonExtras, optional
 *     Notes, the file's metadata and the provenance (optional; see {@link AnalysisJsonExtras}).
 *
 * Returns
 * -------
 * AnalysisJson
 *     The record, plain JSON values only (see {@link AnalysisJson}).
 *
 * Example
 * -------
 * ```ts
 * const { curve, record } = readCurveFile("sample-curves/dot-01.csv");
 * const json = analysisToJson(analyzeCurve(curve), record);
 * json.regime; // => "shell-filling"
 * json.gapV; // => 3.055 (V)
 * ```
 */
export function analysisToJson(analysis: CurveAnalysis, importRecord?: ImportRecord, extras: AnalysisJsonExtras = {}): AnalysisJson {
  const a = analysis.assignment;
  const rec = analysis.conductance.record;
  return {
    version: ANALYSIS_JSON_VERSION,
    source: analysis.source,
    regime: a.regime,
    gapV: a.quantities.gapV,
    gapEdgesV: analysis.gapEdgesV,
    noLevels: a.noLevels ? { code: a.noLevels.code, reason: a.noLevels.reason } : null,
    saturation: rec.saturation.map((s) => ({ end: s.end, biasV: [s.biasV[0], s.biasV[1]], levelA: s.levelA })),
    chargingEnergyV: a.quantities.chargingEnergyV,
    singleParticleGapV: a.quantities.singleParticleGapV,
    levelSpacingSPV: a.quantities.levelSpacingSPV,
    levelSpacingPDV: a.quantities.levelSpacingPDV,
    valenceSpacingsV: a.quantities.valenceSpacingsV,
    multiplets: a.multiplets.map((m) => ({
      ...m,
      peakIndices: [...m.peakIndices],
      peaksV: [...m.peaksV],
      peakUncertaintiesV: [...m.peakUncertaintiesV],
      subgroups: [...m.subgroups],
    })),
    peaks: analysis.peaks.map((p) => ({
      biasV: p.biasV,
      biasUncertaintyV: p.biasUncertaintyV,
      height: p.heightS,
      prominenceS: p.prominenceS,
      fwhmV: p.fwhmV,
      stepA: p.stepA,
      snr: p.snr,
      stepSignificance: p.stepSignificance,
      sweepSpreadV: p.sweepSpreadV,
      multiplet: p.multiplet === null ? null : a.multiplets[p.multiplet].label,
      multipletIndex: p.multiplet,
      role: p.role,
    })),
    subtractedResonances: analysis.subtractedResonances && {
      steps: analysis.subtractedResonances.steps.map((q) => ({ biasV: q.biasV, heightA: q.heightA })),
      rateRatio: analysis.subtractedResonances.rateRatio,
      chargingEnergyEV: analysis.subtractedResonances.chargingEnergyEV,
    },
    energies: a.energies,
    uncertainties: a.uncertainties,
    evidence: a.evidence,
    settings: {
      ...analysis.settings,
      biasStepV: analysis.conductance.stepV,
      noiseCurrentA: rec.noiseCurrentA,
      noiseCurrentBound: rec.noiseCurrentBound,
      noiseCurrentFloorA: rec.noiseCurrentFloorA,
      noiseConductanceS: rec.noiseConductanceS,
      offsetA: rec.offsetA,
      resampled: rec.resampled,
      windowReason: rec.windowReason,
    },
    import: importRecord
      ? {
          delimiter: importRecord.delimiter,
          columns: importRecord.columns.map((c) => ({ name: c.name, role: c.role, unit: c.unit })),
          sweeps: importRecord.sweeps,
          points: importRecord.points,
          currentResolutionA: importRecord.currentResolutionA,
          conductanceResolutionS: importRecord.conductanceResolutionS,
        }
      : null,
    warnings: [...(importRecord?.warnings ?? []), ...analysis.warnings],
    notes: [...(extras.notes ?? [])],
    metadata: { ...(extras.metadata ?? {}) },
    provenance: extras.provenance ?? null,
  };
}
