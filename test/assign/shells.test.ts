// fillingShells / tunnelingShells on peak positions from the closed form (|ε| + Ec(n + ½))/η, n counting
// the carriers already in the CB, with ε_s = 0.5, ε_p = 0.8, ε_d = 1.2 eV, Ec = 0.1 eV, η = 0.8.
import { describe, it, expect } from "vitest";
import { completeShells, fillingShells, tunnelingShells, SHELLS } from "../../lib/assign/shells.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { currentSteps } from "../../lib/model/bandCurrent.ts";

const eta = 0.8, ec = 0.1;
const at = (x: number, index: number, stepA = 1e-11): BandPeak => ({ x, index, peak: { biasV: x, stepA, biasUncertaintyV: 0.001 } as Peak });
const V = (e: number, n: number) => (e + ec * (n + 0.5)) / eta;
const ids = (groups: BandPeak[][]) => groups.map((g) => g.map((p) => p.index));

describe("SHELLS", () => {
  it("holds s, p, d, f with degeneracies 2, 6, 10, 14 (2(2l + 1), spin included)", () => {
    expect(SHELLS.map((s) => [s.label, s.degeneracy])).toEqual([["s", 2], ["p", 6], ["d", 10], ["f", 14]]);
  });
});

describe("fillingShells(cb)", () => {
  it("fills s (n = 0, 1), p (n = 2 … 7) and d (n = 8, 9) and leaves nothing over", () => {
    const xs = [V(0.5, 0), V(0.5, 1), ...[2, 3, 4, 5, 6, 7].map((n) => V(0.8, n)), V(1.2, 8), V(1.2, 9)];
    const r = fillingShells(xs.map((x, i) => at(x, i)));
    expect(r.shells.map((s) => s.flat().map((p) => p.index))).toEqual([[0, 1], [2, 3, 4, 5, 6, 7], [8, 9]]);
    expect(r.leftover).toEqual([]);
    expect(r.offLadder).toEqual([]);
  });

  it("sets aside a peak much closer than Ec to the previous charging peak", () => {
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 2), V(0.8, 2) + 0.2 * (ec / eta), V(0.8, 3), V(0.8, 4)];
    const r = fillingShells(xs.map((x, i) => at(x, i)));
    expect(r.offLadder.map((p) => p.index)).toEqual([3]);
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([2, 4, 5]);
  });
});

describe("fillingShells(cb) on a split p shell cut by the window", () => {
  it("sets aside an inner peak weaker than half of both neighbours (the upper sub-level entered at a lower charge state)", () => {
    // p split 2 + 4: p_a at 0.8 eV (n = 2, 3), p_b at 0.9 eV (n = 4), split by one Ec; the channel
    // into p_b at n = 3, (0.9 + 3.5·Ec)/η, lies one Ec after p_a's second and before p_b's first
    // charging peak (closed form positions), on the ladder's spacing; its step is a fraction of
    // the others (0.3 here: common practice (no source)).
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 2), V(0.8, 3), V(0.9, 3), V(0.9, 4)];
    const steps = [1, 0.95, 1, 0.9, 0.3, 1].map((k) => k * 1e-11);
    const r = fillingShells(xs.map((x, i) => at(x, i, steps[i])));
    expect(r.offLadder.map((p) => p.index)).toEqual([4]);
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([2, 3, 5]);
  });
});

describe("fillingShells(cb) near the filling limit", () => {
  it("sets aside p entered early (one Ec before p's first charging peak, about half its step) instead of shifting p by one Ec", () => {
    // p entered while s holds one carrier: (0.8 + 1.5·Ec)/η, then p's charging peaks n = 2 … 6 (the
    // seventh too weak to see) at the closed-form positions; step heights from the project's master
    // equation (currentSteps, simulated truth) at Γtip/Γsub = 1.6.
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 1), ...[2, 3, 4, 5, 6].map((n) => V(0.8, n))];
    const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }], vb: [], chargingEnergyEV: ec, eta, tipRatePerS: 1.6e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
    const all = currentSteps(model).steps;
    const steps = xs.map((x) => all.find((st) => Math.abs(st.biasV - x) < 1e-9)!.heightA);
    expect(steps[2] / steps[3]).toBeGreaterThan(0.5); // above the satellite rule's 0.5: only the early-entry rule can catch it
    const r = fillingShells(xs.map((x, i) => at(x, i, steps[i])));
    expect(r.offLadder.map((p) => p.index)).toEqual([2]);
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([3, 4, 5, 6, 7]);
  });
});

