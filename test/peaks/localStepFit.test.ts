// The local step fit of findPeaks and the window of its step test. Expected values: closed forms
// (a Gaussian-broadened step Φ((x − x_j)/s) rises from Φ(−2.355) = 0.9 % to Φ(2.355) = 99.1 % over
// ±1 FWHM, FWHM = 2√(2 ln 2)·s; noiseless data drawn from the fitted model give back its
// coefficients exactly), the rule of stepTestWindow's notes (derived there), and an independent
// least-squares computation with mathjs (inv(AᵀA) of the same design matrix: 1, u, u² over the
// moved window, the steps; Φ from mathjs.erf).
import { describe, it, expect } from "vitest";
import { erf, inv, multiply, transpose } from "mathjs";
import { expectClose } from "../helpers/expectClose.ts";
import { localStepFit, stepTestWindow, STEP_TEST_WINDOW, type FitWorkspace } from "../../lib/peaks/localStepFit.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../../lib/util/constants.ts";

const phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));

describe("stepTestWindow(x0V, neighboursV, fwhmV)", () => {
  it("is ±3 FWHM with no neighbour near an edge", () => {
    expect(stepTestWindow(1, [], 0.1).map((v) => +v.toFixed(12))).toEqual([0.7, 1.3]);
    // Neighbours inside the window and more than 1 FWHM from its edges leave it alone.
    expect(stepTestWindow(0, [-0.15, 0.1, 0.15], 0.1).map((v) => +v.toFixed(12))).toEqual([-0.3, 0.3]);
    // A neighbour beyond the edge by more than 1 FWHM is not fitted and moves nothing.
    expect(stepTestWindow(0, [0.45], 0.1).map((v) => +v.toFixed(12))).toEqual([-0.3, 0.3]);
  });

  it("moves an edge to 2 FWHM beyond a neighbour within 1 FWHM of it (derived: the neighbour's rise, 0.9 %–99.1 %, and a plateau as long after it)", () => {
    // Closed form: Φ(±2.355) brackets the rise over ±1 FWHM.
    expectClose(phi(-GAUSSIAN_FWHM_PER_SIGMA), 0.0093, { atol: 1e-4, what: "Φ(−FWHM/s)" });
    expect(STEP_TEST_WINDOW.straddleFwhm).toBe(1);
    expect(stepTestWindow(0, [0.1, 0.28], 0.1).map((v) => +v.toFixed(12))).toEqual([-0.3, 0.48]);
    expect(stepTestWindow(0, [-0.22, 0.1], 0.1).map((v) => +v.toFixed(12))).toEqual([-0.42, 0.3]);
  });

  it("follows a ladder outward but never past 6 FWHM", () => {
    // Steps every 1.4 FWHM: 2.8 cuts the edge at 3 (→ 4.8), 4.2 cuts 4.8 (→ 6.2, capped at 6).
    const fw = 0.05;
    const ladder = [-4, -3, -2, -1, 1, 2, 3, 4].map((k) => 1.4 * fw * k);
    expect(stepTestWindow(0, ladder, fw).map((v) => +(v / fw).toFixed(9))).toEqual([-6, 6]);
  });
});

