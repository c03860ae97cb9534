// The s doublet of a shell-filling reading is placed at the lowest CB pair one VB doublet spacing
// apart that holds a peak set aside as a second-junction resonance (lib/assign/valenceSpacedS.ts).
// On draws of the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept),
// simulated by the project's model: every expected value is the simulation's truth, the tolerance
// the project's quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { expectTrueP, lowEtaDraw, LOW_ETA_RANGES } from "../helpers/lowEtaDraw.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { assignSpectrum, readingWithResonances } from "../../lib/assign/assignSpectrum.ts";
import { withValenceSpacedS } from "../../lib/assign/valenceSpacedS.ts";
import { ASSIGN_DEFAULTS } from "../../lib/assign/assignDefaults.ts";
import { syntheticSpectrum } from "../../lib/model/syntheticSpectrum.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

/** A low-η draw's truth without the simulation, and the project's quality bar (25 % of Ec/η), V. */
const drawTruth = (start: number) => {
  const { truth } = syntheticSpectrum(start, "shell-filling", LOW_ETA_RANGES);
  return { truth, tolV: (0.25 * truth.chargingEnergyEV) / truth.eta };
};
const sOf = (a: { multiplets: { band: string; label: string; peaksV: number[] }[] }) => a.multiplets.find((m) => m.band === "CB" && m.label === "s");

