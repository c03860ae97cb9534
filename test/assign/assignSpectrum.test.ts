// assignSpectrum checked on peak lists built from the closed-form peak positions of orthodox
// theory, (ε + Ec·(n + ½))/η (orthodox theory: C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)), and the trade's formulas for the extracted
// quantities (U. Banin, Y. Cao, D. Katz and O. Millo, Nature 400, 542 (1999), from memory).
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { expectClose } from "../helpers/expectClose.ts";
import { assignSpectrum, ASSIGN_DEFAULTS } from "../../lib/assign/assignSpectrum.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { assignPeak } from "../helpers/assignPeak.ts";
import type { Assignment } from "../../lib/assign/assignSpectrum.ts";
import { levelStepRatio, substrateToTipStepRatio } from "../../lib/model/regimeLimits.ts";

const peak = assignPeak;

// Levels ε_s = 0.5, ε_p = 0.8 (CB), ε_v1 = −0.6 (g 2), ε_v2 = −0.8 (g 4); Ec = 0.1 eV; η = 0.8.
const eta = 0.8, ec = 0.1;
const cbFilling = [0.5 + 0.05, 0.5 + 0.15, ...[2, 3, 4, 5, 6, 7].map((n) => 0.8 + ec * (n + 0.5))].map((e) => e / eta);
const vbFilling = [0.6 + 0.05, 0.6 + 0.15, ...[2, 3, 4, 5].map((n) => 0.8 + ec * (n + 0.5))].map((e) => -e / eta);

