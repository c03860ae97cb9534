/**
 * Simulated I–V (and dI/dV) curves of a dot in a double-barrier junction.
 */
import { biasAxis, parseScenario, type Scenario } from "./scenario.ts";
import { bandLadders, exactCurrent, currentSteps, fastCurrent, fastConductance, type DotModel } from "./bandCurrent.ts";
import { BOLTZMANN_EV_PER_K } from "../util/constants.ts";
import { seededRandom } from "../util/random.ts";
import { DotspecError } from "../util/errors.ts";

/** Options of {@link simulateCurve}. */
export interface SimulateOptions {
  /**
   * "exact": thermal master equation on a grid of step ≤ kB·T/(3·e·η), convolved with the
   * broadening and lock-in kernels — the reference. "fast": zero-temperature plateaus joined by
   * Gaussian-broadened steps ({@link fastCurrent}); accurate when the broadening is much wider
   * than kB·T, and about 100 times quicker. Default: SIMULATE_DEFAULTS.method ("exact").
   */
  method?: "exact" | "fast";
  /** Also compute dI/dV. Default: SIMULATE_DEFAULTS.conductance (true). */
  conductance?: boolean;
}

/** A simulated curve and how it was made. */
export interface SimulatedCurve {
  /** Output bias axis in V. */
  biasV: Float64Array;
  /** Current in A (with noise if the scenario asks for it). */
  currentA: Float64Array;
  /** dI/dV in S (lock-in kernel applied when lockInVrms > 0), or null. */
  didvS: Float64Array | null;
  /** The noise-free current in A. */
  cleanCurrentA: Float64Array;
  /** The noise-free dI/dV in S, or null. */
  cleanDidvS: Float64Array | null;
  /** How it was made. */
  record: {
    /** The method used. */
    method: "exact" | "fast";
    /** Step of the internal fine grid in V (exact method). */
    fineStepV: number | null;
    /** Gaussian broadening in bias, σ = broadeningEV/η, V. */
    broadeningV: number;
    /** Lock-in modulation amplitude (peak) in V. */
    lockInPeakV: number;
    /** Standard deviation of the added current noise in A (0 if none). */
    noiseCurrentA: number;
    /** Standard deviation of the added dI/dV noise in S (0 if none). */
    noiseConductanceS: number;
    /** The scenario, validated and with its defaults filled. */
    scenario: Scenario;
  };
}

/** Defaults and tuning constants of {@link simulateCurve} (locked by test/model/simulate.test.ts). */
export const SIMULATE_DEFAULTS = Object.freeze({
  method: "exact" as const,
  /** Compute dI/dV as well as I. */
  conductance: true,
  /** Fine grid step as a fraction of kB·T/(e·η). */
  fineStepPerThermalWidth: 1 / 3,
  /** Gaussian kernels are cut at this many standard deviations. */
  kernelReachSigma: 8,
  /**
   * Most points of the fine bias grid (and of any kernel) a simulation may need: 2·10⁷ points
   * (160 MB per array). A scenario needing more is refused before anything is allocated.
   */
  maxFinePoints: 20_000_000,
  /** Most multiply-adds of the convolutions (points × kernel taps): 2·10⁹, a few seconds. */
  maxKernelWork: 2_000_000_000,
});

/**
 * Refuses a simulation whose fine grid or kernels would not fit (a temperature or broadening far
 * below the bias step, a lock-in amplitude far above it), before anything is allocated.
 */
function checkSimulationSize(scenario: Scenario, method: "exact" | "fast", wantConductance: boolean, n: number): void {
  const stepV = scenario.bias.stepV;
  const broadeningV = scenario.broadeningEV / scenario.eta;
  const lockInPeakV = Math.SQRT2 * scenario.lockInVrms;
  let finePoints: number;
  let work: number;
  let why: string;
  if (method === "exact") {
    const kT = BOLTZMANN_EV_PER_K * scenario.temperatureK;
    const target = Math.min((SIMULATE_DEFAULTS.fineStepPerThermalWidth * kT) / scenario.eta, broadeningV > 0 ? broadeningV / 4 : Infinity);
    const h = stepV / Math.max(1, Math.ceil(stepV / target));
    const gauss = broadeningV > 0 ? 2 * Math.ceil((SIMULATE_DEFAULTS.kernelReachSigma * broadeningV) / h) + 1 : 1;
    const lock = lockInPeakV > 0 ? 2 * Math.floor(lockInPeakV / h) + 1 : 0;
    const derivative = wantConductance ? (lock ? gauss + lock - 1 : gauss) + 2 : 1;
    finePoints = (n - 1) * (stepV / h) + 2 * Math.max(gauss, derivative, lock);
    work = n * (gauss + derivative) + gauss * lock;
    why = `the exact method's fine grid (step ${h.toPrecision(3)} V, a third of kB·T/(e·η) at temperatureK ${scenario.temperatureK} or a quarter of the broadening)`;
  } else {
    if (!(wantConductance && lockInPeakV > 0)) return;
    const h = stepV / Math.max(1, Math.ceil((8 * stepV) / lockInPeakV));
    const lock = 2 * Math.floor(lockInPeakV / h) + 1;
    finePoints = (n - 1) * (stepV / h) + lock;
    work = n * lock;
    why = `the lock-in kernel (lockInVrms ${scenario.lockInVrms} V on a grid of step ${h.toPrecision(3)} V)`;
  }
  if (!(finePoints <= SIMULATE_DEFAULTS.maxFinePoints && work <= SIMULATE_DEFAULTS.maxKernelWork)) {
    throw new DotspecError(
      "scenario/too-fine",
      `scenario needs ${Number(finePoints.toPrecision(3))} points for ${why} and ${Number(work.toPrecision(3))} kernel operations; ` +
        `at most ${SIMULATE_DEFAULTS.maxFinePoints} points and ${SIMULATE_DEFAULTS.maxKernelWork} operations are allowed: ` +
        (method === "exact" ? "raise temperatureK or broadeningEV, narrow the bias range, or use the fast method" : "lower lockInVrms or narrow the bias range"),
    );
  }
}

