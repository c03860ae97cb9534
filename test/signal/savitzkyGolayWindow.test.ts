// The window choice of the conductance, checked against its closed forms: a given windowMV is the
// nearest odd number of bias steps; a noise-free curve gets the smallest window max(5, order + 2)
// (odd), since σ_G = 0 meets any noise target; a noisy one the largest odd window within
// f_p·peakWidthMV (f_p from SAVITZKY_GOLAY_WINDOW_DEFAULTS, derived in its doc comment). The
// numbers-only variant the pipeline's first pass uses must choose exactly what the described one
// chooses (derived: both are the same rule).
import { describe, expect, it } from "vitest";
import { savitzkyGolayWindow, savitzkyGolayWindowSamples, SAVITZKY_GOLAY_WINDOW_DEFAULTS } from "../../lib/signal/savitzkyGolayWindow.ts";

const stepV = 0.002;
const biasV = Float64Array.from({ length: 2001 }, (_, i) => -2 + i * stepV);
const currentA = biasV.map((v) => 1e-9 * Math.sinh(v));

describe("savitzkyGolayWindow", () => {
  it("a given window is the nearest odd number of bias steps (closed form)", () => {
    const input = { biasV, currentA, stepV, noiseCurrentA: 0 };
    expect(savitzkyGolayWindow(input, 30, 3, 40).windowSamples).toBe(15);
    expect(savitzkyGolayWindow(input, 34, 3, 40).windowSamples).toBe(17);
    expect(savitzkyGolayWindow(input, 30, 3, 40).automatic).toBe(false);
  });

  it("noise-free: the smallest window max(5, order + 2), odd (closed form)", () => {
    const input = { biasV, currentA, stepV, noiseCurrentA: 0 };
    for (const [order, nMin] of [[1, 5], [2, 5], [3, 5], [4, 7], [5, 7]] as const) {
      expect(savitzkyGolayWindow(input, "auto", order, 40).windowSamples).toBe(nMin);
    }
  });

  it("noisy: the largest odd window within f_p·peakWidthMV (closed form from the documented factor)", () => {
    const input = { biasV, currentA, stepV, noiseCurrentA: 1e-9 };
    const fp = SAVITZKY_GOLAY_WINDOW_DEFAULTS.windowFraction[3];
    const largest = Math.floor((fp * 40) / 2);
    const expected = largest % 2 === 1 ? largest : largest - 1;
    const choice = savitzkyGolayWindow(input, "auto", 3, 40);
    expect(choice.windowSamples).toBe(expected);
    expect(choice.reason).toMatch(/is not met below that/);
  });

  it("savitzkyGolayWindowSamples chooses what savitzkyGolayWindow chooses, and throws alike (derived: one rule)", () => {
    for (const noiseCurrentA of [0, 1e-13, 1e-12, 1e-11, 1e-9]) {
      for (const order of [1, 2, 3, 4, 5]) {
        for (const w of ["auto", 10, 30, 101] as const) {
          for (const peakWidthMV of [5, 20, 40, 200, 10000]) {
            const input = { biasV, currentA, stepV, noiseCurrentA };
            const outcome = (f: () => number) => {
              try {
                return f();
              } catch (err) {
                return (err as Error).message;
              }
            };
            expect(outcome(() => savitzkyGolayWindowSamples(input, w, order, peakWidthMV))).toBe(outcome(() => savitzkyGolayWindow(input, w, order, peakWidthMV).windowSamples));
          }
        }
      }
    }
    const input = { biasV, currentA, stepV, noiseCurrentA: 0 };
    expect(() => savitzkyGolayWindowSamples(input, 4, 3, 40)).toThrow(/windowMV must be at least 5 bias steps/);
  });
});
