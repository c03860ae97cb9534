// tunnelingResonanceReasons (notes 28 and 29 of rulesDecisive) on peak lists built from closed forms
// (each expected number below derived from them by hand):
// - positions (source: closed form of the constant-interaction model with the voltage division of a
//   double-barrier junction, orthodox theory; D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena
//   in Solids, Elsevier 1991): a level at ε shows through the tip junction at ±(|ε| + Ec/2)/η, its
//   plain second-junction resonance at ∓(|ε| + Ec/2)/(1 − η), and (the substrate side filling it in
//   shell tunnelling) its next charging peak through that junction at ∓(|ε| + 3Ec/2)/(1 − η);
// - steps (source: closed form, master equation with one extra carrier; E. Bonet, M. M. Deshmukh and
//   D. C. Ralph, Phys. Rev. B 65, 045317 (2002)): a resonance alone steps (g·r + 1)/(g + r) × its
//   source, 1.1/2.05 = 0.537 for g = 2, r = Γtip/Γsub = 0.05; a level merged with it steps the sum.
// The assignments are written out by hand (the reading the rules would give), so that each case
// isolates one note; the thresholds are TUNNELING_RESONANCE_DEFAULTS (1 and 1: the step bound of the
// closed form and one FWHM of overlap; 3 chosen on the accuracy benchmark).
import { describe, expect, it } from "vitest";
import {
  tunnelingResonanceReasons,
  TUNNELING_RESONANCE_DEFAULTS,
  type TunnelingResonanceAssignment,
} from "../../../lib/assign/decisive/tunnelingResonances.ts";
import { rulesDecisive } from "../../../lib/assign/rulesDecisive.ts";
import { substrateToTipStepRatio } from "../../../lib/model/regimeLimits.ts";
import { expectDocumentedDefaults } from "../../helpers/documentedDefaults.ts";
import { expectError } from "../../helpers/errors.ts";

const eta = 0.6, ec = 0.1, r = 0.05;
const tipV = (e: number) => Math.sign(e) * (Math.abs(e) + ec / 2) / eta;
const plainResonanceV = (e: number) => -Math.sign(e) * (Math.abs(e) + ec / 2) / (1 - eta);
const substrateSecondV = (e: number) => -Math.sign(e) * (Math.abs(e) + (3 * ec) / 2) / (1 - eta);
const resonanceStep = substrateToTipStepRatio(2, r); // 1.1/2.05
const STEP = 1e-12;
const pk = (biasV: number, step = 1, fwhmV = 0.06) => ({ biasV, fwhmV, stepA: step * STEP });
const mult = (band: "CB" | "VB", label: string, ...peakIndices: number[]) => ({ band, label, peakIndices });

// Note 28. s at 1.15 eV (2.0 V); p split into 1.45, 1.53, 1.61 eV (2.5, 2.6333, 2.7667 V); the VB edge
// level at −0.95 eV (−1.6667 V), whose plain resonance lies at 1.0/0.4 = 2.5 V, on p's first sub-level.
const sE = 1.15, pE = [1.45, 1.53, 1.61], vE = -0.95;

