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
  // resonance make one near 3.50 V; p was read with two peaks and its last sub-level as d.
  for (const [start, sharedNearV] of [[2122, 2.955], [2177, 3.5]] as const) {
    it(`reads p's six charging peaks with the shared peak refitted (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      const { truth, tolV } = draw;
      // The draw is the case: a p level and a resonance of the truth both lie near that peak.
      const resonances = truth.secondJunctionPeaksV.filter((v) => Math.abs(v - sharedNearV) < tolV);
      expect(resonances.length).toBeGreaterThan(0);
      expect(truth.pPeaksV.some((v) => Math.abs(v - sharedNearV) < tolV)).toBe(true);
      expectTrueP(draw, resonances);
    }, 30_000);
  }
});
