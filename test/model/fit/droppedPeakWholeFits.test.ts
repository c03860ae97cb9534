// droppedPeakWholeFits: the CB ladder in filling order read with one charging peak left out as a
// VB level's substrate-junction resonance. The peak lists are built from the closed form of the
// orthodox ladder in filling order (level j's n-th charging peak at (ε_j + Ec·(N_j + n − ½))/η,
// N_j the electrons below it) with a resonance added among them; the whole-curve stage is checked
// with a run function that stands in for Levenberg–Marquardt (each start's reduced χ² set by hand).
import { describe, it, expect } from "vitest";
import { droppedPeakWholeFits, fillingOrderReading, valencePeaksV, DROPPED_PEAK_DEFAULTS } from "../../../lib/model/fit/droppedPeakWholeFits.ts";
import type { FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import { standInPickingContext } from "../../helpers/standInWholeFit.ts";

// s at 1.0 eV, p split 2+2+2 at 1.3, 1.5, 1.7 eV, Ec 0.12 eV, η 0.55 (closed form above).
const eta = 0.55;
const ecEV = 0.12;
const peak = (epsEV: number, n: number) => (epsEV + ecEV * (n - 0.5)) / eta;
const s = [peak(1.0, 1), peak(1.0, 2)];
const p1 = [peak(1.3, 3), peak(1.3, 4)];
const p2 = [peak(1.5, 5), peak(1.5, 6)];
const p3 = [peak(1.7, 7), peak(1.7, 8)];
// A resonance between s and p (a VB level's, taken by the rules for p's first charging peak).
const resonanceV = (s[1] + p1[0]) / 2;

describe("fillingOrderReading(peaksV, layout, topV)", () => {
  it("DROPPED_PEAK_DEFAULTS are locked", () => {
    expect(DROPPED_PEAK_DEFAULTS).toEqual({ pLayouts: [[6], [2, 4], [2, 2, 2]], maxDropped: 3, maxBudgetSpent: 0.75 });
    expect(Object.isFrozen(DROPPED_PEAK_DEFAULTS)).toBe(true);
  });

  it("reads the levels' entries in filling order, each start on its level (closed form, filling order)", () => {
    const seeds = fillingOrderReading([...s, ...p1, ...p2, ...p3], [2, 2, 2, 2], 10);
    expect(seeds.map((x) => [x.label, x.degeneracy, x.before])).toEqual([["s", 2, 0], ["p1", 2, 2], ["p2", 2, 4], ["p3", 2, 6]]);
    // ε = η·V − Ec·(before + ½) gives back the levels.
    seeds.forEach((x, j) => expect(eta * x.firstPeakV - ecEV * (x.before + 0.5)).toBeCloseTo([1.0, 1.3, 1.5, 1.7][j], 12));
  });

  it("places a split p's last equal sub-level one entry spacing beyond the last where its peaks are unseen, inside the window only (closed form: equal sub-levels enter equally spaced)", () => {
    const seeds = fillingOrderReading([...s, ...p1, ...p2], [2, 2, 2, 2], 10);
    expect(seeds.length).toBe(4);
    expect(seeds[3].before).toBe(6);
    expect(eta * seeds[3].firstPeakV - ecEV * 6.5).toBeCloseTo(1.7, 12);
    expect(fillingOrderReading([...s, ...p1, ...p2], [2, 2, 2, 2], p3[0] - 0.01).length).toBe(3);
    // Not for unequal sub-levels, nor from a single sub-level read.
    expect(fillingOrderReading([...s, ...p1], [2, 2, 4], 10).length).toBe(2);
    expect(fillingOrderReading([...s, ...p1], [2, 2, 2, 2], 10).length).toBe(2);
  });
});

describe("droppedPeakWholeFits(context)", () => {
  const charging = [...s, resonanceV, ...p1, ...p2];
  const topV = 10;
  const analysis = {
    peaks: [{ biasV: -1.9, role: "charging" }, ...charging.map((biasV) => ({ biasV, role: "charging" }))],
    conductance: { biasV: [-3, topV] },
    assignment: { multiplets: [{ band: "CB", peaksV: charging }] },
  };
  const vb = [{ band: "VB", label: "v1", degeneracy: 1, firstPeakV: -1.9, before: 0 }];
  const ladder = { name: "ladder-filling 2+6", kind: "ladder-filling", label: "ladder", analysis, seeds: [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: s[0], before: 0 }, { band: "CB", label: "p", degeneracy: 6, firstPeakV: resonanceV, before: 2 }, ...vb], vbReadings: [vb], cbDegeneracies: [2, 6], states: 21, chargingEnergyStartEV: eta * (s[1] - s[0]), rateRatioStartLog10: 1 } as unknown as FitHypothesis;
  const context = (chiOf: (h: FitHypothesis) => number) => standInPickingContext(chiOf, ecEV, eta, [ladder]);

  it("takes the 2+2+2 reading without the resonance, the last sub-level placed past the peaks, where it alone describes the curve", () => {
    const right = (h: FitHypothesis) => h.seeds.filter((x) => x.band === "CB").map((x) => x.firstPeakV.toFixed(6)).join() === [s[0], p1[0], p2[0], p3[0]].map((v) => v.toFixed(6)).join();
    const found = droppedPeakWholeFits(context((h) => (right(h) ? 1.0 : 12)));
    expect(found?.whole.hypothesis.cbDegeneracies).toEqual([2, 2, 2, 2]);
    expect(found?.whole.hypothesis.name).toContain(`${resonanceV.toFixed(3)} V a resonance`);
    expect(found?.whole.hypothesis.chargingEnergyStartEV).toBeCloseTo(ecEV, 12);
  });

  it("returns null where no reading describes the curve, and without a filling ladder", () => {
    expect(droppedPeakWholeFits(context(() => 12))).toBeNull();
    expect(droppedPeakWholeFits({ ...context(() => 1), hypotheses: [] })).toBeNull();
  });
});

describe("valencePeaksV(peaks)", () => {
  it("keeps the VB peaks below zero bias in their order, the second-junction resonances set aside (exact)", () => {
    // VB charging peaks at −(0.6 + Ec(n − ½))/η, n = 1, 2, η 0.62, Ec 0.15 eV (closed form); a
    // resonance among them and a CB level above zero bias.
    const vb = [1, 2].map((n) => -(0.6 + 0.15 * (n - 0.5)) / 0.62);
    const peaks = [
      { biasV: vb[1], role: "level" },
      { biasV: (vb[0] + vb[1]) / 2, role: "second-junction" },
      { biasV: vb[0], role: "satellite" },
      { biasV: 0.9, role: "level" },
    ];
    expect(valencePeaksV(peaks)).toEqual([vb[1], vb[0]]);
  });
});