describe("localStepFit(x, current, p, x0, neighboursV, halfWidth, withShift, work, windowV)", () => {
  // A ladder of Gaussian-broadened steps 1.4 FWHM apart (a charging multiplet), FWHM 50 mV on 1 mV steps.
  const h = 0.001;
  const x = Float64Array.from({ length: 2001 }, (_, i) => -1 + i * h);
  const halfWidth = 25;
  const fw = 2 * halfWidth * h;
  const s = fw / GAUSSIAN_FWHM_PER_SIGMA;
  const positions = [-4, -3, -2, -1, 0, 1, 2, 3, 4].map((k) => 1.4 * fw * k);
  const heights = [3, 2, 4, 3, 2.5, 3.5, 2, 3, 4].map((c) => c * 1e-12);
  // The background bends (a u² term): the moved window fits it, the plain window's line need not.
  const line = (v: number) => 5e-12 + 2e-12 * v + 3e-12 * v * v;
  const current = x.map((v) => line(v) + positions.reduce((sum, xj, j) => sum + heights[j] * phi((v - xj) / s), 0));
  const p = 1000; // x = 0, the middle step
  const neighbours = positions.filter((v) => v !== 0);

  /** Var(step)/σ² of the last column by mathjs over [lo, hi] with the given neighbours' steps (and u², for the moved window). */
  function referenceStepVar(lo: number, hi: number, fitted: number[], quadratic: boolean): number {
    const rows: number[][] = [];
    for (let i = lo; i <= hi; i++) rows.push([1, x[i], ...(quadratic ? [x[i] * x[i]] : []), ...fitted.map((v) => phi((x[i] - v) / s)), phi(x[i] / s)]);
    const ata = multiply(transpose(rows), rows) as number[][];
    const invAta = inv(ata) as number[][];
    const m = rows[0].length;
    return invAta[m - 1][m - 1];
  }

  it("gives back the step of noiseless data drawn from its own model, quadratic background included (closed form)", () => {
    // Over the window of stepTestWindow every step of the ladder is fitted (the plain ±3 FWHM
    // window leaves out those at ±4.2 and ±5.6 FWHM, whose tails then bias it).
    const work: FitWorkspace = { cols: new Float64Array(0) };
    const fit = localStepFit(x, current, p, 0, neighbours, halfWidth, false, work, stepTestWindow(0, neighbours, fw))!;
    expectClose(fit.step, heights[4], { rtol: 1e-4, what: "middle step" });
    // The refinement (withShift) fits a line over ±3 FWHM: on a straight background its shift is 0.
    const straight = x.map((v, i) => current[i] - 3e-12 * v * v);
    const shifted = localStepFit(x, straight, p, 0, neighbours, halfWidth, true, work)!;
    // Within 1e-5 V (0.02 % of the FWHM): the fit's Φ is a fast approximation of mathjs' erf-based one.
    expectClose(shifted.shift, 0, { atol: 1e-5, what: "shift at the true position" });
  });

  it("the step test's variance is that of the moved window with a quadratic background (mathjs inv(AᵀA)), smaller than over ±3 FWHM", () => {
    const work: FitWorkspace = { cols: new Float64Array(0) };
    const [leftV, rightV] = stepTestWindow(0, neighbours, fw);
    const fit = localStepFit(x, current, p, 0, neighbours, halfWidth, false, work, [leftV, rightV])!;
    const lo = Math.round((leftV - x[0]) / h), hi = Math.round((rightV - x[0]) / h);
    const fittedMoved = neighbours.filter((v) => Math.abs(v) >= fw && v >= x[lo] - fw && v <= x[hi] + fw);
    expect(fittedMoved.length).toBe(8);
    const moved = referenceStepVar(lo, hi, fittedMoved, true);
    expectClose(fit.stepVar, moved, { rtol: 1e-4, what: "Var(step)/σ², moved window" });
    // The plain ±3 FWHM window cuts the steps at ±2.8 FWHM: its variance is larger.
    const plainLo = p - 6 * halfWidth, plainHi = p + 6 * halfWidth;
    const fittedPlain = neighbours.filter((v) => Math.abs(v) >= fw && v >= x[plainLo] - fw && v <= x[plainHi] + fw);
    const plain = referenceStepVar(plainLo, plainHi, fittedPlain, false);
    expect(moved).toBeLessThan(plain);
    // Without windowV the fit is the plain one.
    expectClose(localStepFit(x, current, p, 0, neighbours, halfWidth, false, work)!.stepVar, plain, { rtol: 1e-4, what: "Var(step)/σ², plain window" });
  });

  it("with freeWithinV, a neighbour fitted 0.1 FWHM off its true position biases the tested step to second order only (derived: Φ((x − x_j − δ)/s) = Φ − (δ/s)·φ − (δ²/2s²)·z·φ + O(δ³), the φ and z·φ columns take the first two terms)", () => {
    expect(STEP_TEST_WINDOW.freeNeighbourFwhm).toBe(2);
    const work: FitWorkspace = { cols: new Float64Array(0) };
    // Two steps 1.5 FWHM apart; the neighbour's step is fitted at 1.6 FWHM.
    const pair = x.map((v) => 1e-12 + 1e-11 * phi((v - 1.5 * fw) / s) + 2e-12 * phi(v / s));
    const plain = localStepFit(x, pair, p, 0, [1.6 * fw], halfWidth, false, work)!;
    const free = localStepFit(x, pair, p, 0, [1.6 * fw], halfWidth, false, work, undefined, 2 * fw)!;
    const biasPlain = Math.abs(plain.step - 2e-12), biasFree = Math.abs(free.step - 2e-12);
    expect(biasPlain).toBeGreaterThan(0.05 * 2e-12);
    // Second order in δ/s = 0.1·2.355: about (δ/s)² ≈ 5 % of the first-order bias, or less.
    expect(biasFree).toBeLessThan(0.1 * biasPlain);
    // Beyond freeWithinV the neighbour gets no free columns: the plain fit again.
    expectClose(localStepFit(x, pair, p, 0, [1.6 * fw], halfWidth, false, work, undefined, 1.5 * fw)!.step, plain.step, { rtol: 1e-12 });
  });
});
