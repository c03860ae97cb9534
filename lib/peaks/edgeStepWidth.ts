/**
 * The width of a band's first step, measured on the raw current: the one step whose lower side
 * (the gap) no other level overlaps.
 */
import { normalCdfFast } from "../util/special.ts";
import { GAUSSIAN_FWHM_PER_SIGMA } from "../util/constants.ts";

/** Options of {@link edgeStepWidth}. */
export interface EdgeStepWidthOptions {
  /** Position of the step (the peak of dI/dV), V. */
  positionV: number;
  /** Bias range of the fit [from, to], V; should cover the gap side and stop before the next step. */
  rangeV: [number, number];
  /** Smallest and largest FWHM tried, V. Default [0.005, 0.4]. */
  boundsV?: [number, number];
  /**
   * −1 for a valence-band step: the fit then works on −V and −I (positionV and rangeV given in
   * that mirrored frame, so the step rises with the coordinate). Default 1.
   */
  sign?: 1 | -1;
}

/**
 * FWHM of a Gaussian-broadened current step at a known position, by least squares.
 *
 * Notes:
 * 1. Model I(V) = a + c·Φ((V − V₀)/s) on the given range; for each trial s the best a and c
 *    follow linearly, so only s is searched: 16 log-spaced trials between the bounds, then a
 *    golden-section refinement around the best.
 * 2. Returns FWHM = 2√(2 ln 2)·s, or null when the range holds fewer than 5 points or the
 *    fitted step is not positive.
 * Measured on the unsmoothed current, the width carries no smoothing bias.
 *
 * @param biasV - ascending bias, V.
 * @param currentA - current, A.
 */
export function edgeStepWidth(biasV: ArrayLike<number>, currentA: ArrayLike<number>, options: EdgeStepWidthOptions): number | null {
  const [from, to] = options.rangeV;
  const sign = options.sign ?? 1;
  const xs: number[] = [], ys: number[] = [];
  for (let i = 0; i < biasV.length; i++) {
    const x = sign * biasV[i];
    if (x >= from && x <= to) xs.push(x), ys.push(sign * currentA[i]);
  }
  if (xs.length < 5) return null;
  const x0 = options.positionV;
  const residual = (s: number): { r: number; c: number } => {
    let n = 0, sf = 0, sff = 0, sy = 0, sfy = 0, syy = 0;
    for (let i = 0; i < xs.length; i++) {
      const f = normalCdfFast((xs[i] - x0) / s);
      n++, (sf += f), (sff += f * f), (sy += ys[i]), (sfy += f * ys[i]), (syy += ys[i] * ys[i]);
    }
    const det = n * sff - sf * sf;
    if (!(det > 0)) return { r: Infinity, c: 0 };
    const c = (n * sfy - sf * sy) / det;
    const a = (sy - c * sf) / n;
    // Σ(y − a − c f)² expanded.
    const r = syy - 2 * a * sy - 2 * c * sfy + n * a * a + 2 * a * c * sf + c * c * sff;
    return { r, c };
  };
  const [lo, hi] = (options.boundsV ?? [0.005, 0.4]).map((w) => w / GAUSSIAN_FWHM_PER_SIGMA);
  const trials = 16;
  let best = 0, bestR = Infinity;
  const grid = Array.from({ length: trials }, (_, k) => lo * (hi / lo) ** (k / (trials - 1)));
  grid.forEach((s, k) => {
    const { r } = residual(s);
    if (r < bestR) (bestR = r), (best = k);
  });
  // Golden-section search in log s between the neighbours of the best trial, one new evaluation per step.
  let a = Math.log(grid[Math.max(0, best - 1)]), b = Math.log(grid[Math.min(trials - 1, best + 1)]);
  const g = (Math.sqrt(5) - 1) / 2;
  let c1 = b - g * (b - a), c2 = a + g * (b - a);
  let r1 = residual(Math.exp(c1)).r, r2 = residual(Math.exp(c2)).r;
  for (let it = 0; it < 20; it++) {
    if (r1 < r2) {
      b = c2, c2 = c1, r2 = r1;
      c1 = b - g * (b - a);
      r1 = residual(Math.exp(c1)).r;
    } else {
      a = c1, c1 = c2, r1 = r2;
      c2 = a + g * (b - a);
      r2 = residual(Math.exp(c2)).r;
    }
  }
  const s = Math.exp((a + b) / 2);
  if (!(residual(s).c > 0)) return null;
  return GAUSSIAN_FWHM_PER_SIGMA * s;
}
