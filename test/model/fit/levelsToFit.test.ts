// levelsToFit and startingValues on a simulated shell-filling curve: the levels, degeneracies and
// energies the fit starts from are compared with the scenario the curve was simulated from (its
// inputs: s doublet at 0.6 eV, p sextet at 0.9 eV, VB doublet at −1.2 eV, Ec 0.1 eV, η 0.85).
// spinPairShares: spin pairs shared by largest remainder (closed form: U·s_j/Σs with U = g/2).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { distinctReadings, levelsToFit, spinPairShares } from "../../../lib/model/fit/levelsToFit.ts";
import { startingValues } from "../../../lib/model/fit/startingValues.ts";
import { analysis, eta } from "../../helpers/fitDemo.ts";

describe("levelsToFit(analysis)", () => {
  it("gives one level per shell with the simulated degeneracies and the carriers before it (s 2/0, p 6/2, v1 2/0)", () => {
    expect(analysis.assignment.regime).toBe("shell-filling");
    expect(levelsToFit(analysis).map((s) => [s.band, s.label, s.degeneracy, s.before])).toEqual([
      ["CB", "s", 2, 0],
      ["CB", "p", 6, 2],
      ["VB", "v1", 2, 0],
    ]);
  });
});

describe("startingValues(analysis, seeds, eta, chargingEnergyGuessEV)", () => {
  const seeds = levelsToFit(analysis);
  const start = startingValues(analysis, seeds, eta, 0.1);

  it("starts |ε| within 10 meV of the simulated 0.6, 0.9 and 1.2 eV and Ec within 10 % of the simulated 0.1 eV", () => {
    expectClose(start.initialValues.slice(0, 3), [0.6, 0.9, 1.2], { atol: 0.01, what: "start vs the simulated levels" });
    expectClose(start.initialValues[3], 0.1, { rtol: 0.1, what: "Ec" });
  });

  it("bounds every parameter around its start, and keeps same-band levels from crossing", () => {
    start.initialValues.forEach((v, k) => {
      expect(start.minValues[k]).toBeLessThanOrEqual(v);
      expect(start.maxValues[k]).toBeGreaterThanOrEqual(v);
    });
    // s and p (CB): the upper bound of s stays below the lower bound of p.
    expect(start.maxValues[0]).toBeLessThan(start.minValues[1]);
  });
});

describe("spinPairShares(degeneracy, steps)", () => {
  it("shares a p shell's three spin pairs by the steps: 2+4, 2+2+2, never 3+3 (closed form: 3·s_j/Σs, largest remainder)", () => {
    expect(spinPairShares(6, [1, 1.2])).toEqual([2, 4]); // shares 1.36, 1.64
    expect(spinPairShares(6, [2, 1])).toEqual([4, 2]); // shares 2, 1
    expect(spinPairShares(6, [1, 1])).toEqual([2, 4]); // a tie goes to the higher sub-level
    expect(spinPairShares(6, [1, 1, 1])).toEqual([2, 2, 2]);
    expect(spinPairShares(6, [0.1, 0.1, 5])).toEqual([2, 2, 2]); // one pair each at least
    expect(spinPairShares(2, [3])).toEqual([2]);
  });
  it("gives null for an odd degeneracy or more peaks than pairs", () => {
    expect(spinPairShares(6, [1, 1, 1, 1])).toBeNull();
    expect(spinPairShares(3, [1])).toBeNull();
  });
});

describe("distinctReadings(readings)", () => {
  // By the definition: readings with the same seedKey (band, degeneracy, first peak to 10 µV, carriers before) are one.
  const v = (firstPeakV: number, before = 0) => ({ band: "VB" as const, label: "v1", degeneracy: 2, firstPeakV, before });
  it("keeps each reading where it first comes", () => {
    const a = [v(-1.4)];
    const b = [v(-1.4, 1)];
    expect(distinctReadings([a, [], [v(-1.400001)], b, []])).toEqual([a, [], b]);
  });
});
