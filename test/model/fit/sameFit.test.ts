// sameFit: the same run twice is the same fit (exact); on the example dot of fitDemo (simulated
// truth ε_s = 0.6, ε_p = 0.9, ε_v = −1.2 eV, Ec = 0.1 eV, Γtip/Γsub = 10, η = 0.85) runs started
// with Ec 5 % high and 10 % low converge to the first run's minimum (derived: they end within 1e-6
// of it, at its χ²), one started 20 % high settles elsewhere (χ² ten times higher); a different
// layout, data set or a parameter moved past the tolerance is not the same fit (exact, by construction).
import { describe, it, expect } from "vitest";
import { sameFit, SAME_FIT_DEFAULTS } from "../../../lib/model/fit/sameFit.ts";
import { fitRunner } from "../../../lib/model/fit/fitRunner.ts";
import { fitHypotheses } from "../../../lib/model/fit/fitHypotheses.ts";
import { parameterIndex } from "../../../lib/model/fit/parameterModel.ts";
import { analysis, eta, settings } from "../../helpers/fitDemo.ts";

describe("sameFit(a, b, tolerance)", () => {
  const runner = fitRunner(analysis, settings);
  const [h] = fitHypotheses(analysis, eta, false);
  const at = parameterIndex(h.seeds.length);

  it("SAME_FIT_DEFAULTS are locked", () => {
    expect(SAME_FIT_DEFAULTS).toEqual({ parameterTolerance: 1e-4 });
    expect(Object.isFrozen(SAME_FIT_DEFAULTS)).toBe(true);
  });

  it("finds two runs from different starts at one minimum the same fit, and tells apart what differs", () => {
    const a = runner.run(h, null, 60);
    const from = (f: number) => {
      const start = a.loop.parameters.slice();
      start[at.chargingEnergy] *= f;
      return runner.run(h, null, 60, start);
    };
    expect(sameFit(a, a)).toBe(true);
    expect(sameFit(a, from(1.05))).toBe(true);
    expect(sameFit(a, from(0.9))).toBe(true);
    const elsewhere = from(1.2);
    expect(elsewhere.loop.chiSquare).toBeGreaterThan(2 * a.loop.chiSquare);
    expect(sameFit(a, elsewhere)).toBe(false);
    // A parameter moved past the tolerance, another data set, another layout.
    const moved = { ...a, loop: { ...a.loop, parameters: a.loop.parameters.map((p, j) => (j === at.logRateRatio ? p + 2e-4 : p)) } };
    expect(sameFit(a, moved)).toBe(false);
    expect(sameFit(a, moved, 3e-4)).toBe(true);
    expect(sameFit(a, { ...a, set: runner.cbSide })).toBe(false);
    const other = { ...a, hypothesis: { ...a.hypothesis, seeds: a.hypothesis.seeds.map((s, j) => (j === 1 ? { ...s, degeneracy: 4 } : s)) } };
    expect(sameFit(a, other)).toBe(false);
  }, 60_000);
});
