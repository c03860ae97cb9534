// confirmResonances: which peaks at predicted second-junction resonances stand, checked on peak
// lists at closed-form positions. Tip side of shell filling: (|ε| + Ec·(N + ½))/η; substrate side
// of a level first entered: −(|ε| + Ec/2)/(1 − η) (orthodox theory of the double-barrier junction:
// D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena in Solids (Elsevier, 1991);
// C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991)). ε_s = 0.5, ε_p = 0.8 eV, Ec = 0.1 eV, η = 0.6.
import { describe, it, expect } from "vitest";
import { confirmResonances } from "../../lib/assign/confirmResonances.ts";
import type { Multiplet } from "../../lib/assign/multiplets.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";
import { expectClose } from "../helpers/expectClose.ts";

const eta = 0.6, ec = 0.1;
const peak = (biasV: number, stepA = 1e-11): Peak => ({ biasV, biasUncertaintyV: 0.002, index: 0, heightS: 1e-9, prominenceS: 1e-9, fwhmV: 0.04, stepA, snr: 20, stepSignificance: 30 });
const tip = (e: number, n: number) => (e + ec * (n + 0.5)) / eta;
const sub = (e: number) => -(e + ec / 2) / (1 - eta);
const shell = (label: string, degeneracy: number, peakIndices: number[]) => ({ band: "CB", label, degeneracy, peakIndices, found: peakIndices.length }) as unknown as Multiplet;

describe("confirmResonances(candidates, peaks, first)", () => {
  // Peaks: 0 = p's substrate resonance (level first entered), 1 = s's; 2–3 s doublet; 4–9 p sextet.
  const positions = [sub(0.8), sub(0.5), tip(0.5, 0), tip(0.5, 1), ...[2, 3, 4, 5, 6, 7].map((n) => tip(0.8, n))];
  const peaks = positions.map((v) => peak(v));
  const first = { regime: "shell-filling" as const, multiplets: [shell("s", 2, [2, 3]), shell("p", 6, [4, 5, 6, 7, 8, 9])], chargingEnergyV: ec / eta, eta };

  it("predicts each level's resonance at −η(V₁ − N·Ec)/(1 − η) from its first charging peak (N = 2 for p) and keeps the peaks there", () => {
    const r = confirmResonances([], peaks, first);
    expect(r.kept.map((k) => [k.index, k.sourceIndex])).toEqual([[1, 2], [0, 4]]);
    expectClose(r.kept[1].predictedV, sub(0.8), { rtol: 1e-12, what: "−(ε_p + Ec/2)/(1 − η)" });
  });

  it("releases a candidate predicted by a later charging peak (the substrate side of shell filling shows a level once)", () => {
    const extra = [...peaks, peak(-(eta * tip(0.5, 1)) / (1 - eta))]; // at −(ε_s + 3Ec/2)/(1 − η)
    const r = confirmResonances([{ index: 10, sourceIndex: 3, predictedV: extra[10].biasV }], extra, first);
    expect(r.released.map((x) => x.resonance.index)).toEqual([10]);
    expect(r.released[0].levelStepA).toBeNull();
  });

  it("gives back a peak that fills a charging step of a multiplet, with the multiplet's median step as its own", () => {
    // A VB level whose resonance, +η|V_v|/(1 − η), lands on p's fourth peak (index 7), one Ec from
    // p's third and fifth: the level is what the ladder needs; its step holds both.
    const vb = peak(-(positions[7] * (1 - eta)) / eta);
    const stepped = [...peaks.map((p, i) => (i === 7 ? { ...p, stepA: 3e-11 } : p)), vb];
    const v1 = { band: "VB", label: "v1", degeneracy: null, peakIndices: [10], found: 1 } as unknown as Multiplet;
    const r = confirmResonances([{ index: 7, sourceIndex: 10, predictedV: positions[7] }], stepped, { ...first, multiplets: [first.multiplets[0], shell("p", 6, [4, 5, 6, 8, 9]), v1] });
    const back = r.released.find((x) => x.resonance.index === 7)!;
    expect(back.levelStepA).toBe(1e-11);
    expect(r.kept.some((k) => k.index === 7)).toBe(false);
  });

  it("keeps every candidate outside shell filling", () => {
    const c = [{ index: 0, sourceIndex: 4, predictedV: positions[0] }];
    expect(confirmResonances(c, peaks, { ...first, regime: "shell-tunneling" }).kept).toEqual(c);
  });
});