/**
 * The dot model of a scenario: its levels and junction, without the sweep, broadening, lock-in
 * and noise.
 *
 * Parameters
 * ----------
 * s : Scenario
 *     A complete scenario ({@link parseScenario}).
 *
 * Returns
 * -------
 * DotModel
 *     cb, vb, chargingEnergyEV (eV), eta, tipRatePerS, substrateRatePerS, relaxationRatePerS
 *     (1/s), temperatureK (K), shared with the scenario (not copied).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. A field-by-field selection; nothing is computed.
 *
 * Example
 * -------
 * ```ts
 * const s = parseScenario({ cb: [{ energyEV: 0.5, degeneracy: 2 }], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, temperatureK: 4.5, bias: { fromV: -1, toV: 1.5, stepV: 0.005 } });
 * scenarioModel(s).relaxationRatePerS; // => 1e12 (1/s)
 * ```
 */
export function scenarioModel(s: Scenario): DotModel {
  return {
    cb: s.cb,
    vb: s.vb,
    chargingEnergyEV: s.chargingEnergyEV,
    eta: s.eta,
    tipRatePerS: s.tipRatePerS,
    substrateRatePerS: s.substrateRatePerS,
    relaxationRatePerS: s.relaxationRatePerS,
    temperatureK: s.temperatureK,
  };
}

/**
 * Semicircle kernel of first-harmonic lock-in detection, sampled: the measured dI/dV is the true
 * dI/dV convolved with it.
 *
 * Parameters
 * ----------
 * peakV : number
 *     Modulation amplitude (peak, √2 × rms) in V.
 * stepV : number
 *     Grid step in V.
 *
 * Returns
 * -------
 * Float64Array
 *     2·⌊peakV/stepV⌋ + 1 weights, centred, summing to 1; [1] when the amplitude is below one step.
 *
 * Throws
 * ------
 * Nothing: the caller passes a validated amplitude and step.
 *
 * Notes
 * -----
 * 1. w(v) = (2/(π·Vp²))·√(Vp² − v²) for |v| ≤ Vp, sampled at v = i·h, |i| ≤ ⌊Vp/h⌋. Its FWHM is
 *    √3·Vp.
 * 2. Normalised to unit sum on the grid.
 *
 * References
 * ----------
 * J. Klein, A. Léger, M. Belin, D. Défourneau and M. J. L. Sangster, "Inelastic-electron-tunneling
 * spectroscopy of metal-insulator-metal junctions", Phys. Rev. B 7, 2336 (1973) (the lock-in
 * broadening function).
 *
 * Example
 * -------
 * ```ts
 * lockInKernel(0.002, 0.001); // => [0, 0.317, 0.366, 0.317, 0] (√(1 − (i/2)²), normalised)
 * ```
 */
export function lockInKernel(peakV: number, stepV: number): Float64Array {
  const half = Math.floor(peakV / stepV);
  const k = new Float64Array(2 * half + 1);
  let sum = 0;
  for (let i = -half; i <= half; i++) {
    const v = i * stepV;
    const w = Math.sqrt(Math.max(peakV * peakV - v * v, 0));
    k[i + half] = w;
    sum += w;
  }
  if (sum === 0) return Float64Array.of(1);
  for (let i = 0; i < k.length; i++) k[i] /= sum;
  return k;
}

