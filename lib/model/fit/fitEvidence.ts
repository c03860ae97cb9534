/**
 * Why the model fit chose the grouping it did, in words.
 */
import { parameterIndex } from "./parameterModel.ts";
import type { FitTrial } from "./fitTrial.ts";

/**
 * Why the winner of the comparison won, in words.
 *
 * Parameters
 * ----------
 * best : FitTrial
 *     The run whose values the fit reports.
 * finalists : readonly FitTrial[]
 *     The runs compared and checked for plausibility, all on the same points (best among them).
 * assigned : FitTrial | null
 *     The whole-curve run of the assignment's grouping, if it was made.
 * plausibilityOf : (t: FitTrial) => string[]
 *     Why a run is implausible (empty: plausible).
 * compared : boolean
 *     Whether other groupings were compared at all.
 * tieMargin : number
 *     BIC differences below this are reported as ties.
 *
 * Returns
 * -------
 * string[]
 *     First the winner (name, grouping in words, CB degeneracies, rate ratio, parameters), then
 *     each other finalist: implausible and why, or its BIC excess and weight ratio exp(−ΔBIC/2).
 *
 * Example
 * -------
 * ```ts
 * fitEvidence(best, finalists, assigned, plausibilityOf, true, 2)[0];
 * // => "ladder-empty 2+6 (charging ladder entered from the empty dot …; CB 2+6, Γtip/Γsub 0.50) has the lowest BIC …"
 * ```
 */
export function fitEvidence(best: FitTrial, finalists: readonly FitTrial[], assigned: FitTrial | null, plausibilityOf: (t: FitTrial) => string[], compared: boolean, tieMargin: number): string[] {
  const out: string[] = [];
  const ratioOf = (t: FitTrial) => 10 ** t.loop.parameters[parameterIndex(t.hypothesis.seeds.length).logRateRatio];
  const describe = (t: FitTrial) => `${t.hypothesis.name} (${t.hypothesis.label}; CB ${t.hypothesis.cbDegeneracies.join("+")}, Γtip/Γsub ${ratioOf(t).toPrecision(2)})`;
  if (!compared) {
    out.push("the rules decided the regime and the assignment's grouping describes the curve to the noise: no other grouping was fitted");
    return out;
  }
  out.push(`${describe(best)} has the lowest BIC (χ² + k·ln n, ${best.k} parameters) among the plausible hypotheses (differences below ${tieMargin} are ties, which go to the grouping listed first)`);
  for (const t of finalists) {
    if (t === best) continue;
    const why = plausibilityOf(t);
    if (why.length) out.push(`${t.hypothesis.name}: implausible (${why.join("; ")})`);
    else if (Math.abs(t.bic - best.bic) < tieMargin) out.push(`${t.hypothesis.name}: a tie (BIC ${t.bic >= best.bic ? "+" : "−"}${Math.abs(t.bic - best.bic).toFixed(1)}): it describes the curve as well`);
    else out.push(`${t.hypothesis.name}: BIC higher by ${(t.bic - best.bic).toFixed(1)} (weight ratio ${Math.exp(-(t.bic - best.bic) / 2).toExponential(1)}), ${t.k - best.k >= 0 ? `${t.k - best.k} more` : `${best.k - t.k} fewer`} parameters`);
  }
  if (assigned && assigned.side === best.side && best !== assigned && !finalists.includes(assigned)) out.push(`assigned: BIC higher by ${(assigned.bic - best.bic).toFixed(1)}`);
  return out;
}

