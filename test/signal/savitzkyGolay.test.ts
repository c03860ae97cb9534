import { execFileSync } from "node:child_process";
import sg from "ml-savitzky-golay";
import { describe, expect, it } from "vitest";
import {
  SAVITZKY_GOLAY_DEFAULTS,
  savitzkyGolay,
  savitzkyGolayNoiseGain,
  savitzkyGolaySmoothAndSlopeUnchecked,
  savitzkyGolayWeights,
} from "../../lib/signal/savitzkyGolay.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { whiteNoise } from "./fixtures/random.ts";
import { expectError } from "../helpers/errors.ts";

/** ml-savitzky-golay's default export called directly (CommonJS default-export trap handled here too). */
type Reference = typeof sg.default;
const reference: Reference = typeof sg === "function" ? (sg as unknown as Reference) : sg.default;

const SG_1964 = "Savitzky & Golay, Anal. Chem. 36, 1627 (1964), with Steinier, Termonia & Deltour, Anal. Chem. 44, 1906 (1972)";

function scaled(values: number[], norm: number): number[] {
  return values.map((v) => v / norm);
}


describe("savitzkyGolayWeights(windowSamples, order, derivative)", () => {
  it("smoothing weights equal the published tables", () => {
    const five = scaled([-3, 12, 17, 12, -3], 35); // SG_1964, quadratic/cubic, 5 points
    const seven = scaled([-2, 3, 6, 7, 6, 3, -2], 21); // SG_1964, quadratic/cubic, 7 points
    for (const order of [2, 3]) {
      expectClose(savitzkyGolayWeights(5, order, 0), five, { rtol: 1e-14, atol: 1e-15, what: `5 points order ${order}, ${SG_1964}` });
      expectClose(savitzkyGolayWeights(7, order, 0), seven, { rtol: 1e-14, atol: 1e-15, what: `7 points order ${order}, ${SG_1964}` });
    }
  });

  it("first-derivative weights equal the published tables", () => {
    const lin5 = scaled([-2, -1, 0, 1, 2], 10); // SG_1964, linear/quadratic, 5 points
    const lin7 = scaled([-3, -2, -1, 0, 1, 2, 3], 28); // SG_1964, linear/quadratic, 7 points
    const cub5 = scaled([1, -8, 0, 8, -1], 12); // SG_1964, cubic/quartic, 5 points
    const cub7 = scaled([22, -67, -58, 0, 58, 67, -22], 252); // SG_1964, cubic/quartic, 7 points
    const tol = { rtol: 1e-14, atol: 1e-15 };
    for (const order of [1, 2]) {
      expectClose(savitzkyGolayWeights(5, order, 1), lin5, { ...tol, what: `5 points order ${order}, ${SG_1964}` });
      expectClose(savitzkyGolayWeights(7, order, 1), lin7, { ...tol, what: `7 points order ${order}, ${SG_1964}` });
    }
    expectClose(savitzkyGolayWeights(5, 3, 1), cub5, { ...tol, what: `5 points cubic, ${SG_1964}` });
    for (const order of [3, 4]) {
      expectClose(savitzkyGolayWeights(7, order, 1), cub7, { ...tol, what: `7 points order ${order}, ${SG_1964}` });
    }
  });

  it("second-derivative weights, quadratic, 5 points: (2, −1, −2, −1, 2)/7", () => {
    // From memory (Savitzky & Golay 1964 table); also hard-coded in ml-savitzky-golay 5.0.0 src/index.ts.
    expectClose(savitzkyGolayWeights(5, 2, 2), scaled([2, -1, -2, -1, 2], 7), { rtol: 1e-14, atol: 1e-15 });
  });

  it("end-point weights, quadratic, 5 points, equal the tabulated asymmetric fits", () => {
    // From memory, not re-read: P. A. Gorry, Anal. Chem. 62, 570 (1990), Table I (5-point quadratic).
    const tol = { rtol: 1e-14, atol: 1e-15 };
    expectClose(savitzkyGolayWeights(5, 2, 0, 0), scaled([31, 9, -3, -5, 3], 35), { ...tol, what: "smoothing at the first point" });
    expectClose(savitzkyGolayWeights(5, 2, 0, 1), scaled([9, 13, 12, 6, -5], 35), { ...tol, what: "smoothing at the second point" });
    expectClose(savitzkyGolayWeights(5, 2, 1, 0), scaled([-54, 13, 40, 27, -26], 70), { ...tol, what: "first derivative at the first point" });
  });

  it("satisfies the moment conditions Σ w_i (i − x₀)^k = k!·δ_kd for k ≤ order at every position", () => {
    // Closed form: the weights reproduce the d-th derivative of every polynomial of degree ≤ order.
    for (const [n, order] of [[9, 2], [11, 3], [15, 4], [21, 5]]) {
      for (let d = 0; d <= Math.min(2, order); d++) {
        for (let pos = 0; pos < n; pos++) {
          const w = savitzkyGolayWeights(n, order, d, pos);
          for (let k = 0; k <= order; k++) {
            let s = 0;
            let scale = 0; // Σ|w_i·(i − x₀)^k|, the size of the terms that cancel
            for (let i = 0; i < n; i++) {
              s += w[i] * (i - pos) ** k;
              scale += Math.abs(w[i] * (i - pos) ** k);
            }
            const expected = k === d ? [1, 1, 2][d] : 0;
            expectClose(s, expected, { atol: 1e-13 * scale, rtol: 1e-13, what: `n ${n} order ${order} d ${d} position ${pos} moment ${k}` });
          }
        }
      }
    }
  });

  it("returns a new array each call (the cache cannot be modified from outside)", () => {
    const a = savitzkyGolayWeights(7, 3, 0);
    a[3] = 1000;
    expectClose(savitzkyGolayWeights(7, 3, 0)[3], 7 / 21, { rtol: 1e-14, what: SG_1964 });
  });

  it("rejects invalid windows, orders, derivatives and positions", () => {
    expectError(() => savitzkyGolayWeights(6, 2, 0), "signal/invalid-window", "windowSamples", "odd", "got 6");
    expectError(() => savitzkyGolayWeights(3, 1, 0), "signal/invalid-window", "at least 5", "got 3");
    expectError(() => savitzkyGolayWeights(5, 4, 0), "signal/invalid-window", "at least 7", "order 4");
    expectError(() => savitzkyGolayWeights(7, 0, 0), "signal/invalid-order", "order", "got 0");
    expectError(() => savitzkyGolayWeights(9, 6, 0), "signal/invalid-order", "got 6");
    expectError(() => savitzkyGolayWeights(7, 1, 2), "signal/invalid-derivative", "got 2");
    expectError(() => savitzkyGolayWeights(7, 3, 3), "signal/invalid-derivative", "got 3");
    expectError(() => savitzkyGolayWeights(7, 3, 0, 7), "signal/invalid-position", "0 to 6", "got 7");
  });
});

