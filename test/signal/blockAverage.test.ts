// Block averages of oversampled curves. Expected values: closed forms (the block mean of a
// straight line is its value at the block's centre; the mean of b independent samples has
// σ/√b), and, for the whole analysis, the same model curve sampled at the benchmark's step
// (derived: the analysis of the 2,100-point curve is the reference for the 105,000-point one).
import { describe, it, expect } from "vitest";
import { blockAverageUnchecked } from "../../lib/signal/blockAverage.ts";
import { prepareCurve, PREPARE_CURVE_DEFAULTS } from "../../lib/signal/prepareCurve.ts";
import { whiteNoiseSigmaUnchecked } from "../../lib/signal/noise.ts";
import { analyzeCurve } from "../../lib/pipeline/analyzeCurve.ts";
import { simulateCurve } from "../../lib/model/simulate.ts";
import { seededRandom } from "../../lib/util/random.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { BENCH_SCENARIO } from "../fixtures/exampleScenario.ts";

const curveOf = (biasV: Float64Array, currentA: Float64Array) => ({ biasV, currentA, sweeps: [currentA], didvS: null, meta: { source: "t", metadata: {} } });

describe("blockAverageUnchecked(biasV, series, b)", () => {
  it("puts a straight line's block means at the blocks' centres and drops the incomplete last block (closed form)", () => {
    const x = Float64Array.from({ length: 23 }, (_, i) => -1 + 0.1 * i);
    const r = blockAverageUnchecked(x, [x.map((v) => 3 * v - 2)], 5);
    expect(r.biasV.length).toBe(4); // 23 = 4·5 + 3
    expectClose(r.biasV, [-0.8, -0.3, 0.2, 0.7], { rtol: 1e-12, atol: 1e-12 });
    expectClose(r.series[0], [-4.4, -2.9, -1.4, 0.1], { rtol: 1e-12, atol: 1e-12 });
  });

  it("divides white noise by √b (closed form: σ of the mean of b independent samples)", () => {
    const rng = seededRandom(41);
    const n = 400000;
    const y = Float64Array.from({ length: n }, () => rng.normal());
    const x = Float64Array.from({ length: n }, (_, i) => i);
    for (const b of [4, 25]) {
      const sigma = whiteNoiseSigmaUnchecked(blockAverageUnchecked(x, [y], b).series[0], 3);
      expectClose(sigma, 1 / Math.sqrt(b), { rtol: 0.05, what: `b = ${b}` });
    }
  });
});

describe("prepareCurve on an oversampled curve", () => {
  it("averages a curve of more than maxPoints points in blocks, with a warning, and keeps at most maxPoints", () => {
    const n = 3 * PREPARE_CURVE_DEFAULTS.maxPoints + 7;
    const biasV = Float64Array.from({ length: n }, (_, i) => -2 + (4 * i) / (n - 1));
    const p = prepareCurve(curveOf(biasV, biasV.map((v) => (Math.abs(v) < 1 ? 0 : 1e-9 * (v - Math.sign(v))))));
    expect(p.blockSamples).toBe(4);
    expect(p.biasV.length).toBeLessThanOrEqual(PREPARE_CURVE_DEFAULTS.maxPoints);
    expectClose(p.stepV, (4 * 4) / (n - 1), { rtol: 1e-9 });
    expect(p.warnings.some((w) => w.includes("averaged in blocks of 4"))).toBe(true);
    const small = prepareCurve(curveOf(Float64Array.from({ length: 2001 }, (_, i) => -2 + i * 0.002), new Float64Array(2001)));
    expect(small.blockSamples).toBe(1);
  });

  it("finds the same levels in a model curve sampled 50 times more finely (derived: the benchmark-step analysis)", () => {
    const coarse = simulateCurve(BENCH_SCENARIO, { method: "fast" });
    const fine = simulateCurve({ ...BENCH_SCENARIO, bias: { ...BENCH_SCENARIO.bias, stepV: BENCH_SCENARIO.bias.stepV / 50 } }, { method: "fast" });
    const a = analyzeCurve(curveOf(coarse.biasV, coarse.currentA), { eta: BENCH_SCENARIO.eta });
    const b = analyzeCurve(curveOf(fine.biasV, fine.currentA), { eta: BENCH_SCENARIO.eta });
    expect(b.conductance.record.warnings.some((w) => w.includes("averaged in blocks"))).toBe(true);
    expect(b.assignment.regime).toBe(a.assignment.regime);
    expect(b.assignment.multiplets.map((m) => m.peakIndices.length)).toEqual(a.assignment.multiplets.map((m) => m.peakIndices.length));
    const qa = a.assignment.quantities, qb = b.assignment.quantities;
    expectClose(qb.gapV!, qa.gapV!, { atol: 0.003, what: "gap" });
    expectClose(qb.chargingEnergyV!, qa.chargingEnergyV!, { atol: 0.003, what: "Ec" });
  });
});