describe("fillingShells(cb) on a split p shell in the crossover", () => {
  it("sets aside the dip of a higher sub-level entered early rather than p's weak last charging peak", () => {
    // p split 2 + 4 (p_a at 0.8, p_b at 0.9 eV), Γtip/Γsub = 3: the peaks at the closed-form
    // positions (|ε| + Ec(n + ½))/η, with p_b entered at n = 3 one Ec after p_a's second peak;
    // step heights from the project's master equation (currentSteps, simulated truth). Seven
    // candidates for six states: the dip at n = 3 is the extra, p_b's last (n = 7) is p's sixth.
    const model = {
      cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 2 }, { energyEV: 0.9, degeneracy: 4 }],
      vb: [], chargingEnergyEV: ec, eta, tipRatePerS: 3e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5,
    };
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 1), V(0.8, 2), V(0.8, 3), V(0.9, 3), ...[4, 5, 6, 7].map((n) => V(0.9, n))];
    const all = currentSteps(model).steps;
    const steps = xs.map((x) => all.find((st) => Math.abs(st.biasV - x) < 1e-9)!.heightA);
    // The last charging peak is weaker than the dip: the weakest extra alone would be the wrong one.
    expect(steps[9]).toBeLessThan(steps[5]);
    const r = fillingShells(xs.map((x, i) => at(x, i, steps[i])));
    expect(r.offLadder.map((p) => p.index)).toEqual([2, 5]);
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([3, 4, 6, 7, 8, 9]);
    expect(r.shells).toHaveLength(2);
  });
});

describe("fillingShells(cb) with p entered early and a sub-level off the ladder", () => {
  it("judges p entered early against the next peak on the ladder, not an off-ladder peak between them", () => {
    // p split 2 + 4 (p_a at 0.63, p_b at 0.69 eV: 0.6 Ec apart; Δsp just above Ec), Γtip/Γsub =
    // 2.6: every step the project's master equation gives above a fifth of the median
    // (currentSteps, simulated truth) at its closed-form position (|ε| + Ec(n + ½))/η. p_a entered
    // at n = 1 lies one Ec before p's first charging peak with p_b's n = 1 channel 0.6 Ec after
    // it, off the ladder; taken as p's first peak it would make the s→p jump so small that the
    // gap to p_b opens a new shell.
    const model = {
      cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.63, degeneracy: 2 }, { energyEV: 0.69, degeneracy: 4 }],
      vb: [], chargingEnergyEV: ec, eta, tipRatePerS: 2.6e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5,
    };
    const xs = [V(0.5, 0), V(0.5, 1), V(0.63, 1), V(0.69, 1), V(0.63, 2), V(0.69, 2), V(0.63, 3), V(0.69, 3), ...[4, 5, 6, 7].map((n) => V(0.69, n))];
    const all = currentSteps(model).steps;
    const steps = xs.map((x) => all.find((st) => Math.abs(st.biasV - x) < 1e-9)!.heightA);
    const median = [...steps].sort((a, b) => a - b)[steps.length >> 1];
    expect(Math.min(...steps)).toBeGreaterThan(0.2 * median); // all above the band's noise rule
    const r = fillingShells(xs.map((x, i) => at(x, i, steps[i])));
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([4, 6, 8, 9, 10, 11]);
    expect(r.offLadder.map((p) => p.index)).toEqual([2, 3, 5, 7]);
  });
});

describe("fillingShells(cb) next to peaks that are not charging steps", () => {
  it("keeps a charging peak that dips only next to a strong resonance (not below 0.7 × the median step)", () => {
    // p split 2 + 4 (p_a at 0.8, p_b at 0.9 eV) with its six charging peaks at the closed-form
    // positions, alike steps, and a second-junction resonance not set aside in the sub-level gap
    // (on the ladder's spacing) carrying three tip-side steps (common practice (no source): a
    // level's resonance carries several of its steps). p_b's first peak, 0.95 of the others, is
    // below both neighbours but no early-entry dip.
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 2), V(0.8, 3), (V(0.8, 3) + V(0.9, 4)) / 2, V(0.9, 4), V(0.9, 5), V(0.9, 6), V(0.9, 7)];
    const steps = [1, 0.9, 1, 1, 3, 0.95, 1, 1, 1].map((k) => k * 1e-11);
    const r = fillingShells(xs.map((x, i) => at(x, i, steps[i])));
    expect(r.shells[1].flat().map((p) => p.index)).toContain(5);
  });

  it("does not take a step found twice (two close peaks) for p entered early", () => {
    // p's first charging peak found as two peaks 15 mV apart (the second the stronger), then p's
    // charging peaks at the closed-form positions (equal steps, common practice (no source)).
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 2), V(0.8, 2) + 0.015, ...[3, 4, 5, 6, 7].map((n) => V(0.8, n))];
    const steps = [1, 0.9, 0.45, 0.5, 1, 1, 1, 1, 1].map((k) => k * 1e-11);
    const r = fillingShells(xs.map((x, i) => at(x, i, steps[i])));
    expect(r.shells[1].flat()[0].index).toBe(2);
  });
});

