// bandStepsMemo: the same closed-form plateaus as unitCurrent for an s doublet at Γsub = 1/s,
// I₁ = e·2r/(1 + 2r), I₂ = e·2r/(1 + r) (E. Bonet, M. M. Deshmukh and D. C. Ralph, Phys. Rev. B
// 65, 045317 (2002)), and, on a two-band dot, the reference of the uncached unitCurrent (the model
// sums independent electron and hole ladders, so solving each band alone gives the same current).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { bandStepsMemo, bandStepsStore, BAND_STEPS_MEMO_DEFAULTS } from "../../../lib/model/fit/bandStepsMemo.ts";
import { unitCurrent } from "../../../lib/model/fit/unitCurrent.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";

const e = 1.602176634e-19; // C, exact (SI 2019)
const seeds: LevelSeed[] = [
  { band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 },
  { band: "CB", label: "p", degeneracy: 6, firstPeakV: 1.2, before: 2 },
  { band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.3, before: 0 },
  { band: "VB", label: "v2", degeneracy: 4, firstPeakV: -1.6, before: 2 },
];

describe("bandStepsMemo(seeds, eta, temperatureK)", () => {
  it("BAND_STEPS_MEMO_DEFAULTS are locked", () => {
    expect(BAND_STEPS_MEMO_DEFAULTS).toEqual({ entriesPerBand: 256, windowMarginV: 0.05, plateausPerStructure: 20000 });
    expect(Object.isFrozen(BAND_STEPS_MEMO_DEFAULTS)).toBe(true);
  });

  it("has the closed-form plateaus of an s doublet (steps at 0.765 and 0.882 V, closed form (ε + Ec·(N + ½))/η)", () => {
    const r = 10;
    const current = bandStepsMemo([seeds[0]], 0.85, 4.5);
    const i = current([0.6, 0.1, Math.log10(r), Math.log10(0.005)], [0.82, 1.2]);
    expectClose(Array.from(i), [(e * 2 * r) / (1 + 2 * r), (e * 2 * r) / (1 + r)], { rtol: 1e-6 });
  });

  it("equals unitCurrent on a two-band dot at every finite-difference neighbour, served from the store or not", () => {
    const bias = Array.from({ length: 81 }, (_, i) => -2.4 + 0.06 * i);
    const p0 = [0.6, 0.9, 1.0, 1.25, 0.1, 0.3, Math.log10(0.01)];
    const current = bandStepsMemo(seeds, 0.85, 4.5);
    // Each parameter moved in turn, twice (the second pass finds every band solution stored).
    for (let pass = 0; pass < 2; pass++) {
      for (let j = 0; j < p0.length; j++) {
        const p = p0.map((v, k) => (k === j ? v + 1e-4 : v));
        const scale = Math.max(...Array.from(unitCurrent(p, seeds, 0.85, 4.5, bias), Math.abs));
        expectClose(Array.from(current(p, bias)), Array.from(unitCurrent(p, seeds, 0.85, 4.5, bias)), { atol: 1e-12 * scale });
      }
    }
  });

  it("reuses a band's key only while all its numbers stay: bit for bit the current of a fresh memo after each single change (a level, Ec, Γtip/Γsub)", () => {
    const bias = Array.from({ length: 81 }, (_, i) => -2.4 + 0.06 * i);
    const p0 = [0.6, 0.9, 1.0, 1.25, 0.1, 0.3, Math.log10(0.01)];
    const moved = (j: number, by: number) => p0.map((v, k) => (k === j ? v + by : v));
    // VB level alone (the CB key is reused), back, CB level, Ec, Γtip/Γsub, and back again.
    const sequence = [p0, moved(2, 0.01), p0, moved(0, 0.01), moved(4, 0.002), moved(5, 0.05), p0];
    const current = bandStepsMemo(seeds, 0.85, 4.5);
    for (const p of sequence) expect(Array.from(current(p, bias))).toEqual(Array.from(bandStepsMemo(seeds, 0.85, 4.5)(p, bias)));
  });

  it("shares one store between the memos of two groupings with the same CB levels: the second solves no CB ladder and still equals unitCurrent", () => {
    const bias = Array.from({ length: 61 }, (_, i) => 0.5 + 0.025 * i);
    const store = bandStepsStore();
    const cbOnly = seeds.slice(0, 2);
    const p = [0.6, 0.9, 0.1, 0.3, Math.log10(0.01)];
    bandStepsMemo(cbOnly, 0.85, 4.5, store)(p, bias);
    const solved = store.bands.cb.size;
    // The same two CB levels, labelled as another grouping would label them.
    const relabelled = cbOnly.map((x, j) => ({ ...x, label: `level ${j}` }));
    const other = bandStepsMemo(relabelled, 0.85, 4.5, store)(p, bias);
    expect(store.bands.cb.size).toBe(solved);
    const reference = unitCurrent(p, relabelled, 0.85, 4.5, bias);
    expectClose(Array.from(other), Array.from(reference), { atol: 1e-12 * Math.max(...Array.from(reference, Math.abs)) });
  });
});
