/**
 * A rate ratio on a bound of the fit: the one-sided limit the curve sets on Γtip/Γsub, from the
 * rise of χ² as log₁₀ Γtip/Γsub is held at values stepping inward from the bound.
 */
import { parameterIndex } from "./parameterModel.ts";
import { onBound, type FitTrial } from "./fitTrial.ts";
import type { FitRun } from "./fitRunner.ts";

/** Where Γtip/Γsub sits on a bound of the fit: the limit the curve sets on it. */
export interface RateRatioLimit {
  /** "lower": the curve sets Γtip/Γsub ≥ `rateRatio` (it ran onto the upper bound, deep shell filling); "upper": ≤ (the lower bound, deep shell tunnelling). */
  kind: "lower" | "upper";
  /** The limit on Γtip/Γsub: where χ² has risen by `chiSquareRise` above the fit's. */
  rateRatio: number;
  /** The χ² rise that defines it (2.71: one-sided 95 % for one parameter). */
  chiSquareRise: number;
}

/** What {@link rateRatioLimit} reads. */
export interface RateRatioLimitInput {
  /** The run whose log₁₀ Γtip/Γsub may sit on a bound. */
  trial: FitTrial;
  run: FitRun;
  maxIterations: number;
  /** χ² rise that defines the limit (one-sided 95 % for one parameter: 2.71). */
  chiSquareRise: number;
  /** Held log₁₀ Γtip/Γsub values tried from the upper bound inward, ending at the shell-filling boundary. */
  fromUpperLog10: readonly number[];
  /** The same from the lower bound, ending at the shell-tunnelling boundary. */
  fromLowerLog10: readonly number[];
}

/**
 * The one-sided limit on Γtip/Γsub where a fit ran onto a bound of log₁₀ Γtip/Γsub.
 *
 * Deep in shell filling every CB charging step already has the dot filled from the tip, and the
 * first two steps' ratio r/(1 + r) is within the noise of 1 for every r above some value: the curve
 * then sets a lower limit on r, not a value, and the fit runs onto its upper bound (10⁴). Deep in
 * shell tunnelling the same holds below, towards r → 0. The limit is found by profiling: log₁₀ r
 * is held at `fromUpperLog10` (or `fromLowerLog10`), inward from the bound, with every other
 * parameter refitted, and the limit is where χ² has risen by `chiSquareRise` above the fit's,
 * interpolated between the last held value below it and the first above linearly in √Δχ² (exact
 * where the profile is a parabola in log₁₀ r about the bound).
 * Δχ² = 1.645² = 2.71, 1.645 the one-sided 95 % point of the normal distribution (closed form),
 * is the one-sided 95 % limit of one parameter.
 *
 * Returns
 * -------
 * RateRatioLimit | null
 *     The limit, or null where the trial is off its bounds, or where χ² has not risen by
 *     `chiSquareRise` at the last step (the regime boundary): the curve then does not set a limit
 *     inside one regime.
 *
 * References
 * ----------
 * W. H. Press et al., Numerical Recipes, 3rd ed., §15.6 (confidence limits on one parameter from
 * the Δχ² of a fit with the others refitted; from memory).
 */
export function rateRatioLimit(input: RateRatioLimitInput): RateRatioLimit | null {
  const { trial, run, maxIterations, chiSquareRise } = input;
  const at = parameterIndex(trial.hypothesis.seeds.length).logRateRatio;
  const p = trial.loop.parameters;
  if (!onBound(p, trial.start, at)) return null;
  const mid = (trial.start.minValues[at] + trial.start.maxValues[at]) / 2;
  const sign = p[at] > mid ? 1 : -1;
  let [prevLog, prevRise] = [p[at], 0];
  let from = [...p];
  for (const step of sign > 0 ? input.fromUpperLog10 : input.fromLowerLog10) {
    const held = [...from];
    held[at] = step;
    const t = run(trial.hypothesis, null, maxIterations, held, trial.set, [at]);
    const rise = t.loop.chiSquare - trial.loop.chiSquare;
    if (rise > chiSquareRise) {
      const [a, b, c] = [Math.sqrt(prevRise), Math.sqrt(rise), Math.sqrt(chiSquareRise)];
      const log = prevLog + ((c - a) / (b - a)) * (step - prevLog);
      return { kind: sign > 0 ? "lower" : "upper", rateRatio: 10 ** log, chiSquareRise };
    }
    [prevLog, prevRise, from] = [step, Math.max(prevRise, rise), [...t.loop.parameters]];
  }
  return null;
}
