/**
 * The main job on one curve: conductance, peaks, assignment, with the record of how.
 */
import type { Curve } from "../curve.ts";
import { checkDifferentiateOptions, conductanceFromPrepared, differentiatedNoiseS, CONDUCTANCE_DEFAULTS, type ConductanceRecord, type ConductanceResult, type DifferentiateOptions } from "../signal/conductance.ts";
import { savitzkyGolayUnchecked } from "../signal/savitzkyGolay.ts";
import { savitzkyGolayWindowSamples } from "../signal/savitzkyGolayWindow.ts";
import { prepareCurve, type PreparedCurve } from "../signal/prepareCurve.ts";
import { findPeaks, refineOnCurrent, FIND_PEAKS_DEFAULTS, type Peak, type FindPeaksRecord } from "../peaks/findPeaks.ts";
import { peakAreas } from "../peaks/peakAreas.ts";
import { edgeStepWidth } from "../peaks/edgeStepWidth.ts";
import { assignSpectrum, type Assignment, type Regime } from "../assign/assignSpectrum.ts";
import { withoutCloseShellPeaks } from "../assign/closeShell.ts";
import { peakRoles, withMultiplets, type PeakRole } from "../assign/peakMultiplets.ts";
import { gapEdges } from "../assign/gapEdges.ts";
import { noLevels, type NoLevels } from "../assign/noLevels.ts";
import { flankLevelPeaks, predictedResonancesV, sharedLevelPeaks, sharedReadingStands } from "./flankLevels.ts";
import { shortShellSteps, shortShellPredictions, shortShellStepKept } from "./shortShells.ts";
import { fullShell, subtractionWarning, valenceResonancePeaks, type SubtractedResonances } from "./valenceLadder.ts";
import { bandAreas, gapSideFwhm } from "./bandAreas.ts";
import { setAsideSourcePredictions } from "../assign/oddLeadingLevel.ts";
import { checkEta, checkKnownKeys } from "../util/check.ts";

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
  /** Minimum peak prominence in units of the dI/dV noise. Default: FIND_PEAKS_DEFAULTS.minProminenceSigma (3). */
  minProminenceSigma?: number;
  /** Minimum significance of the current step under a peak, in units of its noise. Default: FIND_PEAKS_DEFAULTS.minStepSigma (5). */
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

/**
 * One peak of the analysis: a {@link Peak} from the final pass with its sweep-to-sweep scatter
 * and, in `stepA`, the current step from the Gaussian decomposition of its band (see the notes of
 * {@link analyzeCurve}), which shares overlapping flanks correctly.
 */
export interface AnalyzedPeak extends Peak {
  /**
   * The current step the peak carries, A: its area in the Gaussian decomposition of its band
   * ({@link peakAreas}); findPeaks' prominence estimate where that decomposition found no area at all.
   */
  stepA: number;
  /** findPeaks' estimate of the same step, prominence × FWHM × 1.0645 (Gaussian area), A. */
  prominenceStepA: number;
  /** Standard deviation of the position over the individual sweeps, V; null with one sweep. */
  sweepSpreadV: number | null;
  /** Sweeps in which the peak was found (of all sweeps). */
  sweepsFound: number;
  /** Index in `assignment.multiplets` of the multiplet holding the peak; null outside every multiplet. */
  multiplet: number | null;
  /** What the peak is in the assignment: a level of a multiplet, a satellite, a second-junction resonance, or unassigned. */
  role: PeakRole;
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
  /** The VB ladder's second-junction resonances taken out of the current before the CB peaks were found (note 9; they are no peaks of the list), or null. */
  subtractedResonances: SubtractedResonances | null;
  /** All warnings of all stages, in order. */
  warnings: string[];
}

