// The s doublet of a shell-filling reading is placed at the lowest CB pair one VB doublet spacing
// apart that holds a peak set aside as a second-junction resonance (lib/assign/valenceSpacedS.ts).
// On draws of the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept),
// simulated by the project's model: every expected value is the simulation's truth, the tolerance
// the project's quality bar (a peak within 25 % of Ec/η).
import { describe, it, expect } from "vitest";
import { lowEtaDraw } from "../helpers/lowEtaDraw.ts";
import { expectClose } from "../helpers/expectClose.ts";
import { assignSpectrum, readingWithResonances } from "../../lib/assign/assignSpectrum.ts";
import { withValenceSpacedS } from "../../lib/assign/valenceSpacedS.ts";

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

  // Identity cases (exact equivalence with the reading given): shell tunnelling, a regime the
  // user gave, η not given.
  it("returns the reading unchanged outside a shell-filling reading of its own", () => {
    const { analysis, truth } = lowEtaDraw(1094);
    const peaks = analysis.peaks;
    const tunnel = assignSpectrum(peaks, { eta: truth.eta, regime: "shell-tunneling" });
    expect(withValenceSpacedS(peaks, tunnel, { eta: truth.eta, regime: "shell-tunneling" })).toBe(tunnel);
    const given = assignSpectrum(peaks, { eta: truth.eta, regime: "shell-filling" });
    expect(withValenceSpacedS(peaks, given, { eta: truth.eta, regime: "shell-filling" })).toBe(given);
    const noEta = assignSpectrum(peaks);
    expect(withValenceSpacedS(peaks, noEta, {})).toBe(noEta);
  }, 30_000);
});
