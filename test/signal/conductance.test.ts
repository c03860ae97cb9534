import { std as mathStd } from "mathjs";
import { describe, expect, it } from "vitest";
import type { Curve } from "../../lib/curve.ts";
import { CONDUCTANCE_DEFAULTS, conductance, conductanceFromPrepared } from "../../lib/signal/conductance.ts";
import { prepareCurve } from "../../lib/signal/prepareCurve.ts";
import { savitzkyGolay, savitzkyGolayNoiseGain } from "../../lib/signal/savitzkyGolay.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { erfStep, erfStepDerivative, peakShape, uniformBias } from "./fixtures/curves.ts";
import { whiteNoise } from "./fixtures/random.ts";
import { filteredPeak } from "./fixtures/windowFactors.ts";
import { expectError } from "../helpers/errors.ts";


function makeCurve(biasV: Float64Array, sweeps: Float64Array[], didvS: Float64Array | null = null): Curve {
  const currentA = new Float64Array(biasV.length);
  for (const s of sweeps) for (let i = 0; i < s.length; i++) currentA[i] += s[i] / sweeps.length;
  return { biasV, currentA, sweeps, didvS, meta: { source: "test", metadata: {} } };
}

// The test spectrum: 2,001 points from −2 V at 2 mV; a current step of 100 pA at +0.8 V (CB edge)
// and of −100 pA at −1.0 V (VB edge), both 40 mV FWHM, so dI/dV has two Gaussian peaks of height
// 100 pA/(s√(2π)) (closed form); a 3 pA current offset; zero current in between.
const STEP_V = 0.002;
const BIAS = uniformBias(2001, -2, STEP_V);
const FWHM_V = 0.04;
const STEP_A = 1e-10;
const OFFSET_A = 3e-12;
const CB_INDEX = 1400; // BIAS[1400] = 0.8 V
const VB_INDEX = 500; // BIAS[500] = −1.0 V
const cleanCurrent = (v: number): number => erfStep(v, 0.8, FWHM_V, STEP_A) - erfStep(-v, 1.0, FWHM_V, STEP_A) + OFFSET_A;
const cleanDidv = (v: number): number => erfStepDerivative(v, 0.8, FWHM_V, STEP_A) + erfStepDerivative(v, -1.0, FWHM_V, STEP_A);
const CLEAN = Float64Array.from(BIAS, cleanCurrent);
const PEAK_S = erfStepDerivative(0.8, 0.8, FWHM_V, STEP_A);

/** Four sweeps with independent white noise of σ per sweep (seeds 21–24). */
function noisySweeps(sigmaA: number, count = 4, seed = 21): Float64Array[] {
  return Array.from({ length: count }, (_, k) => {
    const noise = whiteNoise(BIAS.length, sigmaA, seed + k);
    return CLEAN.map((x, i) => x + noise[i]);
  });
}

describe("CONDUCTANCE_DEFAULTS", () => {
  it("are locked", () => {
    expect(JSON.parse(JSON.stringify(CONDUCTANCE_DEFAULTS))).toEqual({
      windowMV: "auto",
      order: 3,
      peakWidthMV: 40,
      useMeasured: false,
      sweeps: true,
      offset: "gap",
      windowFraction: { 1: 0.55, 2: 0.55, 3: 1.35, 4: 1.35, 5: 2.25 },
      noiseTargetFraction: 0.01,
      offsetNoiseMultiple: 4,
      offsetRunSamples: 3,
      offsetFloorFraction: 1e-6,
      offsetMinSamples: 5,
      uniformStepTolerance: 0.01,
      sweepNoiseWarnRatio: 1.5,
    });
  });

  it("window factors f_p keep a Gaussian peak within 5 % in height and FWHM, and are close to the widest that do", () => {
    // Closed form: the filtered derivative of an erf step against the true Gaussian
    // (test/signal/fixtures/windowFactors.ts). Criterion: height ≥ 95 %, FWHM ≤ 105 %.
    for (const order of [2, 3, 5]) {
      const f = CONDUCTANCE_DEFAULTS.windowFraction[order];
      for (const fwhmSamples of [20, 50, 200]) {
        const odd = (x: number): number => (Math.floor(x) % 2 === 1 ? Math.floor(x) : Math.floor(x) - 1);
        const at = filteredPeak(odd(f * fwhmSamples), order, fwhmSamples);
        expect(at.height, `order ${order}, W ${fwhmSamples} samples: height`).toBeGreaterThanOrEqual(0.95);
        expect(at.fwhm, `order ${order}, W ${fwhmSamples} samples: FWHM`).toBeLessThanOrEqual(1.05);
        if (fwhmSamples === 200) {
          const wider = filteredPeak(odd((f + 0.1) * fwhmSamples), order, fwhmSamples);
          expect(wider.height < 0.95 || wider.fwhm > 1.05, `order ${order}: f_p + 0.1 breaks the criterion`).toBe(true);
        }
      }
    }
  });
});