/** The pipeline's own thresholds (first pass, measured peak width, peak separation), chosen on the accuracy benchmark; locked by a test. */
export const ANALYZE_DEFAULTS = Object.freeze({
  /** Peak width of the first pass when the width is measured, mV. */
  firstPassPeakWidthMV: CONDUCTANCE_DEFAULTS.peakWidthMV,
  /** The peak whose step width is measured must have at least this SNR … */
  edgePeakSnrMin: 5,
  /** … and at least this fraction of the SNR of the band's strongest peak. */
  edgePeakSnrFraction: 0.3,
  /**
   * When the first pass gives no width, or a smaller one at least this many times its own peak
   * width, it is repeated once with its peak width times this factor (note 2).
   */
  firstPassRetryFactor: 2,
  /** The first pass looks for the gap-edge peaks this far beyond the zero-conductance region, V. */
  firstPassReachV: 0.6,
  /** The measured width is kept within these bounds, mV. */
  peakWidthBoundsMV: [10, 200] as readonly [number, number],
  /** The default minimum separation is this fraction of the window … */
  separationPerWindow: 0.5,
  /** … but not below this, mV. */
  minSeparationFloorMV: 10,
});

/** Rounds of the search for charging peaks of short shells (note 8): each adds at most one peak per end of each short shell. */
const SHORT_SHELL_ROUNDS = 4;

const KEYS = ["eta", "windowMV", "order", "peakWidthMV", "minProminenceSigma", "minStepSigma", "minSeparationMV", "useMeasured", "regime"] as const;

