// impossibleLayoutReasons (notes 21 and 22 of rulesDecisive) on shell-filling readings of peak lists
// built from the closed-form positions of orthodox theory: one level's charging peaks at
// (ε + Ec·(n + ½))/η, so s's last and p's first lie (Δsp + Ec)/η apart and p's one Ec/η apart.
// The quantities are those spectrumQuantities gives for the grouping written out by hand (the
// reading the rules give when s's first charging peak goes unseen: s read from its second and p's
// first, Ec the mean spacing inside the multiplets). Note 21 follows from the level order (p above
// s); note 22's limit, Ec ≤ 0.25 × the single-particle gap, is common practice (no source).
import { describe, expect, it } from "vitest";
import { impossibleLayoutReasons, IMPOSSIBLE_LAYOUT_DEFAULTS } from "../../../lib/assign/decisive/impossibleLayout.ts";
import { spectrumQuantities } from "../../../lib/assign/quantities.ts";
import { rulesDecisive } from "../../../lib/assign/rulesDecisive.ts";
import type { Peak } from "../../../lib/peaks/findPeaks.ts";
import { assignPeak } from "../../helpers/assignPeak.ts";
import { expectDocumentedDefaults } from "../../helpers/documentedDefaults.ts";
import { expectError } from "../../helpers/errors.ts";

// ε_s = 0.5, ε_p = 0.8, ε_v = −0.6 eV; Ec = 0.1 eV; η = 0.8: s at n = 0, 1, p at n = 2 … 7, v at n = 0.
const eta = 0.8, ec = 0.1;
const sV = [0, 1].map((n) => (0.5 + ec * (n + 0.5)) / eta);
const pV = [2, 3, 4, 5, 6, 7].map((n) => (0.8 + ec * (n + 0.5)) / eta);
const vV = -(0.6 + 0.5 * ec) / eta;

/** The shell-filling quantities of a reading: s and p as the given positions, one VB peak; Ec the mean spacing inside them. */
function filling(s: number[], p: number[]) {
  const at = (biasV: number, index: number) => ({ x: Math.abs(biasV), index, peak: assignPeak(biasV) as Peak });
  const sB = s.map(at), pB = p.map((v, i) => at(v, s.length + i)), vB = [at(vV, -1)];
  const gaps = [s, p].flatMap((g) => g.slice(1).map((v, i) => v - g[i]));
  const ecReadV = gaps.reduce((a, b) => a + b, 0) / gaps.length;
  return spectrumQuantities({ regime: "shell-filling", cb: [...sB, ...pB], vb: vB, cbGroups: [[sB], [pB]], vbGroups: [vB], chargingEnergyV: ecReadV, chargingEnergySEV: 0 }, []).quantities;
}

