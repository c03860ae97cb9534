// replacesCrowded, and fillingShells through it, on peak positions from the closed form
// (|ε| + Ec(n + ½))/η, n counting the carriers already in the CB (orthodox theory, constant-interaction
// model), with ε_s = 0.5, ε_p = 0.8 eV, Ec = 0.1 eV, η = 0.8: consecutive charging peaks of one level
// lie Ec/η = 0.125 V apart. A peak off the ladder is placed by hand a fraction of Ec/η before or
// after a charging peak.
import { describe, it, expect } from "vitest";
import { replacesCrowded } from "../../lib/assign/crowdedCharging.ts";
import { fillingShells } from "../../lib/assign/shells.ts";
import type { BandPeak } from "../../lib/assign/bandPeaks.ts";
import type { Peak } from "../../lib/peaks/findPeaks.ts";

const eta = 0.8, ec = 0.1, ecV = ec / eta;
const V = (e: number, n: number) => (e + ec * (n + 0.5)) / eta;
const at = (x: number, index: number, stepA = 1e-11): BandPeak => ({ x, index, peak: { biasV: x, stepA, biasUncertaintyV: 0.001 } as Peak });
const q = (x: number, stepA = 1e-11) => ({ x, peak: { stepA } });

describe("replacesCrowded(beforeV, lastV, crowdingV, ecV)", () => {
  it("takes the later peak where it lies one Ec beyond the peak before and the earlier lies 0.7 Ec beyond (closed form)", () => {
    expect(replacesCrowded(V(0.8, 2), q(V(0.8, 2) + 0.7 * ecV), q(V(0.8, 3)), ecV)).toBe(true);
  });

  it("keeps the earlier peak where the later steps less than fillingStepRatio[0] = 0.6 × it (the earlier may hold a level and a resonance)", () => {
    // 0.55 and 0.65 × the earlier's step about fillingStepRatio[0] = r/(1 + r) at the filling limit r = 1.5 (closed form).
    expect(replacesCrowded(V(0.8, 2), q(V(0.8, 2) + 0.7 * ecV, 2e-11), q(V(0.8, 3), 1.1e-11), ecV)).toBe(false);
    expect(replacesCrowded(V(0.8, 2), q(V(0.8, 2) + 0.7 * ecV, 2e-11), q(V(0.8, 3), 1.3e-11), ecV)).toBe(true);
  });

  it("keeps the earlier peak where it lies one Ec beyond and the later 1.4 Ec (closed form)", () => {
    expect(replacesCrowded(V(0.8, 2), q(V(0.8, 3)), q(V(0.8, 3) + 0.4 * ecV), ecV)).toBe(false);
  });

  it("keeps the reading order on an exact tie (0.8 and 1.2 Ec beyond: both 0.2 Ec off; closed form)", () => {
    expect(replacesCrowded(1, q(1 + 0.8 * ecV), q(1 + 1.2 * ecV), ecV)).toBe(false);
  });
});

describe("fillingShells(cb) with a peak off the ladder just before a charging peak", () => {
  it("reads p's six charging peaks and sets aside the peak 0.7 Ec after p's first (a resonance read first)", () => {
    // p's charging peaks n = 2 … 7; a resonance 0.7 Ec/η after p's first, 0.3 Ec/η before its second.
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 2), V(0.8, 2) + 0.7 * ecV, ...[3, 4, 5, 6, 7].map((n) => V(0.8, n))];
    const r = fillingShells(xs.map((x, i) => at(x, i)));
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([2, 4, 5, 6, 7, 8]);
    expect(r.offLadder.map((p) => p.index)).toEqual([3]);
  });

  it("still sets aside a peak 0.3 Ec after a charging peak (the charging peak lies one Ec on)", () => {
    const xs = [V(0.5, 0), V(0.5, 1), V(0.8, 2), V(0.8, 3), V(0.8, 3) + 0.3 * ecV, ...[4, 5, 6, 7].map((n) => V(0.8, n))];
    const r = fillingShells(xs.map((x, i) => at(x, i)));
    expect(r.shells[1].flat().map((p) => p.index)).toEqual([2, 3, 5, 6, 7, 8]);
    expect(r.offLadder.map((p) => p.index)).toEqual([4]);
  });
});
