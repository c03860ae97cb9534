/**
 * The charging energy from a ladder of charging peaks: one common spacing, one intercept per
 * group (a multiplet or a sub-group of one), by weighted least squares.
 */

/** Result of {@link fitLadderSpacing}. */
export interface LadderSpacing {
  /** Common spacing, V. */
  spacingV: number;
  /** Its standard error, V (scaled by √χ²_red when the scatter exceeds the stated uncertainties). */
  spacingSEV: number;
  /** Number of spacings that inform the fit (peaks minus groups). */
  degreesOfFreedom: number;
  /** Reduced χ² of the positions about the fitted ladders (NaN with no residual degrees of freedom). */
  reducedChiSquare: number;
}

/**
 * Fits x_gk = a_g + k·d to the peak positions of several groups (peak k of group g), weights
 * 1/σ², and returns d with its standard error.
 *
 * Parameters
 * ----------
 * groups : { positionsV: readonly number[]; sigmasV: readonly number[] }[]
 *     Positions (V) and their 1σ uncertainties (V) per group, in ladder order.
 *
 * Returns
 * -------
 * LadderSpacing | null
 *     The spacing, or null when no group has two peaks.
 *
 * Notes
 * -----
 * 1. Within group g, centre the index: k' = k − k̄_g (weighted mean); then
 *    d = Σ w·k'·x / Σ w·k'², Var(d) = 1/Σ w·k'² (the intercepts drop out).
 * 2. χ²_red = Σ w·(x − a_g − k·d)² / (N − G − 1); when it exceeds 1 the standard error is
 *    multiplied by √χ²_red (the Birge ratio), so scatter beyond the stated uncertainties widens
 *    the error bar.
 *
 * Reference: R. T. Birge, Phys. Rev. 40, 207 (1932) (the ratio); any text on weighted linear
 * regression, e.g. P. R. Bevington and D. K. Robinson, Data Reduction and Error Analysis for the
 * Physical Sciences, 3rd ed. (McGraw-Hill, 2003), ch. 6.
 *
 * Example
 * -------
 * ```ts
 * fitLadderSpacing([{ positionsV: [0.7, 0.825], sigmasV: [0.002, 0.002] },
 *   { positionsV: [1.3, 1.425, 1.55], sigmasV: [0.002, 0.002, 0.002] }]).spacingV; // => 0.125
 * ```
 */
export function fitLadderSpacing(groups: { positionsV: readonly number[]; sigmasV: readonly number[] }[]): LadderSpacing | null {
  let sxx = 0, sxy = 0, peaks = 0, used = 0;
  const centred: { k: number; x: number; w: number; g: number }[] = [];
  groups.forEach((group, g) => {
    const n = group.positionsV.length;
    if (n < 2) return;
    used++;
    peaks += n;
    const w = group.sigmasV.map((s) => 1 / Math.max(s, 1e-12) ** 2);
    const sw = w.reduce((a, b) => a + b, 0);
    const kMean = w.reduce((a, wi, k) => a + wi * k, 0) / sw;
    const xMean = w.reduce((a, wi, k) => a + wi * group.positionsV[k], 0) / sw;
    for (let k = 0; k < n; k++) {
      const kc = k - kMean;
      sxx += w[k] * kc * kc;
      sxy += w[k] * kc * (group.positionsV[k] - xMean);
      centred.push({ k: kc, x: group.positionsV[k] - xMean, w: w[k], g });
    }
  });
  if (used === 0 || sxx === 0) return null;
  const d = sxy / sxx;
  const dof = peaks - used - 1;
  let chi2 = 0;
  for (const c of centred) chi2 += c.w * (c.x - c.k * d) ** 2;
  const reducedChiSquare = dof > 0 ? chi2 / dof : NaN;
  const scale = dof > 0 && reducedChiSquare > 1 ? Math.sqrt(reducedChiSquare) : 1;
  return { spacingV: d, spacingSEV: scale / Math.sqrt(sxx), degreesOfFreedom: peaks - used, reducedChiSquare };
}
