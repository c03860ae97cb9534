// leadingShoulder: a weak first CB peak within one FWHM of the next is a fragment of that peak.
// Sources: the closed form of a thermally broadened level's conductance peak, the derivative of a
// Fermi step, sech²((V − V₀)/(2w)) (FWHM 4·w·arccosh(√2)); the peak positions of orthodox theory,
// (ε + Ec·(n + ½))/η (C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)).
import { describe, it, expect } from "vitest";
import { leadingShoulder, LEADING_SHOULDER_DEFAULTS } from "../../lib/assign/leadingShoulder.ts";
import { assignSpectrum } from "../../lib/assign/assignSpectrum.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { assignPeak } from "../helpers/assignPeak.ts";

const at = (x: number, stepA: number, fwhmV: number, index: number): BandPeak => ({ x, index, peak: { biasV: x, stepA, fwhmV } as Peak });

/** Local maxima of the sum of two sech² peaks of one FWHM (V), the second `ratio` × the first's height, `spacingV` apart. */
function maxima(fwhmV: number, ratio: number, spacingV: number): number {
  const w = fwhmV / (4 * Math.acosh(Math.SQRT2));
  const g = (v: number) => (ratio * Math.cosh(v / (2 * w)) ** -2) + Math.cosh((v - spacingV) / (2 * w)) ** -2;
  let count = 0;
  const h = fwhmV / 2000;
  for (let v = -3 * fwhmV; v <= spacingV + 3 * fwhmV; v += h) if (g(v) > g(v - h) && g(v) >= g(v + h)) count++;
  return count;
}

describe("leadingShoulder(cb)", () => {
  it("the bound is physical: two sech² peaks, the smaller half the larger, one FWHM apart show one maximum (closed form)", () => {
    expect(maxima(0.06, LEADING_SHOULDER_DEFAULTS.stepRatioMax, LEADING_SHOULDER_DEFAULTS.spacingFwhmMax * 0.06)).toBe(1);
    // … and resolve into two well beyond it (1.3 FWHM).
    expect(maxima(0.06, LEADING_SHOULDER_DEFAULTS.stepRatioMax, 1.3 * 0.06)).toBe(2);
  });

  it("sets aside a weak first peak within the smaller FWHM of the next (a split peak)", () => {
    const cb = [at(2.345, 0.03e-12, 0.067, 3), at(2.383, 0.13e-12, 0.1, 4), at(2.953, 0.37e-12, 0.069, 5)];
    expect(leadingShoulder(cb)?.index).toBe(3);
  });

  it("keeps a first peak that is farther than a FWHM or steps at least half the next (common practice (no source))", () => {
    // s one third of p's step (deep shell tunnelling: 2 states against 6) but 300 mV before it.
    expect(leadingShoulder([at(2.0, 1e-12, 0.06, 0), at(2.3, 3e-12, 0.06, 1)])).toBeNull();
    // Close but alike: two levels' peaks merging, not a fragment.
    expect(leadingShoulder([at(2.0, 2e-12, 0.06, 0), at(2.05, 3e-12, 0.06, 1)])).toBeNull();
    expect(leadingShoulder([at(2.0, 2e-12, 0.06, 0)])).toBeNull();
    expect(leadingShoulder([])).toBeNull();
  });

  it("assignSpectrum in shell tunnelling reads s at the main peak, the shoulder set aside (closed-form positions)", () => {
    // η = 0.8, Ec = 0.1 eV: v2 −0.85/η, v1 −0.65/η, s 0.55/η with a weak fragment 30 mV (< FWHM 40 mV) before it, p 0.85/η.
    const eta = 0.8;
    const sV = 0.55 / eta;
    const peaks = [assignPeak(-0.85 / eta, 4e-11), assignPeak(-0.65 / eta, 2e-11), assignPeak(sV - 0.03, 0.6e-11), assignPeak(sV, 2e-11), assignPeak(0.85 / eta, 6e-11)];
    const a = assignSpectrum(peaks, { eta });
    expect(a.regime).toBe("shell-tunneling");
    expect(Object.fromEntries(a.multiplets.map((m) => [m.label, m.peakIndices]))).toEqual({ s: [3], p: [4], v1: [1], v2: [0] });
    expect(a.evidence.satellitePeakIndices).toContain(2);
    // With the regime given (the model fit's single-level hypothesis) the peak stays a level.
    expect(assignSpectrum(peaks, { eta, regime: "shell-tunneling" }).multiplets.find((m) => m.label === "s")?.peakIndices).toEqual([2]);
  });
});
