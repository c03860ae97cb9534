// mergedStepReasons (notes 23 and 24 of rulesDecisive) on shell-filling peak lists built from the
// closed form of orthodox theory for the positions and steps (source: closed form; each expected
// ratio below derived from it by hand): one level's charging peaks at
// (ε + Ec·(n + ½))/η, one Ec/η apart in bias; a 2-state level filled from the tip at
// Γtip/Γsub = r steps 2r/(1 + 2r) then 2r²/((1 + r)(1 + 2r)) (in units of e·Γsub), the second
// r/(1 + r) × the first (detailed balance on each plateau). Two peaks merged into one step as much
// as both. The assignments are written out by hand (the reading the rules would give), so that
// each case isolates one note; the thresholds are MERGED_STEP_DEFAULTS (chosen on the accuracy
// benchmark).
import { describe, expect, it } from "vitest";
import { mergedStepReasons, MERGED_STEP_DEFAULTS, type MergedStepAssignment } from "../../../lib/assign/decisive/mergedSteps.ts";
import { rulesDecisive } from "../../../lib/assign/rulesDecisive.ts";
import type { Peak } from "../../../lib/peaks/findPeaks.ts";
import { assignPeak } from "../../helpers/assignPeak.ts";
import { expectDocumentedDefaults } from "../../helpers/documentedDefaults.ts";
import { expectError } from "../../helpers/errors.ts";

// ε_s = 0.5, ε_v = −0.6 eV; Ec = 0.1 eV; η = 0.8: s at n = 0, 1; the VB's first level at n = 0, 1.
const eta = 0.8, ec = 0.1;
const ecV = ec / eta;
const sV = [0, 1].map((n) => (0.5 + ec * (n + 0.5)) / eta);
const vV = [0, 1].map((n) => -(0.6 + ec * (n + 0.5)) / eta);
// A 2-state level at r = 3: steps 6/7 and 9/14 (× 1e-11 A), the second 0.75 × the first.
const r = 3;
const [step1A, step2A] = [(2 * r) / (1 + 2 * r), (2 * r * r) / ((1 + r) * (1 + 2 * r))].map((x) => x * 1e-11);

/** A multiplet of the given peaks (indices into `peaks`), in one sub-group. */
const group = (peaks: readonly Peak[], band: "CB" | "VB", label: string, indices: number[]) => ({
  band,
  label,
  peakIndices: indices,
  peaksV: indices.map((i) => peaks[i].biasV),
  subgroups: [indices.length],
});

/** A shell-filling reading of `peaks` with the given multiplets and resonances set aside. */
const reading = (multiplets: MergedStepAssignment["multiplets"], resonances: number[] = [], regime: MergedStepAssignment["regime"] = "shell-filling"): MergedStepAssignment => ({
  regime,
  multiplets,
  quantities: { chargingEnergyV: ecV },
  evidence: { satellitePeakIndices: [], secondJunction: resonances.map((index) => ({ index })) },
});

