// levenbergMarquardtLoop on a model with a known answer: noise-free data y = A·exp(−k·x) are fitted
// exactly at the A and k they were made from (closed form: χ² = 0 there).
import { describe, it, expect } from "vitest";
import { expectClose } from "../../helpers/expectClose.ts";
import { levenbergMarquardtLoop } from "../../../lib/model/fit/levenbergMarquardtLoop.ts";

const x = Array.from({ length: 30 }, (_, i) => i);
const data = { x, y: x.map((v) => 2 * Math.exp(-0.3 * v)) };
const model = (p: number[]) => (v: number) => p[0] * Math.exp(-p[1] * v);
const settings = {
  initialValues: [1, 0.1],
  minValues: [0, 0],
  maxValues: [10, 1],
  gradientDifference: [1e-6, 1e-6],
  maxIterations: 100,
  chunkIterations: 4,
  convergenceTolerance: 1e-5,
};

describe("levenbergMarquardtLoop(data, model, settings)", () => {
  it("recovers the parameters of noise-free exponential data (closed form: A = 2, k = 0.3)", () => {
    const r = levenbergMarquardtLoop(data, model, settings);
    expect(r.converged).toBe(true);
    expectClose(r.parameters, [2, 0.3], { rtol: 1e-6 });
    expect(r.chiSquare).toBeLessThan(1e-10);
  });

  it("stops after maxIterations without claiming convergence, keeping χ² no worse than at the start", () => {
    const start = data.y.reduce((s, y, i) => s + (y - model(settings.initialValues)(i)) ** 2, 0);
    const r = levenbergMarquardtLoop(data, model, { ...settings, maxIterations: 1 });
    expect(r.iterations).toBeLessThanOrEqual(1);
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/without converging/);
    expect(r.chiSquare).toBeLessThanOrEqual(start);
  });

  it("stops at its work budget with exactly maxEvaluations evaluations, at the values of its last whole chunk (exact)", () => {
    // The model evaluations asked for are counted by the loop; the test counts them again from
    // outside, less the loop's own χ² checks (one at the start and one per chunk run).
    let calls = 0;
    const counting = (p: number[]) => {
      calls++;
      return model(p);
    };
    const budget = Math.floor(levenbergMarquardtLoop(data, model, settings).evaluations / 2);
    const r = levenbergMarquardtLoop(data, counting, { ...settings, maxEvaluations: budget });
    expect(r.stoppedBy).toBe("budget");
    expect(r.converged).toBe(false);
    expect(r.evaluations).toBe(budget);
    expect(r.message).toContain(`work budget of ${budget} model evaluations`);
    const chunksRun = r.iterations / settings.chunkIterations;
    expect(Number.isInteger(chunksRun)).toBe(true);
    expect(calls).toBe(budget + 1 + chunksRun);
    // The chunk the budget cut is dropped: the same as a run of just the whole chunks (exact).
    const whole = levenbergMarquardtLoop(data, model, { ...settings, maxIterations: r.iterations });
    expect(r.parameters).toEqual(whole.parameters);
    expect(r.chiSquare).toBe(whole.chiSquare);
  });

  it("with no evaluation left returns its start untouched", () => {
    const r = levenbergMarquardtLoop(data, model, { ...settings, maxEvaluations: 0 });
    expect(r).toMatchObject({ parameters: settings.initialValues, iterations: 0, evaluations: 0, stoppedBy: "budget" });
  });

  it("a budget it does not reach changes nothing (exact)", () => {
    const free = levenbergMarquardtLoop(data, model, settings);
    const bounded = levenbergMarquardtLoop(data, model, { ...settings, maxEvaluations: free.evaluations });
    expect(bounded).toEqual(free);
    expect(free.stoppedBy).toBe("converged");
  });

  it("stops where the caller's own budget (spent) says so, as at maxEvaluations (exact)", () => {
    // Spent from the start: no evaluation, the start returned untouched.
    expect(levenbergMarquardtLoop(data, model, { ...settings, spent: () => true })).toMatchObject({ parameters: settings.initialValues, iterations: 0, evaluations: 0, stoppedBy: "budget", message: "stopped at the caller's work budget" });
    // Spent after the n-th model call (the loop's own χ² checks included): fewer evaluations than
    // the free run, the same parameters as a run of its whole chunks.
    const free = levenbergMarquardtLoop(data, model, settings);
    let calls = 0;
    const r = levenbergMarquardtLoop(data, (p) => (calls++, model(p)), { ...settings, spent: () => calls >= free.evaluations / 2 });
    expect(r.stoppedBy).toBe("budget");
    expect(r.evaluations).toBeLessThan(free.evaluations);
    const whole = levenbergMarquardtLoop(data, model, { ...settings, maxIterations: r.iterations });
    expect(r.parameters).toEqual(whole.parameters);
    // Never spent: nothing changes.
    expect(levenbergMarquardtLoop(data, model, { ...settings, spent: () => false })).toEqual(free);
  });
});
