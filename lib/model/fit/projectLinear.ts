/**
 * Variable projection: the parameters that enter the model current linearly (rate scale, offset,
 * background) solved by least squares for a given shape of the current.
 */
import { mlMatrix } from "./mlMatrix.ts";

/** What {@link projectLinear} returns. */
export interface LinearProjection {
  /** Model current with the best linear coefficients, A. */
  out: Float64Array;
  /** [Γsub (1/s), offset (A), b1 (S), b3 (A/V³)]; all 0 when the normal equations are singular. */
  coef: number[];
}

/**
 * The best rate scale, offset and background for a model current at unit scale, by linear least
 * squares.
 *
 * Parameters
 * ----------
 * unitA : ArrayLike<number>
 *     The model current at Γsub = 1/s ({@link unitCurrent}), A.
 * biasV : ArrayLike<number>
 *     Bias in V of each point.
 * cubeV3 : ArrayLike<number>
 *     V³ of each point, V³ (computed once by the caller).
 * dataA : ArrayLike<number>
 *     The measured current, A.
 *
 * Returns
 * -------
 * LinearProjection
 *     `{ out, coef }`: the model current scale·unit + offset + b1·V + b3·V³ (A) and
 *     coef = [scale, offset, b1, b3].
 *
 * Throws
 * ------
 * Nothing: singular normal equations give coef = [0, 0, 0, 0].
 *
 * Notes
 * -----
 * 1. Columns [unit, 1, V, V³]; normal equations AᵀA·c = Aᵀy (4 × 4).
 * 2. Scale each column to unit norm (the columns differ by many orders of magnitude), solve
 *    (ml-matrix), undo the scaling.
 * 3. Inside every model evaluation this leaves Levenberg–Marquardt only the nonlinear
 *    parameters (variable projection).
 *
 * References
 * ----------
 * G. H. Golub and V. Pereyra, "The differentiation of pseudo-inverses and nonlinear least squares
 * problems whose variables separate", SIAM J. Numer. Anal. 10, 413 (1973).
 *
 * Example
 * -------
 * ```ts
 * const biasV = [0, 0.5, 1, 1.5, 2];
 * const unitA = [0, 0, 1e-19, 2e-19, 2e-19];
 * // Data made of scale 1e8, offset 1e-12 A and b1 = 1e-12 S.
 * const dataA = biasV.map((v, i) => 1e8 * unitA[i] + 1e-12 + 1e-12 * v);
 * projectLinear(unitA, biasV, biasV.map((v) => v ** 3), dataA).coef;
 * // => [1e8, 1e-12, 1e-12, 0] (1/s, A, S, A/V³)
 * ```
 */
export function projectLinear(unitA: ArrayLike<number>, biasV: ArrayLike<number>, cubeV3: ArrayLike<number>, dataA: ArrayLike<number>): LinearProjection {
  const n = biasV.length;
  // Linear least squares for [scale, offset, b1, b3].
  const cols = [unitA, new Float64Array(n).fill(1), biasV, cubeV3];
  const { Matrix, solve } = mlMatrix();
  const ata = Matrix.zeros(4, 4), atb = Matrix.zeros(4, 1);
  for (let a = 0; a < 4; a++) {
    let sb = 0;
    for (let i = 0; i < n; i++) sb += cols[a][i] * dataA[i];
    atb.set(a, 0, sb);
    for (let b = a; b < 4; b++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += cols[a][i] * cols[b][i];
      ata.set(a, b, s);
      ata.set(b, a, s);
    }
  }
  // Column scaling keeps the tiny normal equations well conditioned.
  const scale = [0, 1, 2, 3].map((a) => Math.sqrt(ata.get(a, a)) || 1);
  for (let a = 0; a < 4; a++) {
    atb.set(a, 0, atb.get(a, 0) / scale[a]);
    for (let b = 0; b < 4; b++) ata.set(a, b, ata.get(a, b) / (scale[a] * scale[b]));
  }
  let coef: number[];
  try {
    coef = solve(ata, atb).getColumn(0).map((c, a) => c / scale[a]);
  } catch {
    coef = [0, 0, 0, 0];
  }
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = coef[0] * unitA[i] + coef[1] + coef[2] * biasV[i] + coef[3] * cubeV3[i];
  return { out, coef };
}
