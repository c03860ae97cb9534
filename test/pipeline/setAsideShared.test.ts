// A peak holding a p level and a second-junction resonance at once, set aside by the assignment as
// the resonance alone, is refitted as the two (lib/pipeline/flankLevels.ts, sharedLevelPeaks note 4):
// p then holds its six charging peaks. On a draw of the accuracy benchmark's low-η mix (η 0.55–0.65,
// second-junction resonances kept), simulated by the project's model: every expected value is the
// simulation's truth, the tolerance the project's quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { lowEtaDraw, expectTrueP } from "../helpers/lowEtaDraw.ts";

describe("analyzeCurve(curve, { eta }): a p level inside a peak set aside as a resonance (low-η draw)", () => {
  // Draw 2122: p's second charging peak (2.936 V) and a VB level's resonance (2.971 V) make one
  // peak near 2.955 V that was set aside, and p was read with four peaks.
  it("reads p's six charging peaks with the shared peak refitted (draw 2122)", () => {
    const draw = lowEtaDraw(2122);
    const { truth, tolV } = draw;
    // The draw is the case: a p level of the truth and a resonance of the truth lie within 25 % of Ec/η.
    const shared = truth.secondJunctionPeaksV.filter((v) => v > 0 && truth.pPeaksV.some((q) => Math.abs(q - v) < tolV * 2) && !truth.pPeaksV.some((q) => Math.abs(q - v) < tolV / 2));
    expect(shared.length).toBeGreaterThan(0);
    expectTrueP(draw, shared);
  }, 30_000);
});
