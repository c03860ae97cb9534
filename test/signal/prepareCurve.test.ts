// prepareCurve: the window-independent half of the signal stage. Expected values are closed forms
// of the constructed curves (a gap of zero current between ±1 V, linear beyond) and the project's
// sign convention (README, Conventions: the current has the sign of the sample bias).
import { describe, it, expect } from "vitest";
import { prepareCurve, PREPARE_CURVE_DEFAULTS } from "../../lib/signal/prepareCurve.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { expectError } from "../helpers/errors.ts";

const biasV = Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002);
const gapCurve = (sign: 1 | -1, offsetA = 0, noiseA = 1e-12) => {
  const rng = seededRandom(5);
  const currentA = biasV.map((v) => sign * (Math.abs(v) < 1 ? 0 : 1e-9 * (v - Math.sign(v))) + offsetA + noiseA * rng.normal());
  return { biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "t", metadata: {} } };
};

describe("prepareCurve(curve)", () => {
  it("PREPARE_CURVE_DEFAULTS are locked", () => {
    expect(PREPARE_CURVE_DEFAULTS).toEqual({
      offset: "gap",
      offsetNoiseMultiple: 4,
      offsetRunSamples: 3,
      offsetFloorFraction: 1e-6,
      offsetMinSamples: 5,
      uniformStepTolerance: 0.01,
      signCheckSigma: 4,
      oppositeSignFraction: 0.8,
      maxMagnitude: 1e60,
      maxBiasV: 1e6,
      maxPoints: 20000,
    });
    expect(Object.isFrozen(PREPARE_CURVE_DEFAULTS)).toBe(true);
  });

  it("never puts the current noise below resolution/√12 (closed form: σ of a uniform rounding error of width q; Widrow & Kollár, Quantization Noise, Cambridge UP 2008, from memory)", () => {
    const biasV = Float64Array.from({ length: 501 }, (_, i) => -1 + 0.004 * i);
    const currentA = biasV.map((v) => 1e-9 * v * v * v); // a cubic: third differences constant, so MAD = 0
    const base = { biasV, currentA, sweeps: [currentA], didvS: null };
    const without = prepareCurve({ ...base, meta: { source: "t", metadata: {} } });
    expect(without.noiseCurrentBound).toBe("third-differences");
    expect(without.noiseCurrentFloorA).toBeNull();
    const q = 1e-15;
    const withQ = prepareCurve({ ...base, meta: { source: "t", metadata: {}, currentResolutionA: q } });
    expect(withQ.noiseCurrentBound).toBe("resolution");
    expectClose(withQ.noiseCurrentA, q / Math.sqrt(12), { rtol: 1e-12, what: "floor" });
    expectClose(withQ.noiseCurrentFloorA!, q / Math.sqrt(12), { rtol: 1e-12, what: "floor" });
    expect(withQ.noiseCurrentEstimateA).toBe(without.noiseCurrentA);
  });

  it("keeps the third-difference estimate when the noise is above the floor (noise 100 × q)", () => {
    const rng = seededRandom(11);
    const biasV = Float64Array.from({ length: 2001 }, (_, i) => -1 + 0.001 * i);
    const currentA = biasV.map(() => 1e-13 * rng.normal());
    const p = prepareCurve({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "t", metadata: {}, currentResolutionA: 1e-15 } });
    expect(p.noiseCurrentBound).toBe("third-differences");
    // the white-noise σ put in, 1e-13 A, within the estimator's scatter at 2,000 points (common practice, no source)
    expectClose(p.noiseCurrentA, 1e-13, { rtol: 0.1, what: "σ_I" });
  });

  it("refuses currents beyond ±1e60 A and biases beyond ±1e6 V with signal/out-of-range", () => {
    const biasV = Float64Array.of(-1, 0, 1, 2, 3);
    const big = Float64Array.of(0, 0, 1e61, 0, 0);
    expectError(() => prepareCurve({ biasV, currentA: big, sweeps: [big], didvS: null, meta: { source: "t", metadata: {} } }), "signal/out-of-range", "currentA", "1e+61", "index 2");
    const zeros = new Float64Array(5);
    expectError(
      () => prepareCurve({ biasV: Float64Array.of(-2e6, 0, 1, 2, 3), currentA: zeros, sweeps: [zeros], didvS: null, meta: { source: "t", metadata: {} } }),
      "signal/out-of-range",
      "biasV",
      "-2000000",
    );
  });

  it("removes the offset of the zero-current region (closed form: the constructed 5 pA)", () => {
    const p = prepareCurve(gapCurve(1, 5e-12));
    expectClose(p.offsetA, 5e-12, { atol: 1e-12, what: "offset" });
    expectClose(p.offsetRegionV!, [-1, 1], { atol: 0.01, what: "zero-current region" });
    expect(p.currentSignFlipped).toBe(false);
  });

  it("flips a current recorded with the sign opposite to the bias, with a warning, and keeps the file's offset", () => {
    const right = prepareCurve(gapCurve(1, 0));
    const wrong = prepareCurve(gapCurve(-1, 5e-12));
    expect(wrong.currentSignFlipped).toBe(true);
    expect(wrong.warnings.join(" ")).toMatch(/opposite to the bias/);
    expectClose(wrong.offsetA, 5e-12, { atol: 1e-12, what: "offset as recorded" });
    // Away from the gap the flipped current is the constructed 1 nS line, like the right one.
    expectClose(wrong.currentA[2000], 1e-9, { rtol: 0.01, what: "I(2 V)" });
    expectClose(right.currentA[2000], 1e-9, { rtol: 0.01, what: "I(2 V), unflipped" });
    expect(Array.from(wrong.sweepsA[0]).slice(1990).every((v) => v > 0)).toBe(true);
  });

  it("leaves a noise-only curve alone (no points above 4σ decide anything)", () => {
    const rng = seededRandom(9);
    const currentA = biasV.map(() => 1e-12 * rng.normal());
    const p = prepareCurve({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "t", metadata: {} } });
    expect(p.currentSignFlipped).toBe(false);
  });
});
