// A shell-filling VB group with an odd number of peaks, one at a CB level's second-junction
// resonance. Positions are closed forms of the orthodox theory of the double-barrier junction: a
// CB charging peak at V behind N carriers predicts −η/(1 − η)·(|V| − N·Ec_V); every VB level holds
// two carriers per orbital, so its charging peaks come in an even group.
import { describe, it, expect } from "vitest";
import { oddValenceResonance, ODD_VALENCE_LEVEL_DEFAULTS } from "../../lib/assign/oddValenceLevel.ts";
import { assignSpectrum } from "../../lib/assign/assignSpectrum.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const at = (biasV: number) => ({ biasV, biasUncertaintyV: 0.002, fwhmV: 0.04 });
// η = 0.6 (gain 1.5), Ec_V = 0.2 V: s at 1.0, 1.2 V (N = 0: −1.5, −1.8 V); p's first sub-level at
// 2.1, 2.3 V behind the s doublet (N = 2: −1.5·(2.1 − 0.4) = −2.55 V and −2.85 V).
const cb = (peakIndices: number[], degeneracy: number, subgroups: number[]) => ({ band: "CB" as const, degeneracy, peakIndices, subgroups });
const vb = (peakIndices: number[]) => ({ band: "VB" as const, degeneracy: null, peakIndices, subgroups: [peakIndices.length] });
/** Peaks: VB ones (from the far end inward), the gap-edge doublet −1.3, −1.1 V, then s and p. */
function spectrum(vbFar: number[]) {
  const v = [...vbFar].sort((x, y) => x - y);
  const peaks = [...v, -1.3, -1.1, 1.0, 1.2, 2.1, 2.3].map(at);
  const k = v.length;
  const s = cb([k + 2, k + 3], 2, [2]);
  const p = cb([k + 4, k + 5], 6, [2]);
  const v1 = vb([k + 1, k]);
  const v2 = vb(v.map((_, i) => k - 1 - i));
  return { peaks, multiplets: [s, p, v1, v2] };
}

describe("oddValenceResonance(peaks, multiplets, resonances, chargingEnergyV, eta)", () => {
  it("names a lone VB peak 70 mV from p's resonance, −1.5·(2.1 − 2·0.2) = −2.55 V (closed form): beyond FWHM/2, within 0.25·1.5·0.2 V", () => {
    const { peaks, multiplets } = spectrum([-2.62]);
    const got = oddValenceResonance(peaks, multiplets, [], 0.2, 0.6)!;
    expect(got.index).toBe(0);
    expect(got.sourceIndex).toBe(5);
    expect(got.predictedV).toBeCloseTo(-2.55, 12);
  });

  it("leaves it 80 mV off (beyond the reach of 75 mV), an even group, and η outside (0, 1)", () => {
    expect(oddValenceResonance(spectrum([-2.63]).peaks, spectrum([-2.63]).multiplets, [], 0.2, 0.6)).toBeNull();
    const even = spectrum([-2.62, -2.82]);
    expect(oddValenceResonance(even.peaks, even.multiplets, [], 0.2, 0.6)).toBeNull();
    const lone = spectrum([-2.62]);
    expect(oddValenceResonance(lone.peaks, lone.multiplets, [], 0.2, 1)).toBeNull();
  });

  it("does not take a peak inside a group one Ec_V from both neighbours (a charging step the resonance overlaps)", () => {
    // −2.35, −2.55, −2.75: the middle one is at the prediction but on the group's ladder; the ends
    // are 200 mV from it and 100 mV from −2.85 V.
    const on = spectrum([-2.35, -2.55, -2.75]);
    expect(oddValenceResonance(on.peaks, on.multiplets, [], 0.2, 0.6)).toBeNull();
    // Moved to −2.48 V it splits the spacing into 0.13 and 0.27 V (beyond 0.3·Ec_V of 0.2 V): taken, 70 mV off.
    const off = spectrum([-2.35, -2.48, -2.75]);
    expect(off.peaks[oddValenceResonance(off.peaks, off.multiplets, [], 0.2, 0.6)!.index].biasV).toBe(-2.48);
  });

  it("leaves a prediction that a peak set aside nearer it already answers, unless the two are one peak split (within one FWHM)", () => {
    // −2.62 and −2.55 V: the latter set aside at the prediction; 70 mV apart, beyond one FWHM of 40 mV.
    const { peaks, multiplets } = spectrum([-2.62]);
    const withAside = [at(-2.55), ...peaks];
    const shifted = multiplets.map((m) => ({ ...m, peakIndices: m.peakIndices.map((i) => i + 1) }));
    expect(oddValenceResonance(withAside, shifted, [{ index: 0 }], 0.2, 0.6)).toBeNull();
    // The set-aside half 30 mV away, within one FWHM: the lone peak is the other half of it.
    const split = [at(-2.59), ...peaks];
    expect(oddValenceResonance(split, shifted, [{ index: 0 }], 0.2, 0.6)?.index).toBe(1);
  });

  it("never takes the gap edge (the first peak of v1), where the gap rests", () => {
    // v1 read as one peak at −1.8 V, s's second resonance there (−1.5 × 1.2 V).
    const peaks = [-1.8, 1.0, 1.2, 2.1, 2.3].map(at);
    const multiplets = [cb([1, 2], 2, [2]), cb([3, 4], 6, [2]), vb([0])];
    expect(oddValenceResonance(peaks, multiplets, [], 0.2, 0.6)).toBeNull();
  });

  it("ODD_VALENCE_LEVEL_DEFAULTS are locked: a quarter of Ec times η/(1 − η), two rounds, a resonance step of 7/5 × a level ((g·r + 1)/(g + r) at g = 2, r = 3)", () => {
    expect(Object.isFrozen(ODD_VALENCE_LEVEL_DEFAULTS)).toBe(true);
    expect(ODD_VALENCE_LEVEL_DEFAULTS).toEqual({ ladderReach: 0.25, maxRounds: 2, resonanceStepMin: 7 / 5 });
  });
});