describe("withValenceSpacedS: the s doublet one VB doublet spacing apart (low-η draws)", () => {
  // Draws 1094 and 2172: a VB edge level's plain resonance falls on s's first charging peak, the
  // summed peak was set aside whole and s was read from higher peaks (p's in 1094).
  for (const start of [1094, 2172]) {
    it(`reads s at the truth's doublet (draw ${start})`, () => {
      const draw = lowEtaDraw(start);
      const { analysis, truth, tolV } = draw;
      // The draw is the case: a resonance of the truth lies within the bar of s's first peak.
      expect(truth.secondJunctionPeaksV.some((v) => Math.abs(v - truth.sPeaksV[0]) < tolV)).toBe(true);
      expect(analysis.assignment.regime).toBe("shell-filling");
      const s = sOf(analysis.assignment)!;
      expectClose(s.peaksV, truth.sPeaksV, { atol: tolV, what: "s, the simulation's truth" });
      expect(analysis.assignment.evidence.reasons.some((r) => r.includes("one VB doublet spacing") && r.includes("read as the s doublet"))).toBe(true);
      // Without the rule (assignSpectrum's notes 1–8 alone) the same peaks give s elsewhere (the
      // rule is what places it); assignSpectrum itself applies it.
      const plain = readingWithResonances(analysis.peaks, { eta: truth.eta });
      expectClose(sOf(assignSpectrum(analysis.peaks, { eta: truth.eta }))!.peaksV, truth.sPeaksV, { atol: tolV, what: "s, the simulation's truth" });
      const before = sOf(plain)!;
      expect(before.peaksV.some((v, k) => Math.abs(v - truth.sPeaksV[k]) > tolV)).toBe(true);
    }, 30_000);
  }

  // Draw 26: a pure resonance lies one spacing below s's first peak; s read one spacing apart
  // from that peak stands (note 3).
  it("keeps an s already one spacing apart that starts at the pair's second peak (draw 26)", () => {
    const { analysis, truth, tolV } = lowEtaDraw(26);
    expect(truth.secondJunctionPeaksV.some((v) => v < truth.sPeaksV[0] - tolV && Math.abs(truth.sPeaksV[0] - v - (truth.sPeaksV[1] - truth.sPeaksV[0])) < tolV)).toBe(true);
    expectClose(sOf(analysis.assignment)!.peaksV, truth.sPeaksV, { atol: tolV, what: "s, the simulation's truth" });
  }, 30_000);

  // Identity cases (exact equivalence with the reading given): a regime the user gave (shell
  // tunnelling or shell filling), η not given.
  it("returns the reading unchanged where the user gave the regime or η is not given", () => {
    const { analysis, truth } = lowEtaDraw(1094);
    const peaks = analysis.peaks;
    const tunnel = assignSpectrum(peaks, { eta: truth.eta, regime: "shell-tunneling" });
    expect(withValenceSpacedS(peaks, tunnel, { eta: truth.eta, regime: "shell-tunneling" })).toBe(tunnel);
    const given = assignSpectrum(peaks, { eta: truth.eta, regime: "shell-filling" });
    expect(withValenceSpacedS(peaks, given, { eta: truth.eta, regime: "shell-filling" })).toBe(given);
    const noEta = assignSpectrum(peaks);
    expect(withValenceSpacedS(peaks, noEta, {})).toBe(noEta);
  }, 30_000);

  // Draw 124: s's second peak lies beside a resonance of a deeper VB level (its summed step read
  // as p at many times s's step), so notes 1–8 read shell tunnelling; the VB reads as a charging
  // doublet and the lowest ladder pair one VB doublet spacing apart is s (note 6).
  it("reads shell filling from the VB doublet where s's second peak lies beside a resonance (draw 124)", () => {
    const draw = lowEtaDraw(124);
    const { analysis, truth, tolV } = draw;
    // The draw is the case: a resonance of the truth lies within half s's spacing of its second peak.
    expect(truth.secondJunctionPeaksV.some((v) => Math.abs(v - truth.sPeaksV[1]) < (truth.sPeaksV[1] - truth.sPeaksV[0]) / 2)).toBe(true);
    expect(analysis.assignment.regime).toBe("shell-filling");
    expectClose(sOf(analysis.assignment)!.peaksV, truth.sPeaksV, { atol: tolV, what: "s, the simulation's truth" });
    expectTrueP(draw, []);
  }, 30_000);

  // Unit case: draw 124's peaks as the pipeline found them without note 6 (position V, step pA,
  // FWHM mV; s's second peak and the resonance beside it found as one peak at 2.536 V), with the
  // draw's η. Expected values are the simulation's truth.
  const found124 = "-3.119 19.821 73, -2.923 8.042 92, -2.866 46.477 92, -2.653 16.740 126, -2.431 23.596 113, -1.803 20.086 109, -1.572 19.595 73, 2.027 26.514 86, 2.269 15.757 88, 2.536 40.332 103, 2.854 20.697 126, 3.133 9.493 92, 3.218 16.092 92, 3.423 19.030 110, 3.651 19.365 102, 3.886 18.789 74, 4.110 16.165 133, 4.332 12.816 118";
  const peaks124: Peak[] = found124.split(", ").map((t, index) => {
    const [biasV, stepPA, fwhmMV] = t.split(" ").map(Number);
    return { biasV, biasUncertaintyV: 0.002, index, heightS: 1e-9, prominenceS: 1e-9, fwhmV: fwhmMV / 1000, stepA: stepPA * 1e-12, snr: 20, stepSignificance: 30 };
  });

  it("reads a shell-tunnelling reading again in shell filling from the VB doublet (draw 124's peaks)", () => {
    const { truth, tolV } = drawTruth(124);
    const opts = { eta: truth.eta };
    const plain = readingWithResonances(peaks124, opts);
    expect(plain.regime).toBe("shell-tunneling");
    const out = withValenceSpacedS(peaks124, plain, opts);
    expect(out.regime).toBe("shell-filling");
    const s = sOf(out)!.peaksV;
    expect(s.length).toBe(2);
    expectClose([s[0]], [truth.sPeaksV[0]], { atol: tolV, what: "s's first peak, the simulation's truth" });
    // s's second peak is the merged one: between the truth's s peak and the resonance beside it.
    const beside = truth.secondJunctionPeaksV.find((v) => Math.abs(v - truth.sPeaksV[1]) < (truth.sPeaksV[1] - truth.sPeaksV[0]) / 2)!;
    expect(s[1]).toBeGreaterThan(Math.min(beside, truth.sPeaksV[1]) - tolV);
    expect(s[1]).toBeLessThan(Math.max(beside, truth.sPeaksV[1]) + tolV);
    const p = out.multiplets.find((m) => m.band === "CB" && m.label === "p")!;
    expectClose(p.peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
    expect(out.evidence.reasons[0]).toContain("a charging doublet");
  });

  // The VB doublet's second step scaled to 0.7 × its first, below r/(1 + r) at r = 3 (closed
  // form: 0.75, ASSIGN_DEFAULTS.valenceDoubletStepRatioMin), no longer says shell filling: the
  // reading is returned unchanged (exact equivalence).
  it("leaves a reading unchanged where the VB doublet's second step is below r/(1 + r) at r = 3", () => {
    const { truth } = drawTruth(124);
    expect(ASSIGN_DEFAULTS.valenceDoubletStepRatioMin).toBeCloseTo(3 / 4, 12);
    const opts = { eta: truth.eta };
    const weak = peaks124.map((p) => (p.biasV === -1.803 ? { ...p, stepA: 0.7 * 19.595e-12 } : p));
    const plain = readingWithResonances(weak, opts);
    expect(plain.regime).not.toBe("shell-filling");
    expect(withValenceSpacedS(weak, plain, opts)).toBe(plain);
  });

  // A shell-tunnelling draw of the same mix (draw 1): its reading is returned unchanged (exact
  // equivalence).
  it("leaves a shell-tunnelling draw's reading unchanged (draw 1)", () => {
    const { analysis, truth } = lowEtaDraw(1, "shell-tunneling");
    const plain = readingWithResonances(analysis.peaks, { eta: truth.eta });
    expect(plain.regime).toBe("shell-tunneling");
    expect(withValenceSpacedS(analysis.peaks, plain, { eta: truth.eta })).toBe(plain);
  }, 30_000);
});
