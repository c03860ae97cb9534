// splitSatellites: weak peaks against the band's median step and against the preceding main peak.
// Expected values by construction of the steps (the rules as documented: step < ofMedian × median,
// step < ofPrevious × the preceding main peak's step).
import { describe, it, expect } from "vitest";
import { splitSatellites } from "../../lib/assign/satellites.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const at = (stepA: number, index: number): BandPeak => ({ x: 0.5 + 0.1 * index, index, peak: { biasV: 0.5 + 0.1 * index, stepA } as Peak });
const indices = (list: BandPeak[]) => list.map((p) => p.index);

describe("splitSatellites(list, ofMedian, ofPrevious)", () => {
  it("noise rule: below 0.2 × the median step, wherever it lies (even first)", () => {
    const list = [0.3e-12, 10e-12, 12e-12, 2e-12, 0.5e-12, 1.5e-12].map(at);
    // Sorted 0.3, 0.5, 1.5, 2, 10, 12 pA: the median taken is the upper middle, 2 pA → threshold
    // 0.4 pA; only 0.3 pA is below it.
    const r = splitSatellites(list, 0.2, 0);
    expect(indices(r.satellites)).toEqual([0]);
    expect(indices(r.main)).toEqual([1, 2, 3, 4, 5]);
  });

  it("satellite rule: below 0.5 × the preceding main peak; a weak peak does not become the reference", () => {
    // 10, 4 (< 5: satellite), 6 (≥ 5 against 10: main), 2.9 (< 3 against 6: satellite).
    const r = splitSatellites([10e-12, 4e-12, 6e-12, 2.9e-12].map(at), 0, 0.5);
    expect(indices(r.main)).toEqual([0, 2]);
    expect(indices(r.satellites)).toEqual([1, 3]);
  });

  it("keeps everything with both rules off, and handles an empty band", () => {
    const list = [1e-12, 1e-15].map(at);
    expect(indices(splitSatellites(list, 0, 0).main)).toEqual([0, 1]);
    expect(splitSatellites([], 0.2, 0.5)).toEqual({ main: [], satellites: [] });
  });
});