describe("assignSpectrum(peaks, {eta}) in shell filling", () => {
  const a = assignSpectrum([...vbFilling, ...cbFilling].sort((x, y) => x - y).map((v) => peak(v)), { eta });

  it("finds the s doublet, the p sextet and the valence groups", () => {
    expect(a.regime).toBe("shell-filling");
    const byLabel = Object.fromEntries(a.multiplets.map((m) => [m.label, m]));
    expectClose(byLabel.s.peaksV, cbFilling.slice(0, 2), { rtol: 1e-12 });
    expectClose(byLabel.p.peaksV, cbFilling.slice(2), { rtol: 1e-12 });
    expect([byLabel.p.found, byLabel.p.expected, byLabel.s.degeneracy, byLabel.p.degeneracy]).toEqual([6, 6, 2, 6]);
    // VB ordered from the gap edge, degeneracy not assumed.
    expectClose(byLabel.v1.peaksV, vbFilling.slice(0, 2), { rtol: 1e-12 });
    expectClose(byLabel.v2.peaksV, vbFilling.slice(2), { rtol: 1e-12 });
    expect(byLabel.v1.degeneracy).toBeNull();
  });

  it("extracts gap, Ec, single-particle gap, Δsp and the VB spacing by the formulas of the trade (closed form)", () => {
    const q = a.quantities;
    expectClose(q.gapV!, (0.55 + 0.65) / eta, { rtol: 1e-12, what: "gap = first CB − first VB" });
    expectClose(q.chargingEnergyV!, ec / eta, { rtol: 1e-12, what: "Ec in bias" });
    expectClose(q.levelSpacingSPV!, (0.8 - 0.5) / eta, { rtol: 1e-12, what: "Δsp = (first p − last s) − Ec" });
    expectClose(q.valenceSpacingsV, [(0.8 - 0.6) / eta], { rtol: 1e-12, what: "VB group spacing less Ec" });
    const e = a.energies;
    expectClose(e.chargingEnergyEV!, ec, { rtol: 1e-12 });
    expectClose(e.singleParticleGapEV!, 0.5 + 0.6, { rtol: 1e-12, what: "η·gap − Ec = ε_s − ε_v1" });
    expectClose(e.levelSpacingSPEV!, 0.3, { rtol: 1e-12 });
    expectClose(e.valenceSpacingsEV, [0.2], { rtol: 1e-12 });
  });

  it("propagates the peak uncertainties: σ_gap = √(σ_c² + σ_v²), SE(Ec) = σ/√Σ(k − k̄)² over the multiplets (least squares)", () => {
    expectClose(a.uncertainties.gapV!, Math.SQRT2 * 0.001, { rtol: 1e-9 });
    // s: k = 0, 1 → Σ(k − k̄)² = 0.5; p: k = 0…5 → 17.5.
    expectClose(a.uncertainties.chargingEnergyV!, 0.001 / Math.sqrt(0.5 + 17.5), { rtol: 1e-6 });
    expectClose(a.energies.uncertainties.chargingEnergyEV!, (eta * 0.001) / Math.sqrt(18), { rtol: 1e-6 });
  });

  it("reports a partly resolved p multiplet with found/expected counts", () => {
    const r = assignSpectrum(cbFilling.slice(0, 6).map((v) => peak(v)), { eta });
    const p = r.multiplets.find((m) => m.label === "p")!;
    expect([p.found, p.expected]).toEqual([4, 6]);
  });

  it("splits the p sextet into sub-groups 2 + 4 when shape anisotropy opens a gap inside it", () => {
    // p split: ε_p1 = 0.8 (g 2), ε_p2 = 0.86 (g 4).
    const cb = [0.55, 0.65, 0.8 + 0.25, 0.8 + 0.35, 0.86 + 0.45, 0.86 + 0.55, 0.86 + 0.65, 0.86 + 0.75].map((e) => e / eta);
    const r = assignSpectrum(cb.map((v) => peak(v)), { eta });
    const p = r.multiplets.find((m) => m.label === "p")!;
    expect(p.subgroups).toEqual([2, 4]);
    expectClose(r.energies.chargingEnergyEV!, ec, { rtol: 1e-9, what: "Ec unaffected by the split (separate intercepts)" });
  });

  it("sets aside a weak charging satellite before the p multiplet", () => {
    const cb = [...cbFilling.slice(0, 2), (0.8 + 0.15) / eta, ...cbFilling.slice(2)];
    const steps = cb.map((_, i) => (i === 2 ? 2e-12 : 1e-11));
    const r = assignSpectrum(cb.map((v, i) => peak(v, steps[i])), { eta });
    expect(r.multiplets.find((m) => m.label === "p")!.peaksV.length).toBe(6);
    expectClose(r.evidence.satellitePeaksV, [(0.8 + 0.15) / eta], { rtol: 1e-12 });
  });
});

describe("assignSpectrum(peaks, {eta}) in shell tunnelling", () => {
  // One peak per level at (ε + Ec/2)/η; steps in proportion to degeneracy (s:p = 2:6).
  const cb = [peak((0.5 + 0.05) / eta, 2e-11), peak((0.5 + 0.15) / eta, 1e-12), peak((0.8 + 0.05) / eta, 6e-11)];
  const vb = [peak(-(0.6 + 0.05) / eta, 2e-11), peak(-(0.8 + 0.05) / eta, 4e-11)];
  const a = assignSpectrum([...vb.reverse(), ...cb], { eta });

  it("gives one peak per level, sets the charging satellite aside, and reports Ec as null", () => {
    expect(a.regime).toBe("shell-tunneling");
    const byLabel = Object.fromEntries(a.multiplets.map((m) => [m.label, m]));
    expect(byLabel.s.peaksV.length).toBe(1);
    expect(byLabel.p.peaksV.length).toBe(1);
    expect(a.quantities.chargingEnergyV).toBeNull();
    expect(a.quantities.singleParticleGapV).toBeNull();
    expectClose(a.evidence.satellitePeaksV, [(0.5 + 0.15) / eta], { rtol: 1e-12 });
  });

  it("reads Δsp as the s–p distance and the gap (which still holds one Ec) between first peaks (Banin et al., Nature 400, 542 (1999), from memory)", () => {
    expectClose(a.quantities.levelSpacingSPV!, 0.3 / eta, { rtol: 1e-12 });
    expectClose(a.energies.gapEV!, 0.5 + 0.6 + ec, { rtol: 1e-12, what: "η·gap = ε_s − ε_v1 + Ec" });
    expectClose(a.energies.valenceSpacingsEV, [0.2], { rtol: 1e-12 });
  });
});