/**
 * Analyses one I–V curve over a quantum dot: conductance, peaks, assignment, with the record of
 * how each was obtained.
 *
 * Parameters
 * ----------
 * curve : Curve
 *     Bias (V, ascending), mean current (A), sweeps (A), optional measured dI/dV (S).
 * options : AnalyzeOptions, optional
 *     eta (η, default 1 with a warning), windowMV (mV or "auto", default "auto"), order (default
 *     CONDUCTANCE_DEFAULTS.order), peakWidthMV (mV, default measured), minProminenceSigma and
 *     minStepSigma (defaults in FIND_PEAKS_DEFAULTS), minSeparationMV (mV, default from the
 *     window), useMeasured (default false), regime (default: classified).
 *
 * Returns
 * -------
 * CurveAnalysis
 *     The conductance, the peaks (new objects: nothing returned is modified afterwards), the zero-
 *     conductance region, the assignment, the settings as used and every warning.
 *
 * Throws
 * ------
 * DotspecError
 *     `options/…` for an unknown key or a value out of range (η outside (0, 1], …);
 *     `signal/…` for a curve the signal stage cannot use (too short for the window, not
 *     ascending, not finite).
 *
 * Notes
 * -----
 * 1. Prepare once ({@link prepareCurve}): uniform grid, a saturated end cut off, current noise
 *    (never below the rounding floor of the written numbers), offset. Every window below is
 *    applied to this one preparation ({@link conductanceFromPrepared}).
 * 2. Width. Unless a window or a peak width is given, the expected peak width is measured: a
 *    pass with ANALYZE_DEFAULTS.firstPassPeakWidthMV (the mean curve only) finds the first CB and
 *    first VB peak within ANALYZE_DEFAULTS.firstPassReachV of the zero-current region; the width
 *    of each band's first current step is fitted on the raw current from the gap up to halfway to
 *    the next peak or half the peak's gap-side FWHM past it, whichever is nearer
 *    ({@link edgeStepWidth}; no other level overlaps that stretch); the smaller (a neighbour the
 *    first pass missed can only widen a fit), bounded to ANALYZE_DEFAULTS.peakWidthBoundsMV, sets
 *    the automatic window of the final pass. Where no band gives a width, or the smaller is at
 *    least ANALYZE_DEFAULTS.firstPassRetryFactor times the first pass's own, the pass is repeated
 *    once with that many times its peak width (broad peaks lose their SNR in a narrow filter) and
 *    the smallest width of both passes is kept. The first pass differentiates only the points it
 *    reads (near the zero-current region and on to 0 V), with the values a whole pass gives there.
 *    A gap-edge peak split in two by the first pass ends its fit short of the step's middle and
 *    reads far too narrow; where the measured width lies below the first pass's and the final pass
 *    then finds no peak at all, the curve is analysed again at the retry's width (with a warning),
 *    and that result stands if it finds levels.
 * 3. Peaks ({@link findPeaks}) with the position uncertainty from the noise of the measured signal
 *    (the current, or a measured conductance), with the same floor for both.
 * 4. With several sweeps, the peaks are also found in each sweep's dI/dV; each peak's sweep
 *    scatter is the standard deviation of the nearest sweep peaks (within half its FWHM), and its
 *    uncertainty is raised to scatter/√sweeps when that is larger.
 * 5. Peak areas (current steps) per band by linear decomposition into Gaussians of a common
 *    width ({@link peakAreas}); the width is twice the half width at half maximum of the band's
 *    gap-edge peak on its gap side, the one flank no neighbour overlaps.
 * 6. The zero-conductance region ({@link gapEdges}, once, on the final conductance) and the
 *    assignment ({@link assignSpectrum}, whose last step places s one VB doublet spacing apart
 *    where a resonance hid it, its note 9) — unless the curve shows no dot levels ({@link noLevels}:
 *    no zero region at 0 V, no peak, or a lone peak); then the assignment is that of no peaks
 *    with `noLevels` set, its reason first among the warnings, and `gapEdgesV` is null.
 * 7. Levels beside second-junction resonances (η given, below 1; the current differentiated):
 *    where the assignment predicts a resonance (`predictedResonancesV`) on a peak, the raw
 *    current there is refitted as the resonance's step near its prediction and level steps
 *    beside it (`flankLevelPeaks`); where a level passes the step test, it joins the peak
 *    list, the peak is moved to the prediction, and the areas and the assignment are redone on
 *    the new list (a level within a FWHM of a resonance often makes one peak with it).
 *    Then, in shell filling, a CB charging peak at a predicted resonance that steps more than a
 *    level of its shell can holds both (`sharedLevelPeaks`): the current there is refitted as
 *    the resonance and the level beside it, the peak is replaced by the two, and the areas and
 *    the assignment are redone; the new list stands where each level stays in the shell its
 *    peak was in (a peak set aside as a resonance inside a shell: the level or the resonance
 *    joins it, the shell's peaks read as the next shell may return to it, one peak per level
 *    may leave it) and every other CB charging peak keeps its shell (`sharedReadingStands`).
 * 8. Charging peaks of short shells (shell filling with Ec; the current differentiated): each
 *    sub-group of a CB shell with fewer peaks than its degeneracy predicts one Ec_V beyond its
 *    last peak and before its first (`shortShellPredictions`); the current there is tested for a
 *    step against the peaks kept and the predicted resonances, with no prominence asked for
 *    (`shortShellSteps`: a weak step in a dense ladder often has no conductance maximum above
 *    the screen). Strongest first, a step found becomes a peak and the areas and the assignment
 *    are redone; the new list stands where the peak joins the shell that predicted it, that shell
 *    keeps its peaks or grows, and the regime is unchanged (`shortShellStepKept`). A full shell
 *    whose first peak lies at a predicted resonance is looked at one Ec_V beyond its last peak
 *    too; a step there may take that first peak's place. Repeated while peaks are added (at most
 *    4 rounds).
 * 9. The VB ladder's resonances taken out of the CB side (η given, below 1; the current
 *    differentiated; between notes 7 and 8): where the assignment reads shell filling with VB
 *    levels whose model describes the VB-side current (`valenceLadderPrediction`), the current
 *    their second-junction resonances add at positive bias is predicted with the same model the
 *    steps come from, subtracted from the current (and, through the same filter, from the
 *    conductance), and the CB peaks are found again on the remainder (`valenceResonancePeaks`).
 *    The new list stands where the regime is unchanged and p then holds as many peaks as it
 *    has states; the areas and the later stages then read the remainder, and a warning names the
 *    subtracted steps (those resonances are then no peaks of the list).
 * 10. Last, a shell-filling reading's shells past p lose leading peaks that lie less than one Ec
 *    beyond the full shell below (`withoutCloseShellPeaks`: a new shell opens Ec plus its
 *    orbital spacing beyond). Applied to the final reading only: the stages above read a short
 *    d (its predicted resonances, its missing charging peaks) as they always have.
 *
 * References
 * ----------
 * A. Savitzky and M. J. E. Golay, Anal. Chem. 36, 1627 (1964) (the filters); the method of each
 * stage is in its own notes.
 *
 * Example
 * -------
 * ```ts
 * const { curve } = readCurveFile("sample-curves/dot-01.csv");
 * const a = analyzeCurve(curve, { eta: 0.88 });
 * a.assignment.regime;                                 // => "shell-filling"
 * a.assignment.multiplets.map((m) => m.label);         // => ["s", "p", "v1", "v2"]
 * ```
 */
