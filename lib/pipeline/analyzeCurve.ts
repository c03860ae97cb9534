/**
 * The main job on one curve: conductance, peaks, assignment, with the record of how.
 */
import type { Curve } from "../curve.ts";
import { conductance, CONDUCTANCE_DEFAULTS, type ConductanceResult } from "../signal/conductance.ts";
import { findPeaks, FIND_PEAKS_DEFAULTS, type Peak, type FindPeaksRecord } from "../peaks/findPeaks.ts";
import { peakAreas } from "../peaks/peakAreas.ts";
import { edgeStepWidth } from "../peaks/edgeStepWidth.ts";
import { assignSpectrum, type Assignment, type Regime } from "../assign/assignSpectrum.ts";
import { withMultiplets } from "../assign/peakMultiplets.ts";
import { gapEdges } from "../assign/gapEdges.ts";
import { checkKnownKeys, checkRange } from "../util/check.ts";
import { median } from "../signal/noise.ts";

/** Options of {@link analyzeCurve}; every field optional. */
export interface AnalyzeOptions {
  /** Voltage-division factor η in (0, 1]. Default: 1, with a note in the warnings. */
  eta?: number;
  /** Savitzky–Golay window in mV, or "auto" (default). */
  windowMV?: number | "auto";
  /** Savitzky–Golay polynomial order, 2–4. Default 3. */
  order?: number;
  /**
   * Expected FWHM of the dI/dV peaks in mV, for the automatic window. Default: measured from
   * the curve (a first pass with 40 mV, then the fitted width of each band's first current step).
   */
  peakWidthMV?: number;
  /** Minimum peak prominence in units of the dI/dV noise. Default 4. */
  minProminenceSigma?: number;
  /** Minimum significance of the current step under a peak, in units of its noise. Default 5. */
  minStepSigma?: number;
  /** Minimum separation of two peaks in mV. Default: half the Savitzky–Golay window, at least 10 mV. */
  minSeparationMV?: number;
  /** Use the measured dI/dV column (lock-in) instead of differentiating I. Default false. */
  useMeasured?: boolean;
  /** Force a regime instead of classifying. */
  regime?: Regime;
}

/** Settings as used, for the record (the automatic choices resolved to numbers). */
export interface AnalyzeSettings {
  eta: number;
  etaGiven: boolean;
  windowMV: number;
  windowSamples: number;
  automaticWindow: boolean;
  order: number;
  peakWidthMV: number;
  peakWidthMeasured: boolean;
  minProminenceSigma: number;
  minStepSigma: number;
  minSeparationMV: number;
  useMeasured: boolean;
  regimeForced: boolean;
}

/** One peak with its sweep-to-sweep scatter. */
export interface AnalyzedPeak extends Peak {
  /** Standard deviation of the position over the individual sweeps, V; null with one sweep. */
  sweepSpreadV: number | null;
  /** Sweeps in which the peak was found (of all sweeps). */
  sweepsFound: number;
  /** Index in `assignment.multiplets` of the multiplet holding the peak; null outside every multiplet. */
  multiplet: number | null;
}

/** Everything the analysis of one curve produced. */
export interface CurveAnalysis {
  source: string;
  settings: AnalyzeSettings;
  conductance: ConductanceResult;
  peaks: AnalyzedPeak[];
  peakRecord: FindPeaksRecord;
  /** Common FWHM used to decompose each band's peaks into areas, V (null: no peaks in that band). */
  bandWidthsV: { CB: number | null; VB: number | null };
  /** Zero-conductance region [negative edge, positive edge] in V, or null. */
  gapEdgesV: [number, number] | null;
  assignment: Assignment;
  /** All warnings of all stages, in order. */
  warnings: string[];
}

