/**
 * Dense Cholesky solve for the small normal-equation systems of the decomposition
 * (calendar-monthly effects, yearly harmonics).
 */
import { EngineError } from '../core/errors';

/**
 * Solves A·x = b for a symmetric positive definite matrix A by Cholesky factorisation
 * A = L·Lᵀ (Golub and Van Loan, Matrix Computations, 4th ed., algorithm 4.2.1).
 *
 * Complexity: O(p³/3) time, O(p²) memory for p unknowns.
 *
 * @param a row-major p×p matrix (only the lower triangle is read); never mutated.
 * @param b right-hand side of length p; never mutated.
 * @returns the solution x as a new Float64Array.
 * @throws EngineError INVALID_ARGUMENT when the sizes disagree or A is not numerically
 *   positive definite (a pivot ≤ 1e-12 times the largest diagonal entry).
 * @example
 * solveSymmetricPositiveDefinite(new Float64Array([4, 2, 2, 3]), new Float64Array([2, 1])); // [0.5, 0]
 */
export function solveSymmetricPositiveDefinite(a: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
  const p = b.length;
  if (a.length !== p * p) {
    throw new EngineError('INVALID_ARGUMENT', `matrix has ${a.length} entries, expected ${p * p}`);
  }
  let maxDiag = 0;
  for (let i = 0; i < p; i++) maxDiag = Math.max(maxDiag, Math.abs(a[i * p + i] as number));
  const l = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    let d = a[j * p + j] as number;
    for (let k = 0; k < j; k++) {
      const v = l[j * p + k] as number;
      d -= v * v;
    }
    if (!(d > 1e-12 * maxDiag)) {
      throw new EngineError('INVALID_ARGUMENT', 'normal equations are not positive definite');
    }
    const djj = Math.sqrt(d);
    l[j * p + j] = djj;
    for (let i = j + 1; i < p; i++) {
      let s = a[i * p + j] as number;
      for (let k = 0; k < j; k++) s -= (l[i * p + k] as number) * (l[j * p + k] as number);
      l[i * p + j] = s / djj;
    }
  }
  const x = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    let s = b[i] as number;
    for (let k = 0; k < i; k++) s -= (l[i * p + k] as number) * (x[k] as number);
    x[i] = s / (l[i * p + i] as number);
  }
  for (let i = p - 1; i >= 0; i--) {
    let s = x[i] as number;
    for (let k = i + 1; k < p; k++) s -= (l[k * p + i] as number) * (x[k] as number);
    x[i] = s / (l[i * p + i] as number);
  }
  return x;
}
