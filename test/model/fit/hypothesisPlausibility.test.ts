// Plausibility checks of a fitted grouping. Expected values are closed forms of the checks'
// definitions on hand-made level sets (the limits are common practice, no source, and locked).
import { describe, it, expect } from "vitest";
import { hypothesisPlausibility, PLAUSIBILITY_DEFAULTS } from "../../../lib/model/fit/hypothesisPlausibility.ts";

const level = (band: "CB" | "VB", label: string, degeneracy: number, energyEV: number) => ({ band, label, degeneracy, energyEV });
const dot = [level("CB", "s", 2, 0.6), level("CB", "p", 6, 0.9), level("VB", "v1", 2, -1.2)];

describe("hypothesisPlausibility(input)", () => {
  it("passes Γtip/Γsub alone on a bound (deep in a regime), not together with Ec on one (a collapse)", () => {
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.1, atBound: ["Γtip/Γsub"] })).toEqual([]);
    // On the CB side alone the bound still counts: only a whole-curve fit bears a regime's limit out.
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.1, atBound: ["Γtip/Γsub"], cbSideOnly: true })).toEqual(["Γtip/Γsub ended on a bound of the fit"]);
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.1, atBound: ["Ec"] })).toEqual(["Ec ended on a bound of the fit"]);
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 1e-4, atBound: ["Ec", "Γtip/Γsub"] })).toEqual(["Ec ended on a bound of the fit", "Γtip/Γsub ended on a bound of the fit"]);
  });
  it("passes an s doublet, a p sextet and a VB level with Ec well below half the 1.8 eV gap", () => {
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.1, atBound: [] })).toEqual([]);
  });

  it("rejects Ec above half the single-particle gap (0.5 × (0.6 − (−1.2)) = 0.9 eV)", () => {
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.89, atBound: [] })).toEqual([]);
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.91, atBound: [] }).join(" ")).toMatch(/Ec 910 meV is more than 0.5 × the single-particle gap 1800 meV/);
  });

  it("rejects levels out of the order seeded between shells, and overlapping bands", () => {
    const swapped = [level("CB", "s", 2, 0.6), level("CB", "p", 6, 0.55)];
    expect(hypothesisPlausibility({ levels: swapped, chargingEnergyEV: 0.1, atBound: [] }).join(" ")).toMatch(/p lies below s/);
    const subBelowS = [level("CB", "s", 2, 0.6), level("CB", "p1", 2, 0.9), level("CB", "p2", 4, 0.58)];
    expect(hypothesisPlausibility({ levels: subBelowS, chargingEnergyEV: 0.1, atBound: [] }).join(" ")).toMatch(/p2 lies below s/);
    const overlap = [level("CB", "s", 2, 0.6), level("VB", "v1", 2, 0.7)];
    expect(hypothesisPlausibility({ levels: overlap, chargingEnergyEV: 0.1, atBound: [] }).join(" ")).toMatch(/overlap/);
  });

  it("accepts VB levels in any order (no VB degeneracy is assumed: crossed levels are the same model)", () => {
    const crossed = [...dot, level("VB", "v2", 4, -1.1)];
    expect(hypothesisPlausibility({ levels: crossed, chargingEnergyEV: 0.1, atBound: [] })).toEqual([]);
  });

  it("accepts the sub-levels of a split shell in either order (p2 below p1, both above s)", () => {
    const swapped = [level("CB", "s", 2, 0.6), level("CB", "p1", 2, 0.95), level("CB", "p2", 4, 0.9)];
    expect(hypothesisPlausibility({ levels: swapped, chargingEnergyEV: 0.1, atBound: [] })).toEqual([]);
  });

  it("rejects a shell holding more than its capacity (p: 2 + 2 + 4 = 8 > 6)", () => {
    const over = [level("CB", "s", 2, 0.6), level("CB", "p1", 2, 0.9), level("CB", "p2", 2, 0.95), level("CB", "p3", 4, 1.0)];
    expect(hypothesisPlausibility({ levels: over, chargingEnergyEV: 0.1, atBound: [] }).join(" ")).toMatch(/shell p holds 8 electrons, more than its 6/);
  });

  it("rejects a split shell spanning more than 1.5 × its distance from the shell below (0.5 eV > 1.5 × 0.3 eV)", () => {
    // Harmonic confinement ħω = 0.3, 0.4, 0.8 eV above s (closed form: span/distance = ω_max/ω_min − 1 = 5/3 > 1.5).
    const wide = [level("CB", "s", 2, 0.6), level("CB", "p1", 2, 0.9), level("CB", "p2", 2, 1.0), level("CB", "p3", 2, 1.4)];
    expect(hypothesisPlausibility({ levels: wide, chargingEnergyEV: 0.1, atBound: [] }).join(" ")).toMatch(/spans 500 meV, more than 1.5 × its distance 300 meV/);
    // ħω = 0.3, 0.45, 0.65 eV: ratio 0.35/0.3 = ω_max/ω_min − 1 ≈ 1.17 (confinement 2.17 : 1) is accepted.
    const anisotropic = [level("CB", "s", 2, 0.6), level("CB", "p1", 2, 0.9), level("CB", "p2", 2, 1.05), level("CB", "p3", 2, 1.25)];
    expect(hypothesisPlausibility({ levels: anisotropic, chargingEnergyEV: 0.1, atBound: [] })).toEqual([]);
    // The same span read as single levels (one electron each, not orbitals split by shape) is held to the distance itself.
    const singles = [level("CB", "s", 2, 0.6), level("CB", "p1", 1, 0.9), level("CB", "p2", 1, 1.05), level("CB", "p3", 1, 1.25)];
    expect(hypothesisPlausibility({ levels: singles, chargingEnergyEV: 0.1, atBound: [] }).join(" ")).toMatch(/spans 350 meV, more than its distance 300 meV/);
    const narrow = [level("CB", "s", 2, 0.6), level("CB", "p1", 2, 0.9), level("CB", "p2", 4, 0.95)];
    expect(hypothesisPlausibility({ levels: narrow, chargingEnergyEV: 0.1, atBound: [] })).toEqual([]);
  });

  it("rejects a key parameter on a bound", () => {
    expect(hypothesisPlausibility({ levels: dot, chargingEnergyEV: 0.1, atBound: ["Ec"] })).toEqual(["Ec ended on a bound of the fit"]);
  });

  it("PLAUSIBILITY_DEFAULTS are locked", () => {
    expect(Object.isFrozen(PLAUSIBILITY_DEFAULTS)).toBe(true);
    expect(PLAUSIBILITY_DEFAULTS).toEqual({ maxChargingFractionOfGap: 0.5, shellCapacity: { s: 2, p: 6, d: 10 }, maxSplitSpanOfDistance: 1.5 });
  });
});