export function analyzeCurve(curve: Curve, options: AnalyzeOptions = {}): CurveAnalysis {
  const A = ANALYZE_DEFAULTS;
  checkKnownKeys("analyze options", options, KEYS);
  const eta = options.eta === undefined ? undefined : checkEta("eta", options.eta);
  const order = options.order ?? CONDUCTANCE_DEFAULTS.order;
  const minProminenceSigma = options.minProminenceSigma ?? FIND_PEAKS_DEFAULTS.minProminenceSigma;
  const minStepSigma = options.minStepSigma ?? FIND_PEAKS_DEFAULTS.minStepSigma;
  const useMeasured = options.useMeasured ?? false;
  const windowMV = options.windowMV ?? "auto";

  const prepared = prepareCurve(curve);
  const measureWidth = windowMV === "auto" && options.peakWidthMV === undefined;
  let peakWidthMV = options.peakWidthMV ?? A.firstPassPeakWidthMV;
  let peakWidthMeasured = false;
  const separationFor = (windowMVUsed: number) => options.minSeparationMV ?? Math.max(A.minSeparationFloorMV, A.separationPerWindow * windowMVUsed);
  // "full": each peak tested for a significant current step and refined on the current;
  // "sweeps": single sweeps, which only supply positions near peaks already found.
  // The raw current of points [lo, hi) with its noise, as the step tests and the refinement read it.
  const currentOf = (s: PassSignal, lo: number, hi: number) => ({ currentA: s.currentA.subarray(lo, hi), noiseA: Math.max(s.record.noiseCurrentA, Number.MIN_VALUE) });
  const peaksOf = (s: PassSignal, didv: Float64Array, mode: "full" | "sweeps", widthMV: number, lo = 0, hi = s.biasV.length, refine = true) =>
    findPeaks(s.biasV.subarray(lo, hi), didv.subarray(lo, hi), {
      noiseS: Math.max(s.record.noiseConductanceS, Number.MIN_VALUE),
      minProminenceSigma: mode === "full" ? minProminenceSigma : FIND_PEAKS_DEFAULTS.minProminenceSigma,
      minStepSigma,
      minSeparationMV: separationFor(s.record.windowMV),
      rawNoise: s.record.usedMeasured
        ? { quantity: "conductance", sigmaS: s.record.noiseConductanceRawS ?? s.record.noiseConductanceS }
        : { quantity: "current", sigmaA: s.record.noiseCurrentA },
      expectedFwhmV: widthMV / 1000,
      refineOnCurrent: refine && !s.record.usedMeasured,
      current: mode === "full" ? currentOf(s, lo, hi) : undefined,
    });
  if (measureWidth) {
    // The first pass only has to find the gap-edge peaks: it looks near the zero-current region.
    const [lo, hi] = nearRegion(prepared, A.firstPassReachV);
    const firstPass = (assumedMV: number): number[] => {
      const first = firstPassSignal(prepared, { windowMV, order, peakWidthMV: assumedMV, useMeasured }, lo, hi);
      // Found without the refinement on the current, which then moves only the peaks the width is
      // read from (the same positions when the refinement is one step, as it is by default).
      const selective = FIND_PEAKS_DEFAULTS.refineIterations === 1 && !first.record.usedMeasured;
      const found = peaksOf(first, first.didvS, "full", assumedMV, lo, hi, !selective).peaks;
      const refined = selective ? refineEdgePeaks(found, first.biasV.subarray(lo, hi), currentOf(first, lo, hi), assumedMV) : found;
      const edgePeaks = refined.map((p) => ({ ...p, index: p.index + lo }));
      return edgeWidths(first, edgePeaks).map((w) => w * 1000);
    };
    let widths = firstPass(A.firstPassPeakWidthMV);
    // Peaks far broader than the first pass assumes (low η widens them by 1/η) lose their SNR in
    // its narrow filter: no band gives a width, or the smaller is many times the assumption (a
    // step the pass missed inside the fit widens it). Once, the pass is repeated with a wider
    // filter, and the smallest width of both passes is kept.
    const retry = A.firstPassRetryFactor * A.firstPassPeakWidthMV;
    if (!widths.length || Math.min(...widths) >= retry) widths = [...widths, ...firstPass(retry)];
    if (widths.length) {
      // The smaller: a neighbour the first pass missed can only widen a fit.
      peakWidthMV = Math.min(A.peakWidthBoundsMV[1], Math.max(A.peakWidthBoundsMV[0], Math.min(...widths)));
      peakWidthMeasured = true;
    }
  }
  const signal = conductanceFromPrepared(prepared, { windowMV, order, peakWidthMV, useMeasured });

  const found = peaksOf(signal, signal.didvS, "full", peakWidthMV);
  const sweeps = signal.didvSweepsS;
  const sweepPeaks = sweeps.map((g) => peaksOf(signal, g, "sweeps", peakWidthMV).peaks);
  let areas = bandAreas(signal.biasV, signal.didvS, found.peaks);
  let peaks = withSweeps(found.peaks, areas, sweeps.length, sweepPeaks);

  const edges = gapEdges(signal.biasV, signal.didvS, { noiseS: signal.record.noiseConductanceS });
  const nb = signal.biasV.length;
  const zeroRegion = prepared.offsetRegionV;
  const none = noLevels({
    peaksV: peaks.map((p) => p.biasV),
    gapEdgesV: edges,
    zeroInRange: nb > 0 && signal.biasV[0] <= 0 && signal.biasV[nb - 1] >= 0,
    zeroCurrentSamples: zeroRegion ? Math.round((zeroRegion[1] - zeroRegion[0]) / prepared.stepV) + 1 : 0,
    strongestProminenceSigma: peaks.length ? Math.max(...peaks.map((p) => p.snr)) : undefined,
    peakFwhmV: peaks.map((p) => p.fwhmV),
    biasRangeV: nb > 0 ? [signal.biasV[0], signal.biasV[nb - 1]] : undefined,
  });
  // A width measured below the first pass's that leaves no peak at all is suspect (note 2).
  if (none?.code === "no-peaks" && peakWidthMeasured && peakWidthMV < A.firstPassPeakWidthMV) {
    const again = analyzeCurve(curve, { ...options, peakWidthMV: A.firstPassRetryFactor * A.firstPassPeakWidthMV });
    if (again.assignment.noLevels === null) {
      again.warnings.unshift(`the peak width measured at the gap edges (${peakWidthMV.toFixed(1)} mV) left no peak passing the current-step test; analysed again at ${A.firstPassRetryFactor * A.firstPassPeakWidthMV} mV, the first pass's retry width`);
      return again;
    }
  }
  let assignment = none === null ? assignSpectrum(peaks, { eta, regime: options.regime }) : noLevelsAssignment(none, eta, options.regime);
  const w = peakWidthMV / 1000;
  let curveIn = { biasV: signal.biasV, currentA: signal.currentA, didvS: signal.didvS, noiseA: Math.max(signal.record.noiseCurrentA, Number.MIN_VALUE), noiseS: Math.max(signal.record.noiseConductanceS, Number.MIN_VALUE), floorV: FIND_PEAKS_DEFAULTS.positionFloorPerFwhm * w };
  const resonancesOf = (list: readonly Pick<Peak, "biasV">[], a: Assignment) => (eta !== undefined && eta < 1 ? predictedResonancesV(list, a, eta, w) : []);
  let list: readonly Peak[] = found.peaks;
  // A new peak list read again: its areas, its peaks with the sweeps' positions, its assignment.
  const reread = (next: readonly Peak[]) => {
    const nextAreas = bandAreas(signal.biasV, curveIn.didvS, next);
    const nextPeaks = withSweeps(next, nextAreas, sweeps.length, sweepPeaks);
    return { list: next, areas: nextAreas, peaks: nextPeaks, assignment: assignSpectrum(nextPeaks, { eta, regime: options.regime }) };
  };
  // What note 9 took out of the current, where it was kept.
  let subtracted: SubtractedResonances | null = null;
  const take = (r: ReturnType<typeof reread>): void => {
    ({ list, areas, peaks, assignment } = r);
  };
  if (none === null && eta !== undefined && eta < 1 && !signal.record.usedMeasured) {
    // Levels on the flank of a predicted second-junction resonance (note 7).
    const flank = flankLevelPeaks(curveIn, found.peaks, resonancesOf(peaks, assignment), w, minStepSigma);
    if (flank) take(reread(flank));
    // Levels that share their peak with a predicted resonance, placed on the current (note 7).
    const shared = sharedLevelPeaks(curveIn, list, peaks.map((p) => p.stepA), assignment, resonancesOf(peaks, assignment), w, minStepSigma);
    if (shared) {
      const again = reread(shared.peaks);
      // Kept where each level joins the shell its peak was in and every other CB charging peak keeps its shell.
      if (again.assignment.regime === assignment.regime && sharedReadingStands({ assignment, peaks: list }, { assignment: again.assignment, peaks: shared.peaks }, shared.levels)) take(again);
    }
  }
  if (none === null && eta !== undefined && eta < 1 && !signal.record.usedMeasured) {
    // The CB side found again on the current less the VB ladder's predicted resonances (note 9).
    const differentiate = (y: Float64Array) => savitzkyGolayUnchecked(y, signal.record.windowSamples, signal.record.order, 1, prepared.stepV);
    const findPeaksOn = (currentA: Float64Array, didvS: Float64Array) => peaksOf({ ...signal, currentA }, didvS, "full", peakWidthMV).peaks;
    const vb = valenceResonancePeaks(curveIn.currentA, curveIn.didvS, signal.biasV, list, peaks.map((p) => p.stepA), assignment, eta, w, { differentiate, findPeaks: findPeaksOn });
    const whole = curveIn;
    if (vb) curveIn = { ...curveIn, currentA: vb.currentA, didvS: vb.didvS };
    const again = vb && reread(vb.peaks);
    // Kept where the regime stays and p then holds as many peaks as it has states; the later stages read the remainder.
    if (again && again.assignment.regime === assignment.regime && fullShell(again.assignment, "p")) {
      take(again);
      subtracted = { steps: vb.prediction.steps, rateRatio: vb.prediction.rateRatio, chargingEnergyEV: vb.prediction.chargingEnergyEV };
    } else curveIn = whole;
  }
  for (let round = 0; none === null && !signal.record.usedMeasured && round < SHORT_SHELL_ROUNDS; round++) {
    // Charging peaks a short filling shell lacks (note 8), one at a time, strongest step first.
    // A full shell's first peak is looked at against the resonances predicted, and those its set-aside VB peaks would give.
    const ecV = assignment.quantities.chargingEnergyV ?? 0;
    const resonancesV = resonancesOf(peaks, assignment);
    const leadResonancesV = [...resonancesV, ...(eta !== undefined ? setAsideSourcePredictions(peaks, assignment.evidence.secondJunction, ecV, eta).map((r) => r.predictedV) : [])];
    const predictions = shortShellPredictions(peaks, assignment, [signal.biasV[0], signal.biasV[nb - 1]], { resonancesV: leadResonancesV, toleranceV: w / 2 });
    const steps = predictions.length ? shortShellSteps(curveIn, list, predictions, resonancesV, ecV, w, minStepSigma) : [];
    let added = 0;
    for (const { peak, label, replaces } of steps) {
      if (list.some((q) => Math.abs(q.biasV - peak.biasV) < w)) continue;
      const again = reread([...list, peak].sort((a, b) => a.biasV - b.biasV));
      if (!shortShellStepKept(label, peak, { list, assignment }, again, replaces)) continue;
      take(again);
      added++;
    }
    if (!added) break;
  }
  // A shell past p that opens less than Ec beyond the full shell below loses those peaks (note 10).
  assignment = withoutCloseShellPeaks(assignment);
  const roles = peakRoles(peaks.length, assignment);
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
    minSeparationMV: separationFor(signal.record.windowMV),
    useMeasured: signal.record.usedMeasured,
    regimeForced: options.regime !== undefined,
  };
  return {
    source: curve.meta.source,
    settings,
    conductance: signal,
    peaks: withMultiplets(peaks, assignment.multiplets).map((p, k) => ({ ...p, role: roles[k] })),
    peakRecord: found.record,
    bandWidthsV: areas.widthsV,
    gapEdgesV: none === null ? edges : null,
    assignment,
    subtractedResonances: subtracted,
    warnings: [...signal.record.warnings, ...found.record.warnings, ...(subtracted ? [subtractionWarning(subtracted)] : []), ...assignment.warnings],
  };
}