describe("assignSpectrum: an extra peak before a split p gives no Ec", () => {
  // Deep in shell tunnelling (r = 0.01), η = 0.8, Ec = 0.1 eV, positions (ε + Ec/2)/η: s (0.5 eV),
  // p split into doubly degenerate sub-levels at 0.8, 0.9 and 0.95 eV, each stepping
  // levelStepRatio(2, 2, r) = 1/(1 + 4r) × s, v1 (−0.6 eV) and v2 (4 states, −0.8 eV) stepping
  // levelStepRatio(2, 4, r) × v1 (closed forms). An extra peak (no level of the ladder) at 0.45 × s
  // lies one Ec/η after s, where s's charging satellite would; the second sub-level lies one Ec/η
  // after the first.
  const r = 0.01, S = 1e-12;
  const at = (e: number) => (e + 0.05) / 0.8;
  const sub = levelStepRatio(2, 2, r) * S;
  const peaks = [
    peak(-at(0.8), levelStepRatio(2, 4, r) * S), peak(-at(0.6), S),
    peak(at(0.5), S), peak(at(0.6), 0.45 * S), peak(at(0.8), sub), peak(at(0.9), sub), peak(at(0.95), sub),
  ];

  it("reads the three sub-levels as p and no charging energy from the extra peak", () => {
    const a = assignSpectrum(peaks, { eta: 0.8 });
    expect(a.regime).toBe("shell-tunneling");
    const p = a.multiplets.find((m) => m.label === "p")!;
    expect(p.peakIndices).toEqual([4, 5, 6]);
    expect(a.quantities.chargingEnergyV).toBeNull();
    expect(a.evidence.reasons.join(" ")).toMatch(/no charging peak of s/);
  });
});

describe("assignSpectrum: a deeper level's charging peak leaves the regime deep", () => {
  // Deep in shell tunnelling (r = 0.02), η = 0.6, Ec = 0.25 eV, positions (ε + Ec/2)/η: s (0.5 eV)
  // with no charging satellite (r/(1 + r) < 0.1 of its step: closed form), p split into doubly
  // degenerate sub-levels at 0.8 and 0.99 eV, each stepping levelStepRatio(2, 2, r) = 1/(1 + 4r)
  // × s (≤ 1.3: p short of its six states), 0.63 Δsp apart (within 0.75 Δsp). The first
  // sub-level's tip-side charging peak lies one Ec/η after it, beyond the second, stepping a
  // quarter of s (any value above 0.1 × s: its second carrier may enter s too, so no r/(1 + r)
  // bounds it).
  const r = 0.02, S = 1e-12, etaD = 0.6, ecD = 0.25;
  const at = (e: number, n = 0) => (e + ecD * (n + 0.5)) / etaD;
  const sub = levelStepRatio(2, 2, r) * S;
  const peaks = [peak(-at(0.6), S), peak(at(0.5), S), peak(at(0.8), sub), peak(at(0.99), sub), peak(at(0.8, 1), 0.25 * S)];

  it("reads both sub-levels as p (note: only s's own satellite tells the regime's depth)", () => {
    expect(at(0.8, 1)).toBeGreaterThan(at(0.99));
    const a = assignSpectrum(peaks, { eta: etaD, regime: "shell-tunneling", secondJunction: false });
    expect(a.multiplets.find((m) => m.label === "p")!.peakIndices).toEqual([2, 3]);
    expect(a.multiplets.some((m) => m.label === "d")).toBe(false);
  });
});

