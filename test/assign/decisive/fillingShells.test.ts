// The tests of notes 3, 13 and 16 of rulesDecisive on peak lists at the closed-form positions of
// orthodox theory, (ε + Ec(n + ½))/η: one level's charging peaks lie one Ec/η apart.
// Where the expected values come from: the peak positions and step ratios are closed form (above),
// each verdict derived by hand from them against the limits of RULES_DECISIVE_DEFAULTS (common
// practice (no source), as documented there).
import { describe, expect, it } from "vitest";
import { offLadderSpacingReasons, oddSubgroupReasons, shortShellReasons } from "../../../lib/assign/decisive/fillingShells.ts";
import { assignPeak as peak } from "../../helpers/assignPeak.ts";
import { ec, ecV, eta, pV, reading, sV, vbTunnelingV } from "../../helpers/decisiveReading.ts";

describe("shortShellReasons(peaks, assignment, toV, edgeFwhms)", () => {
  it("flags p with 5 of its 6 charging peaks when the sixth (one Ec/η after the fifth) lies a FWHM inside the window, not when it lies half a FWHM inside", () => {
    const { peaks, assignment } = reading([...sV, ...pV.slice(0, 5)].map((v) => peak(v)));
    const inside = shortShellReasons(peaks, assignment, pV[5] + 0.3, 1);
    expect(inside.map((x) => x.code)).toEqual(["short-shell"]);
    expect(inside[0].text).toContain(`5 of the p multiplet's 6 charging peaks, although the next one (near ${(pV[4] + ecV).toFixed(3)} V`);
    expect(shortShellReasons(peaks, assignment, pV[4] + ecV + 0.5 * 0.04, 1)).toEqual([]);
  });

  it("says nothing in shell tunnelling", () => {
    const { peaks, assignment } = reading([peak(0.75), ...[1.1, 1.15, 1.2, 1.25].map((v) => peak(v))], vbTunnelingV);
    expect(assignment.regime).toBe("shell-tunneling");
    expect(shortShellReasons(peaks, assignment, 5, 1)).toEqual([]);
  });
});

describe("oddSubgroupReasons(assignment)", () => {
  it("flags p read 2+1+3 (a sub-level holds an even number of electrons), not the true 2+2+2", () => {
    // p split 2+2+2 (ε_p1 = 0.8, ε_p2 = 0.85, ε_p3 = 0.9 eV), two charging peaks per sub-level.
    const ps = [0.8, 0.8, 0.85, 0.85, 0.9, 0.9].map((e, k) => (e + ec * (k + 2 + 0.5)) / eta);
    expect(oddSubgroupReasons(reading([...sV, ...ps].map((v) => peak(v))).assignment)).toEqual([]);
    const moved = ps.map((v, k) => (k === 3 ? v + (0.4 * ec) / eta : v));
    const odd = reading([...sV, ...moved].map((v) => peak(v))).assignment;
    expect(odd.multiplets.find((m) => m.label === "p")!.subgroups).toEqual([2, 1, 3]);
    expect(oddSubgroupReasons(odd)).toEqual([{ code: "odd-subgroup", text: "shell filling with p in sub-groups 2+1+3, 2 of them odd although each sub-level of a shell holds an even number of electrons (spin): a peak that is not a charging peak of its sub-level may stand in for one that is" }]);
  });
});

describe("offLadderSpacingReasons(assignment, spacingTolerance)", () => {
  it("flags p's second charging peak 0.7 Ec/η after its first (outside 1 ± 0.175), not 0.9 Ec/η", () => {
    const withSecondAt = (f: number) => reading([...sV, ...pV.map((v, k) => (k === 1 ? pV[0] + f * ecV : v))].map((v) => peak(v))).assignment;
    const off = offLadderSpacingReasons(withSecondAt(0.7), 0.175);
    expect(off.map((x) => x.code)).toEqual(["off-ladder-spacing"]);
    expect(off[0].text).toContain(`p's charging peaks at ${pV[0].toFixed(3)} and ${(pV[0] + 0.7 * ecV).toFixed(3)} V`);
    expect(offLadderSpacingReasons(withSecondAt(0.9), 0.175)).toEqual([]);
  });
});
