// The tests of notes 4, 10, 5 and 6 of rulesDecisive on shell-tunnelling peak lists at the
// closed-form positions of orthodox theory, (ε + Ec(n + ½))/η: one level's charging peaks form a
// ladder one Ec/η apart; deep in shell tunnelling a level of g states steps in proportion to g.
// Where the expected values come from: the peak positions and step ratios are closed form (above),
// each verdict derived by hand from them against the limits of RULES_DECISIVE_DEFAULTS (common
// practice (no source), as documented there).
import { describe, expect, it } from "vitest";
import { cbLadderPeaks, ecSpacingReasons, evenLadderReasons, splitLadderReasons } from "../../../lib/assign/decisive/tunnelingLadders.ts";
import { assignPeak as peak } from "../../helpers/assignPeak.ts";
import { reading, vbTunnelingV } from "../../helpers/decisiveReading.ts";

const limits = { tolerance: 0.15, sigmas: 3 };

describe("evenLadderReasons(peaks, assignment, limits)", () => {
  it("flags s, p and d 300 mV apart, not with the s→p jump 400 mV", () => {
    const even = reading([0.75, 1.05, 1.35].map((v, i) => peak(v, [1, 3, 5][i] * 1e-11)), vbTunnelingV);
    expect(even.assignment.regime).toBe("shell-tunneling");
    const out = evenLadderReasons(even.peaks, even.assignment, limits);
    expect(out.map((x) => x.code)).toEqual(["even-ladder"]);
    expect(out[0].text).toContain("3 CB peaks whose 2 spacings are alike (300, 300 mV");
    const uneven = reading([0.75, 1.15, 1.35].map((v, i) => peak(v, [1, 3, 5][i] * 1e-11)), vbTunnelingV);
    expect(evenLadderReasons(uneven.peaks, uneven.assignment, limits)).toEqual([]);
  });

  it("flags four levels after s one Ec/η = 0.1 V apart (a p level's charging ladder), not three", () => {
    const ladder = [1.1, 1.2, 1.3, 1.4];
    const four = reading([peak(0.75), ...ladder.map((v) => peak(v))]);
    expect(evenLadderReasons(four.peaks, four.assignment, limits)[0].text).toContain("4 CB peaks after s whose 3 spacings are alike (100, 100, 100 mV");
    const three = reading([peak(0.75), ...ladder.slice(0, 3).map((v) => peak(v))]);
    expect(evenLadderReasons(three.peaks, three.assignment, limits)).toEqual([]);
  });
});

describe("cbLadderPeaks(peaks, assignment)", () => {
  it("gives the CB levels and the satellites set aside above zero bias, the same objects, by bias", () => {
    const { peaks, assignment } = reading([peak(0.75), ...[1.1, 1.2, 1.3, 1.4].map((v, i) => peak(v, (i < 3 ? 1 : 0.4) * 1e-11))], vbTunnelingV);
    const cb = cbLadderPeaks(peaks, assignment);
    expect(cb.map((p) => p.biasV)).toEqual([0.75, 1.1, 1.2, 1.3, 1.4]);
    expect(cb.every((p) => peaks.includes(p as never))).toBe(true);
  });
});

describe("splitLadderReasons(peaks, assignment, limits, satelliteMin, satelliteMax)", () => {
  it("flags p's three sub-levels and a satellite 0.4 × the step before, one Ec/η apart, and not the sub-levels alone", () => {
    const ladder = [1.1, 1.2, 1.3, 1.4];
    const strong = reading([peak(0.75), ...ladder.map((v, i) => peak(v, (i < 3 ? 1 : 0.4) * 1e-11))], vbTunnelingV);
    expect(strong.assignment.multiplets.find((m) => m.label === "p")!.found).toBe(3);
    const out = splitLadderReasons(strong.peaks, strong.assignment, limits, 0.2, 0.8);
    expect(out.map((x) => x.code)).toEqual(["split-ladder"]);
    expect(out[0].text).toContain("(the first 0.40 × the step before it, within 0.2–0.8");
    expect(splitLadderReasons(strong.peaks, strong.assignment, limits, 0.5, 0.8)).toEqual([]);
    const none = reading([peak(0.75), ...ladder.slice(0, 3).map((v) => peak(v))], vbTunnelingV);
    expect(splitLadderReasons(none.peaks, none.assignment, limits, 0.2, 0.8)).toEqual([]);
  });
});

describe("ecSpacingReasons(assignment, tolerance)", () => {
  it("flags sub-levels one Ec apart and Δsp ≈ Ec; says nothing without Ec or outside shell tunnelling", () => {
    const base = reading([0.75, 1.05, 1.35].map((v, i) => peak(v, [1, 3, 5][i] * 1e-11)), vbTunnelingV).assignment;
    const p = base.multiplets.find((m) => m.label === "p")!;
    const split = { ...p, peaksV: [1.05, 1.15], found: 2 };
    const a = { ...base, multiplets: base.multiplets.map((m) => (m === p ? split : m)), quantities: { ...base.quantities, chargingEnergyV: 0.1, levelSpacingSPV: 0.105 } };
    expect(ecSpacingReasons(a, 0.15).map((x) => x.code)).toEqual(["satellite-at-p", "sublevels-one-ec"]);
    expect(ecSpacingReasons(a, 0.15)[1].text).toContain("p split into 2 sub-levels, 100 mV apart");
    expect(ecSpacingReasons({ ...a, quantities: { ...a.quantities, chargingEnergyV: null } }, 0.15)).toEqual([]);
    expect(ecSpacingReasons({ ...a, regime: "shell-filling" }, 0.15)).toEqual([]);
  });
});
