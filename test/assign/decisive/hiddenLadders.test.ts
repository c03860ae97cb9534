// hiddenLadderReasons (notes 25 and 26 of rulesDecisive) on peak lists built from the closed form of
// the constant-interaction model for the positions (source: closed form; each expected number below
// derived from it by hand): one level's charging peaks at ±(|ε| + Ec·(n + ½))/η, one Ec/η apart in
// bias, n counting the carriers already on the dot (electrons on the CB side, holes on the VB side);
// a spin-degenerate (2-state) level shows two, the second level's first at n = 2. Single levels in
// shell tunnelling show one peak each at |ε|/η (plus Ec/2), spaced by their level spacings. The
// assignments are written out by hand (the reading the rules would give), so that each case isolates
// one note; the thresholds are HIDDEN_LADDER_DEFAULTS (chosen on the accuracy benchmark).
import { describe, expect, it } from "vitest";
import { hiddenLadderReasons, HIDDEN_LADDER_DEFAULTS, type HiddenLadderAssignment } from "../../../lib/assign/decisive/hiddenLadders.ts";
import { rulesDecisive } from "../../../lib/assign/rulesDecisive.ts";
import { assignPeak } from "../../helpers/assignPeak.ts";
import { expectDocumentedDefaults } from "../../helpers/documentedDefaults.ts";
import { expectError } from "../../helpers/errors.ts";

// ε_p = 0.8 eV (one 6-state level), Ec = 0.1 eV, η = 0.8: p's charging peaks at (0.8 + 0.1(n + ½))/0.8,
// n = 2 … 7 (s holds two), 0.125 V apart: 1.3125, 1.4375, …, 1.9375 V.
const eta = 0.8, ec = 0.1;
const spacingV = ec / eta;
const pV = [2, 3, 4, 5, 6, 7].map((n) => (0.8 + ec * (n + 0.5)) / eta);

/** A multiplet of the given positions, in one sub-group. */
const group = (band: "CB" | "VB", label: string, peaksV: number[], first = 0) => ({
  band,
  label,
  peaksV,
  peakIndices: peaksV.map((_, i) => first + i),
  subgroups: [peaksV.length],
});

/** The rules' words for a charging peak they kept under a resonance (as ladderLevels writes them). */
const kept = (v: number, resonanceV: number) =>
  `peak at ${v.toFixed(3)} V kept as a charging peak of p: it lies where the ladder expects one (one Ec from a neighbour, none closer than 0.7 Ec) and p needs it; the resonance at ${resonanceV.toFixed(3)} V overlaps it`;

