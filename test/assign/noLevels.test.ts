// noLevels: the no-dot-features verdict on constructed inputs; expected values derived by
// construction of the documented rule (NO_LEVELS_DEFAULTS: common practice (no source)).
import { describe, expect, it } from "vitest";
import { noLevels, NO_LEVELS_DEFAULTS } from "../../lib/assign/noLevels.ts";

describe("noLevels(input)", () => {
  it("NO_LEVELS_DEFAULTS are locked", () => {
    expect(NO_LEVELS_DEFAULTS).toEqual({ minZeroCurrentSamples: 5, minStrongestProminenceSigma: 6 });
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

  it("lets two or more peaks through, also on one side of 0 V only or with 0 V outside the range", () => {
    expect(noLevels({ peaksV: [0.7, 0.8], gapEdgesV: [-0.6, 0.65], zeroInRange: true, zeroCurrentSamples: 600 })).toBeNull();
    expect(noLevels({ peaksV: [0.7, 0.8], gapEdgesV: null, zeroInRange: false, zeroCurrentSamples: 0 })).toBeNull();
  });
});
