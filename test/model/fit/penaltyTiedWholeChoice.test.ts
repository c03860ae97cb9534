// penaltyTiedWholeChoice on constructed runs: a grouping behind on the CB side by its parameter
// penalty alone, decided by the whole curve. The BICs are built as χ² + k·ln n (G. Schwarz, Ann.
// Stat. 6, 461 (1978)); a χ² difference below 2 is a tie (common practice (no source)); the whole
// curve's choice is the lowest whole-curve BIC among the fits that describe it, on the same points.
import { describe, expect, it } from "vitest";
import { penaltyTiedWholeChoice, PENALTY_TIED_WHOLE_CHOICE_DEFAULTS } from "../../../lib/model/fit/penaltyTiedWholeChoice.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";

const N_CB = 250;
const N_WHOLE = 740;

/** A stand-in run: its CB layout, side, parameter count and χ²; the BIC from them. "describes" stands for reduced χ² ≤ 1.5. */
function run(layout: number[], side: "CB" | "both", k: number, chi: number, finished = true): FitTrial {
  const n = side === "CB" ? N_CB : N_WHOLE;
  const name = layout.join("+");
  const seeds = layout.map((g, j) => ({ band: "CB", label: j ? `p${j}` : "s", degeneracy: g, firstPeakV: 2 + j, before: 0 }));
  return { hypothesis: { name, label: name, seeds }, side, n, k, bic: chi + k * Math.log(n), finished, loop: { chiSquare: chi } } as unknown as FitTrial;
}
const reduced = (t: FitTrial) => t.loop.chiSquare / (t.n - t.k);

function context(winner: FitTrial, whole: FitTrial, trials: FitTrial[], wholes: Map<FitTrial, FitTrial>, finished = new Map<FitTrial, FitTrial>(), implausible: FitTrial[] = []) {
  const fitted: FitTrial[] = [];
  const finishedRuns: FitTrial[] = [];
  const wholeOf = new Map<FitTrial, FitTrial>([[winner, whole]]);
  const cbSideOf = new Map<FitTrial, FitTrial>([[whole, winner]]);
  return {
    fitted,
    finishedRuns,
    wholeOf,
    cbSideOf,
    context: {
      winner,
      whole,
      trials: [winner, whole, ...trials],
      finish: (t: FitTrial) => (t.finished ? t : (finishedRuns.push(t), finished.get(t)!)),
      plausible: (t: FitTrial) => !implausible.includes(t),
      wholeOf,
      cbSideOf,
      wholeFitOf: (cb: FitTrial) => (fitted.push(cb), wholes.get(cb)!),
      describes: (w: FitTrial) => reduced(w) <= 1.5,
      acceptable: () => true,
      reduced,
      wholeCurveChiSquare: 3,
    },
  };
}

