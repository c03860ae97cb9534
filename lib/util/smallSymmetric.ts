/**
 * Inverse of a small symmetric positive-definite matrix by Cholesky factorisation, without
 * allocation beyond the result: for the many tiny normal-equation systems of local fits, where a
 * general matrix library's per-call overhead dominates.
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
  const l = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * m + j];
      for (let k = 0; k < j; k++) s -= l[i * m + k] * l[j * m + k];
      if (i === j) {
        if (!(s > 0)) return null;
        l[i * m + i] = Math.sqrt(s);
      } else l[i * m + j] = s / l[j * m + j];
    }
  }
  // L⁻¹ (lower triangular), in place of a fresh array.
  const li = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    li[i * m + i] = 1 / l[i * m + i];
    for (let j = 0; j < i; j++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= l[i * m + k] * li[k * m + j];
      li[i * m + j] = s / l[i * m + i];
    }
  }
  const inv = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = i; k < m; k++) s += li[k * m + i] * li[k * m + j];
      inv[i * m + j] = s;
      inv[j * m + i] = s;
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
  const d = new Float64Array(m);
  for (let r = 0; r < m; r++) d[r] = Math.sqrt(a[r * m + r]) || 1;
  const s = new Float64Array(m * m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) s[r * m + c] = a[r * m + c] / (d[r] * d[c]);
  const inv = symmetricInverse(s, m);
  if (!inv) return null;
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) inv[r * m + c] /= d[r] * d[c];
  return inv;
}
