/**
 * Variable projection: the parameters that enter the model current linearly (rate scale, offset,
 * background) solved by least squares for a given shape of the current.
 */
import { scaledCholeskySolve } from "../../util/smallSymmetric.ts";

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
 * 1. Columns [unit, 1, V, V³]; normal equations AᵀA·c = Aᵀy (4 × 4) ({@link linearProjector}).
 * 2. Scale each column to unit norm (the columns differ by many orders of magnitude), solve by
 *    Cholesky, undo the scaling.
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
  return linearProjector(biasV, cubeV3, dataA)(unitA);
}

/**
 * {@link projectLinear} for many model currents on the same points: the sums that involve only
 * the bias and the data are formed once.
 *
 * Parameters
 * ----------
 * biasV : ArrayLike<number>
 *     Bias in V of each point.
 * cubeV3 : ArrayLike<number>
 *     V³ of each point, V³.
 * dataA : ArrayLike<number>
 *     The measured current, A.
 *
 * Returns
 * -------
 * (unitA: ArrayLike<number>) => LinearProjection
 *     projectLinear(unitA, biasV, cubeV3, dataA) for any unit current on these points.
 *
 * Throws
 * ------
 * Nothing.
 *
 * Notes
 * -----
 * 1. Once: the Gram entries and right-hand sides of the columns 1, V, V³.
 * 2. Per unit current u: Σu², Σu, Σu·V, Σu·V³ and Σu·y; the 4 × 4 normal equations scaled to unit
 *    diagonal and solved by Cholesky ({@link scaledCholeskySolve}); not positive definite
 *    (singular) gives coef = [0, 0, 0, 0].
 *
 * Example
 * -------
 * ```ts
 * const biasV = [0, 0.5, 1, 1.5, 2];
 * const project = linearProjector(biasV, biasV.map((v) => v ** 3), biasV.map((v) => 1e-12 + 1e-12 * v));
 * project([0, 0, 1e-19, 2e-19, 2e-19]).coef; // => [0, 1e-12, 1e-12, 0] (1/s, A, S, A/V³)
 * ```
 */
export function linearProjector(biasV: ArrayLike<number>, cubeV3: ArrayLike<number>, dataA: ArrayLike<number>): (unitA: ArrayLike<number>) => LinearProjection {
  const n = biasV.length;
  // Gram entries of [1, V, V³] and their right-hand sides.
  let s1 = 0, sv = 0, sc = 0, svv = 0, svc = 0, scc = 0, sy = 0, svy = 0, scy = 0;
  for (let i = 0; i < n; i++) {
    const v = biasV[i], c = cubeV3[i], y = dataA[i];
    s1 += 1;
    sv += v;
    sc += c;
    svv += v * v;
    svc += v * c;
    scc += c * c;
    sy += y;
    svy += v * y;
    scy += c * y;
  }
  const ata = new Float64Array(16);
  const atb = new Float64Array(4);
  return (unitA) => {
    let uu = 0, u1 = 0, uv = 0, uc = 0, uy = 0;
    for (let i = 0; i < n; i++) {
      const u = unitA[i];
      uu += u * u;
      u1 += u;
      uv += u * biasV[i];
      uc += u * cubeV3[i];
      uy += u * dataA[i];
    }
    ata.set([uu, u1, uv, uc, u1, s1, sv, sc, uv, sv, svv, svc, uc, sc, svc, scc]);
    atb.set([uy, sy, svy, scy]);
    const solved = scaledCholeskySolve(ata, atb, 4, 0);
    const coef = solved ? Array.from(solved.x) : [0, 0, 0, 0];
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = coef[0] * unitA[i] + coef[1] + coef[2] * biasV[i] + coef[3] * cubeV3[i];
    return { out, coef };
  };
}