export const ANALYZE_DEFAULTS = {
  /** Peak width of the first pass when the width is measured, mV. */
  firstPassPeakWidthMV: CONDUCTANCE_DEFAULTS.peakWidthMV,
  /** The peak whose step width is measured must have at least this SNR … */
  edgePeakSnrMin: 5,
  /** … and at least this fraction of the SNR of the band's strongest peak. */
  edgePeakSnrFraction: 0.3,
  /** The first pass looks for the gap-edge peaks this far beyond the zero-conductance region, V. */
  firstPassReachV: 0.6,
  /** The measured width is kept within these bounds, mV. */
  peakWidthBoundsMV: [10, 200] as readonly [number, number],
  /** The default minimum separation is this fraction of the window … */
  separationPerWindow: 0.5,
  /** … but not below this, mV. */
  minSeparationFloorMV: 10,
} as const;

const KEYS = ["eta", "windowMV", "order", "peakWidthMV", "minProminenceSigma", "minStepSigma", "minSeparationMV", "useMeasured", "regime"] as const;

/**
 * Analyses one I–V curve over a quantum dot.
 *
 * Notes:
 * 1. Conductance by Savitzky–Golay differentiation ({@link conductance}). Unless a window or a
 *    peak width is given, the expected peak width is measured first: a pass with 40 mV finds
 *    the first CB and first VB peak; the width of each band's first current step is fitted on
 *    the raw current from the gap up to halfway to the next peak or half the peak's gap-side
 *    FWHM past it, whichever is nearer ({@link edgeStepWidth}; no other level overlaps that
 *    stretch); the smaller (a neighbour the first pass missed can only widen a fit), bounded to
 *    10–200 mV, sets the automatic window of the final pass.
 * 2. Peaks ({@link findPeaks}) with the position uncertainty from the current noise.
 * 3. With several sweeps, the peaks are also found in each sweep's dI/dV; each peak's sweep
 *    scatter is the standard deviation of the nearest sweep peaks (within half its FWHM), and its
 *    uncertainty is raised to scatter/√sweeps when that is larger.
 * 4. Peak areas (current steps) per band by linear decomposition into Gaussians of a common
 *    width ({@link peakAreas}); the width is twice the half width at half maximum of the band's
 *    gap-edge peak on its gap side, the one flank no neighbour overlaps.
 * 5. The zero-conductance region ({@link gapEdges}) and the assignment ({@link assignSpectrum}).
 *
 * @throws DotspecError for invalid options or a curve too short for the window.
 */