describe("assignSpectrum: a p sub-level at a VB level's resonance is judged by its own step", () => {
  // Deep in shell tunnelling (r = 0.02), η = 0.6, Ec = 0.25 eV, positions (ε + Ec/2)/η: s (0.5 eV),
  // p split into doubly degenerate sub-levels at 0.8 and 0.99 eV, each stepping
  // levelStepRatio(2, 2, r) = 1/(1 + 4r) × s, 0.63 Δsp apart. v1 at −0.85 V and v2 at
  // −1.5417/1.5 V; v2's resonance −η·V/(1 − η) = 1.5 × 1.0278 V lies on p's first sub-level and
  // adds its share of v2's step, (g·r + 1)/(g + r) ≈ ½ for g = 2 (substrateToTipStepRatio): merged,
  // the sub-level steps 1.4 × s, above the 1.3 × s a 2-state sub-level may step.
  const r = 0.02, S = 1e-12, etaD = 0.6, ecD = 0.25;
  const at = (e: number) => (e + ecD / 2) / etaD;
  const sub = levelStepRatio(2, 2, r) * S;
  const share = substrateToTipStepRatio(2, r) * S;
  const v2V = -at(0.8) * (1 - etaD) / etaD;
  const peaks = [peak(v2V, S), peak(-0.85, S), peak(at(0.5), S), peak(0.85 * 1.5, substrateToTipStepRatio(2, r) * S), peak(at(0.8), sub + share), peak(at(0.99), sub)];

  it("reads both sub-levels as p (the resonance's least share, ½ of v2's step, taken from the merged step)", () => {
    expect((sub + share) / S).toBeGreaterThan(ASSIGN_DEFAULTS.tunnelingSublevelFirstStepMax);
    const a = assignSpectrum(peaks, { eta: etaD });
    expect(a.regime).toBe("shell-tunneling");
    expect(a.multiplets.find((m) => m.label === "s")!.peakIndices).toEqual([2]);
    expect(a.multiplets.find((m) => m.label === "p")!.peakIndices).toEqual([4, 5]);
    expect(a.multiplets.some((m) => m.label === "d")).toBe(false);
  });
});

describe("assignSpectrum(peaks, options): other cases", () => {
  it("says undetermined when the second CB step is neither alike nor much larger (intermediate rate ratio)", () => {
    const r = assignSpectrum([peak(0.7, 1e-11), peak(0.82, 0.45e-11), peak(1.3, 1e-11)]);
    expect(r.regime).toBe("undetermined");
    expect(r.evidence.reasons.join(" ")).toMatch(/intermediate rate ratio/);
  });

  it("without η uses 1 and says so", () => {
    const r = assignSpectrum(cbFilling.map((v) => peak(v)));
    expect(r.energies.eta).toBe(1);
    expect(r.energies.etaGiven).toBe(false);
    expect(r.warnings.join(" ")).toMatch(/eta not given/);
    expectClose(r.energies.chargingEnergyEV!, r.quantities.chargingEnergyV!, { rtol: 0 });
  });

  it("rejects η outside (0, 1]", () => {
    expect(() => assignSpectrum([], { eta: 1.3 })).toThrow(/eta/);
  });

  it("ASSIGN_DEFAULTS are as documented (locked)", () => {
    expect(ASSIGN_DEFAULTS).toEqual({
      eta: 1,
      secondJunction: true,
      fillingStepRatio: [0.6, 1.3],
      tunnelingStepRatioMin: 1.4,
      satelliteStepRatioMax: 0.5,
      noiseStepRatioMax: 0.2,
      tunnelingSatelliteRatioMax: 0.3,
      fillingJumpRatioMin: 1.25,
      levelPairJumpMax: 0.8,
      levelPairRateRatioMax: 0.35,
      valenceLevelPairJumpMax: 0.6,
      satelliteEvidenceMin: 0.1,
      satelliteEvidenceMax: 0.2,
      levelStepMargin: 0.8,
      minLadderSpacingFraction: 0.65,
      leadingSatelliteRatioMax: 0.6,
      earlyEntryStepRatioMax: 0.48,
      earlyEntryDoubletRatioMin: 0.7,
      dipTypicalRatioMax: 0.7,
      subgroupExtraMin: 0.2,
      newShellExcessFraction: 0.9,
      tunnelingSublevelFraction: 0.5,
      tunnelingSublevelStepFraction: 0.75,
      tunnelingDeepSatelliteMax: 0.1,
      tunnelingDeepSatelliteOfSOnly: true,
      tunnelingDeepLessResonanceShare: true,
      tunnelingSublevelFirstStepMax: 1.3,
      tunnelingSublevelStepMax: 2.5,
      levelChargingTolerance: 0.15,
      fillingResonanceStepMin: 1.4,
      valenceDoubletStepRatioMin: 0.75,
      valenceChargingTolerance: 0.3,
      valenceTwinStepRatioMax: 1,
      splitShellStepRatioMax: 3,
    });
  });
});

