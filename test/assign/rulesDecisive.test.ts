// rulesDecisive on peak lists built from the closed-form peak positions of orthodox theory,
// (ε + Ec·(n + ½))/η, and the closed-form step ratio r/(1 + r) of the s doublet's second step over
// its first for Γtip/Γsub = r (orthodox theory: C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991);
// E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B 65, 045317 (2002); see
// secondToFirstStepRatio). The peaks go through the real rules (assignSpectrum); the expected
// verdicts follow from those closed forms and the documented limits (RULES_DECISIVE_DEFAULTS:
// common practice (no source)).
import { describe, expect, it } from "vitest";
import { assignSpectrum } from "../../lib/assign/assignSpectrum.ts";
import { rulesDecisive, RULES_DECISIVE_DEFAULTS } from "../../lib/assign/rulesDecisive.ts";
import { secondToFirstStepRatio } from "../../lib/model/regimeLimits.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { assignPeak } from "../helpers/assignPeak.ts";
import { expectDocumentedDefaults } from "../helpers/documentedDefaults.ts";
import { expectError } from "../helpers/errors.ts";

const peak = assignPeak;

// ε_s = 0.5, ε_p = 0.8 (CB), ε_v1 = −0.6 (g 2), ε_v2 = −0.8 (g 4) eV; Ec = 0.1 eV; η = 0.8.
const eta = 0.8, ec = 0.1;
const ecV = ec / eta;
const sV = [0.5 + 0.05, 0.5 + 0.15].map((e) => e / eta);
const pV = [2, 3, 4, 5, 6, 7].map((n) => (0.8 + ec * (n + 0.5)) / eta);
const vbV = [0.6 + 0.05, 0.6 + 0.15, ...[2, 3, 4, 5].map((n) => 0.8 + ec * (n + 0.5))].map((e) => -e / eta);
// The same two VB levels deep in shell tunnelling: one peak each at (|ε| + Ec/2)/η (their charging
// peaks unseen), so that the VB does not read as charging pairs (note 26).
const vbTunnelingV = [0.6, 0.8].map((e) => -(e + ec / 2) / eta);

/** The rules' assignment of these peaks and its verdict over a window [−2, toV] V. */
function verdict(cbPeaks: Peak[], toV: number, valenceV: readonly number[] = vbV) {
  const peaks = [...valenceV.map((v) => peak(v)), ...cbPeaks].sort((a, b) => a.biasV - b.biasV);
  const assignment = assignSpectrum(peaks, { eta, secondJunction: false });
  return { assignment, result: rulesDecisive({ peaks, assignment, biasRangeV: [-2, toV] }) };
}