describe("withoutOddValence through assignSpectrum: a peak stepping like a CB level's resonance", () => {
  // η = 0.6, Ec_V = 0.2 V: s at 1.0, 1.2 V, p at 2.1 … 3.1 V (N = 2: p's first predicts −2.55 V);
  // VB doublet −1.1, −1.3 V; a peak 70 mV off the prediction, at −2.62 V (beyond the rounds'
  // FWHM/2, within the 75 mV reach), and a VB peak at −3.3 V stepping 0.6 × a charging step.
  // A resonance of a CB level through the substrate junction steps (g·r + 1)/(g + r) × a level's
  // step (orthodox theory; ≥ 7/5 for g = 2, r ≥ 3), a VB charging peak about one level's step.
  const peak = (biasV: number, stepA = 1e-11): Peak => ({ biasV, biasUncertaintyV: 0.002, index: 0, heightS: 1e-9, prominenceS: 1e-9, fwhmV: 0.04, stepA, snr: 20, stepSignificance: 30 });
  const read = (candidateStepA: number) =>
    assignSpectrum([peak(-3.3, 0.6e-11), peak(-2.62, candidateStepA), peak(-1.3), peak(-1.1), ...[1.0, 1.2, 2.1, 2.3, 2.5, 2.7, 2.9, 3.1].map((v) => peak(v))], { eta: 0.6 });
  const groups = (a: ReturnType<typeof read>) => a.multiplets.filter((m) => m.band === "VB").map((m) => m.peakIndices);

  it("sets it aside at 3 × the VB's median step although the VB stays one odd group (the −3.3 V peak, its satellite before, is then read)", () => {
    expect(ODD_VALENCE_LEVEL_DEFAULTS.resonanceStepMin).toBeCloseTo(7 / 5, 12);
    const a = read(3e-11);
    expect(a.regime).toBe("shell-filling");
    expect(a.evidence.secondJunction.map((r) => r.index)).toContain(1);
    expect(groups(a)).toEqual([[3, 2], [0]]);
  });

  it("keeps it at 1.3 × (below 7/5: it may be a VB charging peak) where the VB would stay as odd", () => {
    const a = read(1.3e-11);
    expect(a.evidence.secondJunction.map((r) => r.index)).not.toContain(1);
    expect(groups(a)).toEqual([[3, 2], [1]]);
  });
});