/**
 * The contract of the peak indices (no tolerance: the link is exact): every index is a peak of
 * the list given, no peak is in two multiplets or both in a multiplet and among the satellites,
 * and positions and uncertainties are those of the peaks the indices name.
 */
function expectIndicesConsistent(peaks: readonly Peak[], a: Assignment): void {
  const owner = new Map<number, string>();
  for (const m of a.multiplets) {
    expect(m.peakIndices).toHaveLength(m.found);
    expect(m.subgroups.reduce((x, y) => x + y, 0)).toBe(m.found);
    m.peakIndices.forEach((i, k) => {
      expect(Number.isInteger(i) && i >= 0 && i < peaks.length, `${m.label}: index ${i} of ${peaks.length} peaks`).toBe(true);
      expect(owner.has(i), `peak ${i} in ${owner.get(i)} and ${m.label}`).toBe(false);
      owner.set(i, m.label);
      expect(m.peaksV[k]).toBe(peaks[i].biasV);
      expect(m.peakUncertaintiesV[k]).toBe(peaks[i].biasUncertaintyV);
    });
  }
  const e = a.evidence;
  expect(e.satellitePeakIndices).toHaveLength(e.satellitePeaksV.length);
  e.satellitePeakIndices.forEach((i, k) => {
    expect(Number.isInteger(i) && i >= 0 && i < peaks.length).toBe(true);
    expect(owner.has(i), `satellite ${i} also in ${owner.get(i)}`).toBe(false);
    expect(e.satellitePeaksV[k]).toBe(peaks[i].biasV);
  });
  expect(new Set(e.satellitePeakIndices).size).toBe(e.satellitePeakIndices.length);
}