describe("rulesDecisive(input, options)", () => {
  it("RULES_DECISIVE_DEFAULTS are locked, frozen and match the documented defaults", () => {
    expect(RULES_DECISIVE_DEFAULTS).toEqual({ stepRatioMargin: 0.1, edgeFwhms: 1, ladderTolerance: 0.15, ladderSigmas: 3, broadFwhmRatio: 2, dipStepRatio: 0.85, ladderSatelliteMin: 0.2, ladderSatelliteMax: 0.8, chargingSpacingTolerance: 0.175, pairRiseRatio: 2 });
    expectDocumentedDefaults(new URL("../../lib/assign/rulesDecisive.ts", import.meta.url), "RulesDecisiveOptions", RULES_DECISIVE_DEFAULTS);
  });

  it("is decisive on a full shell-filling ladder (s doublet alike, p sextet whole)", () => {
    const { assignment, result } = verdict([...sV, ...pV].map((v) => peak(v)), pV[5] + 0.3);
    expect(assignment.regime).toBe("shell-filling");
    expect(result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("is not decisive when p shows 5 of 6 charging peaks and the sixth would sit inside the window, and is when the window ends before it", () => {
    const five = [...sV, ...pV.slice(0, 5)];
    const inside = verdict(five.map((v) => peak(v)), pV[5] + 0.3);
    expect(inside.assignment.regime).toBe("shell-filling");
    expect(inside.result.decisive).toBe(false);
    expect(inside.result.reasons).toHaveLength(1);
    expect(inside.result.reasons[0]).toContain("5 of the p multiplet's 6 charging peaks");
    // The sixth at pV[4] + Ec/η (closed form), one FWHM (0.04 V) from the end of the window.
    expect(inside.result.reasons[0]).toContain(`near ${(pV[4] + ecV).toFixed(3)} V`);
    const cut = verdict(five.map((v) => peak(v)), pV[4] + ecV + 0.5 * 0.04);
    expect(cut.result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("measures the window margin for a missing charging peak in the shell's median FWHM, so one broad (merged) peak does not hide it", () => {
    // p 5 of 6 with its first peak 0.5 V wide; the sixth at pV[4] + Ec/η (closed form), the window
    // ending two typical FWHM (2 × 0.04 V) after it: inside by the median width, outside by the largest.
    const five = [...sV.map((v) => peak(v)), ...pV.slice(0, 5).map((v, i) => ({ ...peak(v), fwhmV: i === 0 ? 0.5 : 0.04 }))];
    const { assignment, result } = verdict(five, pV[4] + ecV + 2 * 0.04);
    expect(assignment.multiplets.find((m) => m.label === "p")!.found).toBe(5);
    expect(result.decisive).toBe(false);
    expect(result.reasons[0]).toContain("5 of the p multiplet's 6 charging peaks");
  });

  it("flags a named regime whose s doublet's step ratio r/(1 + r) lies in the crossover band: r = 2 (2/3 ≤ 0.7) yes, r = 4 (0.8) no", () => {
    for (const [r, decisive] of [[2, false], [4, true]] as const) {
      const q = secondToFirstStepRatio(r);
      const { assignment, result } = verdict([peak(sV[0]), peak(sV[1], q * 1e-11), ...pV.map((v) => peak(v))], pV[5] + 0.3);
      expect(assignment.regime).toBe("shell-filling");
      expect(result.decisive).toBe(decisive);
      if (!decisive) expect(result.reasons[0]).toContain(`the second CB step is ${q.toFixed(2)} × the first`);
    }
  });

  it("is not decisive where the rules leave the regime undetermined (r = 1: step ratio 1/2, between 0.3 and 0.6)", () => {
    const q = secondToFirstStepRatio(1);
    const { assignment, result } = verdict([peak(sV[0]), peak(sV[1], q * 1e-11), ...pV.map((v) => peak(v))], pV[5] + 0.3);
    expect(assignment.regime).toBe("undetermined");
    expect(result).toEqual({ decisive: false, reasons: ["the rules left the regime undetermined"], codes: ["undetermined"] });
  });

  it("flags a shell-tunnelling ladder of alike spacings, and not one whose s→p jump differs", () => {
    // Levels s (g 2), p (g 6), d (g 10) deep in shell tunnelling: steps in proportion to g (r → 0,
    // levelStepRatio), one peak per level.
    const even = verdict([0.75, 1.05, 1.35].map((v, i) => peak(v, [1, 3, 5][i] * 1e-11)), 2, vbTunnelingV);
    expect(even.assignment.regime).toBe("shell-tunneling");
    expect(even.result.decisive).toBe(false);
    expect(even.result.reasons[0]).toContain("3 CB peaks whose 2 spacings are alike (300, 300 mV");
    const uneven = verdict([0.75, 1.15, 1.35].map((v, i) => peak(v, [1, 3, 5][i] * 1e-11)), 2, vbTunnelingV);
    expect(uneven.assignment.regime).toBe("shell-tunneling");
    expect(uneven.result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("flags a shell-tunnelling p read as more levels than its 6 states make spin pairs (4 > 3)", () => {
    // s, then four peaks close together (within half the s→p distance: one shell), p's steps
    // together 4 × the s step (≥ 1.4: shell tunnelling).
    const { assignment, result } = verdict([peak(0.75), ...[1.1, 1.15, 1.2, 1.25].map((v) => peak(v))], 2);
    expect(assignment.regime).toBe("shell-tunneling");
    expect(assignment.multiplets.find((m) => m.label === "p")!.found).toBe(4);
    expect(result.decisive).toBe(false);
    expect(result.reasons).toContain("shell tunnelling with 4 levels in p, more than its 6 states hold in spin pairs (3): some may be charging peaks");
  });

  it("flags shell filling whose p sub-group has a dip in its charging steps, and not one whose steps fall", () => {
    // p's six charging peaks at (ε_p + Ec(n + ½))/η (closed form). A level's charging steps fall one
    // after another; a step below both neighbours (0.6 against 0.9 and 1: below 0.85 of both) is a
    // higher sub-level entered before the lower is full.
    const dip = verdict([...sV.map((v) => peak(v)), ...pV.map((v, i) => peak(v, [1, 0.9, 0.6, 1, 0.9, 0.8][i] * 1e-11))], pV[5] + 0.3);
    expect(dip.assignment.regime).toBe("shell-filling");
    expect(dip.assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([6]);
    expect(dip.result.decisive).toBe(false);
    expect(dip.result.codes).toEqual(["charging-dip"]);
    expect(dip.result.reasons).toEqual([
      `shell filling with a dip in p's charging steps: the peak at ${pV[2].toFixed(3)} V steps 0.67 × the one before and 0.60 × the one after (both < 0.85), whereas a level's charging steps fall one after another: a higher sub-level entered before the lower is full, counted as a charging peak`,
    ]);
    const falling = verdict([...sV.map((v) => peak(v)), ...pV.map((v, i) => peak(v, [1, 0.95, 0.9, 0.85, 0.8, 0.75][i] * 1e-11))], pV[5] + 0.3);
    expect(falling.result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("flags shell filling whose p sub-group has a rise in its charging steps (> 1/0.85 × the step before), and not the falling steps of one level", () => {
    // One level of g = 6 states at Γtip/Γsub = r = 10, filled from the tip: the plateau after its
    // k-th charging peak carries I_k ∝ Σ_{N ≤ k} N·C(g, N)·r^N / Σ_{N ≤ k} C(g, N)·r^N (closed form:
    // the master equation of one level, in at (g − N)·Γtip, out at N·Γsub, detailed balance
    // P(N + 1)/P(N) = (g − N)·r/(N + 1)); its steps I_k − I_(k−1) fall one after another.
    const g = 6, r = 10;
    const plateau = (k: number) => {
      let num = 0, den = 0;
      for (let n = 0; n <= k; n++) {
        const w = binomial(g, n) * r ** n;
        num += n * w;
        den += w;
      }
      return num / den;
    };
    const steps = [1, 2, 3, 4, 5, 6].map((k) => plateau(k) - plateau(k - 1));
    steps.slice(1).forEach((s, i) => expect(s).toBeLessThan(steps[i]));
    const withSteps = (list: number[]) => verdict([...sV.map((v) => peak(v)), ...pV.map((v, i) => peak(v, list[i] * 1e-11))], pV[5] + 0.3);
    const falling = withSteps(steps);
    expect(falling.assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([6]);
    expect(falling.result).toEqual({ decisive: true, reasons: [], codes: [] });
    // The sixth peak stepping 1/0.84 × the fifth (another sub-level's entry read as p's sixth): flagged;
    // at 1/0.86 (within the noise margin of 0.85): not.
    const risen = withSteps([...steps.slice(0, 5), steps[4] / 0.84]);
    expect(risen.result.codes).toEqual(["charging-rise"]);
    expect(risen.result.reasons[0]).toContain(`the peak at ${pV[5].toFixed(3)} V steps 1.19 × the one before (> 1/0.85)`);
    expect(withSteps([...steps.slice(0, 5), steps[4] / 0.86]).result.decisive).toBe(true);
  });

  it("flags shell tunnelling whose p sub-levels and the satellite after them form an even ladder, when the satellite steps 0.2–0.8 × the peak before it", () => {
    // One p level's charging ladder at (ε_p + Ec(n + ½))/η = 1.1, 1.2, 1.3, 1.4 V (ε_p/η = 1.05 V,
    // Ec/η = 0.1 V; closed form); the rules read the first three as p's sub-levels (steps alike
    // the s step) and the fourth, 0.4 × the third, as a satellite.
    const ladder = [1.1, 1.2, 1.3, 1.4];
    const strong = verdict([peak(0.75), ...ladder.map((v, i) => peak(v, (i < 3 ? 1 : 0.4) * 1e-11))], 2, vbTunnelingV);
    expect(strong.assignment.regime).toBe("shell-tunneling");
    expect(strong.assignment.multiplets.find((m) => m.label === "p")!.found).toBe(3);
    expect(strong.result.decisive).toBe(false);
    expect(strong.result.codes).toContain("split-ladder");
    expect(strong.result.reasons).toContain(
      "shell tunnelling with p split into 3 sub-levels that, with the 1 peak(s) after them set aside as satellites (the first 0.40 × the step before it, within 0.2–0.8: a charging peak of Γtip/Γsub no longer small), form an even ladder (100, 100, 100 mV, each within 0.15 of their mean or 3σ): they may be one level's charging peaks",
    );
    // Without the satellite (sub-levels alike, deep in shell tunnelling) the reading stands.
    const none = verdict([peak(0.75), ...ladder.slice(0, 3).map((v) => peak(v))], 2, vbTunnelingV);
    expect(none.assignment.multiplets.find((m) => m.label === "p")!.found).toBe(3);
    expect(none.result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("flags shell tunnelling whose levels after s form an even ladder of four (a p level's charging peaks, s's satellite unseen), and not three", () => {
    // p's charging ladder at (ε_p + Ec(n + ½))/η = 1.1, 1.2, 1.3, 1.4 V (closed form as above),
    // every step alike the s step, no satellite: the rules read single levels.
    const ladder = [1.1, 1.2, 1.3, 1.4];
    const four = verdict([peak(0.75), ...ladder.map((v) => peak(v))], 2);
    expect(four.assignment.regime).toBe("shell-tunneling");
    expect(four.result.decisive).toBe(false);
    expect(four.result.codes).toContain("even-ladder");
    expect(four.result.reasons.find((r) => r.startsWith("shell tunnelling read from 4 CB peaks after s"))).toContain("(100, 100, 100 mV");
    // Three after s (as in the case above without a satellite): the reading stands.
    expect(verdict([peak(0.75), ...ladder.slice(0, 3).map((v) => peak(v))], 2).result.codes).not.toContain("even-ladder");
  });

  it("flags shell tunnelling with a broad peak set aside as a satellite (FWHM 5 × the others'), and not a narrow one", () => {
    // s at 0.75 V, its charging satellite one Ec/η = 0.1 V after it, p at 1.1 V with 3 × the s
    // step (p holds 6 electrons, s 2); the satellite's step 0.25 × s (r/(1 + r) for r = 1/3).
    // stepRatioMargin 0 keeps 0.25 outside the crossover band (0.3–0.6), so only the width counts.
    const run = (fwhmV: number) => {
      const peaks = [...vbTunnelingV.map((v) => peak(v)), peak(0.75), { ...peak(0.85, 0.25e-11), fwhmV }, peak(1.1, 3e-11)].sort((a, b) => a.biasV - b.biasV);
      const assignment = assignSpectrum(peaks, { eta, secondJunction: false });
      return { assignment, result: rulesDecisive({ peaks, assignment, biasRangeV: [-2, 2] }, { stepRatioMargin: 0 }) };
    };
    const broad = run(0.2);
    expect(broad.assignment.regime).toBe("shell-tunneling");
    expect(broad.result.codes).toEqual(["broad-satellite"]);
    expect(broad.result.reasons).toEqual([
      "shell tunnelling with the CB peak at 0.850 V set aside as a charging satellite although it is 200 mV wide, 5.0 × the median FWHM of the CB peaks read (40 mV; ≥ 2): unresolved peaks, among which a level (a sub-level of p merged with a charging peak) may hide",
    ]);
    expect(run(0.04).result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("flags shell tunnelling with a peak set aside as a level's charging peak that steps 0.9 × the level (≥ 0.8), and not one at 0.7", () => {
    // s at (ε_s + Ec/2)/η, its satellite at (ε_s + 3Ec/2)/η (step 0.28 × s: r/(1 + r) for r ≈ 0.39,
    // the tunnelling side), p at (ε_p + Ec/2)/η and the next peak one Ec/η after it, which the
    // rules set aside as p's charging peak (closed-form positions). stepRatioMargin 0 keeps 0.28
    // outside the crossover band (0.3–0.6).
    const run = (chargingStep: number) => {
      const cbPeaks = [peak(sV[0]), peak(sV[1], 0.28e-11), peak((0.8 + ec / 2) / eta, 1.5e-11), peak((0.8 + 1.5 * ec) / eta, chargingStep * 1.5e-11)];
      const peaks = [...vbTunnelingV.map((v) => peak(v)), ...cbPeaks].sort((a, b) => a.biasV - b.biasV);
      const assignment = assignSpectrum(peaks, { eta, secondJunction: false });
      return { assignment, result: rulesDecisive({ peaks, assignment, biasRangeV: [-2, 2] }, { stepRatioMargin: 0 }) };
    };
    const strong = run(0.9);
    expect(strong.assignment.regime).toBe("shell-tunneling");
    expect(strong.assignment.quantities.chargingEnergyV).toBeCloseTo(ecV, 9);
    expect(strong.result.codes).toEqual(["strong-satellite"]);
    expect(strong.result.reasons).toEqual([
      `shell tunnelling with the CB peak at ${((0.8 + 1.5 * ec) / eta).toFixed(3)} V set aside as a charging satellite although it steps 0.90 × the peak before it (≥ 0.8; a level's charging peak steps less): it may be a sub-level the rules did not count`,
    ]);
    const weak = run(0.7);
    expect(weak.assignment.evidence.satellitePeaksV).toContain((0.8 + 1.5 * ec) / eta);
    expect(weak.result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("flags shell filling whose successive charging peaks of one sub-group lie 0.7 Ec apart (off 1 ± 0.175), and not 0.9 Ec", () => {
    // One level's charging peaks sit at (ε_p + Ec(n + ½))/η (closed form), one Ec/η apart. p's second
    // charging peak replaced by a peak f·Ec/η after its first (a resonance or another sub-level's
    // peak in its place): f = 0.7 lies outside 1 ± 0.175 of the rules' Ec, f = 0.9 inside.
    const withSecondAt = (f: number) => verdict([...sV, ...pV.map((v, k) => (k === 1 ? pV[0] + f * ecV : v))].map((v) => peak(v)), pV[5] + 0.3);
    const off = withSecondAt(0.7);
    expect(off.assignment.regime).toBe("shell-filling");
    expect(off.result.decisive).toBe(false);
    expect(off.result.codes).toEqual(["off-ladder-spacing"]);
    const ruleEcV = off.assignment.quantities.chargingEnergyV!;
    const gapV = pV[0] + 0.7 * ecV - pV[0];
    expect(off.result.reasons[0]).toBe(
      `shell filling with p's charging peaks at ${pV[0].toFixed(3)} and ${(pV[0] + 0.7 * ecV).toFixed(3)} V ${(gapV * 1e3).toFixed(0)} mV apart, ${(gapV / ruleEcV).toFixed(2)} × Ec (${(ruleEcV * 1e3).toFixed(0)} mV; outside 1 ± 0.175), whereas successive charging peaks of one level lie one Ec apart: one of them may be another level's peak or a resonance`,
    );
    expect(withSecondAt(0.9).result).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("flags shell filling whose sub-group of two steps 2.2 × at its second charging peak (≥ 2), and not r/(1 + r) or 1.8 ×", () => {
    // p split 2+2+2 (ε_p1 = 0.8, ε_p2 = 0.85, ε_p3 = 0.9 eV), its charging peaks at (ε_pk + Ec(n + ½))/η,
    // n = 2 … 7 (closed form). A 2-state level filled from the tip at Γtip/Γsub = r steps r/(1 + r) ×
    // its first at its second charging peak (closed form, as for the s doublet; secondToFirstStepRatio).
    const r = 10;
    const q = secondToFirstStepRatio(r);
    const ps = [0.8, 0.8, 0.85, 0.85, 0.9, 0.9].map((e, k) => (e + ec * (k + 2 + 0.5)) / eta);
    const withLast = (ratio: number) =>
      verdict([...sV.map((v, i) => peak(v, [1, q][i] * 1e-11)), ...ps.map((v, i) => peak(v, [1, q, 1, q, 1, ratio][i] * 1e-11))], ps[5] + 0.3);
    const level = withLast(q);
    expect(level.assignment.regime).toBe("shell-filling");
    expect(level.assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([2, 2, 2]);
    expect(level.result).toEqual({ decisive: true, reasons: [], codes: [] });
    const merged = withLast(2.2);
    expect(merged.result.codes).toEqual(["pair-rise"]);
    expect(merged.result.reasons).toEqual([
      `shell filling with p's charging peak at ${ps[5].toFixed(3)} V stepping 2.20 × the one before it in a sub-group of two (≥ 2), whereas a 2-state level's second charging peak steps r/(1 + r) < 1 × its first: another peak (a resonance through the substrate junction) may be merged with it and pull its position`,
    ]);
    expect(withLast(1.8).result.decisive).toBe(true);
  });

  it("flags shell filling whose p reads in an odd sub-group (2+1+3), and not the true 2+2+2", () => {
    // p split 2+2+2 (ε_p1 = 0.8, ε_p2 = 0.85, ε_p3 = 0.9 eV): its charging peaks at
    // (ε_pk + Ec(n + ½))/η, n = 2 … 7 (closed form), two per sub-level. A peak 0.4 Ec/η after p2's
    // second position in its place (a channel off the ladder) leaves p2 one peak and puts it with p3's.
    const ps = [0.8, 0.8, 0.85, 0.85, 0.9, 0.9].map((e, k) => (e + ec * (k + 2 + 0.5)) / eta);
    const even = verdict([...sV, ...ps].map((v) => peak(v)), ps[5] + 0.3);
    expect(even.assignment.regime).toBe("shell-filling");
    expect(even.assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([2, 2, 2]);
    expect(even.result.codes).not.toContain("odd-subgroup");
    const moved = ps.map((v, k) => (k === 3 ? v + (0.4 * ec) / eta : v));
    const odd = verdict([...sV, ...moved].map((v) => peak(v)), ps[5] + 0.3);
    expect(odd.assignment.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([2, 1, 3]);
    expect(odd.result.codes).toContain("odd-subgroup");
    expect(odd.result.reasons).toContain(
      "shell filling with p in sub-groups 2+1+3, 2 of them odd although each sub-level of a shell holds an even number of electrons (spin): a peak that is not a charging peak of its sub-level may stand in for one that is",
    );
  });

  it("flags shell tunnelling with a d level 0.6 × the s→p distance after a p that steps like a 2-state sub-level, and not after a whole p", () => {
    // s at (ε_s + Ec/2)/η with its charging satellite at (ε_s + 3Ec/2)/η stepping 0.2 × s (r/(1 + r)
    // at r = 1/4: not deep in the regime, so the rules keep the reach of half the s→p distance);
    // p_a at ε = 0.9, the next level 0.6 × (0.9 − 0.5) eV above it (closed-form positions). Steps
    // relative to s: a 2-state level after s g/(2(1 + (2 + g)r)) = 0.5 at r = 1/4, the whole p
    // 3/(1 + 8r) = 1, the next level 2 (4 states) or 5/(1 + 12r) = 1.25 (a d of 10).
    const run = (pStep: number, dStep: number) => {
      const cbPeaks = [peak(sV[0]), peak(sV[1], 0.2e-11), peak((0.9 + ec / 2) / eta, pStep * 1e-11), peak((0.9 + 0.24 + ec / 2) / eta, dStep * 1e-11)];
      const peaks = [...vbV.map((v) => peak(v)), ...cbPeaks].sort((a, b) => a.biasV - b.biasV);
      const assignment = assignSpectrum(peaks, { eta, secondJunction: false });
      return { assignment, result: rulesDecisive({ peaks, assignment, biasRangeV: [-2, 2.2] }, { stepRatioMargin: 0 }) };
    };
    const split = run(0.5, 2);
    expect(split.assignment.regime).toBe("shell-tunneling");
    expect(split.assignment.multiplets.filter((m) => m.band === "CB").map((m) => m.label)).toEqual(["s", "p", "d"]);
    expect(split.result.codes).toContain("d-near-split-p");
    expect(split.result.reasons).toContain(
      "shell tunnelling with a d level 300 mV after p's last, 0.60 × the s→p distance (< 0.75), while p's first level steps 0.50 × s (≤ 1.3; a 2-state sub-level steps at most 1 ×, the whole p more deep in the regime): d may be p's other sub-level",
    );
    // p stepping 1.5 × s (> 1.3: more than a 2-state level gives at any r): not flagged.
    const whole = run(1.5, 1.25);
    expect(whole.assignment.multiplets.filter((m) => m.band === "CB").map((m) => m.label)).toEqual(["s", "p", "d"]);
    expect(whole.result.codes).not.toContain("d-near-split-p");
  });

  it("flags a regime read from two CB peaks alone, the VB deciding", () => {
    // The s doublet alone at (ε_s + Ec(n + ½))/η (closed form), the VB's first two peaks a
    // charging doublet one Ec apart: the rules read shell filling from the VB.
    const { assignment, result } = verdict(sV.map((v) => peak(v)), sV[1] + 0.1);
    expect(assignment.regime).toBe("shell-filling");
    expect(result.codes).toContain("two-cb-peaks");
    expect(result.reasons).toContain(
      "shell filling read from two CB peaks alone (no third follows), the VB deciding between an s doublet and the s level with a p sub-level: the CB side holds too few peaks for the rules to tell",
    );
  });

  it("is decisive on a curve with no levels (nothing to compare)", () => {
    const peaks = [...sV, ...pV].map((v) => peak(v));
    const assignment = { ...assignSpectrum(peaks, { eta }), regime: "undetermined" as const, noLevels: { code: "faint-peaks" as const, reason: "faint" } };
    expect(rulesDecisive({ peaks, assignment, biasRangeV: [-2, 2] })).toEqual({ decisive: true, reasons: [], codes: [] });
  });

  it("rejects an option out of range and a bias range that is not ascending, naming them", () => {
    const peaks = [...sV, ...pV].map((v) => peak(v));
    const assignment = assignSpectrum(peaks, { eta });
    expectError(() => rulesDecisive({ peaks, assignment, biasRangeV: [-2, 2] }, { stepRatioMargin: -0.1 }), "options/out-of-range", "stepRatioMargin");
    expectError(() => rulesDecisive({ peaks, assignment, biasRangeV: [2, -2] }), "options/out-of-range", "biasRangeV[1]");
  });
});

/** C(n, k), the binomial coefficient. */
function binomial(n: number, k: number): number {
  let c = 1;
  for (let j = 1; j <= k; j++) c = (c * (n - k + j)) / j;
  return c;
}
