// A p charging peak and a second-junction resonance less than a FWHM apart make one peak with no
// conductance maximum at the level; the refit of the shared peak (lib/pipeline/flankLevels.ts,
// sharedLevelPeaks note 2) places the level where its step is, with a step that the fit gives
// at 0.55–0.6 of the shell's other steps (FLANK_LEVELS_DEFAULTS.sharedLevelStepRatio), and
// refits a peak stepping as a level and a resonance that no level of the reading predicts
// (note 5, FLANK_LEVELS_DEFAULTS.unpredictedStepRatio). On draws
// of the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept), simulated
// by the project's model: every expected value is the simulation's truth, the tolerance the
// project's quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { lowEtaDraw, expectTrueP } from "../helpers/lowEtaDraw.ts";

describe("analyzeCurve(curve, { eta }): a p level under a resonance's peak (low-η draws)", () => {
  // Draw 2146: p's sixth charging peak lies 0.09 V above a resonance near 3.80 V; p had kept the
  // shared peak at the resonance, 0.07 V from the level. Draw 1124: p's first lies 0.05 V below
  // a resonance near 2.94 V; p had kept the resonance's position for it.
  for (const [start, resonanceNearV, level] of [[2146, 3.8, 5], [1124, 2.94, 0]] as const) {
    it(`reads p's six charging peaks with the level beside the resonance (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      const { truth, tolV, analysis } = draw;
      // The draw is the case: one resonance of the truth near that peak, within a bar of the level
      // and further from it than half a bar (the shared peak alone, at the resonance, fails the bar
      // or lies at its edge).
      const resonances = truth.secondJunctionPeaksV.filter((v) => Math.abs(v - resonanceNearV) < tolV);
      expect(resonances.length).toBe(1);
      const apart = Math.abs(truth.pPeaksV[level] - resonances[0]);
      expect(apart).toBeGreaterThan(tolV / 2);
      expect(apart).toBeLessThan(tolV * 2);
      expectTrueP(draw, resonances);
      // The level's peak lies nearer its truth than the resonance's position does.
      const p = analysis.assignment.multiplets.find((m) => m.band === "CB" && m.label === "p")!;
      expect(Math.abs(p.peaksV[level] - truth.pPeaksV[level])).toBeLessThan(apart);
    }, 30_000);
  }
});

describe("analyzeCurve(curve, { eta }): a p level under a resonance none predicts (low-η draws)", () => {
  // Draw 2155: p's fourth charging peak lies 0.08 V above a resonance near 3.20 V; p had kept
  // their one peak (three levels' step) at the resonance. Draw 14: p's fourth lies 0.10 V below
  // a resonance near 3.47 V; p had kept their one peak 0.09 V above the level.
  for (const [start, resonanceNearV, level] of [[2155, 3.2, 3], [14, 3.47, 3]] as const) {
    it(`reads p's six charging peaks with the level beside the resonance (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      const { truth, tolV, analysis } = draw;
      // The draw is the case: one resonance of the truth near that peak, more than a bar from the
      // level and less than two (one peak for both, off the level by more than the bar).
      const resonances = truth.secondJunctionPeaksV.filter((v) => Math.abs(v - resonanceNearV) < tolV / 2);
      expect(resonances.length).toBe(1);
      const apart = Math.abs(truth.pPeaksV[level] - resonances[0]);
      expect(apart).toBeGreaterThan(tolV);
      expect(apart).toBeLessThan(tolV * 2);
      expectTrueP(draw, resonances);
    }, 30_000);
  }
});
