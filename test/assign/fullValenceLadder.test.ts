// A reading that is not shell filling, read in shell filling from the VB-spaced pair where the
// held reading's CB is s and p's six charging peaks on one ladder of the VB doublet's spacing
// (lib/assign/valenceSpacedS.ts, note 8). The peaks are those the pipeline found for draw 1006
// of the accuracy benchmark's low-η mix (η 0.55–0.65, second-junction resonances kept; position
// V, step pA, FWHM mV) before the rule; every expected value is the simulation's truth, the
// tolerance the project's quality bar (a peak within 25 % of Ec/η). Physics relation: in shell
// filling the tip junction sets both bands' ladders, so the VB doublet and every CB charging
// peak are one Ec/η apart, and the s doublet's second step is r/(1 + r) ≥ 0.6 of its first
// (orthodox theory, r = Γtip/Γsub ≥ 1.5).
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { LOW_ETA_RANGES } from "../helpers/lowEtaDraw.ts";
import { readingWithResonances } from "../../lib/assign/assignSpectrum.ts";
import { withValenceSpacedS, VALENCE_SPACED_S_DEFAULTS } from "../../lib/assign/valenceSpacedS.ts";
import { ASSIGN_DEFAULTS } from "../../lib/assign/assignDefaults.ts";
import { syntheticSpectrum } from "../../lib/model/syntheticSpectrum.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const found1006 =
  "-3.854 35.675 111, -3.620 17.172 61, -3.305 21.397 85, -3.003 22.121 118, -2.703 22.010 117, -2.067 16.847 80, -1.763 18.169 103, 2.125 25.685 128, 2.431 23.210 105, 2.725 11.867 46, 3.043 22.585 50, 3.196 27.908 116, 3.343 21.447 68, 3.647 18.629 93, 3.787 32.753 102, 3.939 19.540 89, 4.317 37.420 169, 4.555 13.517 78, 4.896 19.040 62";
const toPeaks = (text: string): Peak[] =>
  text.split(", ").map((t, index) => {
    const [biasV, stepPA, fwhmMV] = t.split(" ").map(Number);
    return { biasV, biasUncertaintyV: 0.002, index, heightS: 1e-9, prominenceS: 1e-9, fwhmV: fwhmMV / 1000, stepA: stepPA * 1e-12, snr: 20, stepSignificance: 30 };
  });
const peaks1006 = toPeaks(found1006);
const cbOf = (a: { multiplets: { band: string; label: string; peaksV: number[] }[] }, label: string) => a.multiplets.find((m) => m.band === "CB" && m.label === label);

describe("withValenceSpacedS note 8: s and p's six charging peaks on the VB doublet's ladder", () => {
  const { truth } = syntheticSpectrum(1006, "shell-filling", LOW_ETA_RANGES);
  const tolV = (0.25 * truth.chargingEnergyEV) / truth.eta;
  const opts = { eta: truth.eta };

  it("reads shell filling with s and p at the truth where the rules read none (draw 1006's peaks)", () => {
    const plain = readingWithResonances(peaks1006, opts);
    expect(plain.regime).not.toBe("shell-filling");
    const out = withValenceSpacedS(peaks1006, plain, opts);
    expect(out.regime).toBe("shell-filling");
    expectClose(cbOf(out, "s")!.peaksV, truth.sPeaksV, { atol: tolV, what: "s, the simulation's truth" });
    expectClose(cbOf(out, "p")!.peaksV, truth.pPeaksV, { atol: tolV, what: "p, the simulation's truth" });
    // Ec (bias-referred) is the VB doublet's spacing within the rule's tolerance, and near the truth's Ec/η.
    const vbSpacingV = -1.763 - -2.067;
    expect(Math.abs(out.quantities.chargingEnergyV! - vbSpacingV)).toBeLessThanOrEqual(VALENCE_SPACED_S_DEFAULTS.fullLadderSpacingTolerance * vbSpacingV);
    expectClose([out.quantities.chargingEnergyV!], [truth.chargingEnergyEV / truth.eta], { rtol: 0.1, what: "Ec/η, the simulation's truth" });
    expect(out.evidence.reasons[0]).toContain("six charging peaks on one ladder");
  });

  // The s pair's second step scaled to 0.5 × its first, below r/(1 + r) at r = 1.5 (closed form:
  // 0.6, ASSIGN_DEFAULTS.fillingStepRatio[0]): a crossover doublet, not shell filling's; the
  // reading is returned unchanged (exact equivalence).
  it("leaves the reading unchanged where the s pair's second step is below r/(1 + r) at r = 1.5", () => {
    expect(ASSIGN_DEFAULTS.fillingStepRatio[0]).toBeCloseTo(0.6, 12);
    const weak = peaks1006.map((p) => (p.biasV === 2.431 ? { ...p, stepA: 0.5 * 25.685e-12 } : p));
    const plain = readingWithResonances(weak, opts);
    expect(plain.regime).not.toBe("shell-filling");
    expect(withValenceSpacedS(weak, plain, opts)).toBe(plain);
  });

  // The VB doublet stretched to 1.25 × its spacing (its edge peak moved towards 0 V): the CB ladder,
  // one spacing of 0.30 V, no longer matches it within 10 %, and the reading is returned unchanged.
  it("leaves the reading unchanged where the CB ladder's spacing is not the VB doublet's", () => {
    const stretched = peaks1006.map((p) => (p.biasV === -1.763 ? { ...p, biasV: -2.067 + 1.25 * (2.067 - 1.763) } : p));
    const plain = readingWithResonances(stretched, opts);
    expect(plain.regime).not.toBe("shell-filling");
    expect(withValenceSpacedS(stretched, plain, opts)).toBe(plain);
  });
});
