/**
 * Simulated I–V (and dI/dV) curves of a dot in a double-barrier junction.
 */
import { biasAxis, parseScenario, type Scenario } from "./scenario.ts";
import { bandLadders, exactCurrent, currentSteps, fastCurrent, fastConductance, type DotModel } from "./bandCurrent.ts";
import { BOLTZMANN_EV_PER_K } from "../util/constants.ts";
import { seededRandom } from "../util/random.ts";

/** Options of {@link simulateCurve}. */
export interface SimulateOptions {
  /**
   * "exact" (default): thermal master equation on a grid of step ≤ kB·T/(3·e·η), convolved with
   * the broadening and lock-in kernels — the reference. "fast": zero-temperature plateaus joined
   * by Gaussian-broadened steps ({@link fastCurrent}); accurate when the broadening is much wider
   * than kB·T, and about 100 times quicker.
   */
  method?: "exact" | "fast";
  /** Also compute dI/dV. Default true. */
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
  record: {
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
    scenario: Scenario;
  };
}

/** Tuning constants of the simulation, locked by a test. */
export const SIMULATE_DEFAULTS = Object.freeze({
  method: "exact" as const,
  /** Compute dI/dV as well as I. */
  conductance: true,
  /** Fine grid step as a fraction of kB·T/(e·η). */
  fineStepPerThermalWidth: 1 / 3,
  /** Gaussian kernels are cut at this many standard deviations. */
  kernelReachSigma: 8,
});

/** The dot model of a scenario. */
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
 * Semicircle kernel of first-harmonic lock-in detection, w(v) = (2/(π·Vp²))·√(Vp² − v²) for
 * |v| ≤ Vp: the measured dI/dV is the true dI/dV convolved with it. Its FWHM is √3·Vp.
 * Sampled on a grid of step h and normalised to unit sum.
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
 * Simulates one curve of a scenario.
 *
 * Notes (exact method):
 * 1. A fine grid of step h ≤ kB·T/(3·e·η), aligned with the output points and extended by the
 *    kernel reach beyond the bias range.
 * 2. The exact current (both bands, {@link exactCurrent}) at every fine point.
 * 3. Level broadening: I ⊗ Gaussian of σ = broadeningEV/η (in bias).
 * 4. dI/dV: central difference on the fine grid, then ⊗ the lock-in semicircle kernel when
 *    lockInVrms > 0 (peak amplitude √2·Vrms).
 * 5. Sample at the output points; add seeded Gaussian noise of σ = relative × full scale.
 *
 * @param input - a scenario (validated with {@link parseScenario} if not already).
 * @throws DotspecError for an invalid scenario.
 *
 * @example
 * const { biasV, currentA } = simulateCurve(scenario); // exact reference curve
 */
export function simulateCurve(input: Scenario | unknown, options: SimulateOptions = {}): SimulatedCurve {
  const scenario = parseScenario(input);
  const method = options.method ?? SIMULATE_DEFAULTS.method;
  const wantConductance = options.conductance ?? SIMULATE_DEFAULTS.conductance;
  const model = scenarioModel(scenario);
  const ladders = bandLadders(model);
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
