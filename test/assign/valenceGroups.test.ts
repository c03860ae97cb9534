// valenceGroups: VB peaks in charging multiplets (shell filling) or one group per level.
// Closed form: a VB level of degeneracy g charges at |V| = (|ε| + Ec(n + ½))/η, n = 0 … g − 1, so
// peaks of one level are Ec/η apart; here Ec/η = 0.125 V (Ec = 0.1 eV, η = 0.8).
import { describe, it, expect } from "vitest";
import { valenceEdgePartner, valenceGroups } from "../../lib/assign/valenceGroups.ts";
import { ASSIGN_DEFAULTS } from "../../lib/assign/assignSpectrum.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const ecV = 0.125;
const at = (x: number, index: number): BandPeak => ({ x, index, peak: { biasV: -x } as Peak });
// ε_v1 = −0.6 eV (g 2), ε_v2 = −0.8 eV (g 4).
const ladder = [0.65, 0.75, 1.05, 1.15, 1.25, 1.35].map((e, i) => at(e / 0.8, i));

describe("valenceGroups(vb, chargingEnergyV, regime)", () => {
  it("shell filling: peaks Ec apart form one group; the jump to the next level starts another", () => {
    expect(valenceGroups(ladder, ecV, "shell-filling").map((g) => g.map((p) => p.index))).toEqual([[0, 1], [2, 3, 4, 5]]);
  });

  it("shell filling: a spacing just inside (1 ± tolerance)·Ec joins, just outside does not", () => {
    const tol = ASSIGN_DEFAULTS.valenceChargingTolerance;
    const inside = [at(1, 0), at(1 + (1 + 0.99 * tol) * ecV, 1)];
    const outside = [at(1, 0), at(1 + (1 + 1.01 * tol) * ecV, 1)];
    expect(valenceGroups(inside, ecV, "shell-filling")).toHaveLength(1);
    expect(valenceGroups(outside, ecV, "shell-filling")).toHaveLength(2);
  });

  it("without Ec or outside shell filling, every peak is its own group", () => {
    expect(valenceGroups(ladder, null, "shell-filling")).toHaveLength(6);
    expect(valenceGroups(ladder, ecV, "shell-tunneling")).toHaveLength(6);
  });
});

// valenceEdgePartner: spin puts two carriers on every level, so the gap-edge VB level shows two
// charging peaks Ec/η apart (the closed form above); one of them set aside as a resonance is found
// again where it steps like a level.
describe("valenceEdgePartner(groups, setAside, chargingEnergyV)", () => {
  const withStep = (p: BandPeak, stepA: number): BandPeak => ({ ...p, peak: { ...p.peak, stepA } as Peak });
  const v1 = withStep(ladder[1], 1e-12);
  const rest = ladder.slice(2).map((p) => withStep(p, 1e-12));
  it("takes the set-aside peak one Ec nearer the gap than a gap-edge group of one peak", () => {
    const out = valenceEdgePartner([[v1], rest], [withStep(ladder[0], 2e-12)], ecV);
    expect(out?.index).toBe(0);
  });
  it("takes none for a gap-edge group of two, one stepping under 0.6 × the level's, or one off the ladder by more than the tolerance", () => {
    const partner = withStep(ladder[0], 1e-12);
    expect(valenceEdgePartner([[partner, v1], rest], [withStep(at(0.65 / 0.8 - ecV, 9), 1e-12)], ecV)).toBeNull();
    expect(valenceEdgePartner([[v1], rest], [withStep(ladder[0], 0.5e-12)], ecV)).toBeNull();
    const off = v1.x - ecV * (1 - ASSIGN_DEFAULTS.valenceChargingTolerance) + 0.01;
    expect(valenceEdgePartner([[v1], rest], [withStep(at(off, 9), 1e-12)], ecV)).toBeNull();
  });
});
