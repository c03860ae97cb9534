// currentSteps over a window of bias, with a store of zero-temperature plateaus, and fastCurrent on
// ascending biases. Expected values: closed forms of the orthodox master equation for an s doublet
// (Beenakker, Phys. Rev. B 44, 1646 (1991); plateaus e·Γs·2r/(1 + 2r) and e·Γs·2r/(1 + r) for
// r = Γtip/Γsub, as in the doc example of ladderCurrent: 2.913e-11 A at r = 10), the step
// positions (ε + Ec·(N + ½))/η (closed form), and, where the window must change nothing, the same
// function without the window (itself checked against closed forms in test/model/ladder.test.ts).
import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose.ts";
import { dotModel } from "../helpers/dotModel.ts";
import { bandLadders, currentSteps, fastCurrent } from "../../lib/model/bandCurrent.ts";
import { ladderWorkspace } from "../../lib/model/ladder.ts";
import { ELEMENTARY_CHARGE_C as E } from "../../lib/util/constants.ts";

const doublet = dotModel({
  cb: [{ energyEV: 0.5, degeneracy: 2 }],
  vb: [{ energyEV: -1.1, degeneracy: 2 }, { energyEV: -1.27, degeneracy: 4 }],
});

describe("currentSteps(model, ladders, { fromV, toV })", () => {
  it("keeps the steps inside the window with the closed-form plateaus of an s doublet", () => {
    const cbOnly = { ...doublet, vb: [] };
    const { baseA, steps } = currentSteps(cbOnly, bandLadders(cbOnly), { fromV: 0, toV: 2 });
    const r = 10;
    const i1 = (E * 1e8 * 2 * r) / (1 + 2 * r);
    const i2 = (E * 1e8 * 2 * r) / (1 + r);
    expect(baseA).toBe(0); // Coulomb blockade below the first step (closed form)
    expectClose(steps.map((s) => s.biasV), [0.55 / 0.8, 0.65 / 0.8], { rtol: 1e-12, what: "(ε + Ec·(N + ½))/η" });
    expectClose(steps.map((s) => s.heightA), [i1, i2 - i1], { rtol: 1e-9, what: "closed-form plateaus" });
  });

  it("gives the same current inside the window as without it, on a two-band dot with substrate crossings in and out of it", () => {
    const ladders = bandLadders(doublet);
    const all = currentSteps(doublet, ladders);
    const windowed = currentSteps(doublet, ladders, { fromV: -3, toV: 1.5 });
    expect(windowed.steps.length).toBeLessThan(all.steps.length);
    // Points 9σ inside the window (σ = 10 mV): the steps left out add exactly 0 or their height.
    const bias = Array.from({ length: 301 }, (_, i) => -2.9 + (i * 4.3) / 300);
    const scale = Math.max(...Array.from(fastCurrent(all, bias, 0.01), Math.abs));
    expectClose(Array.from(fastCurrent(windowed, bias, 0.01)), Array.from(fastCurrent(all, bias, 0.01)), { atol: 1e-12 * scale, what: "current inside the window" });
  });

  it("takes plateaus from a store: the same steps, and no new entry when the levels move without reordering a crossing", () => {
    const plateauStore = { cb: new Map<string, number>(), vb: new Map<string, number>() };
    const first = currentSteps(doublet, bandLadders(doublet), { plateauStore });
    expect(first).toEqual(currentSteps(doublet, bandLadders(doublet)));
    const stored = plateauStore.cb.size + plateauStore.vb.size;
    expect(stored).toBeGreaterThan(0);
    const moved = { ...doublet, cb: [{ energyEV: 0.5001, degeneracy: 2 }], chargingEnergyEV: 0.1001 };
    const again = currentSteps(moved, bandLadders(moved), { plateauStore });
    expect(plateauStore.cb.size + plateauStore.vb.size).toBe(stored);
    expect(again).toEqual(currentSteps(moved, bandLadders(moved)));
    // A new rate ratio is a new rate matrix: solved and stored.
    currentSteps({ ...moved, tipRatePerS: 2e9 }, bandLadders(moved), { plateauStore });
    expect(plateauStore.cb.size + plateauStore.vb.size).toBeGreaterThan(stored);
  });

  it("solves in the buffers it is given, reused across rate ratios, with the same steps as in new ones (exact) and the closed-form plateaus", () => {
    const ladders = bandLadders(doublet);
    const workspaces = { cb: ladderWorkspace(ladders.cb!), vb: ladderWorkspace(ladders.vb!) };
    for (const tipRatePerS of [1e9, 3e7, 1e9]) {
      const model = { ...doublet, tipRatePerS };
      expect(currentSteps(model, ladders, { workspaces })).toEqual(currentSteps(model, ladders));
    }
    const cbOnly = { ...doublet, vb: [] };
    const { steps } = currentSteps(cbOnly, bandLadders(cbOnly), { fromV: 0, toV: 2, workspaces });
    const r = 10;
    expectClose(steps[0].heightA, (E * 1e8 * 2 * r) / (1 + 2 * r), { rtol: 1e-9, what: "e·Γs·2r/(1 + 2r)" });
  });
});

describe("fastCurrent(steps, biasV, broadeningV) on ascending biases", () => {
  it("equals the general sum over the same biases in another order (each step summed only within its 9σ reach)", () => {
    const steps = currentSteps(doublet);
    const ascending = Array.from({ length: 401 }, (_, i) => -3.5 + (i * 5) / 400);
    // A permutation (7 and 401 are coprime): the general path, which visits every point.
    const shuffled = ascending.map((_, i) => ascending[(7 * i) % 401]);
    const fromShuffled = fastCurrent(steps, shuffled, 0.02);
    const fromAscending = fastCurrent(steps, ascending, 0.02);
    const scale = Math.max(...Array.from(fromShuffled, Math.abs));
    expectClose(
      ascending.map((_, i) => fromAscending[(7 * i) % 401]),
      Array.from(fromShuffled),
      { atol: 1e-13 * scale, what: "ascending vs any order" },
    );
  });
});
