// resonantWindowReasons (note 27 of rulesDecisive). The second-junction resonance of a tip-junction
// peak at bias V lies at −η·V/(1 − η) (source: closed form of the voltage division of a double-barrier
// junction, orthodox theory; D. V. Averin and K. K. Likharev, in Mesoscopic Phenomena in Solids,
// Elsevier 1991). Each position below is derived from it by hand.
import { describe, expect, it } from "vitest";
import { resonantWindowReasons, type ResonantWindowAssignment } from "../../../lib/assign/decisive/resonantWindow.ts";
import { expectError } from "../../helpers/errors.ts";

/** A shell-filling reading of the given peaks (all in one multiplet), η given, nothing set aside. */
const reading = (n: number, eta: number, over: Partial<ResonantWindowAssignment> = {}): ResonantWindowAssignment => ({
  regime: "shell-filling",
  multiplets: [{ peakIndices: [...Array(n).keys()] }],
  evidence: { secondJunction: [] },
  energies: { eta, etaGiven: true },
  ...over,
});
const at = (...biasV: number[]) => biasV.map((v) => ({ biasV: v }));

describe("resonantWindowReasons(peaks, assignment, biasRangeV)", () => {
  it("a multiplet peak whose resonance falls inside the window sends the reading to the fit", () => {
    // η = 0.6: the peak at 0.9 V resonates at −0.6·0.9/0.4 = −1.35 V, inside [−2, 2].
    const r = resonantWindowReasons(at(0.9), reading(1, 0.6), [-2, 2]);
    expect(r.map((x) => x.code)).toEqual(["resonant-window"]);
    expect(r[0].text).toContain("1 multiplet peak's resonance");
    expect(r[0].text).toContain("η = 0.60");
  });

  it("resonances outside the window (η = 0.8: −4·V) leave the reading alone", () => {
    // η = 0.8: 0.9 V resonates at −3.6 V and −0.6 V at +2.4 V, both outside [−2, 2.2].
    expect(resonantWindowReasons(at(-0.6, 0.9), reading(2, 0.8), [-2, 2.2])).toEqual([]);
    // … but a window reaching −3.6 V holds the first.
    expect(resonantWindowReasons(at(-0.6, 0.9), reading(2, 0.8), [-3.7, 2.2])).toHaveLength(1);
  });

  it("η = 1/2 puts the resonance at −V: the mirror image of the peak lies in a symmetric window", () => {
    expect(resonantWindowReasons(at(1.2), reading(1, 0.5), [-1.25, 1.25])).toHaveLength(1);
    expect(resonantWindowReasons(at(1.2), reading(1, 0.5), [-1.15, 1.25])).toEqual([]);
  });

  it("a peak set aside as a resonance counts even where no multiplet peak's resonance lies inside", () => {
    const r = resonantWindowReasons(at(0.9), reading(1, 0.8, { evidence: { secondJunction: [{}] } }), [-2, 2.2]);
    expect(r).toHaveLength(1);
    expect(r[0].text).toContain("1 peak set aside as second-junction resonances");
  });

  it("shell tunnelling, a default η or η = 1 give no reason", () => {
    expect(resonantWindowReasons(at(0.9), reading(1, 0.6, { regime: "shell-tunneling" }), [-2, 2])).toEqual([]);
    expect(resonantWindowReasons(at(0.9), reading(1, 0.6, { energies: { eta: 0.6, etaGiven: false } }), [-2, 2])).toEqual([]);
    expect(resonantWindowReasons(at(0.9), reading(1, 1), [-2, 2])).toEqual([]);
  });

  it("a window that is not two ascending finite numbers is an error", () => {
    expectError(() => resonantWindowReasons(at(0.9), reading(1, 0.6), [2, -2]), "options/out-of-range");
    expectError(() => resonantWindowReasons(at(0.9), reading(1, 0.6), [Number.NaN, 2]), "options/not-finite");
  });
});