describe("impossibleLayoutReasons(assignment, options)", () => {
  it("IMPOSSIBLE_LAYOUT_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(IMPOSSIBLE_LAYOUT_DEFAULTS).toEqual({ maxChargingFractionOfGap: 0.25 });
    expect(Object.isFrozen(IMPOSSIBLE_LAYOUT_DEFAULTS)).toBe(true);
    expectDocumentedDefaults(new URL("../../../lib/assign/decisive/impossibleLayout.ts", import.meta.url), "ImpossibleLayoutOptions", IMPOSSIBLE_LAYOUT_DEFAULTS);
  });

  it("says nothing of the right reading (Δsp 0.3 eV, Ec a tenth of the gap) nor of shell tunnelling", () => {
    const right = filling(sV, pV);
    expect(right.levelSpacingSPV).toBeCloseTo(0.3 / eta, 9);
    expect(impossibleLayoutReasons({ regime: "shell-filling", quantities: right })).toEqual([]);
    expect(impossibleLayoutReasons({ regime: "shell-tunneling", quantities: { gapV: 1, chargingEnergyV: 0.9, levelSpacingSPV: -0.1 } })).toEqual([]);
  });

  it("note 21: flags s read from its second charging peak and p's first (s's first unseen): Δsp = Ec/η − the inflated Ec < 0", () => {
    // Ec read = ((p1 − s2) + 4 Ec/η)/5 = ((0.3 + 0.1)/η + 0.4/η)/5 = 0.2 V; Δsp = (p2 − p1) − 0.2 = −0.075 V.
    const q = filling([sV[1], pV[0]], pV.slice(1));
    expect(q.chargingEnergyV).toBeCloseTo(0.2, 9);
    expect(q.levelSpacingSPV).toBeCloseTo(-0.075, 9);
    // Ec 0.2 of a single-particle gap 1.625 − 0.2 V: 0.14, below 0.25 (note 22 silent).
    expect(impossibleLayoutReasons({ regime: "shell-filling", quantities: q })).toEqual([
      {
        code: "negative-sp-spacing",
        text: "shell filling with an s–p spacing of -75 mV (in bias), below zero although p lies above s: the peaks read as s and p may not be theirs (s's first charging peak unseen, p's first read as s's second)",
      },
    ]);
  });

  it("note 22: flags Ec above 0.25 × the single-particle gap; the limit is an option", () => {
    // The window ends after p's second charging peak: Ec read from s (s2, p1) alone, 0.5 V of a 1.625 V gap.
    const q = { ...filling([sV[1], pV[0]], [pV[1]]), chargingEnergyV: pV[0] - sV[1] };
    const ratio = q.chargingEnergyV / (q.gapV! - q.chargingEnergyV);
    expect(ratio).toBeCloseTo(0.5 / 1.125, 9);
    expect(impossibleLayoutReasons({ regime: "shell-filling", quantities: { ...q, levelSpacingSPV: null } })).toEqual([
      {
        code: "ec-of-gap",
        text: "shell filling with Ec 500 mV (in bias), 0.44 × the single-particle gap 1125 mV (> 0.25), whereas Ec is a tenth of the gap or so: the spacing read as Ec may not be one level's charging",
      },
    ]);
    expect(impossibleLayoutReasons({ regime: "shell-filling", quantities: { ...q, levelSpacingSPV: null } }, { maxChargingFractionOfGap: 0.5 })).toEqual([]);
  });

  it("reaches rulesDecisive as its notes 21 and 22", () => {
    const peaks = [vV, sV[1], ...pV].map((v) => assignPeak(v));
    const q = filling([sV[1], pV[0]], pV.slice(1));
    const cb = (label: string, degeneracy: number, indices: number[]) => ({ band: "CB" as const, label, degeneracy, found: indices.length, peakIndices: indices, peaksV: indices.map((i) => peaks[i].biasV), peakUncertaintiesV: indices.map(() => 0.001), subgroups: [indices.length] });
    const assignment = {
      regime: "shell-filling" as const,
      noLevels: null,
      multiplets: [cb("s", 2, [1, 2]), cb("p", 6, [3, 4, 5, 6, 7])],
      quantities: q,
      uncertainties: {},
      evidence: { secondToFirstStepRatio: null, reasons: [], satellitePeakIndices: [], secondJunction: [] },
      // η given: the peaks' second-junction resonances, −η·V/(1 − η) = −4·V, lie outside the window (note 27 silent).
      energies: { eta, etaGiven: true },
    };
    // The window ends 0.5 Ec/η after p's last read peak: note 3 silent (the next one would lie outside).
    const verdict = rulesDecisive({ peaks, assignment: assignment as never, biasRangeV: [-2, pV[5] + 0.05] });
    // (p's charging peaks 0.625 × the inflated Ec apart also trip note 16.)
    expect(verdict.codes).toContain("negative-sp-spacing");
    expect(verdict.codes).not.toContain("ec-of-gap");
    expect(verdict.decisive).toBe(false);
  });

  it("rejects options out of range", () => {
    expectError(() => impossibleLayoutReasons({ regime: "shell-filling", quantities: { gapV: 1, chargingEnergyV: 0.1, levelSpacingSPV: 0.2 } }, { maxChargingFractionOfGap: -0.1 }), "options/out-of-range");
  });
});