/** Gaussian kernel of standard deviation sigma (in steps), cut at ±reach σ, unit sum. */
function gaussianKernel(sigmaSteps: number, reachSigma: number): Float64Array {
  const half = Math.max(1, Math.ceil(reachSigma * sigmaSteps));
  const k = new Float64Array(2 * half + 1);
  let sum = 0;
  for (let i = -half; i <= half; i++) {
    const w = Math.exp((-0.5 * i * i) / (sigmaSteps * sigmaSteps));
    k[i + half] = w;
    sum += w;
  }
  for (let i = 0; i < k.length; i++) k[i] /= sum;
  return k;
}

/** Full discrete convolution of two odd-length kernels (an odd-length kernel). */
function convolveKernels(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length - 1);
  for (let i = 0; i < a.length; i++) for (let j = 0; j < b.length; j++) out[i + j] += a[i] * b[j];
  return out;
}

/**
 * Correlation kernel that gives the central difference (y⊗k)[i+1] − (y⊗k)[i−1] over 2h of a
 * symmetric kernel k: d[o] = (k[o−1] − k[o+1])/(2h), one tap longer on each side.
 */
function differenceKernel(k: Float64Array, stepV: number): Float64Array {
  const d = new Float64Array(k.length + 2);
  const at = (o: number) => (o >= 0 && o < k.length ? k[o] : 0);
  for (let o = 0; o < d.length; o++) d[o] = (at(o - 2) - at(o)) / (2 * stepV);
  return d;
}

/** (y ⊗ kernel) at index i, with the kernel centred on i; the caller keeps i away from the ends. */
function convolveAt(y: Float64Array, kernel: Float64Array, i: number): number {
  const half = (kernel.length - 1) >> 1;
  let s = 0;
  for (let j = 0; j < kernel.length; j++) s += kernel[j] * y[i - half + j];
  return s;
}

/**
 * Simulates one curve of a scenario: the current and its dI/dV, with noise if the scenario asks
 * for it, and the noise-free signals.
 *
 * Parameters
 * ----------
 * input : Scenario | unknown
 *     A scenario (validated with {@link parseScenario} if not already).
 * options : SimulateOptions, optional
 *     method ("exact" or "fast", default "exact"); conductance (also compute dI/dV, default
 *     true). Defaults in {@link SIMULATE_DEFAULTS}.
 *
 * Returns
 * -------
 * SimulatedCurve
 *     Bias (V), current (A), dI/dV (S, or null), the noise-free current and dI/dV, and a record
 *     (method, fine grid step, broadening and lock-in amplitude in V, noise σ, the scenario).
 *
 * Throws
 * ------
 * DotspecError
 *     `scenario/…` or `options/…` for an invalid scenario (see {@link parseScenario});
 *     `scenario/too-fine` when the fine grid or the kernels would exceed
 *     SIMULATE_DEFAULTS.maxFinePoints (2·10⁷ points) or maxKernelWork (2·10⁹ operations).
 *
 * Notes
 * -----
 * 0. The sizes of the fine grid and kernels are computed first (closed form); a scenario over
 *    the limits is refused before anything is allocated.
 * Exact method:
 * 1. A fine grid of step h ≤ kB·T/(3·e·η) (and ≤ σ/4 of the broadening), aligned with the output
 *    points and extended by the kernel reach beyond the bias range.
 * 2. The exact current (both bands, {@link exactCurrent}) at every fine point.
 * 3. Level broadening: I ⊗ Gaussian of σ = broadeningEV/η (in bias), cut at
 *    SIMULATE_DEFAULTS.kernelReachSigma (8) σ.
 * 4. dI/dV: central difference on the fine grid, then ⊗ the lock-in semicircle kernel when
 *    lockInVrms > 0 (peak amplitude √2·Vrms) — applied as one kernel to the raw current.
 * 5. Sample at the output points; add seeded Gaussian noise of σ = relative × full scale (the
 *    largest |value| of each signal).
 * Fast method: {@link fastCurrent} and {@link fastConductance} at the output points (the
 * conductance on a sub-grid convolved with the lock-in kernel when lockInVrms > 0), then step 5.
 *
 * References
 * ----------
 * C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991) (the master equation);
 * J. Klein et al., Phys. Rev. B 7, 2336 (1973) (the lock-in kernel).
 *
 * Example
 * -------
 * ```ts
 * const curve = simulateCurve({ cb: [{ energyEV: 0.5, degeneracy: 2 }], chargingEnergyEV: 0.1, eta: 0.8,
 *   tipRatePerS: 1e9, substrateRatePerS: 1e8, temperatureK: 4.5, bias: { fromV: 0, toV: 1.5, stepV: 0.005 } });
 * curve.biasV.length;  // => 301
 * curve.currentA[140]; // => 1.526e-11 (A at 0.7 V: e·Γsub·2r/(1 + 2r), r = 10)
 * curve.currentA[280]; // => 2.913e-11 (A at 1.4 V: e·Γsub·2r/(1 + r))
 * ```
 */
