/**
 * The depth of a central dip in a radial profile: how ring-shaped a map is.
 */
import type { RadialProfile } from "./radialProfile.ts";

/**
 * Depth of the central dip, (max − centre)/max of a radial profile: 0 when the centre is the
 * highest ring (a compact, s-like state), 1 when the centre is empty and the value sits on a
 * ring (the in-plane p components).
 *
 * Parameters
 * ----------
 * profile : RadialProfile
 *     A radial profile of a thresholded map (values ≥ 0).
 *
 * Returns
 * -------
 * number | null
 *     In [0, 1]; null when the first ring is empty or the profile has no positive value.
 *
 * Notes
 * -----
 * The centre value is the first ring (distances below one ring width). Projected on the plane,
 * the squared 1s wave function j0(πr/R)² peaks at the centre (depth 0); |px|² + |py|² vanishes
 * there (depth 1); the whole p shell, spherically symmetric, has a shallow dip (its projected
 * density is 0.81 of its maximum at the centre, maximum near 0.3 R: numerical integration of
 * j1(4.4934 r/R)², spherical Bessel zero from Abramowitz & Stegun Table 10.6).
 *
 * Example
 * -------
 * ```ts
 * dipDepth({ radiusNM: Float64Array.of(0.5, 1.5), mean: Float64Array.of(1, 4), pixels: Uint32Array.of(4, 12), binNM: 1 });
 * // => 0.75
 * ```
 */
export function dipDepth(profile: RadialProfile): number | null {
  const centre = profile.mean[0];
  if (!(centre >= 0)) return null;
  let max = -Infinity;
  for (const v of profile.mean) if (v > max) max = v;
  if (!(max > 0)) return null;
  return Math.min(1, Math.max(0, (max - centre) / max));
}
