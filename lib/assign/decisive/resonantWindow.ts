/**
 * A test of `rulesDecisive` (its note 27): a shell-filling reading made among second-junction
 * resonances, where the rules' grouping of charging peaks is never safe enough to stand unfitted.
 */
import type { Peak } from "../../peaks/findPeaks.ts";
import { checkFinite, checkRange } from "../../util/check.ts";
import type { Assignment } from "../assignSpectrum.ts";
import type { Multiplet } from "../multiplets.ts";

/** The code of {@link resonantWindowReasons}, note 27 of `rulesDecisive`. */
export type ResonantWindowCode = "resonant-window";

/** One reason of {@link resonantWindowReasons}. */
export interface ResonantWindowReason {
  code: ResonantWindowCode;
  /** In words, with the numbers. */
  text: string;
}

/** What {@link resonantWindowReasons} reads of an assignment (`assignSpectrum`'s answer gives it all). */
export interface ResonantWindowAssignment {
  regime: Assignment["regime"];
  multiplets: readonly Pick<Multiplet, "peakIndices">[];
  /** The peaks set aside as second-junction resonances (only their number is read). */
  evidence: { secondJunction: readonly unknown[] };
  /** η and whether it was given (a default η predicts nothing). */
  energies: { eta: number; etaGiven: boolean };
}

/**
 * The reason to doubt a shell-filling reading made where second-junction resonances lie inside
 * the bias window.
 *
 * Parameters
 * ----------
 * peaks : readonly Pick<Peak, "biasV">[]
 *     The peaks the assignment names by index (`biasV` in V).
 * assignment : ResonantWindowAssignment
 *     The rules' assignment of those peaks (regime, multiplets, the peaks set aside as
 *     resonances, η).
 * biasRangeV : readonly [number, number]
 *     The bias window [lowest, highest], V.
 *
 * Returns
 * -------
 * ResonantWindowReason[]
 *     One reason, or none.
 *
 * Throws
 * ------
 * DotspecError
 *     `biasRangeV[…]` for a window that is not two finite numbers in ascending order.
 *
 * Notes
 * -----
 * A tip-junction peak at bias V has its second-junction resonance at −η·V/(1 − η), where the
 * level lines up with the substrate's Fermi level (the voltage division of a double-barrier
 * junction, orthodox theory). Below η = 1/2 every level's resonance lies further out than the
 * level itself; at η 0.55–0.65 those of the levels nearest the gap fall inside a window a few
 * volts wide. A resonance and a charging peak within one FWHM share one step in the peak list and
 * pull each other's position, and a resonance that steps like a charging peak stands in for one:
 * the rules' grouping of a charging ladder there rests on which peaks they set aside, which their
 * step and spacing tests cannot always tell. The model holds both ladders and the resonances, so
 * such a reading goes to the fit (note 27 of `rulesDecisive`): shell filling, η given and below 1,
 * and either a peak set aside as a resonance or a multiplet peak whose resonance falls inside the
 * window. Shell tunnelling is left to the other notes: its single levels carry no charging ladder
 * to confuse, and a fit's Ec there rests on weak satellites.
 *
 * Example
 * -------
 * ```ts
 * // η = 0.6: the s peak at 0.9 V has its resonance at −0.6·0.9/0.4 = −1.35 V, inside [−2, 2].
 * resonantWindowReasons([{ biasV: 0.9 }], { regime: "shell-filling", multiplets: [{ peakIndices: [0] }],
 *   evidence: { secondJunction: [] }, energies: { eta: 0.6, etaGiven: true } }, [-2, 2])
 *   .map((r) => r.code);  // => ["resonant-window"]
 * ```
 */
export function resonantWindowReasons(
  peaks: readonly Pick<Peak, "biasV">[],
  assignment: ResonantWindowAssignment,
  biasRangeV: readonly [number, number],
): ResonantWindowReason[] {
  const [fromV, toV] = biasRangeV;
  checkFinite("biasRangeV[0]", fromV);
  checkFinite("biasRangeV[1]", toV);
  checkRange("biasRangeV[1]", toV, fromV, Infinity);
  const a = assignment;
  const { eta, etaGiven } = a.energies;
  if (a.regime !== "shell-filling" || !etaGiven || !(eta < 1)) return [];
  const setAside = a.evidence.secondJunction.length;
  const inside = a.multiplets
    .flatMap((m) => m.peakIndices)
    .map((i) => (-eta * peaks[i].biasV) / (1 - eta))
    .filter((v) => v >= fromV && v <= toV);
  if (setAside === 0 && inside.length === 0) return [];
  const what = [
    setAside ? `${setAside} peak${setAside === 1 ? "" : "s"} set aside as second-junction resonances` : "",
    inside.length ? `${inside.length} multiplet peak${inside.length === 1 ? "'s" : "s'"} resonance${inside.length === 1 ? "" : "s"} (−η·V/(1 − η), η = ${eta.toFixed(2)}) inside the window` : "",
  ].filter(Boolean);
  return [
    {
      code: "resonant-window",
      text: `shell filling read among second-junction resonances (${what.join(", ")}): a resonance and a charging peak within one FWHM share one step in the peak list, and the rules' grouping of the charging ladder rests on which peaks they set aside; the model, which holds the resonances, decides`,
    },
  ];
}