/** What a pass of peak finding reads of a conductance: a whole pass's result, or the first pass's part. */
type PassSignal = Pick<ConductanceResult, "biasV" | "currentA" | "didvS"> & {
  record: Pick<ConductanceRecord, "noiseConductanceS" | "noiseConductanceRawS" | "noiseCurrentA" | "windowMV" | "usedMeasured">;
};

/**
 * The first pass's dI/dV, computed only where that pass reads it: the points [lo, hi) and the
 * stretch from there to 0 V (which the gap-side width walks), by the derivative filter alone,
 * with the window chosen on the whole curve; each value is the one the whole curve's pass gives
 * there (the filter is local: a point at least half a window from the part's ends, or at the
 * curve's own end, sees the same samples), and the points outside are 0 and never read. A
 * measured conductance (useMeasured) takes the whole pass.
 */
function firstPassSignal(prepared: PreparedCurve, options: DifferentiateOptions & { order: number; peakWidthMV: number }, lo: number, hi: number): PassSignal {
  checkDifferentiateOptions(options);
  if (options.useMeasured && prepared.measuredS) return conductanceFromPrepared(prepared, { ...options, sweeps: false });
  const { biasV, currentA, stepV, noiseCurrentA } = prepared;
  const n = biasV.length;
  const windowSamples = savitzkyGolayWindowSamples(prepared, options.windowMV ?? "auto", options.order, options.peakWidthMV);
  let zero = 0;
  while (zero < n && biasV[zero] < 0) zero++;
  const from = Math.max(0, Math.min(lo, zero - 2)), to = Math.min(n, Math.max(hi, zero + 2));
  const half = (windowSamples - 1) / 2;
  const a = Math.max(0, from - half), b = Math.min(n, to + half);
  const part = savitzkyGolayUnchecked(currentA.subarray(a, b), windowSamples, options.order, 1, stepV);
  const didvS = new Float64Array(n);
  didvS.set(part.subarray(from - a, to - a), from);
  return {
    biasV,
    currentA,
    didvS,
    record: {
      noiseConductanceS: differentiatedNoiseS(noiseCurrentA, windowSamples, options.order, stepV),
      noiseConductanceRawS: null,
      noiseCurrentA,
      windowMV: windowSamples * stepV * 1e3,
      usedMeasured: false,
    },
  };
}

