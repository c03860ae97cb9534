// A peak holding a p level and a second-junction resonance at once, set aside by the assignment as
// the resonance alone, is refitted as the two (lib/pipeline/flankLevels.ts, sharedLevelPeaks note 4;
// sharedReadingStands note 1): p then holds its six charging peaks. On draws of the accuracy
// benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept), simulated by the project's
// model: every expected value is the simulation's truth, the tolerance the project's quality bar
// (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { lowEtaDraw, expectTrueP } from "../helpers/lowEtaDraw.ts";

describe("analyzeCurve(curve, { eta }): a p level inside a peak set aside as a resonance (low-η draws)", () => {
  // Draw 2122: p's second charging peak and a VB level's resonance make one peak near 2.955 V that
  // was set aside, and p was read with four peaks. Draw 2177: p's third charging peak and a
  // resonance make one near 3.50 V; p was read with two peaks and its last sub-level as d. Draw
  // 1044: p's fifth and a resonance make one near 3.114 V; p was read full, with the resonance at
  // 3.32 V in that place.
  for (const [start, sharedNearV, alsoV] of [[2122, 2.955, []], [2177, 3.5, []], [1044, 3.114, [3.32]]] as const) {
    it(`reads p's six charging peaks with the shared peak refitted (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      const { truth, tolV } = draw;
      // The draw is the case: a resonance of the truth lies near that peak, and a p level within
      // twice the bar (the shared peak lies between the two).
      const resonances = truth.secondJunctionPeaksV.filter((v) => [sharedNearV, ...alsoV].some((at) => Math.abs(v - at) < tolV));
      expect(resonances.length).toBe(1 + alsoV.length);
      expect(truth.pPeaksV.some((v) => Math.abs(v - sharedNearV) < 2 * tolV)).toBe(true);
      expectTrueP(draw, resonances);
    }, 30_000);
  }
});
