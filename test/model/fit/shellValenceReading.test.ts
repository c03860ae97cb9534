// shellValenceReading: from the empty dot a VB level with H holes already in the dot steps at
// −(|ε| + Ec·(H + ½))/η (closed form of the orthodox charging ladder), so a doublet at |ε₁| and a
// level of four at |ε₂| show peaks at −(|ε₁| + Ec·(n + ½))/η for n = 0 … 5 and −(|ε₂| + Ec·(n + ½))/η
// for n = 0 … 5; the doublet's steps with a hole in the level of four (n ≥ 2) only beyond that
// level's entry, where such a state is reachable. The reading must return the two entries (n = 0).
import { describe, it, expect } from "vitest";
import { hiddenEntryReading, inFillingOrder, shellValenceReading, SHELL_VALENCE_DEFAULTS } from "../../../lib/model/fit/shellValenceReading.ts";

/** The ladder's peaks (closed form above), V: a doublet at |ε₁| and a level of four at |ε₂|. */
function ladderPeaksV([e1, e2]: readonly number[], ecEV: number, eta: number): number[] {
  const at = (e: number, n: number) => -(e + ecEV * (n + 0.5)) / eta;
  const second = [0, 1, 2, 3, 4, 5].map((n) => at(e2, n));
  const first = [0, 1, 2, 3, 4, 5].map((n) => at(e1, n)).filter((v, n) => n < 2 || v < second[0]);
  return [...first, ...second];
}

describe("shellValenceReading(vbPeaksV, chargingEnergyV)", () => {
  it("reads a doublet and a level of four entered from the empty dot (closed form)", () => {
    // |ε₁| 0.76 eV, |ε₂| 0.975 eV, Ec 77.6 meV, η 0.91: the second level enters 2.77 Ec/η beyond the first, off its ladder.
    const [ec, eta] = [0.0776, 0.91];
    const peaks = ladderPeaksV([0.76, 0.975], ec, eta).filter((v) => v > -1.4); // the window cuts the ladder
    const out = shellValenceReading(peaks.reverse(), ec / eta);
    expect(out.map((s) => [s.label, s.degeneracy, s.before])).toEqual([["v1", 2, 0], ["v2", 4, 0]]);
    expect(out[0].firstPeakV).toBeCloseTo(-(0.76 + ec / 2) / eta, 12);
    expect(out[1].firstPeakV).toBeCloseTo(-(0.975 + ec / 2) / eta, 12);
  });

  it("takes peaks within the tolerance of a lower level's ladder as its charging peaks, and the first one off it as the next entry", () => {
    // Ec/η = 0.1 V: −1.09 lies 0.01 off the first charging peak (inside 15 %); −1.23 lies 2.3 Ec/η out (off the ladder).
    const out = shellValenceReading([-1.0, -1.09, -1.23, -1.33], 0.1);
    expect(out.map((s) => s.firstPeakV)).toEqual([-1.0, -1.23]);
    // At the tolerance's edge: 0.1 × (1 + 0.2) off by 0.02 > 0.015: a new level.
    expect(shellValenceReading([-1.0, -1.12], 0.1).map((s) => s.firstPeakV)).toEqual([-1.0, -1.12]);
  });

  it("stops at the layout, ignores CB peaks and returns nothing without a positive Ec", () => {
    expect(shellValenceReading([-1.0, -1.5, -2.0, 1.2], 0.1).map((s) => s.degeneracy)).toEqual([2, 4]);
    expect(shellValenceReading([-1.0], 0)).toEqual([]);
    expect(shellValenceReading([1.0, 1.1], 0.1)).toEqual([]);
  });

  it("in filling order, enters each level after the levels nearer the gap are full (closed form: the second level's first step at (|ε₂| + 2.5·Ec)/η)", () => {
    // Shell filling, |ε₁| 1.067 eV, |ε₂| 1.11 eV, Ec 0.1844 eV, η 0.9: the doublet's steps at
    // (|ε₁| + Ec/2)/η and (|ε₁| + 1.5·Ec)/η, the level of four's at (|ε₂| + Ec·(N + ½))/η for N = 2 … 5.
    const [ec, eta] = [0.1844, 0.9];
    const peaks = [-(1.067 + ec / 2) / eta, -(1.067 + 1.5 * ec) / eta, ...[2, 3, 4, 5].map((n) => -(1.11 + ec * (n + 0.5)) / eta)];
    const out = inFillingOrder(shellValenceReading(peaks, ec / eta));
    expect(out.map((s) => [s.degeneracy, s.before])).toEqual([[2, 0], [4, 2]]);
    expect(out[1].firstPeakV).toBeCloseTo(-(1.11 + 2.5 * ec) / eta, 12);
  });

  it("offers the second level entered at the first level's second peak, where its entry from the empty dot coincides with it (closed form)", () => {
    // |ε₁| 1.064 eV, |ε₂| 1.273 eV, Ec 0.1844 eV, η 0.9: the level of four enters from the empty dot
    // at (|ε₂| + Ec/2)/η = −1.517 V, 0.03 V from the doublet's second step (|ε₁| + 1.5·Ec)/η = −1.489 V:
    // one peak between them; beyond it the level of four's steps one Ec/η apart.
    const [ec, eta] = [0.1844, 0.9];
    const peaks = [-(1.064 + ec / 2) / eta, -1.499, ...[1, 2, 3, 4].map((n) => -(1.273 + ec * (n + 0.5)) / eta)];
    const walked = shellValenceReading(peaks, ec / eta);
    expect(walked[1].firstPeakV).toBeCloseTo(peaks[2], 12); // the walk reads −1.499 V as the doublet's charging peak
    const hidden = hiddenEntryReading(walked, peaks)!;
    expect(hidden.map((s) => [s.degeneracy, s.firstPeakV, s.before])).toEqual([[2, peaks[0], 0], [4, -1.499, 0]]);
    // Nothing new where the walk already took the second peak, or with one level.
    expect(hiddenEntryReading(hidden, peaks)).toBeNull();
    expect(hiddenEntryReading(walked.slice(0, 1), peaks)).toBeNull();
  });

  it("SHELL_VALENCE_DEFAULTS are locked", () => {
    expect(SHELL_VALENCE_DEFAULTS).toEqual({ layout: [2, 4], tolerance: 0.15 });
  });
});