/** Fitted FWHM (V) of the first current step of each band that has a peak. */
function edgeWidths(signal: PassSignal, peaks: readonly Peak[]): number[] {
  const out: number[] = [];
  const { biasV, currentA } = signal;
  for (const { sign, band: indices } of clearBandPeaks(peaks)) {
    const band = indices.map((k) => peaks[k]);
    if (!band.length) continue;
    // Work in the band's own direction: x = sign·V, y = sign·I rises at its first step.
    const x0 = sign * band[0].biasV;
    // Stop halfway to the next peak, and within half the gap-side FWHM of the step, so a
    // neighbour the first pass missed stays out of the fit.
    const gapSide = gapSideFwhm(signal.biasV, signal.didvS, band[0]);
    let right = band.length > 1 ? x0 + 0.5 * (sign * band[1].biasV - x0) : x0 + 0.15;
    if (gapSide !== null) right = Math.min(right, x0 + 0.5 * gapSide);
    const w = edgeStepWidth(biasV, currentA, { positionV: x0, rangeV: [Math.max(0, x0 - 0.4), right], sign });
    if (w !== null) out.push(w);
  }
  return out;
}

/**
 * Each band's clear peaks (indices into `peaks`), from the gap outward: those with an SNR of at
 * least ANALYZE_DEFAULTS.edgePeakSnrMin and edgePeakSnrFraction of the band's strongest (weak
 * maxima near the gap edge would give a width of noise). The first is the band's edge peak.
 */