describe("assignSpectrum(peaks): multiplets and satellites name their peaks by index", () => {
  // Indices by construction of each list (closed-form positions (|ε| + Ec(n + ½))/η, sorted by bias).
  it("shell filling: v2 (far VB peaks) first in the sorted list, then v1, s, p", () => {
    const peaks = [...vbFilling, ...cbFilling].sort((x, y) => x - y).map((v) => peak(v));
    const a = assignSpectrum(peaks, { eta });
    const byLabel = Object.fromEntries(a.multiplets.map((m) => [m.label, m.peakIndices]));
    // vbFilling has 6 peaks ordered from the gap edge; sorted ascending they sit at 5, 4, …, 0.
    expect(byLabel).toEqual({ s: [6, 7], p: [8, 9, 10, 11, 12, 13], v1: [5, 4], v2: [3, 2, 1, 0] });
    expect(a.evidence.satellitePeakIndices).toEqual([]);
    expectIndicesConsistent(peaks, a);
  });

  it("shell filling: the weak satellite before p is named by its index and belongs to no multiplet", () => {
    const cb = [...cbFilling.slice(0, 2), (0.8 + 0.15) / eta, ...cbFilling.slice(2)];
    const peaks = cb.map((v, i) => peak(v, i === 2 ? 2e-12 : 1e-11));
    const a = assignSpectrum(peaks, { eta });
    expect(a.evidence.satellitePeakIndices).toEqual([2]);
    expect(a.multiplets.map((m) => m.peakIndices)).toEqual([[0, 1], [3, 4, 5, 6, 7, 8]]);
    expectIndicesConsistent(peaks, a);
  });

  it("near the crossover (r = 0.25) reads Ec from the s satellite, sets p's charging peaks aside, and gives the single-particle gap (closed forms)", () => {
    // s at (0.5 + Ec/2)/η, its satellite at (0.5 + 3Ec/2)/η with step r/(1 + r) = 0.2 of s; p at
    // (0.8 + Ec/2)/η charging at (0.8 + 3Ec/2)/η and (0.8 + 5Ec/2)/η (6r = 1.5: p charges).
    const r = 0.25;
    const peaks = [peak(-(0.8 + 0.05) / eta, 4e-11), peak(-(0.6 + 0.05) / eta, 2e-11), peak((0.5 + 0.05) / eta, 2e-11), peak((0.5 + 0.15) / eta, (r / (1 + r)) * 2e-11),
      peak((0.8 + 0.05) / eta, 2.2e-11), peak((0.8 + 0.15) / eta, 2.4e-11), peak((0.8 + 0.25) / eta, 1.8e-11)];
    const a = assignSpectrum(peaks, { eta });
    expect(a.regime).toBe("shell-tunneling");
    expect(Object.fromEntries(a.multiplets.map((m) => [m.label, m.peakIndices]))).toEqual({ s: [2], p: [4], v1: [1], v2: [0] });
    expectClose(a.quantities.chargingEnergyV!, ec / eta, { rtol: 1e-9, what: "Ec/η from s and its satellite" });
    expectClose(a.energies.singleParticleGapEV!, 0.5 + 0.6, { rtol: 1e-9, what: "η·gap − Ec = ε_s − ε_v1" });
    expectClose(a.quantities.levelSpacingSPV!, (0.8 - 0.5) / eta, { rtol: 1e-9, what: "Δsp = p − s" });
    expect(a.evidence.satellitePeakIndices).toEqual([3, 5, 6]);
    expectIndicesConsistent(peaks, a);
  });

  it("shell tunnelling: one index per level, the s satellite among the satellites", () => {
    // Bias order: v2 (−0.85/η), v1 (−0.65/η), s (0.55/η), its satellite (0.65/η), p (0.85/η).
    const peaks = [peak(-(0.8 + 0.05) / eta, 4e-11), peak(-(0.6 + 0.05) / eta, 2e-11), peak((0.5 + 0.05) / eta, 2e-11), peak((0.5 + 0.15) / eta, 1e-12), peak((0.8 + 0.05) / eta, 6e-11)];
    const a = assignSpectrum(peaks, { eta });
    expect(a.regime).toBe("shell-tunneling");
    expect(Object.fromEntries(a.multiplets.map((m) => [m.label, m.peakIndices]))).toEqual({ s: [2], p: [4], v1: [1], v2: [0] });
    expect(a.evidence.satellitePeakIndices).toEqual([3]);
    expectIndicesConsistent(peaks, a);
  });

  it("keeps the contract on arbitrary peak lists (property test, any regime)", () => {
    const peakList = fc
      .array(fc.record({ v: fc.double({ min: -2, max: 2, noNaN: true }), step: fc.double({ min: 1e-13, max: 1e-10, noNaN: true }) }), { maxLength: 24 })
      .map((xs) => xs.sort((a, b) => a.v - b.v).map((x) => peak(x.v, x.step)));
    fc.assert(
      fc.property(peakList, fc.constantFrom(undefined, "shell-tunneling" as const, "shell-filling" as const), (peaks, regime) => {
        // Any regime, even forced on too few CB peaks (it once crashed there), keeps the contract.
        expectIndicesConsistent(peaks, assignSpectrum(peaks, { eta, regime }));
      }),
      { numRuns: 300 },
    );
  });
});

