/**
 * The fitted levels of a split shell in energy order, labelled as such.
 */
import type { FittedLevel } from "./curveFit.ts";

/**
 * Puts the sub-levels of each split shell (p1, p2, …) in order of energy and relabels them, and
 * the VB levels in order of energy downward from the gap, each label keeping its place.
 *
 * Parameters
 * ----------
 * levels : readonly FittedLevel[]
 *     The fitted levels in the order of the fit's parameters.
 *
 * Returns
 * -------
 * FittedLevel[]
 *     The same levels; within each band, those labelled p1, p2, … (a split p shell) sorted by
 *     energy (CB upward, VB downward: away from the gap) and relabelled p1, p2, … in that order,
 *     each keeping its degeneracy and errors; the VB levels sorted downward, the labels (v1, v2,
 *     …) staying in their places. Other levels keep their places.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. The model is the same whatever the order of the levels (the charge states and their addition
 *    energies do not depend on it), so a fit started from a split may end with its sub-levels
 *    crossed (p1 above p2). The readings made from the levels (Δsp = ε_p1 − ε_s, the first p
 *    sub-level) assume the order of energy: with p1 above p2, Δsp would be a sub-level spacing long.
 * 2. The VB assumes no degeneracy, so its levels may cross in a fit the same way; v1 is the level
 *    nearest the gap whatever level the fit started there.
 *
 * Example
 * -------
 * ```ts
 * orderLevels(fit.levels).map((l) => `${l.label} ${l.energyEV.value}`);
 * // => ["s 1.117", "p1 1.503", "p2 1.554", "p3 1.61", "v1 -1.15"] (fitted p1 1.554, p2 1.503)
 * ```
 */
export function orderLevels(levels: readonly FittedLevel[]): FittedLevel[] {
  const out = [...levels];
  for (const band of ["CB", "VB"] as const) {
    const at = out.map((l, i) => (l.band === band && /^p\d+$/.test(l.label) ? i : -1)).filter((i) => i >= 0);
    const sign = band === "CB" ? 1 : -1;
    const sorted = at.map((i) => out[i]).sort((a, b) => sign * (a.energyEV.value - b.energyEV.value));
    at.forEach((i, k) => (out[i] = { ...sorted[k], label: `p${k + 1}` }));
  }
  // The VB levels, downward from the gap, each place keeping its label (v1 the nearest the gap).
  const vb = out.map((l, i) => (l.band === "VB" ? i : -1)).filter((i) => i >= 0);
  const sorted = vb.map((i) => out[i]).sort((a, b) => b.energyEV.value - a.energyEV.value);
  vb.forEach((i, k) => (out[i] = { ...sorted[k], label: out[i].label }));
  return out;
}
