/**
 * Special functions used by the line-shape models.
 */

/**
 * Complementary error function erfc(x), fractional error below 1.2e-7 for all x.
 *
 * Notes: Chebyshev-fitted exponent, erfc(x) ≈ t·exp(−x² + P(t)) with t = 1/(1 + |x|/2) and
 * erfc(−x) = 2 − erfc(x). Smooth in x, so finite-difference Jacobians through it behave.
 *
 * Reference: W. H. Press et al., Numerical Recipes in C, 2nd ed. (Cambridge, 1992), §6.2 (erfcc).
 *
 * @example erfc(0); // => 1 (to 1e-7)
 */
export function erfc(x: number): number {
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const r =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? r : 2 - r;
}

/** Standard normal cumulative distribution Φ(x) = erfc(−x/√2)/2. */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

/**
 * Fermi–Dirac occupation 1/(1 + eˣ) of a state x = (E − μ)/kT above the Fermi level,
 * evaluated without overflow.
 */
export function fermi(x: number): number {
  if (x > 0) {
    const e = Math.exp(-x);
    return e / (1 + e);
  }
  return 1 / (1 + Math.exp(x));
}

const TABLE_STEP = 1 / 512;
const TABLE_REACH = 9;

/** {@link normalCdfFast} returns exactly 0 at or below −NORMAL_CDF_FAST_REACH and exactly 1 at or above it: a sum of its values may skip the points below. */
export const NORMAL_CDF_FAST_REACH = TABLE_REACH;
let cdfTable: Float64Array | null = null;

/**
 * Φ(x) by linear interpolation in a table of step 1/512 over |x| ≤ 9 (0 or 1 beyond): absolute
 * error below 2e-7, about ten times faster than {@link normalCdf}. For inner loops of fits
 * where Φ is evaluated millions of times; the table is built once, on first use.
 */
export function normalCdfFast(x: number): number {
  if (x <= -TABLE_REACH) return 0;
  if (x >= TABLE_REACH) return 1;
  if (cdfTable === null) cdfTable = normalCdfTable();
  const u = (x + TABLE_REACH) / TABLE_STEP;
  const i = u | 0;
  const f = u - i;
  return cdfTable[i] + f * (cdfTable[i + 1] - cdfTable[i]);
}

/**
 * The table of {@link normalCdfFast}: Φ at −9, −9 + 1/512, …, 9 + 1/512, each equal to
 * `normalCdf` there to the bit. The upper half comes from the lower one by Φ(x) = 1 − Φ(−x):
 * `normalCdf(x)` for x > 0 is ½(2 − r) with r = erfc(x/√2), the lower point's value is ½r, and
 * halving is exact, so 1 − ½r rounds to the same double. Half the erfc evaluations, which matters
 * at the first use in a fresh process (9,218 of them in cold code took 12–18 ms of a one-curve
 * `dotspec analyze`).
 */
function normalCdfTable(): Float64Array {
  const half = Math.round(TABLE_REACH / TABLE_STEP); // the index of x = 0
  const table = new Float64Array(2 * half + 2);
  for (let i = 0; i <= half; i++) table[i] = normalCdf(-TABLE_REACH + i * TABLE_STEP);
  for (let i = half + 1; i <= 2 * half; i++) table[i] = 1 - table[2 * half - i];
  table[2 * half + 1] = normalCdf(TABLE_REACH + TABLE_STEP);
  return table;
}

const GAUSSIAN_STEP = 1 / 1024;
const GAUSSIAN_REACH = 9;
let gaussianTable: Float64Array | null = null;

/**
 * The Gaussian exp(−z²/2) from a table, for the basis columns of local least-squares fits
 * (thousands of evaluations per analysis).
 *
 * Parameters
 * ----------
 * z : number
 *     The argument, in standard deviations.
 *
 * Returns
 * -------
 * number
 *     exp(−z²/2) within 1.2e-7 (absolute); 0 for |z| ≥ 9, where the true value is below 2.6e-18;
 *     NaN for NaN.
 *
 * Notes
 * -----
 * 1. Linear interpolation in a table of step h = 1/1024 over 0 ≤ |z| ≤ 9, built once on first use.
 * 2. Error bound h²/8·max|g''| with max|g''| = 1 (at z = 0): 1.2e-7. Several times faster than
 *    `Math.exp` in the fits' inner loops.
 *
 * Example
 * -------
 * ```ts
 * gaussianFast(1); // => 0.60653066 (exp(−1/2), to 1.2e-7)
 * ```
 */
export function gaussianFast(z: number): number {
  const a = Math.abs(z);
  if (!(a < GAUSSIAN_REACH)) return a >= GAUSSIAN_REACH ? 0 : NaN;
  if (gaussianTable === null) {
    const n = Math.round(GAUSSIAN_REACH / GAUSSIAN_STEP) + 2;
    gaussianTable = new Float64Array(n);
    for (let i = 0; i < n; i++) gaussianTable[i] = Math.exp(-0.5 * (i * GAUSSIAN_STEP) ** 2);
  }
  const u = a / GAUSSIAN_STEP;
  const i = u | 0;
  const f = u - i;
  return gaussianTable[i] + f * (gaussianTable[i + 1] - gaussianTable[i]);
}