function clearBandPeaks(peaks: readonly Peak[]): { sign: 1 | -1; band: number[] }[] {
  return ([1, -1] as const).map((sign) => {
    const inBand = peaks.map((_, k) => k).filter((k) => sign * peaks[k].biasV > 0);
    const strongest = Math.max(0, ...inBand.map((k) => peaks[k].snr));
    const band = inBand
      .filter((k) => peaks[k].snr >= Math.max(ANALYZE_DEFAULTS.edgePeakSnrMin, ANALYZE_DEFAULTS.edgePeakSnrFraction * strongest))
      .sort((a, b) => sign * (peaks[a].biasV - peaks[b].biasV));
    return { sign, band };
  });
}

/**
 * The first pass's peaks with the positions a refinement of all of them on the current would
 * give to the peaks {@link edgeWidths} reads, refining only those: each band's edge peak and the
 * one after it, and first any peak within one step's reach (half a width) of 0 V, whose band
 * the refinement could change. Each peak's refinement reads the others' positions as found
 * ({@link refineOnCurrent}), so refining a few gives them the values refining all would; the
 * others keep the parabola's positions, on the same side of 0 V and in the same order as refined
 * ones (a step never passes halfway to a neighbour), so the band and order edgeWidths reads are
 * the same.
 */
function refineEdgePeaks(peaks: readonly Peak[], biasV: Float64Array, current: { currentA: Float64Array; noiseA: number }, peakWidthMV: number): Peak[] {
  const n = biasV.length;
  const stepV = (biasV[n - 1] - biasV[0]) / (n - 1);
  const halfWidth = Math.max(1, Math.round(peakWidthMV / 1000 / (2 * stepV)));
  const work = { cols: new Float64Array(0) };
  const nearZero = peaks.map((_, k) => k).filter((k) => Math.abs(peaks[k].biasV) <= halfWidth * stepV);
  const first = refineOnCurrent(biasV, current, peaks, nearZero, () => halfWidth, work).peaks;
  const read = clearBandPeaks(first).flatMap(({ band }) => band.slice(0, 2)).filter((k) => !nearZero.includes(k));
  const second = refineOnCurrent(biasV, current, peaks, read, () => halfWidth, work).peaks;
  return peaks.map((p, k) => (nearZero.includes(k) ? first[k] : read.includes(k) ? second[k] : p));
}