describe("assignSpectrum at η = 0.6: a resonance on the s doublet's second peak", () => {
  // Shell filling at r = 10 (closed forms, orthodox theory): peaks at (|ε| + Ec·(n + ½))/η with
  // ε_s = 0.525, ε_p = 0.85, ε_v1 = −0.4, ε_v2 = −0.78 eV, Ec = 0.1 eV. v1's resonance through the
  // substrate, (0.4 + 0.05)/(1 − η) = 1.125 V, falls on s's second peak (0.525 + 0.15)/η = 1.125 V;
  // s's resonance at −(0.525 + 0.05)/(1 − η) = −1.4375 V. A resonance carries (2r + 1)/(2 + r) = 1.75
  // of its level's first step (substrateToTipStepRatio), the second s step r/(1 + r) of the first.
  const e = 0.6, r = 10, ecV = 0.1 / e;
  const tip = (eps: number, n: number) => (eps + 0.1 * (n + 0.5)) / e;
  const list: [number, number][] = [
    ...[2, 3, 4, 5].map((n): [number, number] => [-tip(0.78, n), 1]),
    [-(0.525 + 0.05) / (1 - e), 1.75], // s's resonance
    [-tip(0.4, 1), r / (1 + r)], [-tip(0.4, 0), 1],
    [tip(0.525, 0), 1], [tip(0.525, 1), r / (1 + r) + 1.75], // s's second peak and v1's resonance together
    ...[2, 3, 4, 5, 6, 7].map((n): [number, number] => [tip(0.85, n), 1]),
  ];
  const peaks = list.sort((a, b) => a[0] - b[0]).map(([v, k]) => peak(v, k * 1e-11));
  const a = assignSpectrum(peaks, { eta: e });

  it("reads shell filling from the resonance heights and keeps the overlapped peak as the s doublet's second", () => {
    expect(a.regime).toBe("shell-filling");
    const s = a.multiplets.find((m) => m.label === "s")!;
    expectClose(s.peaksV, [tip(0.525, 0), tip(0.525, 1)], { rtol: 1e-12 });
    expect(a.multiplets.find((m) => m.label === "p")!.found).toBe(6);
    expectClose(a.quantities.chargingEnergyV!, ecV, { rtol: 1e-9, what: "Ec/η" });
    expect(a.evidence.secondJunction.map((x) => peaks[x.index].biasV)).toEqual([-(0.525 + 0.05) / (1 - e)]);
    expect(a.evidence.reasons.some((x) => /band-edge level .* carries 1\.75 ×/.test(x))).toBe(true);
  });
});

