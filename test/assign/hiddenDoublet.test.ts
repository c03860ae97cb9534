// The s doublet's second (or first) peak under a VB level's second-junction resonance, read as
// shell filling from the VB's charging doublet where the band-edge resonances read weak (notes 2
// and 3 of `hiddenDoublet` in lib/assign/substrateReadings.ts). Peak lists built from the closed-form peak
// positions of orthodox theory, (ε + Ec·(n + ½))/η, the resonance of a peak at V at −η·V/(1 − η),
// and the step ratios r/(1 + r) of a doublet and (2r + 1)/(2 + r) of its resonance
// (`secondToFirstStepRatio`, `substrateToTipStepRatio`: closed forms).
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { assignPeak as peak } from "../helpers/assignPeak.ts";
import { assignSpectrum, ASSIGN_DEFAULTS, type Assignment } from "../../lib/assign/assignSpectrum.ts";
import { REGIME_LIMITS, secondToFirstStepRatio, substrateToTipStepRatio } from "../../lib/model/regimeLimits.ts";

// η = 0.6 (gain η/(1 − η) = 1.5), Ec = 0.15 eV; ε_s = 0.9, ε_p = 1.35 eV; the VB edge level placed
// so that its first peak's resonance falls on the s doublet's second peak; a VB level of four
// states at ε = 1.0 eV.
const eta = 0.6, ec = 0.15, gain = eta / (1 - eta);
const sV = [0.9 + ec / 2, 0.9 + 1.5 * ec].map((e) => e / eta);
const pV = [2, 3, 4, 5, 6, 7].map((n) => (1.35 + ec * (n + 0.5)) / eta);
const v1 = sV[1] / gain;
const vbV = [v1, v1 + ec / eta, ...[2, 3, 4, 5].map((n) => (1.0 + ec * (n + 0.5)) / eta)].map((v) => -v);

/** The spectrum at rate ratio r; s1's resonance split by the search into a peak and a stepless part. */
function spectrum(r: number) {
  const q = secondToFirstStepRatio(r), rho = substrateToTipStepRatio(2, r), step = 1e-11;
  const sResonanceV = -gain * sV[0];
  return [
    peak(vbV[0], step), peak(vbV[1], q * step), ...vbV.slice(2).map((v) => peak(v, step)),
    peak(sResonanceV, rho * step), peak(sResonanceV - 0.012, 0),
    // s2 and the VB edge level's resonance in one peak: their steps add.
    peak(sV[0], step), peak(sV[1], q * step + rho * step), ...pV.map((v) => peak(v, 0.9 * step)),
  ].sort((a, b) => a.biasV - b.biasV);
}

/** Shell filling with s, p and Ec at the closed form. */
function expectClosedForm(a: Assignment): void {
  expect(a.regime).toBe("shell-filling");
  const byLabel = Object.fromEntries(a.multiplets.map((m) => [m.label, m]));
  expectClose(byLabel.s.peaksV, sV, { rtol: 1e-12, what: "s, closed form" });
  expectClose(byLabel.p.peaksV, pV, { rtol: 1e-12, what: "p, closed form" });
  expectClose(a.quantities.chargingEnergyV!, ec / eta, { rtol: 1e-9, what: "Ec in bias, closed form" });
}

