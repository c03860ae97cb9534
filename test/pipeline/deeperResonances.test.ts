// A shell-tunnelling dot's deeper VB level shows resonances through the substrate junction
// k·Ec/(1 − η) beyond its plain −η·V/(1 − η) once the substrate side is seen to fill
// (lib/assign/secondJunction.ts, deeperChargingResonances). On draws of the accuracy benchmark's
// low-η mix (η 0.55–0.65, second-junction resonances kept), simulated by the project's model:
// every expected value is the simulation's truth or its parameters, the tolerance the project's
// quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { lowEtaDraw } from "../helpers/lowEtaDraw.ts";
import { expectClose } from "../helpers/expectClose.ts";

describe("analyzeCurve(curve, { eta }): a deeper VB level's substrate-side charging resonance is no CB level (low-η draws)", () => {
  // Draw 31 (shell tunnelling): v1's resonance and its second charging peak lead s; v2's
  // resonance two substrate charging steps beyond its plain one fell between s and p, was read
  // as the second CB level, and the regime was named from a resonance.
  it("the simulation's truth holds v2's resonances at its plain prediction + k·Ec/(1 − η), k = 1, 2 (closed form on the draw's parameters)", () => {
    const { scenario, truth } = lowEtaDraw(31, "shell-tunneling");
    const { eta, chargingEnergyEV: ec } = truth;
    const v2 = [...scenario.vb].sort((a, b) => b.energyEV - a.energyEV)[1];
    // Tip side (ε + Ec/2)/η; plain substrate side (ε + Ec/2)/(1 − η) (orthodox theory).
    const plainV = (Math.abs(v2.energyEV) + ec / 2) / (1 - eta);
    for (const k of [1, 2]) {
      const expected = plainV + (k * ec) / (1 - eta);
      const nearest = truth.secondJunctionPeaksV.reduce((a, b) => (Math.abs(b - expected) < Math.abs(a - expected) ? b : a));
      expectClose(nearest, expected, { atol: 0.005, what: `v2's resonance k = ${k} (model's plateau positions, closed form)` });
    }
  }, 30_000);

  it("reads s and p at the truth's levels with the resonance left out (draw 31)", () => {
    const { analysis: a, truth, tolV } = lowEtaDraw(31, "shell-tunneling");
    expect(a.assignment.regime).toBe("shell-tunneling");
    const shell = (label: string) => a.assignment.multiplets.find((m) => m.band === "CB" && m.label === label)!;
    expectClose(shell("s").peaksV, truth.sPeaksV, { atol: tolV, what: "s, the simulation's truth" });
    expectClose(shell("p").peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
    // The truth's resonances between s and p are in no multiplet.
    const between = truth.secondJunctionPeaksV.filter((v) => v > truth.sPeaksV[0] + tolV && v < truth.pPeaksV[0] - tolV);
    expect(between.length).toBeGreaterThan(0);
    const inMultiplet = a.assignment.multiplets.flatMap((m) => m.peaksV);
    for (const v of between) expect(inMultiplet.some((q) => Math.abs(q - v) < tolV / 2), `a multiplet holds the resonance at ${v} V`).toBe(false);
  }, 30_000);
});

describe("analyzeCurve(curve, { eta }): a level beside a nearer resonance of the same prediction stays a level (low-η draw)", () => {
  // Draw 1169 (shell tunnelling): v1's resonance lies 15 mV below p's third level; both peaks
  // matched the one prediction, and p was read with two levels.
  it("reads p's three levels at the truth's (draw 1169)", () => {
    const { analysis: a, truth, tolV } = lowEtaDraw(1169, "shell-tunneling");
    // The draw is the case: a resonance of the truth within a quarter of Ec/η of a p level.
    expect(truth.secondJunctionPeaksV.some((v) => truth.pPeaksV.some((p) => Math.abs(p - v) < tolV))).toBe(true);
    expect(a.assignment.regime).toBe("shell-tunneling");
    const p = a.assignment.multiplets.find((m) => m.band === "CB" && m.label === "p")!;
    expectClose(p.peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
  }, 30_000);
});
