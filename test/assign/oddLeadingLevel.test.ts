// p opened by an odd sub-group at a VB peak's second-junction resonance. Positions are closed
// forms of the orthodox theory of the double-barrier junction: a VB peak at V behind N carriers
// predicts η/(1 − η)·(|V| − N·Ec_V) at positive bias; every p orbital holds two electrons.
import { describe, it, expect } from "vitest";
import { oddLeadingLevel, setAsideSourcePredictions, ODD_LEADING_LEVEL_DEFAULTS } from "../../lib/assign/oddLeadingLevel.ts";

const at = (biasV: number) => ({ biasV, biasUncertaintyV: 0.002, fwhmV: 0.04 });
// η = 0.6 (gain 1.5), Ec_V = 0.2 V: v1 doublet at −1.0, −1.2 V.
const v1 = { band: "VB" as const, label: "v1", degeneracy: null, peakIndices: [2, 1], subgroups: [2] };
const pOf = (subgroups: number[]) => ({ band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [3, 4, 5, 6, 7, 8], subgroups });

describe("oddLeadingLevel(peaks, multiplets, resonances, chargingEnergyV, eta)", () => {
  it("names p's first peak at the resonance of a set-aside VB peak behind the doublet: 1.5·(1.8 − 2·0.2) = 2.1 V", () => {
    const peaks = [-1.8, -1.2, -1.0, 2.1, 2.4, 2.6, 2.8, 3.0, 3.2].map(at);
    const got = oddLeadingLevel(peaks, [pOf([1, 5]), v1], [{ index: 0, sourceIndex: 4, predictedV: -1.8 }], 0.2, 0.6)!;
    expect(got.index).toBe(3);
    expect(got.sourceIndex).toBe(0);
    expect(got.predictedV).toBeCloseTo(2.1, 12);
  });

  it("names it at the resonance of a VB group's own peak: the doublet's first, 1.5 × 1.0 = 1.5 V", () => {
    const peaks = [-1.8, -1.2, -1.0, 1.5, 2.4, 2.6, 2.8, 3.0, 3.2].map(at);
    expect(oddLeadingLevel(peaks, [pOf([1, 5]), v1], [], 0.2, 0.6)?.sourceIndex).toBe(2);
  });

  it("leaves an even first sub-group, a p with no prediction at its first peak, and η = 1", () => {
    const peaks = [-1.8, -1.2, -1.0, 2.1, 2.4, 2.6, 2.8, 3.0, 3.2].map(at);
    const aside = [{ index: 0, sourceIndex: 4, predictedV: -1.8 }];
    expect(oddLeadingLevel(peaks, [pOf([2, 4]), v1], aside, 0.2, 0.6)).toBeNull();
    expect(oddLeadingLevel(peaks, [pOf([1, 5]), v1], [], 0.2, 0.6)).toBeNull();
    expect(oddLeadingLevel(peaks, [pOf([1, 5]), v1], aside, 0.2, 1)).toBeNull();
  });

  it("ODD_LEADING_LEVEL_DEFAULTS are locked: an empty band, a doublet, a doublet and a four, …", () => {
    expect(ODD_LEADING_LEVEL_DEFAULTS).toEqual({ carriersBelow: [0, 2, 4, 6], continuationTolerance: 0.25 });
  });
});

describe("oddLeadingLevel: a p of six whose ladder runs on", () => {
  it("names p's first peak where the next shell's first peak lies one Ec_V after p's last (a seventh charging peak)", () => {
    // p read as 2.1, 2.3 … 3.1 V (six, one group) and d at 3.3 V: one Ec_V = 0.2 V after p's last.
    const peaks = [-1.8, -1.2, -1.0, 2.1, 2.3, 2.5, 2.7, 2.9, 3.1, 3.3].map(at);
    const p6 = { band: "CB" as const, label: "p", degeneracy: 6, peakIndices: [3, 4, 5, 6, 7, 8], subgroups: [6] };
    const d = { band: "CB" as const, label: "d", degeneracy: 10, peakIndices: [9], subgroups: [1] };
    const aside = [{ index: 0, sourceIndex: 4, predictedV: -1.8 }];
    expect(oddLeadingLevel(peaks, [p6, d, v1], aside, 0.2, 0.6)?.index).toBe(3);
    // d a level spacing beyond (0.5 V after p's last): p stops at six.
    const far = [-1.8, -1.2, -1.0, 2.1, 2.3, 2.5, 2.7, 2.9, 3.1, 3.6].map(at);
    expect(oddLeadingLevel(far, [p6, d, v1], aside, 0.2, 0.6)).toBeNull();
  });
});

describe("setAsideSourcePredictions(peaks, resonances, chargingEnergyV, eta)", () => {
  it("gives 1.5·(|V| − N·0.2) for N = 0 and 2 behind two nearer VB peaks (closed form), nothing for a CB peak", () => {
    const peaks = [-1.8, -1.2, -1.0, 2.1].map((biasV) => ({ biasV }));
    const got = setAsideSourcePredictions(peaks, [{ index: 0 }, { index: 3 }], 0.2, 0.6);
    expect(got.map((r) => r.sourceIndex)).toEqual([0, 0]);
    expect(got[0].predictedV).toBeCloseTo(2.7, 12);
    expect(got[1].predictedV).toBeCloseTo(2.1, 12);
    expect(setAsideSourcePredictions(peaks, [{ index: 0 }], 0.2, 1)).toEqual([]);
  });
});
