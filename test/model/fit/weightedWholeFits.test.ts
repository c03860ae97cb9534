// weightedWholeFits on constructed runs: which CB-side finalists get a whole-curve fit, and the
// answer read off it. Expected values: the parameter layout of parameterIndex (closed form:
// Ec after the levels, then log₁₀ Γtip/Γsub) and the documented rule (weight at least minWeight;
// common practice (no source)).
import { describe, expect, it } from "vitest";
import { weightedWholeFits, WEIGHTED_WHOLE_FITS_DEFAULTS } from "../../../lib/model/fit/weightedWholeFits.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";
import { expectDocumentedDefaults } from "../../helpers/documentedDefaults.ts";

/** A run with two levels, Ec (eV) and Γtip/Γsub at the places parameterIndex(2) gives them; the rest neutral. */
function run(side: "CB" | "both", chargingEnergyEV: number, rateRatio: number, reducedChiSquare: number): FitTrial {
  const parameters = [0.6, 0.9, chargingEnergyEV, Math.log10(rateRatio), -2, 1, 0, 0, 0];
  return { hypothesis: { seeds: [{}, {}] }, side, n: 101, loop: { parameters, chiSquare: reducedChiSquare * 100 }, k: 9, bic: 0, finished: true, implausible: [] } as unknown as FitTrial;
}

describe("weightedWholeFits(input)", () => {
  it("WEIGHTED_WHOLE_FITS_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(WEIGHTED_WHOLE_FITS_DEFAULTS).toEqual({ minWeight: 0.02 });
    expect(Object.isFrozen(WEIGHTED_WHOLE_FITS_DEFAULTS)).toBe(true);
    expectDocumentedDefaults(new URL("../../../lib/model/fit/weightedWholeFits.ts", import.meta.url), "WeightedWholeFitsInput", WEIGHTED_WHOLE_FITS_DEFAULTS);
  });

  it("reads Ec and Γtip/Γsub off the whole-curve fit of every CB-side finalist with weight ≥ 0.02, fitting only those the search left without one", () => {
    const winner = run("CB", 0.1407, 0.561, 1.1);
    const rival = run("CB", 0.1611, 0.617, 1.1);
    const faint = run("CB", 0.1594, 0.578, 1.1);
    const winnerWhole = run("both", 0.1438, 0.571, 0.93);
    const rivalWhole = run("both", 0.1439, 0.572, 0.93);
    const fitted: FitTrial[] = [];
    const out = weightedWholeFits({
      finalists: [winner, rival, faint],
      weights: [0.65, 0.34, 0.01],
      wholeOf: new Map([[winner, winnerWhole]]),
      wholeFitOf: (cb) => (fitted.push(cb), rivalWhole),
      describes: (w) => w.loop.chiSquare / Math.max(1, w.n - w.k) <= 3,
      reduced: (t) => t.loop.chiSquare / Math.max(1, t.n - t.k),
    });
    // The rival alone is fitted: the winner has its whole-curve fit, the faint run (0.01 < 0.02) needs none.
    expect(fitted).toEqual([rival]);
    expect([...out.keys()]).toEqual([winner, rival]);
    const r = out.get(rival)!;
    expect(r.chargingEnergyEV).toBeCloseTo(0.1439, 12);
    expect(r.rateRatio).toBeCloseTo(0.572, 12);
    expect(r.reducedChiSquare).toBeCloseTo(93 / 92, 12); // χ² 93 over 101 − 9 points (closed form)
    expect(r.describesCurve).toBe(true);
    expect(out.get(winner)!.chargingEnergyEV).toBeCloseTo(0.1438, 12);
  });

  it("gives a run at the same fit as one already fitted to the whole curve that run's answer, without fitting it again", () => {
    // Two readings of the peaks that settled at one minimum (every nonlinear parameter equal, sameFit).
    const fromEmpty = run("CB", 0.0613, 0.73, 1.03);
    const inFillingOrder = run("CB", 0.0613, 0.73, 1.03);
    const rivalWhole = run("both", 0.0609, 0.854, 38.1);
    let calls = 0;
    const out = weightedWholeFits({ finalists: [fromEmpty, inFillingOrder], weights: [0.5, 0.5], wholeOf: new Map(), wholeFitOf: () => (calls++, rivalWhole), describes: () => false, reduced: (t) => t.loop.chiSquare / Math.max(1, t.n - t.k) });
    expect(calls).toBe(1);
    expect(out.get(inFillingOrder)).toEqual(out.get(fromEmpty));
    expect(out.get(fromEmpty)!.describesCurve).toBe(false);
  });

  it("fits no whole-curve run from a finalist already on the whole curve", () => {
    const assigned = run("both", 0.1, 3, 1);
    const out = weightedWholeFits({ finalists: [assigned], weights: [1], wholeOf: new Map(), wholeFitOf: () => { throw new Error("not called"); }, describes: () => true, reduced: () => 1 });
    expect(out.size).toBe(0);
  });
});