describe("penaltyTiedWholeChoice(context)", () => {
  it("PENALTY_TIED_WHOLE_CHOICE_DEFAULTS are locked and frozen", () => {
    expect(PENALTY_TIED_WHOLE_CHOICE_DEFAULTS).toEqual({ chiSquareMargin: 2, maxRivals: 2 });
    expect(Object.isFrozen(PENALTY_TIED_WHOLE_CHOICE_DEFAULTS)).toBe(true);
  });

  it("carries a rival whose CB-side χ² ties with the winner's to the whole curve, where it wins by its whole-curve BIC", () => {
    const winner = run([2, 2, 4], "CB", 10, 244.2);
    // Its whole-curve fit leaves the curve undescribed: reduced χ² 2.0.
    const whole = run([2, 2, 4], "both", 12, 2.0 * (N_WHOLE - 12));
    // Explored only; χ² 0.4 above the winner's, one parameter more: BIC higher by 0.4 + ln 250 = 5.9, beyond the tie margin 2.
    const explored = run([2, 2, 2, 2], "CB", 11, 244.6, false);
    expect(explored.bic - winner.bic).toBeCloseTo(0.4 + Math.log(N_CB), 10);
    const finishedRival = run([2, 2, 2, 2], "CB", 11, 244.5);
    const rivalWhole = run([2, 2, 2, 2], "both", 13, 1.02 * (N_WHOLE - 13));
    const c = context(winner, whole, [explored], new Map([[finishedRival, rivalWhole]]), new Map([[explored, finishedRival]]));
    const found = penaltyTiedWholeChoice(c.context);
    expect(found?.cb).toBe(finishedRival);
    expect(found?.whole).toBe(rivalWhole);
    expect(found!.whole.bic).toBeLessThan(whole.bic);
    expect(found?.note).toMatch(/parameter penalty alone/);
    expect(c.finishedRuns).toEqual([explored]);
    expect(c.fitted).toEqual([finishedRival]);
    expect(c.wholeOf.get(finishedRival)).toBe(rivalWhole);
    expect(c.cbSideOf.get(rivalWhole)).toBe(finishedRival);
  });

  it("fits nothing where the winner's whole-curve fit describes the curve or is above the χ² bar, or where no rival ties in χ² with more parameters and another layout", () => {
    const winner = run([2, 2, 4], "CB", 10, 244.2);
    const rival = run([2, 2, 2, 2], "CB", 11, 244.5);
    const rivalWhole = run([2, 2, 2, 2], "both", 13, 1.0 * (N_WHOLE - 13));
    // The winner's whole-curve fit describes the curve (reduced χ² 1.1): the CB side's choice stands.
    const good = context(winner, run([2, 2, 4], "both", 12, 1.1 * (N_WHOLE - 12)), [rival], new Map([[rival, rivalWhole]]));
    expect(penaltyTiedWholeChoice(good.context)).toBeNull();
    expect(good.fitted).toEqual([]);
    const poorWhole = run([2, 2, 4], "both", 12, 2.0 * (N_WHOLE - 12));
    // χ² 2.5 above the winner's: the data, not only the penalty, are against it.
    const worse = run([2, 2, 2, 2], "CB", 11, 246.7);
    // Fewer parameters (a smaller model the CB side already weighed), and the winner's own layout refitted.
    const smaller = run([2, 6], "CB", 9, 243.0);
    const same = run([2, 2, 4], "CB", 11, 243.0);
    const none = context(winner, poorWhole, [worse, smaller, same], new Map([[worse, rivalWhole], [smaller, rivalWhole], [same, rivalWhole]]));
    expect(penaltyTiedWholeChoice(none.context)).toBeNull();
    expect(none.fitted).toEqual([]);
    // Above the χ² bar (reduced χ² 3.2 > 3) the whole-curve splits and later VB entries are tried instead: no rival is fitted.
    const above = context(winner, run([2, 2, 4], "both", 12, 3.2 * (N_WHOLE - 12)), [rival], new Map([[rival, rivalWhole]]));
    expect(penaltyTiedWholeChoice(above.context)).toBeNull();
    expect(above.fitted).toEqual([]);
  });

  it("keeps the winner where the rival's whole-curve fit does not describe the curve, has the higher whole-curve BIC, or the rival is implausible", () => {
    const winner = run([2, 2, 4], "CB", 10, 244.2);
    const whole = run([2, 2, 4], "both", 12, 2.0 * (N_WHOLE - 12));
    const rival = run([2, 2, 2, 2], "CB", 11, 244.5);
    const undescribed = context(winner, whole, [rival], new Map([[rival, run([2, 2, 2, 2], "both", 13, 1.8 * (N_WHOLE - 13))]]));
    expect(penaltyTiedWholeChoice(undescribed.context)).toBeNull();
    expect(undescribed.fitted).toEqual([rival]);
    // A whole-curve fit that describes the curve (reduced χ² 1.499) but whose BIC is not below the winner's (1.501, just
    // undescribed): the χ² gained (about 1.5) is less than the extra parameter's ln 740 = 6.6.
    const closeWhole = run([2, 2, 4], "both", 12, 1.501 * (N_WHOLE - 12));
    const rivalClose = run([2, 2, 2, 2], "both", 13, 1.499 * (N_WHOLE - 13));
    expect(reduced(rivalClose)).toBeLessThanOrEqual(1.5);
    expect(rivalClose.bic).toBeGreaterThan(closeWhole.bic);
    const higher = context(winner, closeWhole, [rival], new Map([[rival, rivalClose]]));
    expect(penaltyTiedWholeChoice(higher.context)).toBeNull();
    expect(higher.fitted).toEqual([rival]);
    const implausible = context(winner, whole, [rival], new Map([[rival, run([2, 2, 2, 2], "both", 13, 1.0 * (N_WHOLE - 13))]]), new Map(), [rival]);
    expect(penaltyTiedWholeChoice(implausible.context)).toBeNull();
    expect(implausible.fitted).toEqual([]);
  });

  it("fits at most maxRivals layouts, lowest CB-side χ² first, each layout's best run once, and keeps the lowest whole-curve BIC", () => {
    const winner = run([2, 6], "CB", 9, 250.0);
    const whole = run([2, 6], "both", 11, 2.5 * (N_WHOLE - 11));
    const a1 = run([2, 2, 4], "CB", 10, 250.5);
    const a2 = run([2, 2, 4], "CB", 10, 249.9);
    const b = run([2, 2, 2, 2], "CB", 11, 250.1);
    const c3 = run([2, 2, 2], "CB", 10, 251.5);
    const wholeA = run([2, 2, 4], "both", 12, 1.3 * (N_WHOLE - 12));
    const wholeB = run([2, 2, 2, 2], "both", 13, 1.01 * (N_WHOLE - 13));
    const c = context(winner, whole, [a1, a2, b, c3], new Map([[a2, wholeA], [b, wholeB], [c3, run([2, 2, 2], "both", 12, 1.0 * (N_WHOLE - 12))]]));
    const found = penaltyTiedWholeChoice(c.context);
    // 2+2+4's best run (249.9) and 2+2+2+2 (250.1) are the two of lowest χ²; 2+2+2 (251.5) is the third and is not fitted.
    expect(c.fitted).toEqual([a2, b]);
    expect(found?.cb).toBe(b);
    expect(found?.whole).toBe(wholeB);
  });
});