describe("tunnelingResonanceReasons(peaks, assignment, options)", () => {
  it("TUNNELING_RESONANCE_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(TUNNELING_RESONANCE_DEFAULTS).toEqual({ heldLevelStepMin: 1, overlapFwhms: 1, valenceLevelsMin: 3 });
    expect(Object.isFrozen(TUNNELING_RESONANCE_DEFAULTS)).toBe(true);
    expectDocumentedDefaults(new URL("../../../lib/assign/decisive/tunnelingResonances.ts", import.meta.url), "TunnelingResonanceOptions", TUNNELING_RESONANCE_DEFAULTS);
  });

  it("the closed-form positions and step used below", () => {
    expect(tipV(sE)).toBeCloseTo(2.0, 12);
    expect(pE.map(tipV)).toEqual([2.5, 1.58 / 0.6, 1.66 / 0.6].map((v) => expect.closeTo(v, 12)));
    expect(tipV(vE)).toBeCloseTo(-1.0 / 0.6, 12);
    expect(plainResonanceV(vE)).toBeCloseTo(2.5, 12);
    expect(plainResonanceV(sE)).toBeCloseTo(-3.0, 12);
    expect(substrateSecondV(sE)).toBeCloseTo(-3.25, 12);
    expect(resonanceStep).toBeCloseTo(1.1 / 2.05, 12);
  });

  it("note 28: p's first sub-level merged with the VB edge level's resonance and set aside as it (1.54 × its source) leaves p two levels: flagged", () => {
    // peaks: 0 v1, 1 s, 2 merged p1 + resonance (step 1 + 0.537), 3 p2, 4 p3.
    const peaks = [pk(tipV(vE)), pk(tipV(sE)), pk(2.5, 1 + resonanceStep), pk(tipV(pE[1])), pk(tipV(pE[2]))];
    const a: TunnelingResonanceAssignment = {
      regime: "shell-tunneling",
      multiplets: [mult("CB", "s", 1), mult("CB", "p", 3, 4), mult("VB", "v1", 0)],
      evidence: { secondJunction: [{ index: 2, sourceIndex: 0, predictedV: plainResonanceV(vE) }] },
    };
    const reasons = tunnelingResonanceReasons(peaks, a);
    expect(reasons.map((x) => x.code)).toEqual(["resonance-held-level"]);
    expect(reasons[0].text).toContain("p read as 2 levels");
    expect(reasons[0].text).toContain("the CB peak at 2.500 V set aside as the resonance of the peak at -1.667 V although it steps 1.54 × its source");
    // The resonance alone (0.537 × its source) is what a resonance steps: nothing to say.
    const alone = peaks.map((p, i) => (i === 2 ? pk(2.5, resonanceStep) : p));
    expect(tunnelingResonanceReasons(alone, a)).toEqual([]);
    // A threshold above 1.54 lets the merged peak pass.
    expect(tunnelingResonanceReasons(peaks, a, { heldLevelStepMin: 1.6 })).toEqual([]);
    // p read with its three sub-levels (the resonance a peak of its own beside them): not short.
    expect(tunnelingResonanceReasons(peaks, { ...a, multiplets: [mult("CB", "s", 1), mult("CB", "p", 2, 3, 4), mult("VB", "v1", 0)] })).toEqual([]);
    // A shell-filling reading is note 27's.
    expect(tunnelingResonanceReasons(peaks, { ...a, regime: "shell-filling" })).toEqual([]);
  });

  it("note 28: a strong resonance overlapping a level within one FWHM shares that level's step: not flagged", () => {
    // The VB edge level at −0.99 eV: resonance at 1.04/0.4 = 2.6 V, 33 mV from p2 (2.6333 V), inside its 60 mV FWHM.
    const v = -0.99;
    expect(plainResonanceV(v)).toBeCloseTo(2.6, 12);
    const peaks = [pk(tipV(v)), pk(tipV(sE)), pk(tipV(pE[1])), pk(plainResonanceV(v), 1 + resonanceStep)];
    const a: TunnelingResonanceAssignment = {
      regime: "shell-tunneling",
      multiplets: [mult("CB", "s", 1), mult("CB", "p", 2), mult("VB", "v1", 0)],
      evidence: { secondJunction: [{ index: 3, sourceIndex: 0, predictedV: plainResonanceV(v) }] },
    };
    expect(tunnelingResonanceReasons(peaks, a)).toEqual([]);
    // With the overlap test narrowed to 0.5 FWHM (30 mV < 33 mV) the same peak is flagged.
    expect(tunnelingResonanceReasons(peaks, a, { overlapFwhms: 0.5 }).map((x) => x.code)).toEqual(["resonance-held-level"]);
  });

  it("note 28: two peaks set aside for one prediction (one resonance per prediction), weak as they are: flagged", () => {
    // The resonance alone at 2.5 V and p's third sub-level at 2.7667 V both set aside as it.
    const peaks = [pk(tipV(vE)), pk(tipV(sE)), pk(2.5, resonanceStep), pk(tipV(pE[1])), pk(tipV(pE[2]), resonanceStep)];
    const a: TunnelingResonanceAssignment = {
      regime: "shell-tunneling",
      multiplets: [mult("CB", "s", 1), mult("CB", "p", 3), mult("VB", "v1", 0)],
      evidence: { secondJunction: [2, 4].map((index) => ({ index, sourceIndex: 0, predictedV: plainResonanceV(vE) })) },
    };
    const reasons = tunnelingResonanceReasons(peaks, a);
    expect(reasons.map((x) => x.code)).toEqual(["resonance-held-level"]);
    expect(reasons[0].text).toContain("another peak is set aside for the same prediction (2.500 V");
    // One of them alone: nothing to say.
    expect(tunnelingResonanceReasons(peaks, { ...a, evidence: { secondJunction: [a.evidence.secondJunction[0]] } })).toEqual([]);
  });

  it("note 29: s's next charging peak through the substrate junction (−3.25 V) read as a third VB level beyond s's resonance (−3.0 V): flagged; not with two VB levels, nor with all VB levels nearer than the resonance", () => {
    // VB levels at −0.95 and −1.40 eV: −1.6667 and −2.4167 V.
    const vbV = [tipV(vE), tipV(-1.4)];
    expect(vbV[1]).toBeCloseTo(-1.45 / 0.6, 12);
    // peaks: 0 substrate second of s (−3.25), 1 resonance of s (−3.0), 2 v2, 3 v1, 4 s.
    const peaks = [pk(substrateSecondV(sE)), pk(plainResonanceV(sE), resonanceStep), pk(vbV[1]), pk(vbV[0]), pk(tipV(sE))];
    const a: TunnelingResonanceAssignment = {
      regime: "shell-tunneling",
      multiplets: [mult("CB", "s", 4), mult("VB", "v1", 3), mult("VB", "v2", 2), mult("VB", "v3", 0)],
      evidence: { secondJunction: [{ index: 1, sourceIndex: 4, predictedV: -eta * tipV(sE) / (1 - eta) }] },
    };
    const reasons = tunnelingResonanceReasons(peaks, a);
    expect(reasons.map((x) => x.code)).toEqual(["vb-beyond-resonance"]);
    expect(reasons[0].text).toContain("1 of 3 VB levels read beyond -3.000 V, a peak set aside as the resonance of the CB level at 2.000 V");
    // The substrate peak left unread: two VB levels, below valenceLevelsMin.
    expect(tunnelingResonanceReasons(peaks, { ...a, multiplets: a.multiplets.slice(0, 3) })).toEqual([]);
    expect(tunnelingResonanceReasons(peaks, { ...a, multiplets: a.multiplets.slice(0, 3) }, { valenceLevelsMin: 2 })).toEqual([]);
    // Three VB levels, all nearer 0 V than the resonance (a third at −2.8 V): nothing to say.
    const nearer = peaks.map((p, i) => (i === 0 ? pk(-2.8) : p));
    expect(tunnelingResonanceReasons(nearer, a)).toEqual([]);
    // A VB-side resonance of a VB peak is not a CB level's: nothing to say.
    expect(tunnelingResonanceReasons(peaks, { ...a, evidence: { secondJunction: [{ index: 1, sourceIndex: 3, predictedV: -3.0 }] } })).toEqual([]);
  });

  it("reaches rulesDecisive as its notes 28 and 29", () => {
    const peaks = [pk(tipV(vE)), pk(tipV(sE)), pk(2.5, 1 + resonanceStep), pk(tipV(pE[1])), pk(tipV(pE[2]))].map((p) => ({ ...p, biasUncertaintyV: 0.001 }));
    const full = (label: string, band: "CB" | "VB", idx: number[]) => ({ ...mult(band, label, ...idx), peaksV: idx.map((i) => peaks[i].biasV), subgroups: [idx.length], degeneracy: band === "CB" ? (label === "s" ? 2 : 6) : null, found: idx.length, expected: idx.length, peakUncertaintiesV: idx.map(() => 0.001) });
    const assignment = {
      regime: "shell-tunneling" as const,
      multiplets: [full("s", "CB", [1]), full("p", "CB", [3, 4]), full("v1", "VB", [0])],
      noLevels: null,
      quantities: { chargingEnergyV: null, gapV: null, levelSpacingSPV: null },
      uncertainties: {},
      evidence: { secondToFirstStepRatio: null, reasons: [], satellitePeakIndices: [], secondJunction: [{ index: 2, sourceIndex: 0, predictedV: 2.5 }] },
      energies: { eta, etaGiven: true },
    };
    const verdict = rulesDecisive({ peaks, assignment: assignment as never, biasRangeV: [-2, 3] });
    expect(verdict.codes).toContain("resonance-held-level");
    expect(verdict.decisive).toBe(false);
  });

  it("rejects options out of range", () => {
    const a: TunnelingResonanceAssignment = { regime: "shell-tunneling", multiplets: [], evidence: { secondJunction: [] } };
    expectError(() => tunnelingResonanceReasons([], a, { heldLevelStepMin: -1 }), "options/out-of-range");
    expectError(() => tunnelingResonanceReasons([], a, { valenceLevelsMin: 0 }), "options/out-of-range");
  });
});