describe("savitzkyGolayNoiseGain(windowSamples, order, derivative)", () => {
  it("equals √Σw² of the tabulated weights", () => {
    // From the SG_1964 tables: Σ(−2,−1,0,1,2)² = 10 → √10/10; Σ(−3,12,17,12,−3)² = 595 → √595/35.
    expectClose(savitzkyGolayNoiseGain(5, 2, 1), Math.sqrt(10) / 10, { rtol: 1e-14 });
    expectClose(savitzkyGolayNoiseGain(5, 2, 0), Math.sqrt(595) / 35, { rtol: 1e-14 });
    // Per volt: divided by stepV^derivative.
    expectClose(savitzkyGolayNoiseGain(5, 2, 1, 0.002), Math.sqrt(10) / 10 / 0.002, { rtol: 1e-14 });
  });

  it("gain² of smoothing equals the centre weight (the least-squares hat matrix is idempotent)", () => {
    // Closed form: H = A(AᵀA)⁻¹Aᵀ satisfies H² = H, so Σ_j H_cj² = H_cc.
    for (const [n, order] of [[7, 2], [21, 3], [51, 4], [101, 5]]) {
      const w = savitzkyGolayWeights(n, order, 0);
      expectClose(savitzkyGolayNoiseGain(n, order, 0) ** 2, w[(n - 1) / 2], { rtol: 1e-12, what: `n ${n} order ${order}` });
    }
  });

  it("predicts the standard deviation of filtered white noise (Monte Carlo, seeded)", () => {
    // Var(Σ w ε) = σ² Σ w² for independent ε (closed form); 20,000 samples, seed 11.
    const sigma = 0.7;
    const stepV = 0.01;
    const noise = whiteNoise(20000, sigma, 11);
    for (const [n, order, d] of [[21, 3, 0], [21, 3, 1], [31, 4, 2]]) {
      const out = savitzkyGolay(noise, { windowSamples: n, order, derivative: d, stepV });
      const m = (n - 1) / 2;
      let ss = 0;
      let count = 0;
      for (let i = m; i < out.length - m; i++) {
        ss += out[i] ** 2;
        count++;
      }
      const empirical = Math.sqrt(ss / count);
      expectClose(empirical, sigma * savitzkyGolayNoiseGain(n, order, d, stepV), {
        rtol: 0.03,
        what: `filtered-noise std, window ${n} order ${order} derivative ${d}`,
      });
    }
  });
});