export function analyzeCurve(curve: Curve, options: AnalyzeOptions = {}): CurveAnalysis {
  const A = ANALYZE_DEFAULTS;
  checkKnownKeys("analyze options", options, KEYS);
  if (options.eta !== undefined) checkRange("eta", options.eta, 1e-6, 1);
  const order = options.order ?? CONDUCTANCE_DEFAULTS.order;
  const minProminenceSigma = options.minProminenceSigma ?? FIND_PEAKS_DEFAULTS.minProminenceSigma;
  const minStepSigma = options.minStepSigma ?? FIND_PEAKS_DEFAULTS.minStepSigma;
  const useMeasured = options.useMeasured ?? false;
  const windowMV = options.windowMV ?? "auto";

  let peakWidthMV = options.peakWidthMV ?? A.firstPassPeakWidthMV;
  let peakWidthMeasured = false;
  let signal = conductance(curve, { windowMV, order, peakWidthMV, useMeasured });
  const separationFor = (s: ConductanceResult) =>
    options.minSeparationMV ?? Math.max(A.minSeparationFloorMV, A.separationPerWindow * s.record.windowMV);
  const rawNoise = (s: ConductanceResult) =>
    s.record.usedMeasured ? undefined : ({ quantity: "current", sigmaA: s.record.noiseCurrentA } as const);
  // "full": each peak tested for a significant current step and refined on the current;
  // "sweeps": single sweeps, which only supply positions near peaks already found.
  const peaksOf = (s: ConductanceResult, didv: Float64Array, mode: "full" | "sweeps", lo = 0, hi = s.biasV.length) =>
    findPeaks(s.biasV.subarray(lo, hi), didv.subarray(lo, hi), {
      noiseS: Math.max(s.record.noiseConductanceS, Number.MIN_VALUE),
      minProminenceSigma: mode === "full" ? minProminenceSigma : FIND_PEAKS_DEFAULTS.minProminenceSigma,
      minStepSigma,
      minSeparationMV: separationFor(s),
      rawNoise: rawNoise(s),
      expectedFwhmV: peakWidthMV / 1000,
      refineOnCurrent: !s.record.usedMeasured,
      current: mode === "full" ? { currentA: s.currentA.subarray(lo, hi), noiseA: Math.max(s.record.noiseCurrentA, Number.MIN_VALUE) } : undefined,
    });
  if (windowMV === "auto" && options.peakWidthMV === undefined) {
    // The first pass only has to find the gap-edge peaks: it looks near the zero-conductance region.
    const [lo, hi] = nearGap(signal, A.firstPassReachV);
    const edgePeaks = peaksOf(signal, signal.didvS, "full", lo, hi).peaks.map((p) => ({ ...p, index: p.index + lo }));
    const widths = edgeWidths(signal, edgePeaks).map((w) => w * 1000);
    if (widths.length) {
      // The smaller: a neighbour the first pass missed can only widen a fit.
      peakWidthMV = Math.min(A.peakWidthBoundsMV[1], Math.max(A.peakWidthBoundsMV[0], Math.min(...widths)));
      peakWidthMeasured = true;
      if (peakWidthMV !== A.firstPassPeakWidthMV) signal = conductance(curve, { windowMV, order, peakWidthMV, useMeasured });
    }
  }

  const found = peaksOf(signal, signal.didvS, "full");
  const bandWidthsV = decomposeBands(signal.biasV, signal.didvS, found.peaks);
  const sweeps = signal.didvSweepsS;
  const sweepPeaks = sweeps.map((g) => peaksOf(signal, g, "sweeps").peaks);
  const peaks: Omit<AnalyzedPeak, "multiplet">[] = found.peaks.map((p) => {
    if (sweeps.length < 2) return { ...p, sweepSpreadV: null, sweepsFound: sweeps.length || 1 };
    const positions: number[] = [];
    for (const list of sweepPeaks) {
      let best: Peak | null = null;
      for (const q of list) if (!best || Math.abs(q.biasV - p.biasV) < Math.abs(best.biasV - p.biasV)) best = q;
      if (best && Math.abs(best.biasV - p.biasV) <= p.fwhmV / 2) positions.push(best.biasV);
    }
    let spread: number | null = null;
    let uncertainty = p.biasUncertaintyV;
    if (positions.length >= 2) {
      const mean = positions.reduce((a, b) => a + b, 0) / positions.length;
      spread = Math.sqrt(positions.reduce((a, b) => a + (b - mean) ** 2, 0) / (positions.length - 1));
      uncertainty = Math.max(uncertainty, spread / Math.sqrt(positions.length));
    }
    return { ...p, biasUncertaintyV: uncertainty, sweepSpreadV: spread, sweepsFound: positions.length };
  });

  const edges = gapEdges(signal.biasV, signal.didvS, { noiseS: signal.record.noiseConductanceS });
  const assignment = assignSpectrum(peaks, { eta: options.eta, regime: options.regime });
  const settings: AnalyzeSettings = {
    eta: assignment.energies.eta,
    etaGiven: assignment.energies.etaGiven,
    windowMV: signal.record.windowMV,
    windowSamples: signal.record.windowSamples,
    automaticWindow: signal.record.automaticWindow,
    order: signal.record.order,
    peakWidthMV,
    peakWidthMeasured,
    minProminenceSigma,
    minStepSigma,
    minSeparationMV: separationFor(signal),
    useMeasured: signal.record.usedMeasured,
    regimeForced: options.regime !== undefined,
  };
  return {
    source: curve.meta.source,
    settings,
    conductance: signal,
    peaks: withMultiplets(peaks, assignment.multiplets),
    peakRecord: found.record,
    bandWidthsV,
    gapEdgesV: edges,
    assignment,
    warnings: [...signal.record.warnings, ...found.record.warnings, ...assignment.warnings],
  };
}

/**
 * Replaces each peak's prominence-based step by the area from a Gaussian decomposition of its
 * band (in place) and returns the common widths used.
 */
