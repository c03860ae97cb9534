// peakStartWholeFits: each compared grouping fitted to the whole curve from its own peak-based
// start, with a run function that stands in for Levenberg–Marquardt (each start's reduced χ² set
// by hand); the expected runs follow from the notes by hand, and the VB levels held on the CB side
// sit where their first peaks give the whole curve's energies (closed form: first peak
// (|ε| + Ec·(N + ½))/η).
import { describe, it, expect } from "vitest";
import { ladderHypotheses, peakStartWholeFits, PEAK_START_WHOLE_DEFAULTS } from "../../../lib/model/fit/peakStartWholeFits.ts";
import type { FitHypothesis } from "../../../lib/model/fit/fitHypotheses.ts";
import type { DataSet, FitTrial } from "../../../lib/model/fit/fitTrial.ts";
import type { LevelSeed } from "../../../lib/model/fit/levelsToFit.ts";
import { standInWholeFields } from "../../helpers/standInWholeFit.ts";

const cb = (degeneracies: number[]): LevelSeed[] => degeneracies.map((g, j) => ({ band: "CB", label: j ? `p${j}` : "s", degeneracy: g, firstPeakV: 1.8 + 0.3 * j, before: 0 }));
const vbShell: LevelSeed[] = [
  { band: "VB", label: "v1", degeneracy: 2, firstPeakV: -1.22, before: 0 },
  { band: "VB", label: "v2", degeneracy: 4, firstPeakV: -1.84, before: 2 },
];
const vbSingles: LevelSeed[] = Array.from({ length: 7 }, (_, j) => ({ band: "VB", label: `v${j + 1}`, degeneracy: 2, firstPeakV: -1.2 - 0.1 * j, before: 0 }));
const hypothesis = (name: string, seeds: LevelSeed[], vbReadings: LevelSeed[][]) =>
  ({ name, kind: "ladder-filling", label: name, analysis: { peaks: [] }, seeds: [...seeds, ...vbReadings[0]], vbReadings, cbDegeneracies: seeds.map((s) => s.degeneracy), states: 100, chargingEnergyStartEV: 0.065, rateRatioStartLog10: 0.7 }) as unknown as FitHypothesis;
const cbSide = { biasV: new Float64Array(0) } as unknown as DataSet;
const trial = (h: FitHypothesis, chi: number, parameters: number[], side: "both" | "CB"): FitTrial => ({ hypothesis: h, bic: chi, side, loop: { parameters, chiSquare: chi } } as unknown as FitTrial);

/** A context whose whole-curve runs end at reduced χ² chiOf(CB layout, VB degeneracies, iterations); CB-side runs at cbChi. */
function context(hypotheses: FitHypothesis[], chiOf: (layout: string, vb: string, iterations: number) => number, cbChi = 1.2, acceptable: (w: FitTrial, c: FitTrial) => boolean = () => true) {
  const runs: { layout: string; iterations: number; from: number[] | undefined; set: DataSet | undefined; held: readonly number[]; h: FitHypothesis }[] = [];
  return {
    runs,
    context: {
      trials: [] as FitTrial[],
      run: (h: FitHypothesis, _r: number | null, iterations: number, from?: number[], set?: DataSet, held: readonly number[] = []) => {
        const layout = h.seeds.filter((s) => s.band === "CB").map((s) => s.degeneracy).join("+");
        const vb = h.seeds.filter((s) => s.band === "VB").map((s) => s.degeneracy).join("+");
        runs.push({ layout, iterations, from, set, held, h });
        // Whole-curve parameters: |ε| per level, Ec 0.0653 eV, log₁₀ r 1.1, log₁₀ σ −1.7.
        const parameters = from ?? [...h.seeds.map((s, j) => 0.5 + 0.1 * j), 0.0653, 1.1, -1.7];
        return trial(h, set ? cbChi : chiOf(layout, vb, iterations), parameters, set ? "CB" : "both");
      },
      cbSide,
      eta: 0.623,
      ...standInWholeFields(),
      acceptable,
      hypotheses,
    },
  };
}