describe("conductance(curve, options) on a noise-free erf-step spectrum", () => {
  const result = conductance(makeCurve(BIAS, [CLEAN]));

  it("chooses the smallest window (the noise target is met at once)", () => {
    expect(result.record.windowSamples).toBe(5);
    expect(result.record.automaticWindow).toBe(true);
    expect(result.record.windowReason).toContain("is met at 5 samples");
  });

  it("gives the closed-form dI/dV: Gaussian peaks at the step centres with the closed-form height and FWHM", () => {
    // Closed form: d/dV of A/2·(1 + erf((V − V₀)/(s√2))) = A/(s√(2π))·exp(−(V − V₀)²/(2s²)).
    // Tolerances: a 5-sample cubic filter on a 20-sample FWHM peak changes the height by ≈ 2e-5
    // (fixture windowFactors.ts, filteredPeak(5, 3, 20)); the half-maximum crossings are interpolated
    // linearly on a 2 mV grid (≈ 3e-5 of the FWHM here). Allowed: 2e-4 and 5e-4.
    const cb = peakShape(result.biasV, result.didvS, 1300, 1500);
    expect(cb.index).toBe(CB_INDEX);
    expectClose(cb.height, PEAK_S, { rtol: 2e-4, what: "CB peak height" });
    expectClose(cb.fwhm, FWHM_V, { rtol: 5e-4, what: "CB peak FWHM" });
    const vb = peakShape(result.biasV, result.didvS, 400, 600);
    expect(vb.index).toBe(VB_INDEX);
    expectClose(vb.height, PEAK_S, { rtol: 2e-4, what: "VB peak height" });
    // Everywhere, including the ends (asymmetric fits):
    expectClose(result.didvS, Array.from(BIAS, cleanDidv), { atol: 5e-4 * PEAK_S, what: "dI/dV vs closed form" });
  });

  it("removes the 3 pA offset (the current is exactly zero in the gap)", () => {
    expectClose(result.record.offsetA, OFFSET_A, { rtol: 1e-9, what: "known offset" });
    expectClose(result.currentA, Array.from(CLEAN, (x) => x - OFFSET_A), { rtol: 1e-12, atol: 1e-24 });
    const [lo, hi] = result.record.offsetRegionV!;
    expect(lo).toBeLessThan(-0.85);
    expect(lo).toBeGreaterThan(-1.0);
    expect(hi).toBeGreaterThan(0.65);
    expect(hi).toBeLessThan(0.8);
  });

  it("fills the record", () => {
    const r = result.record;
    expect(r.windowMV).toBeCloseTo(5 * STEP_V * 1e3, 12);
    expect(r.order).toBe(3);
    expect(r.usedMeasured).toBe(false);
    expect(r.resampled).toBe(false);
    expect(r.warnings).toEqual([]);
    expect(r.noiseConductanceSweepsS).toBeNull();
    expect(result.didvSweepsS).toEqual([]);
    expect(result.didvSpreadS).toBeNull();
    expectClose(result.stepV, STEP_V, { rtol: 1e-12 });
    expect(result.currentSmoothA.length).toBe(2001);
    expectClose(result.currentSmoothA, result.currentA, { atol: 1e-3 * STEP_A, what: "smoothed current" });
  });

  it("at the widest window that resolves 40 mV peaks (f_3·W = 54 mV) loses < 5 % in height and FWHM", () => {
    // The rule behind the automatic window; closed-form reference peak.
    const wide = conductance(makeCurve(BIAS, [CLEAN]), { windowMV: 54 });
    expect(wide.record.windowSamples).toBe(27);
    const cb = peakShape(wide.biasV, wide.didvS, 1300, 1500);
    expect(cb.index).toBe(CB_INDEX);
    expect(cb.height / PEAK_S).toBeGreaterThan(0.95);
    expect(cb.height / PEAK_S).toBeLessThan(1);
    expect(cb.fwhm / FWHM_V).toBeLessThan(1.05);
  });
});

