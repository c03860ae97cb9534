// The tests of notes 14 and 7 of rulesDecisive on shell-tunnelling peak lists at the closed-form
// positions of orthodox theory, (ε + Ec(n + ½))/η; a level of g states after s steps
// g/(2(1 + (2 + g)r)) × s (closed form of the orthodox master equation, as in shells.ts).
import { describe, expect, it } from "vitest";
import { dNearSplitPReasons, levelsOverPairsReasons } from "../../../lib/assign/decisive/tunnelingLevels.ts";
import { assignPeak as peak } from "../../helpers/assignPeak.ts";
import { ec, eta, reading, sV, vbTunnelingV } from "../../helpers/decisiveReading.ts";

describe("dNearSplitPReasons(peaks, assignment)", () => {
  it("flags a d 0.6 × the s→p distance after a p stepping 0.5 × s (a 2-state sub-level at r = 1/4), not after a p stepping 1.5 × s", () => {
    const run = (pStep: number, dStep: number) =>
      reading([peak(sV[0]), peak(sV[1], 0.2e-11), peak((0.9 + ec / 2) / eta, pStep * 1e-11), peak((0.9 + 0.24 + ec / 2) / eta, dStep * 1e-11)]);
    const split = run(0.5, 2);
    expect(split.assignment.multiplets.filter((m) => m.band === "CB").map((m) => m.label)).toEqual(["s", "p", "d"]);
    expect(dNearSplitPReasons(split.peaks, split.assignment)).toEqual([{
      code: "d-near-split-p",
      text: "shell tunnelling with a d level 300 mV after p's last, 0.60 × the s→p distance (< 0.75), while p's first level steps 0.50 × s (≤ 1.3; a 2-state sub-level steps at most 1 ×, the whole p more deep in the regime): d may be p's other sub-level",
    }]);
    const whole = run(1.5, 1.25);
    expect(whole.assignment.multiplets.filter((m) => m.band === "CB").map((m) => m.label)).toEqual(["s", "p", "d"]);
    expect(dNearSplitPReasons(whole.peaks, whole.assignment)).toEqual([]);
  });
});

describe("levelsOverPairsReasons(assignment)", () => {
  it("flags p read as 4 levels (6 states make 3 spin pairs), not as 3", () => {
    const four = reading([peak(0.75), ...[1.1, 1.15, 1.2, 1.25].map((v) => peak(v))]).assignment;
    expect(four.regime).toBe("shell-tunneling");
    expect(levelsOverPairsReasons(four)).toEqual([{ code: "levels-over-pairs", text: "shell tunnelling with 4 levels in p, more than its 6 states hold in spin pairs (3): some may be charging peaks" }]);
    const three = reading([peak(0.75), ...[1.1, 1.15, 1.2].map((v) => peak(v))], vbTunnelingV).assignment;
    expect(three.multiplets.find((m) => m.label === "p")!.found).toBe(3);
    expect(levelsOverPairsReasons(three)).toEqual([]);
  });
});
