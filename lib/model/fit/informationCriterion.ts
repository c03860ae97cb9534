/**
 * The score by which the model fit compares groupings of the peaks: the Bayesian information
 * criterion with the noise known, and the relative weights of evidence it implies.
 */

/**
 * Bayesian information criterion of a least-squares fit whose noise σ is known.
 *
 * Parameters
 * ----------
 * chiSquare : number
 *     χ² = Σ ((y_i − f_i)/σ)² at the optimum (dimensionless; residuals in units of the noise).
 * parameterCount : number
 *     k, the free parameters of the model (nonlinear and linear alike).
 * pointCount : number
 *     n, the data points fitted (the same n for every model compared).
 *
 * Returns
 * -------
 * number
 *     BIC = χ² + k·ln n (dimensionless; lower is better).
 *
 * Throws
 * ------
 * Nothing: callers pass counts.
 *
 * Notes
 * -----
 * 1. With Gaussian noise of known σ, −2 ln L = χ² + const, so BIC = −2 ln L + k ln n reduces to
 *    χ² + k·ln n up to a constant shared by every model fitted to the same points.
 * 2. BIC and not AIC (χ² + 2k): each extra free level costs ln n ≈ 6.7 (n = 800) rather than 2, so
 *    a grouping into more single levels must earn its levels; on curves of several hundred points
 *    AIC lets a free level absorb a charging step that the ladder of fewer levels explains.
 * 3. Only differences matter, and only between models fitted to the same points with the same σ.
 *
 * References
 * ----------
 * G. Schwarz, "Estimating the dimension of a model", Ann. Stat. 6, 461 (1978); K. P. Burnham and
 * D. R. Anderson, Model Selection and Multimodel Inference, 2nd ed. (Springer, 2002), §6.4.
 *
 * Example
 * -------
 * ```ts
 * bayesianInformationCriterion(812.4, 10, 800); // => 879.25 (812.4 + 10·ln 800)
 * ```
 */
export function bayesianInformationCriterion(chiSquare: number, parameterCount: number, pointCount: number): number {
  return chiSquare + parameterCount * Math.log(pointCount);
}

/**
 * Relative weights of evidence of models from their information-criterion scores.
 *
 * Parameters
 * ----------
 * scores : readonly number[]
 *     One BIC (or AIC) per model, all on the same points; non-finite scores get weight 0.
 *
 * Returns
 * -------
 * number[]
 *     w_i = exp(−Δ_i/2)/Σ_j exp(−Δ_j/2) with Δ_i = score_i − min score; they sum to 1 (all 0 when
 *     no score is finite).
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Δ_i from the lowest finite score (so the exponentials cannot overflow).
 * 2. exp(−Δ_i/2), normalised.
 *
 * References
 * ----------
 * K. P. Burnham and D. R. Anderson, Model Selection and Multimodel Inference, 2nd ed. (Springer,
 * 2002), §2.9 (Akaike weights; the same form for BIC, §6.4).
 *
 * Example
 * -------
 * ```ts
 * evidenceWeights([100, 102, 110]); // => [0.7275, 0.2676, 0.0049]
 * ```
 */
export function evidenceWeights(scores: readonly number[]): number[] {
  const finite = scores.filter((s) => Number.isFinite(s));
  if (!finite.length) return scores.map(() => 0);
  const min = Math.min(...finite);
  const raw = scores.map((s) => (Number.isFinite(s) ? Math.exp(-(s - min) / 2) : 0));
  const sum = raw.reduce((a, b) => a + b, 0);
  return raw.map((w) => w / sum);
}
