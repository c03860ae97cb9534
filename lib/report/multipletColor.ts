/**
 * The colours dotspec gives to multiplets in its figures: one per shell label, so the s doublet
 * or the p multiplet has the same colour in every figure.
 */

/**
 * The word dotspec uses, in every table, report and legend, for a peak that belongs to no
 * multiplet (a charging satellite set aside, or a peak the assignment did not place).
 */
export const NO_MULTIPLET = "no multiplet";

/**
 * The word for a peak that is a resonance through the dot–substrate junction (a level of the
 * other band seen at −η·V/(1 − η)): in no multiplet either, but not a level of its own.
 */
export const SECOND_JUNCTION = "second junction";

/**
 * Colours of the multiplet labels (CSS hex), from the palette of Okabe & Ito, chosen to stay
 * distinct with the common forms of colour-vision deficiency: conduction-band shells s
 * (vermillion), p (blue), d (bluish green), f (reddish purple); valence-band groups v1, v2, …
 * (orange, sky blue, then again); peaks in no multiplet in grey. Every label is also written
 * beside its peaks, so no reading depends on colour alone.
 *
 * Reference: M. Okabe and K. Ito, "Color Universal Design (CUD): how to make figures and
 * presentations that are friendly to colorblind people", J*FLY (2002, revised 2008).
 */
export const MULTIPLET_COLORS = Object.freeze({
  s: "#D55E00",
  p: "#0072B2",
  d: "#009E73",
  f: "#CC79A7",
  /** Valence-band groups v1, v2, … cycle through these. */
  valence: Object.freeze(["#E69F00", "#56B4E9"]) as readonly string[],
  /** Any other label. */
  other: "#000000",
  /** Peaks in no multiplet (charging satellites, unassigned). */
  none: "#B3B3B3",
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
 * ```ts
 * multipletColor("p");  // => "#0072B2"
 * multipletColor(null); // => "#B3B3B3"
 * ```
 */
export function multipletColor(label: string | null): string {
  const C = MULTIPLET_COLORS;
  if (label === null) return C.none;
  if (label === "s" || label === "p" || label === "d" || label === "f") return C[label];
  const v = /^v(\d+)$/.exec(label);
  if (v) return C.valence[(Number(v[1]) - 1 + C.valence.length * 1000) % C.valence.length];
  return C.other;
}
