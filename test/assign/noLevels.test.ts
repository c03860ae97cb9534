// noLevels: the no-dot-features verdict on constructed inputs; expected values derived by
// construction of the documented rule (NO_LEVELS_DEFAULTS: common practice (no source)).
import { describe, expect, it } from "vitest";
import { noLevels, NO_LEVELS_DEFAULTS } from "../../lib/assign/noLevels.ts";

describe("noLevels(input)", () => {
  it("NO_LEVELS_DEFAULTS are locked", () => {
    expect(NO_LEVELS_DEFAULTS).toEqual({ minZeroCurrentSamples: 5, minStrongestProminenceSigma: 6, edgeFwhms: 1 });
    expect(Object.isFrozen(NO_LEVELS_DEFAULTS)).toBe(true);
  });

  it("says no-gap when neither dI/dV nor the current has a zero region at 0 V, whatever the peaks", () => {
    const r = noLevels({ peaksV: [-0.5, 0.4], gapEdgesV: null, zeroInRange: true, zeroCurrentSamples: 2 });
    expect(r?.code).toBe("no-gap");
    expect(r?.reason).toContain("2 samples");
  });

  it("keeps a dot whose dI/dV at 0 V is one noisy sample above threshold but whose current has a wide zero region", () => {
    expect(noLevels({ peaksV: [-0.9, -0.8, 0.7, 0.8], gapEdgesV: null, zeroInRange: true, zeroCurrentSamples: 600 })).toBeNull();
  });

  it("says no-peaks without a peak, and lone-peak with one", () => {
    expect(noLevels({ peaksV: [], gapEdgesV: [-2, 2], zeroInRange: true, zeroCurrentSamples: 2001 })?.code).toBe("no-peaks");
    const lone = noLevels({ peaksV: [-0.9], gapEdgesV: [-0.7, 0.7], zeroInRange: true, zeroCurrentSamples: 700 });
    expect(lone?.code).toBe("lone-peak");
    expect(lone?.reason).toContain("-0.9 V");
  });

  it("says faint-peaks when the strongest peak stands less than 6σ out of dI/dV, and not from 6σ on", () => {
    const base = { peaksV: [0.7, 0.8, 0.9], gapEdgesV: [-0.6, 0.65] as [number, number], zeroInRange: true, zeroCurrentSamples: 600 };
    const faint = noLevels({ ...base, strongestProminenceSigma: 5.3 });
    expect(faint?.code).toBe("faint-peaks");
    expect(faint?.reason).toContain("5.3σ");
    expect(noLevels({ ...base, strongestProminenceSigma: 6 })).toBeNull();
    expect(noLevels(base)).toBeNull(); // without the figure the rule is not applied
  });

  it("does not count peaks within one FWHM of an end of the bias range, unless the curve has levels elsewhere", () => {
    const base = { gapEdgesV: [-1.5, 1.5] as [number, number], zeroInRange: true, zeroCurrentSamples: 1500, biasRangeV: [-2, 2] as [number, number] };
    // by construction: 1.96 V is 40 mV from the end with a FWHM of 94 mV; −1.969 V is 31 mV from it with 35 mV
    const edges = noLevels({ ...base, peaksV: [-1.969, 1.96], peakFwhmV: [0.035, 0.094] });
    expect(edges?.code).toBe("no-peaks");
    expect(edges?.reason).toContain("away from the ends of the bias range (2 within one FWHM of an end");
    const one = noLevels({ ...base, peaksV: [-1.381, 1.968], peakFwhmV: [0.018, 0.038] });
    expect(one?.code).toBe("lone-peak");
    expect(one?.reason).toContain("-1.381 V");
    // two peaks inside the range: levels possible, and then the edge peak stays with them
    expect(noLevels({ ...base, peaksV: [-1.0, 0.9, 1.96], peakFwhmV: [0.04, 0.04, 0.04] })).toBeNull();
    // a peak exactly one FWHM from the end counts
    expect(noLevels({ ...base, peaksV: [-1.0, 1.96], peakFwhmV: [0.04, 0.04] })).toBeNull();
  });

  it("lets two or more peaks through, also on one side of 0 V only or with 0 V outside the range", () => {
    expect(noLevels({ peaksV: [0.7, 0.8], gapEdgesV: [-0.6, 0.65], zeroInRange: true, zeroCurrentSamples: 600 })).toBeNull();
    expect(noLevels({ peaksV: [0.7, 0.8], gapEdgesV: null, zeroInRange: false, zeroCurrentSamples: 0 })).toBeNull();
  });
});