describe("conductance(curve) on noisy sweeps", () => {
  const sigmaSweepA = 4e-13;
  const sweeps = noisySweeps(sigmaSweepA);
  const curve = makeCurve(BIAS, sweeps);
  const result = conductance(curve);

  it("uses the widest window that resolves the peaks: oddFloor(1.35 × 40 mV / 2 mV) = 27 samples", () => {
    expect(result.record.windowSamples).toBe(27);
    expect(result.record.windowReason).toContain("not met");
    expect(result.record.warnings).toEqual([]);
  });

  it("estimates the current noise σ/√4 of the mean of 4 sweeps", () => {
    // Closed form: the mean of 4 independent sweeps has σ/2.
    expectClose(result.record.noiseCurrentA, sigmaSweepA / 2, { rtol: 0.06 });
  });

  it("reports σ_G = σ_I·gain/stepV, and the filtered noise has that standard deviation", () => {
    const r = result.record;
    expectClose(r.noiseConductanceS, (r.noiseCurrentA * savitzkyGolayNoiseGain(27, 3, 1)) / STEP_V, { rtol: 1e-12 });
    // Linearity: the noise part of dI/dV is the filter applied to the noise alone.
    const clean = conductance(makeCurve(BIAS, [CLEAN]), { windowMV: r.windowMV, offset: "none" });
    let ss = 0;
    let count = 0;
    for (let i = 13; i < 2001 - 13; i++) {
      ss += (result.didvS[i] - clean.didvS[i]) ** 2;
      count++;
    }
    // About 150 independent values over 2,000 correlated ones: ±6 % (1σ) scatter, 15 % allowed.
    expectClose(Math.sqrt(ss / count), r.noiseConductanceS, { rtol: 0.15, what: "empirical dI/dV noise" });
  });

  it("finds the peak at the closed-form position and height within the 5 % resolution loss and the noise", () => {
    const cb = peakShape(result.biasV, result.didvS, 1300, 1500);
    expect(Math.abs(result.biasV[cb.index] - 0.8)).toBeLessThanOrEqual(2 * STEP_V);
    const sigmaG = result.record.noiseConductanceS;
    expect(cb.height).toBeGreaterThan(0.95 * PEAK_S - 4 * sigmaG);
    expect(cb.height).toBeLessThan(PEAK_S + 4 * sigmaG);
    expect(cb.fwhm / FWHM_V).toBeLessThan(1.05 + 0.05); // 5 % rule plus noise on the crossings
  });

  it("recovers the offset within the noise of a median over the gap", () => {
    // σ_I = 0.2 pA; the median of ~800 samples scatters by ≈ 1.25·σ_I/√800 ≈ 0.01 pA.
    expectClose(result.record.offsetA, OFFSET_A, { atol: 0.05e-12, what: "known offset" });
  });

  it("differentiates each sweep with the same filter and reports their spread", () => {
    expect(result.didvSweepsS.length).toBe(4);
    const n = result.record.windowSamples;
    expectClose(result.didvSweepsS[2], savitzkyGolay(sweeps[2], { windowSamples: n, order: 3, derivative: 1, stepV: STEP_V }), {
      rtol: 1e-12,
      atol: 1e-22,
    });
    for (const i of [0, 700, 1400, 2000]) {
      const column = result.didvSweepsS.map((d) => d[i]);
      expectClose(result.didvSpreadS![i], mathStd(column) as unknown as number, { rtol: 1e-10, what: `spread at ${i} vs mathjs std` });
    }
    // White noise: the spread of the sweeps measures the same σ_G (within the scatter of both).
    expectClose(result.record.noiseConductanceSweepsS!, result.record.noiseConductanceS, { rtol: 0.15 });
  });

  it("warns when the sweeps differ by more than white noise (a tip change)", () => {
    const changed = sweeps.map((s, k) => (k === 3 ? s.map((x) => 1.3 * x) : s));
    const r = conductance(makeCurve(BIAS, changed));
    expect(r.record.warnings.join(" ")).toContain("sweeps differ more than white noise explains");
  });

  it("does not modify the curve", () => {
    const copy = sweeps.map((s) => s.slice());
    const currentCopy = curve.currentA.slice();
    conductance(curve);
    sweeps.forEach((s, k) => expect(Array.from(s)).toEqual(Array.from(copy[k])));
    expect(Array.from(curve.currentA)).toEqual(Array.from(currentCopy));
  });
});

