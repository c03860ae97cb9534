// The tests of notes 2 and 11 of rulesDecisive on peak lists at the closed-form positions of
// orthodox theory, (ε + Ec(n + ½))/η, and the closed-form step ratio r/(1 + r) of the s doublet
// (C. W. J. Beenakker, Phys. Rev. B 44, 1646 (1991); E. Bonet, M. M. Deshmukh and D. C. Ralph,
// Phys. Rev. B 65, 045317 (2002); see secondToFirstStepRatio).
// Where the expected values come from: the peak positions and step ratios are closed form (above),
// each verdict derived by hand from them against the limits of RULES_DECISIVE_DEFAULTS (common
// practice (no source), as documented there).
import { describe, expect, it } from "vitest";
import { stepRatioBandReasons, twoCbPeakReasons } from "../../../lib/assign/decisive/regimeEvidence.ts";
import { secondToFirstStepRatio } from "../../../lib/model/regimeLimits.ts";
import { assignPeak as peak } from "../../helpers/assignPeak.ts";
import { pV, reading, sV } from "../../helpers/decisiveReading.ts";

describe("stepRatioBandReasons(assignment, margin)", () => {
  it("flags an s doublet stepping r/(1 + r) = 2/3 at r = 2 (within 0.3–0.6 ± 0.1), not 0.8 at r = 4, nor 2/3 with no margin", () => {
    const at = (r: number) => reading([peak(sV[0]), peak(sV[1], secondToFirstStepRatio(r) * 1e-11), ...pV.map((v) => peak(v))]).assignment;
    const near = stepRatioBandReasons(at(2), 0.1);
    expect(near.map((x) => x.code)).toEqual(["step-ratio-band"]);
    expect(near[0].text).toContain("the second CB step is 0.67 × the first, within the crossover band 0.20–0.70");
    expect(stepRatioBandReasons(at(4), 0.1)).toEqual([]);
    expect(stepRatioBandReasons(at(2), 0)).toEqual([]);
  });
});

describe("twoCbPeakReasons(assignment)", () => {
  it("flags a regime read from the s doublet alone, and not one read from s and p", () => {
    const two = twoCbPeakReasons(reading(sV.map((v) => peak(v))).assignment);
    expect(two).toEqual([{ code: "two-cb-peaks", text: "shell filling read from two CB peaks alone (no third follows), the VB deciding between an s doublet and the s level with a p sub-level: the CB side holds too few peaks for the rules to tell" }]);
    expect(twoCbPeakReasons(reading([...sV, ...pV].map((v) => peak(v))).assignment)).toEqual([]);
  });
});