describe("hiddenLadderReasons(peaks, assignment, options)", () => {
  it("HIDDEN_LADDER_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(HIDDEN_LADDER_DEFAULTS).toEqual({ pulledPeakTolerance: 0.16, pairSpacingTolerance: 0.1, pairGapRatioMax: 0.6 });
    expect(Object.isFrozen(HIDDEN_LADDER_DEFAULTS)).toBe(true);
    expectDocumentedDefaults(new URL("../../../lib/assign/decisive/hiddenLadders.ts", import.meta.url), "HiddenLadderOptions", HIDDEN_LADDER_DEFAULTS);
  });

  it("note 25: flags p's first charging peak kept under a resonance and pulled 30 mV low (0.24 of the 125 mV spacing); not 10 mV (0.08), nor a pulled peak not kept under a resonance", () => {
    const pulled = [pV[0] - 0.03, ...pV.slice(1)];
    const peaks = pulled.map((v) => assignPeak(v));
    const a: HiddenLadderAssignment = { regime: "shell-filling", multiplets: [group("CB", "p", pulled)], evidence: { reasons: [kept(pulled[0], pV[0] - 0.05)] } };
    const reasons = hiddenLadderReasons(peaks, a);
    expect(reasons.map((r) => r.code)).toEqual(["pulled-charging-peak"]);
    // Derived: the ladder puts it one spacing (125 mV) below 1.4375 V, at 1.3125 V; the peak is 30 mV lower.
    expect(reasons[0].text).toContain("0.24 × its sub-group's spacing (125 mV) from where the ladder puts it (1.313 V; > 0.16)");
    expect(hiddenLadderReasons(peaks, a, { pulledPeakTolerance: 0.3 })).toEqual([]);
    const near = [pV[0] - 0.01, ...pV.slice(1)];
    expect(hiddenLadderReasons(near.map((v) => assignPeak(v)), { ...a, multiplets: [group("CB", "p", near)], evidence: { reasons: [kept(near[0], pV[0] - 0.05)] } })).toEqual([]);
    expect(hiddenLadderReasons(peaks, { ...a, evidence: { reasons: [] } })).toEqual([]);
    expect(hiddenLadderReasons(peaks, { ...a, regime: "shell-tunneling" })).toEqual([]);
    expect(spacingV).toBeCloseTo(0.125, 12);
  });

  it("note 26: flags a tunnelling reading of the VB's two 2-state levels' charging pairs as four single levels; not four levels with unlike spacings, nor alike spacings with no wider gap between", () => {
    // Filling: hole levels at 0.6 and 0.9 eV; peaks at −(0.6 + 0.1(n + ½))/0.8 for n = 0, 1 and
    // −(0.9 + 0.1(n + ½))/0.8 for n = 2, 3: −0.8125, −0.9375, −1.4375, −1.5625 V (spacings 125, 500, 125 mV).
    const pairsV = [-0.8125, -0.9375, -1.4375, -1.5625];
    const vb = (vs: number[]) => vs.map((v, i) => group("VB", `v${i + 1}`, [v], i));
    const reasons = hiddenLadderReasons(pairsV.map((v) => assignPeak(v)), { regime: "shell-tunneling", multiplets: vb(pairsV), evidence: { reasons: [] } });
    expect(reasons.map((r) => r.code)).toEqual(["vb-charging-pairs"]);
    expect(reasons[0].text).toContain("pairs 125 and 125 mV apart (alike within 0.1), 500 mV between the pairs");
    // Tunnelling: single levels at 0.6, 0.75, 1.0, 1.4 eV: peaks (|ε| + Ec/2)/0.8, spacings 188, 313, 500 mV.
    const singleV = [0.6, 0.75, 1.0, 1.4].map((e) => -(e + ec / 2) / eta);
    expect(hiddenLadderReasons(singleV.map((v) => assignPeak(v)), { regime: "shell-tunneling", multiplets: vb(singleV), evidence: { reasons: [] } })).toEqual([]);
    // An even ladder (spacings 125, 150, 125 mV): no wider gap between the pairs.
    const evenV = [-0.8125, -0.9375, -1.0875, -1.2125];
    expect(hiddenLadderReasons(evenV.map((v) => assignPeak(v)), { regime: "shell-tunneling", multiplets: vb(evenV), evidence: { reasons: [] } })).toEqual([]);
    // A shell-filling reading of the same pairs is what the note asks for: nothing to say.
    expect(hiddenLadderReasons(pairsV.map((v) => assignPeak(v)), { regime: "shell-filling", multiplets: [group("VB", "v1", pairsV.slice(0, 2)), group("VB", "v2", pairsV.slice(2), 2)], evidence: { reasons: [] } })).toEqual([]);
  });

  it("reaches rulesDecisive as its notes 25 and 26", () => {
    const pairsV = [-0.8125, -0.9375, -1.4375, -1.5625];
    const peaks = [...pairsV, 1.0].map((v) => assignPeak(v));
    const assignment = {
      regime: "shell-tunneling" as const,
      multiplets: [...pairsV.map((v, i) => ({ ...group("VB", `v${i + 1}`, [v], i), degeneracy: null, found: 1, peakUncertaintiesV: [0.001] })),
        { ...group("CB", "s", [1.0], 4), degeneracy: 2, found: 1, peakUncertaintiesV: [0.001] }],
      noLevels: null,
      quantities: { chargingEnergyV: null, gapV: null, levelSpacingSPV: null },
      uncertainties: {},
      evidence: { secondToFirstStepRatio: null, reasons: [], satellitePeakIndices: [], secondJunction: [] },
      energies: { eta, etaGiven: true },
    };
    const verdict = rulesDecisive({ peaks, assignment: assignment as never, biasRangeV: [-2, 2] });
    expect(verdict.codes).toEqual(["vb-charging-pairs"]);
    expect(verdict.decisive).toBe(false);
  });

  it("rejects options out of range", () => {
    const a: HiddenLadderAssignment = { regime: "shell-filling", multiplets: [], evidence: { reasons: [] } };
    expectError(() => hiddenLadderReasons([], a, { pulledPeakTolerance: 1.5 }), "options/out-of-range");
    expectError(() => hiddenLadderReasons([], a, { pairGapRatioMax: -1 }), "options/out-of-range");
  });
});