describe("assignSpectrum at η = 0.6: a resonance on the s doublet's first peak", () => {
  // Shell filling at r = 10 (closed forms, orthodox theory): peaks at (|ε| + Ec·(n + ½))/η with
  // ε_s = 0.625, ε_p = 0.95, ε_v1 = −0.4, ε_v2 = −0.85 eV, Ec = 0.1 eV. v1's resonance through the
  // substrate, (0.4 + 0.05)/(1 − η) = 1.125 V, falls on s's first peak (0.625 + 0.05)/η = 1.125 V;
  // s's resonance at −(0.625 + 0.05)/(1 − η) = −1.6875 V. A resonance carries (2r + 1)/(2 + r) = 1.75
  // of its level's first step (substrateToTipStepRatio), the second s step r/(1 + r) of the first.
  const e = 0.6, r = 10;
  const tip = (eps: number, n: number) => (eps + 0.1 * (n + 0.5)) / e;
  const build = (overlapStep: number) => {
    const list: [number, number][] = [
      ...[2, 3, 4, 5].map((n): [number, number] => [-tip(0.85, n), 1]),
      [-(0.625 + 0.05) / (1 - e), 1.75], // s's resonance
      [-tip(0.4, 1), r / (1 + r)], [-tip(0.4, 0), 1],
      [tip(0.625, 0), overlapStep], [tip(0.625, 1), r / (1 + r)],
      ...[2, 3, 4, 5, 6, 7].map((n): [number, number] => [tip(0.95, n), 1]),
    ];
    return list.sort((a, b) => a[0] - b[0]).map(([v, k]) => peak(v, k * 1e-11));
  };
  const hiddenFirst = /kept as the s doublet's first peak/;

  it("keeps the overlapped peak (the level's step 1 plus the resonance's 1.75) as the s doublet's first", () => {
    const peaks = build(1 + 1.75);
    const a = assignSpectrum(peaks, { eta: e });
    expect(a.regime).toBe("shell-filling");
    expectClose(a.multiplets.find((m) => m.label === "s")!.peaksV, [tip(0.625, 0), tip(0.625, 1)], { rtol: 1e-12 });
    expect(a.multiplets.find((m) => m.label === "p")!.found).toBe(6);
    expectClose(a.quantities.chargingEnergyV!, 0.1 / e, { rtol: 1e-9, what: "Ec/η" });
    expect(a.evidence.reasons.some((x) => hiddenFirst.test(x))).toBe(true);
    expectIndicesConsistent(peaks, a);
  });

  it("does not take a peak stepping like the resonance alone (1.75 < 2 + 0.6 × its source) as the hidden first peak", () => {
    const peaks = build(1.75);
    expect(assignSpectrum(peaks, { eta: e }).evidence.reasons.some((x) => hiddenFirst.test(x))).toBe(false);
  });
});

// Shell tunnelling at low η (η = 0.56, r = Γtip/Γsub = 0.01), closed forms of lib/model/regimeLimits.ts:
// a level of 6 states after one of 2 steps levelStepRatio(2, 6, r) × its step; a resonance
// −η·V/(1 − η) of a g-fold level steps substrateToTipStepRatio(g, r) × its source. The first VB
// level's second resonance lies Ec/(1 − η) beyond its first (Ec = 0.169 eV) where nothing predicts it,
// and p lies at the second VB level's resonance (a shared peak).
describe("assignSpectrum: p under a VB level's resonance in shell tunnelling, at low η", () => {
  const eta = 0.56;
  const r = 0.01;
  const gain = eta / (1 - eta);
  const stepA = 1e-11;
  const pStepA = levelStepRatio(2, 6, r) * stepA;
  const build = (vb2StepA: number) => {
    const vb1V = -1.709;
    const vb2V = -1.944;
    const res1V = -gain * vb1V;
    const pV = -gain * vb2V;
    const resonanceA = substrateToTipStepRatio(2, r) * stepA;
    return [
      peak(vb2V, vb2StepA),
      peak(vb1V, stepA),
      peak(2.085, stepA),
      peak(res1V, resonanceA),
      peak(pV, pStepA + substrateToTipStepRatio(6, r) * vb2StepA),
      peak(res1V + 0.169 / (1 - eta), resonanceA),
    ];
  };

  it("reads shell tunnelling with p at the shared peak where the VB's second level steps levelStepRatio(2, 6, r) × its first", () => {
    const peaks = build(pStepA);
    const a = assignSpectrum(peaks, { eta });
    expect(a.regime).toBe("shell-tunneling");
    const p = a.multiplets.find((m) => m.band === "CB" && m.label === "p")!;
    expect(p.peakIndices).toEqual([4]);
    expect(a.evidence.reasons.some((x) => x.includes("whose resonance it overlaps"))).toBe(true);
  });

  it("leaves the regime undetermined where the VB starts with alike steps", () => {
    expect(assignSpectrum(build(0.9 * stepA), { eta }).regime).toBe("undetermined");
  });
});
