// tiedSplitRefinement on constructed CB-side runs: which refinement of the winner splits its p
// shell and ties with it. Expected answers follow from the documented rule by hand (a refinement
// of the winner's grouping with more CB p levels, BIC less than tieMargin above the winner's;
// BIC differences below 2 are ties: common practice (no source)).
import { describe, expect, it } from "vitest";
import { tiedSplitRefinement, TIED_SPLIT_REFINEMENT_DEFAULTS } from "../../../lib/model/fit/tiedSplitRefinement.ts";
import type { FitTrial } from "../../../lib/model/fit/fitTrial.ts";

/** A run of the grouping `name` with the given CB p degeneracies (s doublet first), side and BIC. */
function run(name: string, p: number[], bic: number, side: "CB" | "both" = "CB"): FitTrial {
  const seeds = [{ band: "CB", label: "s", degeneracy: 2 }, ...p.map((d, i) => ({ band: "CB", label: p.length > 1 ? `p${i + 1}` : "p", degeneracy: d })), { band: "VB", label: "v1", degeneracy: 2 }];
  return { hypothesis: { name, seeds }, side, bic } as unknown as FitTrial;
}

describe("tiedSplitRefinement(winner, trials)", () => {
  it("TIED_SPLIT_REFINEMENT_DEFAULTS are locked and frozen", () => {
    expect(TIED_SPLIT_REFINEMENT_DEFAULTS).toEqual({ tieMargin: 2 });
    expect(Object.isFrozen(TIED_SPLIT_REFINEMENT_DEFAULTS)).toBe(true);
  });

  it("finds the winner's p split 2+4 that ties with it on the CB side (BIC 0.1 above), not a rate-ratio restart or another grouping's split", () => {
    const winner = run("ladder-empty-1 2+6", [6], 286.4);
    const restart = run("ladder-empty-1 2+6, refined to 2+6 (Γtip/Γsub × 0.32)", [6], 286.4);
    const split = run("ladder-empty-1 2+6, refined to 2+2+4 (p split 2+4, sub-levels 61 meV apart)", [2, 4], 286.5);
    const far = run("ladder-empty-1 2+6, refined to 2+2+2+2 (p split 2+2+2, sub-levels 158 meV apart)", [2, 2, 2], 363.6);
    const other = run("ladder-empty 2+6, refined to 2+2+4 (p split 2+4, sub-levels 60 meV apart)", [2, 4], 286.0);
    const whole = run("ladder-empty-1 2+6, refined to 2+2+4 (p split 2+4)", [2, 4], 100, "both");
    expect(tiedSplitRefinement(winner, [winner, restart, far, other, whole, split])).toBe(split);
  });

  it("finds none where the split is worse by the tie margin or more, or the winner is on the whole curve", () => {
    const winner = run("ladder-empty-1 2+6", [6], 286.4);
    expect(tiedSplitRefinement(winner, [winner, run("ladder-empty-1 2+6, refined to 2+2+4 (p split 2+4)", [2, 4], 288.4)])).toBeNull();
    const onWhole = run("ladder-empty-1 2+6", [6], 786.4, "both");
    expect(tiedSplitRefinement(onWhole, [onWhole, run("ladder-empty-1 2+6, refined to 2+2+4 (p split 2+4)", [2, 4], 786.5)])).toBeNull();
  });

  it("counts a split winner's further split (2+4 into 2+2+2) and not its own layout again", () => {
    const winner = run("ladder-empty-1 2+6, refined to 2+2+4 (p split 2+4)", [2, 4], 291.7);
    const same = run("ladder-empty-1 2+6, refined to 2+2+4 (p split 2+4, sub-levels 88 meV apart)", [2, 4], 291.0);
    const finer = run("ladder-empty-1 2+6, refined to 2+2+2+2 (p split 2+2+2)", [2, 2, 2], 293.5);
    expect(tiedSplitRefinement(winner, [winner, same, finer])).toBe(finer);
  });
});