function decomposeBands(biasV: Float64Array, didvS: Float64Array, peaks: Peak[]): { CB: number | null; VB: number | null } {
  const widths: { CB: number | null; VB: number | null } = { CB: null, VB: null };
  for (const band of ["CB", "VB"] as const) {
    const list = peaks.filter((p) => (band === "CB" ? p.biasV > 0 : p.biasV < 0));
    if (!list.length) continue;
    const edge = band === "CB" ? list[0] : list[list.length - 1];
    const fwhm = gapSideFwhm(biasV, didvS, edge) ?? median(list.map((p) => p.fwhmV));
    widths[band] = fwhm;
    const areas = peakAreas(biasV, didvS, list.map((p) => p.biasV), { fwhmV: fwhm });
    list.forEach((p, i) => {
      if (areas.areasA[i] > 0 || areas.amplitudesS.some((a) => a > 0)) p.stepA = areas.areasA[i];
    });
  }
  return widths;
}

/** Twice the half width at half maximum of a peak on its side facing 0 V (above the gap floor), V; null if not reached. */
function gapSideFwhm(biasV: Float64Array, didvS: Float64Array, peak: Peak): number | null {
  const dir = peak.biasV > 0 ? -1 : 1;
  let floor = didvS[peak.index];
  for (let i = peak.index; i >= 0 && i < biasV.length && (dir < 0 ? biasV[i] >= 0 : biasV[i] <= 0); i += dir) floor = Math.min(floor, didvS[i]);
  const half = floor + (peak.heightS - floor) / 2;
  for (let i = peak.index; i + dir >= 0 && i + dir < biasV.length; i += dir) {
    const j = i + dir;
    if (didvS[j] <= half) {
      const x = biasV[i] + ((half - didvS[i]) / (didvS[j] - didvS[i])) * (biasV[j] - biasV[i]);
      return 2 * Math.abs(peak.biasV - x);
    }
    if (dir < 0 ? biasV[j] < 0 : biasV[j] > 0) break;
  }
  return null;
}

/** Fitted FWHM (V) of the first current step of each band that has a peak. */
function edgeWidths(signal: ConductanceResult, peaks: Peak[]): number[] {
  const out: number[] = [];
  const { biasV, currentA } = signal;
  for (const sign of [1, -1]) {
    // Work in the band's own direction: x = sign·V, y = sign·I rises at its first step.
    // The band's first clear peak: weak maxima near the gap edge would give a width of noise.
    const inBand = peaks.filter((p) => sign * p.biasV > 0);
    const strongest = Math.max(0, ...inBand.map((p) => p.snr));
    const band = inBand
      .filter((p) => p.snr >= Math.max(ANALYZE_DEFAULTS.edgePeakSnrMin, ANALYZE_DEFAULTS.edgePeakSnrFraction * strongest))
      .sort((a, b) => sign * (a.biasV - b.biasV));
    if (!band.length) continue;
    const x0 = sign * band[0].biasV;
    // Stop halfway to the next peak, and within half the gap-side FWHM of the step, so a
    // neighbour the first pass missed stays out of the fit.
    const gapSide = gapSideFwhm(signal.biasV, signal.didvS, band[0]);
    let right = band.length > 1 ? x0 + 0.5 * (sign * band[1].biasV - x0) : x0 + 0.15;
    if (gapSide !== null) right = Math.min(right, x0 + 0.5 * gapSide);
    const w = edgeStepWidth(biasV, currentA, { positionV: x0, rangeV: [Math.max(0, x0 - 0.4), right], sign: sign as 1 | -1 });
    if (w !== null) out.push(w);
  }
  return out;
}

/** Index range [lo, hi) of the bias points within `reachV` of the zero-conductance region (all points without one). */
function nearGap(signal: ConductanceResult, reachV: number): [number, number] {
  const edges = gapEdges(signal.biasV, signal.didvS, { noiseS: signal.record.noiseConductanceS });
  const n = signal.biasV.length;
  if (!edges) return [0, n];
  let lo = 0, hi = n;
  while (lo < n - 1 && signal.biasV[lo] < edges[0] - reachV) lo++;
  while (hi > lo + 1 && signal.biasV[hi - 1] > edges[1] + reachV) hi--;
  return [lo, hi];
}
