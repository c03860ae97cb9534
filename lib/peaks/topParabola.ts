/**
 * The least-squares parabola through the top of a conductance peak (findPeaks' note 4).
 * Internal to lib/peaks (not re-exported from the public entry).
 */
import { scaledSymmetricInverse } from "../util/smallSymmetric.ts";

/** Least-squares parabola a·x² + b·x + c in x = biasV − x0 over [l, r], with (XᵀX)⁻¹ (row-major 3×3). */
export function parabola(x: Float64Array, y: Float64Array, l: number, r: number, x0: number): { a: number; b: number; c: number; cov: number[] } | null {
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let i = l; i <= r; i++) {
    const u = x[i] - x0, u2 = u * u;
    s0 += 1, s1 += u, s2 += u2, s3 += u2 * u, s4 += u2 * u2;
    t0 += y[i], t1 += y[i] * u, t2 += y[i] * u2;
  }
  if (s0 < 3) return null;
  // Solve [[s4 s3 s2][s3 s2 s1][s2 s1 s0]] [a b c]ᵀ = [t2 t1 t0]ᵀ.
  const inv = scaledSymmetricInverse([s4, s3, s2, s3, s2, s1, s2, s1, s0], 3);
  if (!inv) return null;
  const a = inv[0] * t2 + inv[1] * t1 + inv[2] * t0;
  const b = inv[3] * t2 + inv[4] * t1 + inv[5] * t0;
  const c = inv[6] * t2 + inv[7] * t1 + inv[8] * t0;
  // Covariance of (a, b) in units of the noise variance: [[Vaa, Vab], [Vba, Vbb]].
  return { a, b, c, cov: [inv[0], inv[1], inv[3], inv[4]] };
}