describe("conductance(curve, options): options and special cases", () => {
  it("leaves the current alone with offset 'none'", () => {
    const r = conductance(makeCurve(BIAS, [CLEAN]), { offset: "none" });
    expect(r.record.offsetA).toBe(0);
    expect(r.record.offsetRegionV).toBeNull();
    expect(Array.from(r.currentA)).toEqual(Array.from(CLEAN));
  });

  it("of an ohmic curve: dI/dV = 1/R (closed form), offset from the current at 0 V, with a warning", () => {
    const biasV = uniformBias(2001, -2, 0.002);
    const currentA = biasV.map((v) => 1e-9 * v + 5e-12);
    const r = conductance(makeCurve(biasV, [currentA]));
    expectClose(r.didvS, new Float64Array(2001).fill(1e-9), { rtol: 1e-9 });
    expectClose(r.record.offsetA, 5e-12, { rtol: 1e-6 });
    expect(r.record.warnings.join(" ")).toContain("no zero-current region");
  });

  it("resamples a non-uniform bias axis (warning) and still differentiates a line exactly", () => {
    // Steps alternate 1.9 and 2.1 mV (5 % off): resampled onto the median-step grid.
    const biasV = Float64Array.from({ length: 1001 }, (_, i) => -1 + i * 0.002 + (i % 2 ? 0.0001 : 0));
    biasV[1000] = 1;
    const currentA = biasV.map((v) => 2e-9 * v);
    const r = conductance(makeCurve(biasV, [currentA, currentA.map((x) => x * 1)]), { offset: "none" });
    expect(r.record.resampled).toBe(true);
    expect(r.record.warnings.join(" ")).toContain("not uniform");
    expect(r.biasV[0]).toBe(-1);
    expect(r.biasV[r.biasV.length - 1]).toBe(1);
    expectClose(r.didvS, new Float64Array(r.biasV.length).fill(2e-9), { rtol: 1e-9, what: "dI/dV of 2 nS·V (closed form)" });
    expect(r.didvSweepsS.length).toBe(2);
  });

  it("uses the measured dI/dV when asked and present; warns when absent", () => {
    const measured = Float64Array.from(BIAS, cleanDidv);
    const r = conductance(makeCurve(BIAS, noisySweeps(4e-13, 2), measured), { useMeasured: true });
    expect(r.record.usedMeasured).toBe(true);
    // The automatic window keeps a Gaussian peak within 5 % of its height (the f_p criterion of CONDUCTANCE_DEFAULTS).
    expectClose(r.didvS, measured, { atol: 0.05 * Math.max(...measured), what: "smoothed measured dI/dV" });
    expect(r.didvSweepsS).toEqual([]);
    expect(r.didvSpreadS).toBeNull();
    const s = conductance(makeCurve(BIAS, [CLEAN]), { useMeasured: true });
    expect(s.record.usedMeasured).toBe(false);
    expect(s.record.warnings.join(" ")).toContain("no measured dI/dV");
  });

  it("rounds a given windowMV to the nearest odd number of steps", () => {
    const r = conductance(makeCurve(BIAS, [CLEAN]), { windowMV: 30 });
    expect(r.record.windowSamples).toBe(15);
    expect(r.record.automaticWindow).toBe(false);
    expect(r.record.windowReason).toContain("given");
    expect(conductance(makeCurve(BIAS, [CLEAN]), { windowMV: 31 }).record.windowSamples).toBe(15); // 15.5 steps
    expect(conductance(makeCurve(BIAS, [CLEAN]), { windowMV: 8 }).record.windowSamples).toBe(5);
  });

  it("rejects a windowMV below the minimum window, naming it in mV", () => {
    expectError(
      () => conductance(makeCurve(BIAS, [CLEAN]), { windowMV: 6 }),
      "signal/window-too-small",
      "windowMV must be at least 5 bias steps (10 mV here)",
      "got 6",
    );
    expectError(() => conductance(makeCurve(BIAS, [CLEAN]), { windowMV: 10, order: 5 }), "signal/window-too-small", "at least 7 bias steps");
  });

  it("rejects curves with too few points, saying the minimum", () => {
    const short = uniformBias(4, 0, 0.01);
    expectError(() => conductance(makeCurve(short, [new Float64Array(4)])), "signal/too-few-points", "at least 5 points", "got 4");
    const nine = uniformBias(9, -0.008, 0.002);
    expectError(
      () => conductance(makeCurve(nine, [nine.map((v) => v)]), { windowMV: 30 }),
      "signal/too-few-points",
      "at least 15 points",
      "got 9",
    );
  });

  it("limits the automatic window to the curve length, with a warning", () => {
    const nine = uniformBias(9, -0.008, 0.002);
    const noisy = whiteNoise(9, 1e-12, 3);
    const r = conductance(makeCurve(nine, [noisy]), { offset: "none" });
    expect(r.record.windowSamples).toBe(9);
    expect(r.record.warnings.join(" ")).toContain("limited to 9 samples");
  });

  it("raises the automatic window to the minimum for narrow peaks, with a warning", () => {
    const r = conductance(makeCurve(BIAS, noisySweeps(4e-13, 1)), { peakWidthMV: 5 });
    expect(r.record.windowSamples).toBe(5);
    expect(r.record.warnings.join(" ")).toContain("peakWidthMV 5 spans only 2.5 bias steps");
  });

  it("rejects unknown options and values of the wrong type", () => {
    const c = makeCurve(BIAS, [CLEAN]);
    expectError(() => conductance(c, { windowMs: 3 } as never), "options/unknown-key", "windowMs");
    expectError(() => conductance(c, { order: 6 }), "options/not-integer", "order");
    expectError(() => conductance(c, { windowMV: -1 }), "options/not-positive", "windowMV");
    expectError(() => conductance(c, { offset: "median" as never }), "options/not-allowed", "offset");
    expectError(() => conductance(c, { useMeasured: "yes" as never }), "options/not-boolean", "useMeasured");
  });

  it("rejects inconsistent curves", () => {
    const c = makeCurve(BIAS, [CLEAN]);
    expectError(() => conductance({ ...c, currentA: c.currentA.subarray(1) }), "signal/length-mismatch", "currentA");
    expectError(() => conductance({ ...c, sweeps: [] }), "signal/no-sweeps");
    const bad = c.currentA.slice();
    bad[7] = Number.NaN;
    expectError(() => conductance({ ...c, currentA: bad }), "signal/not-finite", "index 7");
    const reversed = c.biasV.slice().reverse();
    expectError(() => conductance({ ...c, biasV: reversed }), "signal/not-ascending");
  });
});

describe("conductanceFromPrepared(prepareCurve(curve), options)", () => {
  // Derived by construction: conductance() is defined as this composition, so one preparation
  // differentiated with several windows must give what conductance() gives for each.
  const curve = makeCurve(BIAS, [CLEAN, CLEAN.map((v) => v * 1.01)]);
  const prepared = prepareCurve(curve);
  for (const windowMV of [20, 54, "auto"] as const) {
    it(`equals conductance(curve, { windowMV: ${JSON.stringify(windowMV)} })`, () => {
      const a = conductanceFromPrepared(prepared, { windowMV });
      const b = conductance(curve, { windowMV });
      expect(Array.from(a.didvS)).toEqual(Array.from(b.didvS));
      expect(a.record).toEqual(b.record);
    });
  }
  it("does not modify the prepared curve and skips the sweeps when asked", () => {
    const before = Array.from(prepared.currentA);
    const r = conductanceFromPrepared(prepared, { windowMV: 20, sweeps: false });
    expect(r.didvSweepsS).toEqual([]);
    expect(r.didvSpreadS).toBeNull();
    expect(Array.from(prepared.currentA)).toEqual(before);
  });
});