export function simulateCurve(input: Scenario | unknown, options: SimulateOptions = {}): SimulatedCurve {
  const scenario = parseScenario(input);
  const method = options.method ?? SIMULATE_DEFAULTS.method;
  const wantConductance = options.conductance ?? SIMULATE_DEFAULTS.conductance;
  const model = scenarioModel(scenario);
  const ladders = bandLadders(model);
  checkSimulationSize(scenario, method, wantConductance, Math.floor((scenario.bias.toV - scenario.bias.fromV) / scenario.bias.stepV + 1e-9) + 1);
  const biasV = biasAxis(scenario.bias);
  const n = biasV.length;
  const stepV = scenario.bias.stepV;
  const broadeningV = scenario.broadeningEV / scenario.eta;
  const lockInPeakV = Math.SQRT2 * scenario.lockInVrms;

  let cleanCurrentA: Float64Array;
  let cleanDidvS: Float64Array | null = null;
  let fineStepV: number | null = null;

  if (method === "fast") {
    const steps = currentSteps(model, ladders);
    cleanCurrentA = fastCurrent(steps, biasV, broadeningV);
    if (wantConductance) {
      if (lockInPeakV > 0) {
        // Analytic dI/dV on a sub-grid fine enough for the semicircle kernel, then the kernel.
        const sub = Math.max(1, Math.ceil((8 * stepV) / lockInPeakV));
        const h = stepV / sub;
        const kernel = lockInKernel(lockInPeakV, h);
        const half = (kernel.length - 1) >> 1;
        const grid = new Float64Array((n - 1) * sub + 1 + 2 * half);
        for (let i = 0; i < grid.length; i++) grid[i] = biasV[0] + (i - half) * h;
        const deriv = fastConductance(steps, grid, broadeningV);
        cleanDidvS = new Float64Array(n);
        for (let i = 0; i < n; i++) cleanDidvS[i] = convolveAt(deriv, kernel, i * sub + half);
      } else cleanDidvS = fastConductance(steps, biasV, broadeningV);
    }
  } else {
    const kT = BOLTZMANN_EV_PER_K * scenario.temperatureK;
    const target = Math.min((SIMULATE_DEFAULTS.fineStepPerThermalWidth * kT) / scenario.eta, broadeningV > 0 ? broadeningV / 4 : Infinity);
    const sub = Math.max(1, Math.ceil(stepV / target));
    const h = stepV / sub;
    fineStepV = h;
    const gauss = broadeningV > 0 ? gaussianKernel(broadeningV / h, SIMULATE_DEFAULTS.kernelReachSigma) : Float64Array.of(1);
    // dI/dV kernel: central difference of (Gaussian ⊗ lock-in semicircle), applied to the raw current.
    const derivative = wantConductance
      ? differenceKernel(lockInPeakV > 0 ? convolveKernels(gauss, lockInKernel(lockInPeakV, h)) : gauss, h)
      : Float64Array.of(0);
    const pad = (Math.max(gauss.length, derivative.length) - 1) / 2 + 1;
    const fineN = (n - 1) * sub + 1 + 2 * pad;
    const fine = new Float64Array(fineN);
    for (let i = 0; i < fineN; i++) fine[i] = biasV[0] + (i - pad) * h;
    const raw = exactCurrent(model, fine, ladders);
    const at = (i: number) => i * sub + pad; // fine index of output point i
    cleanCurrentA = new Float64Array(n);
    for (let i = 0; i < n; i++) cleanCurrentA[i] = convolveAt(raw, gauss, at(i));
    if (wantConductance) {
      cleanDidvS = new Float64Array(n);
      for (let i = 0; i < n; i++) cleanDidvS[i] = convolveAt(raw, derivative, at(i));
    }
  }

  let currentA = cleanCurrentA;
  let didvS = cleanDidvS;
  let noiseCurrentA = 0;
  let noiseConductanceS = 0;
  if (scenario.noise && scenario.noise.relative > 0) {
    const rng = seededRandom(scenario.noise.seed ?? 1);
    noiseCurrentA = scenario.noise.relative * maxAbs(cleanCurrentA);
    currentA = cleanCurrentA.map((v) => v + noiseCurrentA * rng.normal());
    if (cleanDidvS) {
      noiseConductanceS = scenario.noise.relative * maxAbs(cleanDidvS);
      didvS = cleanDidvS.map((v) => v + noiseConductanceS * rng.normal());
    }
  }
  return {
    biasV,
    currentA,
    didvS,
    cleanCurrentA,
    cleanDidvS,
    record: { method, fineStepV, broadeningV, lockInPeakV, noiseCurrentA, noiseConductanceS, scenario },
  };
}

function maxAbs(a: Float64Array): number {
  let m = 0;
  for (const v of a) m = Math.max(m, Math.abs(v));
  return m;
}