describe("mergedStepReasons(peaks, assignment, options)", () => {
  it("MERGED_STEP_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(MERGED_STEP_DEFAULTS).toEqual({ subgroupFallRatio: 0.35, edgePeakTolerance: 0.175, edgePeakStepMin: 2 });
    expect(Object.isFrozen(MERGED_STEP_DEFAULTS)).toBe(true);
    expectDocumentedDefaults(new URL("../../../lib/assign/decisive/mergedSteps.ts", import.meta.url), "MergedStepOptions", MERGED_STEP_DEFAULTS);
  });

  it("says nothing of a clean 2-state level (second step r/(1 + r) = 0.75 × the first) nor of shell tunnelling", () => {
    const peaks = [assignPeak(sV[0], step1A), assignPeak(sV[1], step2A)];
    expect(step2A / step1A).toBeCloseTo(r / (1 + r), 12);
    expect(mergedStepReasons(peaks, reading([group(peaks, "CB", "s", [0, 1])]))).toEqual([]);
    const merged = [assignPeak(sV[0], step1A + 3e-11), assignPeak(sV[1], step2A)];
    expect(mergedStepReasons(merged, reading([group(merged, "CB", "s", [0, 1])], [], "shell-tunneling"))).toEqual([]);
  });

  it("note 23: flags a sub-group whose first peak carries a resonance's step besides its own (second step 0.17 × the first); the ratio is an option", () => {
    // The resonance steps 3e-11 A: the merged first peak steps 3.86e-11, the second 0.64e-11
    // (derived: (9/14)/(6/7 + 3) = 0.17 × the first).
    const peaks = [assignPeak(sV[0], step1A + 3e-11), assignPeak(sV[1], step2A)];
    const a = reading([group(peaks, "CB", "s", [0, 1])]);
    expect(mergedStepReasons(peaks, a)).toEqual([
      {
        code: "subgroup-fall",
        text: `shell filling with s's charging peak at ${sV[1].toFixed(3)} V stepping 0.17 × the one before it, the first of its sub-group (< 0.35), whereas a level's second charging step is at least r/(1 + r) ≥ 0.6 × its first in shell filling: the first peak carries another peak's step (a resonance through the substrate junction), which pulls its position, or is that peak alone`,
      },
    ]);
    expect(mergedStepReasons(peaks, a, { subgroupFallRatio: 0.1 })).toEqual([]);
  });

  it("note 24: flags s read from its second charging peak while its first, merged with a resonance one Ec before, was set aside; not a weak resonance there, nor one 0.7 Ec before", () => {
    // The first charging peak with a resonance's 2e-11 A: 2.86e-11, 4.4 × the second's step
    // (derived: (6/7 + 2)/(9/14) = 4.44; the peak lies (derived) exactly one Ec/η = 125 mV before it).
    const peaks = [assignPeak(sV[0], step1A + 2e-11), assignPeak(sV[1], step2A), assignPeak(sV[1] + ecV, step1A)];
    const a = reading([group(peaks, "CB", "s", [1, 2])], [0]);
    expect(mergedStepReasons(peaks, a)).toEqual([
      {
        code: "edge-peak-set-aside",
        text: `shell filling with the peak at ${sV[0].toFixed(3)} V, 1.00 × Ec (125 mV) before s's first charging peak and stepping 4.44 × it (≥ 2), set aside: s's first charging peak may be that one, merged with a resonance, and s read from its second`,
      },
    ]);
    // A lone resonance there stepping 1.5 × s's first: nothing (below the benchmark-chosen 2 ×).
    const weak = peaks.map((p, i) => (i === 0 ? assignPeak(p.biasV, 1.5 * step2A) : p));
    expect(mergedStepReasons(weak, a)).toEqual([]);
    // The strong peak 0.7 Ec before s's first: not where a charging peak lies.
    const near = peaks.map((p, i) => (i === 0 ? assignPeak(sV[1] - 0.7 * ecV, p.stepA) : p));
    expect(mergedStepReasons(near, a)).toEqual([]);
  });

  it("note 24: the same on the VB side, toward zero bias from the first VB multiplet's first charging peak", () => {
    const peaks = [assignPeak(vV[1] - ecV, step1A), assignPeak(vV[1], step2A), assignPeak(vV[0], step1A + 2e-11), assignPeak(sV[0], step1A), assignPeak(sV[1], step2A)];
    const a = reading([group(peaks, "CB", "s", [3, 4]), group(peaks, "VB", "v1", [1, 0])], [2]);
    expect(mergedStepReasons(peaks, a).map((x) => x.code)).toEqual(["edge-peak-set-aside"]);
  });

  it("reaches rulesDecisive as its notes 23 and 24", () => {
    const peaks = [assignPeak(sV[0], step1A + 3e-11), assignPeak(sV[1], step2A)];
    const assignment = {
      regime: "shell-filling" as const,
      multiplets: [{ ...group(peaks, "CB", "s", [0, 1]), degeneracy: 2, found: 2, peakUncertaintiesV: [0.001, 0.001] }],
      noLevels: null,
      quantities: { chargingEnergyV: ecV, gapV: null, levelSpacingSPV: null },
      uncertainties: {},
      evidence: { secondToFirstStepRatio: null, reasons: [], satellitePeakIndices: [], secondJunction: [] },
      // η given: the peaks' second-junction resonances, −η·V/(1 − η) = −4·V, lie outside the window (note 27 silent).
      energies: { eta, etaGiven: true },
    };
    const verdict = rulesDecisive({ peaks, assignment: assignment as never, biasRangeV: [-2, sV[1] + 0.05] });
    expect(verdict.codes).toEqual(["subgroup-fall"]);
    expect(verdict.decisive).toBe(false);
  });

  it("rejects options out of range", () => {
    expectError(() => mergedStepReasons([], reading([]), { subgroupFallRatio: 1.5 }), "options/out-of-range");
    expectError(() => mergedStepReasons([], reading([]), { edgePeakStepMin: -1 }), "options/out-of-range");
  });
});