describe("completeShells(shells, weak, chargingEnergyV)", () => {
  it("appends a weak peak one Ec beyond a shell that is short of its degeneracy (p's last charging peak near the filling limit)", () => {
    // p's sixth charging peak at (0.8 + 7.5·Ec)/η: at Γtip/Γsub = 2 its step is a small fraction of
    // p's first (the project's master equation, currentSteps: simulated truth).
    const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }], vb: [], chargingEnergyEV: ec, eta, tipRatePerS: 2e8, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
    const all = currentSteps(model).steps;
    const stepAt = (x: number) => all.find((st) => Math.abs(st.biasV - x) < 1e-9)!.heightA;
    expect(stepAt(V(0.8, 7)) / stepAt(V(0.8, 2))).toBeLessThan(0.2); // below the band's noise rule
    const s = [[at(V(0.5, 0), 0), at(V(0.5, 1), 1)]];
    const p = [[2, 3, 4, 5, 6].map((n, k) => at(V(0.8, n), 2 + k))];
    const r = completeShells([s, p], [at(V(0.8, 7), 7, stepAt(V(0.8, 7))), at(V(0.8, 7) + 0.4 * (ec / eta), 8)], ec / eta);
    expect(r.added.map((x) => x.index)).toEqual([7]);
    expect(r.shells[1].flat().map((x) => x.index)).toEqual([2, 3, 4, 5, 6, 7]);
  });
  it("adds nothing to a full shell or off the ladder", () => {
    const s = [[at(V(0.5, 0), 0), at(V(0.5, 1), 1)]];
    expect(completeShells([s], [at(V(0.5, 2), 2)], ec / eta).added).toEqual([]); // s holds 2
    const p = [[at(V(0.8, 2), 2)]];
    expect(completeShells([s, p], [at(V(0.8, 2) + 1.5 * (ec / eta), 3)], ec / eta).added).toEqual([]); // 1.5 Ec away
  });
});

describe("tunnelingShells(main)", () => {
  it("one level per shell; a level close to p (split p) joins it", () => {
    // s at 0.5, p at 0.8 and 0.83 (split by 30 meV, well under half the s–p distance), d at 1.2 eV.
    const xs = [V(0.5, 0), V(0.8, 0), V(0.83, 0), V(1.2, 0)];
    expect(ids(tunnelingShells(xs.map((x, i) => at(x, i))))).toEqual([[0], [1, 2], [3]]);
  });

  it("with stepReach, p split 2 + 4 at 0.6 × the s–p distance joins by its steps (a 2-state level steps like s), and a level after a whole p opens d", () => {
    // Deep shell tunnelling (Γtip/Γsub = 0.01): s at 0.5, p_a (2 states) at 0.8, p_b (4 states) at
    // 0.98 eV, 0.6 × the s–p distance above p_a; each level's first peak at (ε + Ec/2)/η (closed
    // form), step heights from the project's master equation (currentSteps, simulated truth): p_a
    // steps about 1 × s, below 2.5 × s.
    const model = { cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 2 }, { energyEV: 0.98, degeneracy: 4 }], vb: [], chargingEnergyEV: ec, eta, tipRatePerS: 1e6, substrateRatePerS: 1e8, relaxationRatePerS: 1e12, temperatureK: 4.5 };
    const xs = [V(0.5, 0), V(0.8, 0), V(0.98, 0)];
    const all = currentSteps(model).steps;
    const steps = xs.map((x) => all.find((st) => Math.abs(st.biasV - x) < 1e-9)!.heightA);
    expect(steps[1] / steps[0]).toBeLessThan(1.2);
    const peaks = xs.map((x, i) => at(x, i, steps[i]));
    expect(ids(tunnelingShells(peaks, true))).toEqual([[0], [1, 2]]);
    expect(ids(tunnelingShells(peaks))).toEqual([[0], [1], [2]]); // without: 0.6 ≥ 0.5 opens d
    // p whole (6 states) at 0.8, a d level (10 states) at 0.98 eV: p steps about 3 × s (> 2.5), d opens.
    const whole = { ...model, cb: [{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.8, degeneracy: 6 }, { energyEV: 0.98, degeneracy: 10 }] };
    const allWhole = currentSteps(whole).steps;
    const stepsWhole = xs.map((x) => allWhole.find((st) => Math.abs(st.biasV - x) < 1e-9)!.heightA);
    expect(stepsWhole[1] / stepsWhole[0]).toBeGreaterThan(2.5);
    expect(ids(tunnelingShells(xs.map((x, i) => at(x, i, stepsWhole[i])), true))).toEqual([[0], [1], [2]]);
  });

  it("with ownStepA, a 2-state sub-level whose peak also holds a resonance's step is judged by its own step (note 5)", () => {
    // s and p_a step alike (2 states each, deep in the regime); a resonance adds half a VB level's
    // step (the least share, (g·r + 1)/(g + r) → ½ for g = 2 as r → 0) to p_a's peak: 1.5 × s
    // merged, above the 1.3 × s a 2-state level may step, so p_b 0.6 × Δsp above opens d unless
    // the share is taken off.
    const xs = [V(0.5, 0), V(0.8, 0), V(0.98, 0)];
    const peaks = xs.map((x, i) => at(x, i, i === 1 ? 1.5e-11 : 1e-11));
    expect(ids(tunnelingShells(peaks, true))).toEqual([[0], [1], [2]]);
    const own = (p: BandPeak) => (p.index === 1 ? p.peak.stepA - 0.5e-11 : p.peak.stepA);
    expect(ids(tunnelingShells(peaks, true, own))).toEqual([[0], [1, 2]]);
  });
});