describe("savitzkyGolay(y, {windowSamples, order, derivative, stepV})", () => {
  it("reproduces and differentiates polynomials of degree ≤ order exactly over the whole length", () => {
    // Closed form: y = Σ c_k x^k, y' and y'' by hand; x = x₀ + i·h with a non-unit step.
    const coefficients = [0.3, -1.2, 0.8, 2.5, -0.6, 0.15];
    const h = 0.05;
    const x0 = -1.1;
    const n = 48;
    for (const order of [1, 2, 3, 4, 5]) {
      const c = coefficients.slice(0, order + 1);
      const x = Float64Array.from({ length: n }, (_, i) => x0 + i * h);
      const poly = (t: number, d: number): number => {
        let s = 0;
        for (let k = d; k < c.length; k++) s += c[k] * (d === 0 ? 1 : d === 1 ? k : k * (k - 1)) * t ** (k - d);
        return s;
      };
      const y = x.map((t) => poly(t, 0));
      for (const windowSamples of [Math.max(5, order + 2) | 1, 11, 17]) {
        for (let d = 0; d <= Math.min(2, order); d++) {
          const got = savitzkyGolay(y, { windowSamples, order, derivative: d, stepV: h });
          expect(got.length).toBe(n);
          expectClose(got, Array.from(x, (t) => poly(t, d)), {
            atol: [1e-12, 1e-10, 1e-8][d],
            rtol: 1e-10,
            what: `order ${order} window ${windowSamples} derivative ${d}`,
          });
        }
      }
    }
  });

  it("agrees in the interior with ml-savitzky-golay called directly (reference library)", () => {
    const y = whiteNoise(300, 1, 5).map((e, i) => Math.sin(i / 17) + 0.1 * e);
    for (const [n, order, d] of [[5, 2, 1], [11, 3, 0], [11, 3, 1], [25, 4, 2], [41, 5, 1]]) {
      const ours = savitzkyGolay(y, { windowSamples: n, order, derivative: d, stepV: 0.02 });
      const expected = reference(Array.from(y), 0.02, { windowSize: n, polynomial: order, derivative: d, pad: "none" });
      const m = (n - 1) / 2;
      expectClose(ours.subarray(m, y.length - m), expected, { rtol: 1e-12, atol: 1e-12, what: `window ${n} order ${order} d ${d}` });
    }
  });

  it("smoothing and slope in one pass agree with ml-savitzky-golay (reference library) inside and with a polynomial at the ends (closed form)", () => {
    const y = whiteNoise(300, 1, 6).map((e, i) => Math.cos(i / 23) + 0.05 * e);
    for (const [n, order] of [[7, 2], [11, 3], [25, 3], [31, 4]]) {
      const { smooth, slope } = savitzkyGolaySmoothAndSlopeUnchecked(y, n, order, 0.01);
      const m = (n - 1) / 2;
      for (const [d, got] of [[0, smooth], [1, slope]] as const) {
        const expected = reference(Array.from(y), 0.01, { windowSize: n, polynomial: order, derivative: d, pad: "none" });
        expectClose(got.subarray(m, y.length - m), expected, { rtol: 1e-12, atol: 1e-12, what: `window ${n} order ${order} d ${d}` });
      }
    }
    // Closed form at the ends: y = 1 + 2x − x² with order 2 is reproduced exactly, y' = 2 − 2x.
    const h = 0.1;
    const x = Array.from({ length: 30 }, (_, i) => i * h);
    const { smooth, slope } = savitzkyGolaySmoothAndSlopeUnchecked(x.map((t) => 1 + 2 * t - t * t), 9, 2, h);
    expectClose(smooth, x.map((t) => 1 + 2 * t - t * t), { rtol: 1e-12, atol: 1e-12 });
    expectClose(slope, x.map((t) => 2 - 2 * t), { rtol: 1e-10, atol: 1e-10 });
  });

  it("agrees in the interior with the tabulated weights (cubic first derivative, 7 points)", () => {
    const y = whiteNoise(60, 1, 9);
    const stepV = 0.004;
    const w = scaled([22, -67, -58, 0, 58, 67, -22], 252); // SG_1964
    const got = savitzkyGolay(y, { windowSamples: 7, order: 3, derivative: 1, stepV });
    for (let i = 3; i < 57; i++) {
      let s = 0;
      for (let j = 0; j < 7; j++) s += w[j] * y[i - 3 + j];
      expectClose(got[i], s / stepV, { rtol: 1e-12, atol: 1e-12, what: `index ${i}` });
    }
  });

  it("is exact at the ends of a cubic, where a padded filter is not", () => {
    // Closed form: y = x³ − 2x, y' = 3x² − 2. The padded filter is ml-savitzky-golay with
    // pad 'pre' and padValue 'replicate' (its documented edge handling).
    const h = 0.1;
    const x = Float64Array.from({ length: 40 }, (_, i) => i * h);
    const y = x.map((t) => t ** 3 - 2 * t);
    const exact = Array.from(x, (t) => 3 * t * t - 2);
    const ours = savitzkyGolay(y, { windowSamples: 11, order: 3, derivative: 1, stepV: h });
    const padded = reference(Array.from(y), h, { windowSize: 11, polynomial: 3, derivative: 1, pad: "pre", padValue: "replicate" });
    expect(padded.length).toBe(40);
    expectClose(ours, exact, { rtol: 1e-10, atol: 1e-10, what: "ours, whole length" });
    const errorFirst = Math.abs(padded[0] - exact[0]);
    const errorLast = Math.abs(padded[39] - exact[39]);
    expect(errorFirst, "padded filter at the first point (−1 vs −2)").toBeGreaterThan(0.5);
    expect(errorLast, "padded filter at the last point (20.8 vs 43.6)").toBeGreaterThan(10);
    // …while in the interior the padded filter is exact too (the difference is the ends alone).
    expectClose(padded[20], exact[20], { rtol: 1e-10 });
  });

  it("does not modify its input and returns a Float64Array of the same length", () => {
    const y = Float64Array.from({ length: 30 }, (_, i) => Math.cos(i));
    const copy = y.slice();
    const out = savitzkyGolay(y, { windowSamples: 9 });
    expect(out).toBeInstanceOf(Float64Array);
    expect(out.length).toBe(30);
    expect(Array.from(y)).toEqual(Array.from(copy));
  });

  it("accepts exactly windowSamples points and rejects fewer, naming the minimum", () => {
    const y = Float64Array.from({ length: 9 }, (_, i) => i * i);
    expectClose(savitzkyGolay(y, { windowSamples: 9, order: 2, derivative: 1 }), Array.from({ length: 9 }, (_, i) => 2 * i), {
      atol: 1e-12,
      what: "d(i²)/di = 2i (closed form)",
    });
    expectError(() => savitzkyGolay(y.subarray(0, 8), { windowSamples: 9 }), "signal/too-few-points", "at least 9 points", "got 8");
  });

  it("rejects a non-positive or non-finite step", () => {
    const y = new Float64Array(20);
    expectError(() => savitzkyGolay(y, { windowSamples: 5, stepV: 0 }), "signal/invalid-step", "stepV", "got 0");
    expectError(() => savitzkyGolay(y, { windowSamples: 5, stepV: Number.NaN }), "signal/invalid-step", "got NaN");
    expectError(() => savitzkyGolay(y, { windowSamples: 4 }), "signal/invalid-window", "got 4");
  });

  it("SAVITZKY_GOLAY_DEFAULTS are locked", () => {
    expect({ ...SAVITZKY_GOLAY_DEFAULTS }).toEqual({
      order: 3,
      derivative: 0,
      stepV: 1,
      minWindowSamples: 5,
      minOrder: 1,
      maxOrder: 5,
      maxDerivative: 2,
    });
  });
});

describe("savitzkyGolay under plain Node ESM (tsx), as the command runs it", () => {
  it("differentiates x² exactly outside vitest's module loader", () => {
    const script =
      "const m = await import('./lib/signal/savitzkyGolay.ts');" +
      "const y = Float64Array.from({length: 9}, (_, i) => i * i);" +
      "console.log(Array.from(m.savitzkyGolay(y, {windowSamples: 5, order: 2, derivative: 1})).map(Math.round).join(','));";
    const out = execFileSync(process.execPath, ["--import", "tsx", "--input-type=module", "-e", script], {
      cwd: new URL("../..", import.meta.url).pathname,
      encoding: "utf8",
    }).trim();
    expect(out).toBe("0,2,4,6,8,10,12,14,16"); // d(i²)/di = 2i (closed form)
  });
});
