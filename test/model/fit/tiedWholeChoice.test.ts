// tiedWholeChoice on constructed runs: a CB-side tie decided by which grouping's whole-curve fit
// describes the curve. Expected answers follow from the documented rule by hand (BIC differences
// below 2 are ties: common practice (no source); the lowest whole-curve BIC among those that
// describe the curve, on the same points).
import { describe, expect, it } from "vitest";
import { tiedWholeChoice, TIED_WHOLE_CHOICE_DEFAULTS } from "../../../lib/model/fit/tiedWholeChoice.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";

/** A stand-in run: name, side, BIC and reduced χ² ("describes" is χ² ≤ 1.5, standing for χ² ≤ 3 with no structure; the χ² bar is 3). */
const run = (name: string, side: "CB" | "both", bic: number, chi: number): FitTrial => ({ hypothesis: { name, label: name }, side, bic, loop: { chiSquare: chi } } as unknown as FitTrial);

function context(winner: FitTrial, whole: FitTrial, plausible: FitTrial[], wholes: Map<FitTrial, FitTrial>) {
  const fitted: FitTrial[] = [];
  const wholeOf = new Map<FitTrial, FitTrial>([[winner, whole]]);
  const cbSideOf = new Map<FitTrial, FitTrial>([[whole, winner]]);
  return {
    fitted,
    wholeOf,
    cbSideOf,
    context: { winner, whole, plausible, wholeOf, cbSideOf, wholeFitOf: (cb: FitTrial) => (fitted.push(cb), wholes.get(cb)!), describes: (w: FitTrial) => w.loop.chiSquare <= 1.5, acceptable: () => true, reduced: (t: FitTrial) => t.loop.chiSquare, wholeCurveChiSquare: 3 },
  };
}

describe("tiedWholeChoice(context)", () => {
  it("TIED_WHOLE_CHOICE_DEFAULTS are locked and frozen", () => {
    expect(TIED_WHOLE_CHOICE_DEFAULTS).toEqual({ tieMargin: 2 });
    expect(Object.isFrozen(TIED_WHOLE_CHOICE_DEFAULTS)).toBe(true);
  });

  it("gives the tie to the grouping whose whole-curve fit describes the curve, fitting it once and recording it", () => {
    const winner = run("2+2+2+2, Γtip/Γsub × 0.32", "CB", 268.6, 0.83);
    const whole = run("2+2+2+2, Γtip/Γsub × 0.32", "both", 816.6, 2.1);
    const tied = run("2+2+2+2, 148 meV apart", "CB", 268.7, 0.83);
    const tiedWhole = run("2+2+2+2, 148 meV apart", "both", 742.8, 1.01);
    const behind = run("2+6", "CB", 275.0, 0.9);
    const c = context(winner, whole, [winner, tied, behind], new Map([[tied, tiedWhole], [behind, run("2+6", "both", 700, 1.0)]]));
    const found = tiedWholeChoice(c.context);
    expect(found?.cb).toBe(tied);
    expect(found?.whole).toBe(tiedWhole);
    // 275.0 is 6.4 above the winner: not a tie, not fitted.
    expect(c.fitted).toEqual([tied]);
    expect(c.wholeOf.get(tied)).toBe(tiedWhole);
    expect(c.cbSideOf.get(tiedWhole)).toBe(tied);
  });

  it("leaves the winner where its whole-curve fit describes the curve, or no tied grouping's does", () => {
    const winner = run("a", "CB", 100, 1);
    const tied = run("b", "CB", 101, 1);
    const good = context(winner, run("a", "both", 500, 1.2), [winner, tied], new Map([[tied, run("b", "both", 400, 1.0)]]));
    expect(tiedWholeChoice(good.context)).toBeNull();
    expect(good.fitted).toEqual([]);
    const neither = context(winner, run("a", "both", 900, 2.0), [winner, tied], new Map([[tied, run("b", "both", 800, 1.9)]]));
    expect(tiedWholeChoice(neither.context)).toBeNull();
    // Above the χ² bar (3.2 > 3) the splits are tried instead: no tied rival is fitted.
    const above = context(winner, run("a", "both", 2000, 3.2), [winner, tied], new Map([[tied, run("b", "both", 400, 1.0)]]));
    expect(tiedWholeChoice(above.context)).toBeNull();
    expect(above.fitted).toEqual([]);
  });
});
