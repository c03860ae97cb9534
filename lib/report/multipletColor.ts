/**
 * The colours dotspec gives to multiplets in its figures: one per shell label, so the s doublet
 * or the p multiplet has the same colour in every figure.
 */

/**
 * Colours of the multiplet labels (CSS hex). Conduction-band shells s, p, d, f in warm-to-cool
 * order; valence-band groups v1, v2, … in a second family; peaks without a multiplet (satellites,
 * unassigned) in grey.
 */
export const MULTIPLET_COLORS = Object.freeze({
  s: "#c8553d",
  p: "#2a7f8f",
  d: "#d39b2a",
  f: "#6b8e4e",
  /** Valence-band groups v1, v2, … cycle through these. */
  valence: Object.freeze(["#3d5a98", "#8a5a9e", "#5e7d8c", "#a26769"]) as readonly string[],
  /** Any other label. */
  other: "#4f4f4f",
  /** Peaks outside every multiplet (charging satellites, unassigned). */
  none: "#a3a3a3",
});

/**
 * The colour of a multiplet label.
 *
 * Parameters
 * ----------
 * label : string | null
 *     "s", "p", "d", "f", "v1", "v2", …, or null for a peak outside every multiplet.
 *
 * Returns
 * -------
 * string
 *     A CSS hex colour from {@link MULTIPLET_COLORS}.
 *
 * Example
 * -------
 * multipletColor("p");  // => "#2a7f8f"
 * multipletColor(null); // => "#a3a3a3"
 */
export function multipletColor(label: string | null): string {
  const C = MULTIPLET_COLORS;
  if (label === null) return C.none;
  if (label === "s" || label === "p" || label === "d" || label === "f") return C[label];
  const v = /^v(\d+)$/.exec(label);
  if (v) return C.valence[(Number(v[1]) - 1 + C.valence.length * 1000) % C.valence.length];
  return C.other;
}