describe("assignSpectrum(peaks, { eta }): the s doublet's second peak under the VB edge level's resonance", () => {
  it("the least VB doublet ratio is r/(1 + r) at twice the filling limit (closed form)", () => {
    expect(ASSIGN_DEFAULTS.valenceDoubletStepRatioMin).toBe(secondToFirstStepRatio(2 * REGIME_LIMITS.fillingRateRatioMin));
    expect(ASSIGN_DEFAULTS.valenceDoubletStepRatioMin).toBeCloseTo(3 / 4, 12);
  });

  it("reads shell filling with s, p and Ec at the closed form where the VB doublet steps 4/5 (r = 4)", () => {
    const peaks = spectrum(4);
    const a = assignSpectrum(peaks, { eta });
    expectClosedForm(a);
    expect(a.evidence.reasons[0]).toMatch(/a charging doublet, so shell filling; the peak at 1\.875 V/);
  });

  it("does not where the VB doublet steps below 3/4 (r = 2: 2/3), though inside the filling range", () => {
    // r/(1 + r) = 2/3 ≥ 0.6: a doublet by the CB's rule, but under the margin; the resonances
    // (one split) give no reading either, so the merged peak stays what the rules made of it.
    const a = assignSpectrum(spectrum(2), { eta });
    expect(a.regime).not.toBe("shell-filling");
    expect(a.evidence.reasons.some((r) => r.includes("a charging doublet, so shell filling"))).toBe(false);
  });

  it("reads shell filling from the rounds where a VB level's resonance the plain guess misses follows s2", () => {
    // A VB level of four states, its first peak 1.85 V: the plain −η·V/(1 − η) puts its resonance
    // at 2.775 V, the ladder at η/(1 − η)·(|V| − 2·Ec_V) = 2.025 V (two carriers before it), 0.15 V
    // after s2: the pair s1, s2 then reads as the s level and a p level until the rounds set it aside.
    const r = 4, step = 1e-11, ecV = ec / eta, v2 = 1.85;
    const q = secondToFirstStepRatio(r), rho = substrateToTipStepRatio(2, r);
    const vb = [vbV[0], vbV[1], ...[0, 1, 2, 3].map((k) => -(v2 + k * ecV))];
    const sResonanceV = -gain * sV[0];
    const peaks = [
      peak(vb[0], step), peak(vb[1], q * step), ...vb.slice(2).map((v) => peak(v, step)),
      peak(sResonanceV, rho * step), peak(sResonanceV - 0.012, 0),
      peak(sV[0], step), peak(sV[1], q * step + rho * step), peak(gain * (v2 - 2 * ecV), substrateToTipStepRatio(4, r) * step), ...pV.map((v) => peak(v, 0.9 * step)),
    ].sort((a, b) => a.biasV - b.biasV);
    const a = assignSpectrum(peaks, { eta });
    expectClosedForm(a);
    expectClose(a.evidence.secondJunction.map((x) => peaks[x.index].biasV).filter((v) => v > 0), [gain * (v2 - 2 * ecV)], { rtol: 1e-12, what: "the ladder's resonance, closed form" });
    expect(a.evidence.reasons.some((x) => x.includes("given by the user"))).toBe(false);
  });

  it("reads shell filling where the VB edge level's resonance hides the s doublet's first peak (r = 9)", () => {
    // The VB edge level at s1/gain: its resonance on s1 ((2r + 1)/(2 + r) × its step added to
    // s1's). The CB edge left is s2, whose resonance carries 1/(1 + r) of s1's: the band-edge
    // resonances read weak, the VB doublet (9/10) reads shell filling.
    const r = 9, step = 1e-11, ecV = ec / eta;
    const q = secondToFirstStepRatio(r), rho = substrateToTipStepRatio(2, r);
    const v1Edge = sV[0] / gain;
    const vb = [v1Edge, v1Edge + ecV, 1.75, 1.75 + ecV].map((v) => -v);
    const peaks = [
      peak(vb[0], step), peak(vb[1], q * step), ...vb.slice(2).map((v) => peak(v, step)),
      peak(-gain * sV[1], (rho * step) / (1 + r)),
      peak(sV[0], step + rho * step), peak(sV[1], q * step), ...pV.map((v) => peak(v, 0.9 * step)),
    ].sort((a, b) => a.biasV - b.biasV);
    const a = assignSpectrum(peaks, { eta });
    expectClosedForm(a);
    expect(a.evidence.reasons[0]).toMatch(/a charging doublet, so shell filling; the peak at 1\.625 V, one VB doublet spacing below the first CB peak, is kept as the s doublet's first peak/);
  });
});
