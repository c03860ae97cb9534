// The tests of notes 9, 15 and 17 of rulesDecisive on peak lists at the closed-form positions of
// orthodox theory, (ε + Ec(n + ½))/η, with the closed-form charging steps of one level filled
// from the tip (detailed balance of in at (g − N)·Γtip, out at N·Γsub: the steps fall one after
// another; for g = 2 the second is r/(1 + r) × the first, see secondToFirstStepRatio).
// Where the expected values come from: the peak positions and step ratios are closed form (above),
// each verdict derived by hand from them against the limits of RULES_DECISIVE_DEFAULTS (common
// practice (no source), as documented there).
import { describe, expect, it } from "vitest";
import { chargingStepReasons, pairRiseReasons } from "../../../lib/assign/decisive/fillingSteps.ts";
import { secondToFirstStepRatio } from "../../../lib/model/regimeLimits.ts";
import { assignPeak as peak } from "../../helpers/assignPeak.ts";
import { ec, eta, pV, reading, sV } from "../../helpers/decisiveReading.ts";

describe("chargingStepReasons(peaks, assignment, dipRatio)", () => {
  const withSteps = (steps: number[]) => reading([...sV.map((v) => peak(v)), ...pV.map((v, i) => peak(v, steps[i] * 1e-11))]);

  it("flags a dip (0.6 against 0.9 and 1, below 0.85 of both) and not the rise after it, and leaves falling steps alone", () => {
    const dip = withSteps([1, 0.9, 0.6, 1, 0.9, 0.8]);
    expect(dip.assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([6]);
    const out = chargingStepReasons(dip.peaks, dip.assignment, 0.85);
    expect(out.map((x) => x.code)).toEqual(["charging-dip"]);
    expect(out[0].text).toContain(`the peak at ${pV[2].toFixed(3)} V steps 0.67 × the one before and 0.60 × the one after`);
    const falling = withSteps([1, 0.95, 0.9, 0.85, 0.8, 0.75]);
    expect(chargingStepReasons(falling.peaks, falling.assignment, 0.85)).toEqual([]);
  });

  it("flags a rise of 1/0.84 × the step before (> 1/0.85), not 1/0.86", () => {
    const steps = [1, 0.95, 0.9, 0.85, 0.8];
    const risen = withSteps([...steps, 0.8 / 0.84]);
    const out = chargingStepReasons(risen.peaks, risen.assignment, 0.85);
    expect(out.map((x) => x.code)).toEqual(["charging-rise"]);
    expect(out[0].text).toContain(`the peak at ${pV[5].toFixed(3)} V steps 1.19 × the one before (> 1/0.85)`);
    const within = withSteps([...steps, 0.8 / 0.86]);
    expect(chargingStepReasons(within.peaks, within.assignment, 0.85)).toEqual([]);
  });
});

describe("pairRiseReasons(peaks, assignment, pairRise)", () => {
  it("flags a sub-group of two whose second charging peak steps 2.2 × its first (≥ 2), not r/(1 + r) at r = 10 nor 1.8 ×", () => {
    // p split 2+2+2 (ε_p1 = 0.8, ε_p2 = 0.85, ε_p3 = 0.9 eV), two charging peaks per sub-level.
    const q = secondToFirstStepRatio(10);
    const ps = [0.8, 0.8, 0.85, 0.85, 0.9, 0.9].map((e, k) => (e + ec * (k + 2 + 0.5)) / eta);
    const withLast = (ratio: number) => reading([...sV.map((v, i) => peak(v, [1, q][i] * 1e-11)), ...ps.map((v, i) => peak(v, [1, q, 1, q, 1, ratio][i] * 1e-11))]);
    for (const ratio of [q, 1.8]) {
      const { peaks, assignment } = withLast(ratio);
      expect(assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([2, 2, 2]);
      expect(pairRiseReasons(peaks, assignment, 2)).toEqual([]);
    }
    const merged = withLast(2.2);
    const out = pairRiseReasons(merged.peaks, merged.assignment, 2);
    expect(out.map((x) => x.code)).toEqual(["pair-rise"]);
    expect(out[0].text).toContain(`p's charging peak at ${ps[5].toFixed(3)} V stepping 2.20 × the one before it in a sub-group of two (≥ 2)`);
  });
});
