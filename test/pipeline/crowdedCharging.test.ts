// A p level a fraction of Ec/η after a peak off the ladder (a second-junction resonance) is kept on
// p's charging ladder in place of that peak (lib/assign/crowdedCharging.ts: consecutive charging
// peaks of one level lie Ec/η apart in bias; constant-interaction model, closed form). On draws of
// the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept), simulated by
// the project's model: every expected value is the simulation's truth, the tolerance the project's
// quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { lowEtaDraw, expectTrueP } from "../helpers/lowEtaDraw.ts";

describe("analyzeCurve(curve, { eta }): a p level crowded by a peak read before it (low-η draws)", () => {
  // Draw 13: a resonance at 3.418 V lies between p's first two peaks (3.232, 3.537 V; Ec/η =
  // 0.275 V) and pushed the second off the ladder.
  it("reads p's six charging peaks at the truth with the resonance before a level left out (draw 13)", () => {
    const draw = lowEtaDraw(13);
    const { truth, tolV } = draw;
    const ecV = truth.chargingEnergyEV / truth.eta;
    // The draw is the case: a resonance of the truth lies 0.3–0.8 Ec/η before a p level, clear of the levels.
    const crowding = truth.secondJunctionPeaksV.filter((v) => truth.pPeaksV.some((p) => p - v > 0.3 * ecV && p - v < 0.8 * ecV) && truth.pPeaksV.every((p) => Math.abs(p - v) > tolV));
    expect(crowding.length).toBeGreaterThan(0);
    expectTrueP(draw, crowding);
  }, 30_000);

  // Draw 1081: p's fifth level (3.256 V) found as two peaks 4 mV apart; the weaker, read first, lay
  // a little further from one Ec after p's fourth and was later dropped, leaving p with five.
  it("reads p's six charging peaks at the truth with a level found as two peaks (draw 1081)", () => {
    const draw = lowEtaDraw(1081);
    const { truth, tolV, analysis } = draw;
    // The draw is the case: two peaks within the bar of one p level.
    expect(truth.pPeaksV.some((v) => analysis.peaks.filter((p) => Math.abs(p.biasV - v) <= tolV).length >= 2)).toBe(true);
    expectTrueP(draw, []);
  }, 30_000);
});