describe("peakStartWholeFits(context)", () => {
  const whole = hypothesis("ladder-filling 2+6", cb([2, 6]), [vbShell]);
  const split = hypothesis("ladder-filling 2+2+4", cb([2, 2, 4]), [vbShell, vbSingles]);
  const vbOnly = { ...hypothesis("assigned", [], [vbShell]) } as FitHypothesis;

  it("PEAK_START_WHOLE_DEFAULTS are locked", () => {
    expect(PEAK_START_WHOLE_DEFAULTS).toEqual({ finishedStarts: 2, maxReadingStates: 100 });
    expect(Object.isFrozen(PEAK_START_WHOLE_DEFAULTS)).toBe(true);
  });

  it("explores each grouping with CB levels from its own start, each VB reading within the state limit, and finishes the best two", () => {
    const { context: ctx, runs } = context([vbOnly, whole, split], (layout, _vb, it) => (layout === "2+2+4" ? (it === 8 ? 2.4 : 1.06) : it === 8 ? 40 : 30));
    const found = peakStartWholeFits(ctx);
    const explored = runs.filter((r) => r.iterations === 8);
    // 2+6 with the shell reading; 2+2+4 with the shell reading (seven single VB levels make 3⁷ = 2,187 states > 100: left out).
    expect(explored.map((r) => `${r.layout}|${r.h.seeds.filter((s) => s.band === "VB").length}`)).toEqual(["2+6|2", "2+2+4|2"]);
    expect(explored.every((r) => r.from === undefined && r.set === undefined)).toBe(true);
    expect(runs.filter((r) => r.iterations === 60 && !r.set).length).toBe(PEAK_START_WHOLE_DEFAULTS.finishedStarts);
    expect(found?.whole.loop.chiSquare).toBe(1.06);
    expect(found?.whole.hypothesis.seeds.filter((s) => s.band === "CB").map((s) => s.degeneracy)).toEqual([2, 2, 4]);
    expect(found?.whole.hypothesis.name).toBe("ladder-filling 2+2+4 (whole curve from its peaks)");
  });

  it("fits the chosen grouping's CB side from its whole-curve values, its VB levels held at the whole curve's energies", () => {
    const { context: ctx, runs } = context([split], () => 1.06);
    const found = peakStartWholeFits(ctx)!;
    const cbRun = runs.find((r) => r.set === cbSide)!;
    expect(cbRun.h.seeds.map((s) => s.band)).toEqual(["CB", "CB", "CB"]);
    // whole-curve |ε| 0.5, 0.6, 0.7 (CB), 0.8, 0.9 (VB), then Ec, log₁₀ r, log₁₀ σ.
    expect(cbRun.from).toEqual([0.5, 0.6, 0.7, 0.0653, 1.1, -1.7]);
    expect(cbRun.held).toEqual([]);
    // closed form: first peak −(|ε| + Ec·(N + ½))/η, N the holes before (0 and 2).
    expect(cbRun.h.heldVb!.map((s) => s.firstPeakV)).toEqual([-(0.8 + 0.0653 * 0.5) / 0.623, -(0.9 + 0.0653 * 2.5) / 0.623].map((v) => expect.closeTo(v, 12)));
    expect(found.cb).toBe(ctx.trials.find((t) => t.side === "CB"));
  });

  it("holds Ec and Γtip/Γsub at the whole curve's on a CB side whose free fit is not acceptable, and keeps it only where it describes the side", () => {
    // Acceptable only where the CB side was fitted with Ec and Γtip/Γsub held (a free one ran onto a bound).
    const heldRun = (c: FitTrial) => c.hypothesis === lastCb.h && lastCb.held.length > 0;
    let lastCb = { h: null as unknown as FitHypothesis, held: [] as readonly number[] };
    const { context: ctx, runs } = context([split], () => 1.06, 1.3, (_w, c) => heldRun(c));
    const run = ctx.run;
    ctx.run = (h, r, it, from, set, held = []) => {
      if (set) lastCb = { h, held };
      return run(h, r, it, from, set, held);
    };
    const found = peakStartWholeFits(ctx);
    // three CB levels: Ec at index 3, log₁₀ Γtip/Γsub at 4.
    expect(runs.filter((r) => r.set === cbSide).map((r) => r.held)).toEqual([[], [3, 4]]);
    expect(found?.cb.loop.chiSquare).toBe(1.3);
    // The held CB side at reduced χ² 3.5 does not describe its side: nothing found.
    const { context: poorSide } = context([split], () => 1.06, 3.5, () => false);
    expect(peakStartWholeFits(poorSide)).toBeNull();
  });

  it("returns null when no finished run describes the curve", () => {
    const { context: ctx } = context([whole, split], () => 12);
    expect(peakStartWholeFits(ctx)).toBeNull();
  });
});

describe("ladderHypotheses(base, compared, readings, vbReadings, ecEV)", () => {
  // By the definition: a reading is new when its CB levels (seedKey) are neither compared nor read
  // before, and a ladder needs two levels at least.
  const base = hypothesis("ladder-filling 2+6", cb([2, 6]), [vbShell]);
  const reading = (degeneracies: number[], name: string) => ({ cb: cb(degeneracies), name, label: name });
  it("keeps each new reading of two or more levels once, in order, with the first VB reading held", () => {
    const out = ladderHypotheses(base, [base], [reading([2, 6], "same as compared"), reading([2], "s alone"), reading([2, 2, 4], "split"), reading([2, 2, 4], "split again")], [vbShell, vbSingles], 0.08);
    expect(out.map((h) => h.name)).toEqual(["split"]);
    expect(out[0].seeds).toEqual([...cb([2, 2, 4]), ...vbShell]);
    expect(out[0].vbReadings).toEqual([vbShell, vbSingles]);
    expect(out[0].cbDegeneracies).toEqual([2, 2, 4]);
    expect(out[0].chargingEnergyStartEV).toBe(0.08);
  });
  it("holds no VB level where there is no VB reading", () => {
    const [h] = ladderHypotheses(base, [], [reading([2, 6], "ladder")], [], 0.08);
    expect(h.seeds).toEqual(cb([2, 6]));
    expect(h.vbReadings).toEqual([[]]);
  });
});
