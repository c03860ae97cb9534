// ladderSolveWork and the work a band-steps store counts. Expected values: closed form, the
// elimination steps of state reduction W = Σ_{N≥1} Σ_{i<b_N} (b_{N−1} + i)² with b_N the number of
// occupations holding N carriers (the coefficients of Π_j (1 + x + … + x^{g_j}), computed here by
// polynomial multiplication, independently of the ladder code), W. K. Grassmann, M. I. Taksar and
// D. P. Heyman, Operations Research 33, 1107 (1985); the plateaus of an s doublet's window
// counted by hand (exact).
import { describe, it, expect } from "vitest";
import { buildLadder } from "../../../lib/model/ladder.ts";
import { ladderSolveWork } from "../../../lib/model/fit/solveWork.ts";
import { bandStepsMemo, bandStepsStore } from "../../../lib/model/fit/bandStepsMemo.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";

/** Closed form: block sizes from Π (1 + x + … + x^g), then Σ_N Σ_i (b_{N−1} + i)². */
function closedFormWork(degeneracies: number[]): number {
  let b = [1];
  for (const g of degeneracies) {
    const next = new Array(b.length + g).fill(0);
    b.forEach((c, n) => {
      for (let k = 0; k <= g; k++) next[n + k] += c;
    });
    b = next;
  }
  let w = 0;
  for (let n = 1; n < b.length; n++) for (let i = 0; i < b[n]; i++) w += (b[n - 1] + i) ** 2;
  return w;
}

describe("ladderSolveWork(ladder)", () => {
  it("is g for one level of degeneracy g (blocks of one state: closed form)", () => {
    for (const g of [1, 2, 4, 6]) expect(ladderSolveWork(buildLadder([{ energyEV: 0.5, degeneracy: g }], 0.1))).toBe(g);
  });

  it("is 63 for two doublets (blocks 1, 2, 3, 2, 1: 1 + 4 + 4 + 9 + 16 + 9 + 16 + 4, by hand)", () => {
    expect(ladderSolveWork(buildLadder([{ energyEV: 0.5, degeneracy: 2 }, { energyEV: 0.7, degeneracy: 2 }], 0.1))).toBe(63);
  });

  it("matches the closed form from the block sizes for the fit's layouts (s+p whole: 263)", () => {
    expect(closedFormWork([2, 6])).toBe(263);
    for (const layout of [[2, 6], [2, 2, 4], [2, 2, 2, 2], [2, 2, 2, 2, 2], [1, 1, 1, 1, 1, 1, 1, 1]]) {
      const ladder = buildLadder(layout.map((g, j) => ({ energyEV: 0.5 + 0.1 * j, degeneracy: g })), 0.1);
      expect(ladder.nStates).toBe(layout.reduce((m, g) => m * (g + 1), 1)); // closed form Π(g + 1)
      expect(ladderSolveWork(ladder)).toBe(closedFormWork(layout));
    }
  });
});

describe("bandStepsStore().work", () => {
  const seeds: LevelSeed[] = [{ band: "CB", label: "s", degeneracy: 2, firstPeakV: 0.8, before: 0 }];

  it("counts each zero-temperature plateau solved once, weighed by its ladder's elimination steps (exact)", () => {
    const store = bandStepsStore();
    expect(store.work).toEqual({ solves: 0, eliminationSteps: 0 });
    const current = bandStepsMemo(seeds, 0.85, 4.5, store);
    // Steps at (0.6 + 0.05)/0.85 = 0.765 V and (0.6 + 0.15)/0.85 = 0.882 V in the window; the
    // substrate crossings −0.65/0.15 and −0.75/0.15 V far below it: three plateaus, W = 2 each.
    current([0.6, 0.1, 1, -2], [0.7, 0.82, 1]);
    expect(store.work).toEqual({ solves: 3, eliminationSteps: 6 });
    // The broadening alone moved: the band's steps are stored, nothing solved.
    current([0.6, 0.1, 1, -1.9], [0.7, 0.82, 1]);
    expect(store.work).toEqual({ solves: 3, eliminationSteps: 6 });
    // The level moved without reordering a crossing: the same rate-matrix patterns, nothing solved.
    current([0.61, 0.1, 1, -2], [0.7, 0.82, 1]);
    expect(store.work).toEqual({ solves: 3, eliminationSteps: 6 });
  });
});
