/**
 * Inverse of a small symmetric positive-definite matrix by Cholesky factorisation, with no
 * scratch beyond one plain array for the factor: for the many tiny normal-equation systems of
 * local fits, where a general matrix library's per-call overhead dominates.
 *
 * Notes: A = L·Lᵀ (Cholesky–Banachiewicz), then A⁻¹ = L⁻ᵀ·L⁻¹. Returns null when a pivot is not
 * positive (the matrix is singular or not positive definite to working precision).
 *
 * Reference: G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed. (Johns Hopkins, 2013), §4.2.
 *
 * @param a - m×m row-major symmetric matrix (not modified).
 * @param m - order.
 * @returns the m×m row-major inverse, or null.
 */
export function symmetricInverse(a: Float64Array, m: number): Float64Array | null {
  const l = Array.from(a.subarray(0, m * m));
  return factorInPlace(l, m) ? trailingInverse(l, m, m) : null;
}

/**
 * Cholesky–Banachiewicz factor L of A = L·Lᵀ, written over A's lower triangle (row-major; the
 * upper triangle is left as it was and never read); false when a pivot is not positive. Each
 * entry of A is read just before L's entry takes its place, so the factor is the same, bit for
 * bit, as one written to a separate array. The scratch arrays here are plain arrays: a typed
 * array of more than a few numbers is allocated outside V8's heap, which cost more than the
 * arithmetic of these small systems.
 */
function factorInPlace(l: number[], m: number): boolean {
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let s = l[i * m + j];
      for (let k = 0; k < j; k++) s -= l[i * m + k] * l[j * m + k];
      if (i === j) {
        if (!(s > 0)) return false;
        l[i * m + i] = Math.sqrt(s);
      } else l[i * m + j] = s / l[j * m + j];
    }
  }
  return true;
}

/**
 * The trailing t×t block of A⁻¹ from the Cholesky factor L of A: since L⁻¹ is lower triangular,
 * that block of L⁻ᵀL⁻¹ involves only the trailing block of L⁻¹, the inverse of L's trailing block.
 * With t = m, the whole inverse.
 */
function trailingInverse(l: readonly number[], m: number, t: number): Float64Array {
  const o = m - t;
  const li: number[] = new Array(t * t).fill(0);
  for (let i = 0; i < t; i++) {
    li[i * t + i] = 1 / l[(o + i) * m + o + i];
    for (let j = 0; j < i; j++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= l[(o + i) * m + o + k] * li[k * t + j];
      li[i * t + j] = s / l[(o + i) * m + o + i];
    }
  }
  const inv = new Float64Array(t * t);
  for (let i = 0; i < t; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = i; k < t; k++) s += li[k * t + i] * li[k * t + j];
      inv[i * t + j] = s;
      inv[j * t + i] = s;
    }
  }
  return inv;
}

/**
 * {@link symmetricInverse} after scaling to unit diagonal (D⁻¹AD⁻¹, D = √diag A), then scaled
 * back: for normal equations whose columns differ by orders of magnitude (a constant, a bias in
 * volts, its powers, unit-height peaks). Not modified: `a`.
 */
export function scaledSymmetricInverse(a: Float64Array | readonly number[], m: number): Float64Array | null {
  const d: number[] = new Array(m);
  for (let r = 0; r < m; r++) d[r] = Math.sqrt(a[r * m + r]) || 1;
  const l: number[] = new Array(m * m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) l[r * m + c] = a[r * m + c] / (d[r] * d[c]);
  if (!factorInPlace(l, m)) return null;
  const inv = trailingInverse(l, m, m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) inv[r * m + c] /= d[r] * d[c];
  return inv;
}

/** Result of {@link scaledCholeskySolve}. */
export interface TailSolution {
  /** The solution x of A·x = b. */
  x: Float64Array;
  /** The trailing `tail`×`tail` block of A⁻¹, row-major (the covariance of the last `tail` unknowns, in units of the noise variance for normal equations). */
  tailInverse: Float64Array;
}

/**
 * Solves A·x = b for a small symmetric positive-definite A and returns, besides x, only the
 * trailing block of A⁻¹: what a local least-squares fit needs when the variances of its last one
 * or two coefficients are wanted, without the whole inverse.
 *
 * Notes:
 * 1. A is scaled to unit diagonal (D⁻¹AD⁻¹, D = √diag A), as in {@link scaledSymmetricInverse}.
 * 2. Cholesky: D⁻¹AD⁻¹ = L·Lᵀ; x by forward and back substitution.
 * 3. A⁻¹ = D⁻¹ L⁻ᵀ L⁻¹ D⁻¹, and since L⁻¹ is lower triangular, the trailing block of L⁻ᵀL⁻¹
 *    involves only the trailing block of L⁻¹, which is the inverse of the trailing block of L.
 *
 * Reference: G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed. (Johns Hopkins, 2013),
 * §4.2 (Cholesky) and §3.1 (triangular systems).
 *
 * @param a - m×m row-major symmetric matrix (not modified).
 * @param b - right-hand side, length m (not modified).
 * @param m - order.
 * @param tail - size of the trailing block of A⁻¹ wanted, 0 … m.
 * @returns x and the trailing block, or null when A is not positive definite to working precision.
 *
 * Example:
 *   scaledCholeskySolve(Float64Array.of(4, 2, 2, 3), Float64Array.of(2, 1), 2, 1);
 *   // { x: [0.5, 0], tailInverse: [0.5] }   (A⁻¹ = [[3, −2], [−2, 4]] / 8)
 */
export function scaledCholeskySolve(a: ArrayLike<number>, b: ArrayLike<number>, m: number, tail: number): TailSolution | null {
  const d: number[] = new Array(m);
  for (let r = 0; r < m; r++) d[r] = Math.sqrt(a[r * m + r]) || 1;
  const l: number[] = new Array(m * m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) l[r * m + c] = a[r * m + c] / (d[r] * d[c]);
  if (!factorInPlace(l, m)) return null;
  // L·y = D⁻¹b, then Lᵀ·z = y, x = D⁻¹z.
  const x = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let s = b[i] / d[i];
    for (let k = 0; k < i; k++) s -= l[i * m + k] * x[k];
    x[i] = s / l[i * m + i];
  }
  for (let i = m - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < m; k++) s -= l[k * m + i] * x[k];
    x[i] = s / l[i * m + i];
  }
  for (let i = 0; i < m; i++) x[i] /= d[i];
  const t = Math.max(0, Math.min(m, tail)), o = m - t;
  const tailInverse = trailingInverse(l, m, t);
  for (let i = 0; i < t; i++) for (let j = 0; j < t; j++) tailInverse[i * t + j] /= d[o + i] * d[o + j];
  return { x, tailInverse };
}
