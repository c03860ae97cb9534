// p read again as three spin pairs (each orbital's two electrons charge one Ec apart, so p's six
// charging peaks are three pairs Ec/η wide: constant-interaction model, closed form), on draws of
// the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept), simulated by
// the project's model: every expected value is derived from the simulation's own parameters (its
// truth), the tolerance the project's quality bar (a peak within 25 % of Ec/η: common practice, no
// source).
import { describe, it, expect } from "vitest";
import { lowEtaDraw, expectTrueP, leadResonancesV } from "../helpers/lowEtaDraw.ts";

describe("analyzeCurve(curve, { eta }): p read as three spin pairs past the resonances in it (low-η draws)", () => {
  // Draw 1131: p 2.732, 2.896 | 3.233, 3.397, 3.561, 3.724 V; a VB level's resonance at 3.067 V
  // between the pairs was read in p, and the shell's last peak left out.
  // Draw 115: p 2.779 … 4.109 V (whole, Ec/η = 0.266 V); resonances at 2.740, 3.231 and 3.667 V
  // crowd p's peaks, and p was read with four.
  for (const start of [1131, 115]) {
    it(`reads p's six charging peaks and leaves the resonances out (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      const { analysis: a, truth, tolV } = draw;
      // The draw is the case: a resonance of the truth lies inside p's span, clear of p's peaks.
      const inside = truth.secondJunctionPeaksV.filter((v) => v > truth.pPeaksV[0] && v < truth.pPeaksV[5] && truth.pPeaksV.every((q) => Math.abs(q - v) > tolV));
      expect(inside.length).toBeGreaterThan(0);
      expectTrueP(draw, inside);
      expect(a.assignment.evidence.reasons.some((r) => r.startsWith("p read again as three spin pairs"))).toBe(true);
      // Ec against the truth, within the accuracy benchmark's 10 % for shell filling.
      expect(Math.abs(a.assignment.energies.chargingEnergyEV! / truth.chargingEnergyEV - 1)).toBeLessThan(0.1);
    }, 30_000);
  }
});

describe("analyzeCurve(curve, { eta }): p of the reading the VB's charging doublet makes shell filling (low-η draws)", () => {
  // Draw 181: the first reading is shell tunnelling; the VB's doublet reads shell filling, whose p
  // was led by a resonance at 2.23 V 0.66 Ec/η before p's first peak (sub-groups 1 + 5), its true
  // first peak at 2.762 V set aside. Read as three spin pairs, p is the truth's.
  it("reads p as three spin pairs (draw 181)", () => {
    const draw = lowEtaDraw(181);
    const reasons = draw.analysis.assignment.evidence.reasons;
    // The draw is the case: the reading is the VB doublet's.
    expect(reasons.some((r) => r.includes("the VB's first two main peaks step alike"))).toBe(true);
    expectTrueP(draw, draw.truth.secondJunctionPeaksV.filter((v) => v > 0 && v < draw.truth.pPeaksV[0]));
    expect(reasons.some((r) => r.startsWith("p read again as three spin pairs"))).toBe(true);
  }, 30_000);
  // Draw 1098: the VB doublet's reading opened p with a resonance at 2.686 V (sub-groups 1 + 5),
  // p's first peak at 3.148 V then lying in d's place; set aside (as the resonance of a VB peak, or
  // left out of the spin pairs), p is the truth's.
  it("sets p's odd leading resonance aside (draw 1098)", () => {
    const draw = lowEtaDraw(1098);
    const reasons = draw.analysis.assignment.evidence.reasons;
    expect(reasons.some((r) => r.includes("the VB's first two main peaks step alike"))).toBe(true);
    const lead = draw.truth.secondJunctionPeaksV.filter((v) => v > 0 && v < draw.truth.pPeaksV[0]);
    expect(lead.length).toBeGreaterThan(0);
    expectTrueP(draw, lead);
    expect(reasons.some((r) => r.includes("it opened p with an odd sub-group") || r.startsWith("p read again as three spin pairs"))).toBe(true);
  }, 30_000);
});

describe("analyzeCurve(curve, { eta }): an odd lead set aside where p's ladder then needs a level read as a resonance (low-η draw)", () => {
  // Draw 121: p opened by a VB level's resonance at 2.57 V (sub-groups 1 + 1), p's second peak at
  // 3.203 V set aside as another VB level's resonance (3.16 V predicted) and p's last four read as
  // d. With the lead aside alone p stayed odd (1 + 4); the ladder's rounds, the lead kept aside,
  // give the shared peak back to p.
  it("reads p's six charging peaks (draw 121)", () => {
    const draw = lowEtaDraw(121);
    const lead = leadResonancesV(draw);
    expect(lead.length).toBeGreaterThan(0);
    expectTrueP(draw, lead);
    expect(draw.analysis.assignment.evidence.reasons.some((r) => r.includes("it opened p with an odd sub-group"))).toBe(true);
  }, 30_000);
});

describe("analyzeCurve(curve, { eta }): spin pairs past a level and a resonance split apart (low-η draw)", () => {
  // Draw 2043: a VB level's resonance at 2.891 V, one Ec/η before p's first peak, was read as p's
  // first; p's second peak (3.480 V) and a resonance (3.521 V) were found as two peaks 39 mV apart,
  // the one that is no resonance left unexplained, so the spin pairs could not skip it.
  it("reads p's six charging peaks (draw 2043)", () => {
    const draw = lowEtaDraw(2043);
    const { truth, tolV } = draw;
    // The draw is the case: a resonance within 25 % of Ec/η of a p peak, and one before p.
    expect(truth.secondJunctionPeaksV.some((v) => truth.pPeaksV.some((q) => Math.abs(q - v) < tolV))).toBe(true);
    const lead = leadResonancesV(draw);
    expect(lead.length).toBeGreaterThan(0);
    expectTrueP(draw, lead);
    expect(draw.analysis.assignment.evidence.reasons.some((r) => r.startsWith("p read again as three spin pairs"))).toBe(true);
  }, 30_000);
});

describe("analyzeCurve(curve, { eta }): p read as one peak, a resonance, its six peaks in d (low-η draw)", () => {
  // Draw 1128: a resonance at 2.905 V (truth 2.927 V) was read as p alone and p's six charging
  // peaks (3.366 … 4.262 V) as d; read as three spin pairs, p was the truth's. Since the stronger
  // peak is named at a level's first resonance (ladderResonances note 5) the first reading
  // already holds the truth's p, so the outcome is checked here; the spin-pair stage itself stays
  // under the test above.
  it("reads p's six charging peaks (draw 1128)", () => {
    const draw = lowEtaDraw(1128);
    const lead = leadResonancesV(draw);
    expect(lead.length).toBeGreaterThan(0);
    expectTrueP(draw, lead);
  }, 30_000);
});