/**
 * Index range [lo, hi) of the bias points within `reachV` of the zero-current region found when
 * the curve was prepared (all points without one).
 */
function nearRegion(prepared: PreparedCurve, reachV: number): [number, number] {
  const region = prepared.offsetRegionV;
  const { biasV } = prepared;
  const n = biasV.length;
  if (!region) return [0, n];
  let lo = 0, hi = n;
  while (lo < n - 1 && biasV[lo] < region[0] - reachV) lo++;
  while (hi > lo + 1 && biasV[hi - 1] > region[1] + reachV) hi--;
  return [lo, hi];
}

/** The assignment of a curve without dot levels: that of no peaks (no multiplets, every quantity null), with the verdict and its reason first among the warnings. */
function noLevelsAssignment(none: NoLevels, eta: number | undefined, regime: Regime | undefined): Assignment {
  const empty = assignSpectrum([], { eta, regime });
  const etaNotes = empty.warnings.filter((w) => w.startsWith("eta"));
  return {
    ...empty,
    regime: "undetermined",
    evidence: { ...empty.evidence, reasons: [`no levels found: ${none.reason}`] },
    noLevels: none,
    warnings: [`no levels found: ${none.reason}`, ...etaNotes],
  };
}

/**
 * The pipeline's peaks from a list of found peaks: each with its step from the band decomposition
 * and, with several sweeps, the scatter of the nearest sweep peaks (within half its FWHM) and its
 * uncertainty raised to scatter/√sweeps where that is larger (note 4 of {@link analyzeCurve}).
 */
function withSweeps(list: readonly Peak[], areas: { stepsA: number[] }, sweepCount: number, sweepPeaks: readonly Peak[][]): Omit<AnalyzedPeak, "multiplet" | "role">[] {
  return list.map((p, k) => {
    // Written out (not spread): the same keys in the same order as Peak's, then the pipeline's.
    const own = (biasUncertaintyV: number, sweepSpreadV: number | null, sweepsFound: number) => ({
      biasV: p.biasV,
      biasUncertaintyV,
      index: p.index,
      heightS: p.heightS,
      prominenceS: p.prominenceS,
      fwhmV: p.fwhmV,
      stepA: areas.stepsA[k],
      snr: p.snr,
      stepSignificance: p.stepSignificance,
      prominenceStepA: p.stepA,
      sweepSpreadV,
      sweepsFound,
    });
    if (sweepCount < 2) return own(p.biasUncertaintyV, null, sweepCount || 1);
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
    return own(uncertainty, spread, positions.length);
  });
}
