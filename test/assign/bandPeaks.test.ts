// bandPeaks: the two bands, ordered from the gap edge, each peak keeping its index.
// Expected values derived by construction of the input list (sign convention: CB at positive sample bias).
import { describe, it, expect } from "vitest";
import { bandPeaks } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const peak = (biasV: number): Peak => ({ biasV, biasUncertaintyV: 0.001, index: 0, heightS: 1e-9, prominenceS: 1e-9, fwhmV: 0.04, stepA: 1e-11, snr: 20, stepSignificance: 30 });

describe("bandPeaks(peaks)", () => {
  const peaks = [-1.2, -0.9, -0.7, 0, 0.6, 0.8].map(peak);
  const { cb, vb } = bandPeaks(peaks);

  it("puts positive bias in the CB and negative in the VB, a peak at 0 V in neither", () => {
    expect(cb.map((p) => p.index)).toEqual([4, 5]);
    expect(vb.map((p) => p.index)).toEqual([2, 1, 0]);
  });

  it("measures x = |bias| from the gap edge outward and keeps the peak object itself", () => {
    expect(cb.map((p) => p.x)).toEqual([0.6, 0.8]);
    expect(vb.map((p) => p.x)).toEqual([0.7, 0.9, 1.2]);
    for (const p of [...cb, ...vb]) expect(p.peak).toBe(peaks[p.index]);
  });
});
