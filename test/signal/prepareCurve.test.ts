// prepareCurve: the window-independent half of the signal stage. Expected values are closed forms
// of the constructed curves (a gap of zero current between ±1 V, linear beyond) and the project's
// sign convention (README, Conventions: the current has the sign of the sample bias).
import { describe, it, expect } from "vitest";
import { prepareCurve, PREPARE_CURVE_DEFAULTS } from "../../lib/signal/prepareCurve.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { expectClose } from "../helpers/expectClose.ts";

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
    });
    expect(Object.isFrozen(PREPARE_CURVE_DEFAULTS)).toBe(true);
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
