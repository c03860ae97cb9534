// The s doublet's second charging peak's resonance through the substrate junction steps at most
// 1/(1 + r) of the first's (closed form, derived in lib/assign/doubletResonance.ts and checked
// against the master equation in test/model/regimeLimits.test.ts): at most 0.4 in shell filling,
// r ≥ 1.5. Constructed peak lists; no value here comes from the function under test.
import { describe, it, expect } from "vitest";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { levelsAtDoubletResonance } from "../../lib/assign/doubletResonance.ts";

// s at 1.5 and 1.65 V, η = 0.6 (gain 1.5): plain resonances at −2.25 and −2.475 V.
const gain = 1.5;
const peak = (biasV: number, stepA: number) => ({ biasV, stepA }) as Peak;
const list = (secondResonanceA: number) => [peak(-2.475, secondResonanceA), peak(-2.25, 2e-11), peak(1.5, 1e-11), peak(1.65, 1e-11)];
const res = (peaks: Peak[], index: number, sourceIndex: number, shift = 0) => ({ index, sourceIndex, predictedV: -gain * peaks[sourceIndex].biasV + shift });

describe("levelsAtDoubletResonance(peaks, resonances, sIndices, gain)", () => {
  it("gives back a second-peak resonance stepping more than 0.4 × the first's, not one stepping less", () => {
    const strong = list(0.5 * 2e-11);
    expect(levelsAtDoubletResonance(strong, [res(strong, 1, 2), res(strong, 0, 3)], [2, 3], gain).map((r) => r.index)).toEqual([0]);
    const weak = list(0.35 * 2e-11);
    expect(levelsAtDoubletResonance(weak, [res(weak, 1, 2), res(weak, 0, 3)], [2, 3], gain)).toEqual([]);
  });

  it("reads nothing without the first peak's resonance, with an s of one peak, or for a prediction moved by the carriers below", () => {
    const peaks = list(0.5 * 2e-11);
    expect(levelsAtDoubletResonance(peaks, [res(peaks, 0, 3)], [2, 3], gain)).toEqual([]);
    expect(levelsAtDoubletResonance(peaks, [res(peaks, 1, 2), res(peaks, 0, 3)], [2], gain)).toEqual([]);
    expect(levelsAtDoubletResonance(peaks, [res(peaks, 1, 2), res(peaks, 0, 3, 0.1)], [2, 3], gain)).toEqual([]);
  });
});
